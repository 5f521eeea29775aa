// SPDX-License-Identifier: MIT
/// @file face_neighbourhood.hpp  Cofaces of one face of K_n and its degrees in G_n and H_n, counted
/// without enumerating the vertices.
#pragma once

#include <cstdint>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::complex {

/// Largest n accepted by face_neighbourhood (10^10): the counts then cost O(sqrt(n)) per
/// smooth divisor and a mu table of a few MiB. Larger n would work in 64 bits up to about
/// 10^14 but is not needed by any command; the limit is documented in docs/cli.md.
inline constexpr Natural max_neighbourhood_n = 10'000'000'000ULL;

/// Counts squarefree integers up to a bound from a table of mu, without enumerating them:
///   Q(y) = sum_{d <= sqrt y} mu(d) floor(y / d^2)                         (design.md identity 7),
///   #{squarefree t <= y, gcd(t, P) = 1} = sum_{t | P^inf, t <= y} lambda(t) Q(floor(y / t)),
/// the second from the Dirichlet series zeta(s)/zeta(2s) * prod_{p | P} 1/(1 + p^-s).
/// Invariant: holds mu(d) and Q(d) for every d <= table_limit(), where
/// table_limit() >= max(floor(sqrt(max_y)), min(max_y, 2^20)); immutable after construction,
/// so threads may share one instance.
class SquarefreeCounter {
 public:
  /// Sieves mu (segmented sieve, arith::sieve_range) up to the table limit.
  /// Pre: max_y <= 10^14 (checked; InvalidArgument).
  /// Complexity: O(T log log T) time and 5 bytes per entry, T = table_limit() (at most
  /// 10^7 + 2^20 for max_y = 10^14).
  explicit SquarefreeCounter(Natural max_y);

  [[nodiscard]] Natural max_y() const noexcept { return max_y_; }
  [[nodiscard]] Natural table_limit() const noexcept { return table_limit_; }

  /// Q(y), the number of squarefree integers in [1, y] (Q(0) = 0).
  /// Pre: y <= max_y() (checked; InvalidArgument). Complexity: O(1) for y <= table_limit(),
  /// else O(sqrt y).
  [[nodiscard]] Count squarefree_count(Natural y) const;

  /// The number of squarefree t in [1, y] coprime to every prime in @p primes (t = 1 included).
  /// Pre: primes are distinct primes (assumed); y <= max_y() (checked; InvalidArgument).
  /// Complexity: one squarefree_count per P-smooth t <= y, P the product of @p primes;
  /// in all O(sqrt(y) prod_{p | P} 1/(1 - p^-1/2)).
  [[nodiscard]] Count count_coprime_squarefree(const std::vector<Natural>& primes, Natural y) const;

 private:
  Natural max_y_;
  Natural table_limit_;
  std::vector<std::int8_t> mu_;     // mu(d), d = 0..table_limit_ (mu_[0] unused)
  std::vector<std::uint32_t> q_;    // Q(d), d = 0..table_limit_ (< 2^32 since table_limit_ < 2^32)
};

/// One squarefree k as a vertex of K_n, G_n and H_n (design.md section 1).
struct FaceNeighbourhood {
  Natural k = 0;                  ///< the integer asked about
  Natural n = 0;                  ///< the complex K_n
  bool is_face = false;           ///< k squarefree and 2 <= k <= n; when false the counts are 0
  Count vertices = 0;             ///< faces of K_n (vertices of G_n and H_n): Q(n) - 1
  Count cofaces = 0;              ///< faces of K_n properly containing k: squarefree k m <= n, m > 1
  Count divisibility_degree = 0;  ///< degree of k in G_n: (2^omega(k) - 2) + cofaces
  Count shared_factor_degree = 0; ///< degree of k in H_n: squarefree j in [2, n], j != k, gcd(j, k) > 1
};

/// The neighbourhood counts of k in K_n, factoring k with arith::factor_u64.
/// Pre: 1 <= n <= max_neighbourhood_n and k >= 1 (checked; InvalidArgument).
/// Complexity: building a SquarefreeCounter(n) plus the calls below.
FaceNeighbourhood face_neighbourhood(Natural k, Natural n);

/// The same with a caller-built counter (reuse it across many k).
/// Pre: k >= 1, 1 <= n <= counter.max_y() (checked; InvalidArgument).
/// Complexity: factoring k plus two count_coprime_squarefree calls (at y = n and n / k).
FaceNeighbourhood face_neighbourhood(const SquarefreeCounter& counter, Natural k, Natural n);

}  // namespace sqfc::complex
