#include "ui/reconcile/reconcile_dialog.h"

#include <QCheckBox>
#include <QDialogButtonBox>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QProgressBar>
#include <QPushButton>
#include <QSplitter>
#include <QStackedWidget>
#include <QTableWidget>
#include <QVBoxLayout>
#include <cmath>
#include <tuple>

#include "core/balance/solver.h"
#include "core/model/text.h"
#include "core/reconcile/reconciled_scenario.h"
#include "core/store/project.h"
#include "ui/document/project_document.h"
#include "ui/reconcile/ee_change_chart.h"
#include "ui/reconcile/reconcile_runner.h"
#include "ui/style/palette.h"
#include "ui/style/wrapping_row.h"
#include "ui/widgets/number_text.h"
#include "ui/widgets/scenario_shelf.h"

namespace tl::ui {
namespace {

QString qs(const std::string& s) { return QString::fromStdString(s); }
QString number(double v) { return QString::number(v, 'g', 4); }

QTableWidgetItem* readOnlyItem(const QString& text)
{
    auto* item = new QTableWidgetItem(text);
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable);
    return item;
}

QTableWidgetItem* pinItem(bool applies, const QString& tip)
{
    auto* item = new QTableWidgetItem;
    if (!applies) {
        item->setFlags(Qt::NoItemFlags);  // nothing to pin: no box
        return item;
    }
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable | Qt::ItemIsUserCheckable);
    item->setCheckState(Qt::Unchecked);
    item->setToolTip(tip);
    return item;
}

QString inputLabel(const tl::Model& model, const tl::ReconcileChange& ch)
{
    if (ch.param == tl::AdjustParam::Diet) return QObject::tr("diet: %1").arg(qs(model.compartment(ch.prey).name));
    return qs(std::string(tl::adjustSymbol(ch.param)));
}

}  // namespace

bool addReconciledScenario(ProjectDocument* doc, int from, const tl::Model& reconciled, const tl::ReconcileResult& result,
                           const tl::ReconcileOptions& options, const QString& name, QString* why)
{
    const auto& scenarios = doc->project().scenarios;
    if (from < 0 || from >= int(scenarios.size()) || !(scenarios[std::size_t(from)].model == reconciled)) {
        if (why) *why = QObject::tr("The scenario was edited after reconcile ran; run it again.");
        return false;
    }
    if (result.status != tl::ReconcileStatus::Balanced && result.status != tl::ReconcileStatus::LeastViolating) {
        if (why) *why = QObject::tr("There is no change to keep.");
        return false;
    }
    const QString n = checkScenarioName(doc->project(), name, -1, why);
    if (n.isEmpty()) return false;
    tl::Project after = doc->project();
    const QString sourceName = qs(after.scenarios[std::size_t(from)].name);
    const std::string date = tl::utcNowIso8601();
    tl::Scenario made = tl::reconciledScenario(after.scenarios[std::size_t(from)], result, n.toStdString(), date);
    after.runs.push_back(tl::reconcileRun(after.scenarios[std::size_t(from)], result, options, made.name, date));
    after.scenarios.insert(after.scenarios.begin() + from + 1, std::move(made));  // (invalidates references into it)
    doc->editProject(after, from + 1, QObject::tr("Reconcile %1 into new scenario %2").arg(sourceName, n));
    return true;
}

