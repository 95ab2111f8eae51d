#include "ui/analysis/indicators_page.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QMenu>
#include <QPushButton>
#include <QScrollArea>
#include <QStandardItemModel>
#include <QTableView>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <qcustomplot.h>

#include "core/model/text.h"
#include "ui/style/palette.h"

namespace tl::ui {

IndicatorsPage::IndicatorsPage(QWidget* parent)
    : ResultsPage(parent), table_(new QStandardItemModel(0, ColumnCount, this)), view_(new QTableView(this)),
      plot_(new QCustomPlot(this)), status_(new QLabel(this)), notice_(new QLabel(decisionSupportNotice(), this)),
      runner_(new AnalysisRunner(this))
{
    table_->setHorizontalHeaderLabels({tr("Indicator"), tr("Value"), tr("Unit"), tr("Definition and source")});
    view_->setModel(table_);
    view_->setEditTriggers(QAbstractItemView::NoEditTriggers);
    view_->setSelectionBehavior(QAbstractItemView::SelectRows);
    view_->setAlternatingRowColors(true);
    view_->verticalHeader()->setVisible(false);
    view_->horizontalHeader()->setStretchLastSection(true);
    view_->setWordWrap(false);
    view_->verticalHeader()->setDefaultSectionSize(view_->fontMetrics().height() + 8);

    auto* copy = new QAction(tr("Copy as text"), this);
    copy->setShortcut(QKeySequence::Copy);
    copy->setShortcutContext(Qt::WidgetWithChildrenShortcut);
    connect(copy, &QAction::triggered, this, &IndicatorsPage::copyToClipboard);
    view_->addAction(copy);
    auto* copyButton = new QPushButton(tr("Copy as text"), this);
    copyButton->setToolTip(tr("Copies the indicators as tab-separated text (for a spreadsheet or a report)"));
    connect(copyButton, &QPushButton::clicked, this, &IndicatorsPage::copyToClipboard);

    notice_->setWordWrap(true);
    notice_->setStyleSheet(QStringLiteral("color: #555555;"));
    status_->setWordWrap(true);

    // One scrolling column: the whole table (catch figures just above the notice), then
    // the keystone chart at one readable row per bar; nothing gets squeezed.
    auto* content = new QWidget(this);
    auto* column = new QVBoxLayout(content);
    auto* bar = new QHBoxLayout;
    bar->addWidget(status_, 1);
    bar->addWidget(copyButton);
    column->addLayout(bar);
    column->addWidget(view_);
    column->addWidget(notice_);
    column->addSpacing(8);

    plot_->setBackground(Qt::white);
    plot_->setContextMenuPolicy(Qt::CustomContextMenu);
    plot_->plotLayout()->insertRow(0);
    plot_->plotLayout()->addElement(0, 0, new QCPTextElement(plot_, figureTitle(), QFont(font().family(), 11, QFont::Bold)));
    static_cast<QCPTextElement*>(plot_->plotLayout()->element(0, 0))->setObjectName(QStringLiteral("keystoneTitle"));
    plot_->xAxis->setLabel(tr("Keystone index  log10(ε (1 − p))  (Libralato et al. 2006); higher = larger effect for its biomass\n"
                              "ε sums the squared mixed trophic impacts on the other living compartments (detritus and "
                              "fleets left out); p is the share of living biomass"));
    plot_->yAxis->grid()->setVisible(false);
    plot_->yAxis->setSubTicks(false);
    plot_->yAxis->setTickLength(0, 0);
    plot_->legend->setVisible(true);
    // Legend in a row of its own under the axis: bars of any length stay uncovered.
    plot_->axisRect()->insetLayout()->take(plot_->legend);
    plot_->plotLayout()->addElement(2, 0, plot_->legend);
    plot_->plotLayout()->setRowStretchFactor(2, 0.001);
    plot_->legend->setFillOrder(QCPLegend::foColumnsFirst);
    plot_->legend->setBorderPen(Qt::NoPen);
    plot_->legend->setMargins(QMargins(4, 0, 4, 4));
    connect(plot_, &QWidget::customContextMenuRequested, this, [this](QPoint at) {
        QMenu menu(this);
        addFigureExportActions(menu, *this, this);
        menu.exec(plot_->mapToGlobal(at));
    });
    column->addWidget(plot_, 1);

    auto* scroll = new QScrollArea(this);
    scroll->setWidgetResizable(true);
    scroll->setFrameShape(QFrame::NoFrame);
    scroll->setWidget(content);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(scroll);

    connect(runner_, &AnalysisRunner::finished, this, &IndicatorsPage::display);
    display(nullptr);
}

IndicatorsPage::~IndicatorsPage() = default;

void IndicatorsPage::setScenario(const tl::Model& model, const tl::BalanceSheet& sheet) { runner_->start(model, sheet); }

QString IndicatorsPage::noticeText() const { return notice_->text(); }

void IndicatorsPage::display(std::shared_ptr<const ScenarioAnalysis> analysis)
{
    analysis_ = analysis && analysis->available() ? analysis : nullptr;
    rows_ = analysis_ ? indicatorRows(*analysis_) : std::vector<IndicatorRow>{};
    table_->removeRows(0, table_->rowCount());
    for (const IndicatorRow& r : rows_) {
        auto* name = new QStandardItem(r.name);
        auto* value = new QStandardItem(displayIndicatorValue(r));
        value->setData(r.value, ValueRole);
        value->setData(int(Qt::AlignRight | Qt::AlignVCenter), Qt::TextAlignmentRole);
        value->setToolTip(QString::fromStdString(formatNumber(r.value)));
        auto* unit = new QStandardItem(r.unit);
        auto* definition = new QStandardItem(r.definition);
        definition->setToolTip(r.definition);
        name->setToolTip(r.definition);
        name->setData(r.key, Qt::UserRole);
        if (r.catchFigure)
            for (QStandardItem* item : {name, value, unit, definition}) item->setData(QColor(0xf4, 0xf1, 0xe8), Qt::BackgroundRole);
        table_->appendRow({name, value, unit, definition});
    }
    view_->resizeColumnsToContents();
    // The whole table stays in view (the catch figures sit just above the notice); the
    // keystone chart below takes the rest and scrolls.
    const int tableHeight = view_->horizontalHeader()->sizeHint().height() + 2 * view_->frameWidth() + 4 +
                            view_->verticalHeader()->defaultSectionSize() * std::max(1, table_->rowCount());
    view_->setMinimumHeight(tableHeight);
    view_->setMaximumHeight(tableHeight);
    view_->horizontalHeader()->setStretchLastSection(true);
    notice_->setVisible(analysis_ != nullptr);
    status_->setText(!analysis ? tr("No scenario yet.")
                     : !analysis_ ? analysis->unavailable
                     : analysis_->balanced
                         ? tr("System indicators of the scenario's flow network; shaded rows depend on "
                              "the harvest. Hover a value for all its digits.")
                         : tr("The scenario does not balance: these figures describe its flows as they stand "
                              "(see Checks). Shaded rows depend on the harvest."));

    bars_.clear();
    leftOut_ = 0;
    if (analysis_) {
        std::vector<const KeystoneEntry*> ranked;
        for (const KeystoneEntry& k : analysis_->keystone) {
            if (std::isfinite(k.keystoneIndex)) ranked.push_back(&k);
            else ++leftOut_;
        }
        std::stable_sort(ranked.begin(), ranked.end(),
                         [](const KeystoneEntry* a, const KeystoneEntry* b) { return a->keystoneIndex > b->keystoneIndex; });
        for (std::size_t r = 0; r < ranked.size(); ++r) {
            const std::size_t node = ranked[r]->node;
            bars_.push_back({QString::fromStdString(analysis_->network.names[node]),
                             node < analysis_->kinds.size() ? analysis_->kinds[node] : CompartmentKind::Consumer,
                             ranked[r]->keystoneIndex, static_cast<double>(ranked.size() - r)});
        }
    }
    rebuildPlot();
}

void IndicatorsPage::rebuildPlot()
{
    plot_->clearPlottables();
    plot_->clearItems();
    auto ticker = QSharedPointer<QCPAxisTickerText>::create();
    double lo = 0, hi = 0;
    for (CompartmentKind kind : {CompartmentKind::Producer, CompartmentKind::Consumer, CompartmentKind::Detritus}) {
        QVector<double> keys, values;
        for (const KeystoneBar& b : bars_)
            if (b.kind == kind) {
                keys << b.position;
                values << b.keystoneIndex;
            }
        if (keys.isEmpty()) continue;
        auto* bars = new QCPBars(plot_->yAxis, plot_->xAxis);
        bars->setName(kindLabel(kind));
        bars->setBrush(kindColour(kind));
        bars->setPen(QPen(kindColour(kind).darker(130)));
        bars->setWidth(0.7);
        bars->setData(keys, values, true);
    }
    for (const KeystoneBar& b : bars_) {
        ticker->addTick(b.position, b.name);
        lo = std::min(lo, b.keystoneIndex);
        hi = std::max(hi, b.keystoneIndex);
    }
    plot_->yAxis->setTicker(ticker);
    plot_->setMinimumHeight(130 + 20 * static_cast<int>(bars_.size()));
    plot_->yAxis->setRange(0.3, bars_.size() + 0.7);
    const double pad = std::max(0.1, 0.06 * (hi - lo));
    plot_->xAxis->setRange(lo - pad, hi + pad);
    plot_->legend->setVisible(!bars_.empty());
    if (bars_.empty() || leftOut_ > 0) {
        auto* note = new QCPItemText(plot_);
        note->position->setType(QCPItemPosition::ptAxisRectRatio);
        note->position->setCoords(bars_.empty() ? 0.5 : 0.99, bars_.empty() ? 0.5 : 0.02);
        note->setPositionAlignment(bars_.empty() ? Qt::AlignCenter : (Qt::AlignRight | Qt::AlignTop));
        note->setText(bars_.empty() ? tr("No keystone index to show.")
                                    : tr("%n compartment(s) with no effect on the others left out", "", leftOut_));
        note->setFont(QFont(font().family(), 8));
    }
    plot_->replot();
}

QString IndicatorsPage::tabSeparatedText() const
{
    QString out = tr("Indicator") + '\t' + tr("Value") + '\t' + tr("Unit") + '\t' + tr("Definition and source") + '\n';
    for (const IndicatorRow& r : rows_)
        out += r.name + '\t' + (std::isfinite(r.value) ? QString::fromStdString(formatNumber(r.value)) : QString()) + '\t' +
               r.unit + '\t' + r.definition + '\n';
    if (!rows_.empty()) out += decisionSupportNotice() + '\n';
    return out;
}

void IndicatorsPage::copyToClipboard() const { QApplication::clipboard()->setText(tabSeparatedText()); }

QSize IndicatorsPage::figureSize() const { return {820, std::max(320, 130 + 22 * static_cast<int>(bars_.size()))}; }

void IndicatorsPage::renderFigure(QPaintDevice& device, QSize size, double scale)
{
    const QSize old = plot_->size();
    plot_->resize(size);
    plot_->setViewport(QRect(QPoint(0, 0), size));
    plot_->replot(QCustomPlot::rpImmediateRefresh);
    {
        QCPPainter painter(&device);
        painter.setRenderHint(QPainter::Antialiasing);
        painter.setRenderHint(QPainter::TextAntialiasing);
        painter.scale(scale, scale);
        plot_->toPainter(&painter, size.width(), size.height());
    }
    plot_->resize(old);
    plot_->setViewport(QRect(QPoint(0, 0), old));
    plot_->replot();
}

void IndicatorsPage::figureContextChanged()
{
    if (auto* heading = qobject_cast<QCPTextElement*>(plot_->plotLayout()->element(0, 0))) heading->setText(figureTitle());
    plot_->replot();
}

}  // namespace tl::ui
