#include "ui/ensemble/ensemble_charts.h"

#include <algorithm>
#include <cmath>

#include <QFontMetrics>

#include "ui/ensemble/ensemble_models.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {

QCPTextElement* addTitle(QCustomPlot* plot, int row, int pointSize, bool bold)
{
    plot->plotLayout()->insertRow(row);
    QFont f(plot->font().family(), pointSize, bold ? QFont::Bold : QFont::Normal);
    auto* t = new QCPTextElement(plot, QString(), f);
    plot->plotLayout()->addElement(row, 0, t);
    return t;
}

void resetPlot(QCustomPlot* plot)
{
    plot->clearPlottables();
    plot->clearItems();
}

}  // namespace

// --- histogram -----------------------------------------------------------------------

OutputHistogram::OutputHistogram(QWidget* parent) : QCustomPlot(parent)
{
    setObjectName(QStringLiteral("ensembleHistogram"));
    setBackground(Qt::white);
    title_ = addTitle(this, 0, 10, true);
    yAxis->setLabel(tr("Balanced draws"));
    // Counts: whole-number ticks only.
    auto whole = QSharedPointer<QCPAxisTickerFixed>::create();
    whole->setTickStep(1.0);
    whole->setScaleStrategy(QCPAxisTickerFixed::ssMultiples);
    yAxis->setTicker(whole);
    xAxis->grid()->setVisible(false);
}

QString OutputHistogram::title() const { return title_->text(); }

void OutputHistogram::showMessage(const QString& text)
{
    resetPlot(this);
    bars_ = {};
    title_->setText(text);
    xAxis->setLabel(QString());
    replot();
}

void OutputHistogram::showOutput(const QString& label, const tl::ensemble::HistogramBars& bars,
                                 const tl::ensemble::OutputSummary& summary)
{
    resetPlot(this);
    bars_ = bars;
    title_->setText(tr("Distribution of %1 over %2 balanced draws").arg(label).arg(summary.count));
    xAxis->setLabel(label + tr("  (lines: 2.5 %, median, 97.5 %)"));
    if (bars.counts.empty()) {
        replot();
        return;
    }
    // A single value has zero width: draw it as a bar of 1 % of its magnitude.
    const double width = bars.width > 0.0 ? bars.width : std::max(std::abs(bars.low) * 0.01, 1e-12);
    QVector<double> keys, values;
    double top = 0.0;
    for (std::size_t k = 0; k < bars.counts.size(); ++k) {
        keys << bars.low + (double(k) + 0.5) * width;
        values << double(bars.counts[k]);
        top = std::max(top, double(bars.counts[k]));
    }
    auto* b = new QCPBars(xAxis, yAxis);
    b->setWidth(width);
    b->setPen(QPen(okabe_ito::kBlue.darker(130)));
    b->setBrush(okabe_ito::kSkyBlue);
    b->setData(keys, values, true);
    const double low = bars.low, high = bars.low + width * double(bars.counts.size());
    xAxis->setRange(low - 0.02 * (high - low), high + 0.02 * (high - low));
    yAxis->setRange(0.0, top * 1.1);
    for (const auto& [value, style] : {std::pair{summary.p2_5, Qt::DashLine}, std::pair{summary.p50, Qt::SolidLine},
                                       std::pair{summary.p97_5, Qt::DashLine}}) {
        if (!value) continue;
        auto* line = new QCPItemStraightLine(this);
        line->point1->setCoords(*value, 0);
        line->point2->setCoords(*value, 1);
        line->setPen(QPen(Qt::black, 1.2, style));
    }
    replot();
}

// --- tornado -------------------------------------------------------------------------

DriversTornado::DriversTornado(QWidget* parent) : QCustomPlot(parent)
{
    setObjectName(QStringLiteral("ensembleTornado"));
    setBackground(Qt::white);
    title_ = addTitle(this, 0, 10, true);
    subtitle_ = addTitle(this, 1, 8, false);
    xAxis->setLabel(tr("Elasticity (% per 1 % of the input)"));
    yAxis->grid()->setVisible(false);
    yAxis->setSubTicks(false);
    yAxis->setTickLength(0, 0);
}

