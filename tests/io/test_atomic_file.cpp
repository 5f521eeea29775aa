// SPDX-License-Identifier: MIT
// Tests of io/atomic_file: no output appears before commit, an uncommitted output leaves
// nothing behind, and unwritable paths fail with IoError before any work.
#include "sqfc/io/atomic_file.hpp"

#include <unistd.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <random>
#include <sstream>
#include <string>
#include <vector>

#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"

namespace {

namespace fs = std::filesystem;
using sqfc::io::AtomicOutputFile;

// A fresh directory under the system temporary directory, removed at the end of the test.
class AtomicFileTest : public ::testing::Test {
 protected:
  void SetUp() override {
    auto rng = sqfc::testing::test_rng(static_cast<std::uint64_t>(::getpid()));
    dir_ = fs::temp_directory_path() / ("sqfc-atomic-" + std::to_string(::getpid()) + "-" + std::to_string(rng() % 1000000));
    fs::create_directories(dir_);
  }
  void TearDown() override {
    std::error_code ec;
    fs::remove_all(dir_, ec);
  }
  std::string path(const std::string& name) const { return (dir_ / name).string(); }
  // Names in the directory, sorted.
  std::vector<std::string> listing() const {
    std::vector<std::string> names;
    for (const auto& entry : fs::directory_iterator(dir_)) names.push_back(entry.path().filename().string());
    std::sort(names.begin(), names.end());
    return names;
  }
  static std::string read(const std::string& p) {
    std::ifstream in(p, std::ios::binary);
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
  }
  fs::path dir_;
};

TEST_F(AtomicFileTest, NothingAppearsUntilCommit) {
  const std::string target = path("table.csv");
  const std::string temporary = target + ".part-" + std::to_string(::getpid());
  {
    AtomicOutputFile out(target);
    EXPECT_EQ(out.path(), target);
    EXPECT_FALSE(out.is_stdout());
    out.stream() << "n,mertens\n1,1\n";
    out.stream().flush();
    EXPECT_FALSE(fs::exists(target));     // not before commit, even after a flush
    EXPECT_TRUE(fs::exists(temporary));   // the temporary sits beside it
    out.commit();
    EXPECT_TRUE(fs::exists(target));
    EXPECT_FALSE(fs::exists(temporary));
    out.commit();  // a second commit changes nothing
  }
  EXPECT_EQ(read(target), "n,mertens\n1,1\n");  // and the destructor keeps a committed file
  EXPECT_EQ(listing(), std::vector<std::string>{"table.csv"});
}

TEST_F(AtomicFileTest, DestructorRemovesAnUncommittedOutput) {
  const std::string target = path("partial.csv");
  {
    AtomicOutputFile out(target);
    out.stream() << "half a table";
    EXPECT_EQ(listing().size(), 1U);  // only the temporary
  }
  EXPECT_FALSE(fs::exists(target));
  EXPECT_TRUE(listing().empty());
}

TEST_F(AtomicFileTest, ExistingFileIsUntouchedUntilCommit) {
  const std::string target = path("kept.csv");
  std::ofstream(target) << "old\n";
  {
    AtomicOutputFile out(target);
    out.stream() << "new\n";
    EXPECT_EQ(read(target), "old\n");
  }
  EXPECT_EQ(read(target), "old\n");  // an abandoned output leaves the old file
  AtomicOutputFile out(target);
  out.stream() << "new\n";
  out.commit();
  EXPECT_EQ(read(target), "new\n");
  EXPECT_EQ(listing(), std::vector<std::string>{"kept.csv"});
}

TEST_F(AtomicFileTest, UnwritablePathsThrowIoError) {
  // Paths whose directory cannot hold the temporary: missing directories, a regular file
  // used as a directory, a directory as the target, an empty path. (Permission bits are not
  // used: the test may run as root.)
  std::ofstream(path("plain-file")) << "x";
  const std::vector<std::string> bad = {path("missing/dir/table.csv"), path("plain-file/table.csv"), dir_.string(),
                                        path("."), ""};
  int checked = 0;
  for (const auto& p : bad) {
    EXPECT_THROW(AtomicOutputFile{p}, sqfc::IoError) << "'" << p << "'";
    ++checked;
  }
  EXPECT_EQ(checked, 5);
  EXPECT_EQ(listing(), std::vector<std::string>{"plain-file"});  // no temporaries left behind
  try {
    AtomicOutputFile out(path("missing/table.csv"));
    FAIL() << "no exception";
  } catch (const sqfc::IoError& e) {
    EXPECT_EQ(e.exit_code(), sqfc::exit_code::bad_input);
    EXPECT_NE(std::string(e.what()).find("missing/table.csv"), std::string::npos) << e.what();  // names the path
  }
}

TEST_F(AtomicFileTest, FailedRenameThrowsAndCleansUp) {
  // The target becomes a non-empty directory after the output was opened: rename fails.
  const std::string target = path("becomes-a-directory");
  {
    AtomicOutputFile out(target);
    out.stream() << "data\n";
    fs::create_directories(fs::path(target) / "inside");
    EXPECT_THROW(out.commit(), sqfc::IoError);
  }
  EXPECT_TRUE(fs::is_directory(target));
  EXPECT_EQ(listing(), std::vector<std::string>{"becomes-a-directory"});  // the temporary is gone
}

TEST_F(AtomicFileTest, DashIsStandardOutput) {
  {
    AtomicOutputFile out("-");
    EXPECT_TRUE(out.is_stdout());
    EXPECT_EQ(&out.stream(), &std::cout);
    out.commit();
  }
  EXPECT_TRUE(listing().empty());
  // No file named "-" or a temporary of it in the working directory either.
  EXPECT_FALSE(fs::exists("-"));
  EXPECT_FALSE(fs::exists("-.part-" + std::to_string(::getpid())));
}

TEST_F(AtomicFileTest, EnsureDirectory) {
  const std::string nested = path("a/b/c");
  sqfc::io::ensure_directory(nested);
  EXPECT_TRUE(fs::is_directory(nested));
  sqfc::io::ensure_directory(nested);  // existing: no error
  sqfc::io::ensure_directory("");      // empty: nothing to do
  std::ofstream(path("file")) << "x";
  EXPECT_THROW(sqfc::io::ensure_directory(path("file/sub")), sqfc::IoError);
  EXPECT_THROW(sqfc::io::ensure_directory(path("file")), sqfc::IoError);
}

}  // namespace
