// SPDX-License-Identifier: MIT
// `sqfc check` without --bfile: the identity suite through the binary. A clean run passes, one
// corrupted value per identity (the test-only --inject-fault) gives exit code 1 with the right
// first failure, the JSON output and its manifest, bad input, and the progress bar.
#include <gtest/gtest.h>

#include <csignal>
#include <nlohmann/json.hpp>
#include <regex>

#include "cli_runner.hpp"

namespace sqfc::cli_test {
namespace {

using nlohmann::json;

bool has_line(const std::string& text, const std::string& line) { return text.find(line + "\n") != std::string::npos; }

TEST(CheckSuite, CleanRunPassesEveryCheck) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"check", "--to", "600", "--threads", "2"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "");
  EXPECT_TRUE(has_line(r.out, "range: n = 1..600")) << r.out;
  EXPECT_TRUE(has_line(r.out, "identities: 1,2,3,4,5,6,7,8")) << r.out;
  EXPECT_TRUE(has_line(r.out, "checks: 20 run, 20 passed, 0 failed, 0 skipped")) << r.out;
  EXPECT_TRUE(has_line(r.out, "verdict: PASS")) << r.out;
  // Every identity heading, and each check with its source and range.
  int headings = 0;
  for (const std::string title : {"[1] Euler characteristic", "[2] Homotopy type and Betti numbers", "[3] Unimodularity",
                                  "[4] Energy", "[5] Spectrum (inertia)", "[6] Green function in closed form",
                                  "[7] Arithmetic", "[8] Edge counts"}) {
    EXPECT_TRUE(has_line(r.out, title)) << title;
    ++headings;
  }
  EXPECT_EQ(headings, 8);
  const std::regex pass("  PASS  [a-z0-9_]+\n    statement: [^\n]+\n    source: [^\n]+\n    routes: [^\n]+\n    checked: [^\n]+\n"
                        "    counts: [0-9]+ n, [0-9]+ values compared, 0 n failed\n");
  EXPECT_EQ(std::distance(std::sregex_iterator(r.out.begin(), r.out.end(), pass), std::sregex_iterator()), 20) << r.out;
  EXPECT_TRUE(has_line(r.out, "    checked: every n in [1, 600]")) << r.out;
  // Expensive checks say their smaller range, and are listed together at the end.
  EXPECT_TRUE(has_line(r.out, "    checked: every n in [1, 600] (b_0..b_3)")) << r.out;
  EXPECT_TRUE(has_line(r.out, "  inertia_lapack: every n in [2, 200]")) << r.out;
  EXPECT_TRUE(list_dir(dir.work()).empty());  // no file without --out
}

