#include "core/io/json_writer.h"

#include <cmath>
#include <cstdio>

#include "core/model/text.h"

namespace tl {

std::string jsonEscape(std::string_view s)
{
    std::string out;
    out.reserve(s.size() + 2);
    out += '"';
    for (const char ch : s) {
        const auto c = static_cast<unsigned char>(ch);
        switch (c) {
        case '"': out += "\\\""; break;
        case '\\': out += "\\\\"; break;
        case '\n': out += "\\n"; break;
        case '\r': out += "\\r"; break;
        case '\t': out += "\\t"; break;
        default:
            if (c < 0x20) {
                char buf[8];
                std::snprintf(buf, sizeof buf, "\\u%04x", c);
                out += buf;
            } else {
                out += ch;  // UTF-8 passes through unchanged
            }
        }
    }
    out += '"';
    return out;
}

void JsonWriter::newline()
{
    if (indent_ <= 0) return;
    out_ += '\n';
    out_.append(stack_.size() * static_cast<std::size_t>(indent_), ' ');
}

void JsonWriter::beforeValue()
{
    if (afterKey_) {
        afterKey_ = false;
        return;
    }
    if (stack_.empty()) return;
    if (!stack_.back().empty) out_ += ',';
    stack_.back().empty = false;
    newline();
}

JsonWriter& JsonWriter::beginObject()
{
    beforeValue();
    out_ += '{';
    stack_.push_back({true, true});
    return *this;
}

JsonWriter& JsonWriter::endObject()
{
    const bool wasEmpty = stack_.back().empty;
    stack_.pop_back();
    if (!wasEmpty) newline();
    out_ += '}';
    if (stack_.empty() && indent_ > 0) out_ += '\n';
    return *this;
}

JsonWriter& JsonWriter::beginArray()
{
    beforeValue();
    out_ += '[';
    stack_.push_back({false, true});
    return *this;
}

JsonWriter& JsonWriter::endArray()
{
    const bool wasEmpty = stack_.back().empty;
    stack_.pop_back();
    if (!wasEmpty) newline();
    out_ += ']';
    return *this;
}

JsonWriter& JsonWriter::key(std::string_view k)
{
    beforeValue();
    out_ += jsonEscape(k);
    out_ += indent_ > 0 ? ": " : ":";
    afterKey_ = true;
    return *this;
}

JsonWriter& JsonWriter::value(std::string_view s)
{
    beforeValue();
    out_ += jsonEscape(s);
    return *this;
}

JsonWriter& JsonWriter::value(double v)
{
    beforeValue();
    out_ += std::isfinite(v) ? formatNumber(v) : "null";
    return *this;
}

JsonWriter& JsonWriter::value(long long v)
{
    beforeValue();
    out_ += std::to_string(v);
    return *this;
}

JsonWriter& JsonWriter::value(bool b)
{
    beforeValue();
    out_ += b ? "true" : "false";
    return *this;
}

JsonWriter& JsonWriter::null()
{
    beforeValue();
    out_ += "null";
    return *this;
}

}  // namespace tl
