// SPDX-License-Identifier: MIT
// Helpers of the run-store CLI tests: start sqfc, SIGKILL it once its store holds a chosen n,
// and compare manifests apart from the fields that record when and how a run was invoked.
#pragma once

#include <signal.h>
#include <sqlite3.h>
#include <sys/wait.h>
#include <unistd.h>

#include <nlohmann/json.hpp>

#include <chrono>
#include <string>
#include <thread>
#include <vector>

#include <gtest/gtest.h>

#include <algorithm>

#include "cli/cli_runner.hpp"
#include "oracles/test_support.hpp"

namespace sqfc::cli_test {

/// Last n a store has committed, read as `sqfc runs` would (0 when there is no store yet).
inline unsigned long long store_done(const std::string& path) {
  sqlite3* db = nullptr;
  unsigned long long done = 0;
  if (sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr) == SQLITE_OK) {
    sqlite3_stmt* s = nullptr;
    if (sqlite3_prepare_v2(db, "SELECT coalesce(max(hi), 1) - 1 FROM segments", -1, &s, nullptr) == SQLITE_OK &&
        sqlite3_step(s) == SQLITE_ROW)
      done = static_cast<unsigned long long>(sqlite3_column_int64(s, 0));
    sqlite3_finalize(s);
  }
  sqlite3_close(db);
  return done;
}

/// What happened to a run that was to be killed.
struct KillOutcome {
  bool killed = false;             ///< false: it finished (or failed) before reaching the kill point
  int exit_code = -1;              ///< its exit code when it was not killed
  unsigned long long done_before = 0;  ///< what the store held when the kill was sent
};

/// Runs `sqfc args...` in dir.work() and sends SIGKILL (by pid) `extra_delay` after the store at
/// `store` (relative to dir.work()) first holds n >= kill_at.
inline KillOutcome run_and_kill_at(const ScratchDir& dir, const std::vector<std::string>& args, const std::string& store,
                                   unsigned long long kill_at, std::chrono::microseconds extra_delay) {
  std::vector<std::string> argv = {binary_path()};
  argv.insert(argv.end(), args.begin(), args.end());
  std::vector<char*> c_argv;
  for (auto& a : argv) c_argv.push_back(a.data());
  c_argv.push_back(nullptr);
  const std::string work = dir.work().string();
  const std::string store_path = (dir.work() / store).string();
  const pid_t pid = ::fork();
  if (pid < 0) throw std::runtime_error("fork failed");
  if (pid == 0) {
    const int null_fd = ::open("/dev/null", O_RDWR);
    if (null_fd < 0 || ::chdir(work.c_str()) != 0) ::_exit(126);
    ::dup2(null_fd, 0);
    ::dup2(null_fd, 1);
    ::dup2(null_fd, 2);
    ::execv(c_argv[0], c_argv.data());
    ::_exit(127);
  }
  KillOutcome outcome;
  const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(120);
  while (std::chrono::steady_clock::now() < deadline) {
    int status = 0;
    if (::waitpid(pid, &status, WNOHANG) == pid) {
      outcome.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
      return outcome;
    }
    const auto done = store_done(store_path);
    if (done >= kill_at) {
      std::this_thread::sleep_for(extra_delay);
      outcome.done_before = done;
      ::kill(pid, SIGKILL);
      int ignored = 0;
      ::waitpid(pid, &ignored, 0);
      outcome.killed = WIFSIGNALED(ignored);
      if (!outcome.killed) outcome.exit_code = WEXITSTATUS(ignored);
      return outcome;
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(1));
  }
  ::kill(pid, SIGKILL);
  ::waitpid(pid, nullptr, 0);
  throw std::runtime_error("sqfc did not finish within 120 s");
}

/// A manifest without the fields that say when and how this invocation ran: started_utc,
/// finished_utc, wall_seconds and command_line (a resumed run adds --resume to it).
inline nlohmann::json manifest_without_run_facts(const std::string& text) {
  nlohmann::json m = nlohmann::json::parse(text);
  for (const char* key : {"started_utc", "finished_utc", "wall_seconds", "command_line"}) m.erase(key);
  return m;
}

namespace fs = std::filesystem;

/// `sqfc table` with a table, events and a store at fixed relative paths (run.db).
inline std::vector<std::string> table_args(const std::string& to, bool resume) {
  std::vector<std::string> a = {"table", "--to", to, "--every", "3000000", "--events", "ev.csv", "--out", "t.csv",
                                "--quiet", "--threads", "2", "--store", "run.db"};
  if (resume) a.push_back("--resume");
  return a;
}

inline int count_lines(const std::string& s) { return static_cast<int>(std::count(s.begin(), s.end(), '\n')); }

// The outputs of an uninterrupted --store run and of a run without a store, in their own folders.
struct Reference {
  ScratchDir stored, plain;
  explicit Reference(const std::string& to) {
    const auto a = run_sqfc(stored, table_args(to, false));
    EXPECT_EQ(a.exit_code, 0) << describe(a);
    auto args = table_args(to, false);
    args.resize(args.size() - 2);  // no --store
    const auto b = run_sqfc(plain, args);
    EXPECT_EQ(b.exit_code, 0) << describe(b);
    EXPECT_EQ(read_file(stored.path("t.csv")), read_file(plain.path("t.csv")));
    EXPECT_EQ(read_file(stored.path("ev.csv")), read_file(plain.path("ev.csv")));
  }
};

// Kills a run at each of `kill_points` (increasing n), resumes each time, finishes, and compares.
// Returns how many kills landed inside the run.
inline int kill_resume_and_compare(const std::string& to, std::vector<unsigned long long> kill_points, std::uint64_t salt) {
  Reference ref(to);
  ScratchDir dir;
  auto rng = sqfc::testing::test_rng(salt);
  std::sort(kill_points.begin(), kill_points.end());
  int inside = 0;
  unsigned long long last_done = 0;
  for (const auto point : kill_points) {
    const auto delay = std::chrono::microseconds(rng() % 20000);
    const auto k = run_and_kill_at(dir, table_args(to, true), "run.db", point, delay);
    if (!k.killed) {
      EXPECT_EQ(k.exit_code, 0) << "kill point " << point;
      continue;
    }
    const auto done = store_done(dir.path("run.db").string());
    EXPECT_GE(done, last_done) << "a kill lost committed segments";
    last_done = done;
    if (done < static_cast<unsigned long long>(std::stod(to))) ++inside;
    EXPECT_FALSE(fs::exists(dir.path("t.csv"))) << "a killed run left a table behind";
  }
  const auto final_run = run_sqfc(dir, table_args(to, true));
  EXPECT_EQ(final_run.exit_code, 0) << describe(final_run);
  EXPECT_EQ(read_file(dir.path("t.csv")), read_file(ref.stored.path("t.csv"))) << sqfc::testing::seed_note();
  EXPECT_EQ(read_file(dir.path("ev.csv")), read_file(ref.stored.path("ev.csv"))) << sqfc::testing::seed_note();
  EXPECT_EQ(manifest_without_run_facts(read_file(dir.path("t.csv.manifest.json"))),
            manifest_without_run_facts(read_file(ref.stored.path("t.csv.manifest.json"))));
  return inside;
}

}  // namespace sqfc::cli_test
