// SPDX-License-Identifier: MIT
// `sqfc runs list|show` through the binary: complete, partial and damaged stores.
#include <gtest/gtest.h>

#include <regex>

#include "cli/store_kill_support.hpp"

namespace {

using namespace sqfc::cli_test;
namespace fs = std::filesystem;

TEST(Runs, ShowReportsRangeParametersTimingsAndChecks) {
  ScratchDir dir;
  ASSERT_EQ(run_sqfc(dir, table_args("1e7", false)).exit_code, 0);
  const auto r = run_sqfc(dir, {"runs", "show", "run.db"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_NE(r.out.find("done         n in [1, 10000000] of [1, 10000000] (100.0%, complete)"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find(" to=10000000"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find(" samples=every=3000000;"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("store checks passed"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("check        euler_poincare: 3 passed, 0 failed"), std::string::npos) << r.out;
  EXPECT_TRUE(std::regex_search(r.out, std::regex("attempt 1 .* n 1\\.\\.10000000, [0-9.]+ s, threads 2, ranks 1")))
      << r.out;
  // M(10^7) = 1037 (OEIS A084237), Q(10^7) = 6079291 (OEIS A071172).
  EXPECT_NE(r.out.find("at n = 10000000  M = 1037, Q = 6079291"), std::string::npos) << r.out;
}

TEST(Runs, ListMarksCompletePartialAndDamagedStores) {
  ScratchDir dir;
  ASSERT_EQ(run_sqfc(dir, table_args("1e7", false)).exit_code, 0);
  fs::rename(dir.path("run.db"), dir.path("complete.db"));
  const auto k = run_and_kill_at(dir, table_args("3e8", false), "run.db", 1, std::chrono::microseconds(0));
  ASSERT_TRUE(k.killed);
  fs::rename(dir.path("run.db"), dir.path("partial.db"));
  for (const char* side : {"run.db-wal", "run.db-shm"})
    if (fs::exists(dir.path(side))) fs::rename(dir.path(side), dir.path(std::string("partial.db") + (side + 6)));
  fs::copy_file(dir.path("complete.db"), dir.path("damaged.db"));
  fs::resize_file(dir.path("damaged.db"), fs::file_size(dir.path("damaged.db")) / 2);
  const auto r = run_sqfc(dir, {"runs", "list", "."});
  EXPECT_EQ(r.exit_code, 1) << describe(r);  // a damaged store is a failed check
  const auto lines = split_lines(r.out);
  ASSERT_EQ(lines.size(), 4U) << r.out;
  EXPECT_EQ(lines[0], "store\tstatus\tdone\tto\tprogress\tattempts\twall_seconds\tnote");
  EXPECT_TRUE(std::regex_match(lines[1], std::regex("\\./complete\\.db\tcomplete\t10000000\t10000000\t100\\.0%\t1\t[0-9.]+\t-")))
      << lines[1];
  EXPECT_TRUE(std::regex_match(lines[2], std::regex("\\./damaged\\.db\trefused\t.*damaged.*"))) << lines[2];
  EXPECT_TRUE(std::regex_match(lines[3], std::regex("\\./partial\\.db\tpartial\t[0-9]+\t300000000\t[0-9.]+%\t1\t[0-9.]+\t-")))
      << lines[3];
  const auto one = run_sqfc(dir, {"runs", "list", "complete.db"});
  EXPECT_EQ(one.exit_code, 0);
  EXPECT_EQ(split_lines(one.out).size(), 2U);
}

TEST(Runs, ShowRefusesDamagedOrMissingStoresWithOneLine) {
  ScratchDir dir;
  ASSERT_EQ(run_sqfc(dir, table_args("1e7", false)).exit_code, 0);
  fs::resize_file(dir.path("run.db"), 5000);
  for (const char* name : {"run.db", "missing.db"}) {
    const auto r = run_sqfc(dir, {"runs", "show", name});
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(count_lines(r.err), 1) << r.err;
    EXPECT_NE(r.err.find("run store '" + std::string(name) + "'"), std::string::npos) << r.err;
    EXPECT_TRUE(r.out.empty());
  }
  const auto u = run_sqfc(dir, {"runs", "list", "nowhere"});
  EXPECT_EQ(u.exit_code, 2);
  EXPECT_NE(u.err.find("'nowhere' does not exist"), std::string::npos) << u.err;
}

}  // namespace
