#include "ui/document/project_document.h"

#include <QDir>
#include <algorithm>
#include <QFileInfo>
#include <filesystem>

#include "core/io/csv_model.h"
#include "core/store/model_source.h"
#include "core/store/project_save.h"
#include "ui/document/document_commands.h"

namespace tl::ui {
namespace {

std::filesystem::path toPath(const QString& s) { return std::filesystem::path(s.toStdString()); }

tl::Scenario emptyScenario(const QString& name)
{
    tl::Scenario s;
    s.name = name.toStdString();
    s.created = tl::utcNowIso8601();
    return s;
}

}  // namespace

QString ProjectDocument::describeProblems(const tl::Problems& problems, int maxLines)
{
    QStringList lines;
    int shown = 0;
    for (const auto& p : problems) {
        if (p.severity != tl::Severity::Error) continue;
        if (shown++ == maxLines) {
            lines << QObject::tr("… and more.");
            break;
        }
        lines << QString::fromStdString(p.describe());
    }
    if (lines.isEmpty())
        for (const auto& p : problems) lines << QString::fromStdString(p.describe());
    return lines.join('\n');
}

static bool readProjectSource(const QString& path, bool readOnly, tl::ModelSource* out, QString* error)
{
    *out = tl::readModelSource(toPath(path), {std::nullopt, readOnly ? tl::OpenMode::ReadOnly : tl::OpenMode::ReadWrite});
    if (out->project) return true;
    if (error) *error = ProjectDocument::describeProblems(out->problems);
    if (error && error->isEmpty()) *error = QObject::tr("Could not open %1.").arg(path);
    return false;
}

bool readProjectFile(const QString& path, tl::Project* out, QString* error, QString* readOnlyReason, bool readOnly)
{
    tl::ModelSource source;
    if (!readProjectSource(path, readOnly, &source, error)) return false;
    if (source.project->scenarios.empty()) source.project->scenarios.push_back(emptyScenario(QString::fromUtf8(kFirstScenarioName)));
    if (readOnlyReason && !readOnly && source.readOnly)
        *readOnlyReason = QString::fromStdString(source.readOnlyReason.empty() ? "read-only" : source.readOnlyReason);
    *out = std::move(*source.project);
    return true;
}

bool writeProjectFile(const tl::Project& project, const QString& path, QString* error)
{
    const tl::Problems problems = tl::saveProjectToPath(project, toPath(path));
    if (!tl::hasErrors(problems)) return true;
    if (error) *error = ProjectDocument::describeProblems(problems);
    if (error && error->isEmpty()) *error = QObject::tr("Could not write %1.").arg(path);
    return false;
}

ProjectDocument::ProjectDocument(QObject* parent) : QObject(parent)
{
    project_.scenarios.push_back(emptyScenario(QString::fromUtf8(kFirstScenarioName)));
    connect(&undo_, &QUndoStack::cleanChanged, this, &ProjectDocument::originChanged);
}

QString ProjectDocument::displayName() const
{
    if (path_.isEmpty()) return tr("Untitled");
    return QFileInfo(path_).fileName();
}

void ProjectDocument::setProject(tl::Project project, int current, Origin origin, const QString& path, bool modified)
{
    if (project.scenarios.empty()) project.scenarios.push_back(emptyScenario(QString::fromUtf8(kFirstScenarioName)));
    project_ = std::move(project);
    current_ = std::clamp(current, 0, static_cast<int>(project_.scenarios.size()) - 1);
    origin_ = origin;
    path_ = path;
    undo_.clear();
    // A recovered project is unsaved work: it stays marked until the user saves.
    if (modified) undo_.resetClean();
    emit projectChanged();
    emit modelChanged();
    emit originChanged();
}

void ProjectDocument::newProject()
{
    tl::Project p;
    p.info.title = tr("Untitled").toStdString();
    p.info.created = tl::utcNowIso8601();
    p.scenarios.push_back(emptyScenario(QString::fromUtf8(kFirstScenarioName)));
    templateReason_.clear();
    setProject(std::move(p), 0, Origin::Untitled, {}, false);
}

bool ProjectDocument::open(const QString& path, QString* error, bool asTemplate)
{
    const QFileInfo info(path);
    if (!info.exists()) {
        if (error) *error = tr("%1 does not exist.").arg(path);
        return false;
    }
    tl::Project p;
    QString readOnlyReason;
    if (!readProjectFile(path, &p, error, &readOnlyReason, asTemplate)) return false;
    Origin origin = info.isDir() ? Origin::CsvFolder : Origin::ProjectFile;
    templateReason_.clear();
    if (asTemplate) {
        origin = Origin::Template;
        templateReason_ = tr("sample project, opened as a template");
    } else if (!readOnlyReason.isEmpty()) {
        origin = Origin::Template;
        templateReason_ = tr("read-only: %1").arg(readOnlyReason);
    }
    setProject(std::move(p), 0, origin, info.absoluteFilePath(), false);
    return true;
}

bool ProjectDocument::saveAs(const QString& path, QString* error)
{
    if (path.isEmpty()) {
        if (error) *error = tr("No file name given.");
        return false;
    }
    tl::Project p = project_;
    p.info.modified = tl::utcNowIso8601();
    if (p.info.created.empty()) p.info.created = p.info.modified;
    if (!writeProjectFile(p, path, error)) return false;
    project_.info.modified = p.info.modified;
    project_.info.created = p.info.created;
    path_ = QFileInfo(path).absoluteFilePath();
    origin_ = Origin::ProjectFile;
    templateReason_.clear();
    undo_.setClean();
    emit originChanged();
    return true;
}

bool ProjectDocument::exportCsv(const QString& folder, QString* error) const
{
    const tl::Problems problems = tl::writeCsvModel(model(), toPath(folder));
    if (tl::hasErrors(problems)) {
        if (error) *error = describeProblems(problems);
        return false;
    }
    return true;
}

void ProjectDocument::editModel(const tl::Model& after, const QString& text)
{
    if (after == model()) return;  // nothing changed: nothing to undo
    undo_.push(new ModelEditCommand(this, current_, model(), after, text));
}

void ProjectDocument::editProject(const tl::Project& after, int current, const QString& text)
{
    undo_.push(new ProjectEditCommand(this, project_, current_, after, current, text));
}

bool ProjectDocument::importCsvScenario(const QString& folder, const QString& name, QString* error)
{
    tl::ModelSource read;
    if (!readProjectSource(folder, true, &read, error)) return false;
    if (!read.csvFolder) {
        if (error) *error = tr("%1 is not a CSV model folder.").arg(folder);
        return false;
    }
    tl::Project after = project_;
    tl::Scenario s = std::move(read.project->scenarios.front());
    QString unique = name.trimmed().isEmpty() ? QString::fromStdString(s.name) : name.trimmed();
    for (int n = 2; after.findScenario(unique.toStdString()); ++n)
        unique = QStringLiteral("%1 (%2)").arg(name.trimmed()).arg(n);
    s.name = unique.toStdString();
    s.model.units = project_.info.units;
    after.scenarios.push_back(std::move(s));
    editProject(after, static_cast<int>(after.scenarios.size()) - 1, tr("Import scenario %1").arg(unique));
    return true;
}

void ProjectDocument::setCurrentIndex(int index)
{
    if (index < 0 || index >= static_cast<int>(project_.scenarios.size()) || index == current_) return;
    current_ = index;
    emit projectChanged();
    emit modelChanged();
}

void ProjectDocument::restoreModel(int scenario, const tl::Model& m)
{
    if (scenario < 0 || scenario >= static_cast<int>(project_.scenarios.size())) return;
    project_.scenarios[static_cast<std::size_t>(scenario)].model = m;
    if (scenario != current_) {
        // Undoing an edit made in another scenario shows that scenario again.
        current_ = scenario;
        emit projectChanged();
    }
    emit modelChanged();
}

void ProjectDocument::restoreProject(const tl::Project& p, int current)
{
    project_ = p;
    current_ = std::clamp(current, 0, static_cast<int>(project_.scenarios.size()) - 1);
    emit projectChanged();
    emit modelChanged();
}

}  // namespace tl::ui
