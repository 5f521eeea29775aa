// SPDX-License-Identifier: MIT
/// @file face_counts.hpp  Counting facts about the squarefree complex K_n and its graphs.
#pragma once

#include <cstdint>

#include "sqfc/core/types.hpp"

namespace sqfc::complex {

/// Product of the first m primes (m-th primorial): the smallest squarefree integer with
/// omega = m, so the first n at which K_n has a face of dimension m - 1.
/// Pre: 0 <= m <= 15 (checked; InvalidArgument); the 15th primorial 6.1e17 fits 64 bits.
Natural primorial(int m);

/// Product of the first m odd primes: the smallest odd squarefree integer with omega = m,
/// so the first n at which b_{m-1}(K_n) > 0 (for m >= 2; design.md identity 2).
/// Pre: 0 <= m <= 14 (checked; InvalidArgument).
Natural odd_primorial(int m);

/// Largest face dimension of K_n: d with primorial(d+1) <= n < primorial(d+2); -1 for n < 2
/// (the empty complex). Complexity: O(1).
int max_face_dimension(Natural n);

/// Edges the face k = p1...pm contributes to the divisibility graph G_n, counted at its top
/// end: the squarefree proper divisors a of k with a >= 2, that is 2^m - 2. Pre: 1 <= m <= 15.
constexpr Count divisibility_edges_below(int m) noexcept { return (Count{1} << m) - 2; }

}  // namespace sqfc::complex
