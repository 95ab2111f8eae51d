#include "ui/ensemble/ensemble_page.h"

#include <QCheckBox>
#include <QComboBox>
#include <QFutureWatcher>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QSortFilterProxyModel>
#include <QSpinBox>
#include <QSplitter>
#include <QTabWidget>
#include <QTableView>
#include <QTableWidget>
#include <QThread>
#include <QVBoxLayout>
#include <QtConcurrent/QtConcurrentRun>
#include <charconv>

#include "core/ensemble/ensemble_report.h"
#include "core/model/names.h"
#include "core/sensitivity/strongest_drivers.h"
#include "ui/document/project_document.h"
#include "ui/ensemble/ensemble_charts.h"
#include "ui/ensemble/ensemble_models.h"
#include "ui/style/palette.h"
#include "ui/style/wrapping_row.h"
#include "ui/widgets/number_text.h"

namespace tl::ui {
namespace {

using namespace tl::ensemble;

QString qs(const std::string& s) { return QString::fromStdString(s); }

std::optional<std::uint64_t> wholeNumber(const QString& text)
{
    const std::string t = text.trimmed().toStdString();
    std::uint64_t v = 0;
    const auto [end, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
    if (t.empty() || ec != std::errc{} || end != t.data() + t.size()) return std::nullopt;
    return v;
}

QTableView* makeTable(QWidget* parent, QAbstractItemModel* model, const QString& name)
{
    auto* view = new QTableView(parent);
    view->setObjectName(name);
    view->setModel(model);
    view->setSortingEnabled(true);
    view->setSelectionBehavior(QAbstractItemView::SelectRows);
    view->setSelectionMode(QAbstractItemView::SingleSelection);
    view->setEditTriggers(QAbstractItemView::NoEditTriggers);
    view->setAlternatingRowColors(true);
    view->setWordWrap(false);
    view->verticalHeader()->hide();
    view->horizontalHeader()->setStretchLastSection(true);
    return view;
}

QSortFilterProxyModel* sortable(QObject* parent, QAbstractItemModel* source)
{
    auto* proxy = new QSortFilterProxyModel(parent);
    proxy->setSourceModel(source);
    proxy->setSortRole(Qt::UserRole);
    proxy->setFilterCaseSensitivity(Qt::CaseInsensitive);
    proxy->setFilterKeyColumn(-1);
    return proxy;
}

// One decimal, but a small share keeps two significant digits ("0.01 %", never "0.0 %").
QString percentText(double share)
{
    if (share > 0.0 && share < 0.001) return QStringLiteral("%1 %").arg(100.0 * share, 0, 'g', 2);
    return QStringLiteral("%1 %").arg(100.0 * share, 0, 'f', 1);
}

}  // namespace

EnsemblePage::EnsemblePage(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc)
{
    setObjectName(QStringLiteral("ensemblePage"));
    runner_ = new EnsembleRunner(this);
    auto* layout = new QVBoxLayout(this);

    heading_ = new QLabel(this);
    heading_->setObjectName(QStringLiteral("ensembleHeading"));
    heading_->setWordWrap(true);
    layout->addWidget(heading_);

    // Settings, in a row that wraps on a narrow window.
    auto* settingsBox = new QWidget(this);
    auto* settings = new WrappingRow(settingsBox);
    settings->setContentsMargins(0, 0, 0, 0);
    auto labelled = [&](const QString& text, QWidget* field, const QString& tip) {
        auto* box = new QWidget(settingsBox);
        auto* row = new QHBoxLayout(box);
        row->setContentsMargins(0, 0, 0, 0);
        auto* label = new QLabel(text, box);
        label->setBuddy(field);
        field->setParent(box);
        field->setToolTip(tip);
        row->addWidget(label);
        row->addWidget(field);
        settings->addWidget(box);
    };
    draws_ = new QLineEdit(QStringLiteral("2000"));
    draws_->setObjectName(QStringLiteral("ensembleDraws"));
    draws_->setMaximumWidth(90);
    labelled(tr("&Draws:"), draws_, tr("How many sets of inputs to draw and solve (1 or more)"));
    seed_ = new QLineEdit(QStringLiteral("1"));
    seed_->setObjectName(QStringLiteral("ensembleSeed"));
    seed_->setMaximumWidth(90);
    labelled(tr("S&eed:"), seed_, tr("Any whole number: the same seed gives the same result on any number of threads"));
    threads_ = new QSpinBox;
    threads_->setObjectName(QStringLiteral("ensembleThreads"));
    threads_->setRange(1, 256);
    threads_->setValue(std::max(1, QThread::idealThreadCount()));
    labelled(tr("&Threads:"), threads_, tr("Threads that solve draws; the result does not depend on it"));
    shape_ = new QComboBox;
    shape_->setObjectName(QStringLiteral("ensembleShape"));
    for (Shape s : {Shape::Lognormal, Shape::TruncatedNormal, Shape::Uniform, Shape::Triangular})
        shape_->addItem(qs(std::string(shapeKey(s))), int(s));
    labelled(tr("&Inputs drawn:"), shape_,
             tr("Distribution of each drawn B, P/B, Q/B, EE and P/Q around its value, with the CV of its confidence grade"));
    dietCv_ = new QLineEdit;
    dietCv_->setObjectName(QStringLiteral("ensembleDietCv"));
    dietCv_->setMaximumWidth(70);
    dietCv_->setPlaceholderText(tr("grade C"));
    labelled(tr("Diet &CV:"), dietCv_,
             tr("CV given to the largest share of each diet row (Dirichlet); empty: the project's CV of grade C"));
    tl_ = new QCheckBox(tr("Trophic levels"), settingsBox);
    tl_->setObjectName(QStringLiteral("ensembleTl"));
    tl_->setChecked(true);
    levels_ = new QCheckBox(tr("Transfer efficiency by level"), settingsBox);
    levels_->setObjectName(QStringLiteral("ensembleLevels"));
    levels_->setToolTip(tr("Costs more per draw; gives the level bars their intervals"));
    indicators_ = new QCheckBox(tr("System indicators"), settingsBox);
    indicators_->setObjectName(QStringLiteral("ensembleIndicators"));
    indicators_->setToolTip(tr("Costs more per draw"));
    settings->addWidget(tl_);
    settings->addWidget(levels_);
    settings->addWidget(indicators_);
    layout->addWidget(settingsBox);

    auto* runRow = new QHBoxLayout;
    runButton_ = new QPushButton(tr("&Run"), this);
    runButton_->setObjectName(QStringLiteral("ensembleRun"));
    cancelButton_ = new QPushButton(tr("Cancel"), this);
    cancelButton_->setObjectName(QStringLiteral("ensembleCancel"));
    cancelButton_->setEnabled(false);
    progress_ = new QProgressBar(this);
    progress_->setObjectName(QStringLiteral("ensembleProgress"));
    progress_->setRange(0, 1000);
    progress_->setValue(0);
    progress_->setTextVisible(true);
    progress_->setFormat(QString());
    status_ = new QLabel(this);
    status_->setObjectName(QStringLiteral("ensembleStatus"));
    status_->setWordWrap(true);
    runRow->addWidget(runButton_);
    runRow->addWidget(cancelButton_);
    runRow->addWidget(progress_, 1);
    runRow->addWidget(status_, 2);
    layout->addLayout(runRow);

    summary_ = new QLabel(this);
    summary_->setObjectName(QStringLiteral("ensembleSummary"));
    summary_->setWordWrap(true);
    summary_->setTextInteractionFlags(Qt::TextSelectableByMouse);
    layout->addWidget(summary_);

    tabs_ = new QTabWidget(this);
    tabs_->setObjectName(QStringLiteral("ensembleTabs"));
    // Percentiles.
    auto* percentTab = new QWidget(tabs_);
    auto* percentLayout = new QVBoxLayout(percentTab);
    filter_ = new QLineEdit(percentTab);
    filter_->setObjectName(QStringLiteral("ensembleFilter"));
    filter_->setPlaceholderText(tr("Filter by compartment or output"));
    filter_->setClearButtonEnabled(true);
    percentiles_ = new PercentileTableModel(this);
    percentileProxy_ = sortable(this, percentiles_);
    percentileView_ = makeTable(percentTab, percentileProxy_, QStringLiteral("ensemblePercentiles"));
    percentileView_->horizontalHeader()->setSortIndicator(-1, Qt::AscendingOrder);
    percentileView_->horizontalHeader()->setStretchLastSection(false);
    percentLayout->addWidget(filter_);
    percentLayout->addWidget(percentileView_, 1);
    tabs_->addTab(percentTab, tr("Percentiles"));
    // Distribution and drivers of one output.
    auto* chartTab = new QWidget(tabs_);
    auto* chartLayout = new QVBoxLayout(chartTab);
    auto* chooseRow = new QHBoxLayout;
    output_ = new QComboBox(chartTab);
    output_->setObjectName(QStringLiteral("ensembleOutput"));
    output_->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    output_->setMaxVisibleItems(20);
    auto* outputLabel = new QLabel(tr("&Output:"), chartTab);
    outputLabel->setBuddy(output_);
    chooseRow->addWidget(outputLabel);
    chooseRow->addWidget(output_);
    chooseRow->addStretch(1);
    chartLayout->addLayout(chooseRow);
    auto* charts = new QSplitter(Qt::Horizontal, chartTab);
    histogram_ = new OutputHistogram(charts);
    tornado_ = new DriversTornado(charts);
    charts->addWidget(histogram_);
    charts->addWidget(tornado_);
    charts->setChildrenCollapsible(false);
    chartLayout->addWidget(charts, 1);
    tabs_->addTab(chartTab, tr("Distribution and drivers"));
    // Breakers.
    breakers_ = new BreakersModel(this);
    breakersView_ = makeTable(tabs_, sortable(this, breakers_), QStringLiteral("ensembleBreakers"));
    tabs_->addTab(breakersView_, tr("Balance breakers"));
    // Stored runs.
    storedRuns_ = new QTableWidget(0, 5, tabs_);
    storedRuns_->setObjectName(QStringLiteral("ensembleStoredRuns"));
    storedRuns_->setHorizontalHeaderLabels({tr("Stored (UTC)"), tr("Draws"), tr("Seed"), tr("Balanced"), tr("Analyses")});
    storedRuns_->setSelectionBehavior(QAbstractItemView::SelectRows);
    storedRuns_->setSelectionMode(QAbstractItemView::SingleSelection);
    storedRuns_->setEditTriggers(QAbstractItemView::NoEditTriggers);
    storedRuns_->verticalHeader()->hide();
    storedRuns_->horizontalHeader()->setStretchLastSection(true);
    storedRuns_->setToolTip(tr("Runs kept with this scenario (double-click or Enter shows one)"));
    tabs_->addTab(storedRuns_, tr("Stored runs"));
    layout->addWidget(tabs_, 1);

    notice_ = new QLabel(decisionSupportNotice(), this);
    notice_->setObjectName(QStringLiteral("ensembleNotice"));
    notice_->setWordWrap(true);
    QFont small = notice_->font();
    small.setPointSizeF(small.pointSizeF() * 0.9);
    notice_->setFont(small);
    layout->addWidget(notice_);

    connect(runButton_, &QPushButton::clicked, this, [this] { run(); });
    connect(cancelButton_, &QPushButton::clicked, this, &EnsemblePage::cancel);
    for (QLineEdit* e : {draws_, seed_, dietCv_}) connect(e, &QLineEdit::returnPressed, this, [this] { run(); });
    connect(runner_, &EnsembleRunner::progressed, this, &EnsemblePage::onProgress);
    connect(runner_, &EnsembleRunner::finished, this, &EnsemblePage::onFinished);
    connect(filter_, &QLineEdit::textChanged, percentileProxy_, &QSortFilterProxyModel::setFilterFixedString);
    connect(output_, &QComboBox::currentIndexChanged, this, [this] { drawChosen(); });
    connect(percentileView_, &QTableView::activated, this, [this](const QModelIndex& index) {
        chooseOutput(index.data(PercentileTableModel::kOutputNameRole).toString());
        tabs_->setCurrentIndex(1);
    });
    connect(storedRuns_, &QTableWidget::activated, this, [this](const QModelIndex& index) { showStoredRun(index.row()); });
    connect(doc_, &ProjectDocument::projectChanged, this, &EnsemblePage::onScenarioChanged);
    connect(doc_, &ProjectDocument::modelChanged, this, &EnsemblePage::onScenarioChanged);

    onScenarioChanged();
}

EnsemblePage::~EnsemblePage() = default;

bool EnsemblePage::busy() const { return runner_->busy(); }
void EnsemblePage::waitForIdle() { runner_->waitForIdle(); }
QString EnsemblePage::statusText() const { return status_->text(); }
QString EnsemblePage::summaryText() const { return summary_->text(); }
QString EnsemblePage::noticeText() const { return notice_->text(); }

void EnsemblePage::setStatus(const QString& text, bool problem)
{
    status_->setText(text);
    status_->setStyleSheet(problem ? QStringLiteral("color: #b00020;") : QString());
}

void EnsemblePage::setRunning(bool running)
{
    runButton_->setEnabled(!running);
    cancelButton_->setEnabled(running);
    for (QWidget* w : std::initializer_list<QWidget*>{draws_, seed_, threads_, shape_, dietCv_, tl_, levels_, indicators_})
        w->setEnabled(!running);
}

bool EnsemblePage::run()
{
    if (busy()) {
        setStatus(tr("A run is going; cancel it first."), true);
        return false;
    }
    EnsembleSettings s;
    const auto draws = wholeNumber(draws_->text());
    if (!draws || *draws == 0 || *draws > 0xFFFFFFFFull) {
        setStatus(tr("Draws: '%1' is not a whole number from 1 to 4294967295.").arg(draws_->text()), true);
        draws_->setFocus();
        return false;
    }
    const auto seed = wholeNumber(seed_->text());
    if (!seed) {
        setStatus(tr("Seed: '%1' is not a whole number from 0 to 18446744073709551615.").arg(seed_->text()), true);
        seed_->setFocus();
        return false;
    }
    if (!dietCv_->text().trimmed().isEmpty()) {
        const auto cv = parseTypedNumber(dietCv_->text());
        if (!cv || *cv < 0.0 || *cv > 10.0) {
            setStatus(tr("Diet CV: '%1' is not a CV from 0 to 10 (0.3 = 30 %; empty: grade C).").arg(dietCv_->text()), true);
            dietCv_->setFocus();
            return false;
        }
        s.dietCv = *cv;
    }
    s.draws = *draws;
    s.seed = *seed;
    s.threads = unsigned(threads_->value());
    s.shape = Shape(shape_->currentData().toInt());
    s.analyses.trophicLevels = tl_->isChecked();
    s.analyses.levels = levels_->isChecked();
    s.analyses.indicators = indicators_->isChecked();
    const QString scenario = qs(doc_->scenario().name);
    if (!runner_->start(doc_->model(), s, scenario)) return false;
    setRunning(true);
    progress_->setValue(0);
    progress_->setFormat(tr("%1 draws").arg(*draws));
    setStatus(tr("Drawing and solving scenario '%1'…").arg(scenario));
    return true;
}

void EnsemblePage::cancel()
{
    if (!busy()) return;
    runner_->cancel();
    setStatus(tr("Cancelling…"));
}

void EnsemblePage::onProgress(quint64 done, quint64 total, double seconds)
{
    progress_->setValue(total ? int(1000.0 * double(done) / double(total)) : 0);
    progress_->setFormat(tr("%1 of %2 draws").arg(done).arg(total));
    if (!status_->text().startsWith(tr("Cancelling")))
        setStatus(tr("Drawing and solving… %1 s").arg(seconds, 0, 'f', 1));
}

void EnsemblePage::onFinished(std::shared_ptr<const EnsembleOutcome> outcome)
{
    setRunning(false);
    if (!outcome) return;
    const EnsembleRun& run = outcome->run;
    if (!run.ran()) {
        progress_->setValue(0);
        progress_->setFormat(QString());
        setStatus(tr("Scenario '%1' cannot be run: %2").arg(outcome->scenario, ProjectDocument::describeProblems(run.problems, 3)), true);
        return;
    }
    const EnsembleStatistics& st = run.statistics;
    live_ = outcome;
    const std::string json = ensembleJson(st);
    std::string why;
    const auto summary = readEnsembleSummary(json, &why);
    if (!summary) {  // cannot happen: the core wrote it; said rather than hidden
        setStatus(tr("The run's summary cannot be read: %1").arg(qs(why)), true);
        return;
    }
    progress_->setValue(st.cancelled ? progress_->value() : 1000);
    progress_->setFormat(tr("%1 of %2 draws").arg(st.drawsRun).arg(st.totalDraws));
    showSummary(*summary, st.cancelled ? tr("cancelled run, %1 s (not stored)").arg(outcome->seconds, 0, 'f', 1)
                                : tr("this run, %1 s").arg(outcome->seconds, 0, 'f', 1),
                outcome->scenario);
    shownIsLive_ = true;
    drawChosen();
    if (outcome->scenario != qs(doc_->scenario().name)) onScenarioChanged();  // switched while it ran
    if (st.cancelled) {
        setStatus(tr("Cancelled after %1 of %2 draws; the figures cover those only.").arg(st.drawsRun).arg(st.totalDraws));
        return;
    }
    if (!storeRuns_) {
        setStatus(tr("Done (not stored)."));
        return;
    }
    storeRun(*outcome, json);
    setStatus(st.balanced ? tr("Done; stored with scenario '%1' (written when the project is saved).").arg(outcome->scenario)
                          : tr("Done, but no draw balanced: the balance breakers name the compartments that fail."),
              st.balanced == 0);
}

void EnsemblePage::storeRun(const EnsembleOutcome& outcome, const std::string& summaryJson)
{
    // Stored beside the scenario it was run on (it may no longer be the current one).
    tl::Project after = doc_->project();
    if (!after.findScenario(outcome.scenario.toStdString())) return;
    tl::StoredRun stored;
    stored.scenario = outcome.scenario.toStdString();
    stored.kind = "ensemble";
    stored.settingsJson = ensembleSettingsJson(outcome.settings, stored.scenario);
    stored.summaryJson = summaryJson;
    stored.created = tl::utcNowIso8601();
    after.runs.push_back(std::move(stored));
    doc_->editProject(after, doc_->currentIndex(), tr("Store ensemble run of '%1'").arg(outcome.scenario));
    emit runStored();
}

void EnsemblePage::showSummary(const EnsembleSummary& s, const QString& origin, const QString& scenario)
{
    shown_ = s;
    shownIsLive_ = false;
    shownScenario_ = scenario;
    percentiles_->setSummary(s);
    breakers_->setSummary(s);
    percentileView_->resizeColumnsToContents();
    breakersView_->resizeColumnsToContents();
    summary_->setText(tr("<b>Balanced in %1 of %2 draws (%3)</b> · seed %4 · inputs %5 · %6 · outputs over the balanced draws; "
                         "held at their values: %7")
                          .arg(s.balanced)
                          .arg(s.draws)
                          .arg(percentText(s.balancedShare))
                          .arg(qs(s.seed), qs(s.shape), origin.toHtmlEscaped(), QString::fromUtf8(kHeldFixed)));
    fillOutputChoice();
}

void EnsemblePage::fillOutputChoice()
{
    const QString keep = chosenOutput();
    QSignalBlocker block(output_);
    output_->clear();
    if (shown_)
        for (const OutputSummary& o : shown_->outputs)
            if (o.count > 0) output_->addItem(outputLabel(o.name), qs(o.name));
    int i = output_->findData(keep);
    if (i < 0) {
        // First pick: the first EE (what a modeller asks about first), else the first output.
        for (int k = 0; k < output_->count() && i < 0; ++k)
            if (output_->itemData(k).toString().endsWith(QStringLiteral(".ee"))) i = k;
    }
    output_->setCurrentIndex(std::max(i, output_->count() ? 0 : -1));
}

void EnsemblePage::chooseOutput(const QString& name)
{
    const int i = output_->findData(name);
    if (i >= 0) output_->setCurrentIndex(i);
}

QString EnsemblePage::chosenOutput() const { return output_->currentData().toString(); }

void EnsemblePage::drawChosen()
{
    const QString name = chosenOutput();
    if (shown_ && name.isEmpty()) {
        histogram_->showMessage(tr("No draw balanced: no distribution to show"));
        tornado_->showMessage(tr("No output to show the drivers of"));
        return;
    }
    if (!shown_ || name.isEmpty()) {
        histogram_->showMessage(tr("Run an ensemble to see the distribution of an output"));
        tornado_->showMessage(tr("Choose an output to see what drives it"));
        return;
    }
    const std::string key = name.toStdString();
    const OutputSummary* o = shown_->find(key);
    if (!o) return;
    if (shownIsLive_ && live_) {
        const EnsembleStatistics& st = live_->run.statistics;
        for (std::size_t k = 0; k < st.outputNames.size(); ++k)
            if (st.outputNames[k] == key) histogram_->showOutput(outputLabel(key), histogramBars(st.outputs[k], OutputHistogram::kBars), *o);
    } else {
        histogram_->showMessage(tr("A stored run keeps percentiles, not the distribution:\nrun again to see it"));
    }
    // Drivers at the point estimate of the current scenario. One output's elasticities
    // need one factorisation (or two solves per input for an over-determined system):
    // small, but kept off the GUI thread for large models.
    const tl::Model& model = doc_->model();
    if (model.size() <= 200) {
        const auto drivers = tl::strongestDrivers(model, key, DriversTornado::kMaxRows);
        if (!drivers.error.empty()) tornado_->showMessage(qs(drivers.error));
        else tornado_->showDrivers(outputLabel(key), drivers);
        return;
    }
    tornado_->showMessage(tr("Computing the drivers…"));
    auto* watcher = new QFutureWatcher<tl::StrongestDrivers>(this);
    connect(watcher, &QFutureWatcherBase::finished, this, [this, watcher, name] {
        watcher->deleteLater();
        if (chosenOutput() != name) return;  // another output was chosen meanwhile
        const tl::StrongestDrivers d = watcher->result();
        if (!d.error.empty()) tornado_->showMessage(qs(d.error));
        else tornado_->showDrivers(outputLabel(name.toStdString()), d);
    });
    watcher->setFuture(QtConcurrent::run([model, key] { return tl::strongestDrivers(model, key, DriversTornado::kMaxRows); }));
}

void EnsemblePage::refreshStoredRuns()
{
    const tl::Project& p = doc_->project();
    const std::string scenario = doc_->scenario().name;
    storedIndex_.clear();
    for (int k = int(p.runs.size()) - 1; k >= 0; --k)  // newest first
        if (p.runs[std::size_t(k)].kind == "ensemble" && tl::sameName(p.runs[std::size_t(k)].scenario, scenario))
            storedIndex_.push_back(k);
    storedRuns_->setRowCount(int(storedIndex_.size()));
    for (int row = 0; row < int(storedIndex_.size()); ++row) {
        const tl::StoredRun& r = p.runs[std::size_t(storedIndex_[std::size_t(row)])];
        const auto s = readEnsembleSummary(r.summaryJson);
        auto set = [&](int column, const QString& text) { storedRuns_->setItem(row, column, new QTableWidgetItem(text)); };
        set(0, qs(r.created));
        if (!s) {
            set(1, tr("summary unreadable"));
            continue;
        }
        set(1, QString::number(s->draws));
        set(2, qs(s->seed));
        set(3, percentText(s->balancedShare));
        QStringList analyses;
        for (const std::string& a : s->analyses) analyses << qs(a);
        set(4, analyses.join(QStringLiteral(", ")));
    }
    storedRuns_->resizeColumnsToContents();
    tabs_->setTabText(3, storedIndex_.empty() ? tr("Stored runs") : tr("Stored runs (%1)").arg(storedIndex_.size()));
}

int EnsemblePage::storedRunCount() const { return int(storedIndex_.size()); }

bool EnsemblePage::showStoredRun(int row)
{
    if (row < 0 || row >= int(storedIndex_.size())) return false;
    const tl::StoredRun& r = doc_->project().runs[std::size_t(storedIndex_[std::size_t(row)])];
    std::string why;
    const auto s = readEnsembleSummary(r.summaryJson, &why);
    if (!s) {
        setStatus(tr("Stored run of %1 cannot be read: %2").arg(qs(r.created), qs(why)), true);
        return false;
    }
    showSummary(*s, tr("stored %1").arg(qs(r.created)), qs(r.scenario));
    drawChosen();
    return true;
}

void EnsemblePage::onScenarioChanged()
{
    const QString scenario = qs(doc_->scenario().name);
    heading_->setText(tr("<b>Ensemble of scenario '%1'</b>: every given B, P/B, Q/B, EE and P/Q drawn from its data "
                         "confidence, diets from a Dirichlet; each draw solved. How sure are the results?")
                          .arg(scenario.toHtmlEscaped()));
    refreshStoredRuns();
    if (shown_ && shownScenario_ == scenario) {
        drawChosen();  // the drivers follow the scenario's point estimate
        return;
    }
    // Nothing shown yet, or what is shown belongs to another scenario: show this one's
    // newest stored run, or nothing.
    shown_.reset();
    shownIsLive_ = false;
    percentiles_->clear();
    breakers_->clear();
    output_->clear();
    summary_->setText(tr("No run of scenario '%1' yet: choose the settings and press Run.").arg(scenario.toHtmlEscaped()));
    if (!showStoredRun(0)) drawChosen();
}

}  // namespace tl::ui
