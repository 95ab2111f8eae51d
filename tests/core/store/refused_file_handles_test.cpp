// A project file that fails SQLite's quick check is refused without keeping anything
// open: before the fix, the check's statement was still open when the connection was
// closed, so sqlite3_close failed and every refused open leaked a connection and its
// file handle. The input is the fuzzer's finding (tests/fuzz/regressions/project).
#include <gtest/gtest.h>

#include "core/store/model_source.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

std::size_t openFileHandles()
{
    std::size_t n = 0;
    for ([[maybe_unused]] const auto& e : fs::directory_iterator("/proc/self/fd")) ++n;
    return n;
}

TEST(RefusedProjectFile, LeavesNoFileHandleOpen)
{
    const fs::path finding =
        fs::path(TL_FIXTURES_DIR).parent_path() / "fuzz/regressions/project/leak_connection_after_failed_quick_check.tledger";
    ASSERT_TRUE(fs::exists(finding)) << finding;
    ScratchDir dir("refused");
    const fs::path copy = dir / "damaged.tledger";
    fs::copy_file(finding, copy);
    const std::string before = slurp(copy);

    const std::size_t handles = openFileHandles();
    for (int k = 0; k < 20; ++k) {
        const ModelSource source = readModelSource(copy);
        ASSERT_FALSE(source.project.has_value());
        ASSERT_TRUE(hasErrors(source.problems));
    }
    EXPECT_EQ(openFileHandles(), handles);
    EXPECT_EQ(slurp(copy), before);  // refused files are left as they were
}

}  // namespace
}  // namespace tl::testing
