// SPDX-License-Identifier: MIT
/// @file tracker_state.hpp  Running invariants of K_n, advanced one n or one block at a time.
#pragma once

#include <array>

#include "sqfc/arith/factor_code.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/types.hpp"
#include "sqfc/topology/betti_counting.hpp"
#include "sqfc/track/block_summary.hpp"

namespace sqfc::track {

/// Every column of `sqfc table` at one n (design.md section 4).
struct TableRow {
  Natural n = 0;
  int mu = 0;
  SignedSum mertens = 0;     ///< M(n)
  SignedSum euler = 0;       ///< chi(K_n) = 1 - M(n)
  Count squarefree = 0;      ///< Q(n)
  SignedSum liouville = 0;   ///< L(n)
  int fredholm = 1;          ///< det(1 + A(H_n)) = prod_{2<=k<=n squarefree} -mu(k)
  std::array<Count, config::omega_slots> faces{};      ///< f_d, d = 0..15
  std::array<SignedSum, config::omega_slots> betti{};  ///< b_d (unreduced), d = 0..15
  Count div_edges = 0;       ///< edges of the divisibility graph G_n
};

/// The state after n: sums up to n and counts that give every column.
/// Invariant: all members describe [1, n]; n = 0 is the state before the first integer.
class TrackerState {
 public:
  [[nodiscard]] Natural n() const noexcept { return n_; }

  /// Advances to n + 1 whose factor code is @p code. Complexity: O(1).
  void step(arith::FactorCode code) noexcept;

  /// Advances over a whole block. Pre: summary.lo == n() + 1 (checked; InvalidArgument).
  /// Complexity: O(omega_slots).
  void apply(const BlockSummary& summary);

  /// The row at n(). Pre: n() >= 1 (assumed). Complexity: O(omega_slots).
  [[nodiscard]] TableRow row() const noexcept;

  [[nodiscard]] SignedSum mertens() const noexcept { return mertens_; }
  [[nodiscard]] SignedSum liouville() const noexcept { return liouville_; }
  [[nodiscard]] Count squarefree() const noexcept { return squarefree_; }
  [[nodiscard]] int mu_at_n() const noexcept { return mu_n_; }
  /// Squarefree m <= n with omega(m) = w, m odd and m even.
  [[nodiscard]] const std::array<Count, config::omega_slots>& odd_squarefree() const noexcept { return odd_; }
  [[nodiscard]] const std::array<Count, config::omega_slots>& even_squarefree() const noexcept { return even_; }
  [[nodiscard]] const topology::OddIntervalCounts& interval_counts() const noexcept { return interval_; }
  friend bool operator==(const TrackerState&, const TrackerState&) = default;

 private:
  Natural n_ = 0;
  SignedSum mertens_ = 0;
  SignedSum liouville_ = 0;
  Count squarefree_ = 0;
  int mu_n_ = 0;
  std::array<Count, config::omega_slots> odd_{};
  std::array<Count, config::omega_slots> even_{};
  topology::OddIntervalCounts interval_{};
};

}  // namespace sqfc::track