ReconcileDialog::ReconcileDialog(ProjectDocument* doc, QWidget* parent)
    : QDialog(parent), doc_(doc), from_(doc->currentIndex()), model_(doc->model()), runner_(new ReconcileRunner(this))
{
    setObjectName(QStringLiteral("reconcileDialog"));
    setWindowTitle(tr("Reconcile %1").arg(qs(doc->scenario().name)));
    auto* intro = new QLabel(tr("Finds the smallest change to the inputs of <b>%1</b>, weighted by their data "
                                "confidence, that balances it (every EE within its bounds, P/Q within its range, "
                                "respiration not negative, detritus not over-eaten). The result becomes a new "
                                "scenario; %1 itself is not changed.")
                                 .arg(qs(doc->scenario().name).toHtmlEscaped()),
                             this);
    intro->setWordWrap(true);
    pages_ = new QStackedWidget(this);
    pages_->addWidget(buildSettingsPage());
    pages_->addWidget(buildReportPage());
    auto* notice = new QLabel(decisionSupportNotice(), this);
    notice->setWordWrap(true);
    notice->setStyleSheet(QStringLiteral("color: #555555;"));
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    connect(buttons, &QDialogButtonBox::rejected, this, &ReconcileDialog::reject);

    auto* layout = new QVBoxLayout(this);
    layout->addWidget(intro);
    layout->addWidget(pages_, 1);
    layout->addWidget(notice);
    layout->addWidget(buttons);

    connect(runner_, &ReconcileRunner::progressed, this, &ReconcileDialog::showProgress);
    connect(runner_, &ReconcileRunner::finished, this, &ReconcileDialog::showResult);
    // Fits a 1024 x 700 screen with the window's frame; larger screens get more rows.
    if (parent) resize(std::min(1180, parent->width() - 40), std::min(820, parent->height() - 40));
    else resize(1100, 760);
}

ReconcileDialog::~ReconcileDialog() = default;  // the runner (our child) cancels a running job

// --- settings -------------------------------------------------------------------------------

QWidget* ReconcileDialog::buildSettingsPage()
{
    auto* page = new QWidget(this);
    auto* moves = new QGroupBox(tr("Inputs that may move"), page);
    auto* moveRow = new WrappingRow(nullptr, 12);
    struct Kind { tl::AdjustParam p; QString text; QString tip; bool on; };
    const Kind kinds[] = {
        {tl::AdjustParam::Biomass, tr("&B"), tr("Biomasses"), true},
        {tl::AdjustParam::PB, tr("&P/B"), tr("Production / biomass ratios"), true},
        {tl::AdjustParam::QB, tr("&Q/B"), tr("Consumption / biomass ratios"), true},
        {tl::AdjustParam::Diet, tr("&Diet shares"),
         tr("Each predator's diet shares, kept summing to what they sum to now; a share never becomes a new "
            "feeding link"),
         true},
        {tl::AdjustParam::Catch, tr("C&atch"),
         tr("Landings and discards: off by default, catch is usually the best-known and a regulated figure"), false}};
    for (const Kind& k : kinds) {
        auto* box = new QCheckBox(k.text, page);
        box->setChecked(k.on);
        box->setToolTip(k.tip);
        move_[std::size_t(k.p)] = box;
        moveRow->addWidget(box);
    }
    // Diet shares and catch have no confidence of their own in the project (a diet entry
    // keeps only its share), so one CV each stands in for them (ReconcileOptions).
    const tl::ReconcileOptions defaults;
    auto cvEdit = [page](double value, const QString& tip) {
        auto* e = new QLineEdit(number(value), page);
        e->setToolTip(tip);
        e->setMaximumWidth(70);
        return e;
    };
    dietCv_ = cvEdit(defaults.dietCv, tr("CV of the diet shares of rows that have no diet confidence of their own"));
    catchCv_ = cvEdit(defaults.catchCv, tr("CV of every catch figure, when catch may move"));
    auto* dietCvLabel = new QLabel(tr("Diet share CV:"), page);
    dietCvLabel->setBuddy(dietCv_);
    auto* catchCvLabel = new QLabel(tr("Catch CV:"), page);
    catchCvLabel->setBuddy(catchCv_);
    auto* cvBox = new QWidget(page);  // kept together when the row wraps
    auto* cvRow = new QHBoxLayout(cvBox);
    cvRow->setContentsMargins(12, 0, 0, 0);
    cvRow->setSpacing(4);
    cvRow->addWidget(dietCvLabel);
    cvRow->addWidget(dietCv_);
    cvRow->addSpacing(12);
    cvRow->addWidget(catchCvLabel);
    cvRow->addWidget(catchCv_);
    moveRow->addWidget(cvBox);
    moves->setLayout(moveRow);

    auto* help = new QLabel(tr("Per compartment: EE bounds and P/Q range (defaults from Project settings; empty EE min: "
                               "none). Tick a box to pin that input where it is. Changes are weighted by 1/CV² of "
                               "each input's confidence grade or CV."),
                            page);
    help->setWordWrap(true);
    table_ = new QTableWidget(0, ColumnCount, page);
    table_->setObjectName(QStringLiteral("reconcileSettings"));
    table_->setHorizontalHeaderLabels({tr("Compartment"), tr("EE now"), tr("EE max"), tr("EE min"), tr("P/Q min"),
                                       tr("P/Q max"), tr("Pin B"), tr("Pin P/B"), tr("Pin Q/B"), tr("Pin diet"),
                                       tr("Pin catch")});
    table_->verticalHeader()->setVisible(false);
    table_->verticalHeader()->setDefaultSectionSize(table_->fontMetrics().height() + 8);
    table_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    table_->horizontalHeader()->setSectionResizeMode(NameColumn, QHeaderView::Stretch);
    table_->setSelectionMode(QAbstractItemView::SingleSelection);
    table_->setEditTriggers(QAbstractItemView::DoubleClicked | QAbstractItemView::EditKeyPressed |
                            QAbstractItemView::AnyKeyPressed);
    fillSettingsTable();

    message_ = new QLabel(page);
    message_->setObjectName(QStringLiteral("reconcileMessage"));
    message_->setWordWrap(true);
    run_ = new QPushButton(tr("&Run"), page);
    run_->setDefault(true);
    run_->setToolTip(tr("Solve in the background; the workbench stays usable"));
    cancel_ = new QPushButton(tr("&Stop"), page);
    cancel_->setToolTip(tr("Stop the solve; nothing is changed"));
    cancel_->setVisible(false);
    busy_ = new QProgressBar(page);
    busy_->setRange(0, 0);  // SLSQP cannot say how much is left: a busy bar, with counts beside it
    busy_->setMaximumWidth(160);
    busy_->setVisible(false);
    progress_ = new QLabel(page);
    connect(run_, &QPushButton::clicked, this, [this] { run(); });
    connect(cancel_, &QPushButton::clicked, this, &ReconcileDialog::cancelRun);
    auto* runRow = new QHBoxLayout;
    runRow->addWidget(run_);
    runRow->addWidget(cancel_);
    runRow->addWidget(busy_);
    runRow->addWidget(progress_, 1);

    auto* layout = new QVBoxLayout(page);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(moves);
    layout->addWidget(help);
    layout->addWidget(table_, 1);
    layout->addWidget(message_);
    layout->addLayout(runRow);
    return page;
}

