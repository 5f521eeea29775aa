// SPDX-License-Identifier: MIT
/// @file omega_counting.hpp  Squarefree k <= x by omega(k) at one huge x, by counting over primes (no sieve to x).
#pragma once

#include <cstdint>
#include <vector>

#include "sqfc/arith/prime_counting.hpp"
#include "sqfc/core/types.hpp"

namespace sqfc::arith {

/// Largest x count_by_omega accepts: 10^14. Verified against the segmented sieve (every
/// x <= 10^4, random x <= 10^8, the benchmark at 10^9 and 10^10), against Q(10^k) (OEIS A071172)
/// for k <= 14 and against the table engine's f-vector and Betti numbers at 10^6..10^8
/// (tests/arith/test_omega_counting*.cpp, tests/track/test_omega_counting_faces*.cpp).
/// Time at the bound is minutes on two cores (docs/algorithms/omega-counting.md).
inline constexpr Natural max_omega_counting_x = 100'000'000'000'000ULL;

/// Counts of squarefree integers up to x by their number of distinct prime factors.
/// Both vectors have the same length: 1 + the largest m with 2 * 3 * ... * p_m <= x (so the last
/// entry of squarefree_by_omega is nonzero; that of odd_squarefree_by_omega may be 0).
struct OmegaCounts {
  std::vector<std::uint64_t> squarefree_by_omega;      ///< [m] = #{squarefree k <= x : omega(k) = m}, m = 0.. (m = 0 is k = 1)
  std::vector<std::uint64_t> odd_squarefree_by_omega;  ///< [m] = #{odd squarefree k <= x : omega(k) = m}
};

/// The face counts of K_x in omega form: f_d(x) = squarefree_by_omega[d + 1].
/// Also gives the Betti numbers: the even squarefree k = 2j <= x with omega(k) = m are the odd
/// squarefree j <= x/2 with omega(j) = m - 1, so odd_upper_half_by_omega() below needs nothing else.
/// @param x        inclusive bound.
/// @param threads  worker threads (1 = the calling thread only); results do not depend on it.
/// Pre: 1 <= x <= max_omega_counting_x (checked; InvalidArgument); threads >= 1 (checked; InvalidArgument).
/// Complexity: time O(x^(3/4) / log x) for the prime-counting table plus one table look-up per
/// odd squarefree prefix p1 < ... < p_r with c * p1 * ... * p_r * p_r < x, c in {1, 2}
/// (about 10^7 at x = 10^12); memory 12 * sqrt(x) bytes plus O(x^(0.4)) for the task list.
/// Thread-safety: reentrant.
/// See: docs/algorithms/omega-counting.md.
OmegaCounts count_by_omega(std::uint64_t x, unsigned threads);

/// count_by_omega with progress: progress(done, 1000) is called on the calling thread, done
/// increasing; the table of pi takes done to 600, the recursion (by tasks finished) to 1000.
/// Pre, Complexity, Throws: as above; whatever progress throws stops the count (after the
/// worker threads have finished).
OmegaCounts count_by_omega(std::uint64_t x, unsigned threads, const CountProgressFn& progress);

/// #{odd squarefree k in (x/2, x] : omega(k) = m} for every m, from counts at x: the reduced Betti
/// numbers of K_x are b~_d = result[d + 1] (Björner 2011; design.md identity 2).
/// Pre: counts came from count_by_omega (assumed: both vectors have the same length >= 1).
/// Complexity: O(length).
std::vector<std::uint64_t> odd_upper_half_by_omega(const OmegaCounts& counts);

}  // namespace sqfc::arith
