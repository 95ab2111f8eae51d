// The report (core/io/html_report.h) as a PDF: Qt's rich text lays out the HTML on A4
// pages and each chart is drawn from its SVG by Qt's SVG renderer as vector paths and
// text (QPdfWriter), not as a picture. Qt-free header, so that tledger's export command
// can call it; link tl_ui_report.
#pragma once

#include <string>

namespace tl {
struct HtmlReport;
}

namespace tl::ui {

// `report` must have been made with ReportOptions::figureMarkers. Writes `path`
// atomically (a temporary file beside it, then renamed); creates an offscreen
// QGuiApplication when none exists. Empty on success, else one sentence saying why not.
std::string writeReportPdf(const tl::HtmlReport& report, const std::string& path);

}  // namespace tl::ui
