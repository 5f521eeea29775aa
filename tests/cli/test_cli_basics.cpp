// SPDX-License-Identifier: MIT
// The executable's front door: --help, --version, and what happens without a subcommand.
// Expected values: the version string from sqfc/core/version.hpp and the exit codes of design.md
// section 4 (common practice: 0 for help, 2 for usage errors); no outside value is used.
#include <gtest/gtest.h>

#include "cli_runner.hpp"
#include "sqfc/core/version.hpp"

namespace sqfc::cli_test {
namespace {

TEST(CliBasics, HelpListsTheSubcommandsAndExitsZero) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"--help"});
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "") << describe(r);
  int found = 0;
  for (const std::string word : {"table", "demo"}) {
    EXPECT_NE(r.out.find(word), std::string::npos) << word << "\n" << r.out;
    ++found;
  }
  EXPECT_EQ(found, 2);
  EXPECT_EQ(list_dir(dir.work()).size(), 0u);
}

TEST(CliBasics, TableHelpListsItsOptions) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"table", "--help"});
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  int found = 0;
  // The options of design.md section 4, plus the engine's own.
  for (const std::string option : {"--to", "--from", "--every", "--at", "--log", "--columns", "--format", "--out",
                                   "--events", "--threads", "--block-size", "--quiet"}) {
    EXPECT_NE(r.out.find(option), std::string::npos) << option << "\n" << r.out;
    ++found;
  }
  EXPECT_EQ(found, 12);
  EXPECT_EQ(list_dir(dir.work()).size(), 0u);  // help runs nothing
}

TEST(CliBasics, DemoHelpExitsZero) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"demo", "--help"});
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_NE(r.out.find("--out-dir"), std::string::npos) << r.out;
  EXPECT_EQ(list_dir(dir.work()).size(), 0u);  // no data_out/demo created by asking for help
}

TEST(CliBasics, VersionPrintsTheLibraryVersion) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"--version"});
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_NE(r.out.find(sqfc::version_string), std::string::npos) << r.out;
}

TEST(CliBasics, NoSubcommandIsExitTwoWithOneLine) {
  int checked = 0;
  for (const auto& args : std::vector<std::vector<std::string>>{{}, {"--threads", "2"}}) {
    ScratchDir dir;
    const auto r = run_sqfc(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(r.out, "") << describe(r);
    EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << describe(r);
    EXPECT_NE(r.err.find("command"), std::string::npos) << describe(r);  // says a (sub)command is missing
    EXPECT_EQ(list_dir(dir.work()).size(), 0u);
    ++checked;
  }
  EXPECT_EQ(checked, 2);
}

}  // namespace
}  // namespace sqfc::cli_test
