#include "ui/widgets/editing_pages.h"

#include "ui/style/palette.h"

#include <QCheckBox>
#include <algorithm>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QInputDialog>
#include <QLabel>
#include <QMessageBox>
#include <QPushButton>
#include <QRegularExpression>
#include <QStyle>
#include <QVBoxLayout>

#include "ui/document/project_document.h"
#include "ui/style/value_marks.h"
#include "ui/tables/cell_delegates.h"
#include "ui/style/wrapping_row.h"
#include "ui/widgets/removal_question.h"

namespace tl::ui {

EditingPage::EditingPage(ProjectDocument* doc, const QString& title, const QString& key, const QString& note,
                         QWidget* parent)
    : QWidget(parent), doc_(doc), title_(title), key_(key)
{
    setObjectName(key);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(6, 6, 6, 6);
    auto* heading = new QLabel(QStringLiteral("<b>%1</b> — %2").arg(title.toHtmlEscaped(), note.toHtmlEscaped()), this);
    heading->setWordWrap(true);
    heading->setObjectName(QStringLiteral("pageHeading"));
    layout->addWidget(heading);
    actions_ = new WrappingRow;
    layout->addLayout(actions_);
    view_ = new LedgerTableView(this);
    layout->addWidget(view_, 1);
}

void EditingPage::setTableModel(ScenarioTableModel* model)
{
    view_->setModel(model);
    view_->setItemDelegate(new NumberDelegate(view_));
    connect(model, &QAbstractItemModel::modelReset, this, &EditingPage::fitColumns);
    fitColumns();
}

int EditingPage::headerWidthNeeded(int column) const
{
    // The header wraps at spaces, so its longest word (beside the kind icon, if any) must
    // fit whole: a column narrower than that clips its own name.
    QAbstractItemModel* m = view_->model();
    const QFontMetrics fm(view_->horizontalHeader()->font());
    int word = 0;
    for (const QString& w : m->headerData(column, Qt::Horizontal).toString().split(QRegularExpression(QStringLiteral("\\s+")),
                                                                                    Qt::SkipEmptyParts))
        word = std::max(word, fm.horizontalAdvance(w));
    const bool icon = !m->headerData(column, Qt::Horizontal, Qt::DecorationRole).isNull();
    const int margins = 2 * view_->style()->pixelMetric(QStyle::PM_HeaderMargin, nullptr, view_->horizontalHeader()) + 8;
    return word + (icon ? view_->horizontalHeader()->style()->pixelMetric(QStyle::PM_SmallIconSize) + 4 : 0) + margins;
}

void EditingPage::fitColumns()
{
    // Width from the cells, not from the header on one line: the header wraps at spaces
    // (LedgerTableView), so a unit such as "(t wet weight/km²)" need not widen its column
    // (issue 13: six columns whole at 1024x700). It only needs its longest word to fit,
    // and the header enough height for the lines it wraps into.
    QHeaderView* header = view_->horizontalHeader();
    const QFontMetrics fm(header->font());
    int lines = 1;
    for (int c = 0; c < view_->model()->columnCount(); ++c) {
        const int width = std::max(std::clamp(view_->cellWidthHint(c), minWidth_, maxWidth_), headerWidthNeeded(c));
        view_->setColumnWidth(c, width);
        const QString text = view_->model()->headerData(c, Qt::Horizontal).toString();
        const QRect wrapped = fm.boundingRect(QRect(0, 0, width - 12, 1 << 16), Qt::AlignCenter | Qt::TextWordWrap, text);
        lines = std::max(lines, (wrapped.height() + fm.lineSpacing() - 1) / fm.lineSpacing());
    }
    header->setMinimumHeight(std::max(header->minimumHeight(), lines * fm.lineSpacing() + 12));
}

namespace {
QPushButton* addButton(QLayout* row, QWidget* parent, const QString& text, const QString& tip)
{
    auto* b = new QPushButton(text, parent);
    b->setToolTip(tip);
    b->setAutoDefault(false);
    row->addWidget(b);
    return b;
}
}  // namespace

// --- Compartments -----------------------------------------------------------------

CompartmentsPage::CompartmentsPage(ProjectDocument* doc, QWidget* parent)
    : EditingPage(doc, tr("Compartments"), QStringLiteral("compartments"),
                  tr("one row per producer, consumer or detritus pool. Leave a value empty when it is unknown; "
                     "solved values then appear in grey."),
                  parent)
{
    model_ = new CompartmentTableModel(doc, this);
    auto* addProducer = addButton(actions(), this, tr("Add producer"), tr("Insert a producer below the current row"));
    auto* addConsumer = addButton(actions(), this, tr("Add consumer"), tr("Insert a consumer below the current row"));
    auto* addPool = addButton(actions(), this, tr("Add detritus pool"), tr("Insert a detritus pool below the current row"));
    auto* remove = addButton(actions(), this, tr("Remove"), tr("Remove the selected compartments with their diet, harvest and routing"));
    auto* up = addButton(actions(), this, tr("Move up"), tr("Move the current compartment up (Ctrl+Shift+Up)"));
    auto* down = addButton(actions(), this, tr("Move down"), tr("Move the current compartment down (Ctrl+Shift+Down)"));
    up->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Up));
    down->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Down));
    setTableModel(model_);
    view()->setItemDelegateForColumn(CompartmentTableModel::kKindColumn, new KindDelegate(view()));
    view()->setItemDelegateForColumn(CompartmentTableModel::kNameColumn, new QStyledItemDelegate(view()));
    view()->horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
    fitColumns();
    view()->horizontalHeader()->setMinimumHeight(std::max(44, view()->horizontalHeader()->minimumHeight()));
    // Room for an EE marked "1.156 — above 1" beside its icon (issue 13), after every reset.
    auto widenEE = [this] {
        const int ee = CompartmentTableModel::columnOf(tl::Param::EE);
        // Four significant digits ("1.156", "12.35"), the icon beside them and the cell's margins:
        // at 1024x700 every pixel decides whether EE shows whole (ui_small_window_test).
        const int icon = view()->style()->pixelMetric(QStyle::PM_SmallIconSize, nullptr, view());
        const int margin = view()->style()->pixelMetric(QStyle::PM_FocusFrameHMargin, nullptr, view()) + 1;
        const int need = view()->fontMetrics().horizontalAdvance(eeAboveMaxText(QStringLiteral("0.000"), 1.0)) + icon + 4 * margin + 4;
        view()->setColumnWidth(ee, std::max(view()->columnWidth(ee), need));
    };
    widenEE();
    connect(model_, &QAbstractItemModel::modelReset, this, widenEE);

    auto addKind = [this](tl::CompartmentKind kind) {
        const QModelIndex cur = view()->currentIndex();
        const int at = cur.isValid() ? cur.row() + 1 : -1;
        const int row = model_->addCompartment(at, kind);
        view()->startRowEntry(row, CompartmentTableModel::kNameColumn);  // name, then Tab or Enter to its values
    };
    connect(addProducer, &QPushButton::clicked, this, [=, this] { addKind(tl::CompartmentKind::Producer); });
    connect(addConsumer, &QPushButton::clicked, this, [=, this] { addKind(tl::CompartmentKind::Consumer); });
    connect(addPool, &QPushButton::clicked, this, [=, this] { addKind(tl::CompartmentKind::Detritus); });
    connect(remove, &QPushButton::clicked, this, [this] {
        const QList<int> rows = selectedRows();
        if (rows.isEmpty() || !confirmRemoval(this, doc_->model(), rows)) return;
        model_->removeCompartments(rows);
        emit message(tr("Removed %n compartment(s); Undo brings them back with their diet.", nullptr, int(rows.size())));
    });
    auto move = [this](int delta) {
        const QModelIndex cur = view()->currentIndex();
        if (!cur.isValid()) return;
        const int row = model_->moveCompartment(cur.row(), delta);
        view()->goToCell(row, cur.column());
    };
    connect(up, &QPushButton::clicked, this, [=, this] { move(-1); });
    connect(down, &QPushButton::clicked, this, [=, this] { move(+1); });
}