void ReconcileDialog::fillSettingsTable()
{
    const tl::Model& m = model_;
    const tl::BalanceSheet sheet = tl::solveBalance(m);
    rowCompartment_.clear();
    for (std::size_t i = 0; i < m.size(); ++i)
        if (m.compartment(i).isLiving()) rowCompartment_.push_back(i);
    table_->setRowCount(int(rowCompartment_.size()));
    for (int r = 0; r < int(rowCompartment_.size()); ++r) {
        const std::size_t i = rowCompartment_[std::size_t(r)];
        const tl::Compartment& c = m.compartment(i);
        const bool consumer = c.kind == tl::CompartmentKind::Consumer;
        auto* name = readOnlyItem(qs(c.name));
        name->setIcon(kindIcon(c.kind));
        table_->setItem(r, NameColumn, name);

        const double ee = i < sheet.rows.size() ? sheet.rows[i].ee : std::nan("");
        auto* now = readOnlyItem(std::isfinite(ee) ? number(ee) : tr("—"));
        now->setData(Qt::TextAlignmentRole, int(Qt::AlignRight | Qt::AlignVCenter));
        if (std::isfinite(ee) && ee > m.rules.eeMax) {
            now->setIcon(severityIcon(tl::Severity::Warning));
            now->setToolTip(tr("Above the EE maximum %1: this is what reconcile removes").arg(number(m.rules.eeMax)));
        }
        table_->setItem(r, EENowColumn, now);

        // An EE that is given stays as given (an equality of the balance), so it has no bounds here.
        const bool eeGiven = c.value(tl::Param::EE).has_value();
        auto bound = [&](int col, const QString& text, bool applies, const QString& tip) {
            auto* item = applies ? new QTableWidgetItem(text) : readOnlyItem(QString());
            item->setToolTip(tip);
            item->setData(Qt::TextAlignmentRole, int(Qt::AlignRight | Qt::AlignVCenter));
            table_->setItem(r, col, item);
        };
        const QString givenTip = tr("EE of %1 is given (%2): reconcile keeps it").arg(qs(c.name), number(c.valueOr(tl::Param::EE, 0)));
        bound(EEMaxColumn, number(m.rules.eeMax), !eeGiven, eeGiven ? givenTip : tr("Highest EE accepted for %1").arg(qs(c.name)));
        bound(EEMinColumn, QString(), !eeGiven, eeGiven ? givenTip : tr("Lowest EE accepted for %1 (empty: none)").arg(qs(c.name)));
        const QString pqTip = consumer ? tr("P/Q range of %1 (rule of thumb 0.05–0.5 for fish; give a bird or mammal its own)")
                                             .arg(qs(c.name))
                                       : tr("Producers have no P/Q");
        bound(PQMinColumn, consumer ? number(m.rules.pqMin) : QString(), consumer, pqTip);
        bound(PQMaxColumn, consumer ? number(m.rules.pqMax) : QString(), consumer, pqTip);

        const bool eats = consumer && !m.dietRow(i).empty();
        table_->setItem(r, PinBColumn, pinItem(true, tr("Hold B of %1 where it is").arg(qs(c.name))));
        table_->setItem(r, PinPBColumn, pinItem(true, tr("Hold P/B of %1 where it is").arg(qs(c.name))));
        table_->setItem(r, PinQBColumn, pinItem(consumer, tr("Hold Q/B of %1 where it is").arg(qs(c.name))));
        table_->setItem(r, PinDietColumn, pinItem(eats, tr("Hold the diet of %1 where it is").arg(qs(c.name))));
        table_->setItem(r, PinCatchColumn, pinItem(m.totalCatch(i) > 0.0, tr("Hold the catch of %1 where it is").arg(qs(c.name))));
    }
}

