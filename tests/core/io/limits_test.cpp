// Limits of this version (core/model/limits.h) in the CSV and SCOR readers: one past
// each limit is refused with an error naming the file, line and column and the limit;
// at the limit the input reads. The diet-entry case reads 2 million shares; its
// suite's name ends in "Large" so that the sanitizer run can leave it out (tests/run.sh).
#include <gtest/gtest.h>

#include <algorithm>
#include <fstream>

#include "core/io/csv_model.h"
#include "core/io/scor.h"
#include "core/model/limits.h"
#include "tests/support/test_support.h"

namespace tl::testing {
namespace {

const Problem* findCode(const Problems& problems, std::string_view code)
{
    const auto it = std::find_if(problems.begin(), problems.end(), [&](const Problem& p) { return p.code == code; });
    return it == problems.end() ? nullptr : &*it;
}

const std::string kHeader = "name,kind,biomass,pb,qb,ee,pq,unassim,biomass_accum,net_emigration,detritus_import\n";

// `n` producers and one detritus pool: a model that reads without a diet.csv.
std::string producers(std::size_t n)
{
    std::string text = kHeader + "Detritus,detritus,10,,,,,,,,\n";
    for (std::size_t k = 1; k < n; ++k) text += "Alga " + std::to_string(k) + ",producer,1,10,,,,,,,\n";
    return text;
}

std::string repeated(std::string_view piece, std::size_t times)
{
    std::string out;
    for (std::size_t k = 0; k < times; ++k) out += piece;
    return out;
}

// A file of `bytes` zero bytes that takes no disk space (a sparse file).
void sparseFile(const fs::path& path, std::uintmax_t bytes)
{
    { std::ofstream create(path, std::ios::binary); }
    fs::resize_file(path, bytes);
}

TEST(CsvLimits, CompartmentsUpToTheLimitRead)
{
    ScratchDir dir("limits");
    writeText(dir / "compartments.csv", producers(limits::kMaxCompartments));
    const CsvReadResult read = readCsvModel(dir.path());
    ASSERT_TRUE(read.model.has_value());
    EXPECT_EQ(read.model->size(), limits::kMaxCompartments);
}

TEST(CsvLimits, OneCompartmentTooManyIsRefusedAtItsRow)
{
    ScratchDir dir("limits");
    writeText(dir / "compartments.csv", producers(limits::kMaxCompartments + 1));
    const CsvReadResult read = readCsvModel(dir.path());
    EXPECT_FALSE(read.model.has_value());
    const Problem* p = findCode(read.problems, "csv-limit");
    ASSERT_NE(p, nullptr);
    ASSERT_TRUE(p->location.has_value());
    EXPECT_EQ(p->location->file, (dir / "compartments.csv").string());
    EXPECT_EQ(p->location->line, static_cast<int>(limits::kMaxCompartments) + 2);  // header, then row 20 001
    EXPECT_EQ(p->location->column, 1);
    EXPECT_NE(p->message.find("20 000"), std::string::npos) << p->message;
}

TEST(CsvLimits, NameLengthCountsCharactersNotBytes)
{
    ScratchDir dir("limits");
    const std::string atLimit = repeated("é", limits::kMaxNameLength);  // 400 bytes, 200 characters
    writeText(dir / "compartments.csv", producers(2) + atLimit + ",producer,1,10,,,,,,,\n");
    EXPECT_TRUE(readCsvModel(dir.path()).model.has_value());

    writeText(dir / "compartments.csv", producers(2) + atLimit + "e,producer,1,10,,,,,,,\n");
    const CsvReadResult read = readCsvModel(dir.path());
    EXPECT_FALSE(read.model.has_value());
    const Problem* p = findCode(read.problems, "csv-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_EQ(p->location->line, 4);
    EXPECT_EQ(p->location->column, 1);
    EXPECT_NE(p->message.find("201 characters; the limit is 200"), std::string::npos) << p->message;
}

TEST(CsvLimits, FleetsBeyondTheLimitAreRefusedOnce)
{
    ScratchDir dir("limits");
    writeText(dir / "compartments.csv", producers(3));
    std::string harvest = "fleet,compartment,landings,discards\n";
    for (std::size_t f = 1; f <= limits::kMaxFleets + 3; ++f) harvest += "Boat " + std::to_string(f) + ",Alga 1,0.01,\n";
    writeText(dir / "harvest.csv", harvest);
    const CsvReadResult read = readCsvModel(dir.path());
    EXPECT_FALSE(read.model.has_value());
    EXPECT_EQ(std::count_if(read.problems.begin(), read.problems.end(),
                            [](const Problem& p) { return p.code == "csv-limit"; }), 1);
    const Problem* p = findCode(read.problems, "csv-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_EQ(p->location->file, (dir / "harvest.csv").string());
    EXPECT_EQ(p->location->line, static_cast<int>(limits::kMaxFleets) + 2);
    EXPECT_EQ(p->location->column, 1);

    harvest.resize(harvest.find("Boat " + std::to_string(limits::kMaxFleets + 1) + ","));  // 200 fleets: read
    writeText(dir / "harvest.csv", harvest);
    const CsvReadResult atLimit = readCsvModel(dir.path());
    ASSERT_TRUE(atLimit.model.has_value());
    EXPECT_EQ(atLimit.model->fleets().size(), limits::kMaxFleets);
}

TEST(CsvLimits, OversizedFileIsRefusedBeforeItIsRead)
{
    ScratchDir dir("limits");
    sparseFile(dir / "compartments.csv", limits::kMaxCsvFileBytes + 1);
    const CsvReadResult read = readCsvModel(dir.path());
    EXPECT_FALSE(read.model.has_value());
    const Problem* p = findCode(read.problems, "csv-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_EQ(p->location->file, (dir / "compartments.csv").string());
    EXPECT_NE(p->message.find("256 MiB"), std::string::npos) << p->message;
}

TEST(CsvLimits, WriterRefusesWhatTheReaderWould)
{
    ScratchDir dir("limits");
    writeText(dir / "compartments.csv", producers(3));
    Model model = readCsvModel(dir.path()).model.value();
    model.compartment(1).name = repeated("x", limits::kMaxNameLength + 1);
    const Problems written = writeCsvModel(model, dir / "out");
    const Problem* p = findCode(written, "csv-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_NE(p->message.find("compartment 2"), std::string::npos) << p->message;
    EXPECT_FALSE(fs::exists(dir / "out" / "compartments.csv"));
}

// "P12": a generated name (appended piecewise; GCC 12 warns, wrongly, about "P" + to_string).
std::string generated(char prefix, std::size_t k)
{
    std::string name(1, prefix);
    name += std::to_string(k);
    return name;
}

// 2 000 001 non-zero shares in long form (1 001 predators x 1 999 prey): refused at the
// share too many.
TEST(CsvLimitsLarge, DietEntriesBeyondTheLimitAreRefusedAtTheirCell)
{
    constexpr std::size_t kPrey = 1999, kPredators = 1001;
    static_assert(kPrey * kPredators > limits::kMaxDietEntries);
    ScratchDir dir("limits");
    std::string compartments = kHeader + "Detritus,detritus,10,,,,,,,,\n";
    for (std::size_t k = 0; k < kPrey; ++k) compartments += generated('P', k) + ",producer,1,10,,,,,,,\n";
    for (std::size_t k = 0; k < kPredators; ++k) compartments += generated('C', k) + ",consumer,1,1,5,,,0.2,,,\n";
    writeText(dir / "compartments.csv", compartments);
    std::string diet = "predator,prey,share\n";
    diet.reserve(kPrey * kPredators * 18);
    for (std::size_t c = 0; c < kPredators; ++c)
        for (std::size_t k = 0; k < kPrey; ++k) diet += generated('C', c) + "," + generated('P', k) + ",0.0005\n";
    writeText(dir / "diet.csv", diet);
    const CsvReadResult read = readCsvModel(dir.path());
    EXPECT_FALSE(read.model.has_value());
    const Problem* p = findCode(read.problems, "csv-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_EQ(p->location->file, (dir / "diet.csv").string());
    EXPECT_EQ(p->location->line, static_cast<int>(limits::kMaxDietEntries) + 2);  // header, then entry 2 000 001
    EXPECT_EQ(p->location->column, 3);
    EXPECT_NE(p->message.find("2 000 000"), std::string::npos) << p->message;
}

// SCOR: at most 999 nodes by its format; names and the file's size are limited here.
std::string scorWithName(const std::string& name)
{
    return "title\n  2  1\n" + name + "\nDetritus\n  1 5\n  2 1\n -1\n  1 10\n -1\n -1\n  1 2\n  2 3\n -1\n"
           "  1  2 3\n -1 -1\n";
}

TEST(ScorLimits, LongNameIsRefusedAtItsLine)
{
    EXPECT_TRUE(readScor(scorWithName(repeated("a", limits::kMaxNameLength)), "x.scor").network.has_value());
    const ScorReadResult read = readScor(scorWithName(repeated("a", limits::kMaxNameLength + 1)), "x.scor");
    EXPECT_FALSE(read.network.has_value());
    const Problem* p = findCode(read.problems, "scor-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_EQ(p->location->file, "x.scor");
    EXPECT_EQ(p->location->line, 3);
    EXPECT_EQ(p->location->column, 1);
}

// The writer turns " -1" inside a name into " - 1" (readers key on " -1"): a name at
// the limit with one in it would come back one character too long, so it is refused
// before writing (found by tests/fuzz/fuzz_scor; tests/fuzz/regressions/scor).
TEST(ScorLimits, WriterRefusesANameThatWritingWouldLengthenPastTheLimit)
{
    ScorReadResult read = readScor(scorWithName(repeated("a", limits::kMaxNameLength - 3) + " -1"), "x.scor");
    ASSERT_TRUE(read.network.has_value());
    const auto refused = checkScorWritable(*read.network);
    ASSERT_TRUE(refused.has_value());
    EXPECT_NE(refused->find("201 characters"), std::string::npos) << *refused;
    read.network->names[0] = repeated("a", limits::kMaxNameLength - 4) + " -1";  // 200 as written
    EXPECT_FALSE(checkScorWritable(*read.network).has_value());
    EXPECT_TRUE(readScor(writeScor(*read.network), "y.scor").network.has_value());
}

TEST(ScorLimits, OversizedFileIsRefused)
{
    ScratchDir dir("limits");
    sparseFile(dir / "big.scor", limits::kMaxScorFileBytes + 1);
    const ScorReadResult read = readScorFile(dir / "big.scor");
    EXPECT_FALSE(read.network.has_value());
    const Problem* p = findCode(read.problems, "scor-limit");
    ASSERT_NE(p, nullptr);
    EXPECT_EQ(p->location->file, (dir / "big.scor").string());
    EXPECT_NE(p->message.find("64 MiB"), std::string::npos) << p->message;
}

TEST(Limits, NumbersAsMessagesShowThem)
{
    EXPECT_EQ(limits::groupedNumber(20000), "20 000");
    EXPECT_EQ(limits::groupedNumber(2000000), "2 000 000");
    EXPECT_EQ(limits::groupedNumber(999), "999");
    EXPECT_EQ(limits::byteSize(256u << 20), "256 MiB");
    EXPECT_EQ(limits::byteSize(1025), "1 025 bytes");
    EXPECT_EQ(limits::characterCount("é-ö"), 3u);
}

}  // namespace
}  // namespace tl::testing
