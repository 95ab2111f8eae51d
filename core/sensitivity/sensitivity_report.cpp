#include "core/sensitivity/sensitivity_report.h"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <vector>

#include "core/io/balance_report.h"
#include "core/io/json_writer.h"
#include "core/io/text_table.h"

namespace tl {

const char* const kDietPathNote =
    "A diet share moves with the rest of its predator's diet (import included) giving up the change in "
    "proportion to their shares, so the row still sums to the same total.";

namespace {

// Elasticities smaller than this are rounding residue of the solve, not an effect (this
// project's choice: the solve's relative accuracy is about 1e-14 times its conditioning).
constexpr double kNegligibleElasticity = 1e-12;

// Input columns of one output row with a defined elasticity above kNegligibleElasticity,
// largest first.
std::vector<std::size_t> ranked(const ElasticityResult& result, std::size_t output, std::optional<std::size_t> top)
{
    std::vector<std::size_t> order;
    const auto o = static_cast<Eigen::Index>(output);
    for (std::size_t k = 0; k < result.inputs.size(); ++k) {
        const double e = result.elasticity(o, static_cast<Eigen::Index>(k));
        if (std::isfinite(e) && std::abs(e) > kNegligibleElasticity) order.push_back(k);
    }
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return std::abs(result.elasticity(o, static_cast<Eigen::Index>(a))) >
               std::abs(result.elasticity(o, static_cast<Eigen::Index>(b)));
    });
    if (top && order.size() > *top) order.resize(*top);
    return order;
}

std::string outputNote(const SensitivityOutput& output)
{
    return output.value == 0.0 ? "the output is 0 at the point estimate, so it has no relative change" : "";
}

void writeInputFields(JsonWriter& w, const Model& model, const SensitivityInput& input)
{
    w.field("input", inputName(model, input));
    w.field("compartment", model.compartment(input.compartment).name);
    w.field("parameter", inputKindKey(input.kind));
    w.key("prey");
    if (input.kind != SensitivityInputKind::Diet) w.null();
    else w.value(input.prey == kImportPrey ? std::string("import") : model.compartment(input.prey).name);
    w.field("value", input.value);
}

std::string quantityLabel(SensitivityOutputKind kind)
{
    switch (kind) {
    case SensitivityOutputKind::Biomass: return "B";
    case SensitivityOutputKind::PB: return "P/B";
    case SensitivityOutputKind::QB: return "Q/B";
    case SensitivityOutputKind::EE: return "EE";
    case SensitivityOutputKind::PQ: return "P/Q";
    case SensitivityOutputKind::TL: return "TL";
    }
    return "";
}

std::string inputLabel(const Model& model, const SensitivityInput& input)
{
    const std::string& name = model.compartment(input.compartment).name;
    switch (input.kind) {
    case SensitivityInputKind::Biomass: return "B of " + name;
    case SensitivityInputKind::PB: return "P/B of " + name;
    case SensitivityInputKind::QB: return "Q/B of " + name;
    case SensitivityInputKind::EE: return "EE of " + name;
    case SensitivityInputKind::PQ: return "P/Q of " + name;
    case SensitivityInputKind::Catch: return "catch of " + name;
    case SensitivityInputKind::Unassim: return "U of " + name;
    case SensitivityInputKind::NetEmigration: return "net emigration of " + name;
    case SensitivityInputKind::BiomassAccum: return "BA of " + name;
    case SensitivityInputKind::DetritusImport: return "import into " + name;
    case SensitivityInputKind::Diet:
        return (input.prey == kImportPrey ? std::string("import") : model.compartment(input.prey).name) +
               " in the diet of " + name;
    }
    return name;
}

// Input columns of one PRCC result with a defined coefficient, largest magnitude first.
std::vector<std::size_t> rankedDrivers(const PrccResult& r, std::optional<std::size_t> top)
{
    std::vector<std::size_t> order;
    for (std::size_t k = 0; k < r.note.size(); ++k)
        if (std::isfinite(r.coefficient[static_cast<Eigen::Index>(k)])) order.push_back(k);
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return std::abs(r.coefficient[static_cast<Eigen::Index>(a)]) > std::abs(r.coefficient[static_cast<Eigen::Index>(b)]);
    });
    if (top && order.size() > *top) order.resize(*top);
    return order;
}

