#include "core/io/atomic_file.h"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

namespace tl {
namespace {

namespace fs = std::filesystem;

fs::path freshDir(const std::string& name)
{
    const fs::path dir = fs::temp_directory_path() / ("tl_atomic_" + name + "_" + std::to_string(::testing::UnitTest::GetInstance()->random_seed()));
    fs::remove_all(dir);
    fs::create_directories(dir);
    return dir;
}

std::string slurp(const fs::path& p)
{
    std::ifstream in(p, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

std::size_t entries(const fs::path& dir)
{
    return static_cast<std::size_t>(std::distance(fs::directory_iterator(dir), fs::directory_iterator{}));
}

TEST(AtomicFile, WritesNewFileWithExactBytesAndLeavesNoTemporary)
{
    const fs::path dir = freshDir("new");
    const std::string content("a,b\r\n\"x\"\n\0tail", 15);  // binary-safe, no newline translation
    ASSERT_EQ(writeFileAtomically(dir / "out.csv", content), std::nullopt);
    EXPECT_EQ(slurp(dir / "out.csv"), content);
    EXPECT_EQ(entries(dir), 1u);
    fs::remove_all(dir);
}

TEST(AtomicFile, ReplacesExistingFile)
{
    const fs::path dir = freshDir("replace");
    { std::ofstream(dir / "out.csv") << "old content that is longer than the new one\n"; }
    ASSERT_EQ(writeFileAtomically(dir / "out.csv", "new\n"), std::nullopt);
    EXPECT_EQ(slurp(dir / "out.csv"), "new\n");
    EXPECT_EQ(entries(dir), 1u);
    fs::remove_all(dir);
}

TEST(AtomicFile, MissingFolderIsReportedAndNothingIsCreated)
{
    const fs::path dir = freshDir("missing");
    const auto error = writeFileAtomically(dir / "no_such_sub" / "out.csv", "x");
    ASSERT_TRUE(error.has_value());
    EXPECT_NE(error->find("no_such_sub"), std::string::npos) << *error;
    EXPECT_EQ(entries(dir), 0u);
    fs::remove_all(dir);
}

TEST(AtomicFile, TargetThatIsAFolderKeepsItsContentAndLeavesNoTemporary)
{
    const fs::path dir = freshDir("folder");
    fs::create_directories(dir / "out.csv");
    { std::ofstream(dir / "out.csv" / "keep.txt") << "keep"; }
    const auto error = writeFileAtomically(dir / "out.csv", "x");
    ASSERT_TRUE(error.has_value());
    EXPECT_EQ(slurp(dir / "out.csv" / "keep.txt"), "keep");
    EXPECT_EQ(entries(dir), 1u);  // no temporary left beside it
    fs::remove_all(dir);
}

}  // namespace
}  // namespace tl
