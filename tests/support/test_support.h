// Set-up shared by the test suites (GoogleTest and Qt Test alike, so nothing here
// asserts): scratch folders, reading files and fixture models, running the tledger
// executable as a user would, and parsing its JSON (nlohmann::json, so tests check
// values and keys, not substrings).
#pragma once

#include <grp.h>
#include <unistd.h>
#include <sys/wait.h>

#include <atomic>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
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

// Runs `body` in a child process and returns what it reports: empty when all its checks
// held, else the failures. Permissions do not bind root, so as root the child first
// becomes 'nobody' (unless `asNobody` is false); `prepare` runs before that, still as
// root (e.g. to mount a tmpfs in a namespace of its own), and a non-empty answer from it
// is returned instead of running `body`.
inline std::string runInChild(const std::function<std::string()>& body,
                              const std::function<std::string()>& prepare = {}, bool asNobody = true)
{
    int fds[2];
    if (::pipe(fds) != 0) return "pipe failed";
    const pid_t pid = ::fork();
    if (pid == 0) {
        ::close(fds[0]);
        std::string out = prepare ? prepare() : std::string();
        if (out.empty() && asNobody && ::geteuid() == 0 &&
            (::setgroups(0, nullptr) != 0 || ::setgid(65534) != 0 || ::setuid(65534) != 0))
            out = "could not become 'nobody'";
        if (out.empty()) out = body();
        const ssize_t n = ::write(fds[1], out.data(), out.size());
        ::_exit(n == static_cast<ssize_t>(out.size()) ? 0 : 3);
    }
    ::close(fds[1]);
    std::string report;
    char buffer[4096];
    for (ssize_t n; (n = ::read(fds[0], buffer, sizeof buffer)) > 0;) report.append(buffer, static_cast<std::size_t>(n));
    ::close(fds[0]);
    int status = 0;
    ::waitpid(pid, &status, 0);
    if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) report += "\n(the child process did not finish normally)";
    return report;
}

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
// `asNobody`: as root, run it as 'nobody' (setpriv), for tests of permissions.
inline CliRun runTledger(const std::string& args, bool asNobody = false)
{
    ScratchDir dir("cli");
    const std::string as =
        asNobody && ::geteuid() == 0 ? "setpriv --reuid=65534 --regid=65534 --clear-groups " : "";
    const std::string cmd = as + shellQuoted(TL_TLEDGER_EXE) + " " + args + " >" + shellQuoted((dir / "out").string()) +
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
