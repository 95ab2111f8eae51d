#include "ui/widgets/scenario_shelf.h"

#include <QDateTime>
#include <QHBoxLayout>
#include <QInputDialog>
#include <QLabel>
#include <QListWidget>
#include <QMessageBox>
#include <QToolButton>
#include <QVBoxLayout>

#include "core/model/names.h"
#include "ui/document/project_document.h"
#include "ui/style/wrapping_row.h"
#include "ui/widgets/name_dialog.h"

namespace tl::ui {
namespace {
QString qs(const std::string& s) { return QString::fromStdString(s); }
}  // namespace

ScenarioShelf::ScenarioShelf(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc)
{
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    list_ = new QListWidget(this);
    list_->setObjectName(QStringLiteral("scenarioList"));
    list_->setWordWrap(true);
    list_->setSpacing(1);
    layout->addWidget(list_, 1);
    auto* buttons = new WrappingRow(nullptr, 4);  // a narrow dock puts them on two lines
    auto button = [&](const QString& text, const QString& tip, void (ScenarioShelf::*slot)()) {
        auto* b = new QToolButton(this);
        b->setText(text);
        b->setToolTip(tip);
        b->setToolButtonStyle(Qt::ToolButtonTextOnly);
        connect(b, &QToolButton::clicked, this, slot);
        buttons->addWidget(b);
    };
    button(tr("New"), tr("New empty scenario"), &ScenarioShelf::askNew);
    button(tr("Duplicate"), tr("Copy the selected scenario into a new one; later edits of either do not reach the other"),
           &ScenarioShelf::askDuplicate);
    button(tr("Rename"), tr("Rename the selected scenario"), &ScenarioShelf::askRename);
    button(tr("Delete"), tr("Delete the selected scenario (asks first)"), &ScenarioShelf::askDelete);
    layout->addLayout(buttons);
    setMinimumWidth(120);  // scenario names stay readable when the window is narrow

    connect(list_, &QListWidget::currentRowChanged, this, [this](int row) {
        if (!updating_ && row >= 0) doc_->setCurrentIndex(row);
    });
    connect(list_, &QListWidget::itemDoubleClicked, this, [this] { askRename(); });
    connect(doc_, &ProjectDocument::projectChanged, this, &ScenarioShelf::refresh);
    refresh();
}

QString copyLabel(const tl::Scenario& s)
{
    if (s.parent.empty()) return {};
    // A reconciled scenario is a changed copy, not a plain one: its description starts as
    // core/reconcile's reconcileDescription writes it.
    const bool reconciled = s.description.rfind("reconciled from '", 0) == 0;
    // `created` is ISO 8601 UTC; the calendar day is what a reader needs.
    const QDateTime when = QDateTime::fromString(qs(s.created), Qt::ISODate);
    if (!when.isValid())
        return reconciled ? QObject::tr("reconciled from %1").arg(qs(s.parent)) : QObject::tr("copied from %1").arg(qs(s.parent));
    const QString day = when.toUTC().date().toString(Qt::ISODate);
    return reconciled ? QObject::tr("reconciled from %1 on %2").arg(qs(s.parent), day)
                      : QObject::tr("copied from %1 on %2").arg(qs(s.parent), day);
}

void ScenarioShelf::refresh()
{
    updating_ = true;
    list_->clear();
    for (const auto& s : doc_->project().scenarios) {
        QString text = qs(s.name);
        if (!s.parent.empty()) text += QStringLiteral("\n   ") + copyLabel(s);
        auto* item = new QListWidgetItem(text, list_);
        QString tip = tr("%n compartment(s)", nullptr, int(s.model.size()));
        if (!s.description.empty()) tip += QLatin1Char('\n') + qs(s.description);
        if (!s.created.empty()) tip += QLatin1Char('\n') + tr("created %1").arg(qs(s.created));
        if (!s.parent.empty())
            tip += QLatin1Char('\n') + tr("A copy: edits of %1 made after copying do not reach it, and its edits do not reach %1.").arg(qs(s.parent));
        item->setToolTip(tip);
    }
    list_->setCurrentRow(doc_->currentIndex());
    updating_ = false;
}

QString ScenarioShelf::checkName(const QString& name, int except, QString* why) const
{
    return checkScenarioName(doc_->project(), name, except, why);
}

QString checkScenarioName(const tl::Project& project, const QString& name, int except, QString* why)
{
    const QString n = name.trimmed();
    if (n.isEmpty()) {
        if (why) *why = ScenarioShelf::tr("A scenario needs a name.");
        return {};
    }
    const auto& sc = project.scenarios;
    for (int i = 0; i < int(sc.size()); ++i)
        if (i != except && tl::sameName(sc[std::size_t(i)].name, n.toStdString())) {
            if (why)
                *why = qs(sc[std::size_t(i)].name) == n
                           ? ScenarioShelf::tr("A scenario called \"%1\" already exists.").arg(n)
                           : ScenarioShelf::tr("A scenario called \"%1\" already exists; names must differ by more than capitals "
                                "and spaces.").arg(qs(sc[std::size_t(i)].name));
            return {};
        }
    return n;
}

bool ScenarioShelf::newScenario(const QString& name, QString* why)
{
    const QString n = checkName(name, -1, why);
    if (n.isEmpty()) return false;
    tl::Project after = doc_->project();
    tl::Scenario s;
    s.name = n.toStdString();
    s.created = tl::utcNowIso8601();
    s.model.units = after.info.units;
    s.model.rules = after.info.rules;
    after.scenarios.push_back(s);
    doc_->editProject(after, int(after.scenarios.size()) - 1, tr("New scenario %1").arg(n));
    return true;
}

bool ScenarioShelf::duplicateScenario(int index, const QString& name, QString* why)
{
    if (index < 0 || index >= int(doc_->project().scenarios.size())) return false;
    const QString n = checkName(name, -1, why);
    if (n.isEmpty()) return false;
    tl::Project after = doc_->project();
    tl::Scenario copy = after.scenarios[std::size_t(index)];
    copy.parent = copy.name;
    copy.name = n.toStdString();
    copy.created = tl::utcNowIso8601();
    after.scenarios.insert(after.scenarios.begin() + index + 1, copy);
    doc_->editProject(after, index + 1, tr("Duplicate scenario %1 as %2").arg(qs(copy.parent), n));
    return true;
}

bool ScenarioShelf::renameScenario(int index, const QString& name, QString* why)
{
    if (index < 0 || index >= int(doc_->project().scenarios.size())) return false;
    const QString n = checkName(name, index, why);
    if (n.isEmpty()) return false;
    tl::Project after = doc_->project();
    const std::string old = after.scenarios[std::size_t(index)].name;
    if (old == n.toStdString()) return true;
    after.scenarios[std::size_t(index)].name = n.toStdString();
    for (auto& s : after.scenarios)  // children keep pointing at their parent
        if (s.parent == old) s.parent = n.toStdString();
    for (auto& r : after.runs)  // stored runs (ensemble, reconcile) go with their scenario
        if (r.scenario == old) r.scenario = n.toStdString();
    doc_->editProject(after, index, tr("Rename scenario %1 to %2").arg(qs(old), n));
    return true;
}

bool ScenarioShelf::deleteScenario(int index, QString* why)
{
    const auto& sc = doc_->project().scenarios;
    if (index < 0 || index >= int(sc.size())) return false;
    if (sc.size() == 1) {
        if (why) *why = tr("A project keeps at least one scenario.");
        return false;
    }
    tl::Project after = doc_->project();
    const std::string name = after.scenarios[std::size_t(index)].name;
    after.scenarios.erase(after.scenarios.begin() + index);
    std::erase_if(after.runs, [&name](const tl::StoredRun& r) { return r.scenario == name; });  // the file drops them too
    doc_->editProject(after, std::min(index, int(after.scenarios.size()) - 1), tr("Delete scenario %1").arg(qs(name)));
    return true;
}

// The name dialogs check the name before closing: a clash is corrected in place.
void ScenarioShelf::askNew()
{
    NameDialog::ask(this, tr("New scenario"), tr("Name:"), tr("New scenario"), [this](const QString& name) {
        QString why;
        return newScenario(name, &why) ? QString() : why;
    });
}

void ScenarioShelf::askDuplicate()
{
    const int i = doc_->currentIndex();
    NameDialog::ask(this, tr("Duplicate scenario"), tr("Name of the copy:"), tr("%1 (copy)").arg(qs(doc_->scenario().name)),
                    [this, i](const QString& name) {
                        QString why;
                        return duplicateScenario(i, name, &why) ? QString() : why;
                    });
}

void ScenarioShelf::askRename()
{
    const int i = doc_->currentIndex();
    NameDialog::ask(this, tr("Rename scenario"), tr("New name:"), qs(doc_->scenario().name), [this, i](const QString& name) {
        QString why;
        return renameScenario(i, name, &why) ? QString() : why;
    });
}

void ScenarioShelf::askDelete()
{
    const int i = doc_->currentIndex();
    QString why;
    if (doc_->project().scenarios.size() == 1) {
        QMessageBox::information(this, tr("Delete scenario"), tr("A project keeps at least one scenario."));
        return;
    }
    const auto answer = QMessageBox::question(
        this, tr("Delete scenario"),
        tr("Delete the scenario \"%1\"? Undo (Ctrl+Z) brings it back until the project is closed.").arg(qs(doc_->scenario().name)),
        QMessageBox::Yes | QMessageBox::Cancel, QMessageBox::Cancel);
    if (answer == QMessageBox::Yes && !deleteScenario(i, &why)) QMessageBox::warning(this, tr("Delete scenario"), why);
}

}  // namespace tl::ui