// One corrupted value per identity: exit code 1, the check marked FAIL with its first failure.
TEST(CheckSuite, InjectedFaultFailsEachIdentity) {
  struct Case {
    std::string identity, fault, first_failure;
  };
  // Expected values: 1 - M(37) = 3 with M(37) = -2 (OEIS A002321); Q(100) = 61 (OEIS A013928,
  // shifted by one); D(6) = (-mu(2))(-mu(3))(-mu(5))(-mu(6)) = -1 (design.md identity 3); the faces
  // of K_6 are 2, 3, 5 (dimension 0) and 6 (dimension 1); G_6 has the edges 2-6 and 3-6; g_2 = (1)^-1.
  // b(105) = [13, 10, 1, 0] by Bjorner 2011 (odd squarefree m in (52, 105] by omega, counted by
  // hand: 12 primes 53..103, 10 with two primes, 105 itself), b_0 adding 1 for the vertex 2.
  const std::vector<Case> cases = {
      {"1", "euler_characteristic:37", "first failure: n = 37, expected 3, got 4"},
      {"2", "betti_persistence:105", "first failure: n = 105, expected [13, 10, 1, 0], got [14, 10, 1, 0]"},
      {"3", "fredholm_flint:6", "first failure: n = 6, expected -1, got 1"},
      {"4", "energy_bordered:37", "first failure: n = 37, expected 3, got 4"},
      {"5", "inertia_pivots:6", "first failure: n = 6, expected [3, 1], got [4, 1]"},
      {"6", "green_closed_form:2", "first failure: n = 2, expected g(2, 2) = 1, got g(2, 2) = 2"},
      {"7", "squarefree_formula:100", "first failure: n = 100, expected 61, got 62"},
      {"8", "divisibility_edges:6", "first failure: n = 6, expected 2, got 3"},
  };
  int checked = 0;
  for (const auto& c : cases) {
    ScratchDir dir;
    const auto r = run_sqfc(dir, {"check", "--to", "300", "--threads", "2", "--only", c.identity, "--inject-fault", c.fault});
    EXPECT_EQ(r.exit_code, 1) << describe(r);
    const std::string name = c.fault.substr(0, c.fault.find(':'));
    EXPECT_TRUE(has_line(r.out, "  FAIL  " + name)) << r.out;
    EXPECT_TRUE(has_line(r.out, "    " + c.first_failure)) << c.fault << "\n" << r.out;
    EXPECT_TRUE(has_line(r.out, "verdict: FAIL")) << r.out;
    EXPECT_TRUE(has_line(r.out, "injected fault (test only): " + name + " at n = " + c.fault.substr(c.fault.find(':') + 1))) << r.out;
    const std::string n = c.fault.substr(c.fault.find(':') + 1);
    EXPECT_EQ(r.err, "sqfc check: " + name + " failed at 1 n, first at n = " + n + "\n") << describe(r);
    // Only the corrupted check fails.
    const std::regex fail("\n  FAIL  ");
    EXPECT_EQ(std::distance(std::sregex_iterator(r.out.begin(), r.out.end(), fail), std::sregex_iterator()), 1);
    ++checked;
  }
  EXPECT_EQ(checked, 8);
}

TEST(CheckSuite, JsonOutputAndManifest) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"check", "--to", "500", "--only", "euler,arithmetic", "--out", "suite.json", "--quiet"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"suite.json", "suite.json.manifest.json"}));
  const json doc = json::parse(read_file(dir.path("suite.json")));
  EXPECT_EQ(doc.at("to"), 500);
  EXPECT_EQ(doc.at("identities"), json::array({1, 7}));
  EXPECT_EQ(doc.at("passed"), true);
  ASSERT_EQ(doc.at("checks").size(), 5u);  // 1 Euler check, 4 arithmetic checks
  for (const auto& c : doc.at("checks")) {
    EXPECT_EQ(c.at("verdict"), "PASS") << c.dump();
    EXPECT_EQ(c.at("failed"), 0);
    EXPECT_TRUE(c.at("first_failure").is_null());
    EXPECT_EQ(c.at("from"), 1);
    EXPECT_EQ(c.at("to"), 500);
    EXPECT_FALSE(c.at("source").get<std::string>().empty());
  }
  const json m = json::parse(read_file(dir.path("suite.json.manifest.json")));
  EXPECT_EQ(m.at("command"), "check");
  EXPECT_EQ(m.at("parameters").at("to"), 500);
  EXPECT_EQ(m.at("checks_passed"), true);
  EXPECT_EQ(m.at("checks").size(), 5u);
  EXPECT_TRUE(m.contains("wall_seconds"));

  // A failing run still writes both, saying so; `--out -` puts the JSON on stdout alone.
  const auto f = run_sqfc(dir, {"check", "--to", "200", "--only", "7", "--inject-fault", "liouville_formula:150",
                                "--out", "-", "--quiet"});
  EXPECT_EQ(f.exit_code, 1) << describe(f);
  const json failed = json::parse(f.out);
  EXPECT_EQ(failed.at("passed"), false);
  EXPECT_EQ(failed.at("injected_fault").at("check"), "liouville_formula");
  EXPECT_EQ(failed.at("injected_fault").at("n"), 150);
  EXPECT_TRUE(doc.at("injected_fault").is_null());
  bool found = false;
  for (const auto& c : failed.at("checks"))
    if (c.at("name") == "liouville_formula") {
      found = true;
      EXPECT_EQ(c.at("first_failure").at("n"), 150);
      EXPECT_EQ(c.at("verdict"), "FAIL");
    }
  EXPECT_TRUE(found);
}

