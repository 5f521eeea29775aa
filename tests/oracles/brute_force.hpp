// SPDX-License-Identifier: MIT
// Brute-force oracles for tests only: trial division and direct enumeration, written to share
// no code with the library's sieve and tracker.
#pragma once

#include <cstdint>
#include <vector>

namespace sqfc::oracles {

struct NaiveArithmetic {
  int mu;
  int omega;
  int big_omega;
};

/// mu, omega, Omega of n >= 1 by trial division. Complexity: O(sqrt(n)).
NaiveArithmetic arithmetic_naive(std::uint64_t n);

/// Prefix values for every n in [1, n_max], index n (index 0 unused), by trial division.
struct NaivePrefix {
  std::vector<int> mu;
  std::vector<int> omega;
  std::vector<int> big_omega;
  std::vector<std::int64_t> mertens;
  std::vector<std::int64_t> liouville;
  std::vector<std::int64_t> squarefree;
};
NaivePrefix prefix_naive(std::uint64_t n_max);

/// f-vector of K_n by enumeration: faces[d] = squarefree k in [2, n] with d + 1 primes.
std::vector<std::uint64_t> f_vector_naive(std::uint64_t n);

/// Edges of the divisibility graph G_n by testing every pair a < b of squarefree integers in
/// [2, n] for a | b. Complexity: O(n^2); meant for n <= 3000.
std::uint64_t divisibility_edges_naive(std::uint64_t n);

/// Unreduced Betti numbers of K_n over Z/2 from the boundary matrices (dense Gaussian
/// elimination), index d = 0..top dimension. Complexity: O(F^3 / 64) for F faces; n <= 1000.
std::vector<std::int64_t> betti_mod2_naive(std::uint64_t n);

}  // namespace sqfc::oracles
