// SPDX-License-Identifier: MIT
// Tests of io/identity_report: the exact text of the report of a hand-made suite result (a pass,
// a failure, a skipped check, a smaller range, an injected fault) and its JSON, read back with
// nlohmann-json (used here only as a reader).
#include "sqfc/io/identity_report.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <sstream>

namespace {

using sqfc::track::IdentityCheckResult;
using sqfc::track::IdentitySuiteReport;

IdentitySuiteReport sample_report() {
  IdentitySuiteReport r;
  r.to = 50;
  r.identities = {1, 7};
  IdentityCheckResult pass;
  pass.identity = 1;
  pass.name = "euler_characteristic";
  pass.statement = "S1";
  pass.source = "P1";
  pass.routes = "A vs B";
  pass.from = 1;
  pass.to = 50;
  pass.coverage = "every n in [1, 50]";
  pass.points = 50;
  pass.compared = 50;
  IdentityCheckResult fail = pass;
  fail.identity = 7;
  fail.name = "squarefree_formula";
  fail.to = 40;
  fail.coverage = "every n in [1, 40]";
  fail.reduced_range = true;
  fail.points = 40;
  fail.compared = 40;
  fail.failed = 2;
  fail.first_failure = sqfc::track::IdentityFailure{12, "9", "10"};
  IdentityCheckResult skipped = pass;
  skipped.identity = 7;
  skipped.name = "liouville_formula";
  skipped.from = 0;
  skipped.to = 0;
  skipped.points = 0;
  skipped.compared = 0;
  r.checks = {pass, fail, skipped};
  r.corruption = sqfc::track::IdentityCorruption{"squarefree_formula", 12};
  return r;
}

TEST(IdentityReport, TextHasEveryPartInOrder) {
  std::ostringstream out;
  sqfc::io::write_identity_report(out, sample_report(), 2);
  EXPECT_EQ(out.str(),
            "sqfc identity suite (design.md section 2)\n"
            "range: n = 1..50\n"
            "identities: 1,7\n"
            "threads: 2\n"
            "injected fault (test only): squarefree_formula at n = 12\n"
            "\n[1] Euler characteristic\n"
            "  PASS  euler_characteristic\n"
            "    statement: S1\n    source: P1\n    routes: A vs B\n"
            "    checked: every n in [1, 50]\n"
            "    counts: 50 n, 50 values compared, 0 n failed\n"
            "\n[7] Arithmetic\n"
            "  FAIL  squarefree_formula\n"
            "    statement: S1\n    source: P1\n    routes: A vs B\n"
            "    checked: every n in [1, 40] (smaller range: expensive check)\n"
            "    counts: 40 n, 40 values compared, 2 n failed\n"
            "    first failure: n = 12, expected 9, got 10\n"
            "  SKIPPED  liouville_formula\n"
            "    statement: S1\n    source: P1\n    routes: A vs B\n"
            "    checked: nothing (no n of this check lies in 1..50)\n"
            "\nsmaller ranges (expensive checks):\n"
            "  squarefree_formula: every n in [1, 40]\n"
            "\nengine self-checks: all passed\n"
            "checks: 3 run, 1 passed, 1 failed, 1 skipped\n"
            "verdict: FAIL\n");
}

TEST(IdentityReport, JsonReadsBack) {
  const auto doc = nlohmann::json::parse(sqfc::io::identity_report_json(sample_report()).dump(2));
  EXPECT_EQ(doc.at("to"), 50);
  EXPECT_EQ(doc.at("identities"), nlohmann::json::array({1, 7}));
  EXPECT_EQ(doc.at("passed"), false);
  EXPECT_EQ(doc.at("injected_fault").at("check"), "squarefree_formula");
  EXPECT_EQ(doc.at("injected_fault").at("n"), 12);
  ASSERT_EQ(doc.at("checks").size(), 3u);
  const auto& f = doc.at("checks").at(1);
  EXPECT_EQ(f.at("identity"), 7);
  EXPECT_EQ(f.at("identity_title"), "Arithmetic");
  EXPECT_EQ(f.at("verdict"), "FAIL");
  EXPECT_EQ(f.at("reduced_range"), true);
  EXPECT_EQ(f.at("first_failure").at("n"), 12);
  EXPECT_EQ(f.at("first_failure").at("expected"), "9");
  EXPECT_EQ(f.at("first_failure").at("got"), "10");
  const auto& s = doc.at("checks").at(2);
  EXPECT_EQ(s.at("verdict"), "SKIPPED");
  EXPECT_TRUE(s.at("from").is_null());
  EXPECT_TRUE(s.at("to").is_null());
  EXPECT_TRUE(doc.at("checks").at(0).at("first_failure").is_null());
  // A failing engine self-check fails the whole report even when every check passed.
  IdentitySuiteReport clean;
  clean.to = 1;
  clean.engine_checks_failed = {"block_rescan"};
  EXPECT_FALSE(clean.passed());
  std::ostringstream out;
  sqfc::io::write_identity_report(out, clean, 1);
  EXPECT_NE(out.str().find("engine self-checks: block_rescan FAILED\n"), std::string::npos) << out.str();
}

}  // namespace