std::optional<tl::ReconcileOptions> ReconcileDialog::options(QString* why) const
{
    tl::ReconcileOptions o;
    o.moveBiomass = move_[std::size_t(tl::AdjustParam::Biomass)]->isChecked();
    o.movePB = move_[std::size_t(tl::AdjustParam::PB)]->isChecked();
    o.moveQB = move_[std::size_t(tl::AdjustParam::QB)]->isChecked();
    o.moveDiet = move_[std::size_t(tl::AdjustParam::Diet)]->isChecked();
    o.moveCatch = move_[std::size_t(tl::AdjustParam::Catch)]->isChecked();
    if (!(o.moveBiomass || o.movePB || o.moveQB || o.moveDiet || o.moveCatch)) {
        if (why) *why = tr("Tick at least one kind of input that may move.");
        return std::nullopt;
    }
    for (const auto& [edit, target, label] : {std::tuple{dietCv_, &o.dietCv, tr("Diet share CV")},
                                               std::tuple{catchCv_, &o.catchCv, tr("Catch CV")}}) {
        const auto v = parseTypedNumber(edit->text());
        if (!v || !(*v > 0.0) || *v > 10.0) {
            if (why) *why = tr("%1: '%2' is not a number above 0 and at most 10.").arg(label, edit->text());
            return std::nullopt;
        }
        *target = *v;
    }
    const tl::BalanceRules& rules = model_.rules;
    auto header = [this](int col) { return table_->horizontalHeaderItem(col)->text(); };
    for (int r = 0; r < table_->rowCount(); ++r) {
        const std::size_t i = rowCompartment_[std::size_t(r)];
        const QString name = qs(model_.compartment(i).name);
        // A cell's number: nullopt when empty; `bad` set (with the sentence) when it does not parse.
        auto cell = [&](int col, bool& bad) -> std::optional<double> {
            const QTableWidgetItem* item = table_->item(r, col);
            if (!item || !(item->flags() & Qt::ItemIsEditable) || item->text().trimmed().isEmpty()) return std::nullopt;
            const auto v = parseTypedNumber(item->text());
            if (!v || !(*v > 0.0)) {
                bad = true;
                if (why) *why = tr("%1 of %2: '%3' is not a positive number.").arg(header(col), name, item->text());
            }
            return v;
        };
        bool bad = false;
        const auto eeMax = cell(EEMaxColumn, bad);
        const auto eeMin = cell(EEMinColumn, bad);
        const auto pqMin = cell(PQMinColumn, bad);
        const auto pqMax = cell(PQMaxColumn, bad);
        auto refuse = [&](const QString& text) {
            if (why) *why = text;
            return std::nullopt;
        };
        if (bad) return std::nullopt;
        if (eeMin && eeMax && *eeMin > *eeMax) return refuse(tr("EE min of %1 is above its EE max.").arg(name));
        if (eeMax && *eeMax != rules.eeMax) o.eeMax[i] = *eeMax;
        if (eeMin) o.eeMin[i] = *eeMin;
        if (pqMin || pqMax) {
            const double low = pqMin.value_or(rules.pqMin), high = pqMax.value_or(rules.pqMax);
            if (low >= 1.0 || high > 1.0) return refuse(tr("P/Q range of %1: a P/Q is below 1.").arg(name));
            if (low > high) return refuse(tr("P/Q min of %1 is above its P/Q max.").arg(name));
            if (low != rules.pqMin || high != rules.pqMax) o.pqRange[i] = {low, high};
        }
        const std::pair<int, tl::AdjustParam> pins[] = {{PinBColumn, tl::AdjustParam::Biomass},
                                                         {PinPBColumn, tl::AdjustParam::PB},
                                                         {PinQBColumn, tl::AdjustParam::QB},
                                                         {PinDietColumn, tl::AdjustParam::Diet},
                                                         {PinCatchColumn, tl::AdjustParam::Catch}};
        for (const auto& [col, param] : pins) {
            const QTableWidgetItem* item = table_->item(r, col);
            if (item && (item->flags() & Qt::ItemIsUserCheckable) && item->checkState() == Qt::Checked)
                o.pins.push_back({i, param});
        }
    }
    return o;
}

