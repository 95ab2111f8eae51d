// Saving a whole project to a path: the one way the workbench (Save, Save As, the
// recovery file) and the CLI write a project. Project files are never rewritten by
// copying: each case keeps the file valid at every instant, so a killed program leaves
// the old state or the new one, and a second program reading the file meanwhile sees
// one of them whole.
//
//   no file there       ProjectFile::create: built under a temporary name beside the
//                       target, then linked into place (a half-made project never
//                       appears under the real name).
//   a project file      ProjectFile::save in place: ONE SQLite transaction in WAL mode
//                       (readers keep their snapshot until it commits; the kill test in
//                       tests/core/store/crash_safety_test.cpp). Stored runs already in
//                       the file are kept; runs with id 0 are added.
//   anything else       refused with a Problem naming the file; nothing is written over
//                       a file that is not a Trophic Ledger project, nor over a project
//                       of a newer schema or one that cannot be written.
#pragma once

#include <filesystem>

#include "core/model/problem.h"
#include "core/store/project.h"

namespace tl {

Problems saveProjectToPath(const Project& project, const std::filesystem::path& path);

}  // namespace tl
