// SPDX-License-Identifier: MIT
// Shared pieces of the Betti-counting tests: interval counts advanced with trial-division
// arithmetic, compared with the direct Z/2 homology of K_n.
#pragma once

#include <gtest/gtest.h>

#include <cstdint>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/topology/betti_counting.hpp"

namespace sqfc::testing {

/// Unreduced Betti numbers b_0..b_{omega_slots-2} from interval counts.
inline std::vector<std::int64_t> betti_from_counts(const topology::OddIntervalCounts& counts) {
  std::vector<std::int64_t> betti;
  for (int d = 0; d + 1 < config::omega_slots; ++d) betti.push_back(topology::betti_from_interval_counts(counts, d));
  return betti;
}

/// The direct Z/2 Betti numbers padded with zeros to the length of betti_from_counts.
inline std::vector<std::int64_t> betti_direct(std::uint64_t n) {
  auto betti = oracles::betti_mod2_naive(n);
  betti.resize(config::omega_slots - 1, 0);
  return betti;
}

/// Advances interval counts from 1 to n_max by trial division and compares every n with the
/// direct homology of K_n. Returns the number of n compared.
inline std::uint64_t compare_counting_with_homology(std::uint64_t n_max) {
  topology::OddIntervalCounts counts{};
  std::uint64_t checked = 0;
  for (std::uint64_t n = 1; n <= n_max; ++n) {
    const auto a = oracles::arithmetic_naive(n);
    topology::advance_interval_counts(counts, n, a.omega, a.mu != 0);
    const auto counted = betti_from_counts(counts);
    const auto direct = betti_direct(n);
    EXPECT_EQ(counted, direct) << "n = " << n;
    if (counted != direct) return checked;
    ++checked;
  }
  return checked;
}

}  // namespace sqfc::testing
