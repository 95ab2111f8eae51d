#include "ui/main_window.h"

#include <QAction>
#include <QApplication>
#include <QCloseEvent>
#include <QResizeEvent>
#include <QDateTime>
#include <QDialog>
#include <QDialogButtonBox>
#include <QDir>
#include <QDockWidget>
#include <QDragEnterEvent>
#include <QFile>
#include <QFileDialog>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QImage>
#include <QInputDialog>
#include <QLabel>
#include <QListWidget>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QSettings>
#include <QSplitter>
#include <QStackedWidget>
#include <QStatusBar>
#include <QTimer>
#include <QToolBar>
#include <QUndoStack>
#include <QUrl>
#include <QVBoxLayout>

#include "core/ensemble/ensemble_summary.h"
#include "core/model/compartment.h"
#include "core/model/problem_fixes.h"
#include "ui/document/project_document.h"
#include "ui/document/recovery_file.h"
#include "ui/reconcile/reconcile_dialog.h"
#include "ui/reconcile/reconcile_runner.h"
#include "ui/style/palette.h"
#include "ui/widgets/checks_panel.h"
#include "ui/widgets/confidence_panel.h"
#include "ui/widgets/editing_pages.h"
#include "ui/widgets/help_window.h"
#include "ui/widgets/fieldwork_dialog.h"
#include "ui/widgets/project_settings_dialog.h"
#include "ui/widgets/scenario_shelf.h"
#include "ui/workbench_actions.h"
#include "ui/compare/compare_page.h"
#include "ui/ensemble/ensemble_page.h"
#include "ui/widgets/report_dialog.h"
#include "core/model/names.h"
#if TL_UI_HAVE_RESULTS
#include "ui/results/figure_export.h"
#include "ui/results/results_pages.h"
#endif
#if TL_UI_HAVE_ANALYSIS
#include "ui/analysis/analysis_pages.h"
#endif