QList<int> CompartmentsPage::selectedRows() const
{
    QList<int> rows;
    for (const QModelIndex& i : view()->selectionModel()->selectedIndexes())
        if (!rows.contains(i.row())) rows << i.row();
    if (rows.isEmpty() && view()->currentIndex().isValid()) rows << view()->currentIndex().row();
    return rows;
}

// --- Diet matrix --------------------------------------------------------------------

DietPage::DietPage(ProjectDocument* doc, QWidget* parent)
    : EditingPage(doc, tr("Diet matrix"), QStringLiteral("diet"),
                  tr("one row per predator, one column per prey: the share of each prey in the predator's food. "
                     "Each row should sum to 1; an empty cell is 0."),
                  parent)
{
    model_ = new DietTableModel(doc, this);
    setColumnBounds(64, 104);  // prey names wrap in the header: more prey fit on screen
    auto* normalise = addButton(actions(), this, tr("Normalise this row"), tr("Scale the current predator's diet so that it sums to 1"));
    hideUnused_ = new QCheckBox(tr("Hide prey no predator eats"), this);
    actions()->addWidget(hideUnused_);
    setTableModel(model_);
    view()->horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
    view()->horizontalHeader()->setMinimumHeight(std::max(44, view()->horizontalHeader()->minimumHeight()));
    connect(normalise, &QPushButton::clicked, this, [this] {
        const QModelIndex cur = view()->currentIndex();
        if (!cur.isValid()) {
            emit message(tr("Select a cell in the row of the predator to normalise."));
            return;
        }
        QString why;
        if (!model_->normaliseRow(cur.row(), &why)) emit message(why);
    });
    connect(hideUnused_, &QCheckBox::toggled, this, &DietPage::updateHiddenColumns);
    connect(model_, &QAbstractItemModel::modelReset, this, &DietPage::updateHiddenColumns);
    connect(model_, &QAbstractItemModel::dataChanged, this, &DietPage::updateHiddenColumns);
    updateHiddenColumns();
}