bool ReconcileDialog::run()
{
    if (running()) return false;
    QString why;
    const auto o = options(&why);
    if (!o) {
        message_->setText(why);
        return false;
    }
    message_->clear();
    result_.reset();
    if (!runner_->start(model_, *o)) return false;
    ranWith_ = *o;
    setRunning(true);
    return true;
}

void ReconcileDialog::cancelRun()
{
    if (!running()) return;
    runner_->cancel();
    progress_->setText(tr("Stopping…"));
}

bool ReconcileDialog::running() const { return runner_->busy(); }

void ReconcileDialog::setRunning(bool on)
{
    run_->setVisible(!on);
    cancel_->setVisible(on);
    busy_->setVisible(on);
    table_->setEnabled(!on);
    for (QCheckBox* box : move_) box->setEnabled(!on);
    dietCv_->setEnabled(!on);
    catchCv_->setEnabled(!on);
    if (on) cancel_->setFocus();
    else progress_->clear();
}

void ReconcileDialog::showProgress(const tl::ReconcileProgress& p, double seconds)
{
    if (runner_->busy() && progress_->text() == tr("Stopping…")) return;
    const QString phase = p.elastic ? tr("least-violating search") : tr("round %1").arg(std::max(1, p.round));
    progress_->setText(tr("Solving: %1 · %2 evaluations · %3 inputs moving · %4 s")
                           .arg(phase)
                           .arg(p.evaluations)
                           .arg(p.freeVariables)
                           .arg(seconds, 0, 'f', 1));
}