namespace tl::ui {
namespace {

constexpr int kMaxRecent = 8;
// QSettings keys, each written here once.
const char* kRecentKey = "files/recent";
const char* kGeometryKey = "window/geometry";
const char* kStateKey = "window/state";

QString qs(const std::string& s) { return QString::fromStdString(s); }

bool looksLikeCsvFolder(const QString& path)
{
    return QFileInfo(path).isDir() && QFileInfo::exists(path + QStringLiteral("/compartments.csv"));
}

}  // namespace

MainWindow::MainWindow(const MainWindowOptions& options, QWidget* parent) : QMainWindow(parent), options_(options)
{
    initResources();
    initGuideResources();
    setObjectName(QStringLiteral("workbench"));
    setWindowIcon(QIcon(QStringLiteral(":/tl/icons/app.svg")));
    setAcceptDrops(true);
    doc_ = new ProjectDocument(this);
    runner_ = new BalanceRunner(this);
    recovery_ = std::make_unique<RecoveryKeeper>(
        doc_, options_.recoveryDirectory.isEmpty() ? RecoveryKeeper::defaultDirectory() : options_.recoveryDirectory);

    // Centre: page rail + stacked pages, and the confidence panel at the right.
    auto* centre = new QWidget(this);
    auto* row = new QHBoxLayout(centre);
    row->setContentsMargins(0, 0, 0, 0);
    row->setSpacing(0);
    rail_ = new QListWidget(centre);
    rail_->setObjectName(QStringLiteral("pageRail"));
    rail_->setFixedWidth(178);
    rail_->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    rail_->setIconSize(QSize(18, 18));
    stack_ = new QStackedWidget(centre);
    row->addWidget(rail_);
    row->addWidget(stack_, 1);
    setCentralWidget(centre);
    connect(rail_, &QListWidget::currentRowChanged, this, [this](int i) {
        if (i < 0) return;
        stack_->setCurrentIndex(i);
        // Data confidence belongs to the Compartments table; other pages get the room.
        if (confidenceDock_) confidenceDock_->setVisible(stack_->currentWidget() == compartments_);
        if (exportFigureAct_) exportFigureAct_->setEnabled(figureOf(stack_->currentWidget()) != nullptr);
    });

    checks_ = new ChecksPanel(this);
    confidence_ = new ConfidencePanel(doc_, this);
    shelf_ = new ScenarioShelf(doc_, this);
    buildPages();
    buildDocks();
    buildActions();

    // Status bar: balance status as icon + word, then the template note and timing.
    statusIcon_ = new QLabel(this);
    statusText_ = new QLabel(this);
    statusText_->setObjectName(QStringLiteral("balanceStatus"));
    templateNote_ = new QLabel(this);
    templateNote_->setObjectName(QStringLiteral("templateNote"));
    solveNote_ = new QLabel(this);
    solveNote_->setObjectName(QStringLiteral("solveNote"));
    statusBar()->addPermanentWidget(templateNote_);
    statusBar()->addPermanentWidget(solveNote_);
    statusBar()->addPermanentWidget(statusIcon_);
    statusBar()->addPermanentWidget(statusText_);

    connect(doc_, &ProjectDocument::modelChanged, this, &MainWindow::onModelChanged);
    connect(doc_, &ProjectDocument::originChanged, this, &MainWindow::updateTitle);
    connect(doc_, &ProjectDocument::projectChanged, this, &MainWindow::updateTitle);
    connect(doc_->undoStack(), &QUndoStack::cleanChanged, this, &MainWindow::updateTitle);
    connect(runner_, &BalanceRunner::solved, this, &MainWindow::onSolved);
    connect(runner_, &BalanceRunner::started, this, [this] { solveNote_->setText(tr("Solving…")); });
    connect(checks_, &ChecksPanel::problemActivated, this, [this](const tl::Problem& p) { goToProblem(p); });
    // One-click fixes where the remedy is unambiguous (core/model/problem_fixes.h), one undo step each.
    checks_->setFixLabeler([this](const tl::Problem& p) {
        const auto label = tl::fixLabel(doc_->model(), p);
        return label ? qs(*label) : QString();
    });
    connect(checks_, &ChecksPanel::fixRequested, this, [this](const tl::Problem& p) {
        if (auto fix = tl::unambiguousFix(doc_->model(), p)) doc_->editModel(fix->fixed, qs(fix->label));
    });

    if (options_.useSettings) {
        QSettings s;
        restoreGeometry(s.value(QLatin1String(kGeometryKey)).toByteArray());
        restoreState(s.value(QLatin1String(kStateKey)).toByteArray());
    } else {
        resize(1400, 880);
    }
    showPage(0);
    onModelChanged();
    updateTitle();
}

MainWindow::~MainWindow()
{
    runner_->waitForIdle();
}

// --- pages -------------------------------------------------------------------------------

namespace {
// Each page its own icon (resources/icons/page-KEY.svg): below 1200 px the rail shows icons
// only, so pages that shared one could be told apart by tooltip alone.
QIcon pageIcon(const QString& key)
{
    const QString file = QStringLiteral(":/tl/icons/page-%1.svg").arg(key);
    return QFile::exists(file) ? QIcon(file) : QIcon(QStringLiteral(":/tl/icons/page-level-bars.svg"));
}
}  // namespace

void MainWindow::addPage(QWidget* page, const QString& title, const QString& key, const QIcon& icon)
{
    stack_->addWidget(page);
    auto* item = new QListWidgetItem(icon, rail_->width() < 100 ? QString() : title, rail_);
    item->setData(Qt::UserRole, title);
    item->setToolTip(title);
    item->setSizeHint(QSize(rail_->width() < 100 ? 40 : 160, 34));
    pageKeys_ << key;
    if (viewMenu_) {
        const int i = pageCount() - 1;
        auto* a = viewMenu_->addAction(title, this, [this, i] { showPage(i); });
        if (i < 9) a->setShortcut(QKeySequence(Qt::CTRL | Qt::Key(Qt::Key_1 + i)));
    }
}

int MainWindow::pageCount() const { return stack_->count(); }
QString MainWindow::pageKey(int i) const { return pageKeys_.value(i); }
QString MainWindow::pageTitle(int i) const { return rail_->item(i) ? rail_->item(i)->data(Qt::UserRole).toString() : QString(); }

// Below 1200 px the rail shows icons only (titles in tooltips): on a 1024 px screen its
// 130 px go to the tables.
void MainWindow::setCompactRail(bool compact)
{
    const int width = compact ? 42 : 178;
    if (rail_->width() == width) return;
    rail_->setFixedWidth(width);
    for (int i = 0; i < rail_->count(); ++i) {
        QListWidgetItem* item = rail_->item(i);
        item->setText(compact ? QString() : item->data(Qt::UserRole).toString());
        item->setSizeHint(QSize(compact ? 36 : 160, 34));
    }
}

// Polish comes before the first layout of a shown window: a window shown at 1024 px is
// laid out compact from the start (else the wide rail would set its minimum width).
bool MainWindow::event(QEvent* event)
{
    if (event->type() == QEvent::Polish) fitToWidth();
    return QMainWindow::event(event);
}

void MainWindow::resizeEvent(QResizeEvent* event)
{
    QMainWindow::resizeEvent(event);
    fitToWidth();
}

void MainWindow::fitToWidth()
{
    const bool compact = width() < 1200;
    if (compact == (rail_->width() < 100)) return;
    setCompactRail(compact);
    if (!compact) return;
    // The docks give up some room to the tables (the user may widen them again); after the
    // window's layout is in place, which it is not yet at Polish.
    QTimer::singleShot(0, this, [this] {
        const QList<QDockWidget*> sides = {findChild<QDockWidget*>(QStringLiteral("scenarioDock")), confidenceDock_};
        resizeDocks(sides, {120, 160}, Qt::Horizontal);
        auto* checksDock = findChild<QDockWidget*>(QStringLiteral("checksDock"));
        if (checks_->maximumHeight() == QWIDGETSIZE_MAX) resizeDocks({checksDock}, {150}, Qt::Vertical);
    });
}

void MainWindow::showPage(int i)
{
    if (i < 0 || i >= pageCount()) return;
    rail_->setCurrentRow(i);
    stack_->setCurrentIndex(i);
}

void MainWindow::showPage(const QString& key) { showPage(int(pageKeys_.indexOf(key))); }
QWidget* MainWindow::currentPage() const { return stack_->currentWidget(); }
QWidget* MainWindow::page(int i) const { return stack_->widget(i); }

void MainWindow::buildPages()
{
    compartments_ = new CompartmentsPage(doc_, this);
    diet_ = new DietPage(doc_, this);
    harvest_ = new HarvestPage(doc_, this);
    routing_ = new RoutingPage(doc_, this);
    editingPages_ = {compartments_, diet_, harvest_, routing_};
    for (EditingPage* p : editingPages_) {
        addPage(p, p->title(), p->key(), pageIcon(p->key()));
        connect(p, &EditingPage::message, this, [this](const QString& t) { message(t); });
        connect(p->view(), &LedgerTableView::blockEdited, this, &MainWindow::showBlockReport);
        connect(p->tableModel(), &ScenarioTableModel::inputRefused, this, [this](const QString& t) {
            message(t, 10000);
        });
    }
    connect(compartments_->view()->selectionModel(), &QItemSelectionModel::currentChanged, this,
            &MainWindow::updateCurrentCell);
    connect(diet_->view()->selectionModel(), &QItemSelectionModel::currentChanged, this, [this](const QModelIndex& cur) {
        if (cur.isValid() && cur.row() < diet_->diet()->rowCount()) confidence_->setDietTarget(diet_->diet()->predatorOf(cur.row()));
    });
    connect(compartments_->tableModel(), &QAbstractItemModel::modelReset, this, [this] {
        // The view's selection model survives a reset; re-read the cell it points at.
        updateCurrentCell();
    });
#if TL_UI_HAVE_RESULTS
    resultsPages_ = createResultsPages(stack_);
#if TL_UI_HAVE_ANALYSIS
    for (ResultsPage* p : createAnalysisPages(stack_)) resultsPages_.push_back(p);
#endif
    // A results page off screen is brought up to date when it is shown (see onSolved).
    connect(stack_, &QStackedWidget::currentChanged, this, [this](int) {
        auto* page = qobject_cast<ResultsPage*>(stack_->currentWidget());
        if (page && staleResults_.erase(page)) page->setScenario(doc_->model(), outcome_.sheet);
    });
    for (ResultsPage* p : resultsPages_) {
        addPage(p, p->title(), p->key(), pageIcon(p->key()));
        bindFlowMapLayout(p, doc_);  // box positions: saved in the scenario, drags undoable
        connect(p, &ResultsPage::compartmentActivated, this, [this](const QString& name) {
            const auto i = doc_->model().indexOf(name.toStdString());
            if (!i) return;
            showPage(QStringLiteral("compartments"));
            compartments_->view()->goToCell(int(*i), CompartmentTableModel::kNameColumn);
        });
    }
#endif
    compare_ = new ComparePage(stack_);
    addPage(compare_, compare_->title(), compare_->key(), pageIcon(compare_->key()));
    connect(compare_, &ComparePage::openCell, this, &MainWindow::openComparedCell);
    connect(stack_, &QStackedWidget::currentChanged, this, [this](int) {
        if (stack_->currentWidget() == compare_ && compareStale_) refreshCompare();
    });
    connect(doc_, &ProjectDocument::modelChanged, this, [this] { compareStale_ = true; refreshCompare(); });
    connect(doc_, &ProjectDocument::projectChanged, this, [this] { compareStale_ = true; refreshCompare(); });
    ensemble_ = new EnsemblePage(doc_, stack_);
    addPage(ensemble_, ensemble_->title(), ensemble_->key(), pageIcon(ensemble_->key()));
    // Uncertainty bands on the results pages from the scenario's newest stored ensemble run.
    connect(doc_, &ProjectDocument::projectChanged, this, &MainWindow::updateEnsembleBands);
    updateEnsembleBands();
}

void MainWindow::updateEnsembleBands()
{
#if TL_UI_HAVE_RESULTS
    std::shared_ptr<const tl::ensemble::EnsembleSummary> summary;
    QString origin;
    const auto& runs = doc_->project().runs;
    for (auto it = runs.rbegin(); it != runs.rend() && !summary; ++it) {
        if (it->kind != "ensemble" || !tl::sameName(it->scenario, doc_->scenario().name)) continue;
        if (auto s = tl::ensemble::readEnsembleSummary(it->summaryJson)) {
            origin = tr("ensemble run of %1, %2 draws").arg(qs(it->created)).arg(s->draws);
            summary = std::make_shared<const tl::ensemble::EnsembleSummary>(std::move(*s));
        }
    }
    for (ResultsPage* p : resultsPages_) p->setEnsembleBands(summary, origin);
#endif
}

void MainWindow::refreshCompare()
{
    if (!compare_ || stack_->currentWidget() != compare_) return;
    compare_->setProject(doc_->project());
    compareStale_ = false;
}

// A row of the Compare page: the scenario becomes current and the cell behind the row is
// shown in its editing page.
void MainWindow::openComparedCell(const QString& scenario, const QString& compartment, const QString& item)
{
    const auto& scenarios = doc_->project().scenarios;
    for (std::size_t s = 0; s < scenarios.size(); ++s)
        if (tl::sameName(scenarios[s].name, scenario.toStdString()) && int(s) != doc_->currentIndex()) doc_->setCurrentIndex(int(s));
    // The cell is found as the Checks panel finds a problem's cell (goToProblem).
    tl::Problem where;
    where.compartment = compartment.toStdString();
    const QString kind = item.section(QLatin1Char(':'), 0, 0), name = item.section(QLatin1Char(':'), 1);
    if (kind == QStringLiteral("diet") || kind == QStringLiteral("routing")) {
        where.parameter = kind.toStdString();
        if (name != QStringLiteral("import")) where.prey = name.toStdString();
    } else if (kind == QStringLiteral("landings") || kind == QStringLiteral("discards") ||
               kind == QStringLiteral("discard_survival") || kind == QStringLiteral("fleet") ||
               kind == QStringLiteral("discard_pool")) {
        where.parameter = "harvest";
        where.fleet = name.toStdString();
    } else {
        where.parameter = item.toStdString();  // a parameter key opens its column, anything else the name
    }
    if (!goToProblem(where)) showPage(QStringLiteral("compartments"));
    message(tr("Scenario '%1', %2: %3").arg(scenario, compartment.isEmpty() ? tr("harvest") : compartment, item));
}

void MainWindow::buildDocks()
{
    auto dock = [this](QWidget* w, const QString& title, const QString& name, Qt::DockWidgetArea area) {
        auto* d = new QDockWidget(title, this);
        d->setObjectName(name);
        d->setWidget(w);
        d->setFeatures(QDockWidget::DockWidgetMovable | QDockWidget::DockWidgetClosable | QDockWidget::DockWidgetFloatable);
        addDockWidget(area, d);
        return d;
    };
    auto* shelfDock = dock(shelf_, tr("Scenarios"), QStringLiteral("scenarioDock"), Qt::LeftDockWidgetArea);
    auto* confDock = confidenceDock_ = dock(confidence_, tr("Data confidence"), QStringLiteral("confidenceDock"), Qt::RightDockWidgetArea);
    auto* checksDock = dock(checks_, tr("Checks"), QStringLiteral("checksDock"), Qt::BottomDockWidgetArea);
    resizeDocks({shelfDock}, {180}, Qt::Horizontal);
    resizeDocks({confDock}, {220}, Qt::Horizontal);
    resizeDocks({checksDock}, {210}, Qt::Vertical);
    // An empty Checks panel is one line high; problems bring back the list.
    connect(checks_, &ChecksPanel::emptinessChanged, this, [this, checksDock](bool empty) {
        const bool wasCompact = checks_->maximumHeight() < QWIDGETSIZE_MAX;
        if (empty == wasCompact) return;
        if (empty) {
            const auto* summary = checks_->findChild<QLabel*>(QStringLiteral("checksSummary"));
            const QMargins m = checks_->layout()->contentsMargins();
            checks_->setMaximumHeight(summary->sizeHint().height() + m.top() + m.bottom());
        } else {
            checks_->setMaximumHeight(QWIDGETSIZE_MAX);
            resizeDocks({checksDock}, {std::min(210, height() / 4)}, Qt::Vertical);
        }
    });
}

// --- actions and menus ---------------------------------------------------------------------

void MainWindow::buildActions()
{
    auto icon = [](const char* name) { return QIcon(QStringLiteral(":/tl/icons/%1.svg").arg(QLatin1String(name))); };
    QMenu* file = menuBar()->addMenu(tr("&File"));
    QAction* newAct = file->addAction(icon("new"), tr("&New project"), this, [this] {
        if (maybeSave()) doc_->newProject();
    });
    newAct->setShortcut(QKeySequence::New);
    QAction* openAct = file->addAction(icon("open"), tr("&Open…"), this, &MainWindow::openDialog);
    openAct->setShortcut(QKeySequence::Open);
    recentMenu_ = file->addMenu(tr("Open &recent"));
    rebuildRecentMenu();
    file->addSeparator();
    QAction* saveAct = file->addAction(icon("save"), tr("&Save"), this, [this] { save(); });
    saveAct->setShortcut(QKeySequence::Save);
    QAction* saveAsAct = file->addAction(tr("Save &as…"), this, [this] { saveAsDialog(); });
    saveAsAct->setShortcut(QKeySequence::SaveAs);
    file->addSeparator();
    file->addAction(tr("&Import CSV folder as scenario…"), this, &MainWindow::importCsvDialog);
    file->addAction(tr("&Export scenario as CSV folder…"), this, &MainWindow::exportCsvDialog);
    exportFigureAct_ = file->addAction(icon("export-figure"), tr("Export &figure…"), this, &MainWindow::exportFigureDialog);
    exportFigureAct_->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_E));
    exportFigureAct_->setToolTip(tr("Export the chart of this page as PNG, SVG or PDF (results pages)"));
    exportFigureAct_->setEnabled(false);
    reportAct_ = file->addAction(icon("report"), tr("&Report…"), this, &MainWindow::reportDialog);
    reportAct_->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_R));
    reportAct_->setToolTip(tr("Preview a report of the scenario, every scenario or the comparison, and save it as HTML or PDF"));
    file->addSeparator();
    QAction* quitAct = file->addAction(tr("&Quit"), this, &QWidget::close);
    quitAct->setShortcut(QKeySequence::Quit);

    QMenu* edit = menuBar()->addMenu(tr("&Edit"));
    QAction* undoAct = doc_->undoStack()->createUndoAction(this, tr("&Undo"));
    undoAct->setShortcut(QKeySequence::Undo);
    undoAct->setIcon(icon("undo"));
    QAction* redoAct = doc_->undoStack()->createRedoAction(this, tr("&Redo"));
    redoAct->setShortcut(QKeySequence::Redo);
    redoAct->setIcon(icon("redo"));
    edit->addAction(undoAct);
    edit->addAction(redoAct);
    edit->addSeparator();
    auto currentView = [this]() -> LedgerTableView* {
        for (EditingPage* p : editingPages_)
            if (stack_->currentWidget() == p) return p->view();
        return nullptr;
    };
    struct Item { QString text; QKeySequence key; void (LedgerTableView::*slot)(); };
    const Item items[] = {{tr("&Copy"), QKeySequence::Copy, &LedgerTableView::copySelection},
                          {tr("&Paste"), QKeySequence::Paste, &LedgerTableView::pasteClipboard},
                          {tr("Fill &down"), QKeySequence(Qt::CTRL | Qt::Key_D), &LedgerTableView::fillDownSelection},
                          {tr("C&lear cells"), QKeySequence::Delete, &LedgerTableView::clearSelectedCells}};
    for (const Item& it : items) {
        QAction* a = edit->addAction(it.text, this, [currentView, slot = it.slot] {
            if (LedgerTableView* v = currentView()) (v->*slot)();
        });
        // Shown in the menu as a reminder; the table views handle the keys themselves.
        a->setShortcut(it.key);
        a->setShortcutContext(Qt::WidgetShortcut);
    }

    QMenu* project = menuBar()->addMenu(tr("&Project"));
    settingsAct_ = project->addAction(tr("Project &settings…"), this, [this] {
        ProjectSettingsDialog dialog(doc_, this);
        dialog.exec();
    });
    settingsAct_->setToolTip(tr("Units, check rules and the fleets' discard pools"));
    project->addAction(tr("&Fieldwork…"), this, [this] {
        FieldworkDialog dialog(doc_, this);
        dialog.resize(std::min(1200, int(width() * 0.9)), std::min(760, int(height() * 0.9)));
        dialog.exec();
    })->setToolTip(tr("A parameter from survey data (hauls, lengths, stomachs) or a published equation, "
                      "previewed with its interval, written with its CV and source"));

    QMenu* scenario = menuBar()->addMenu(tr("&Scenario"));
    scenario->addAction(tr("&New scenario…"), shelf_, &ScenarioShelf::askNew);
    scenario->addAction(tr("&Duplicate scenario…"), shelf_, &ScenarioShelf::askDuplicate);
    scenario->addAction(tr("&Rename scenario…"), shelf_, &ScenarioShelf::askRename);
    scenario->addAction(tr("De&lete scenario…"), shelf_, &ScenarioShelf::askDelete);
    scenario->addSeparator();
    reconcileAct_ = scenario->addAction(tr("Re&concile…"), this, [this] {
        ReconcileDialog dialog(doc_, this);
        connect(&dialog, &ReconcileDialog::scenarioCreated, this, [this](const QString& name) {
            message(tr("Scenario %1 created from the reconcile; Edit > Undo removes it").arg(name));
        });
        dialog.exec();
    });
    reconcileAct_->setToolTip(tr("Find the smallest confidence-weighted change that balances this scenario, as a new scenario"));

    viewMenu_ = menuBar()->addMenu(tr("&View"));
    for (int i = 0; i < pageCount(); ++i) {
        auto* a = viewMenu_->addAction(pageTitle(i), this, [this, i] { showPage(i); });
        if (i < 9) a->setShortcut(QKeySequence(Qt::CTRL | Qt::Key(Qt::Key_1 + i)));
    }
    viewMenu_->addSeparator();
    for (QDockWidget* d : findChildren<QDockWidget*>()) viewMenu_->addAction(d->toggleViewAction());

    QMenu* help = menuBar()->addMenu(tr("&Help"));
    guideAct_ = help->addAction(tr("&User guide"), this, [this] { showUserGuide(QString()); });
    guideAct_->setShortcut(QKeySequence::HelpContents);
    help->addAction(tr("&Keyboard shortcuts"), this, [this] { showUserGuide(QStringLiteral("keys")); });
    help->addAction(tr("&Problem codes"), this, [this] {
        QDialog dialog(this);
        dialog.setWindowTitle(tr("Problem codes"));
        auto* layout = new QVBoxLayout(&dialog);
        layout->addWidget(new QLabel(tr("Every problem the Checks panel and tledger report, with its usual severity."),
                                     &dialog));
        layout->addWidget(problemCodesTable(&dialog));
        auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, &dialog);
        connect(buttons, &QDialogButtonBox::rejected, &dialog, &QDialog::reject);
        layout->addWidget(buttons);
        dialog.resize(900, 600);
        dialog.exec();
    });
    help->addAction(tr("&About Trophic Ledger"), this, [this] {
        QMessageBox::about(this, tr("About Trophic Ledger"),
                           tr("<p><b>Trophic Ledger</b> %1 — build, check, balance and explore steady-state food-web "
                              "models of lakes, reservoirs and coastal waters.</p><p>%2</p>")
                               .arg(QApplication::applicationVersion(), decisionSupportNotice()));
    });

    QToolBar* bar = addToolBar(tr("Main"));
    bar->setObjectName(QStringLiteral("mainToolBar"));
    bar->setIconSize(QSize(20, 20));
    bar->addAction(newAct);
    bar->addAction(openAct);
    bar->addAction(saveAct);
    bar->addSeparator();
    bar->addAction(undoAct);
    bar->addAction(redoAct);
    bar->addSeparator();
    bar->addAction(exportFigureAct_);
    bar->addAction(reportAct_);
}

