// SPDX-License-Identifier: MIT
/// @file betti_counting.hpp  Betti numbers of K_n from counts of odd squarefree integers.
#pragma once

#include <array>

#include "sqfc/core/config.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::topology {

/// Counts of odd squarefree m in (n/2, n], indexed by omega(m) (index 0 is m = 1).
using OddIntervalCounts = std::array<SignedSum, config::omega_slots>;

/// Unreduced Betti number b_d(K_n) from the interval counts (Björner 2011, design.md
/// identity 2): reduced b~_d = count[d + 1]; b_0 adds 1 for the nonempty complex, which is
/// exactly when m = 1 has left the interval (n >= 2).
/// Pre: n >= 1, 0 <= d < omega_slots - 1 (assumed). Complexity: O(1).
constexpr SignedSum betti_from_interval_counts(const OddIntervalCounts& counts, int d) noexcept {
  return d == 0 ? counts[1] + 1 - counts[0] : counts[static_cast<std::size_t>(d) + 1];
}

/// Moves interval counts from n - 1 to n (the incremental form of identity 2): an odd
/// squarefree n enters with its omega; for even n = 2m with m odd squarefree, m leaves.
/// @param omega omega(n); @param squarefree whether n is squarefree.
constexpr void advance_interval_counts(OddIntervalCounts& counts, Natural n, int omega, bool squarefree) noexcept {
  if (!squarefree) return;
  if (n & 1) ++counts[static_cast<std::size_t>(omega)];
  else --counts[static_cast<std::size_t>(omega - 1)];
}

}  // namespace sqfc::topology
