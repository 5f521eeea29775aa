// SPDX-License-Identifier: MIT
// `sqfc table --store/--resume` through the binary: runs SIGKILLed at random points and resumed
// write byte-identical table and events files (and the same manifest apart from run times and
// command line) as an uninterrupted run; other parameters, damaged stores and a file-size limit
// each give one clear error line and exit code 2. Many kill points: test_table_store_slow.cpp.
#include <gtest/gtest.h>

#include <algorithm>
#include <random>

#include "cli/store_kill_support.hpp"
#include "oracles/test_support.hpp"
#include <sqlite3.h>

namespace {

using namespace sqfc::cli_test;
namespace fs = std::filesystem;

TEST(TableStore, KilledAtRandomPointsAndResumedIsByteIdentical) {
  auto rng = sqfc::testing::test_rng(71);
  std::vector<unsigned long long> points;
  for (int i = 0; i < 2; ++i) points.push_back(1 + rng() % 60'000'000ULL);
  const int inside = kill_resume_and_compare("6e7", points, 72);
  EXPECT_EQ(inside, 2) << sqfc::testing::seed_note();
}

TEST(TableStore, KilledBeforeTheFirstCommitAndResumed) {
  const int inside = kill_resume_and_compare("3e7", {0}, 73);
  EXPECT_EQ(inside, 1);
}

TEST(TableStore, OtherParametersAreRefusedNamingThem) {
  ScratchDir dir;
  ASSERT_EQ(run_sqfc(dir, table_args("1e7", false)).exit_code, 0);
  auto args = table_args("2e7", true);
  const auto r = run_sqfc(dir, args);
  EXPECT_EQ(r.exit_code, 2) << describe(r);
  EXPECT_EQ(count_lines(r.err), 1) << r.err;
  EXPECT_NE(r.err.find("other parameters: to (store: 10000000, now: 20000000)"), std::string::npos) << r.err;
  args = table_args("1e7", true);
  args[4] = "5000";
  const auto s = run_sqfc(dir, args);
  EXPECT_EQ(s.exit_code, 2);
  EXPECT_NE(s.err.find("samples (store: every=3000000;, now: every=5000;)"), std::string::npos) << s.err;
  // A store that exists is never overwritten without --resume; --resume needs --store.
  const auto t = run_sqfc(dir, table_args("1e7", false));
  EXPECT_EQ(t.exit_code, 2);
  EXPECT_NE(t.err.find("already exists"), std::string::npos) << t.err;
  const auto u = run_sqfc(dir, {"table", "--to", "1e6", "--resume", "--quiet", "--out", "x.csv"});
  EXPECT_EQ(u.exit_code, 2);
  EXPECT_NE(u.err.find("--resume needs --store"), std::string::npos) << u.err;
  EXPECT_FALSE(fs::exists(dir.path("x.csv")));
}

TEST(TableStore, DamagedStoresAreRefusedWithoutOutput) {
  ScratchDir base;
  ASSERT_EQ(run_sqfc(base, table_args("2e7", false)).exit_code, 0);
  const auto original = base.path("run.db");
  const auto size = fs::file_size(original);
  struct Damage {
    std::string name;
    std::function<void(const std::string&)> apply;
  };
  auto sql = [](const std::string& p, const std::string& statement) {
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(p.c_str(), &db), SQLITE_OK);
    ASSERT_EQ(sqlite3_exec(db, statement.c_str(), nullptr, nullptr, nullptr), SQLITE_OK) << statement;
    sqlite3_close(db);
  };
  const std::vector<Damage> damages = {
      {"flipped bytes in a block row",
       [&](const std::string& p) {
         sql(p, "UPDATE blocks SET summary = CAST(substr(summary, 1, 4) || X'55' || substr(summary, 6) AS BLOB) "
                "WHERE lo = 1 + 5 * 131072");
       }},
      {"a deleted block row", [&](const std::string& p) { sql(p, "DELETE FROM blocks WHERE lo = 1 + 7 * 131072"); }},
      {"a truncated file", [&](const std::string& p) { fs::resize_file(p, size / 2); }},
      {"random bytes overwritten", [&](const std::string& p) {
         std::fstream f(p, std::ios::in | std::ios::out | std::ios::binary);
         auto rng = sqfc::testing::test_rng(74);
         for (int i = 0; i < 16; ++i) {
           f.seekp(static_cast<std::streamoff>(4096 + rng() % (size - 4096)));
           f.put(static_cast<char>(rng()));
         }
       }}};
  int refused = 0;
  for (const auto& d : damages) {
    ScratchDir dir;
    fs::copy_file(original, dir.path("run.db"));
    d.apply(dir.path("run.db").string());
    const auto r = run_sqfc(dir, table_args("2e7", true));
    EXPECT_EQ(r.exit_code, 2) << d.name << ": " << describe(r);
    EXPECT_EQ(count_lines(r.err), 1) << d.name << ": " << r.err;
    EXPECT_NE(r.err.find("run store 'run.db'"), std::string::npos) << d.name << ": " << r.err;
    EXPECT_FALSE(fs::exists(dir.path("t.csv"))) << d.name;
    EXPECT_FALSE(fs::exists(dir.path("ev.csv"))) << d.name;
    ++refused;
  }
  EXPECT_EQ(refused, 4);
}

