// SPDX-License-Identifier: MIT
// `mpirun -np K sqfc table ...`: 1, 2 and 3 ranks write byte-identical tables and events to one
// process, with and without a run store; a store made by ranks resumes in one process. Skipped
// only when the build has no MPI (SQFC_ENABLE_MPI=OFF); CI builds it.
#include <gtest/gtest.h>

#include "cli/store_kill_support.hpp"

namespace {

using namespace sqfc::cli_test;
namespace fs = std::filesystem;

#ifdef SQFC_MPIEXEC
// mpirun refuses to run as root without its allow flag; 3 ranks on 2 cores need --oversubscribe.
RunResult run_mpi(const ScratchDir& dir, int ranks, const std::vector<std::string>& args) {
  std::vector<std::string> a = {"--allow-run-as-root", "--oversubscribe", "-np", std::to_string(ranks), binary_path()};
  a.insert(a.end(), args.begin(), args.end());
  RunOptions options;
  options.timeout = std::chrono::seconds(180);
  return run_program(dir, SQFC_MPIEXEC, a, options);
}
#endif

[[maybe_unused]] std::vector<std::string> mpi_args(const std::string& to) {
  return {"table", "--to", to, "--every", "7000001", "--events", "ev.csv", "--out", "t.csv", "--quiet", "--threads", "1"};
}

TEST(TableMpi, OneTwoAndThreeRanksMatchOneProcess) {
#ifndef SQFC_MPIEXEC
  GTEST_SKIP() << "built without MPI (SQFC_ENABLE_MPI=OFF)";
#else
  ScratchDir single;
  const auto s = run_sqfc(single, mpi_args("60000000"));
  ASSERT_EQ(s.exit_code, 0) << describe(s);
  int compared = 0;
  for (const int ranks : {1, 2, 3}) {
    ScratchDir dir;
    const auto r = run_mpi(dir, ranks, mpi_args("60000000"));
    ASSERT_EQ(r.exit_code, 0) << ranks << " ranks: " << describe(r);
    EXPECT_EQ(read_file(dir.path("t.csv")), read_file(single.path("t.csv"))) << ranks << " ranks";
    EXPECT_EQ(read_file(dir.path("ev.csv")), read_file(single.path("ev.csv"))) << ranks << " ranks";
    // Only rank 0 writes: no stray temporary files from the other ranks.
    EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"ev.csv", "t.csv", "t.csv.manifest.json"})) << ranks;
    auto manifest = manifest_without_run_facts(read_file(dir.path("t.csv.manifest.json")));
    auto reference = manifest_without_run_facts(read_file(single.path("t.csv.manifest.json")));
    EXPECT_EQ(manifest["counts"], reference["counts"]);
    EXPECT_EQ(manifest["checks"], reference["checks"]);
    EXPECT_EQ(manifest["final"], reference["final"]);
    EXPECT_EQ(manifest.value("ranks", 1), ranks);
    ++compared;
  }
  EXPECT_EQ(compared, 3);
#endif
}

TEST(TableMpi, RanksWithAStoreMatchAndResumeInOneProcess) {
#ifndef SQFC_MPIEXEC
  GTEST_SKIP() << "built without MPI (SQFC_ENABLE_MPI=OFF)";
#else
  auto args = mpi_args("5e7");
  args.insert(args.end(), {"--store", "run.db"});
  ScratchDir single;
  ASSERT_EQ(run_sqfc(single, args).exit_code, 0);
  ScratchDir dir;
  const auto r = run_mpi(dir, 2, args);
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(read_file(dir.path("t.csv")), read_file(single.path("t.csv")));
  EXPECT_EQ(read_file(dir.path("ev.csv")), read_file(single.path("ev.csv")));
  // A partial store written by one process is finished by 3 ranks, and the reverse.
  ScratchDir mixed;
  const auto k = run_and_kill_at(mixed, args, "run.db", 15'000'000, std::chrono::microseconds(0));
  EXPECT_TRUE(k.killed || k.exit_code == 0);
  auto resume = args;
  resume.push_back("--resume");
  const auto m = run_mpi(mixed, 3, resume);
  ASSERT_EQ(m.exit_code, 0) << describe(m);
  EXPECT_EQ(read_file(mixed.path("t.csv")), read_file(single.path("t.csv")));
  EXPECT_EQ(read_file(mixed.path("ev.csv")), read_file(single.path("ev.csv")));
  const auto again = run_sqfc(mixed, resume);  // complete: only rewrites the outputs from the store
  ASSERT_EQ(again.exit_code, 0) << describe(again);
  EXPECT_EQ(read_file(mixed.path("t.csv")), read_file(single.path("t.csv")));
#endif
}

}  // namespace
