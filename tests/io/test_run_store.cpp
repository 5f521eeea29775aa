// SPDX-License-Identifier: MIT
// Tests of io/run_store and io/stored_run: a run stopped at any point and resumed gives the
// rows, events and report of an uninterrupted engine run; a store with other parameters is
// refused naming them; every kind of damage (flipped bytes, deleted rows, truncation, foreign
// files, other schema versions) is refused, never read as a shorter or different run.
#include "sqfc/io/run_store.hpp"

#include <sqlite3.h>
#include <unistd.h>

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <random>

#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/io/stored_run.hpp"
#include "track/table_engine_support.hpp"

namespace {

namespace fs = std::filesystem;
using namespace sqfc;
namespace st = sqfc::testing;

constexpr Natural kTo = 50'000;

track::TableRunOptions small_options() {
  return st::options(kTo, 1, 2, 1024, 4096,
                          track::SampleSchedule(1, kTo, Natural{499}, {1, 4096, 4097}, 10U, true), true);
}

std::vector<io::RunParameter> params(Natural to = kTo) {
  return {{"block_size", "1024"}, {"events", "yes"}, {"to", std::to_string(to)}};
}

class RunStoreTest : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / ("sqfc-store-" + std::to_string(::getpid()) + "-" +
                                        ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
    reference_ = st::run_engine(small_options());
  }
  void TearDown() override { fs::remove_all(dir_); }
  std::string path(const std::string& name) const { return (dir_ / name).string(); }

  // A complete store at `name`.
  std::string complete_store(const std::string& name) {
    const std::string p = path(name);
    io::RunStore store = io::RunStore::create(p, params());
    st::CollectingSink out;
    (void)io::run_table_stored(small_options(), store, out);
    return p;
  }
  void expect_same_as_reference(const st::CollectingSink& out, const track::TableRunReport& report) {
    EXPECT_TRUE(st::same_rows(out.rows, reference_.sink.rows));
    EXPECT_EQ(out.events, reference_.sink.events);
    EXPECT_EQ(report.final_state, reference_.report.final_state);
    EXPECT_EQ(report.rows, reference_.report.rows);
    EXPECT_EQ(report.events, reference_.report.events);
    EXPECT_EQ(report.blocks, reference_.report.blocks);
    EXPECT_EQ(report.scanned_blocks, reference_.report.scanned_blocks);
    ASSERT_EQ(report.checks.size(), reference_.report.checks.size());
    for (std::size_t i = 0; i < report.checks.size(); ++i)
      EXPECT_EQ(report.checks[i].passed, reference_.report.checks[i].passed);
  }
  void sql(const std::string& p, const std::string& statement) {
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(p.c_str(), &db), SQLITE_OK);
    char* error = nullptr;
    ASSERT_EQ(sqlite3_exec(db, statement.c_str(), nullptr, nullptr, &error), SQLITE_OK) << (error ? error : "");
    sqlite3_close(db);
  }
  void expect_refused(const std::string& p, const std::string& words) {
    try {
      (void)io::RunStore::open_for_resume(p, params());
      ADD_FAILURE() << "damaged store accepted; expected: " << words;
    } catch (const IoError& e) {
      EXPECT_NE(std::string(e.what()).find(words), std::string::npos) << e.what();
    }
  }

  fs::path dir_;
  st::EngineRun reference_;
};

TEST_F(RunStoreTest, StoredRunReplaysTheEngineRun) {
  const std::string p = complete_store("a.db");
  io::RunStore store = io::RunStore::open_read_only(p);
  EXPECT_EQ(store.done(), kTo);
  st::CollectingSink out;
  store.for_each_row([&](const track::TableRow& r) { out.rows.push_back(r); });
  store.for_each_event([&](const track::Event& e) { out.events.push_back(e); });
  expect_same_as_reference(out, io::report_from_store(store));
  const auto summary = store.summary();
  EXPECT_EQ(summary.segments, (kTo + 4095) / 4096);
  EXPECT_EQ(summary.blocks, reference_.report.blocks);
}

