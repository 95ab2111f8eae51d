// Qt-free entry point for `tledger export MODEL --scenario NAME --format svg|png|pdf
// --view level-bars|flow-map --out PATH [--dpi N]`: renders one results view of a solved
// scenario offscreen (creating an offscreen QApplication if none exists) and writes
// it atomically. Link tl_ui_results (available when the GUI is built).
#pragma once

#include <string>

namespace tl {
class Model;
struct BalanceSheet;
}  // namespace tl

namespace tl::ui {

struct CliFigureRequest {
    std::string view;    // "level-bars" or "flow-map"
    std::string format;  // "svg", "png" or "pdf"
    std::string path;
    int dpi = 300;
    int width = 0, height = 0;  // logical pixels (1/96 inch); 0 = the view's natural size
    std::string quantity = "throughput";  // level bars: throughput | biomass | production
    std::string chains = "combined";      // level bars: combined | producers | detritus
    bool logScale = false;                // level bars
    std::string scenario, project;        // named in the figure's title (empty: left out)
};

// Empty on success; otherwise one sentence saying what is wrong (unknown view or
// format, unsolvable scenario, unwritable path), suitable for exit code 2 or 1.
std::string exportFigureForCli(const tl::Model& model, const tl::BalanceSheet& sheet, const CliFigureRequest& request);

}  // namespace tl::ui
