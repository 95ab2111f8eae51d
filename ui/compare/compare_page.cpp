#include "ui/compare/compare_page.h"

#include <QApplication>
#include <QCheckBox>
#include <QFutureWatcher>
#include <QThread>
#include <QtConcurrent/QtConcurrentRun>
#include <QComboBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QKeyEvent>
#include <QLabel>
#include <QListWidget>
#include <QMouseEvent>
#include <QScrollArea>
#include <QTabWidget>
#include <QTableView>
#include <QVBoxLayout>

#include "core/io/balance_report.h"
#include "core/io/report_svg.h"
#include "ui/compare/comparison_models.h"
#include "ui/compare/svg_chart_view.h"
#include "ui/style/wrapping_row.h"

namespace tl::ui {
namespace {

QString qs(const std::string& s) { return QString::fromStdString(s); }

QTableView* makeTable(QWidget* parent, QAbstractItemModel* model, const QString& name)
{
    auto* view = new QTableView(parent);
    view->setObjectName(name);
    view->setModel(model);
    view->setSelectionBehavior(QAbstractItemView::SelectRows);
    view->setEditTriggers(QAbstractItemView::NoEditTriggers);
    view->setAlternatingRowColors(true);
    view->setWordWrap(false);
    view->verticalHeader()->hide();
    view->horizontalHeader()->setStretchLastSection(true);
    return view;
}

QScrollArea* scrolled(QWidget* content)
{
    auto* area = new QScrollArea;
    area->setWidgetResizable(true);
    area->setWidget(content);
    return area;
}

}  // namespace

ComparePage::ComparePage(QWidget* parent) : QWidget(parent)
{
    setObjectName(QStringLiteral("comparePage"));
    auto* layout = new QVBoxLayout(this);

    auto* picksBox = new QWidget(this);
    auto* picks = new WrappingRow(picksBox);
    picks->setContentsMargins(0, 0, 0, 0);
    reference_ = new QComboBox(this);
    reference_->setObjectName(QStringLiteral("compareReference"));
    reference_->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    others_ = new QListWidget(this);
    others_->setObjectName(QStringLiteral("compareOthers"));
    others_->setFlow(QListView::LeftToRight);
    others_->setWrapping(true);
    others_->setMaximumHeight(52);
    others_->setMinimumWidth(260);
    auto* refLabel = new QLabel(tr("Reference:"), this);
    refLabel->setBuddy(reference_);
    auto* otherLabel = new QLabel(tr("Set beside it:"), this);
    picks->addWidget(refLabel);
    picks->addWidget(reference_);
    picks->addWidget(otherLabel);
    picks->addWidget(others_);
    layout->addWidget(picksBox);

    summary_ = new QLabel(this);
    summary_->setObjectName(QStringLiteral("compareSummary"));
    summary_->setWordWrap(true);
    layout->addWidget(summary_);

    tabs_ = new QTabWidget(this);
    inputs_ = new InputDifferencesModel(this);
    outputs_ = new ComparedOutputsModel(this);
    inputsView_ = makeTable(this, inputs_, QStringLiteral("changedInputs"));
    outputsView_ = makeTable(this, outputs_, QStringLiteral("comparedOutputs"));
    tabs_->addTab(inputsView_, tr("Changed inputs"));
    auto* outputsPage = new QWidget(this);
    auto* outputsLayout = new QVBoxLayout(outputsPage);
    outputsLayout->setContentsMargins(0, 4, 0, 0);
    onlyDiffering_ = new QCheckBox(tr("Only outputs that differ"), outputsPage);
    onlyDiffering_->setChecked(true);
    outputsLayout->addWidget(onlyDiffering_);
    outputsLayout->addWidget(outputsView_, 1);
    tabs_->addTab(outputsPage, tr("Outputs"));
    levelBars_ = new SvgChartView;
    tabs_->addTab(scrolled(levelBars_), tr("Level bars"));
    auto* changes = new QWidget;
    changesLayout_ = new QVBoxLayout(changes);
    tabs_->addTab(scrolled(changes), tr("Largest changes"));
    layout->addWidget(tabs_, 1);

    auto* notice = new QLabel(qs(tl::kDecisionSupportNotice), this);
    notice->setWordWrap(true);
    layout->addWidget(notice);

    connect(reference_, &QComboBox::currentIndexChanged, this, [this] { recompute(); });
    connect(others_, &QListWidget::itemChanged, this, [this] { recompute(); });
    connect(onlyDiffering_, &QCheckBox::toggled, outputs_, &ComparedOutputsModel::setOnlyDiffering);
    // One click opens (no double-click needed); Ctrl/Shift-click keeps selecting rows.
    connect(inputsView_, &QTableView::clicked, this, [this](const QModelIndex& index) {
        if (!(clickModifiers_ & (Qt::ControlModifier | Qt::ShiftModifier | Qt::MetaModifier))) activateInput(index);
    });
    connect(outputsView_, &QTableView::clicked, this, [this](const QModelIndex& index) {
        if (!(clickModifiers_ & (Qt::ControlModifier | Qt::ShiftModifier | Qt::MetaModifier))) activateOutput(index);
    });
    for (QTableView* view : {inputsView_, outputsView_}) {
        view->installEventFilter(this);
        view->viewport()->installEventFilter(this);
        view->setToolTip(tr("Click a row to open that cell in its scenario; Ctrl+click or Shift+click selects rows "
                            "without opening; Enter opens the current row."));
    }
}

bool ComparePage::eventFilter(QObject* watched, QEvent* event)
{
    const bool inputs = watched == inputsView_ || watched == inputsView_->viewport();
    const bool outputs = watched == outputsView_ || watched == outputsView_->viewport();
    if (!inputs && !outputs) return QWidget::eventFilter(watched, event);
    if (event->type() == QEvent::MouseButtonRelease || event->type() == QEvent::MouseButtonPress)
        clickModifiers_ = static_cast<QMouseEvent*>(event)->modifiers();
    if (event->type() == QEvent::KeyPress && (watched == inputsView_ || watched == outputsView_)) {
        const int key = static_cast<QKeyEvent*>(event)->key();
        if (key == Qt::Key_Return || key == Qt::Key_Enter) {
            QTableView* view = inputs ? inputsView_ : outputsView_;
            if (view->currentIndex().isValid()) {
                if (inputs) activateInput(view->currentIndex());
                else activateOutput(view->currentIndex());
                return true;
            }
        }
    }
    return QWidget::eventFilter(watched, event);
}

ComparePage::~ComparePage() = default;

void ComparePage::setProject(const tl::Project& project)
{
    const QStringList before = picked();
    project_ = project;
    updating_ = true;
    reference_->clear();
    others_->clear();
    for (const tl::Scenario& s : project_.scenarios) {
        reference_->addItem(qs(s.name));
        auto* item = new QListWidgetItem(qs(s.name), others_);
        item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsUserCheckable);
        item->setCheckState(Qt::Unchecked);
    }
    updating_ = false;
    QStringList keep;
    for (const QString& name : before)
        if (project_.findScenario(name.toStdString())) keep << name;
    if (keep.size() < 2) {
        keep.clear();
        for (const tl::Scenario& s : project_.scenarios) keep << qs(s.name);
    }
    pick(keep);
}

