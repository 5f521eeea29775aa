// SPDX-License-Identifier: MIT
/// @file prime_counting.hpp  pi(v) at every quotient v = floor(x/j), by Legendre's identity over a quotient table.
#pragma once

#include <cstdint>
#include <functional>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::arith {

/// Largest x the prime-counting table accepts: 10^14, the largest x verified (pi(10^k) for
/// k <= 14 against OEIS A006880 in tests/arith/test_omega_counting_slow.cpp; every quotient
/// against the sieve of Eratosthenes for small x). The table needs 12 * floor(sqrt(x)) bytes
/// (120 MB at 10^14) and time about x^(3/4) / log x; integer width is not the limit (values
/// stay <= x, and every product j * p formed is <= x).
inline constexpr Natural max_prime_count_x = 100'000'000'000'000ULL;
// The table divides in double precision, exact only below 2^53.
static_assert(max_prime_count_x < (Natural{1} << 53));

/// Progress of a long count: called with (done, total) work units, done increasing, on the thread
/// that called the counting function (never concurrently). May be empty.
using CountProgressFn = std::function<void(Natural done, Natural total)>;

/// The prime-counting function at every quotient of x.
/// Invariant: after construction, pi(v) is exact for every v <= sqrt(x) and every v = floor(x/j),
/// j >= 1. Those are the only values floor(floor(x/a)/b) = floor(x/(ab)) can take, so the table
/// serves any recursion over divisors or prime prefixes of x.
/// Method: the sieve of Legendre on the quotient set (the "Lucy" form of the
/// Meissel-Lehmer phi recursion): S(v) starts at v - 1 and, for each prime p <= sqrt(x), every
/// S(v) with v >= p^2 drops by S(floor(v/p)) - S(p - 1); afterwards S(v) = pi(v).
/// Immutable after construction: any number of threads may read one instance.
class PrimeCountTable {
 public:
  /// Builds the table for x.
  /// @param x        the number whose quotients are tabulated.
  /// @param threads  worker threads for the large rounds (1 = the calling thread only).
  /// @param progress called after rounds with (entries updated so far, entries in all rounds),
  ///                 at most about 1000 times; may be empty.
  /// Pre: 1 <= x <= max_prime_count_x (checked; InvalidArgument, naming the bound); threads >= 1 (checked; InvalidArgument).
  /// Complexity: time O(x^(3/4) / log x), spread over `threads` for the rounds of the primes
  /// p with x / p^2 large; memory 12 * floor(sqrt(x)) bytes plus the primes <= sqrt(x).
  /// See: docs/algorithms/omega-counting.md.
  PrimeCountTable(Natural x, unsigned threads, const CountProgressFn& progress = {});

  [[nodiscard]] Natural x() const noexcept { return x_; }
  /// floor(sqrt(x)).
  [[nodiscard]] Natural sqrt_x() const noexcept { return root_; }

  /// pi(floor(x / j)) for any j >= 1 (0 once j > x). Pre: j >= 1 (assumed). Complexity: O(1),
  /// one division when floor(x/j) <= sqrt(x).
  [[nodiscard]] Natural pi_of_quotient(Natural j) const noexcept {
    return j <= large_count_ ? large_[j] : small_[x_ / j];
  }

  /// The number of j with floor(x/j) > sqrt(x), i.e. floor(x / (sqrt_x() + 1)): pi_of_quotient(j)
  /// reads the table by index for j <= large_count() and divides otherwise.
  [[nodiscard]] Natural large_count() const noexcept { return large_count_; }

  /// pi(v) for v <= sqrt(x). Pre: v <= sqrt_x() (assumed). Complexity: O(1).
  [[nodiscard]] Natural pi_small(Natural v) const noexcept { return small_[v]; }

  /// The primes p <= sqrt(x), increasing; primes()[i] is the (i+1)-th prime, so pi(primes()[i]) = i + 1.
  [[nodiscard]] const std::vector<std::uint32_t>& primes() const noexcept { return primes_; }

 private:
  Natural x_;
  Natural root_;
  Natural large_count_;                // number of j with floor(x/j) > root_, i.e. floor(x / (root_ + 1))
  std::vector<std::uint32_t> small_;   // small_[v] = pi(v), v = 0..root_
  std::vector<std::uint64_t> large_;   // large_[j] = pi(floor(x/j)), j = 1..large_count_ (index 0 unused)
  std::vector<std::uint32_t> primes_;  // primes <= root_
};

/// pi(x), the number of primes <= x, by a PrimeCountTable.
/// Pre, Complexity, Throws: as PrimeCountTable. See: docs/algorithms/omega-counting.md.
Natural prime_count(Natural x, unsigned threads = 1);

}  // namespace sqfc::arith