// --- model changes and solving -------------------------------------------------------------

void MainWindow::onModelChanged()
{
    runner_->request(doc_->model());
    updateCurrentCell();
}

void MainWindow::onSolved(const SolveOutcome& outcome)
{
    outcome_ = outcome;
    checks_->setProblems(outcome.checks);
    for (EditingPage* p : editingPages_) p->tableModel()->setBalanceSheet(outcome.sheet);
#if TL_UI_HAVE_RESULTS
    // Only the page on screen follows every edit at once: the analyses behind the others
    // (flow-map layout, impacts, indicators) would multiply the time from an edit to its
    // redraw. The others catch up when shown.
    for (ResultsPage* p : resultsPages_) {
        if (p == stack_->currentWidget()) p->setScenario(doc_->model(), outcome.sheet);
        else staleResults_.insert(p);
    }
#endif
    // Balanced only when valid, solved and without errors (core scenarioState).
    statusIcon_->setPixmap(scenarioStateIcon(outcome.state).pixmap(16, 16));
    int errors = 0, warnings = 0;
    for (const auto& p : outcome.checks) (p.severity == tl::Severity::Error ? errors : warnings) += p.severity != tl::Severity::Info;
    QString text = scenarioStateLabel(outcome.state);
    if (errors + warnings > 0) text += tr(" — %1 error(s), %2 warning(s) in Checks").arg(errors).arg(warnings);
    statusText_->setText(text);
    solveNote_->setText(outcome.inBackground ? tr("solved in the background in %1 ms").arg(outcome.milliseconds, 0, 'f', 1)
                                             : tr("solved in %1 ms").arg(outcome.milliseconds, 0, 'f', 1));
}