void ComparePage::pick(const QStringList& scenarios)
{
    updating_ = true;
    if (!scenarios.isEmpty()) reference_->setCurrentText(scenarios.front());
    for (int i = 0; i < others_->count(); ++i) {
        QListWidgetItem* item = others_->item(i);
        const bool on = scenarios.indexOf(item->text()) > 0;
        item->setCheckState(on ? Qt::Checked : Qt::Unchecked);
    }
    updating_ = false;
    recompute();
}

QStringList ComparePage::picked() const
{
    QStringList names;
    if (reference_->currentIndex() < 0) return names;
    names << reference_->currentText();
    for (int i = 0; i < others_->count(); ++i) {
        const QListWidgetItem* item = others_->item(i);
        if (item->checkState() == Qt::Checked && item->text() != names.front()) names << item->text();
    }
    return names;
}

void ComparePage::recompute()
{
    if (updating_) return;
    // The reference cannot also stand beside itself.
    for (int i = 0; i < others_->count(); ++i) {
        QListWidgetItem* item = others_->item(i);
        const bool isReference = item->text() == reference_->currentText();
        if (item->isHidden() != isReference) item->setHidden(isReference);
    }
    std::vector<std::string> names;
    for (const QString& n : picked()) names.push_back(n.toStdString());
    std::string error;
    const auto scenarios = tl::pickScenarios(project_, names, error);
    const quint64 generation = ++generation_;
    if (scenarios.empty()) {
        install(nullptr);
        summary_->setText(project_.scenarios.size() < 2
                              ? tr("A comparison needs two scenarios: duplicate this one on the Scenarios shelf and change the copy.")
                              : tr("Tick at least one scenario to set beside the reference."));
        return;
    }
    std::size_t size = 0;
    for (const tl::Scenario* s : scenarios) size += s->model.size();
    if (size <= inlineLimit_) {
        install(std::make_unique<tl::ScenarioComparison>(tl::compareScenarios(scenarios)));
        return;
    }
    // In the background, on copies (the project may change meanwhile); a late result of an
    // older pick is dropped.
    install(nullptr);
    summary_->setText(tr("Comparing %1 scenarios (%2 compartments in all)…").arg(scenarios.size()).arg(size));
    auto copies = std::make_shared<std::vector<tl::Scenario>>();
    for (const tl::Scenario* s : scenarios) copies->push_back(*s);
    auto* watcher = new QFutureWatcher<std::shared_ptr<tl::ScenarioComparison>>(this);
    ++running_;
    connect(watcher, &QFutureWatcherBase::finished, this, [this, watcher, generation] {
        --running_;
        auto result = watcher->result();
        watcher->deleteLater();
        if (generation == generation_) install(std::make_unique<tl::ScenarioComparison>(std::move(*result)));
    });
    watcher->setFuture(QtConcurrent::run([copies] {
        std::vector<const tl::Scenario*> pointers;
        for (const tl::Scenario& s : *copies) pointers.push_back(&s);
        return std::make_shared<tl::ScenarioComparison>(tl::compareScenarios(pointers));
    }));
}

