// ScenarioShelf: the project's scenarios, in the order the user keeps them, each with
// the scenario it was copied from and when. New, duplicate, rename and delete (with a
// confirmation) are undoable edits of the project; picking one shows it in the editors.
#pragma once

#include <QWidget>

class QListWidget;
class QToolButton;

namespace tl {
struct Project;
struct Scenario;
}

namespace tl::ui {

class ProjectDocument;

// "copied from baseline on 2026-12-02" for a duplicated scenario (empty for one that
// was not copied). A copy does not follow the scenario it came from: it is frozen at
// the moment of copying, and the label says so rather than suggesting derivation.
QString copyLabel(const tl::Scenario& s);

// `name` trimmed when it can name a new scenario of `project` (scenario `except` left
// out of the comparison: a rename), else empty with `why` saying what is wrong.
QString checkScenarioName(const tl::Project& project, const QString& name, int except, QString* why);

class ScenarioShelf : public QWidget {
    Q_OBJECT
public:
    explicit ScenarioShelf(ProjectDocument* doc, QWidget* parent = nullptr);

    // The operations, also used by the menus and tests. Names are trimmed; an empty
    // or taken name is refused with `why`.
    bool newScenario(const QString& name, QString* why = nullptr);
    bool duplicateScenario(int index, const QString& name, QString* why = nullptr);
    bool renameScenario(int index, const QString& name, QString* why = nullptr);
    bool deleteScenario(int index, QString* why = nullptr);

    // Interactive versions (ask for a name / confirmation).
    void askNew();
    void askDuplicate();
    void askRename();
    void askDelete();

private:
    void refresh();
    QString checkName(const QString& name, int except, QString* why) const;

    ProjectDocument* doc_;
    QListWidget* list_;
    bool updating_ = false;
};

}  // namespace tl::ui
