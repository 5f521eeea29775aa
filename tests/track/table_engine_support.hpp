// SPDX-License-Identifier: MIT
// Helpers of the table-engine tests: options, runs into a collecting sink, a tracker stepped
// over trial-division codes, and the published values at powers of ten.
#pragma once

#include <gtest/gtest.h>

#include <cstdint>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/published_csv.hpp"
#include "sqfc/arith/factor_code.hpp"
#include "sqfc/track/table_engine.hpp"
#include "track/collecting_sink.hpp"

namespace sqfc::testing {

inline std::string data_path(const char* name) { return std::string(SQFC_TEST_DATA_DIR) + "/" + name; }

inline track::TableRunOptions options(Natural to, Natural from, unsigned threads, std::size_t block, Natural segment,
                                      track::SampleSchedule samples, bool events = false) {
  track::TableRunOptions o;
  o.to = to;
  o.from = from;
  o.threads = threads;
  o.block_size = block;
  o.segment_size = segment;
  o.samples = std::move(samples);
  o.events = events;
  return o;
}

struct EngineRun {
  CollectingSink sink;
  track::TableRunReport report;
};

inline EngineRun run_engine(const track::TableRunOptions& o) {
  EngineRun run;
  run.report = track::run_table(o, run.sink);
  return run;
}

inline bool same_rows(const std::vector<track::TableRow>& a, const std::vector<track::TableRow>& b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i)
    if (!same_row(a[i], b[i])) return false;
  return true;
}

/// Rows at the n in [1, to] that `wanted` accepts, from a TrackerState stepped over factor
/// codes made by trial division (no sieve involved).
template <class Wanted>
std::vector<track::TableRow> stepped_rows(Natural to, Wanted wanted) {
  std::vector<track::TableRow> rows;
  track::TrackerState s;
  for (Natural n = 1; n <= to; ++n) {
    const auto a = oracles::arithmetic_naive(n);
    s.step(arith::make_factor_code(a.omega, a.mu != 0, a.big_omega));
    if (wanted(n)) rows.push_back(s.row());
  }
  return rows;
}

inline track::TrackerState stepped_state(Natural to) {
  track::TrackerState s;
  for (Natural n = 1; n <= to; ++n) {
    const auto a = oracles::arithmetic_naive(n);
    s.step(arith::make_factor_code(a.omega, a.mu != 0, a.big_omega));
  }
  return s;
}

/// Runs the engine to 10^k_max with rows at 10^0 .. 10^k_max and compares M, Q and L with
/// tests/data/{mertens,squarefree,liouville}_powers_of_ten.csv (OEIS A084237, A071172,
/// A090410). Returns the number of powers compared.
inline int check_powers_of_ten(int k_max, unsigned threads) {
  const auto mertens = oracles::read_published_csv(data_path("mertens_powers_of_ten.csv"));
  const auto squarefree = oracles::read_published_csv(data_path("squarefree_powers_of_ten.csv"));
  const auto liouville = oracles::read_published_csv(data_path("liouville_powers_of_ten.csv"));
  Natural to = 1;
  std::vector<Natural> at = {1};
  for (int k = 1; k <= k_max; ++k) at.push_back(to *= 10);
  const auto run = run_engine(options(to, 1, threads, config::default_block_size, config::default_segment_size,
                                      track::SampleSchedule(1, to, std::nullopt, at, std::nullopt, false)));
  EXPECT_TRUE(run.report.all_checks_passed());
  EXPECT_EQ(run.sink.rows.size(), at.size());
  int compared = 0;
  for (std::size_t r = 0; r < mertens.rows.size() && r < run.sink.rows.size(); ++r) {
    const auto k = mertens.integer(r, "k");
    if (k > k_max) continue;
    EXPECT_EQ(squarefree.integer(r, "k"), k);
    EXPECT_EQ(liouville.integer(r, "k"), k);
    const auto& row = run.sink.rows[static_cast<std::size_t>(k)];
    EXPECT_EQ(row.n, at[static_cast<std::size_t>(k)]);
    EXPECT_EQ(row.mertens, mertens.integer(r, "value")) << "M(10^" << k << ") " << mertens.text(r, "source");
    EXPECT_EQ(static_cast<std::int64_t>(row.squarefree), squarefree.integer(r, "value"))
        << "Q(10^" << k << ") " << squarefree.text(r, "source");
    EXPECT_EQ(row.liouville, liouville.integer(r, "value")) << "L(10^" << k << ") " << liouville.text(r, "source");
    ++compared;
  }
  return compared;
}

}  // namespace sqfc::testing
