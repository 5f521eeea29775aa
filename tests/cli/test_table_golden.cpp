// SPDX-License-Identifier: MIT
// `sqfc table` reproduces the golden files of tests/data/golden/ byte for byte (their content is
// verified independently in test_golden_content.cpp), into a file and on standard output.
// Expected values: the golden files (their sources are named in test_golden_content.cpp).
#include <gtest/gtest.h>

#include "cli_runner.hpp"
#include "golden_cases.hpp"

namespace sqfc::cli_test {
namespace {

// Points at the first differing line, so a failure is readable.
std::string first_difference(const std::string& actual, const std::string& expected) {
  const auto a = split_lines(actual), e = split_lines(expected);
  for (std::size_t i = 0; i < std::max(a.size(), e.size()); ++i) {
    const std::string got = i < a.size() ? a[i] : "(missing)", want = i < e.size() ? e[i] : "(missing)";
    if (got != want) return "line " + std::to_string(i + 1) + ": got '" + got + "', expected '" + want + "'";
  }
  return actual.size() == expected.size() ? "no difference" : "differs only in the final newline";
}

class GoldenFile : public ::testing::TestWithParam<std::size_t> {};

TEST_P(GoldenFile, BinaryReproducesItByteForByte) {
  const auto& c = golden_cases().at(GetParam());
  const std::string expected = read_file(golden_dir() / c.file);
  ASSERT_FALSE(expected.empty()) << c.file;
  ScratchDir dir;
  const auto r = run_sqfc(dir, c.args);
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "") << describe(r);  // stderr is not a terminal: no progress bar, no chatter
  EXPECT_EQ(r.out, "") << describe(r);
  const std::string actual = read_file(dir.path(c.file));
  EXPECT_TRUE(actual == expected) << c.file << ": " << first_difference(actual, expected);
  EXPECT_EQ(actual.size(), expected.size()) << c.file;
}

std::string case_name(const ::testing::TestParamInfo<std::size_t>& info) {
  std::string name = golden_cases().at(info.param).file;
  for (auto& ch : name)
    if (!std::isalnum(static_cast<unsigned char>(ch))) ch = '_';
  return name;
}

INSTANTIATE_TEST_SUITE_P(All, GoldenFile, ::testing::Range<std::size_t>(0, golden_cases().size()), case_name);

TEST(GoldenFiles, SixCasesAreRegistered) { EXPECT_EQ(golden_cases().size(), 6u); }

TEST(GoldenFiles, StandardOutputGivesTheSameBytesAndNoFiles) {
  // `--out -` for each table golden (not the events one, whose table goes to t.csv).
  int checked = 0;
  for (const auto& c : golden_cases()) {
    if (c.file.rfind("events", 0) == 0) continue;
    auto args = c.args;
    const auto out = std::find(args.begin(), args.end(), "--out");
    ASSERT_NE(out, args.end());
    *(out + 1) = "-";
    ScratchDir dir;
    const auto r = run_sqfc(dir, args);
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(r.err, "") << describe(r);
    const std::string expected = read_file(golden_dir() / c.file);
    EXPECT_TRUE(r.out == expected) << c.file << " on stdout: " << first_difference(r.out, expected);
    // No file at all: neither a table nor a manifest (the manifest goes beside file outputs only).
    EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{}) << describe(r);
    ++checked;
  }
  EXPECT_EQ(checked, 5);
}

TEST(GoldenFiles, EventsGoToStandardOutputToo) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"table", "--to", "1000", "--at", "1000", "--events", "-", "--out", "t.csv"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const std::string expected = read_file(golden_dir() / "events_to1000.csv");
  EXPECT_TRUE(r.out == expected) << first_difference(r.out, expected);
  // The table still went to its file, with its manifest beside it.
  EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"t.csv", "t.csv.manifest.json"}));
}

}  // namespace
}  // namespace sqfc::cli_test
