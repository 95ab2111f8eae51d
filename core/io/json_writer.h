// JsonWriter: a small streaming JSON writer for the CLI contracts (DESIGN.md 5.3).
// Numbers are written in their shortest exact form; NaN and infinities, which JSON
// cannot hold, are written as null.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace tl {

class JsonWriter {
public:
    explicit JsonWriter(int indent = 2) : indent_(indent) {}

    JsonWriter& beginObject();
    JsonWriter& endObject();
    JsonWriter& beginArray();
    JsonWriter& endArray();
    JsonWriter& key(std::string_view k);  // inside an object, before each value
    JsonWriter& value(std::string_view s);
    JsonWriter& value(const char* s) { return value(std::string_view(s)); }
    JsonWriter& value(double v);
    JsonWriter& value(int v) { return value(static_cast<long long>(v)); }
    JsonWriter& value(long long v);
    JsonWriter& value(std::size_t v) { return value(static_cast<long long>(v)); }
    JsonWriter& value(bool b);
    JsonWriter& null();

    template <typename T>
    JsonWriter& field(std::string_view k, const T& v) { key(k); return value(v); }

    const std::string& str() const { return out_; }

private:
    void beforeValue();
    void newline();

    struct Level { bool isObject; bool empty; };
    std::vector<Level> stack_;
    std::string out_;
    int indent_;
    bool afterKey_ = false;
};

std::string jsonEscape(std::string_view s);

}  // namespace tl