TEST_F(RunStoreTest, StoppedAtEverySegmentAndResumedGivesTheSameRun) {
  const Natural segments = (kTo + 4095) / 4096;
  std::size_t resumed = 0;
  // Four stop points keep the file fast; the CLI tests kill real processes at random points.
  for (const Natural stop : {Natural{1}, Natural{2}, segments / 2, segments - 1}) {
    const std::string p = path("stop" + std::to_string(stop) + ".db");
    {
      io::RunStore store = io::RunStore::create(p, params());
      st::CollectingSink ignored;
      // The progress callback throws inside segment `stop`, as an interrupt would.
      EXPECT_THROW((void)io::run_table_stored(small_options(), store, ignored,
                                              [&](Natural done, Natural) {
                                                if (done > stop * 4096) throw IoError("stop");
                                              }),
                   IoError);
      EXPECT_EQ(store.done(), stop * 4096);
    }
    io::RunStore store = io::RunStore::open_for_resume(p, params());
    EXPECT_EQ(store.done(), stop * 4096);
    st::CollectingSink out;
    const auto report = io::run_table_stored(small_options(), store, out);
    expect_same_as_reference(out, report);
    ++resumed;
  }
  EXPECT_EQ(resumed, 4U);
}

TEST_F(RunStoreTest, OtherParametersAreRefusedByName) {
  const std::string p = complete_store("a.db");
  try {
    auto other = params(kTo + 1);
    other.push_back({"format", "tsv"});
    (void)io::RunStore::open_for_resume(p, other);
    FAIL() << "accepted";
  } catch (const InvalidArgument& e) {
    const std::string m = e.what();
    EXPECT_NE(m.find("to (store: 50000, now: 50001)"), std::string::npos) << m;
    EXPECT_NE(m.find("format (store: none, now: tsv)"), std::string::npos) << m;
    EXPECT_EQ(m.find("block_size"), std::string::npos) << m;
  }
  EXPECT_THROW((void)io::RunStore::create(p, params()), InvalidArgument);  // exists
}

TEST_F(RunStoreTest, FlippedBytesInABlockRowAreRefused) {
  const std::string p = complete_store("a.db");
  sql(p, "UPDATE blocks SET summary = CAST(X'0102' || substr(summary, 3) AS BLOB) WHERE lo = 2049");
  expect_refused(p, "checksum of the block at n = 2049");
}

TEST_F(RunStoreTest, DeletedRowsOfEveryTableAreRefused) {
  struct Case {
    const char* sql;
    const char* words;
  };
  const Case cases[] = {
      {"DELETE FROM blocks WHERE lo = 5121", "not contiguous at n = 5121"},
      {"DELETE FROM segments WHERE segment = 3", "segment 3 is missing"},
      {"DELETE FROM segments WHERE segment = (SELECT max(segment) FROM segments)", "beyond its last segment"},
      {"DELETE FROM rows WHERE n = 4097", "rows where its checkpoint says"},
      {"DELETE FROM events WHERE seq = 3", "events where its checkpoint says"},
      {"UPDATE segments SET checksum = checksum + 1 WHERE segment = 2", "checksum of segment 2"},
      {"UPDATE blocks SET scanned = 1 - scanned WHERE lo = 1025", "checksum of the block at n = 1025"},
      {"PRAGMA user_version = 7", "schema version 7"},
      {"PRAGMA application_id = 5", "not an sqfc run store"},
  };
  int refused = 0;
  const std::string original = complete_store("a.db");  // closed: the WAL is folded into the file
  for (const auto& c : cases) {
    const std::string p = path("case" + std::to_string(refused) + ".db");
    fs::copy_file(original, p);
    sql(p, c.sql);
    expect_refused(p, c.words);
    ++refused;
  }
  EXPECT_EQ(refused, 9);
}

TEST_F(RunStoreTest, DamagedRowDataIsRefusedWhenReplayed) {
  const std::string p = complete_store("a.db");
  sql(p, "UPDATE rows SET data = CAST(substr(data, 1, 3) || X'7F' || substr(data, 5) AS BLOB) WHERE n = 4096");
  io::RunStore store = io::RunStore::open_read_only(p);  // counts still agree; the checksum does not
  EXPECT_THROW(store.for_each_row([](const track::TableRow&) {}), IoError);
}

TEST_F(RunStoreTest, TruncatedOrForeignFilesAreRefused) {
  const std::string p = complete_store("a.db");
  const auto size = fs::file_size(p);
  std::size_t refused = 0;
  for (const auto keep : {size / 2, size / 4, std::uintmax_t{4096}, std::uintmax_t{100}}) {
    const std::string q = path("cut" + std::to_string(keep) + ".db");
    fs::copy_file(p, q);
    fs::resize_file(q, keep);
    EXPECT_THROW((void)io::RunStore::open_for_resume(q, params()), IoError) << "kept " << keep << " of " << size;
    ++refused;
  }
  EXPECT_EQ(refused, 4U);
  const std::string text = path("text.db");
  std::ofstream(text) << "not a database\n";
  EXPECT_THROW((void)io::RunStore::open_read_only(text), IoError);
  EXPECT_THROW((void)io::RunStore::open_read_only(path("missing.db")), IoError);
}

}  // namespace
