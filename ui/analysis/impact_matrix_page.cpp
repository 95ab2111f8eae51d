#include "ui/analysis/impact_matrix_page.h"

#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLinearGradient>
#include <QMenu>
#include <QPainter>
#include <QStyledItemDelegate>
#include <QTableView>
#include <QVBoxLayout>
#include <cmath>

#include "core/balance/balance_sheet.h"
#include "ui/analysis/impact_colour_map.h"
#include "ui/style/palette.h"

namespace tl::ui {
namespace {

constexpr int kCell = 44;  // figure cell width and on-screen column width, logical pixels

// Draws a rule above the first fleet row and left of the first fleet column, so that
// fleets read as a block apart from the compartments.
class ImpactCellDelegate : public QStyledItemDelegate {
public:
    ImpactCellDelegate(ImpactMatrixModel* model, QObject* parent) : QStyledItemDelegate(parent), model_(model) {}
    void paint(QPainter* painter, const QStyleOptionViewItem& option, const QModelIndex& index) const override
    {
        QStyledItemDelegate::paint(painter, option, index);
        const int fleetRow = model_->firstFleetRow();
        const int fleetColumn = fleetRow;  // columns keep matrix order: fleets start at nodeCount
        painter->save();
        painter->setPen(QPen(QColor(0x33, 0x33, 0x33), 2));
        if (fleetRow >= 0 && index.row() == fleetRow) painter->drawLine(option.rect.topLeft(), option.rect.topRight());
        if (fleetColumn >= 0 && index.column() == fleetColumn)
            painter->drawLine(option.rect.topLeft(), option.rect.bottomLeft());
        painter->restore();
    }

private:
    ImpactMatrixModel* model_;
};

// Column header written bottom-to-top so that a matrix of long names stays narrow.
class UprightHeader : public QHeaderView {
public:
    explicit UprightHeader(QWidget* parent) : QHeaderView(Qt::Horizontal, parent) { setSectionsClickable(false); }

protected:
    QSize sectionSizeFromContents(int section) const override
    {
        const QString text = model() ? model()->headerData(section, Qt::Horizontal).toString() : QString();
        QFont f = font();
        f.setItalic(model() && model()->headerData(section, Qt::Horizontal, Qt::FontRole).value<QFont>().italic());
        return {fontMetrics().height() + 8, std::min(220, QFontMetrics(f).horizontalAdvance(text) + 26)};
    }
    void paintSection(QPainter* painter, const QRect& rect, int section) const override
    {
        if (!model()) return;
        painter->save();
        painter->fillRect(rect, palette().window());
        painter->setPen(palette().mid().color());
        painter->drawLine(rect.topRight(), rect.bottomRight());
        painter->drawLine(rect.bottomLeft(), rect.bottomRight());
        const QVariant fontData = model()->headerData(section, Qt::Horizontal, Qt::FontRole);
        if (fontData.isValid()) painter->setFont(fontData.value<QFont>());
        const QIcon icon = model()->headerData(section, Qt::Horizontal, Qt::DecorationRole).value<QIcon>();
        const QString text = model()->headerData(section, Qt::Horizontal).toString();
        painter->translate(rect.left() + rect.width() / 2.0, rect.bottom() - 4);
        painter->rotate(-90);
        if (!icon.isNull()) icon.paint(painter, QRect(0, -5, 10, 10));
        painter->setPen(palette().windowText().color());
        const QFontMetrics fm(painter->font());
        painter->drawText(QRectF(14, -fm.height() / 2.0, rect.height() - 20, fm.height()), Qt::AlignLeft | Qt::AlignVCenter,
                          fm.elidedText(text, Qt::ElideRight, rect.height() - 20));
        painter->restore();
    }
};

QString rangeText(double range) { return QString::number(range, 'f', 2); }

}  // namespace

void ImpactLegend::setRange(double range)
{
    range_ = range;
    update();
}

void ImpactLegend::paintEvent(QPaintEvent*)
{
    QPainter painter(this);
    paintLegend(painter, QRectF(rect()).adjusted(2, 2, -2, -2), range_, font());
}

void ImpactLegend::paintLegend(QPainter& painter, const QRectF& area, double range, const QFont& font)
{
    painter.save();
    painter.setFont(font);
    const QFontMetricsF fm(font);
    const QString neg = tr("negative impact"), pos = tr("positive impact");
    const double side = std::max(fm.horizontalAdvance(neg), fm.horizontalAdvance(pos)) + 10;
    const QRectF bar(area.left() + side, area.top() + 2, std::max(40.0, area.width() - 2 * side), area.height() * 0.42);
    QLinearGradient gradient(bar.topLeft(), bar.topRight());
    for (int k = 0; k <= 20; ++k) {
        const double t = k / 20.0;
        gradient.setColorAt(t, impactColour((2 * t - 1) * std::max(range, 1.0), std::max(range, 1.0)));
    }
    painter.fillRect(bar, gradient);
    painter.setPen(QColor(0x66, 0x66, 0x66));
    painter.drawRect(bar);
    painter.setPen(Qt::black);
    painter.drawText(QRectF(area.left(), bar.top(), side - 6, bar.height()), Qt::AlignRight | Qt::AlignVCenter, neg);
    painter.drawText(QRectF(bar.right() + 6, bar.top(), side, bar.height()), Qt::AlignLeft | Qt::AlignVCenter, pos);
    const double tickTop = bar.bottom() + 1, tickHeight = std::max(fm.height(), area.bottom() - bar.bottom());
    const auto tick = [&](double x, const QString& text) {
        painter.drawText(QRectF(x - 40, tickTop, 80, tickHeight), Qt::AlignHCenter | Qt::AlignTop, text);
    };
    tick(bar.left(), QStringLiteral("−") + rangeText(range));
    tick(bar.center().x(), QStringLiteral("0"));
    tick(bar.right(), QStringLiteral("+") + rangeText(range));
    painter.restore();
}

ImpactMatrixPage::ImpactMatrixPage(QWidget* parent)
    : ResultsPage(parent), model_(new ImpactMatrixModel(this)), view_(new QTableView(this)),
      orderCombo_(new QComboBox(this)), legend_(new ImpactLegend(this)), status_(new QLabel(this)),
      runner_(new AnalysisRunner(this))
{
    orderCombo_->addItems({tr("Model order"), tr("Name"), tr("Keystone index, highest first"),
                           tr("Overall effect, largest first")});
    auto* controls = new QHBoxLayout;
    controls->addWidget(new QLabel(tr("Order rows by"), this));
    controls->addWidget(orderCombo_);
    controls->addSpacing(24);
    controls->addWidget(legend_, 1);
    controls->addStretch(0);

    status_->setWordWrap(true);
    view_->setModel(model_);
    view_->setHorizontalHeader(new UprightHeader(view_));
    view_->setItemDelegate(new ImpactCellDelegate(model_, view_));
    view_->horizontalHeader()->setSectionResizeMode(QHeaderView::Fixed);
    view_->horizontalHeader()->setDefaultSectionSize(kCell);
    view_->verticalHeader()->setSectionResizeMode(QHeaderView::Fixed);
    view_->verticalHeader()->setDefaultSectionSize(24);
    view_->setSelectionMode(QAbstractItemView::NoSelection);  // a highlight would hide the colours
    view_->setFocusPolicy(Qt::NoFocus);
    view_->setShowGrid(true);
    view_->setGridStyle(Qt::DotLine);
    view_->setContextMenuPolicy(Qt::CustomContextMenu);
    view_->setWordWrap(false);

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(controls);
    layout->addWidget(status_);
    layout->addWidget(view_, 1);
    auto* notice = new QLabel(decisionSupportNotice(), this);
    notice->setWordWrap(true);
    notice->setStyleSheet(QStringLiteral("color: #555555;"));
    layout->addWidget(notice);

    connect(orderCombo_, &QComboBox::currentIndexChanged, this,
            [this](int i) { setRowOrder(static_cast<ImpactRowOrder>(i)); });
    connect(runner_, &AnalysisRunner::finished, this, &ImpactMatrixPage::display);
    connect(view_, &QTableView::customContextMenuRequested, this, [this](QPoint at) {
        QMenu menu(this);
        addFigureExportActions(menu, *this, this);
        menu.exec(view_->viewport()->mapToGlobal(at));
    });
    connect(view_->verticalHeader(), &QHeaderView::sectionDoubleClicked, this, [this](int row) {
        const std::size_t i = model_->matrixRow(row);
        if (!model_->isFleet(i)) emit compartmentActivated(model_->name(i));
    });
    display(nullptr);
}

ImpactMatrixPage::~ImpactMatrixPage() = default;

void ImpactMatrixPage::setScenario(const tl::Model& model, const tl::BalanceSheet& sheet)
{
    runner_->start(model, sheet);
}

void ImpactMatrixPage::setRowOrder(ImpactRowOrder order)
{
    model_->setRowOrder(order);
    if (orderCombo_->currentIndex() != static_cast<int>(order)) orderCombo_->setCurrentIndex(static_cast<int>(order));
}

void ImpactMatrixPage::display(std::shared_ptr<const ScenarioAnalysis> analysis)
{
    message_ = !analysis ? tr("No scenario yet.") : analysis->unavailable;
    if (analysis && analysis->available() && analysis->mti.singular)
        message_ = tr("The impact matrix is not defined for this scenario: I − Q is singular (a closed loop of "
                      "impacts), so the cells show “–”.");
    const bool unbalanced = analysis && analysis->available() && !analysis->balanced;
    model_->setAnalysis(std::move(analysis));
    legend_->setRange(model_->range());
    status_->setText(message_.isEmpty()
                         ? tr("Each cell: effect of a small increase in the row group's biomass on the column group "
                              "(mixed trophic impact, Ulanowicz & Puccia 1990). |m| < %1 left blank; "
                              "fleets in italics below the rule. Hover for exact values. A consumer's gain from a prey "
                              "is that prey's share of all its food, imported food included, so food from outside "
                              "dilutes its dependence on modelled prey.")
                               .arg(ImpactMatrixModel::kBlankBelow) +
                               (unbalanced
                                    ? tr(" The scenario does not balance: impacts describe its flows as they stand.")
                                    : QString())
                         : message_);
    legend_->setVisible(model_->rowCount() > 0);
}

QSize ImpactMatrixPage::figureSize() const
{
    const QFontMetrics fm(font());
    int nameWidth = 60;
    for (int r = 0; r < model_->rowCount(); ++r) nameWidth = std::max(nameWidth, fm.horizontalAdvance(model_->name(model_->matrixRow(r))) + 30);
    const int n = model_->rowCount();
    return {std::max(640, nameWidth + n * kCell + 40), 40 + nameWidth + n * 24 + 100};
}

void ImpactMatrixPage::renderFigure(QPaintDevice& device, QSize size, double scale)
{
    QPainter painter(&device);
    painter.setRenderHint(QPainter::Antialiasing);
    painter.setRenderHint(QPainter::TextAntialiasing);
    painter.scale(scale, scale);
    paintFigure(painter, size);
}

void ImpactMatrixPage::paintFigure(QPainter& painter, QSize size)
{
    painter.fillRect(QRect(QPoint(0, 0), size), Qt::white);
    QFont base(font().family(), 9);
    QFont bold(font().family(), 12, QFont::Bold);
    painter.setFont(bold);
    painter.setPen(Qt::black);
    painter.drawText(QRectF(16, 8, size.width() - 32, 24), Qt::AlignLeft | Qt::AlignVCenter, figureTitle());
    painter.setFont(base);
    const int n = model_->rowCount();
    if (n == 0) {
        painter.drawText(QRectF(16, 40, size.width() - 32, 40), Qt::AlignLeft | Qt::TextWordWrap, message_);
        return;
    }
    const QFontMetricsF fm(base);
    double nameWidth = 60;
    for (int r = 0; r < n; ++r) nameWidth = std::max(nameWidth, fm.horizontalAdvance(model_->name(model_->matrixRow(r))) + 30);
    // Fit the grid to the width asked for; rows keep a readable height.
    const double cellW = std::max(24.0, std::min<double>(kCell, (size.width() - 40 - nameWidth) / n));
    const double cellH = 24;
    const double left = 16 + nameWidth, top = 40 + nameWidth;
    const auto italicIfFleet = [&](std::size_t i) {
        QFont f = base;
        f.setItalic(model_->isFleet(i));
        return f;
    };
    const auto headerIcon = [&](int section, Qt::Orientation o) {
        return model_->headerData(section, o, Qt::DecorationRole).value<QIcon>();
    };
    // Column names, bottom to top.
    for (int c = 0; c < n; ++c) {
        painter.save();
        painter.translate(left + (c + 0.5) * cellW, top - 4);
        painter.rotate(-90);
        headerIcon(c, Qt::Horizontal).paint(&painter, QRect(0, -5, 10, 10));
        painter.setFont(italicIfFleet(static_cast<std::size_t>(c)));
        painter.drawText(QRectF(14, -fm.height() / 2, nameWidth - 20, fm.height()), Qt::AlignLeft | Qt::AlignVCenter,
                         model_->name(static_cast<std::size_t>(c)));
        painter.restore();
    }
    // Rows: name, then the cells.
    for (int r = 0; r < n; ++r) {
        const std::size_t i = model_->matrixRow(r);
        const double y = top + r * cellH;
        headerIcon(r, Qt::Vertical).paint(&painter, QRect(int(left - 14), int(y + cellH / 2 - 5), 10, 10));
        painter.setFont(italicIfFleet(i));
        painter.setPen(Qt::black);
        painter.drawText(QRectF(16, y, nameWidth - 20, cellH), Qt::AlignRight | Qt::AlignVCenter, model_->name(i));
        for (int c = 0; c < n; ++c) {
            const QModelIndex index = model_->index(r, c);
            const QRectF cell(left + c * cellW, y, cellW, cellH);
            painter.fillRect(cell, model_->data(index, Qt::BackgroundRole).value<QBrush>());
            painter.setPen(model_->data(index, Qt::ForegroundRole).value<QBrush>().color());
            painter.drawText(cell, Qt::AlignCenter, model_->data(index, Qt::DisplayRole).toString());
        }
    }
    painter.setPen(QPen(QColor(0xbb, 0xbb, 0xbb), 0.5));
    painter.setBrush(Qt::NoBrush);
    painter.drawRect(QRectF(left, top, n * cellW, n * cellH));
    const int fleetRow = model_->firstFleetRow();
    if (fleetRow >= 0) {
        painter.setPen(QPen(QColor(0x33, 0x33, 0x33), 2));
        painter.drawLine(QPointF(16, top + fleetRow * cellH), QPointF(left + n * cellW, top + fleetRow * cellH));
        painter.drawLine(QPointF(left + fleetRow * cellW, top - nameWidth + 10), QPointF(left + fleetRow * cellW, top + n * cellH));
    }
    // Legend, note, decision-support line.
    double y = top + n * cellH + 14;
    ImpactLegend::paintLegend(painter, QRectF(16, y, std::min(560.0, size.width() - 32.0), 40), model_->range(), base);
    y += 48;
    painter.setFont(QFont(font().family(), 8));
    painter.setPen(QColor(0x33, 0x33, 0x33));
    painter.drawText(QRectF(16, y, size.width() - 32, 16), Qt::AlignLeft,
                     tr("Row acts on column; |m| < %1 left blank; fleets in italics. Mixed trophic impact after "
                        "Ulanowicz & Puccia (1990).").arg(ImpactMatrixModel::kBlankBelow));
    painter.setPen(QColor(0x55, 0x55, 0x55));
    painter.drawText(QRectF(16, y + 18, size.width() - 32, 16), Qt::AlignLeft, decisionSupportNotice());
}

}  // namespace tl::ui
