// SPDX-License-Identifier: MIT
/// @file block_summary.hpp  What a run must know about a block [lo, hi) to continue past it.
#pragma once

#include <array>
#include <cstddef>

#include "sqfc/arith/factor_code.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::track {

/// Totals of one block [lo, hi) of consecutive n. Summaries of adjacent blocks merge into the
/// summary of their union (merge_summaries), so a run can be checkpointed, resumed or split
/// over machines without changing any result.
/// Invariant: every count refers to n in [lo, hi); the prefix extremes are of
/// P(n) = sum_{lo <= k <= n} mu(k) over n in [lo, hi), and are 0 for an empty block.
struct BlockSummary {
  Natural lo = 1;
  Natural hi = 1;
  SignedSum mertens = 0;    ///< sum of mu(n)
  SignedSum liouville = 0;  ///< sum of lambda(n)
  /// Squarefree n with n odd / n even, by omega(n) (n = 1 is odd with omega 0).
  std::array<Count, config::omega_slots> odd_squarefree{};
  std::array<Count, config::omega_slots> even_squarefree{};
  SignedSum prefix_low = 0;   ///< min of P(n) over the block
  SignedSum prefix_high = 0;  ///< max of P(n) over the block
  int mu_last = 0;            ///< mu(hi - 1), 0 for an empty block

  [[nodiscard]] bool empty() const noexcept { return hi <= lo; }
  /// Number of squarefree n in the block.
  [[nodiscard]] Count squarefree() const noexcept;
  /// Sum over squarefree n >= 2 in the block of 2^omega(n) - 2 (divisibility-graph edges).
  [[nodiscard]] Count divisibility_edges() const noexcept;
  friend bool operator==(const BlockSummary&, const BlockSummary&) = default;
};

/// The summary of [a.lo, b.hi). Pre: a.hi == b.lo (checked; InvalidArgument).
/// Complexity: O(omega_slots).
BlockSummary merge_summaries(const BlockSummary& a, const BlockSummary& b);

/// Summarises n in [lo, lo + count) from their factor codes (codes[i] belongs to n = lo + i).
/// Pre: lo >= 1; codes has count entries (assumed). Complexity: O(count) time, O(1) memory.
BlockSummary summarize_codes(Natural lo, const arith::FactorCode* codes, std::size_t count);

}  // namespace sqfc::track
