// Set-up shared by the test suites (GoogleTest and Qt Test alike, so nothing here
// asserts): scratch folders, reading files and fixture models, running the tledger
// executable as a user would, and parsing its JSON (nlohmann::json, so tests check
// values and keys, not substrings).
#pragma once

#include <unistd.h>
#include <sys/wait.h>

#include <atomic>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/io/csv_model.h"
#include "core/model/model.h"

namespace tl::testing {

namespace fs = std::filesystem;

inline std::string slurp(const fs::path& p)
{
    std::ifstream in(p, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

inline void writeText(const fs::path& p, const std::string& text)
{
    std::ofstream out(p, std::ios::binary);
    out << text;
}

// `s` in single quotes for /bin/sh.
// Rows of a tab-separated file after its header line, each split into fields.
inline std::vector<std::vector<std::string>> readTsv(const fs::path& path)
{
    std::ifstream in(path);
    std::vector<std::vector<std::string>> rows;
    std::string line;
    std::getline(in, line);  // header
    while (std::getline(in, line)) {
        std::vector<std::string> fields;
        std::stringstream ss(line);
        std::string f;
        while (std::getline(ss, f, '\t')) fields.push_back(f);
        rows.push_back(fields);
    }
    return rows;
}

inline std::string shellQuoted(const std::string& s)
{
    std::string q = "'";
    for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return q + "'";
}

// A fresh, empty folder for one test, removed with everything in it by the destructor.
class ScratchDir {
public:
    explicit ScratchDir(const std::string& tag = "test", const fs::path& base = fs::temp_directory_path())
    {
        static std::atomic<int> counter{0};
        path_ = base /
                ("tl_" + tag + "_" + std::to_string(::getpid()) + "_" + std::to_string(counter++));
        fs::remove_all(path_);
        fs::create_directories(path_);
    }
    ~ScratchDir()
    {
        std::error_code ec;
        fs::remove_all(path_, ec);
    }
    ScratchDir(const ScratchDir&) = delete;
    ScratchDir& operator=(const ScratchDir&) = delete;

    const fs::path& path() const { return path_; }
    fs::path operator/(const std::string& name) const { return path_ / name; }

private:
    fs::path path_;
};

// A CSV model folder of tests/fixtures (a path relative to it, or absolute); nullopt
// when it does not read, with the problems in `why`.
inline std::optional<Model> readFixtureModel(const fs::path& folder, std::string* why = nullptr)
{
    const fs::path path = folder.is_absolute() ? folder : fs::path(TL_FIXTURES_DIR) / folder;
    CsvReadResult read = readCsvModel(path);
    if (why)
        for (const Problem& p : read.problems) *why += p.describe() + "\n";
    return std::move(read.model);
}

// The same for fixtures a test cannot do without: stops the test program, naming the
// folder and the problems, when it does not read.
inline Model fixtureModel(const fs::path& folder)
{
    std::string why;
    std::optional<Model> model = readFixtureModel(folder, &why);
    if (!model) {
        std::fprintf(stderr, "fixture %s does not read:\n%s", folder.string().c_str(), why.c_str());
        std::abort();
    }
    return std::move(*model);
}

#ifdef TL_TLEDGER_EXE
struct CliRun {
    int exitCode = -1;
    std::string out, err;
    nlohmann::json json() const { return nlohmann::json::parse(out); }  // throws on bad JSON
};

// Runs `tledger ARGS` (ARGS already quoted for the shell) and captures its output.
inline CliRun runTledger(const std::string& args)
{
    ScratchDir dir("cli");
    const std::string cmd = shellQuoted(TL_TLEDGER_EXE) + " " + args + " >" + shellQuoted((dir / "out").string()) +
                            " 2>" + shellQuoted((dir / "err").string());
    const int status = std::system(cmd.c_str());
    CliRun run;
    run.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    run.out = slurp(dir / "out");
    run.err = slurp(dir / "err");
    return run;
}
#endif

}  // namespace tl::testing