void MainWindow::updateCurrentCell()
{
    const QModelIndex cur = compartments_->view()->currentIndex();
    if (!cur.isValid() || cur.row() >= int(doc_->model().size())) {
        confidence_->setTarget(std::nullopt, std::nullopt);
        return;
    }
    confidence_->setTarget(std::size_t(cur.row()), CompartmentTableModel::paramOf(cur.column()));
}

void MainWindow::updateTitle()
{
    QString title = doc_->displayName() + QStringLiteral("[*] — ") + qs(doc_->scenario().name);
    if (doc_->origin() == ProjectDocument::Origin::Template) title += tr(" (template)");
    setWindowTitle(title + QStringLiteral(" — Trophic Ledger"));
    setWindowModified(doc_->isModified());
    QList<QWidget*> pages;
    for (int i = 0; i < pageCount(); ++i) pages << page(i);
    setFigureContexts(pages, qs(doc_->scenario().name), doc_->displayName());
    if (doc_->origin() == ProjectDocument::Origin::Template)
        templateNote_->setText(tr("Template (%1): use Save As to keep changes").arg(doc_->templateReason()));
    else if (doc_->origin() == ProjectDocument::Origin::CsvFolder)
        templateNote_->setText(tr("CSV folder: Save writes a new project file"));
    else templateNote_->clear();
}

