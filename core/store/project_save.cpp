#include "core/store/project_save.h"

#include <system_error>

#include "core/store/project_file.h"

namespace tl {

Problems saveProjectToPath(const Project& project, const std::filesystem::path& path)
{
    std::error_code ec;
    if (!std::filesystem::exists(std::filesystem::symlink_status(path, ec))) {
        ProjectOpenResult created = ProjectFile::create(path, project);
        return created.file ? Problems{} : std::move(created.problems);
    }
    ProjectOpenResult opened = ProjectFile::open(path, OpenMode::ReadWrite);
    if (!opened.file) return std::move(opened.problems);  // not a project, damaged, busy: names the file
    return opened.file->save(project);  // refuses a read-only file (newer schema, no permission) with the reason
}

}  // namespace tl
