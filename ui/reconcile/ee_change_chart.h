// EeChangeChart: the before/after EE chart of a reconcile report, as horizontal bar
// pairs (one row per compartment, names readable at any length) with the project's EE
// maximum as a dashed line. A large model (or a small window) would give an unreadable
// forest of bars, so the chart shows as many compartments as its height gives a
// readable row (at most kMaxRows): every one above its EE maximum before the change,
// then those whose EE moved most; its subtitle says how many were left out.
// A view: the EE values are the core's (ReconcileResult::eeBefore / eeAfter).
#pragma once

#include <QString>
#include <memory>
#include <qcustomplot.h>

#include "core/reconcile/reconcile.h"

namespace tl::ui {

class EeChangeChart : public QCustomPlot {
    Q_OBJECT
public:
    static constexpr int kMaxRows = 24;

    explicit EeChangeChart(QWidget* parent = nullptr);

    // Draws the EE of `model`'s living compartments before and after `result` (kept, so
    // that a resize can show more or fewer rows).
    void showResult(const tl::Model& model, std::shared_ptr<const tl::ReconcileResult> result);
    void clearResult();

    // The compartments drawn, top row first (tests).
    const std::vector<std::size_t>& rows() const { return rows_; }
    QString subtitle() const;

    QSize minimumSizeHint() const override { return {320, 220}; }

protected:
    void resizeEvent(QResizeEvent* event) override;

private:
    std::size_t rowCapacity() const;
    void draw();

    tl::Model model_;
    std::shared_ptr<const tl::ReconcileResult> result_;
    std::vector<std::size_t> rows_;
    std::size_t drawnCapacity_ = 0;
    QCPTextElement* subtitle_;
};

// The compartments the chart shows (at most `limit`), highest EE before first: every
// living compartment above `eeMax` before the change, then the largest changes of EE.
std::vector<std::size_t> eeChartRows(const tl::Model& model, const tl::ReconcileResult& result, double eeMax,
                                     std::size_t limit);

}  // namespace tl::ui