void MainWindow::message(const QString& text, int ms) { statusBar()->showMessage(text, ms); }

void MainWindow::showBlockReport(const BlockEditReport& report, const QString& action)
{
    if (report.ok()) {
        message(tr("%1: %2").arg(action, report.summary()));
        return;
    }
    // Refused cells are listed one by one; the window stays usable (non-blocking box).
    auto* box = new QMessageBox(QMessageBox::Warning, action, tr("%1: some cells could not be taken.").arg(action),
                                QMessageBox::Ok, this);
    box->setInformativeText(report.summary());
    box->setAttribute(Qt::WA_DeleteOnClose);
    box->open();
    message(report.summary().section(QLatin1Char('\n'), 0, 0), 10000);
}

bool MainWindow::goToProblem(const tl::Problem& p)
{
    const tl::Model& m = doc_->model();
    const auto comp = m.indexOf(p.compartment);
    int prey = -1;  // compartment index of the prey or pool named, if any
    if (const auto i = m.indexOf(p.prey); !p.prey.empty() && i) prey = int(*i);
    if (p.parameter == "diet" && comp) {
        showPage(QStringLiteral("diet"));
        const int row = diet_->diet()->rowOfPredator(*comp);
        if (row < 0) return false;
        if (prey >= 0) diet_->setHideUnusedPrey(false);  // the cell must be visible
        diet_->view()->goToCell(row, prey >= 0 ? prey : diet_->diet()->sumColumn());
        return true;
    }
    if (p.parameter == "routing" && comp) {
        showPage(QStringLiteral("routing"));
        RoutingTableModel* r = routing_->routing();
        const int row = r->rowOfCompartment(*comp);
        int col = r->sumColumn();
        for (int c = 0; prey >= 0 && c < r->sumColumn(); ++c)
            if (int(r->poolOf(c)) == prey) col = c;
        if (row < 0) return false;
        routing_->view()->goToCell(row, col);
        return true;
    }
    if (p.parameter == "harvest" || !p.fleet.empty()) {
        showPage(QStringLiteral("harvest"));
        HarvestTableModel* h = harvest_->harvest();
        const auto fleet = m.fleetIndexOf(p.fleet);
        const int row = comp ? h->rowOfCompartment(*comp) : 0;
        harvest_->view()->goToCell(std::max(0, row), fleet ? int(*fleet) * HarvestTableModel::kFieldsPerFleet : 0);
        return true;
    }
    if (comp) {
        showPage(QStringLiteral("compartments"));
        const auto param = tl::parseParamKey(p.parameter);
        compartments_->view()->goToCell(int(*comp), param ? CompartmentTableModel::columnOf(*param)
                                                          : CompartmentTableModel::kNameColumn);
        return true;
    }
    return false;
}