void ReconcileDialog::reject()
{
    runner_->cancel();  // the job stops at its next evaluation; its result is dropped
    QDialog::reject();
}

// --- report -------------------------------------------------------------------------------

QWidget* ReconcileDialog::buildReportPage()
{
    auto* page = new QWidget(this);
    summary_ = new QLabel(page);
    summary_->setObjectName(QStringLiteral("reconcileSummary"));
    summary_->setWordWrap(true);
    summary_->setTextFormat(Qt::RichText);

    changes_ = new QTableWidget(0, 7, page);
    changes_->setObjectName(QStringLiteral("reconcileChanges"));
    changes_->setHorizontalHeaderLabels({tr("Compartment"), tr("Input"), tr("Before"), tr("After"), tr("Change %"),
                                         tr("CV"), tr("Share %")});
    changes_->horizontalHeaderItem(1)->setToolTip(tr("The input that changed; diet: the predator's share of that prey"));
    changes_->horizontalHeaderItem(5)->setToolTip(tr("Coefficient of variation that weights the change (1/CV²), and "
                                                     "where it comes from (hover a cell)"));
    changes_->horizontalHeaderItem(6)->setToolTip(
        tr("Share of the objective: this change's term, (change / CV)², over the sum; where the adjustment "
           "concentrates"));
    changes_->horizontalHeaderItem(4)->setToolTip(tr("100 (after − before) / before"));
    changes_->verticalHeader()->setVisible(false);
    changes_->verticalHeader()->setDefaultSectionSize(changes_->fontMetrics().height() + 8);
    changes_->setEditTriggers(QAbstractItemView::NoEditTriggers);
    changes_->setSelectionBehavior(QAbstractItemView::SelectRows);
    changes_->setAlternatingRowColors(true);
    // Numbers fit their text and the input's name takes what is left (elided, full text in
    // its tooltip); the CV's source is in its tooltip: the table fits beside the chart in
    // a 1024 px window without a horizontal scroll bar.
    changes_->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    changes_->horizontalHeader()->setSectionResizeMode(1, QHeaderView::Stretch);  // elided when narrow
    changes_->setWordWrap(false);
    changes_->setTextElideMode(Qt::ElideMiddle);

    chart_ = new EeChangeChart(page);

    binding_ = new QListWidget(page);
    binding_->setObjectName(QStringLiteral("reconcileBinding"));
    // A few lines: the chart above needs the height more (one row per compartment).
    binding_->setMinimumHeight(3 * binding_->fontMetrics().height());
    binding_->setMaximumHeight(7 * binding_->fontMetrics().height());
    auto* bindingBox = new QGroupBox(tr("Binding constraints and bounds"), page);
    bindingBox->setToolTip(tr("What holds the answer where it is: relaxing one of these would allow a smaller change"));
    auto* bindingLayout = new QVBoxLayout(bindingBox);
    bindingLayout->addWidget(binding_);
    conflicts_ = new QListWidget(page);
    conflicts_->setObjectName(QStringLiteral("reconcileConflicts"));
    conflicts_->setWordWrap(true);
    conflictBox_ = new QGroupBox(tr("Constraints in conflict (what to relax)"), page);
    auto* conflictLayout = new QVBoxLayout(conflictBox_);
    conflictLayout->addWidget(conflicts_);

    // Left: the ranked changes, the whole height (the list a reviewer reads first).
    // Right: the chart over the binding constraints and, when any, the conflicts.
    auto* side = new QSplitter(Qt::Vertical, page);
    side->addWidget(chart_);
    side->addWidget(bindingBox);
    side->addWidget(conflictBox_);
    side->setStretchFactor(0, 4);
    side->setStretchFactor(1, 1);
    side->setStretchFactor(2, 1);
    side->setChildrenCollapsible(false);
    auto* split = new QSplitter(Qt::Horizontal, page);
    split->setObjectName(QStringLiteral("reconcileReportSplit"));
    split->addWidget(changes_);
    split->addWidget(side);
    split->setStretchFactor(0, 2);
    split->setStretchFactor(1, 1);
    split->setSizes({660, 330});
    split->setChildrenCollapsible(false);

    auto* back = new QPushButton(tr("&Back to settings"), page);
    connect(back, &QPushButton::clicked, this, &ReconcileDialog::showSettings);
    name_ = new QLineEdit(page);
    name_->setObjectName(QStringLiteral("reconcileName"));
    name_->setMinimumWidth(220);
    create_ = new QPushButton(tr("&Create scenario"), page);
    create_->setToolTip(tr("Adds the adjusted inputs as a new scenario and shows it; Edit > Undo removes it again"));
    connect(create_, &QPushButton::clicked, this, [this] { createScenario(); });
    connect(name_, &QLineEdit::returnPressed, this, [this] { createScenario(); });
    createNote_ = new QLabel(page);
    createNote_->setWordWrap(true);
    auto* row = new QHBoxLayout;
    row->addWidget(back);
    row->addStretch(1);
    row->addWidget(new QLabel(tr("New scenario:"), page));
    row->addWidget(name_);
    row->addWidget(create_);

    auto* layout = new QVBoxLayout(page);
    layout->setContentsMargins(0, 0, 0, 0);
    summaryIcon_ = new QLabel(page);
    summaryIcon_->setAlignment(Qt::AlignTop);
    auto* summaryRow = new QHBoxLayout;
    summaryRow->addWidget(summaryIcon_);
    summaryRow->addWidget(summary_, 1);
    layout->addLayout(summaryRow);
    layout->addWidget(split, 1);
    layout->addWidget(createNote_);
    layout->addLayout(row);
    return page;
}