void ComparePage::waitForIdle()
{
    while (running_ > 0) {
        QApplication::processEvents(QEventLoop::AllEvents, 20);
        QThread::msleep(5);
    }
}

void ComparePage::install(std::unique_ptr<tl::ScenarioComparison> comparison)
{
    inputs_->setComparison(nullptr);
    outputs_->setComparison(nullptr);
    comparison_ = std::move(comparison);
    while (QLayoutItem* item = changesLayout_->takeAt(0)) {
        delete item->widget();
        delete item;
    }
    if (!comparison_) {
        levelBars_->setFigure({});
        tabs_->setTabText(0, tr("Changed inputs"));
        tabs_->setTabText(1, tr("Outputs"));
        return;
    }
    const tl::ScenarioComparison& c = *comparison_;
    inputs_->setComparison(&c);
    outputs_->setComparison(&c);
    inputsView_->resizeColumnsToContents();
    outputsView_->resizeColumnsToContents();
    const std::size_t differing = c.differingOutputs();
    QStringList states;
    for (std::size_t s = 0; s < c.scenarios.size(); ++s)
        states << tr("%1: %2").arg(qs(c.scenarios[s]), qs(std::string(tl::statusKey(c.sheets[s].status))));
    summary_->setText((c.inputs.size() == 1 ? tr("1 input differs") : tr("%1 inputs differ").arg(c.inputs.size())) +
                      QStringLiteral("; ") +
                      tr("%1 of %2 outputs differ from the reference.").arg(differing).arg(c.outputs.size()) +
                      QStringLiteral("  ") + tr("Balance: %1.").arg(states.join(QStringLiteral(", "))) +
                      QStringLiteral("  ") + tr("Double-click a row to open it in its scenario."));
    tabs_->setTabText(0, tr("Changed inputs (%1)").arg(c.inputs.size()));
    tabs_->setTabText(1, tr("Outputs (%1 differ)").arg(differing));
    levelBars_->setFigure(tl::levelBarsComparisonSvg(c));
    for (std::size_t s = 1; s < c.scenarios.size(); ++s) {
        auto* view = new SvgChartView;
        view->setFigure(tl::relativeChangesSvg(c, s));
        changesLayout_->addWidget(view);
    }
    changesLayout_->addStretch(1);
}

QString ComparePage::scenarioFor(int scenarioIndex) const
{
    if (!comparison_) return {};
    // A row clicked outside a scenario's column opens the first scenario beside the reference.
    const std::size_t s = scenarioIndex >= 0 ? static_cast<std::size_t>(scenarioIndex) : (comparison_->scenarios.size() > 1 ? 1 : 0);
    return qs(comparison_->scenarios[s]);
}

void ComparePage::activateInput(const QModelIndex& index)
{
    const tl::InputDifference* d = inputs_->row(index.row());
    if (!d) return;
    emit openCell(scenarioFor(inputs_->scenarioOfColumn(index.column())), qs(d->compartment), qs(d->item));
}

void ComparePage::activateOutput(const QModelIndex& index)
{
    const tl::ComparedOutput* o = outputs_->row(index.row());
    if (!o || o->group != tl::OutputGroup::Compartment) return;
    emit openCell(scenarioFor(outputs_->scenarioOfColumn(index.column())), qs(o->subject), qs(o->quantity));
}

}  // namespace tl::ui
