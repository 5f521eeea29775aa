// SPDX-License-Identifier: MIT
// Larger versions of test_table_determinism.cpp (label `slow`): three segments of work, three
// thread counts, four block sizes, --from deep inside a run to 10^7.
// Expected values: the oracle is a run of sqfc with the default cut; no outside value is used.
#include <gtest/gtest.h>

#include "determinism_support.hpp"

namespace sqfc::cli_test {
namespace {

TEST(TableDeterminismSlow, ThreadCountDoesNotChangeABit) {
  // 10^7 spans three work segments of 2^22 values (config.hpp, default_segment_size), so two
  // threads really share the work.
  const std::vector<std::string> args = {"--to", "1e7", "--every", "1e4"};
  auto with_threads = [&](const std::string& t) {
    auto a = args;
    a.insert(a.end(), {"--threads", t});
    return run_table(a);
  };
  const auto one = with_threads("1");
  const auto two = with_threads("2");
  const auto three = with_threads("3");  // more threads than segments left at the end
  ASSERT_EQ(split_lines(one.table).size(), 1u + 1000);
  EXPECT_GT(split_lines(one.events).size(), 1000u);  // zeros and records of M up to 10^7: plenty
  int compared = 0;
  for (const auto* other : {&two, &three}) {
    EXPECT_TRUE(other->table == one.table) << "table differs with more threads";
    EXPECT_TRUE(other->events == one.events) << "events differ with more threads";
    ++compared;
  }
  EXPECT_EQ(compared, 2);
}

TEST(TableDeterminismSlow, BlockSizeDoesNotChangeABit) {
  // Blocks of 1024 values (the smallest allowed) against the default 2^17, over two segments; the
  // events test the block-skipping of the event detector (events.hpp, may_fire_in).
  const std::vector<std::string> args = {"--to", "5e6", "--every", "997", "--threads", "2"};
  auto with_block = [&](const std::string& b) {
    auto a = args;
    if (!b.empty()) a.insert(a.end(), {"--block-size", b});
    return run_table(a);
  };
  const auto standard = with_block("");
  int compared = 0;
  for (const std::string b : {"1024", "4096", "1000003"}) {
    const auto other = with_block(b);
    EXPECT_TRUE(other.table == standard.table) << "--block-size " << b;
    EXPECT_TRUE(other.events == standard.events) << "--block-size " << b;
    ++compared;
  }
  EXPECT_EQ(compared, 3);
  EXPECT_EQ(split_lines(standard.table).size(), 1u + 5000000 / 997);
}

TEST(TableDeterminismSlow, FromDeepInsideTheRunMatchesTheFullRun) {
  // --from reports only n >= A, with the values of a run from 1 (table --help); A = 6 * 10^6 lies in
  // the second segment, A = 4194305 just after the first segment boundary 2^22.
  // Events likewise: those with n >= A, with records that still count every n >= 1 (docs/output-formats.md).
  const auto full = run_table({"--to", "1e7", "--every", "1e5", "--threads", "2"});
  int compared = 0;
  for (const unsigned long long from : {6000000ULL, 4194305ULL, 4194304ULL}) {
    const auto part = run_table({"--to", "1e7", "--every", "1e5", "--threads", "2", "--from", std::to_string(from)});
    EXPECT_EQ(split_lines(part.table), rows_from(full.table, from)) << "--from " << from;
    EXPECT_EQ(split_lines(part.events), events_from(full.events, from)) << "--from " << from;
    ++compared;
  }
  EXPECT_GT(events_from(full.events, 6000000).size(), 100u);  // the restriction is not vacuous
  EXPECT_EQ(compared, 3);
  EXPECT_EQ(rows_from(full.table, 6000000).size(), 1u + 41);  // 6.0e6, 6.1e6, ..., 1.0e7
}

}  // namespace
}  // namespace sqfc::cli_test
