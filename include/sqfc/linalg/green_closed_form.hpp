// SPDX-License-Identifier: MIT
/// @file green_closed_form.hpp  Green function entries of H_n without forming the matrix.
#pragma once

#include <cstdint>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/linalg/green_statistics.hpp"

namespace sqfc::linalg {

/// Closed form of g_n = (1 + A(H_n))^-1 (design.md identity 6, from the published Green star
/// formula g(x,y) = w(x) w(y) chi(St(x) ∩ St(y))): for squarefree x, y in [2, n] with
/// l = lcm(x, y) <= n,
///   g(x, y) = -mu(x) mu(y) mu(l) M_l(floor(n / l)),  M_l(y) = sum_{t <= y, gcd(t, l) = 1} mu(t),
/// and 0 when l > n. M_l is evaluated as sum over t | l^infinity (t <= y) of M(floor(y / t)),
/// the Dirichlet inverse of the prime-by-prime recursion M_l(y) = M_{l'}(y) + M_l(y/p).
/// Invariant: holds M(k) and the smallest prime factor of every k <= n.
class GreenClosedForm {
 public:
  /// Sieves the tables for n. Pre: 1 <= n <= 2 * 10^8 (checked; InvalidArgument).
  /// Complexity: O(n log log n) time; 12 bytes per integer up to n.
  explicit GreenClosedForm(Natural n);

  [[nodiscard]] Natural n() const noexcept { return n_; }
  /// M(k). Pre: k <= n (assumed).
  [[nodiscard]] std::int64_t mertens(Natural k) const noexcept { return mertens_[k]; }
  /// mu(k). Pre: 1 <= k <= n (assumed).
  [[nodiscard]] int mu(Natural k) const noexcept { return static_cast<int>(mertens_[k] - mertens_[k - 1]); }
  /// M_l(y) for squarefree l <= n and y <= n. Pre: l squarefree, l, y <= n (assumed).
  /// Complexity: O(number of l-smooth t <= y).
  [[nodiscard]] std::int64_t mertens_coprime(Natural l, Natural y) const;
  /// g_n(x, y) for squarefree x, y in [2, n] (checked: InvalidArgument otherwise).
  [[nodiscard]] std::int64_t entry(Natural x, Natural y) const { return entry_at(n_, x, y); }
  /// g_m(x, y) for any m <= n: the tables up to n serve every smaller m.
  /// Pre: 2 <= m <= n; x, y squarefree in [2, m] (checked; InvalidArgument).
  [[nodiscard]] std::int64_t entry_at(Natural m, Natural x, Natural y) const;
  /// Statistics of all V^2 entries, from one M_l(n / l) per squarefree l <= n: the entries with
  /// lcm l and |X ∩ Y| = i number C(w, i) 2^(w-i) (minus 2 for i = 0), with value
  /// -(-1)^i M_l(n / l), where w = omega(l). Complexity: O(sum over l of the l-smooth t <= n/l).
  [[nodiscard]] GreenStatistics statistics() const { return statistics_at(n_); }
  /// Statistics of g_m for any 1 <= m <= n (checked; InvalidArgument).
  [[nodiscard]] GreenStatistics statistics_at(Natural m) const;
  /// Edges of H_m for m <= n without enumeration (design.md identity 8):
  /// sum over squarefree d >= 2 of -mu(d) C(S_d(m), 2), where S_d(m) counts the squarefree
  /// multiples of d up to m, i.e. squarefree t <= m/d coprime to d, evaluated as
  /// sum over t | d^infinity of lambda(t) Q(m / (d t)). Pre: m <= n (checked).
  /// Complexity: O(sum over d <= m/2 of the d-smooth t <= m/d).
  [[nodiscard]] Count shared_factor_edges_at(Natural m) const;
  /// Q(k), the squarefree count. Pre: k <= n (assumed).
  [[nodiscard]] Count squarefree_count(Natural k) const noexcept { return squarefree_[k]; }
  /// The distinct prime factors of k, increasing. Pre: 1 <= k <= n (assumed).
  [[nodiscard]] std::vector<std::uint32_t> prime_factors(Natural k) const;

 private:
  Natural n_;
  std::vector<std::int32_t> mertens_;          // M(k), k = 0..n; |M(k)| < 2^31 for k <= 2*10^8
  std::vector<std::uint32_t> smallest_prime_;  // smallest prime factor, k = 0..n (0, 1 -> 0)
  std::vector<std::uint32_t> squarefree_;      // Q(k), k = 0..n
};

}  // namespace sqfc::linalg