void writePrcc(JsonWriter& w, const PrccTable& table, std::optional<std::size_t> top,
               const SensitivityReportOptions::PrccEnsemble* source)
{
    w.beginObject();
    w.field("method", "partial rank correlation (Marino et al. 2008), two-sided t test");
    w.key("ensemble");
    if (source) {
        w.beginObject();
        w.field("draws", static_cast<long long>(source->draws));
        w.field("seed", std::to_string(source->seed));  // as text, as tledger ensemble writes it
        w.field("balanced_draws", static_cast<long long>(source->balanced));
        w.key("left_out").beginArray();
        for (const std::string& n : source->leftOut) w.value(n);
        w.endArray();
        w.field("held_at_point_value", source->held);
        w.endObject();
    } else {
        w.null();
    }
    w.key("outputs").beginArray();
    for (std::size_t o = 0; o < table.outputs.size(); ++o) {
        const PrccResult& r = table.outputs[o];
        w.beginObject();
        w.field("output", table.outputNames[o]);
        w.field("draws", r.draws);
        w.field("degrees_of_freedom", r.degreesOfFreedom);
        w.key("drivers").beginArray();
        for (std::size_t k : rankedDrivers(r, top)) {
            w.beginObject();
            w.field("input", table.inputNames[k]);
            w.field("prcc", r.coefficient[static_cast<Eigen::Index>(k)]);
            w.field("p_value", r.pValue[static_cast<Eigen::Index>(k)]);
            w.endObject();
        }
        w.endArray();
        w.key("undefined").beginArray();
        for (std::size_t k = 0; k < r.note.size(); ++k) {
            if (r.note[k] == PrccNote::Defined) continue;
            w.beginObject();
            w.field("input", table.inputNames[k]);
            w.field("reason", prccNoteKey(r.note[k]));
            w.endObject();
        }
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.endObject();
}

}  // namespace

