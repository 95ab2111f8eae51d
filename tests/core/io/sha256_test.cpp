// SHA-256 (core/io/sha256.h) against the examples of FIPS 180-2 (appendix B: "abc" and
// the 448-bit two-block message; values as published) and against Python's hashlib on
// the sample project files (a reference library, run here).
#include "core/io/sha256.h"

#include <cstdio>
#include <gtest/gtest.h>

#include "tests/support/test_support.h"

namespace tl {
namespace {

TEST(Sha256, PublishedExamples)
{
    EXPECT_EQ(sha256Hex("abc"), "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    EXPECT_EQ(sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq"),
              "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    EXPECT_EQ(sha256Hex(""), "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

std::string pythonSha256(const std::string& path)
{
    // Appended, not "..." + std::string: GCC 12 warns falsely (-Wrestrict) on that.
    std::string cmd = "/usr/bin/python3 -c 'import hashlib,sys; print(hashlib.sha256(open(sys.argv[1],\"rb\").read()).hexdigest())' ";
    cmd += testing::shellQuoted(path);
    std::string out;
    if (FILE* pipe = ::popen(cmd.c_str(), "r")) {
        char buffer[128];
        while (std::fgets(buffer, sizeof buffer, pipe)) out += buffer;
        ::pclose(pipe);
    }
    while (!out.empty() && out.back() == '\n') out.pop_back();
    return out;
}

TEST(Sha256, FilesAgreeWithPythonHashlib)
{
    for (const char* name : {"reservoir.tledger", "lagoon.tledger", "README.md"}) {
        const std::string path = std::string(TL_SAMPLES_DIR) + "/" + name;
        const auto mine = fileSha256(path);
        ASSERT_TRUE(mine) << path;
        EXPECT_EQ(*mine, pythonSha256(path)) << path;
    }
    EXPECT_FALSE(fileSha256("/no/such/file"));
}

// Lengths around the 55/56/64-byte padding boundaries, against hashlib.
TEST(Sha256, PaddingBoundariesAgreeWithPythonHashlib)
{
    const testing::ScratchDir dir("sha256");
    for (std::size_t n : {55u, 56u, 63u, 64u, 65u, 119u, 120u, 1000u}) {
        const std::string text(n, static_cast<char>('a' + n % 26));
        const auto path = dir / std::string("m").append(std::to_string(n));
        testing::writeText(path, text);
        EXPECT_EQ(sha256Hex(text), pythonSha256(path.string())) << n;
    }
}

}  // namespace
}  // namespace tl
