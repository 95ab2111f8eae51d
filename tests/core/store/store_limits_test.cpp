// Limits of this version (core/model/limits.h) in the project store: a file holding
// more than the loader accepts (written by another program, or damaged) is refused
// with an error naming the file, the scenario and the limit, and left unchanged; a
// save that the loader would refuse is refused before anything is written.
#include <gtest/gtest.h>

#include <algorithm>

#include <sqlite3.h>

#include "core/model/limits.h"
#include "core/store/model_source.h"
#include "core/store/project_save.h"
#include "tests/core/store/store_test_support.h"
#include "tests/support/raw_sqlite.h"

namespace tl::testing {
namespace {

const Problem* findCode(const Problems& problems, std::string_view code)
{
    const auto it = std::find_if(problems.begin(), problems.end(), [&](const Problem& p) { return p.code == code; });
    return it == problems.end() ? nullptr : &*it;
}

struct Saved {
    ScratchDir dir{"store_limits"};
    fs::path file = dir / "limits.tledger";
    Saved() { EXPECT_FALSE(hasErrors(saveProjectToPath(inventedProject(), file))); }
};

TEST(StoreLimits, TooLongCompartmentNameInTheFileIsRefused)
{
    Saved saved;
    tl::testing::rawExec(saved.file, "UPDATE compartment SET name = replace(hex(zeroblob(201)), '00', 'x') WHERE name = 'pike'");
    const std::string before = fileBytes(saved.file);
    const ModelSource source = readModelSource(saved.file);
    EXPECT_FALSE(source.project.has_value());
    const Problem* p = findCode(source.problems, "store-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_EQ(p->location->file, saved.file.string());
    EXPECT_NE(p->message.find("201 characters; the limit of this version is 200"), std::string::npos) << p->message;
    EXPECT_EQ(fileBytes(saved.file), before);
}

TEST(StoreLimits, TooManyCompartmentsInTheFileAreRefused)
{
    Saved saved;
    // 20 001 more producers in the first scenario, added as another program might.
    tl::testing::rawExec(saved.file,
                "WITH RECURSIVE k(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM k WHERE i < 20001) "
                "INSERT INTO compartment (scenario_id, position, name, kind) "
                "SELECT (SELECT min(id) FROM scenario), 1000 + i, 'alga ' || i, 'producer' FROM k");
    const ModelSource source = readModelSource(saved.file);
    EXPECT_FALSE(source.project.has_value());
    const Problem* p = findCode(source.problems, "store-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_NE(p->message.find("more than 20 000 compartments"), std::string::npos) << p->message;
}

TEST(StoreLimits, SaveRefusesWhatTheLoaderWould)
{
    ScratchDir dir("store_limits");
    Project project = inventedProject();
    project.scenarios.front().model.compartment(0).name = std::string(limits::kMaxNameLength + 1, 'y');
    const Problems problems = saveProjectToPath(project, dir / "refused.tledger");
    const Problem* p = findCode(problems, "store-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_NE(p->message.find("compartment 1"), std::string::npos) << p->message;
    EXPECT_FALSE(fs::exists(dir / "refused.tledger"));

    project.scenarios.front().model.compartment(0).name = std::string(limits::kMaxNameLength, 'y');  // at the limit
    EXPECT_FALSE(hasErrors(saveProjectToPath(project, dir / "kept.tledger")));
    const ModelSource back = readModelSource(dir / "kept.tledger");
    ASSERT_TRUE(back.project.has_value());
    EXPECT_TRUE(sameContent(*back.project, project));
}

}  // namespace
}  // namespace tl::testing
