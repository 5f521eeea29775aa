// SPDX-License-Identifier: MIT
/// @file mertens_helfgott_thompson.hpp  M(x) by local linear approximation of x/(mn) (Helfgott–Thompson).
#pragma once

#include <cstdint>

#include "sqfc/core/types.hpp"

namespace sqfc::arith {

/// Largest x that mertens_isolated_helfgott_thompson() accepts: 10^15, the largest x where its
/// result was compared (with mertens_isolated() and OEIS A084237, tests/bench/bench_mertens_methods).
/// x < 2^53 keeps x exact in a double; the model's doubles carry a rounding allowance of 1e-13
/// relative (hundreds of times their error), and every pair the model may get wrong is
/// recomputed in integers, so the limit is one of verification, not of the method.
inline constexpr Natural max_helfgott_thompson_x = 1'000'000'000'000'000ULL;  // 10^15

/// Tuning of mertens_isolated_helfgott_thompson(). Every field has a default (0 = tuned);
/// any allowed value gives the same M(x), only the time moves (tests vary them).
struct HelfgottThompsonOptions {
  /// The split u of the identity (1 <= u, u * u < x): 0 chooses the tuned default
  /// (default_helfgott_thompson_split). The sieve runs to x/u, the boxes cover [1, u]^2.
  Natural split = 0;
  /// Box size: the quadratic error of the linear model times the box height stays below
  /// this (in (0, 4]). Larger boxes cost fewer tables but more exact corrections.
  double box_tolerance = 0;
  /// Smallest box height; rows below it are summed one quotient at a time, by the vector
  /// kernel (>= 2; the default 160 was measured, see default_helfgott_thompson_split).
  unsigned min_box_height = 0;
};

/// What one evaluation did, for the benchmark and the tests (counts, not times).
struct HelfgottThompsonWork {
  Natural split = 0;           ///< u
  Natural sieve_limit = 0;     ///< floor(x/u): mu is sieved on (u, x/u]
  Count boxes = 0;             ///< boxes summed by the linear model
  Count box_pairs = 0;         ///< (m, n) pairs those boxes cover
  Count box_columns = 0;       ///< squarefree columns n visited in boxes (one model step each)
  Count box_table_entries = 0; ///< rows plus class-table entries (a + q per box)
  Count corrections = 0;       ///< exact quotients computed inside boxes (model checks)
  Count long_classes = 0;      ///< ambiguous classes corrected by bisection instead of member by member
  Count direct_pairs = 0;      ///< pairs summed one quotient at a time
  Count lookups = 0;           ///< M values read during the sieve (one per k or t)
};

/// The split u used by default: about 0.5 x^(2/5) (at least x/2^43), measured on the 2-core
/// EPYC (December 2026) to balance the sieve to x/u against the double sum on [1, u]^2.
Natural default_helfgott_thompson_split(Natural x);

/// M(x) = sum_{k <= x} mu(k) by the identity (u^2 < x, W = floor(x/u))
///   M(x) = M(u) + M(W) - sum_{m, n <= u} mu(m) mu(n) floor(x/(mn))
///                      - sum_{d <= u} mu(d) sum_{u < a <= W} mu(a) floor(x/(ad)),
/// the first double sum over boxes on which x/(mn) is replaced by its linear Taylor
/// polynomial, whose slope in m is replaced by a continued-fraction convergent p/q; the floor
/// of the model is summed by congruence classes mod q in O(a + b + q) per a x b box, and every
/// pair where the model can differ from the floor is recomputed exactly. The second double
/// sum reads M from a segmented mu sieve on (u, W]. One thread.
/// Pre: 1 <= x <= max_helfgott_thompson_x (checked; InvalidArgument); options as documented
/// (checked; InvalidArgument). `work`, when not null, receives the counts of the run.
/// Complexity: with boxes from a fixed height and u about x^(2/5), time about x^(3/5) up to
/// logarithms (sieve to x/u, boxes on [1, u]^2). The default tuning, the fastest measured up to
/// 10^15, makes no box there: the square is then summed pair by pair by the vector kernel,
/// about u^2 / 4 = x^(4/5) / 16 quotients. Memory O(u + sqrt(x/u)) plus the sieve's tables.
/// See: docs/algorithms/mertens-isolated.md section 7; Helfgott and Thompson, Research in
/// Number Theory 9 (2023), arXiv:2101.08773.
SignedSum mertens_isolated_helfgott_thompson(Natural x, const HelfgottThompsonOptions& options = {},
                                             HelfgottThompsonWork* work = nullptr);

}  // namespace sqfc::arith