TEST(TableStore, FileSizeLimitGivesOneErrorAndAResumableStore) {
  // No events here: the first segment's events alone would pass the limit.
  const std::vector<std::string> args = {"table", "--to", "5e7", "--every", "100000", "--out", "t.csv",
                                         "--quiet", "--threads", "2", "--store", "run.db"};
  ScratchDir plain;
  auto plain_args = args;
  plain_args.resize(plain_args.size() - 2);
  ASSERT_EQ(run_sqfc(plain, plain_args).exit_code, 0);
  ScratchDir dir;
  std::string command = "ulimit -f 100; exec '" + binary_path() + "'";
  for (const auto& a : args) command += " '" + a + "'";
  const auto limited = run_program(dir, "/bin/sh", {"-c", command});
  EXPECT_EQ(limited.exit_code, 2) << describe(limited);
  EXPECT_EQ(count_lines(limited.err), 1) << limited.err;
  EXPECT_NE(limited.err.find("cannot write"), std::string::npos) << limited.err;
  EXPECT_NE(limited.err.find("continue it with --resume"), std::string::npos) << limited.err;
  EXPECT_FALSE(fs::exists(dir.path("t.csv")));
  const auto done = store_done(dir.path("run.db").string());
  EXPECT_GT(done, 0ULL) << "the limit should leave some committed segments";
  EXPECT_LT(done, 50'000'000ULL);
  auto resume_args = args;
  resume_args.push_back("--resume");
  const auto resumed = run_sqfc(dir, resume_args);
  EXPECT_EQ(resumed.exit_code, 0) << describe(resumed);
  EXPECT_EQ(read_file(dir.path("t.csv")), read_file(plain.path("t.csv")));
}

}  // namespace

namespace {

TEST(TableStore, EnvelopesAreRefusedWithAStore) {
  // The store keeps block summaries, not envelope columns: a resumed envelope would be partial.
  for (const std::vector<std::string>& extra : {std::vector<std::string>{"--envelope", "env.csv"}, std::vector<std::string>{"--plot"}}) {
    ScratchDir dir;
    std::vector<std::string> args = {"table", "--to", "1000", "--out", "t.csv", "--store", "run.db"};
    args.insert(args.end(), extra.begin(), extra.end());
    const auto r = run_sqfc(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << r.err;
    EXPECT_NE(r.err.find("cannot be combined with --store"), std::string::npos) << r.err;
    EXPECT_TRUE(list_dir(dir.work()).empty()) << describe(r);
  }
}

}  // namespace