TEST(CheckSuite, BadInputIsExitTwoWithOneLineAndNoOutput) {
  ScratchDir dir;
  const std::vector<std::pair<std::vector<std::string>, std::string>> cases = {
      {{"check", "--to", "0"}, "--to"},
      {{"check", "--to", "1e9"}, "--to"},
      {{"check", "--to", "abc"}, "--to"},
      {{"check", "--to", "100", "--threads", "0"}, "--threads"},
      {{"check", "--to", "100", "--only", "9"}, "--only: unknown identity '9'"},
      {{"check", "--to", "100", "--only", "euler,"}, "--only: unknown identity ''"},
      {{"check", "--to", "100", "--inject-fault", "nothing:3"}, "--inject-fault: unknown check 'nothing'"},
      {{"check", "--to", "100", "--inject-fault", "euler_characteristic"}, "--inject-fault: expected CHECK:N"},
      {{"check", "--to", "100", "--only", "2", "--inject-fault", "euler_characteristic:5"}, "which is not selected"},
      {{"check", "--to", "100", "--inject-fault", "euler_characteristic:x"}, "--inject-fault"},
      {{"check", "--to", "100", "--out", ""}, "--out: empty path"},
      {{"check", "--to", "100", "--out", "missing/dir/s.json"}, "missing/dir/s.json"},
      {{"check", "--to", "100", "--sequence", "mertens"}, "--sequence needs --bfile"},
  };
  int checked = 0;
  for (const auto& [args, message] : cases) {
    const auto r = run_sqfc(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(r.out, "") << describe(r);
    EXPECT_EQ(split_lines(r.err).size(), 1u) << describe(r);
    EXPECT_NE(r.err.find(message), std::string::npos) << describe(r);
    EXPECT_TRUE(list_dir(dir.work()).empty()) << describe(r);
    ++checked;
  }
  EXPECT_EQ(checked, 13);
}

TEST(CheckSuite, InterruptLeavesNoFile) {
  // SIGINT once the JSON output is open (its *.part-* file exists): exit 130 by itself, one line,
  // and neither the JSON nor its manifest nor a partial file is left.
  ScratchDir dir;
  RunOptions options;
  options.signal_number = SIGINT;
  options.signal_delay = std::chrono::milliseconds(100);
  options.signal_after_partial_file = true;
  options.timeout = std::chrono::seconds(60);
  const auto r = run_sqfc(dir, {"check", "--to", "1e7", "--only", "7", "--threads", "2", "--out", "s.json"}, options);
  EXPECT_FALSE(r.killed_by_signal) << describe(r);
  EXPECT_EQ(r.exit_code, 128 + SIGINT) << describe(r);
  EXPECT_EQ(split_lines(r.err).size(), 1u) << describe(r);
  EXPECT_NE(r.err.find("interrupt"), std::string::npos) << describe(r);
  EXPECT_EQ(r.out, "") << describe(r);
  EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{}) << describe(r);
}

TEST(CheckSuite, ProgressOnlyOnATerminalAndNotQuiet) {
  RunOptions terminal;
  terminal.stderr_terminal = true;
  ScratchDir dir;
  const auto loud = run_sqfc(dir, {"check", "--to", "1e5", "--only", "1,2"}, terminal);
  EXPECT_EQ(loud.exit_code, 0) << describe(loud);
  EXPECT_NE(loud.err.find("check  |"), std::string::npos) << describe(loud);
  const auto quiet = run_sqfc(dir, {"check", "--to", "1e5", "--only", "1,2", "--quiet"}, terminal);
  EXPECT_EQ(quiet.exit_code, 0) << describe(quiet);
  EXPECT_EQ(quiet.err, "") << describe(quiet);
  EXPECT_EQ(loud.out, quiet.out);
}

}  // namespace
}  // namespace sqfc::cli_test