// --- files ----------------------------------------------------------------------------------

QStringList MainWindow::recentFiles() { return QSettings().value(QLatin1String(kRecentKey)).toStringList(); }

void MainWindow::addRecent(const QString& path)
{
    if (!options_.useSettings) return;
    QSettings s;
    QStringList list = s.value(QLatin1String(kRecentKey)).toStringList();
    list.removeAll(path);
    list.prepend(path);
    while (list.size() > kMaxRecent) list.removeLast();
    s.setValue(QLatin1String(kRecentKey), list);
    rebuildRecentMenu();
}

void MainWindow::rebuildRecentMenu()
{
    if (!recentMenu_) return;
    recentMenu_->clear();
    const QStringList list = options_.useSettings ? recentFiles() : QStringList();
    for (const QString& path : list)
        recentMenu_->addAction(QFileInfo(path).fileName() + QStringLiteral("  —  ") + QFileInfo(path).absolutePath(), this,
                               [this, path] {
                                   if (maybeSave()) openPath(path);
                               });
    recentMenu_->setEnabled(!list.isEmpty());
}

bool MainWindow::openPath(const QString& path, bool asTemplate, QString* error)
{
    QString why;
    if (!doc_->open(path, &why, asTemplate)) {
        if (error) *error = why;
        else QMessageBox::warning(this, tr("Open"), why);
        return false;
    }
    if (!asTemplate) addRecent(QFileInfo(path).absoluteFilePath());
    message(tr("Opened %1").arg(QDir::toNativeSeparators(path)));
    return true;
}