bool ReconcileDialog::showingReport() const { return pages_->currentIndex() == 1; }

void ReconcileDialog::showSettings()
{
    pages_->setCurrentIndex(0);
    run_->setFocus();
}

void ReconcileDialog::showResult(std::shared_ptr<const tl::ReconcileResult> result)
{
    setRunning(false);
    if (!result || result->status == tl::ReconcileStatus::Cancelled) {
        message_->setText(tr("Stopped: nothing was changed."));
        return;
    }
    result_ = std::move(result);
    if (result_->status == tl::ReconcileStatus::Invalid) {
        message_->setText(tr("This scenario cannot be reconciled as it stands:\n%1")
                              .arg(ProjectDocument::describeProblems(result_->problems)));
        return;
    }
    fillReport();
    pages_->setCurrentIndex(1);
}

void ReconcileDialog::fillReport()
{
    const tl::ReconcileResult& r = *result_;
    const tl::Model& m = model_;
    const QString scenario = qs(doc_->project().scenarios[std::size_t(from_)].name).toHtmlEscaped();
    const QString figures = tr("Objective %1 (sum of (change / CV)²), %2 inputs changed, %3 evaluations, %4 s.")
                                .arg(number(r.objective))
                                .arg(r.changes.size())
                                .arg(r.evaluations)
                                .arg(r.seconds, 0, 'f', 2);
    QIcon icon;
    QString words;
    switch (r.status) {
    case tl::ReconcileStatus::Unchanged:
        icon = okIcon();
        words = tr("<b>%1 already balances</b>: there is nothing to change.").arg(scenario);
        break;
    case tl::ReconcileStatus::Balanced:
        icon = okIcon();
        words = r.balanceAfter == tl::BalanceStatus::Balanced
                    ? tr("<b>The changes below balance %1.</b> %2").arg(scenario, figures)
                    : tr("<b>The changes below meet every constraint, but the balance of the result still reports "
                         "a problem</b> (see Checks after creating it). %1").arg(figures);
        break;
    case tl::ReconcileStatus::LeastViolating:
        icon = severityIcon(tl::Severity::Error);
        words = tr("<b>%1 cannot balance within these pins and bounds.</b> Below is the least-violating change; the "
                   "constraints in conflict say what to relax. %2").arg(scenario, figures);
        break;
    default: break;
    }
    summaryIcon_->setPixmap(icon.pixmap(20, 20));  // status by icon and words, never colour alone
    summary_->setText(words);
    summary_->setToolTip(tr("NLopt result: %1; largest remaining violation %2")
                             .arg(qs(r.solverResult), number(r.largestViolation)));

    changes_->setRowCount(int(r.changes.size()));
    for (int k = 0; k < int(r.changes.size()); ++k) {
        const tl::ReconcileChange& ch = r.changes[std::size_t(k)];
        auto right = [](const QString& text) {
            auto* item = new QTableWidgetItem(text);
            item->setData(Qt::TextAlignmentRole, int(Qt::AlignRight | Qt::AlignVCenter));
            return item;
        };
        changes_->setItem(k, 0, new QTableWidgetItem(qs(m.compartment(ch.compartment).name)));
        auto* input = new QTableWidgetItem(inputLabel(m, ch));
        input->setToolTip(input->text());
        changes_->setItem(k, 1, input);
        changes_->setItem(k, 2, right(number(ch.before)));
        changes_->setItem(k, 3, right(number(ch.after)));
        changes_->setItem(k, 4, right(QStringLiteral("%1%2").arg(ch.percent > 0 ? QStringLiteral("+") : QString())
                                          .arg(ch.percent, 0, 'f', 1)));
        auto* cv = right(number(ch.cv));
        cv->setToolTip(qs(ch.confidence));
        changes_->setItem(k, 5, cv);
        const double share = 100.0 * ch.objectiveShare;
        changes_->setItem(k, 6, right(share >= 1.0 ? QString::number(share, 'f', 1) : QString::number(share, 'g', 2)));
    }
    chart_->showResult(m, result_);

    binding_->clear();
    for (const std::string& b : r.binding) binding_->addItem(qs(b));
    if (r.binding.empty()) binding_->addItem(r.status == tl::ReconcileStatus::Unchanged ? tr("(nothing was changed)")
                                                                                        : tr("(none)"));
    conflicts_->clear();
    for (const tl::ReconcileConflict& c : r.conflicts) {
        QString text = qs(c.constraint);
        if (!c.relax.empty()) {
            QStringList relax;
            // The core's words name the CLI option; here the same choice is a tick box.
            for (const std::string& s : c.relax)
                relax << qs(s).replace(QStringLiteral(" (--move)"), tr(" (tick it under Inputs that may move)"));
            text += QStringLiteral("\n    ") + tr("to relax: %1").arg(relax.join(QStringLiteral("; ")));
        }
        auto* item = new QListWidgetItem(severityIcon(tl::Severity::Error), text, conflicts_);
        item->setToolTip(text);
    }
    conflictBox_->setVisible(!r.conflicts.empty());

    // A least-violating answer that changes nothing would only be a copy of the scenario.
    const bool keep = (r.status == tl::ReconcileStatus::Balanced || r.status == tl::ReconcileStatus::LeastViolating) &&
                      !r.changes.empty();
    name_->setEnabled(keep);
    create_->setEnabled(keep);
    name_->setText(keep ? qs(tl::freeReconciledName(doc_->project(), doc_->project().scenarios[std::size_t(from_)].name))
                        : QString());
    create_->setText(r.status == tl::ReconcileStatus::LeastViolating ? tr("&Create scenario (not balanced)")
                                                                     : tr("&Create scenario"));
    createNote_->setText(keep ? QString()
                              : r.status == tl::ReconcileStatus::LeastViolating
                                  ? tr("Nothing to keep: no input could move toward balance. Relax what the conflicts "
                                       "name and run again.")
                                  : tr("Nothing to keep: the scenario is unchanged."));
    createNote_->setVisible(!keep);
}

bool ReconcileDialog::createScenario()
{
    if (!result_) return false;
    QString why;
    const QString name = name_->text().trimmed();
    if (!addReconciledScenario(doc_, from_, model_, *result_, ranWith_, name, &why)) {
        createNote_->setText(why);
        createNote_->setVisible(true);
        return false;
    }
    emit scenarioCreated(name);
    accept();
    return true;
}

}  // namespace tl::ui
