// SPDX-License-Identifier: MIT
// Depth-first enumeration of squarefree products of distinct primes.
#include "oracles/squarefree_enumeration.hpp"

#include <cstddef>

namespace sqfc::oracles {
namespace {

// Calls visit(k, omega) for every squarefree k = product * p_j * ... <= n built from primes of
// index >= first. Recursion depth is at most omega(k) <= 15 for 64-bit n.
template <class Visit>
void extend(const std::vector<std::uint32_t>& primes, std::size_t first, std::uint64_t product, int omega,
            std::uint64_t n, Visit& visit) {
  for (std::size_t j = first; j < primes.size(); ++j) {
    const std::uint64_t p = primes[j];
    if (p > n / product) break;  // product * p > n, and so for every later prime
    const std::uint64_t k = product * p;
    visit(k, omega + 1);
    extend(primes, j + 1, k, omega + 1, n, visit);
  }
}

template <class Visit>
void for_each_squarefree(std::uint64_t n, Visit visit) {
  if (n < 1) return;
  visit(std::uint64_t{1}, 0);
  const auto primes = primes_up_to_naive(n);
  extend(primes, 0, 1, 0, n, visit);
}

}  // namespace

std::vector<std::uint32_t> primes_up_to_naive(std::uint64_t n) {
  std::vector<std::uint32_t> primes;
  if (n < 2) return primes;
  std::vector<bool> composite(n + 1, false);
  for (std::uint64_t p = 2; p <= n; ++p) {
    if (composite[p]) continue;
    primes.push_back(static_cast<std::uint32_t>(p));
    for (std::uint64_t q = p * p; q <= n; q += p) composite[q] = true;
  }
  return primes;
}

SquarefreeCensus squarefree_census_dfs(std::uint64_t n) {
  SquarefreeCensus c;
  c.n = n;
  for_each_squarefree(n, [&](std::uint64_t k, int omega) {
    ++c.squarefree;
    c.mertens += (omega % 2) ? -1 : 1;
    const auto w = static_cast<std::size_t>(omega);
    if (k >= 2) {
      if (c.faces.size() < w) c.faces.resize(w, 0);
      ++c.faces[w - 1];
      c.divisibility_pairs += (std::uint64_t{1} << omega) - 2;
    }
    if ((k & 1) && 2 * k > n) {
      if (c.odd_upper.size() <= w) c.odd_upper.resize(w + 1, 0);
      ++c.odd_upper[w];
    }
  });
  return c;
}

std::vector<std::int8_t> mobius_table_dfs(std::uint64_t n) {
  std::vector<std::int8_t> mu(n + 1, 0);
  for_each_squarefree(n, [&](std::uint64_t k, int omega) { mu[k] = (omega % 2) ? -1 : 1; });
  return mu;
}

std::vector<std::int8_t> squarefree_omega_table_dfs(std::uint64_t n) {
  std::vector<std::int8_t> omega(n + 1, -1);
  for_each_squarefree(n, [&](std::uint64_t k, int w) { omega[k] = static_cast<std::int8_t>(w); });
  return omega;
}

}  // namespace sqfc::oracles
