#include "ui/widgets/confidence_panel.h"

#include <QComboBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QVBoxLayout>

#include "core/model/text.h"
#include "ui/document/project_document.h"
#include "ui/tables/scenario_table_model.h"

namespace tl::ui {
namespace {
QString sym(tl::Param p) { return QString::fromUtf8(tl::paramSymbol(p).data(), qsizetype(tl::paramSymbol(p).size())); }
}  // namespace

ConfidencePanel::ConfidencePanel(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc)
{
    auto* outer = new QVBoxLayout(this);
    title_ = new QLabel(this);
    title_->setWordWrap(true);
    title_->setObjectName(QStringLiteral("panelTitle"));
    outer->addWidget(title_);
    auto* form = new QFormLayout;
    grade_ = new QComboBox(this);
    grade_->addItem(tr("not graded"), QString());
    for (const char* g : {"A", "B", "C", "D"}) grade_->addItem(tr("grade %1").arg(QLatin1String(g)), QLatin1String(g));
    cv_ = new QLineEdit(this);
    cv_->setPlaceholderText(tr("e.g. 0.3 (empty: from the grade)"));
    effective_ = new QLabel(this);
    effective_->setWordWrap(true);
    source_ = new QLineEdit(this);
    source_->setPlaceholderText(tr("survey, paper, estimate…"));
    form->addRow(tr("Grade"), grade_);
    form->addRow(tr("CV"), cv_);
    form->addRow(QString(), effective_);
    form->addRow(tr("Source"), source_);
    outer->addLayout(form);
    message_ = new QLabel(this);
    message_->setWordWrap(true);
    message_->setObjectName(QStringLiteral("refusal"));
    outer->addWidget(message_);
    auto* help = new QLabel(tr("Grades run from A (best supported) to D (weakest); each stands for a default CV set in "
                               "the project's rules. An explicit CV replaces the grade."),
                            this);
    help->setWordWrap(true);
    help->setObjectName(QStringLiteral("helpText"));
    outer->addWidget(help);
    outer->addStretch(1);

    connect(grade_, &QComboBox::currentIndexChanged, this, [this] { if (!updating_) applyGrade(); });
    connect(cv_, &QLineEdit::editingFinished, this, [this] { if (!updating_) applyCv(); });
    connect(source_, &QLineEdit::editingFinished, this, [this] { if (!updating_) applySource(); });
    connect(doc_, &ProjectDocument::modelChanged, this, &ConfidencePanel::refresh);
    refresh();
}

void ConfidencePanel::setTarget(std::optional<std::size_t> compartment, std::optional<tl::Param> param)
{
    compartment_ = compartment;
    param_ = param;
    diet_ = false;
    message_->clear();
    refresh();
}

void ConfidencePanel::setDietTarget(std::size_t predator)
{
    compartment_ = predator;
    param_.reset();
    diet_ = true;
    message_->clear();
    refresh();
}

bool ConfidencePanel::hasTarget() const
{
    return compartment_ && (param_ || diet_) && *compartment_ < doc_->model().size();
}

const tl::Confidence& ConfidencePanel::targetIn(const tl::Model& m) const
{
    const tl::Compartment& c = m.compartment(*compartment_);
    return diet_ ? c.dietConfidence : c.confidenceOf(*param_);
}

tl::Confidence& ConfidencePanel::targetIn(tl::Model& m) const
{
    tl::Compartment& c = m.compartment(*compartment_);
    return diet_ ? c.dietConfidence : c.confidenceOf(*param_);
}

QString ConfidencePanel::targetName(const tl::Model& m) const
{
    const QString name = QString::fromStdString(m.compartment(*compartment_).name);
    return diet_ ? tr("the diet of %1").arg(name) : tr("%1 of %2").arg(sym(*param_), name);
}

void ConfidencePanel::refresh()
{
    updating_ = true;
    const tl::Model& m = doc_->model();
    const bool valid = hasTarget();
    grade_->setEnabled(valid);
    cv_->setEnabled(valid);
    source_->setEnabled(valid);
    if (!valid) {
        title_->setText(tr("Select a parameter cell in Compartments, or a row of Diet, to see and edit its data "
                           "confidence."));
        grade_->setCurrentIndex(0);
        cv_->clear();
        source_->clear();
        effective_->clear();
        updating_ = false;
        return;
    }
    const tl::Confidence& conf = targetIn(m);
    title_->setText(diet_ ? tr("Data confidence of %1 (every share of the row)").arg(targetName(m))
                          : tr("Data confidence of %1").arg(targetName(m)));
    grade_->setCurrentIndex(std::max(0, grade_->findData(QString::fromStdString(std::string(tl::gradeKey(conf.grade))))));
    cv_->setText(conf.cv ? ScenarioTableModel::numberText(*conf.cv) : QString());
    source_->setText(QString::fromStdString(conf.source));
    if (conf.cv) effective_->setText(tr("CV used: %1 % (explicit)").arg(*conf.cv * 100.0, 0, 'g', 3));
    else if (conf.grade != tl::Confidence::Grade::None)
        effective_->setText(tr("CV used: %1 % (from grade)").arg(m.rules.cvByGrade[std::size_t(int(conf.grade) - 1)] * 100.0, 0, 'g', 3));
    else effective_->setText(tr("No confidence given yet."));
    updating_ = false;
}

void ConfidencePanel::apply(const tl::Confidence& conf, const QString& what)
{
    if (!hasTarget()) return;
    tl::Model copy = doc_->model();
    targetIn(copy) = conf;
    doc_->editModel(copy, tr("Set %1 of %2").arg(what, targetName(copy)));
}

void ConfidencePanel::applyGrade()
{
    if (!hasTarget()) return;
    tl::Confidence conf = targetIn(doc_->model());
    conf.grade = tl::parseGrade(grade_->currentData().toString().toStdString()).value_or(tl::Confidence::Grade::None);
    apply(conf, tr("confidence grade"));
}

void ConfidencePanel::applyCv()
{
    if (!hasTarget()) return;
    tl::Confidence conf = targetIn(doc_->model());
    const QString t = cv_->text().trimmed();
    if (t.isEmpty()) conf.cv.reset();
    else {
        const auto v = tl::parseNumber(t.toStdString());
        if (!v || *v <= 0.0) {
            message_->setText(tr("The CV expects a positive number such as 0.3 (30 %); \"%1\" was not taken.").arg(t));
            refresh();
            return;
        }
        conf.cv = *v;
    }
    message_->clear();
    apply(conf, tr("CV"));
}

void ConfidencePanel::applySource()
{
    if (!hasTarget()) return;
    tl::Confidence conf = targetIn(doc_->model());
    conf.source = source_->text().trimmed().toStdString();
    apply(conf, tr("source note"));
}

}  // namespace tl::ui