bool MainWindow::saveTo(const QString& path, QString* error)
{
    QString why;
    if (!doc_->saveAs(path, &why)) {
        if (error) *error = why;
        else QMessageBox::warning(this, tr("Save"), why);
        return false;
    }
    addRecent(doc_->filePath());
    message(tr("Saved %1").arg(QDir::toNativeSeparators(doc_->filePath())));
    return true;
}

bool MainWindow::save()
{
    if (doc_->saveNeedsFileName()) return saveAsDialog();
    return saveTo(doc_->filePath());
}

bool MainWindow::saveAsDialog()
{
    QString suggested = doc_->filePath();
    if (doc_->origin() != ProjectDocument::Origin::ProjectFile)
        suggested = QDir::homePath() + QLatin1Char('/') + QFileInfo(doc_->displayName()).completeBaseName() + QStringLiteral(".tledger");
    QString path = QFileDialog::getSaveFileName(this, tr("Save project as"), suggested, tr("Trophic Ledger project (*.tledger)"));
    if (path.isEmpty()) return false;
    if (!path.endsWith(QStringLiteral(".tledger"))) path += QStringLiteral(".tledger");
    return saveTo(path);
}

void MainWindow::openDialog()
{
    if (!maybeSave()) return;
    const QString path = QFileDialog::getOpenFileName(this, tr("Open project"), QString(),
                                                      tr("Trophic Ledger project (*.tledger);;All files (*)"));
    if (!path.isEmpty()) openPath(path);
}

void MainWindow::importCsvDialog()
{
    const QString folder = QFileDialog::getExistingDirectory(this, tr("Import CSV model folder"));
    if (folder.isEmpty()) return;
    bool ok = false;
    const QString name = QInputDialog::getText(this, tr("Import CSV folder"), tr("Scenario name:"), QLineEdit::Normal,
                                               QFileInfo(folder).fileName(), &ok);
    if (!ok) return;
    QString why;
    if (!doc_->importCsvScenario(folder, name, &why)) QMessageBox::warning(this, tr("Import CSV folder"), why);
}

void MainWindow::exportCsvDialog()
{
    const QString folder = QFileDialog::getExistingDirectory(this, tr("Export the scenario into a CSV folder"));
    if (folder.isEmpty()) return;
    QString why;
    if (!doc_->exportCsv(folder, &why)) QMessageBox::warning(this, tr("Export CSV"), why);
    else message(tr("Scenario %1 written to %2").arg(qs(doc_->scenario().name), QDir::toNativeSeparators(folder)));
}

void MainWindow::exportFigureDialog()
{
    FigureSource* figure = figureOf(currentPage());
    if (!figure) {
        message(tr("This page has no figure: open Level bars, Flow map, Impact matrix or Indicators."));
        return;
    }
#if TL_UI_HAVE_RESULTS
    const QString path = exportFigureInteractively(*figure, this);
    if (!path.isEmpty()) message(tr("Figure written to %1").arg(QDir::toNativeSeparators(path)));
#endif
}

bool MainWindow::writeReport(const QString& path, QString* error)
{
    return writeProjectReport(doc_->project(), QFileInfo(doc_->displayName()).completeBaseName(), path, error);
}

void MainWindow::reportDialog()
{
    tl::Project project = doc_->project();
    if (project.info.title.empty()) project.info.title = QFileInfo(doc_->displayName()).completeBaseName().toStdString();
    const QString path = doc_->origin() == ProjectDocument::Origin::ProjectFile ? doc_->filePath() : QString();
    ReportDialog dialog(project, path, doc_->isModified(), qs(doc_->scenario().name), compare_ ? compare_->picked() : QStringList(),
                        this);
    dialog.exec();
}

void MainWindow::showUserGuide(const QString& section)
{
    // One guide window, kept and raised again; its shortcut table is read from the menus now.
    auto* guide = findChild<HelpWindow*>();
    if (!guide) {
        guide = new HelpWindow(menuBar()->actions(), this);
        guide->setModal(false);
    }
    guide->show();
    guide->raise();
    if (!section.isEmpty()) guide->showSection(section);
}

bool MainWindow::maybeSave()
{
    if (!doc_->isModified() || !options_.askBeforeClosing) return true;
    const auto answer = QMessageBox::warning(this, tr("Unsaved changes"),
                                             tr("%1 has unsaved changes. Save them?").arg(doc_->displayName()),
                                             QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel,
                                             QMessageBox::Save);
    if (answer == QMessageBox::Cancel) return false;
    if (answer == QMessageBox::Save) return save();
    return true;
}

