// SPDX-License-Identifier: MIT
// Oracle for tests only: every squarefree integer up to n enumerated as a product of distinct
// primes by depth-first search, with a plain sieve of Eratosthenes for the primes. It shares
// no code with the library's segmented sieve or tracker, and is fast enough for n = 10^8.
#pragma once

#include <cstdint>
#include <vector>

namespace sqfc::oracles {

/// Every prime p <= n, by a bit-per-number sieve of Eratosthenes. Complexity: O(n log log n)
/// time, n / 8 bytes of memory plus 4 bytes per prime.
std::vector<std::uint32_t> primes_up_to_naive(std::uint64_t n);

/// Totals over the squarefree k in [1, n], all from the depth-first enumeration.
struct SquarefreeCensus {
  std::uint64_t n = 0;
  std::uint64_t squarefree = 0;            ///< Q(n): every squarefree k in [1, n]
  std::int64_t mertens = 0;                ///< M(n) = sum of (-1)^omega(k)
  std::vector<std::uint64_t> faces;        ///< faces[d]: squarefree k in [2, n] with omega(k) = d + 1
  std::vector<std::uint64_t> odd_upper;    ///< odd_upper[w]: odd squarefree m in (n/2, n] with omega(m) = w
  std::uint64_t divisibility_pairs = 0;    ///< sum over squarefree k in [2, n] of 2^omega(k) - 2
};

/// The census of [1, n] by depth-first search over products of distinct primes.
/// Complexity: O(Q(n)) products plus the prime sieve up to n.
SquarefreeCensus squarefree_census_dfs(std::uint64_t n);

/// omega(k) for every squarefree k in [1, n] and -1 for every other k (index k; entry 0 is -1),
/// marked by the depth-first search. Complexity: O(n) memory, O(Q(n)) products.
std::vector<std::int8_t> squarefree_omega_table_dfs(std::uint64_t n);

/// mu(k) for every k in [0, n] (index k; entry 0 unused): +-1 on the products that the
/// depth-first search reaches, 0 elsewhere. Complexity: O(n) memory, O(Q(n)) products.
std::vector<std::int8_t> mobius_table_dfs(std::uint64_t n);

}  // namespace sqfc::oracles
