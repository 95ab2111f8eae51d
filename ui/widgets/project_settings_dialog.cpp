#include "ui/widgets/project_settings_dialog.h"

#include <algorithm>

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QLabel>
#include <QHBoxLayout>
#include <QLineEdit>
#include <QScreen>
#include <QScrollArea>
#include <QVBoxLayout>

#include "ui/document/project_document.h"
#include "ui/widgets/number_text.h"

namespace tl::ui {
namespace {

QString qs(const std::string& s) { return QString::fromStdString(s); }

QString numberText(double v) { return QString::number(v, 'g', 10); }

}  // namespace

ProjectSettings currentSettings(const tl::Project& project, int scenario)
{
    ProjectSettings s;
    s.units = project.info.units;
    s.rules = project.info.rules;
    if (scenario >= 0 && scenario < int(project.scenarios.size()))
        for (const tl::Fleet& f : project.scenarios[std::size_t(scenario)].model.fleets()) s.discardPools.push_back(f.discardPool);
    return s;
}

QString checkSettings(const ProjectSettings& s, const tl::Model& model)
{
    const auto blank = [](const std::string& t) { return QString::fromStdString(t).trimmed().isEmpty(); };
    if (blank(s.units.currency)) return QObject::tr("Currency: give the unit biomass is counted in, for example t wet weight or g C.");
    if (blank(s.units.area)) return QObject::tr("Area: give the unit of area, for example km² or ha.");
    if (blank(s.units.time)) return QObject::tr("Time: give the time unit of rates, for example year.");
    const tl::BalanceRules& r = s.rules;
    if (!(r.eeMax > 0 && r.eeMax <= 10)) return QObject::tr("Highest EE accepted: expected a number above 0 and at most 10.");
    if (!(r.pqMin >= 0 && r.pqMin < 1)) return QObject::tr("Lowest P/Q: expected a number from 0 to below 1.");
    if (!(r.pqMax > 0 && r.pqMax <= 1)) return QObject::tr("Highest P/Q: expected a number above 0 and at most 1.");
    if (!(r.pqMin < r.pqMax)) return QObject::tr("P/Q range: the lowest P/Q must be below the highest.");
    if (!(r.dietSumTolerance > 0 && r.dietSumTolerance <= 0.1))
        return QObject::tr("Tolerance on diet sums: expected a number above 0 and at most 0.1.");
    const tl::PlausibleRanges& p = r.plausible;
    if (!(p.biomassMax > 0)) return QObject::tr("Plausible B up to: expected a number above 0.");
    if (!(p.rateMax > 0)) return QObject::tr("Plausible P/B, Q/B up to: expected a number above 0.");
    if (!(p.flowMax > 0)) return QObject::tr("Plausible flows up to: expected a number above 0.");
    // Grade A is the best supported, so its CV is the smallest (DESIGN: grades A-D).
    const char* const grades = "ABCD";
    for (std::size_t g = 0; g < 4; ++g) {
        if (!(r.cvByGrade[g] > 0 && r.cvByGrade[g] <= 10))
            return QObject::tr("CV of grade %1: expected a number above 0 and at most 10 (0.25 = 25 %).").arg(QChar::fromLatin1(grades[g]));
        if (g > 0 && r.cvByGrade[g] < r.cvByGrade[g - 1])
            return QObject::tr("CV of grade %1: expected at least the CV of grade %2 (grade A is the best supported).")
                .arg(QChar::fromLatin1(grades[g]))
                .arg(QChar::fromLatin1(grades[g - 1]));
    }
    if (s.discardPools.size() != model.fleets().size()) return QObject::tr("The fleets changed while the dialog was open.");
    for (std::size_t f = 0; f < s.discardPools.size(); ++f) {
        const auto pool = s.discardPools[f];
        if (pool && (*pool >= model.size() || model.compartment(*pool).kind != tl::CompartmentKind::Detritus))
            return QObject::tr("Discard pool of %1: expected a detritus pool.").arg(qs(model.fleet(f).name));
    }
    return {};
}

tl::Project withSettings(tl::Project project, int scenario, const ProjectSettings& s)
{
    project.info.units = s.units;
    project.info.rules = s.rules;
    for (tl::Scenario& sc : project.scenarios) {
        sc.model.units = s.units;
        sc.model.rules = s.rules;
    }
    if (scenario >= 0 && scenario < int(project.scenarios.size())) {
        tl::Model& m = project.scenarios[std::size_t(scenario)].model;
        for (std::size_t f = 0; f < m.fleets().size() && f < s.discardPools.size(); ++f) m.fleet(f).discardPool = s.discardPools[f];
    }
    return project;
}

bool applySettings(ProjectDocument* doc, const ProjectSettings& s, QString* why)
{
    const QString problem = checkSettings(s, doc->model());
    if (!problem.isEmpty()) {
        if (why) *why = problem;
        return false;
    }
    const tl::Project after = withSettings(doc->project(), doc->currentIndex(), s);
    if (after == doc->project()) {  // nothing to undo: no command
        if (why) why->clear();
        return false;
    }
    doc->editProject(after, doc->currentIndex(), QObject::tr("Change project settings"));
    return true;
}

// --- the dialog ------------------------------------------------------------------------

ProjectSettingsDialog::ProjectSettingsDialog(ProjectDocument* doc, QWidget* parent) : QDialog(parent), doc_(doc)
{
    setObjectName(QStringLiteral("projectSettings"));
    setWindowTitle(tr("Project settings"));
    const ProjectSettings now = currentSettings(doc->project(), doc->currentIndex());
    auto line = [this](const QString& text, const QString& tip) {
        auto* e = new QLineEdit(text, this);
        e->setToolTip(tip);
        return e;
    };

    auto* units = new QGroupBox(tr("Units (the whole project)"), this);
    auto* unitForm = new QFormLayout(units);
    currency_ = line(qs(now.units.currency), tr("What biomass is counted in: t wet weight, g C, kJ …"));
    area_ = line(qs(now.units.area), tr("Unit of area: km², ha, m² …"));
    time_ = line(qs(now.units.time), tr("Time unit of rates and flows: year, month …"));
    unitForm->addRow(tr("&Currency:"), currency_);
    unitForm->addRow(tr("&Area:"), area_);
    unitForm->addRow(tr("&Time:"), time_);
    auto* example = new QLabel(this);
    example->setWordWrap(true);
    unitForm->addRow(example);
    auto updateExample = [this, example] {
        tl::Units u{currency_->text().trimmed().toStdString(), area_->text().trimmed().toStdString(),
                    time_->text().trimmed().toStdString()};
        example->setText(tr("Biomass in %1, flows in %2, rates in %3. Numbers are not converted: change the units "
                            "only to name what the values already are.")
                             .arg(qs(u.biomass()), qs(u.flow()), qs(u.rate())));
    };
    for (QLineEdit* e : {currency_, area_, time_}) connect(e, &QLineEdit::textChanged, this, updateExample);
    updateExample();

    auto* rules = new QGroupBox(tr("Check rules (the whole project)"), this);
    auto* ruleForm = new QFormLayout(rules);
    eeMax_ = line(numberText(now.rules.eeMax), tr("An EE above this is reported as a breach of balance (usually 1)."));
    pqMin_ = line(numberText(now.rules.pqMin), tr("A consumer's P/Q below this is flagged (rule of thumb)."));
    pqMax_ = line(numberText(now.rules.pqMax), tr("A consumer's P/Q above this is flagged (rule of thumb)."));
    dietTolerance_ = line(numberText(now.rules.dietSumTolerance), tr("How far a diet row may sum from 1 before it is reported."));
    ruleForm->addRow(tr("Highest &EE accepted:"), eeMax_);
    ruleForm->addRow(tr("Lowest &P/Q of consumers:"), pqMin_);
    ruleForm->addRow(tr("Highest P/&Q of consumers:"), pqMax_);
    ruleForm->addRow(tr("&Tolerance on diet sums:"), dietTolerance_);
    // Entered values beyond these are warned about as likely slips (issue 13), never refused.
    const QString beyond = tr("An entered %1 above this (in the project's units) is warned about as a likely slip of "
                              "the digits or the units; it is kept as entered.");
    biomassMax_ = line(numberText(now.rules.plausible.biomassMax), beyond.arg(tr("biomass")));
    rateMax_ = line(numberText(now.rules.plausible.rateMax), beyond.arg(tr("P/B or Q/B")));
    flowMax_ = line(numberText(now.rules.plausible.flowMax), beyond.arg(tr("flow (BA, E, detritus import)")));
    ruleForm->addRow(tr("Plausible B up to:"), biomassMax_);
    ruleForm->addRow(tr("Plausible P/B, Q/B up to:"), rateMax_);
    ruleForm->addRow(tr("Plausible flows up to:"), flowMax_);

    // What each data-confidence grade stands for: the ensemble draws and reconcile weighs
    // an input of that grade with this CV unless the input has a CV of its own. One row,
    // A to D, so that the dialog stays short enough for a small screen.
    auto* grades = new QGroupBox(tr("Data confidence grades (the whole project)"), this);
    auto* gradeForm = new QFormLayout(grades);
    const QString gradeTip = tr("Coefficient of variation an input of grade %1 stands for (0.25 = 25 %), unless "
                                "the input has a CV of its own; used by the ensemble and by reconcile. Grade A is "
                                "the best supported.");
    auto* gradeRow = new QHBoxLayout;
    for (std::size_t g = 0; g < gradeCv_.size(); ++g) {
        const QChar grade = QChar::fromLatin1("ABCD"[g]);
        gradeCv_[g] = line(numberText(now.rules.cvByGrade[g]), gradeTip.arg(grade));
        gradeCv_[g]->setAccessibleName(tr("CV of grade %1").arg(grade));
        auto* label = new QLabel(QString(grade), this);  // no mnemonic: Alt+A and Alt+C name Area and Currency
        label->setBuddy(gradeCv_[g]);
        gradeRow->addWidget(label);
        gradeRow->addWidget(gradeCv_[g], 1);
    }
    gradeForm->addRow(tr("CV of grades:"), gradeRow);

    auto* fleets = new QGroupBox(tr("Fleet discard pools (scenario %1)").arg(qs(doc->scenario().name)), this);
    auto* fleetForm = new QFormLayout(fleets);
    const tl::Model& m = doc->model();
    pools_ = m.detritusPools();
    if (m.fleets().empty()) fleetForm->addRow(new QLabel(tr("This scenario has no fleet."), this));
    else if (pools_.empty()) fleetForm->addRow(new QLabel(tr("Add a detritus pool to choose where discards go."), this));
    for (std::size_t f = 0; f < m.fleets().size(); ++f) {
        auto* combo = new QComboBox(this);
        combo->addItem(tr("First detritus pool (default)"));
        for (std::size_t p : pools_) combo->addItem(qs(m.compartment(p).name));
        const auto pool = m.fleet(f).discardPool;
        for (std::size_t k = 0; pool && k < pools_.size(); ++k)
            if (pools_[k] == *pool) combo->setCurrentIndex(int(k) + 1);
        combo->setEnabled(!pools_.empty());
        combo->setToolTip(tr("Where the dead discards of %1 go").arg(qs(m.fleet(f).name)));
        fleetForm->addRow(qs(m.fleet(f).name) + QLatin1Char(':'), combo);
        poolCombos_.push_back(combo);
    }

    error_ = new QLabel(this);
    error_->setObjectName(QStringLiteral("settingsError"));
    error_->setWordWrap(true);
    error_->setStyleSheet(QStringLiteral("color: #a03000;"));
    error_->hide();

    auto* content = new QWidget(this);
    auto* column = new QVBoxLayout(content);
    column->addWidget(units);
    column->addWidget(rules);
    column->addWidget(grades);
    column->addWidget(fleets);
    column->addStretch(1);
    auto* scroll = new QScrollArea(this);  // many fleets must not push the buttons off a small screen
    scroll->setWidget(content);
    scroll->setWidgetResizable(true);
    scroll->setFrameShape(QFrame::NoFrame);
    scroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);  // the fields follow the dialog's width

    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel, this);
    connect(buttons, &QDialogButtonBox::accepted, this, &ProjectSettingsDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(scroll, 1);
    layout->addWidget(error_);
    layout->addWidget(buttons);
    // Tall enough for everything when the screen has room (no needless scroll bar);
    // many fleets on a small screen scroll instead of pushing the buttons off it.
    const int available = screen() ? screen()->availableGeometry().height() * 9 / 10 : 700;
    const int margins = layout->contentsMargins().top() + layout->contentsMargins().bottom();
    const int wanted = content->sizeHint().height() + buttons->sizeHint().height() + 2 * layout->spacing() + margins;
    resize(std::max(520, content->sizeHint().width() + margins), std::min(wanted, available));
}

