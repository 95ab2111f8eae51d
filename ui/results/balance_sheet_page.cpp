#include "ui/results/balance_sheet_page.h"

#include "core/balance/scenario_checks.h"

#include <cmath>

#include "core/balance/production_uses.h"

#include <QAction>
#include <QApplication>
#include <QCheckBox>
#include <QClipboard>
#include <QComboBox>
#include <QFileDialog>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QItemSelectionModel>
#include <QLabel>
#include <QLineEdit>
#include <QMenu>
#include <QMessageBox>
#include <QPushButton>
#include <QSaveFile>
#include <QTableView>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>
#include <set>

#include "ui/style/palette.h"
#include "ui/style/wrapping_row.h"

namespace tl::ui {

// --- filter ---------------------------------------------------------------------------

void BalanceSheetFilter::setNameFilter(const QString& text)
{
    name_ = text.trimmed();
    invalidateFilter();
}

void BalanceSheetFilter::setKindFilter(std::optional<CompartmentKind> kind)
{
    kind_ = kind;
    invalidateFilter();
}

void BalanceSheetFilter::setProblemsOnly(bool on)
{
    problemsOnly_ = on;
    invalidateFilter();
}

bool BalanceSheetFilter::filterAcceptsRow(int sourceRow, const QModelIndex& sourceParent) const
{
    const auto* m = qobject_cast<const BalanceSheetModel*>(sourceModel());
    if (!m) return true;
    using C = BalanceSheetModel::Column;
    if (!name_.isEmpty()) {
        const QString name = m->index(sourceRow, BalanceSheetModel::column(C::Name), sourceParent).data().toString();
        if (!name.contains(name_, Qt::CaseInsensitive)) return false;
    }
    if (kind_) {
        const QString key = m->cellText(sourceRow, C::Kind);
        if (key.toStdString() != kindKey(*kind_)) return false;
    }
    if (problemsOnly_ && !m->worstSeverity(sourceRow)) return false;
    return true;
}

bool BalanceSheetFilter::lessThan(const QModelIndex& left, const QModelIndex& right) const
{
    const QVariant a = left.data(BalanceSheetModel::kValueRole), b = right.data(BalanceSheetModel::kValueRole);
    if (a.typeId() == QMetaType::Double && b.typeId() == QMetaType::Double) {
        const double x = a.toDouble(), y = b.toDouble();
        const bool nx = std::isnan(x), ny = std::isnan(y);
        // Empty cells go last whichever way the column is sorted.
        if (nx || ny) return sortOrder() == Qt::AscendingOrder ? (!nx && ny) : (nx && !ny);
        return x < y;
    }
    if (left.column() == BalanceSheetModel::column(BalanceSheetModel::Column::Status)) {
        const auto* m = qobject_cast<const BalanceSheetModel*>(sourceModel());
        auto rank = [m](int row) {
            const auto s = m->worstSeverity(row);
            return s ? 3 - static_cast<int>(*s) : 0;  // OK < note < warning < error
        };
        return rank(left.row()) < rank(right.row());
    }
    return QString::localeAwareCompare(a.toString(), b.toString()) < 0;
}

// --- page -----------------------------------------------------------------------------

BalanceSheetPage::BalanceSheetPage(QWidget* parent)
    : ResultsPage(parent), model_(new BalanceSheetModel(this)), filter_(new BalanceSheetFilter(this)),
      table_(new QTableView(this)), statusIcon_(new QLabel(this)), statusLabel_(new QLabel(this)),
      nameEdit_(new QLineEdit(this)), kindCombo_(new QComboBox(this)),
      problemsOnly_(new QCheckBox(tr("Only compartments with problems"), this))
{
    filter_->setSourceModel(model_);
    table_->setModel(filter_);
    table_->setSortingEnabled(true);
    table_->sortByColumn(-1, Qt::AscendingOrder);  // model order until the user sorts
    table_->setSelectionBehavior(QAbstractItemView::SelectRows);
    table_->setSelectionMode(QAbstractItemView::ExtendedSelection);
    table_->setAlternatingRowColors(true);
    table_->setWordWrap(false);
    table_->setTextElideMode(Qt::ElideRight);
    table_->horizontalHeader()->setDefaultAlignment(Qt::AlignCenter);
    table_->horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
    // Names head the rows (BalanceSheetModel's vertical header): they stay in view when
    // the table scrolls sideways; the Name column itself is hidden.
    table_->verticalHeader()->setVisible(true);
    table_->verticalHeader()->setSectionResizeMode(QHeaderView::Fixed);
    table_->verticalHeader()->setDefaultAlignment(Qt::AlignLeft | Qt::AlignVCenter);
    table_->setColumnHidden(BalanceSheetModel::column(BalanceSheetModel::Column::Name), true);
    table_->setCornerButtonEnabled(false);
    table_->setContextMenuPolicy(Qt::CustomContextMenu);

    statusLabel_->setWordWrap(true);
    statusLabel_->setTextInteractionFlags(Qt::TextSelectableByMouse);
    nameEdit_->setPlaceholderText(tr("Filter compartments by name"));
    nameEdit_->setClearButtonEnabled(true);
    kindCombo_->addItem(tr("All kinds"));
    kindCombo_->addItem(kindLabel(CompartmentKind::Producer));
    kindCombo_->addItem(kindLabel(CompartmentKind::Consumer));
    kindCombo_->addItem(kindLabel(CompartmentKind::Detritus));

    auto* copyButton = new QPushButton(tr("Copy"), this);
    copyButton->setToolTip(tr("Copy the selected rows (all visible rows if none) as tab-separated text"));
    auto* exportButton = new QPushButton(tr("Export CSV…"), this);

    auto* legendIcon = new QLabel(this);
    legendIcon->setPixmap(solvedIcon().pixmap(12, 12));
    auto* legend = new QLabel(tr("%1; bold. Columns marked (input) show what was entered, empty = unknown.")
                                  .arg(solvedLegend()), this);
    legend->setWordWrap(true);  // a long line would set the window's minimum width

    auto* statusRow = new QHBoxLayout;
    statusRow->addWidget(statusIcon_);
    statusRow->addWidget(statusLabel_, 1);
    auto* filterRow = new WrappingRow;  // continues on a second line in a narrow window
    nameEdit_->setMinimumWidth(200);
    filterRow->addWidget(nameEdit_);
    filterRow->addWidget(kindCombo_);
    filterRow->addWidget(problemsOnly_);
    filterRow->addWidget(copyButton);
    filterRow->addWidget(exportButton);
    auto* legendRow = new QHBoxLayout;
    legendRow->addWidget(legendIcon);
    legendRow->addWidget(legend, 1);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(statusRow);
    layout->addLayout(filterRow);
    layout->addWidget(table_, 1);
    uses_ = new QLabel(this);
    uses_->setWordWrap(true);
    uses_->setTextFormat(Qt::PlainText);
    uses_->setTextInteractionFlags(Qt::TextSelectableByMouse);
    layout->addWidget(uses_);
    layout->addLayout(legendRow);
    auto* notice = new QLabel(decisionSupportNotice(), this);
    notice->setWordWrap(true);
    notice->setStyleSheet(QStringLiteral("color: #555555;"));
    layout->addWidget(notice);

    connect(table_->selectionModel(), &QItemSelectionModel::currentChanged, this, [this] { showProductionUses(); });
    auto* copyAction = new QAction(tr("&Copy"), this);
    copyAction->setShortcut(QKeySequence::Copy);
    copyAction->setShortcutContext(Qt::WidgetWithChildrenShortcut);
    addAction(copyAction);
    auto* exportAction = new QAction(tr("&Export CSV…"), this);

    connect(nameEdit_, &QLineEdit::textChanged, filter_, &BalanceSheetFilter::setNameFilter);
    connect(kindCombo_, &QComboBox::currentIndexChanged, this, [this](int i) {
        static const CompartmentKind kinds[] = {CompartmentKind::Producer, CompartmentKind::Consumer,
                                                CompartmentKind::Detritus};
        filter_->setKindFilter(i <= 0 ? std::nullopt : std::optional(kinds[i - 1]));
    });
    connect(problemsOnly_, &QCheckBox::toggled, filter_, &BalanceSheetFilter::setProblemsOnly);
    connect(copyButton, &QPushButton::clicked, this, &BalanceSheetPage::copy);
    connect(copyAction, &QAction::triggered, this, &BalanceSheetPage::copy);
    connect(exportButton, &QPushButton::clicked, this, &BalanceSheetPage::exportCsvInteractive);
    connect(exportAction, &QAction::triggered, this, &BalanceSheetPage::exportCsvInteractive);
    connect(table_, &QTableView::customContextMenuRequested, this, [this, copyAction, exportAction](QPoint at) {
        QMenu menu(this);
        menu.addAction(copyAction);
        menu.addAction(exportAction);
        menu.exec(table_->viewport()->mapToGlobal(at));
    });
    connect(table_, &QTableView::doubleClicked, this, [this](const QModelIndex& index) {
        const QModelIndex src = filter_->mapToSource(index);
        emit compartmentActivated(model_->cellText(src.row(), BalanceSheetModel::Column::Name));
    });
}

QString BalanceSheetPage::productionUsesText() const
{
    const QModelIndex current = filter_->mapToSource(table_->currentIndex());
    if (!current.isValid()) return tr("Select a compartment to see who takes its production.");
    const auto i = static_cast<std::size_t>(current.row());
    const tl::Model& model = model_->model();
    const tl::BalanceSheet& sheet = model_->sheet();
    if (i >= model.size() || i >= sheet.rows.size()) return {};
    const QString name = QString::fromStdString(model.compartment(i).name);
    if (!model.compartment(i).isLiving()) return tr("%1 is a detritus pool: it has no production of its own.").arg(name);
    const std::vector<ProductionUse> uses = productionUses(model, sheet, i);
    const QString flow = QString::fromStdString(model.units.flow());
    if (uses.empty()) return tr("Nothing eats or catches %1.").arg(name);
    QStringList parts;
    for (const ProductionUse& u : uses) {
        const QString who = u.kind == ProductionUse::Kind::NetEmigration         ? tr("net emigration")
                            : u.kind == ProductionUse::Kind::BiomassAccumulation ? tr("biomass accumulation")
                            : u.kind == ProductionUse::Kind::Fleet ? tr("%1 (fleet)").arg(QString::fromStdString(u.name))
                                                                   : QString::fromStdString(u.name);
        parts << (std::isfinite(u.shareOfProduction)
                      ? tr("%1 %2 %").arg(who, QString::number(100.0 * u.shareOfProduction, 'f', 1))
                      : tr("%1 %2 %3").arg(who, QString::number(u.amount, 'g', 4), flow));
    }
    return tr("Who takes the production of %1 (P = %2 %3), as shares of it: %4. Together they make EE = %5.")
        .arg(name, QString::number(sheet.rows[i].production, 'g', 4), flow, parts.join(QStringLiteral(", ")),
             QString::number(sheet.rows[i].ee, 'g', 4));
}

void BalanceSheetPage::showProductionUses() { uses_->setText(productionUsesText()); }

void BalanceSheetPage::setEnsembleBands(std::shared_ptr<const tl::ensemble::EnsembleSummary> summary, const QString& origin)
{
    model_->setEnsemble(std::move(summary), origin);
    if (!model_->hasEnsemble()) return;
    // The interval column is the model's last; it is shown right after the EE column.
    QHeaderView* header = table_->horizontalHeader();
    const int from = header->visualIndex(BalanceSheetModel::kEeIntervalColumn);
    const int to = header->visualIndex(BalanceSheetModel::column(BalanceSheetModel::Column::Ee)) + 1;
    if (from >= 0 && to > 0 && from != to) header->moveSection(from, to);
    table_->resizeColumnToContents(BalanceSheetModel::kEeIntervalColumn);
}

void BalanceSheetPage::setScenario(const tl::Model& model, const tl::BalanceSheet& sheet)
{
    model_->setScenario(model, sheet);
    showProductionUses();
    std::optional<Severity> worst;
    int withProblems = 0;
    QStringList general;
    for (const Problem& p : sheet.problems) {
        if (!worst || static_cast<int>(p.severity) < static_cast<int>(*worst)) worst = p.severity;
        if (p.compartment.empty()) general << QString::fromStdString(p.message).toHtmlEscaped();
    }
    for (int r = 0; r < model_->rowCount(); ++r)
        if (model_->worstSeverity(r)) ++withProblems;
    // The same word as the status bar (core scenarioState): balanced only when the inputs
    // are valid, the balance solved and no check is an error.
    const ScenarioState state = scenarioState(model, sheet, scenarioChecks(model, sheet));
    QString text = QStringLiteral("<b>%1.</b>").arg(scenarioStateLabel(state).toHtmlEscaped());
    if (state == ScenarioState::Incomplete && sheet.status != BalanceStatus::Invalid)
        text += " " + tr("Some inputs are missing or wrong (see Checks); the values below use them as they are.");
    if (withProblems == 0) text += " " + tr("No compartment has a problem.");
    else if (withProblems == 1) text += " " + tr("1 compartment has problems; see its Status cell.");
    else text += " " + tr("%1 compartments have problems; see their Status cells.").arg(withProblems);
    if (!general.isEmpty()) text += "<br>" + general.join("<br>");
    statusLabel_->setText(text);
    statusIcon_->setPixmap((state == ScenarioState::Balanced ? statusIcon(worst) : scenarioStateIcon(state)).pixmap(20, 20));
    table_->setColumnHidden(BalanceSheetModel::column(BalanceSheetModel::Column::Name), true);  // lost on reset
    table_->resizeColumnsToContents();
    const int statusColumn = BalanceSheetModel::column(BalanceSheetModel::Column::Status);
    table_->setColumnWidth(statusColumn, std::min(table_->columnWidth(statusColumn), 280));  // full text in the tooltip
}

std::vector<int> BalanceSheetPage::chosenSourceRows(bool selectionOnly) const
{
    std::vector<int> rows;
    if (selectionOnly && table_->selectionModel()) {
        std::set<int> viewRows;
        for (const QModelIndex& i : table_->selectionModel()->selectedIndexes()) viewRows.insert(i.row());
        for (int v : viewRows) rows.push_back(filter_->mapToSource(filter_->index(v, 0)).row());
        if (!rows.empty()) return rows;
    }
    for (int v = 0; v < filter_->rowCount(); ++v) rows.push_back(filter_->mapToSource(filter_->index(v, 0)).row());
    return rows;
}

QString BalanceSheetPage::selectionAsText() const { return model_->toText(chosenSourceRows(true), '\t'); }

void BalanceSheetPage::copy() { QApplication::clipboard()->setText(selectionAsText()); }

bool BalanceSheetPage::exportCsv(const QString& path, QString* error) const
{
    QSaveFile file(path);
    if (!file.open(QIODevice::WriteOnly | QIODevice::Text)) {
        if (error) *error = tr("Cannot write %1: %2").arg(path, file.errorString());
        return false;
    }
    file.write(model_->toText(chosenSourceRows(false), ',').toUtf8());
    if (!file.commit()) {
        if (error) *error = tr("Cannot write %1: %2").arg(path, file.errorString());
        return false;
    }
    return true;
}

void BalanceSheetPage::exportCsvInteractive()
{
    const QString path = QFileDialog::getSaveFileName(this, tr("Export balance sheet"), QStringLiteral("balance_sheet.csv"),
                                                      tr("CSV files (*.csv)"));
    if (path.isEmpty()) return;
    QString error;
    if (!exportCsv(path, &error)) QMessageBox::warning(this, tr("Export balance sheet"), error);
}

}  // namespace tl::ui