std::string sensitivityJson(const Model& model, const ElasticityResult& result, const SensitivityReportOptions& options)
{
    JsonWriter w;
    w.beginObject();
    w.field("scenario", options.scenario);
    w.field("status", statusKey(result.status));
    w.key("error");
    if (result.error.empty()) w.null();
    else w.value(result.error);
    w.key("method_note");
    if (result.methodNote.empty()) w.null();
    else w.value(result.methodNote);
    w.field("log_step", result.logStep);
    w.field("diet_path", kDietPathNote);
    w.field("input_count", result.inputs.size());
    w.field("output_count", result.outputs.size());
    w.key("outputs").beginArray();
    for (std::size_t o = 0; o < result.outputs.size(); ++o) {
        const SensitivityOutput& out = result.outputs[o];
        w.beginObject();
        w.field("output", outputName(model, out));
        w.field("compartment", model.compartment(out.compartment).name);
        w.field("quantity", outputKindKey(out.kind));
        w.field("value", out.value);
        w.field("solved", out.solved);
        w.field("method", methodKey(out.method));
        const std::string note = outputNote(out);
        w.key("note");
        if (note.empty()) w.null();
        else w.value(note);
        w.key("elasticities").beginArray();
        for (std::size_t k : ranked(result, o, options.top)) {
            w.beginObject();
            writeInputFields(w, model, result.inputs[k]);
            w.field("elasticity", result.elasticity(static_cast<Eigen::Index>(o), static_cast<Eigen::Index>(k)));
            w.endObject();
        }
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.key("inputs").beginArray();
    for (const SensitivityInput& input : result.inputs) {
        w.beginObject();
        writeInputFields(w, model, input);
        w.endObject();
    }
    w.endArray();
    w.key("prcc");
    if (options.prcc) writePrcc(w, *options.prcc, options.top, options.prccEnsemble);
    else w.null();
    w.field("notice", kDecisionSupportNotice);
    w.endObject();
    return w.str() + "\n";
}

std::string prccText(const PrccTable& table, std::optional<std::size_t> top)
{
    return prccText(table, top, nullptr);
}

std::string prccText(const PrccTable& table, std::optional<std::size_t> top, const SensitivityReportOptions::PrccEnsemble* source)
{
    std::string out = "\nPartial rank correlation over the draws (Marino et al. 2008): the monotone effect of each "
                      "input once the others' are taken out; p from a two-sided t test.\n";
    if (source) {
        out += "Draws: " + std::to_string(source->balanced) + " balanced of " + std::to_string(source->draws) +
               " (seed " + std::to_string(source->seed) + "). Held at their point values: " + source->held + ".\n";
        if (!source->leftOut.empty()) {
            out += "Left out (one share per diet row, since a row's shares sum to a fixed total):";
            for (std::size_t k = 0; k < source->leftOut.size(); ++k) out += (k ? ", " : " ") + source->leftOut[k];
            out += ".\n";
        }
    }
    for (std::size_t o = 0; o < table.outputs.size(); ++o) {
        const PrccResult& r = table.outputs[o];
        out += '\n';
        out += table.outputNames[o] + " (" + std::to_string(r.draws) + " draws)\n";
        const std::vector<std::size_t> order = rankedDrivers(r, top);
        if (order.empty()) {
            out += "  no input has a defined coefficient\n";
            continue;
        }
        TextTable t;
        t.addColumn("Input", TextTable::Align::Left);
        t.addColumn("PRCC");
        t.addColumn("p");
        for (std::size_t k : order)
            t.addRow({table.inputNames[k], displayNumber(r.coefficient[static_cast<Eigen::Index>(k)]),
                      displayNumber(r.pValue[static_cast<Eigen::Index>(k)])});
        out += t.render();
    }
    return out;
}

std::string sensitivityText(const Model& model, const ElasticityResult& result, const SensitivityReportOptions& options)
{
    std::string out = "Elasticities of scenario '" + options.scenario + "' (" + std::string(statusKey(result.status)) +
                      ")\nd ln(output) / d ln(input) at the point estimate: a 1 % rise of the input moves the "
                      "output by about e %.\n";
    if (!result.error.empty()) return out + "Not computed: " + result.error + "\n";
    if (result.status == BalanceStatus::Unbalanced)
        out += "Note: the scenario does not balance; these describe its unbalanced point.\n";
    if (!result.methodNote.empty()) out += "Method: " + result.methodNote + ".\n";
    out += std::to_string(result.inputs.size()) + " inputs, " + std::to_string(result.outputs.size()) + " outputs.\n";
    out += kDietPathNote;
    out += '\n';
    for (std::size_t o = 0; o < result.outputs.size(); ++o) {
        const SensitivityOutput& output = result.outputs[o];
        out += '\n';
        out += quantityLabel(output.kind) + " of " + model.compartment(output.compartment).name + " (" +
               outputName(model, output) + ") = " + displayNumber(output.value) + (output.solved ? ", solved" : "") +
               "; " + (output.method == DerivativeMethod::Analytic ? "analytic" : "central differences") + "\n";
        const std::string note = outputNote(output);
        if (!note.empty()) {
            out += "  " + note + "\n";
            continue;
        }
        const std::vector<std::size_t> order = ranked(result, o, options.top);
        if (order.empty()) {
            out += "  no input moves it\n";
            continue;
        }
        TextTable table;
        table.addColumn("Input", TextTable::Align::Left);
        table.addColumn("Value");
        table.addColumn("Elasticity");
        for (std::size_t k : order)
            table.addRow({inputLabel(model, result.inputs[k]), displayNumber(result.inputs[k].value),
                          displayNumber(result.elasticity(static_cast<Eigen::Index>(o), static_cast<Eigen::Index>(k)))});
        out += table.render();
        const std::size_t all = ranked(result, o, std::nullopt).size();
        if (order.size() < all) {
            out += "  (";
            out += std::to_string(all - order.size());
            out += " smaller not shown; --top N shows more)\n";
        }
    }
    if (options.prcc) out += prccText(*options.prcc, options.top, options.prccEnsemble);
    out += std::string("\n") + kDecisionSupportNotice + "\n";
    return out;
}

}  // namespace tl
