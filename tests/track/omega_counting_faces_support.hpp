// SPDX-License-Identifier: MIT
// Compares count_by_omega (arith) with the f-vector and Betti numbers of the table engine (track)
// at sample points: two independent routes, counting over primes and sieving every n. The oracle is
// the other route; no outside values.
#pragma once

#include <gtest/gtest.h>

#include <algorithm>
#include <cstddef>
#include <numeric>
#include <vector>

#include "sqfc/arith/omega_counting.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/topology/betti_counting.hpp"
#include "track/table_engine_support.hpp"

namespace sqfc::testing {

/// Runs the table engine to the largest of `points` with rows at exactly those points and checks
/// every row's f_d and b_d against count_by_omega. Returns the number of rows compared.
inline int compare_with_table_engine(const std::vector<Natural>& points, unsigned threads) {
  const Natural to = *std::max_element(points.begin(), points.end());
  const auto run = run_engine(options(to, 1, threads, config::default_block_size, config::default_segment_size,
                                      track::SampleSchedule(1, to, std::nullopt, points, std::nullopt, false)));
  EXPECT_TRUE(run.report.all_checks_passed());
  int compared = 0;
  for (const auto& row : run.sink.rows) {
    const auto counts = arith::count_by_omega(row.n, threads);
    const auto upper = arith::odd_upper_half_by_omega(counts);
    topology::OddIntervalCounts interval{};
    for (std::size_t m = 0; m < upper.size() && m < interval.size(); ++m) interval[m] = static_cast<SignedSum>(upper[m]);
    for (std::size_t d = 0; d + 1 < config::omega_slots; ++d) {
      const Count faces = d + 1 < counts.squarefree_by_omega.size() ? counts.squarefree_by_omega[d + 1] : 0;
      EXPECT_EQ(row.faces[d], faces) << "f_" << d << " at n = " << row.n;
      EXPECT_EQ(row.betti[d], topology::betti_from_interval_counts(interval, static_cast<int>(d)))
          << "b_" << d << " at n = " << row.n;
    }
    EXPECT_EQ(row.squarefree, std::accumulate(counts.squarefree_by_omega.begin(), counts.squarefree_by_omega.end(), Count{0}))
        << "Q at n = " << row.n;
    ++compared;
  }
  return compared;
}

}  // namespace sqfc::testing