void DietPage::setHideUnusedPrey(bool hide) { hideUnused_->setChecked(hide); }
bool DietPage::hidesUnusedPrey() const { return hideUnused_->isChecked(); }

void DietPage::updateHiddenColumns()
{
    const std::vector<bool> used = model_->usedPrey();
    for (int c = 0; c < model_->columnCount(); ++c) {
        const bool preyColumn = c < int(used.size());
        view()->setColumnHidden(c, hideUnused_->isChecked() && preyColumn && !used[std::size_t(c)]);
    }
    view()->setColumnWidth(model_->sumColumn(), 190);
}

// --- Harvest ---------------------------------------------------------------------------

HarvestPage::HarvestPage(ProjectDocument* doc, QWidget* parent)
    : EditingPage(doc, tr("Harvest"), QStringLiteral("harvest"),
                  tr("what each fleet lands and discards from each compartment. Dead discards go to detritus. ") +
                      decisionSupportNotice(),
                  parent)
{
    model_ = new HarvestTableModel(doc, this);
    setColumnBounds(72, 150);  // long "fleet / landings (unit)" headers wrap
    auto* add = addButton(actions(), this, tr("Add fleet"), tr("Add a fleet (three columns: landings, discards, surviving share)"));
    auto* rename = addButton(actions(), this, tr("Rename fleet"), tr("Rename the fleet of the current column"));
    auto* remove = addButton(actions(), this, tr("Remove fleet"), tr("Remove the fleet of the current column"));
    emptyNote_ = new QLabel(tr("No fleet yet: add one to enter landings and discards."), this);
    actions()->addWidget(emptyNote_);
    setTableModel(model_);
    view()->horizontalHeader()->setMinimumHeight(std::max(44, view()->horizontalHeader()->minimumHeight()));
    connect(add, &QPushButton::clicked, this, [this] {
        bool ok = false;
        const QString name = QInputDialog::getText(this, tr("Add fleet"), tr("Fleet name:"), QLineEdit::Normal, tr("Fleet"), &ok);
        if (!ok) return;
        QString why;
        if (model_->addFleet(name, &why).isEmpty()) QMessageBox::warning(this, tr("Add fleet"), why);
    });
    auto currentFleet = [this] {
        const QModelIndex cur = view()->currentIndex();
        return cur.isValid() ? HarvestTableModel::fleetOf(cur.column()) : (model_->columnCount() > 0 ? 0 : -1);
    };
    connect(rename, &QPushButton::clicked, this, [=, this] {
        const int f = currentFleet();
        if (f < 0) return;
        bool ok = false;
        const QString name = QInputDialog::getText(this, tr("Rename fleet"), tr("New name:"), QLineEdit::Normal,
                                                   QString::fromStdString(doc_->model().fleet(std::size_t(f)).name), &ok);
        QString why;
        if (ok && !model_->renameFleet(f, name, &why)) QMessageBox::warning(this, tr("Rename fleet"), why);
    });
    connect(remove, &QPushButton::clicked, this, [=, this] {
        const int f = currentFleet();
        if (f < 0) return;
        model_->removeFleet(f);
        emit message(tr("Fleet removed; Undo brings it back."));
    });
    connect(model_, &QAbstractItemModel::modelReset, this, &HarvestPage::updateEmptyNote);
    updateEmptyNote();
}

void HarvestPage::updateEmptyNote() { emptyNote_->setVisible(model_->columnCount() == 0); }

// --- Detritus routing ------------------------------------------------------------------

RoutingPage::RoutingPage(ProjectDocument* doc, QWidget* parent)
    : EditingPage(doc, tr("Detritus routing"), QStringLiteral("routing"),
                  tr("where each compartment's unused production and egestion go. A row left empty sends all "
                     "of it to the first detritus pool (shown in grey)."),
                  parent)
{
    model_ = new RoutingTableModel(doc, this);
    setTableModel(model_);
}

}  // namespace tl::ui
