// The Ensemble page's two charts (QCustomPlot). Views: the figures come from the core
// (histogramBars in core/ensemble/ensemble_summary.h, strongestDrivers in
// core/sensitivity/strongest_drivers.h).
//   OutputHistogram  the distribution of one output over the balanced draws, with the
//                    2.5, 50 and 97.5 % percentiles as vertical lines.
//   DriversTornado   the inputs that move one output most at the point estimate: one
//                    horizontal bar per input, elasticity (% change of the output per
//                    1 % change of the input), largest at the top; a rise solid blue, a
//                    fall hatched orange (told apart by fill as well as colour).
#pragma once

#include <QString>
#include <qcustomplot.h>

#include "core/ensemble/ensemble_summary.h"
#include "core/sensitivity/strongest_drivers.h"

namespace tl::ui {

class OutputHistogram : public QCustomPlot {
    Q_OBJECT
public:
    static constexpr int kBars = 30;
    explicit OutputHistogram(QWidget* parent = nullptr);

    void showOutput(const QString& label, const tl::ensemble::HistogramBars& bars, const tl::ensemble::OutputSummary& summary);
    void showMessage(const QString& text);  // no chart: why (no run, stored run, no value)

    const tl::ensemble::HistogramBars& bars() const { return bars_; }
    QString title() const;
    QSize minimumSizeHint() const override { return {280, 200}; }

private:
    tl::ensemble::HistogramBars bars_;
    QCPTextElement* title_;
};

class DriversTornado : public QCustomPlot {
    Q_OBJECT
public:
    static constexpr int kMaxRows = 15;
    explicit DriversTornado(QWidget* parent = nullptr);

    void showDrivers(const QString& label, const tl::StrongestDrivers& drivers);
    void showMessage(const QString& text);

    const std::vector<tl::Driver>& drawn() const { return drawn_; }
    QString title() const;
    QSize minimumSizeHint() const override { return {280, 200}; }

protected:
    void resizeEvent(QResizeEvent* event) override;

private:
    void draw();  // labels elided to fit the width the chart has now

    QString label_;
    tl::StrongestDrivers drivers_;
    bool hasDrivers_ = false;
    int drawnLabelWidth_ = 0;
    int drawnRows_ = 0;
    int rowCapacity() const;  // rows that stay readable in the chart's height (at most kMaxRows)
    std::vector<tl::Driver> drawn_;
    QCPTextElement* title_;
    QCPTextElement* subtitle_;
};

}  // namespace tl::ui
