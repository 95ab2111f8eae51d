// ProjectDocument: the open project as the workbench sees it — a tl::Project held in
// memory, the scenario being edited, where it came from, and the QUndoStack through
// which every edit passes. The core Model stays the single source of truth
// (DESIGN.md 2); table models and panels read it from here and never keep copies.
//
// Files: a .tledger project file (read whole into memory, written whole on save through
// the core's one safe save, core/store/project_save.h) or a CSV model folder
// (DESIGN.md 5.1, one scenario). Paths are read by the core's one rule for models,
// core/store/model_source.h, as the CLI reads them.
#pragma once

#include <QObject>
#include <QString>
#include <QUndoStack>

#include "core/model/problem.h"
#include "core/store/project.h"

namespace tl::ui {

// The name the program gives a project's first scenario (a new project, a file holding
// none): the word the sample projects and the CLI examples use for it.
inline constexpr const char* kFirstScenarioName = "baseline";

class ProjectDocument : public QObject {
    Q_OBJECT
public:
    // Where the content came from decides what Save does.
    enum class Origin {
        Untitled,     // made here: Save asks for a file name
        ProjectFile,  // a .tledger file: Save writes it back
        CsvFolder,    // imported CSV folder: Save asks for a .tledger name
        Template      // a sample or a read-only file: Save As keeps the changes elsewhere
    };

    explicit ProjectDocument(QObject* parent = nullptr);

    const tl::Project& project() const { return project_; }
    int currentIndex() const { return current_; }
    const tl::Scenario& scenario() const { return project_.scenarios[static_cast<std::size_t>(current_)]; }
    const tl::Model& model() const { return scenario().model; }
    QUndoStack* undoStack() { return &undo_; }

    Origin origin() const { return origin_; }
    QString filePath() const { return path_; }        // the file or folder read, or empty
    QString templateReason() const { return templateReason_; }
    bool isModified() const { return !undo_.isClean(); }
    bool saveNeedsFileName() const { return origin_ != Origin::ProjectFile; }
    QString displayName() const;                      // file name, folder name or "Untitled"

    // --- whole-document operations (not undoable; they clear the undo history) ----
    void newProject();
    // Opens a .tledger file or a CSV model folder. On failure the document is
    // unchanged and `error` says why (naming the file, line and column when known).
    bool open(const QString& path, QString* error, bool asTemplate = false);
    // Writes the whole project to `path` (.tledger) and makes it the document's file.
    bool saveAs(const QString& path, QString* error);
    bool save(QString* error) { return saveAs(path_, error); }
    // Writes the current scenario as a CSV folder (DESIGN.md 5.1).
    bool exportCsv(const QString& folder, QString* error) const;
    // Replaces the content wholesale (recovery, tests); marks it modified if asked.
    void setProject(tl::Project project, int current, Origin origin, const QString& path, bool modified);

    // --- undoable edits ------------------------------------------------------------
    // Replaces the current scenario's model by `after`; `text` is the undo text.
    void editModel(const tl::Model& after, const QString& text);
    // Replaces the project (scenario operations); `current` is the scenario shown after.
    void editProject(const tl::Project& after, int current, const QString& text);
    // Imports a CSV folder as a new scenario (undoable).
    bool importCsvScenario(const QString& folder, const QString& name, QString* error);

    // Switching scenario is navigation, not an edit.
    void setCurrentIndex(int index);

    // --- used by the undo commands (document_commands.h) ---------------------------
    void restoreModel(int scenario, const tl::Model& model);
    void restoreProject(const tl::Project& project, int current);

    static QString describeProblems(const tl::Problems& problems, int maxLines = 8);

signals:
    void modelChanged();     // the current scenario's inputs changed
    void projectChanged();   // scenario list, current scenario or whole content changed
    void originChanged();    // file name, origin or template state changed

private:
    tl::Project project_;
    int current_ = 0;
    QUndoStack undo_;
    Origin origin_ = Origin::Untitled;
    QString path_;
    QString templateReason_;
};

// Reads a whole .tledger file, or a CSV folder as a one-scenario project named after
// the folder (tl::readModelSource). A file that can only be read (newer schema, no
// write permission) sets `readOnlyReason`; `readOnly` opens it without ever writing
// (no migration), as for templates. A project without scenarios gets an empty one named kFirstScenarioName.
bool readProjectFile(const QString& path, tl::Project* out, QString* error, QString* readOnlyReason,
                     bool readOnly = false);
// Writes `project` to `path` through tl::saveProjectToPath (a new file is linked into
// place when complete; an existing project is replaced in one transaction).
bool writeProjectFile(const tl::Project& project, const QString& path, QString* error);

}  // namespace tl::ui
