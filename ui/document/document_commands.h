// Undo commands of the ProjectDocument (one QUndoCommand per user action, its text a
// sentence such as "Set B of Zooplankton to 12.5"). Each keeps the state before and
// after: a scenario's Model for edits of its inputs, the whole Project for scenario
// operations. Models are small (tens of compartments), so whole copies are cheap and
// make every undo exact — including the diet rows and columns, routing and harvest
// that removing a compartment takes with it.
#pragma once

#include <QUndoCommand>

#include "core/store/project.h"

namespace tl::ui {

class ProjectDocument;

class ModelEditCommand : public QUndoCommand {
public:
    ModelEditCommand(ProjectDocument* doc, int scenario, tl::Model before, tl::Model after, const QString& text);
    void undo() override;
    void redo() override;

private:
    ProjectDocument* doc_;
    int scenario_;
    tl::Model before_, after_;
};

class ProjectEditCommand : public QUndoCommand {
public:
    ProjectEditCommand(ProjectDocument* doc, tl::Project before, int currentBefore, tl::Project after,
                       int currentAfter, const QString& text);
    void undo() override;
    void redo() override;

private:
    ProjectDocument* doc_;
    tl::Project before_, after_;
    int currentBefore_, currentAfter_;
};

}  // namespace tl::ui
