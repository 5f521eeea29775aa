// SPDX-License-Identifier: MIT
/// @file persistence.hpp  Persistent homology of the filtration K_1 ⊂ K_2 ⊂ ... straight from the boundary matrix.
#pragma once

#include <cstdint>
#include <optional>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::topology {

/// Which squarefree k >= 2 are faces. Every choice keeps the family closed under taking
/// faces (a divisor of an accepted k is accepted), so each is a simplicial complex filtered by k.
struct FaceFamily {
  std::optional<Natural> smooth_bound;  ///< only k whose primes are all <= Y
  std::optional<Natural> coprime_to;    ///< only k coprime to m
  std::optional<int> max_dimension;     ///< only faces of dimension <= D (a skeleton)
  /// True for the whole squarefree complex K_n (identity 2 applies).
  [[nodiscard]] bool is_full() const noexcept { return !smooth_bound && !coprime_to && !max_dimension; }
};

/// A persistence interval: a class of `dimension` born when face `birth` enters and killed when
/// face `death` enters; death = 0 means it never dies (an essential class, written `inf`).
struct Bar {
  int dimension;
  Natural birth;
  Natural death;
  friend bool operator==(const Bar&, const Bar&) = default;
  friend auto operator<=>(const Bar&, const Bar&) = default;
};

/// Column order of the reduction. All give the same bars; tests compare them and
/// tests/bench/bench_homology measures them.
enum class ReductionOrder {
  /// The default. In every family here the smallest allowed prime q0 is a cone point: for a face
  /// k with q0 dividing k, its youngest facet is k/q0 and the oldest coface of k/q0 is k, so
  /// (k/q0, k) is an apparent pair (U. Bauer, "Ripser: efficient computation of Vietoris-Rips
  /// persistence barcodes", J. Appl. Comput. Topol. 5 (2021)) and is a persistence pair without
  /// any reduction. Both conditions are read off the face's primes, in one segmented, threaded
  /// pass with the sieve. Every other column (a face k with q0 not dividing k whose coface k*q0
  /// is missing) is reduced by adding apparent columns; when a pivot is met that no apparent column
  /// owns, the whole computation falls back to `twist` (never for the families of FaceFamily, but
  /// nothing assumes it). Bars come out in order, so no sort is needed.
  apparent_pairs,
  twist,     ///< dimensions from the top down, clearing pivots of the dimension above
  standard,  ///< all columns in filtration order, no clearing
};

/// Result of one reduction.
struct PersistenceResult {
  std::vector<Bar> bars;            ///< sorted by (dimension, birth, death)
  std::vector<Count> faces_by_dimension;
  Count column_additions = 0;       ///< column operations the reduction needed
  Count cleared_columns = 0;        ///< columns skipped by clearing (apparent births included)
  Count apparent_pairs = 0;         ///< pairs found without reduction (apparent_pairs only)
  int top_dimension = -1;
  ReductionOrder method = ReductionOrder::twist;  ///< the order that produced the bars
};

/// Persistence of the family's filtration on [2, n] over the prime field Z/p (p = 2 or 3), by
/// apparent pairs with the twist reduction as fallback (see ReductionOrder), on all hardware
/// threads. Faces are identified by their integer, so a column's pivot (its latest-entering
/// boundary face) is its largest entry. Nothing about the expected pairing is assumed.
/// Pre: 1 <= n <= 2*10^8 (checked; InvalidArgument); p in {2, 3} (checked).
/// Complexity (apparent_pairs): O(n log log n) time for the sieve passes plus a few column
/// additions per face k > n/q0 with q0 not dividing k; memory the bars (24 bytes each) plus
/// O(threads * 2^16) for the segments. twist and standard: O(n) words of tables (4 bytes per
/// integer for the pivot index, 1 bit for clearing, 4 for the smallest prime factor) plus the
/// stored reduced columns.
PersistenceResult compute_persistence(Natural n, const FaceFamily& family, unsigned field = 2);

/// compute_persistence with an explicit column order; `threads` is used by apparent_pairs only
/// (0 means all hardware threads). The result does not depend on the thread count.
PersistenceResult compute_persistence(Natural n, const FaceFamily& family, unsigned field, ReductionOrder order,
                                      unsigned threads = 1);

/// b_d at m from the bars: the bars of dimension d with birth <= m < death (or no death).
/// Pre: bars as compute_persistence returns them. Complexity: O(|bars|).
std::vector<Count> betti_from_bars(const std::vector<Bar>& bars, Natural m, int top_dimension);

/// First bar (in the result's order) that is finite and not of the form [m, 2m) with m odd
/// squarefree and of dimension omega(m) - 1 (design.md identity 2), or nullopt when every finite
/// bar is. omega and squarefreeness come from the sieve. Pre: every bar's birth <= n (assumed).
/// Complexity: O(n log log n + |bars|).
std::optional<Bar> first_bar_not_m_2m(const std::vector<Bar>& bars, Natural n);

}  // namespace sqfc::topology

namespace sqfc::topology {

/// Betti numbers b_0..b_top of K_m at each of the increasing points m, by design.md identity 2
/// (odd squarefree counts in (m/2, m]; Björner 2011), from one sieve pass to the last point.
/// Independent of compute_persistence: it never looks at a boundary matrix.
/// Pre: points increasing, each in [1, 2*10^8] (checked; InvalidArgument).
/// Complexity: O(points.back() log log points.back()) time, O(1) extra memory per point.
std::vector<std::vector<Count>> betti_by_formula(const std::vector<Natural>& points, int top_dimension);

}  // namespace sqfc::topology