QString DriversTornado::title() const { return title_->text(); }

void DriversTornado::showMessage(const QString& text)
{
    resetPlot(this);
    hasDrivers_ = false;
    drawn_.clear();
    title_->setText(text);
    subtitle_->setText(QString());
    yAxis->setTicker(QSharedPointer<QCPAxisTickerText>::create());
    replot();
}

void DriversTornado::showDrivers(const QString& label, const tl::StrongestDrivers& drivers)
{
    label_ = label;
    drivers_ = drivers;
    hasDrivers_ = true;
    draw();
}

// Input names are long ("microzooplankton.diet:water-column detritus"): at most 45 % of
// the chart's width each, elided in the middle, so that the bars keep their room.
static int labelWidthFor(int chartWidth) { return std::max(80, chartWidth * 45 / 100); }

void DriversTornado::resizeEvent(QResizeEvent* event)
{
    QCustomPlot::resizeEvent(event);
    if (hasDrivers_ && (labelWidthFor(width()) != drawnLabelWidth_ || rowCapacity() != drawnRows_)) draw();
}

// One text line and a little air per row, after the titles and the axis (about 110 px).
int DriversTornado::rowCapacity() const
{
    const int line = QFontMetrics(yAxis->tickLabelFont()).height() + 3;
    return std::clamp((height() - 110) / line, 3, kMaxRows);
}

void DriversTornado::draw()
{
    resetPlot(this);
    drawn_ = drivers_.drivers;
    drawnRows_ = rowCapacity();
    if (drawn_.size() > std::size_t(drawnRows_)) drawn_.resize(std::size_t(drawnRows_));
    drawnLabelWidth_ = labelWidthFor(width());
    const QFontMetrics metrics(yAxis->tickLabelFont());
    title_->setText(tr("Strongest drivers of %1").arg(label_));
    const QString shown = drawn_.size() < drivers_.drivers.size()
                              ? tr("\nthe %1 strongest of %2 shown").arg(drawn_.size()).arg(drivers_.drivers.size())
                              : QString();
    subtitle_->setText(drawn_.empty() ? tr("no input moves it")
                                      : tr("elasticities at the point estimate (%1)%2")
                                            .arg(QString::fromStdString(drivers_.note), shown));
    const int n = int(drawn_.size());
    auto ticker = QSharedPointer<QCPAxisTickerText>::create();
    QVector<double> upKeys, up, downKeys, down;
    double reach = 0.0;
    for (int k = 0; k < n; ++k) {
        const tl::Driver& d = drawn_[std::size_t(k)];
        const double key = n - k;  // largest at the top
        ticker->addTick(key, metrics.elidedText(QString::fromStdString(d.input), Qt::ElideMiddle, drawnLabelWidth_));
        (d.elasticity >= 0 ? upKeys : downKeys) << key;
        (d.elasticity >= 0 ? up : down) << d.elasticity;
        reach = std::max(reach, std::abs(d.elasticity));
    }
    yAxis->setTicker(ticker);
    yAxis->setRange(0.3, n + 0.7);
    if (!(reach > 0.0)) reach = 1.0;
    xAxis->setRange(-reach * 1.1, reach * 1.1);
    auto bars = [&](const QVector<double>& keys, const QVector<double>& values, const QColor& colour, Qt::BrushStyle style) {
        auto* b = new QCPBars(yAxis, xAxis);
        b->setWidth(0.7);
        b->setPen(QPen(colour.darker(130)));
        b->setBrush(QBrush(colour, style));
        b->setData(keys, values, true);
    };
    bars(upKeys, up, okabe_ito::kBlue, Qt::SolidPattern);
    bars(downKeys, down, okabe_ito::kOrange, Qt::BDiagPattern);
    auto* zero = new QCPItemStraightLine(this);
    zero->point1->setCoords(0, 0);
    zero->point2->setCoords(0, 1);
    zero->setPen(QPen(Qt::black, 1));
    replot();
}

}  // namespace tl::ui
