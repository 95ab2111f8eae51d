#include "ui/results/level_bars_page.h"

#include "core/ensemble/ensemble_summary.h"

#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QMenu>
#include <QMouseEvent>
#include <QTimer>
#include <QToolTip>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <qcustomplot.h>

#include "core/balance/balance_sheet.h"
#include "core/model/model.h"
#include "ui/style/palette.h"
#include "ui/style/wrapping_row.h"

namespace tl::ui {
namespace {

constexpr double kBarHalfHeight = 0.36;

QString number(double v) { return QString::number(v, 'g', 4); }

QString percent(double v) { return std::isfinite(v) ? QString::number(100.0 * v, 'f', 1) + " %" : QStringLiteral("–"); }

// The lighter of the two alternating shades of a kind's colour: 40 % towards white.
QColor tint(const QColor& c)
{
    return QColor::fromRgbF(c.redF() + (1 - c.redF()) * 0.4f, c.greenF() + (1 - c.greenF()) * 0.4f,
                            c.blueF() + (1 - c.blueF()) * 0.4f);
}

// `text` broken at spaces into lines no wider than `width` pixels (its own line breaks
// kept): the chart's titles follow the window instead of setting its minimum width.
QString wrapped(const QString& text, const QFont& font, int width)
{
    const QFontMetricsF fm(font);
    QStringList lines;
    for (const QString& paragraph : text.split(QLatin1Char('\n'))) {
        QString line;
        for (const QString& word : paragraph.split(QLatin1Char(' '))) {
            const QString candidate = line.isEmpty() ? word : line + QLatin1Char(' ') + word;
            if (!line.isEmpty() && fm.horizontalAdvance(candidate) > width) {
                lines << line;
                line = word;
            } else {
                line = candidate;
            }
        }
        lines << line;
    }
    return lines.join(QLatin1Char('\n'));
}

bool darkText(const QColor& c) { return 0.299 * c.redF() + 0.587 * c.greenF() + 0.114 * c.blueF() > 0.55; }

// A round length (1, 2 or 5 x 10^k) close to a quarter of `span`, for the scale bar.
double niceLength(double span)
{
    if (!(span > 0)) return 1.0;
    const double raw = span / 4;
    const double decade = std::pow(10.0, std::floor(std::log10(raw)));
    for (double m : {1.0, 2.0, 5.0})
        if (m * decade >= raw * 0.7) return m * decade;
    return 10 * decade;
}

}  // namespace

QString romanNumeral(int level)
{
    if (level <= 0 || level >= 4000) return QString::number(level);
    static const std::pair<int, const char*> table[] = {{1000, "M"}, {900, "CM"}, {500, "D"}, {400, "CD"},
                                                        {100, "C"},  {90, "XC"},  {50, "L"},  {40, "XL"},
                                                        {10, "X"},   {9, "IX"},   {5, "V"},   {4, "IV"}, {1, "I"}};
    QString out;
    for (auto [value, text] : table)
        while (level >= value) {
            out += text;
            level -= value;
        }
    return out;
}

LevelBarsPage::LevelBarsPage(QWidget* parent)
    : ResultsPage(parent), plot_(new QCustomPlot(this)), quantityCombo_(new QComboBox(this)),
      chainsCombo_(new QComboBox(this)), scaleCombo_(new QComboBox(this)), cyclesCombo_(new QComboBox(this))
{
    quantityCombo_->addItems({tr("Throughput"), tr("Biomass"), tr("Production")});
    chainsCombo_->addItems({tr("All food chains"), tr("Chains from producers"), tr("Chains from detritus")});
    scaleCombo_->addItems({tr("Linear"), tr("Logarithmic")});
    cyclesCombo_->addItems({tr("Cycles removed"), tr("Cycles kept")});
    cyclesCombo_->setToolTip(tr("The aggregation into integer levels removes feeding cycles first (cycle analysis, "
                                "Ulanowicz 1983, 1995). Keeping them follows every chain round its loops."));

    auto* controls = new WrappingRow;  // continues on a second line in a narrow window
    auto labelled = [this, controls](const QString& text, QComboBox* combo) {  // a label stays with its box
        auto* pair = new QWidget(this);
        auto* row = new QHBoxLayout(pair);
        row->setContentsMargins(0, 0, 0, 0);
        row->addWidget(new QLabel(text, pair));
        row->addWidget(combo);
        controls->addWidget(pair);
    };
    labelled(tr("Show"), quantityCombo_);
    labelled(tr("of"), chainsCombo_);
    labelled(tr("Bar length"), scaleCombo_);
    labelled(tr("Feeding"), cyclesCombo_);
    for (QComboBox* combo : {quantityCombo_, chainsCombo_, scaleCombo_, cyclesCombo_}) {  // may shrink on small screens
        combo->setSizeAdjustPolicy(QComboBox::AdjustToMinimumContentsLengthWithIcon);
        combo->setMinimumContentsLength(combo == cyclesCombo_ ? 14 : 8);
    }
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(controls);
    layout->addWidget(plot_, 1);

    plot_->setBackground(Qt::white);
    plot_->plotLayout()->insertRow(0);
    auto* heading = new QCPTextElement(plot_, QString(), QFont(font().family(), 12, QFont::Bold));
    plot_->plotLayout()->addElement(0, 0, heading);
    plot_->plotLayout()->insertRow(1);
    auto* subheading = new QCPTextElement(plot_, QString(), QFont(font().family(), 9));
    subheading->setMargins(QMargins(4, 0, 4, 10));
    plot_->plotLayout()->addElement(1, 0, subheading);
    for (QCPTextElement* text : {heading, subheading}) text->setMinimumSize(QSize(160, 0));  // wrapped in rebuild()
    auto* notice = new QCPTextElement(plot_, decisionSupportNotice(), QFont(font().family(), 8));
    notice->setTextColor(QColor(0x55, 0x55, 0x55));
    notice->setMargins(QMargins(4, 6, 4, 4));
    notice->setMinimumSize(QSize(160, 0));  // wrapped in rebuild()
    plot_->plotLayout()->addElement(3, 0, notice);
    plot_->xAxis->setTicks(false);
    plot_->xAxis->setTickLabels(false);
    plot_->xAxis->grid()->setVisible(false);
    plot_->yAxis->grid()->setVisible(false);
    plot_->yAxis->setLabel(tr("Trophic level"));
    plot_->yAxis->setSubTicks(false);
    // Legend in a row of its own under the bars (never over the values at their right).
    plot_->axisRect()->insetLayout()->take(plot_->legend);
    plot_->plotLayout()->insertRow(3);
    plot_->plotLayout()->addElement(3, 0, plot_->legend);
    plot_->plotLayout()->setRowStretchFactor(3, 0.001);
    plot_->legend->setFillOrder(QCPLegend::foColumnsFirst);
    plot_->legend->setBorderPen(Qt::NoPen);
    plot_->legend->setMargins(QMargins(4, 2, 4, 2));
    plot_->axisRect()->setMinimumMargins(QMargins(10, 10, 24, 10));
    plot_->setContextMenuPolicy(Qt::CustomContextMenu);

    connect(quantityCombo_, &QComboBox::currentIndexChanged, this,
            [this](int i) { setQuantity(static_cast<LevelQuantity>(i)); });
    connect(chainsCombo_, &QComboBox::currentIndexChanged, this, [this](int i) { setChains(static_cast<LevelChains>(i)); });
    connect(scaleCombo_, &QComboBox::currentIndexChanged, this, [this](int i) { setLogScale(i == 1); });
    connect(cyclesCombo_, &QComboBox::currentIndexChanged, this, [this](int i) {
        cycles_ = i == 1 ? FeedingCycles::Kept : FeedingCycles::Removed;
        if (network_) decomposition_ = std::make_unique<LevelDecomposition>(decomposeLevels(*network_, 30, cycles_));
        scheduleRebuild();
    });
    connect(plot_, &QCustomPlot::mouseMove, this, &LevelBarsPage::onMouseMove);
    connect(plot_, &QWidget::customContextMenuRequested, this, [this](QPoint at) {
        QMenu menu(this);
        addFigureExportActions(menu, *this, this);
        menu.exec(plot_->mapToGlobal(at));
    });
}

LevelBarsPage::~LevelBarsPage() = default;

void LevelBarsPage::setEnsembleBands(std::shared_ptr<const tl::ensemble::EnsembleSummary> summary, const QString& origin)
{
    ensemble_ = std::move(summary);
    ensembleOrigin_ = origin;
    scheduleRebuild();
}

// The ensemble's TE of level k is "system.te_<roman k>" (core/ensemble/ensemble.h), of the
// combined chains with feeding cycles removed: only that view gets the band.
QString LevelBarsPage::teBandText(int level) const
{
    if (!ensemble_ || chains_ != LevelChains::Combined || cycles_ != tl::FeedingCycles::Removed) return {};
    const std::string name = level == 0 ? std::string("system.mean_te") : "system.te_" + romanNumeral(level).toStdString();
    const tl::ensemble::OutputSummary* o = ensemble_->find(name);
    if (!o || !o->p2_5 || !o->p97_5) return {};
    return tr("95 %: %1–%2").arg(percent(*o->p2_5), percent(*o->p97_5));
}

void LevelBarsPage::setScenario(const tl::Model& model, const tl::BalanceSheet& sheet)
{
    biomassUnit_ = QString::fromStdString(model.units.biomass());
    flowUnit_ = QString::fromStdString(model.units.flow());
    kinds_.clear();
    for (const auto& c : model.compartments()) kinds_.push_back(c.kind);
    network_.reset();
    decomposition_.reset();
    unavailable_.clear();
    if (sheet.status == BalanceStatus::Invalid || sheet.rows.size() != model.size()) {
        unavailable_ = tr("The scenario could not be solved, so it has no trophic levels to show. "
                          "See the balance sheet for the problems.");
    } else {
        network_ = std::make_unique<FlowNetwork>(buildFlowNetwork(model, sheet));
        decomposition_ = std::make_unique<LevelDecomposition>(decomposeLevels(*network_, 30, cycles_));
        if (decomposition_->levelCount() == 0) unavailable_ = tr("The food web has no flows to decompose.");
    }
    scheduleRebuild();
}

void LevelBarsPage::setQuantity(LevelQuantity q)
{
    quantity_ = q;
    if (quantityCombo_->currentIndex() != static_cast<int>(q)) quantityCombo_->setCurrentIndex(static_cast<int>(q));
    scheduleRebuild();
}

void LevelBarsPage::setChains(LevelChains c)
{
    chains_ = c;
    if (chainsCombo_->currentIndex() != static_cast<int>(c)) chainsCombo_->setCurrentIndex(static_cast<int>(c));
    scheduleRebuild();
}

void LevelBarsPage::setLogScale(bool on)
{
    log_ = on;
    if (scaleCombo_->currentIndex() != (on ? 1 : 0)) scaleCombo_->setCurrentIndex(on ? 1 : 0);
    scheduleRebuild();
}

// The data follow at once (tests and export read them); the drawing waits until shown.
void LevelBarsPage::scheduleRebuild()
{
    data_ = (network_ && decomposition_ && unavailable_.isEmpty())
                ? levelBarsData(*network_, *decomposition_, quantity_, chains_)
                : LevelBarsData{};
    if (isVisible()) {
        if (!dirty_) QTimer::singleShot(0, this, [this] { if (dirty_) rebuild(); });
        dirty_ = true;
    } else {
        dirty_ = true;
    }
}

void LevelBarsPage::showEvent(QShowEvent* event)
{
    ResultsPage::showEvent(event);
    if (dirty_) rebuild();
}

void LevelBarsPage::resizeEvent(QResizeEvent* event)
{
    ResultsPage::resizeEvent(event);
    if (isVisible()) QTimer::singleShot(0, this, [this] { rebuild(); });
}

QString LevelBarsPage::quantityLabel() const
{
    switch (quantity_) {
    case LevelQuantity::Throughput: return tr("Throughput");
    case LevelQuantity::Biomass: return tr("Biomass");
    case LevelQuantity::Production: return tr("Production");
    }
    return {};
}

QString LevelBarsPage::unitLabel() const { return quantity_ == LevelQuantity::Biomass ? biomassUnit_ : flowUnit_; }

QString LevelBarsPage::figureTitle() const
{
    static const char* chains[] = {"all food chains", "chains from producers", "chains from detritus"};
    return titled(tr("%1 by trophic level, %2").arg(quantityLabel(), tr(chains[static_cast<int>(chains_)])));
}

void LevelBarsPage::rebuild()
{
    dirty_ = false;
    drawn_.clear();
    labels_.clear();
    plot_->clearItems();
    plot_->clearPlottables();
    auto* heading = qobject_cast<QCPTextElement*>(plot_->plotLayout()->element(0, 0));
    auto* subheading = qobject_cast<QCPTextElement*>(plot_->plotLayout()->element(1, 0));
    const int textWidth = std::max(160, plot_->width() - 24);
    heading->setText(wrapped(figureTitle(), heading->font(), textWidth));
    if (auto* notice = qobject_cast<QCPTextElement*>(plot_->plotLayout()->element(4, 0)))
        notice->setText(wrapped(decisionSupportNotice(), notice->font(), textWidth));

    if (data_.stacks.empty()) {
        subheading->setText(QString());
        plot_->legend->setVisible(false);
        auto* message = new QCPItemText(plot_);
        message->position->setType(QCPItemPosition::ptAxisRectRatio);
        message->position->setCoords(0.5, 0.5);
        message->setText(unavailable_.isEmpty() ? tr("Nothing to show.") : unavailable_);
        message->setFont(QFont(font().family(), 10));
        plot_->xAxis->setLabel(QString());
        plot_->replot();
        return;
    }

    QString sub = tr("Mean transfer efficiency, levels II–IV (geometric mean): %1").arg(percent(data_.meanTe));
    if (const QString band = teBandText(0); !band.isEmpty())
        sub += tr(" (%1 of the balanced draws of the %2)").arg(band, ensembleOrigin_);
    if (data_.droppedLevels == 1)
        sub += tr("  ·  1 higher level below 0.01 % of the largest not drawn");
    else if (data_.droppedLevels > 1)
        sub += tr("  ·  %1 higher levels below 0.01 % of the largest not drawn").arg(data_.droppedLevels);
    // Level I mixes producers and detritus: no transfer efficiency, the eaten shares instead.
    sub += QLatin1Char('\n') + tr("Level I has no transfer efficiency: consumers eat %1 of primary production and %2 of "
                                   "detritus inflow")
                                    .arg(percent(data_.primaryProductionConsumed), percent(data_.detritusInflowConsumed));
    subheading->setText(wrapped(sub, subheading->font(), textWidth));

    // Bar lengths: the total (linear) or log10(total / floor), floor a decade below the smallest.
    double minPositive = 0, maxTotal = 0;
    for (const auto& s : data_.stacks)
        if (s.total > 0) {
            minPositive = minPositive > 0 ? std::min(minPositive, s.total) : s.total;
            maxTotal = std::max(maxTotal, s.total);
        }
    const double floorLog = minPositive > 0 ? std::floor(std::log10(minPositive)) - 1.0 : 0.0;
    auto lengthOf = [&](double total) {
        if (!(total > 0)) return 0.0;
        return log_ ? std::log10(total) - floorLog : total;
    };
    double maxLength = 0;
    for (const auto& s : data_.stacks) maxLength = std::max(maxLength, lengthOf(s.total));
    if (!(maxLength > 0)) maxLength = 1;

    const int levels = static_cast<int>(data_.stacks.size());
    plot_->xAxis->setRange(-maxLength * 0.95, maxLength * 0.95);  // bars fill the middle, labels the sides
    plot_->yAxis->setRange(-0.05, levels + 0.55);
    auto ticker = QSharedPointer<QCPAxisTickerText>::create();
    for (const auto& s : data_.stacks) ticker->addTick(s.level, romanNumeral(s.level));
    plot_->yAxis->setTicker(ticker);
    plot_->xAxis->setLabel(log_ ? tr("Bar length: log10 of %1 (%2) above 1e%3; segments split each bar by share")
                                       .arg(quantityLabel().toLower(), unitLabel()).arg(floorLog)
                                : tr("Bar length: %1 (%2), linear; bars centred").arg(quantityLabel().toLower(), unitLabel()));

    // Legend: one entry per kind present (colour plus name; segments also carry labels).
    plot_->legend->setVisible(true);
    std::vector<bool> kindShown(3, false);
    for (const auto& s : data_.stacks)
        for (const auto& seg : s.segments)
            if (seg.node < kinds_.size()) kindShown[static_cast<int>(kinds_[seg.node])] = true;
    for (auto k : {CompartmentKind::Producer, CompartmentKind::Consumer, CompartmentKind::Detritus}) {
        if (!kindShown[static_cast<int>(k)]) continue;
        auto* entry = new QCPBars(plot_->yAxis, plot_->xAxis);
        entry->setName(kindLabel(k));
        entry->setBrush(kindColour(k));
        entry->setPen(QPen(Qt::white));
    }

    for (const auto& s : data_.stacks) {
        const double length = lengthOf(s.total);
        double x = -length / 2;
        int index = 0;
        for (const auto& seg : s.segments) {
            const double w = log_ ? length * seg.share : seg.value;
            const CompartmentKind kind = seg.node < kinds_.size() ? kinds_[seg.node] : CompartmentKind::Consumer;
            const bool tinted = index++ % 2 == 1;
            const QColor fill = tinted ? tint(kindColour(kind)) : kindColour(kind);
            auto* rect = new QCPItemRect(plot_);
            rect->topLeft->setCoords(x, s.level + kBarHalfHeight);
            rect->bottomRight->setCoords(x + w, s.level - kBarHalfHeight);
            rect->setPen(QPen(Qt::white, 1.0));
            rect->setBrush(fill);
            drawn_.push_back({x, x + w, s.level - kBarHalfHeight, s.level + kBarHalfHeight, seg.node, seg.value, seg.share,
                              s.level, tinted});
            x += w;
        }
        auto* total = new QCPItemText(plot_);
        total->position->setCoords(length / 2 + maxLength * 0.015, s.level);
        total->setPositionAlignment(Qt::AlignLeft | Qt::AlignVCenter);
        total->setText(number(s.total) + " " + unitLabel());
        total->setFont(QFont(font().family(), 9));
    }
    // Transfer efficiency of level k, written left of the gap between bars k and k+1.
    for (int k = 1; k + 1 < levels; ++k) {  // from level II (level I: see the subheading)
        const auto& s = data_.stacks[static_cast<std::size_t>(k)];
        const double left = -std::max(lengthOf(s.total), lengthOf(data_.stacks[static_cast<std::size_t>(k + 1)].total)) / 2;
        auto* te = new QCPItemText(plot_);
        te->position->setCoords(left - maxLength * 0.02, s.level + 0.5);
        te->setPositionAlignment(Qt::AlignRight | Qt::AlignVCenter);
        const QString band = teBandText(s.level);
        te->setText(tr("TE %1→%2: %3").arg(romanNumeral(s.level), romanNumeral(s.level + 1), percent(s.te)) +
                    (band.isEmpty() ? QString() : QStringLiteral("\n(") + band + QLatin1Char(')')));
        te->setFont(QFont(font().family(), 9, QFont::DemiBold));
        te->setColor(QColor(0x33, 0x33, 0x33));
    }
    // Scale bar for the bar length.
    const double scale = log_ ? 1.0 : niceLength(maxLength);
    const double sx = -maxLength * 0.90, sy = 0.18;
    auto* bar = new QCPItemLine(plot_);
    bar->start->setCoords(sx, sy);
    bar->end->setCoords(sx + scale, sy);
    bar->setPen(QPen(Qt::black, 1.5));
    bar->setHead(QCPLineEnding::esBar);
    bar->setTail(QCPLineEnding::esBar);
    auto* barText = new QCPItemText(plot_);
    barText->position->setCoords(sx, sy + 0.08);
    barText->setPositionAlignment(Qt::AlignLeft | Qt::AlignBottom);
    barText->setText(log_ ? tr("one decade (×10)") : number(scale) + " " + unitLabel());
    barText->setFont(QFont(font().family(), 8));

    plot_->replot(QCustomPlot::rpImmediateRefresh);  // lays out the axis rect for coordToPixel
    addSegmentLabels();
    plot_->replot();
}

std::vector<QRectF> LevelBarsPage::segmentPixelRects() const
{
    std::vector<QRectF> out;
    for (const auto& d : drawn_)
        out.push_back(QRectF(QPointF(plot_->xAxis->coordToPixel(d.left), plot_->yAxis->coordToPixel(d.top)),
                             QPointF(plot_->xAxis->coordToPixel(d.right), plot_->yAxis->coordToPixel(d.bottom)))
                          .normalized());
    return out;
}

// Names inside segments wide enough to hold them; a narrower segment gets its name just
// above its bar (under it for the lowest bar) when that room is inside the chart and
// clear of bars, other names and the value and TE texts.
void LevelBarsPage::addSegmentLabels()
{
    labels_.clear();
    const QFont labelFont(font().family(), 8);
    const QFontMetricsF fm(labelFont);
    const std::vector<QRectF> bars = segmentPixelRects();
    std::vector<QRectF> taken;  // texts already on the chart
    for (int i = 0; i < plot_->itemCount(); ++i)
        if (auto* text = qobject_cast<QCPItemText*>(plot_->item(i))) {
            const QPointF at = text->position->pixelPosition();
            QRectF r = QFontMetricsF(text->font()).boundingRect(QRectF(), Qt::TextDontClip, text->text());
            const Qt::Alignment a = text->positionAlignment();
            const double x = a & Qt::AlignLeft ? at.x() : a & Qt::AlignRight ? at.x() - r.width() : at.x() - r.width() / 2;
            const double y = a & Qt::AlignTop ? at.y() : a & Qt::AlignBottom ? at.y() - r.height() : at.y() - r.height() / 2;
            taken.push_back(QRectF(x, y, r.width(), r.height()));
        }
    const QRectF chart = plot_->axisRect()->rect();
    auto clear = [&](const QRectF& r) {
        if (!chart.contains(r)) return false;
        for (const QRectF& b : bars)
            if (b.intersects(r)) return false;
        for (const QRectF& t : taken)
            if (t.intersects(r)) return false;
        return true;
    };
    for (std::size_t k = 0; k < drawn_.size(); ++k) {
        const auto& d = drawn_[k];
        if (!network_ || d.node >= network_->names.size()) continue;
        const QRectF bar = bars[k];
        const QString name = QString::fromStdString(network_->names[d.node]);
        const double width = fm.horizontalAdvance(name), height = fm.height();
        const CompartmentKind kind = d.node < kinds_.size() ? kinds_[d.node] : CompartmentKind::Consumer;
        auto* label = new QCPItemText(plot_);
        label->setText(name);
        label->setFont(labelFont);
        label->position->setType(QCPItemPosition::ptAbsolute);
        if (width + 6 <= bar.width() && height + 2 <= bar.height()) {
            const QColor fill = d.tinted ? tint(kindColour(kind)) : kindColour(kind);
            label->setColor(darkText(fill) ? Qt::black : Qt::white);
            label->position->setCoords(bar.center());
            labels_.push_back({name, false, QRectF(bar.center() - QPointF(width / 2, height / 2), QSizeF(width, height)), k});
            taken.push_back(labels_.back().pixels);
            continue;
        }
        const QRectF above(bar.center().x() - width / 2, bar.top() - 2 - height, width, height);
        const QRectF below(bar.center().x() - width / 2, bar.bottom() + 2, width, height);
        // Below only under the lowest bar: a name in the gap between two bars belongs to the
        // bar beneath it, never to the one above.
        const bool lowest = d.level == data_.stacks.front().level;
        const QRectF* place = clear(above) ? &above : lowest && clear(below) ? &below : nullptr;
        if (!place) {
            plot_->removeItem(label);
            continue;
        }
        label->setColor(QColor(0x33, 0x33, 0x33));
        label->position->setCoords(place->center());
        labels_.push_back({name, true, *place, k});
        taken.push_back(*place);
    }
}

QString LevelBarsPage::segmentToolTip(double x, double level) const
{
    for (const auto& d : drawn_) {
        if (x < d.left || x > d.right || level < d.bottom || level > d.top) continue;
        const QString name = network_ && d.node < network_->names.size() ? QString::fromStdString(network_->names[d.node])
                                                                        : QString::number(d.node);
        return tr("<b>%1</b> at level %2<br>%3: %4 %5<br>%6 of the level").arg(name.toHtmlEscaped(),
                                                                           romanNumeral(d.level), quantityLabel(),
                                                                           number(d.value), unitLabel(), percent(d.share));
    }
    return {};
}

void LevelBarsPage::onMouseMove(QMouseEvent* event)
{
    const QPointF p = event->position();
    const QString tip = segmentToolTip(plot_->xAxis->pixelToCoord(p.x()), plot_->yAxis->pixelToCoord(p.y()));
    if (tip.isEmpty())
        QToolTip::hideText();
    else
        QToolTip::showText(event->globalPosition().toPoint(), tip, plot_);
}

void LevelBarsPage::renderFigure(QPaintDevice& device, QSize size, double scale)
{
    // Lay out at the figure size (a hidden widget gets no resize event, so set the
    // viewport directly), draw, then go back to the on-screen layout.
    const QSize old = plot_->size();
    plot_->resize(size);
    plot_->setViewport(QRect(QPoint(0, 0), size));
    rebuild();
    {
        QCPPainter painter(&device);
        painter.setRenderHint(QPainter::Antialiasing);
        painter.setRenderHint(QPainter::TextAntialiasing);
        painter.scale(scale, scale);
        plot_->toPainter(&painter, size.width(), size.height());
    }
    plot_->resize(old);
    plot_->setViewport(QRect(QPoint(0, 0), old));
    rebuild();
}

}  // namespace tl::ui
