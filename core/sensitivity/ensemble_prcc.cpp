// PRCC over an ensemble's kept draws; why a share per diet row is left out: see the header.
#include "core/sensitivity/ensemble_prcc.h"

#include <algorithm>

namespace tl {

EnsemblePrcc prccOfKeptDraws(const ensemble::KeptDraws& kept, const std::vector<std::string>& outputs)
{
    EnsemblePrcc result;
    std::vector<char> keep(kept.inputNames.size(), 1);
    for (const auto& [first, count] : kept.dietColumns) {
        if (count == 0 || first + count > keep.size()) continue;
        keep[first + count - 1] = 0;
        result.leftOut.push_back(kept.inputNames[first + count - 1]);
    }
    std::vector<Eigen::Index> inputColumns;
    std::vector<std::string> inputNames;
    for (std::size_t k = 0; k < keep.size(); ++k)
        if (keep[k]) {
            inputColumns.push_back(static_cast<Eigen::Index>(k));
            inputNames.push_back(kept.inputNames[k]);
        }
    std::vector<Eigen::Index> outputColumns;
    std::vector<std::string> outputNames;
    auto addOutput = [&](const std::string& name) {
        const auto at = std::find(kept.outputNames.begin(), kept.outputNames.end(), name);
        if (at == kept.outputNames.end()) return;
        outputColumns.push_back(at - kept.outputNames.begin());
        outputNames.push_back(name);
    };
    if (outputs.empty())
        for (const std::string& n : kept.outputNames) addOutput(n);
    else
        for (const std::string& n : outputs) addOutput(n);

    const Eigen::Index rows = kept.inputs.rows();
    Eigen::MatrixXd x(rows, static_cast<Eigen::Index>(inputColumns.size()));
    for (std::size_t c = 0; c < inputColumns.size(); ++c) x.col(static_cast<Eigen::Index>(c)) = kept.inputs.col(inputColumns[c]);
    Eigen::MatrixXd y(rows, static_cast<Eigen::Index>(outputColumns.size()));
    for (std::size_t c = 0; c < outputColumns.size(); ++c) y.col(static_cast<Eigen::Index>(c)) = kept.outputs.col(outputColumns[c]);
    result.table = prccTable(inputNames, x, outputNames, y);
    return result;
}

}  // namespace tl
