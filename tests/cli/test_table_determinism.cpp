// SPDX-License-Identifier: MIT
// The output of `sqfc table` does not depend on how the work is cut up: thread count, sieve block
// size, segment boundaries, or where --from starts reporting. Sizes are kept small for the default
// suite; test_table_determinism_slow.cpp runs the same comparisons on larger ranges.
// Expected values: the oracle is a run of sqfc with the default cut; no outside value is used.
#include <gtest/gtest.h>

#include "determinism_support.hpp"

namespace sqfc::cli_test {
namespace {

TEST(TableDeterminism, ThreadCountDoesNotChangeABit) {
  // 5 * 10^6 spans two work segments of 2^22 values (config.hpp, default_segment_size), so two
  // threads really share the work.
  const auto one = run_table({"--to", "5e6", "--every", "1e4", "--threads", "1"});
  const auto two = run_table({"--to", "5e6", "--every", "1e4", "--threads", "2"});
  ASSERT_EQ(split_lines(one.table).size(), 1u + 500);
  EXPECT_GT(split_lines(one.events).size(), 1000u);  // zeros and records of M up to 5 * 10^6: plenty
  EXPECT_TRUE(two.table == one.table) << "table differs with two threads";
  EXPECT_TRUE(two.events == one.events) << "events differ with two threads";
}

TEST(TableDeterminism, BlockSizeDoesNotChangeABit) {
  // Blocks of 1024 values (the smallest allowed) and of 1000003 (not a power of two) against the
  // default 2^17; the events test the block skipping of the event detector (events.hpp, may_fire_in).
  const std::vector<std::string> args = {"--to", "2e6", "--every", "997", "--threads", "2"};
  auto with_block = [&](const std::string& b) {
    auto a = args;
    if (!b.empty()) a.insert(a.end(), {"--block-size", b});
    return run_table(a);
  };
  const auto standard = with_block("");
  int compared = 0;
  for (const std::string b : {"1024", "1000003"}) {
    const auto other = with_block(b);
    EXPECT_TRUE(other.table == standard.table) << "--block-size " << b;
    EXPECT_TRUE(other.events == standard.events) << "--block-size " << b;
    ++compared;
  }
  EXPECT_EQ(compared, 2);
  EXPECT_EQ(split_lines(standard.table).size(), 1u + 2000000 / 997);
}

TEST(TableDeterminism, FromInsideTheRunMatchesTheFullRun) {
  // --from reports only n >= A with the values of a run from 1 (docs/cli.md); events likewise, with
  // records that still count every n >= 1 (docs/output-formats.md). A = 4194305 is just after the
  // segment boundary 2^22, A = 4194304 on it, A = 3 * 10^6 inside the first segment.
  const auto full = run_table({"--to", "5e6", "--every", "1e5", "--threads", "2"});
  int compared = 0;
  for (const unsigned long long from : {3000000ULL, 4194305ULL, 4194304ULL}) {
    const auto part = run_table({"--to", "5e6", "--every", "1e5", "--threads", "2", "--from", std::to_string(from)});
    EXPECT_EQ(split_lines(part.table), rows_from(full.table, from)) << "--from " << from;
    EXPECT_EQ(split_lines(part.events), events_from(full.events, from)) << "--from " << from;
    ++compared;
  }
  EXPECT_EQ(compared, 3);
  EXPECT_EQ(rows_from(full.table, 3000000).size(), 1u + 21);  // 3.0e6, 3.1e6, ..., 5.0e6
  EXPECT_GT(events_from(full.events, 3000000).size(), 100u);  // the restriction is not vacuous
}

TEST(TableDeterminism, SegmentBoundaryValuesAgree) {
  // n on both sides of the segment boundary 2^22 and at N = 2^22 + 1, one thread and two.
  const std::vector<std::string> args = {"--to", "4194305", "--at", "4194303,4194304,4194305"};
  auto a = args, b = args;
  a.insert(a.end(), {"--threads", "1", "--block-size", "1024"});
  b.insert(b.end(), {"--threads", "2"});
  const auto one = run_table(a), two = run_table(b);
  EXPECT_TRUE(one.table == two.table);
  EXPECT_TRUE(one.events == two.events);
  EXPECT_EQ(split_lines(one.table).size(), 4u);
}

}  // namespace
}  // namespace sqfc::cli_test
