#include "ui/reconcile/ee_change_chart.h"

#include <algorithm>
#include <cmath>

#include "ui/style/palette.h"

namespace tl::ui {

std::vector<std::size_t> eeChartRows(const tl::Model& model, const tl::ReconcileResult& result, double eeMax,
                                     std::size_t limit)
{
    struct Candidate { std::size_t i; bool over; double moved; double before; };
    std::vector<Candidate> all;
    for (std::size_t i = 0; i < model.size(); ++i) {
        if (!model.compartment(i).isLiving() || i >= result.eeBefore.size() || i >= result.eeAfter.size()) continue;
        const double before = result.eeBefore[i], after = result.eeAfter[i];
        if (!std::isfinite(before) || !std::isfinite(after)) continue;
        all.push_back({i, before > eeMax, std::abs(after - before), before});
    }
    // Violations first, then by how far EE moved; a stable order for ties (model order).
    std::stable_sort(all.begin(), all.end(), [](const Candidate& a, const Candidate& b) {
        if (a.over != b.over) return a.over;
        return a.moved > b.moved;
    });
    if (all.size() > limit) all.resize(limit);
    std::stable_sort(all.begin(), all.end(), [](const Candidate& a, const Candidate& b) { return a.before > b.before; });
    std::vector<std::size_t> rows;
    for (const Candidate& c : all) rows.push_back(c.i);
    return rows;
}

EeChangeChart::EeChangeChart(QWidget* parent) : QCustomPlot(parent)
{
    setObjectName(QStringLiteral("eeChangeChart"));
    setBackground(Qt::white);
    plotLayout()->insertRow(0);
    auto* title = new QCPTextElement(this, tr("EE before and after"), QFont(font().family(), 10, QFont::Bold));
    plotLayout()->addElement(0, 0, title);
    plotLayout()->insertRow(1);
    subtitle_ = new QCPTextElement(this, QString(), QFont(font().family(), 8));
    plotLayout()->addElement(1, 0, subtitle_);
    xAxis->setLabel(tr("EE (dashed line: EE max)"));
    yAxis->grid()->setVisible(false);
    yAxis->setSubTicks(false);
    yAxis->setTickLength(0, 0);
    legend->setVisible(true);
    // The legend in a row of its own under the axis, so that it never covers a bar.
    axisRect()->insetLayout()->take(legend);
    plotLayout()->addElement(3, 0, legend);
    plotLayout()->setRowStretchFactor(3, 0.001);
    legend->setFillOrder(QCPLegend::foColumnsFirst);
    legend->setBorderPen(Qt::NoPen);
}

QString EeChangeChart::subtitle() const { return subtitle_->text(); }

void EeChangeChart::clearResult()
{
    result_.reset();
    clearPlottables();
    clearItems();
    rows_.clear();
    subtitle_->setText(QString());
    replot();
}

void EeChangeChart::showResult(const tl::Model& model, std::shared_ptr<const tl::ReconcileResult> result)
{
    model_ = model;
    result_ = std::move(result);
    draw();
}

// Rows that stay readable in the height the plot has now: one text line and a little
// air each, after the title, subtitle, axis and legend (about 150 px; measured on the
// snapshots at 1024 x 700).
std::size_t EeChangeChart::rowCapacity() const
{
    const int line = fontMetrics().height() + 3;
    return std::size_t(std::clamp((height() - 150) / line, 5, kMaxRows));
}

void EeChangeChart::resizeEvent(QResizeEvent* event)
{
    QCustomPlot::resizeEvent(event);
    if (result_ && rowCapacity() != drawnCapacity_) draw();
}

void EeChangeChart::draw()
{
    clearPlottables();
    clearItems();
    if (!result_) return;
    const tl::Model& model = model_;
    const tl::ReconcileResult& result = *result_;
    const double eeMax = model.rules.eeMax;
    std::size_t living = 0;
    for (std::size_t i = 0; i < model.size(); ++i) living += model.compartment(i).isLiving();
    drawnCapacity_ = rowCapacity();
    rows_ = eeChartRows(model, result, eeMax, drawnCapacity_);
    subtitle_->setText(rows_.size() < living
                           ? tr("%1 of %2 living compartments shown\n(over EE max first, then largest changes)")
                                 .arg(rows_.size())
                                 .arg(living)
                           : tr("every living compartment, highest EE before at the top"));

    // Row k of the chart (top = 0) sits at key n - k so that the first row is on top.
    const int n = int(rows_.size());
    auto ticker = QSharedPointer<QCPAxisTickerText>::create();
    QVector<double> keys, before, after;
    double top = eeMax;
    for (int k = 0; k < n; ++k) {
        const std::size_t i = rows_[std::size_t(k)];
        const double key = n - k;
        ticker->addTick(key, QString::fromStdString(model.compartment(i).name));
        keys << key;
        before << result.eeBefore[i];
        after << result.eeAfter[i];
        top = std::max({top, result.eeBefore[i], result.eeAfter[i]});
    }
    yAxis->setTicker(ticker);
    yAxis->setRange(0.3, n + 0.7);
    xAxis->setRange(0.0, top * 1.08);

    auto* group = new QCPBarsGroup(this);
    group->setSpacing(1);
    auto bars = [&](const QVector<double>& values, const QColor& colour, const QString& name, Qt::BrushStyle style) {
        auto* b = new QCPBars(yAxis, xAxis);
        b->setName(name);
        b->setWidth(0.38);
        b->setPen(QPen(colour.darker(130)));
        b->setBrush(QBrush(colour, style));
        b->setData(keys, values, true);
        b->setBarsGroup(group);
        return b;
    };
    // Told apart by fill (hatched vs solid) as well as by colour (Okabe-Ito).
    bars(before, okabe_ito::kOrange, tr("EE before"), Qt::BDiagPattern);
    bars(after, okabe_ito::kBlue, tr("EE after"), Qt::SolidPattern);

    auto* line = new QCPItemStraightLine(this);
    line->point1->setCoords(eeMax, 0);
    line->point2->setCoords(eeMax, 1);
    line->setPen(QPen(Qt::black, 1, Qt::DashLine));
    replot();
}

}  // namespace tl::ui
