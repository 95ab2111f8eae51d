#include "ui/document/document_commands.h"

#include "ui/document/project_document.h"

namespace tl::ui {

ModelEditCommand::ModelEditCommand(ProjectDocument* doc, int scenario, tl::Model before, tl::Model after,
                                   const QString& text)
    : QUndoCommand(text), doc_(doc), scenario_(scenario), before_(std::move(before)), after_(std::move(after))
{
}

void ModelEditCommand::undo() { doc_->restoreModel(scenario_, before_); }
void ModelEditCommand::redo() { doc_->restoreModel(scenario_, after_); }

ProjectEditCommand::ProjectEditCommand(ProjectDocument* doc, tl::Project before, int currentBefore, tl::Project after,
                                       int currentAfter, const QString& text)
    : QUndoCommand(text),
      doc_(doc),
      before_(std::move(before)),
      after_(std::move(after)),
      currentBefore_(currentBefore),
      currentAfter_(currentAfter)
{
}

void ProjectEditCommand::undo() { doc_->restoreProject(before_, currentBefore_); }
void ProjectEditCommand::redo() { doc_->restoreProject(after_, currentAfter_); }

}  // namespace tl::ui