std::optional<ProjectSettings> ProjectSettingsDialog::settings(QString* why) const
{
    ProjectSettings s = currentSettings(doc_->project(), doc_->currentIndex());
    s.units.currency = currency_->text().trimmed().toStdString();
    s.units.area = area_->text().trimmed().toStdString();
    s.units.time = time_->text().trimmed().toStdString();
    const struct { QLineEdit* edit; double* into; QString label; } numbers[] = {
        {eeMax_, &s.rules.eeMax, tr("Highest EE accepted")},
        {pqMin_, &s.rules.pqMin, tr("Lowest P/Q")},
        {pqMax_, &s.rules.pqMax, tr("Highest P/Q")},
        {dietTolerance_, &s.rules.dietSumTolerance, tr("Tolerance on diet sums")},
        {biomassMax_, &s.rules.plausible.biomassMax, tr("Plausible B up to")},
        {rateMax_, &s.rules.plausible.rateMax, tr("Plausible P/B, Q/B up to")},
        {flowMax_, &s.rules.plausible.flowMax, tr("Plausible flows up to")},
        {gradeCv_[0], &s.rules.cvByGrade[0], tr("CV of grade A")},
        {gradeCv_[1], &s.rules.cvByGrade[1], tr("CV of grade B")},
        {gradeCv_[2], &s.rules.cvByGrade[2], tr("CV of grade C")},
        {gradeCv_[3], &s.rules.cvByGrade[3], tr("CV of grade D")}};
    for (const auto& n : numbers) {
        const auto v = parseTypedNumber(n.edit->text());
        if (!v) {
            if (why) *why = tr("%1: \"%2\" is not a number.").arg(n.label, n.edit->text());
            return std::nullopt;
        }
        *n.into = *v;
    }
    for (std::size_t f = 0; f < poolCombos_.size() && f < s.discardPools.size(); ++f) {
        const int k = poolCombos_[f]->currentIndex();
        s.discardPools[f] = k <= 0 ? std::nullopt : std::optional<std::size_t>(pools_[std::size_t(k - 1)]);
    }
    return s;
}

void ProjectSettingsDialog::accept()
{
    QString why;
    const auto s = settings(&why);
    if (!s) {
        error_->setText(why);
        error_->show();
        return;
    }
    if (!applySettings(doc_, *s, &why) && !why.isEmpty()) {
        error_->setText(why);
        error_->show();
        return;
    }
    QDialog::accept();
}

}  // namespace tl::ui