bool MainWindow::offerRecovery()
{
    const QList<RecoveryEntry> found = RecoveryKeeper::findRecoverable(recovery_->directory());
    if (found.isEmpty()) return false;
    const RecoveryEntry& e = found.front();
    const auto answer = QMessageBox::question(
        this, tr("Recover unsaved work"),
        tr("Trophic Ledger did not close normally. Unsaved work on %1 was kept at %2.\nRecover it?")
            .arg(e.displayName, QLocale().toString(e.saved.toLocalTime(), QLocale::ShortFormat)),
        QMessageBox::Yes | QMessageBox::Discard | QMessageBox::Ignore, QMessageBox::Yes);
    if (answer == QMessageBox::Discard) {
        RecoveryKeeper::remove(e);
        return false;
    }
    if (answer != QMessageBox::Yes) return false;
    QString why;
    if (!RecoveryKeeper::recover(e, doc_, &why)) {
        QMessageBox::warning(this, tr("Recover unsaved work"), why);
        return false;
    }
    message(tr("Recovered unsaved work; save it to keep it."));
    return true;
}

void MainWindow::closeEvent(QCloseEvent* event)
{
    if (!maybeSave()) {
        event->ignore();
        return;
    }
    recovery_->discard();
    if (options_.useSettings) {
        QSettings s;
        s.setValue(QLatin1String(kGeometryKey), saveGeometry());
        s.setValue(QLatin1String(kStateKey), saveState());
    }
    event->accept();
}

void MainWindow::dragEnterEvent(QDragEnterEvent* event)
{
    const QList<QUrl> urls = event->mimeData()->urls();
    if (urls.size() == 1 && urls.front().isLocalFile()) {
        const QString path = urls.front().toLocalFile();
        if (path.endsWith(QStringLiteral(".tledger")) || looksLikeCsvFolder(path)) event->acceptProposedAction();
    }
}

void MainWindow::dropEvent(QDropEvent* event)
{
    const QString path = event->mimeData()->urls().front().toLocalFile();
    event->acceptProposedAction();
    // Opened after the drop returns, so a question about unsaved changes does not block the drag source.
    QTimer::singleShot(0, this, [this, path] {
        if (maybeSave()) openPath(path);
    });
}

// --- snapshots ----------------------------------------------------------------------------------

QStringList MainWindow::renderSnapshots(const QString& dir, QString* error)
{
    QStringList written;
    if (!QDir().mkpath(dir)) {
        if (error) *error = tr("Cannot create %1.").arg(dir);
        return written;
    }
    if (!isVisible()) {
        resize(1600, 1000);
        show();
    }
    runner_->waitForIdle();
    for (int i = 0; i < pageCount(); ++i) {
        showPage(i);
        for (int k = 0; k < 5; ++k) QApplication::processEvents();
        const QImage image = grab().toImage();
        const QString file = QStringLiteral("%1/%2-%3.png").arg(dir).arg(i + 1, 2, 10, QLatin1Char('0')).arg(pageKey(i));
        if (!image.save(file)) {
            if (error) *error = tr("Cannot write %1.").arg(file);
            return written;
        }
        written << file;
    }
    // The Ensemble page after a run of the current scenario: its percentiles, then the
    // distribution and drivers of the first EE. The run is not stored: snapshots change
    // nothing in the document (not even its undo history).
    if (ensemble_) {
        showPage(ensemble_->key());
        const QString draws = ensemble_->drawsEdit()->text();
        ensemble_->drawsEdit()->setText(QStringLiteral("20000"));
        ensemble_->setStoreRuns(false);
        if (ensemble_->run()) {
            ensemble_->waitForIdle();
            for (int tab = 0; tab < 2; ++tab) {
                ensemble_->tabs()->setCurrentIndex(tab);
                for (int k = 0; k < 5; ++k) QApplication::processEvents();
                const QString file = QStringLiteral("%1/%2-ensemble-%3.png")
                                         .arg(dir)
                                         .arg(written.size() + 1, 2, 10, QLatin1Char('0'))
                                         .arg(tab == 0 ? QStringLiteral("percentiles") : QStringLiteral("distribution"));
                if (!grab().toImage().save(file)) {
                    if (error) *error = tr("Cannot write %1.").arg(file);
                    ensemble_->setStoreRuns(true);
                    return written;
                }
                written << file;
            }
            ensemble_->tabs()->setCurrentIndex(0);
        }
        ensemble_->setStoreRuns(true);
        ensemble_->drawsEdit()->setText(draws);
    }
    // The Reconcile dialog on the current scenario: its settings, then its report.
    ReconcileDialog dialog(doc_, this);
    dialog.show();
    auto grabDialog = [&](const QString& key) {
        for (int k = 0; k < 5; ++k) QApplication::processEvents();
        const QString file = QStringLiteral("%1/%2-%3.png").arg(dir).arg(written.size() + 1, 2, 10, QLatin1Char('0')).arg(key);
        if (!dialog.grab().toImage().save(file)) {
            if (error) *error = tr("Cannot write %1.").arg(file);
            return false;
        }
        written << file;
        return true;
    };
    if (!grabDialog(QStringLiteral("dialog-reconcile-settings"))) return written;
    if (dialog.run()) {
        dialog.runner()->waitForIdle();
        if (dialog.showingReport() && !grabDialog(QStringLiteral("dialog-reconcile-report"))) return written;
    }
    dialog.reject();
    showPage(0);
    return written;
}

}  // namespace tl::ui
