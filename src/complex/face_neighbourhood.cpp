// SPDX-License-Identifier: MIT
// Counting the neighbourhood of one face of K_n through Q(y) and coprime squarefree counts.
#include "sqfc/complex/face_neighbourhood.hpp"

#include <algorithm>
#include <string>

#include "sqfc/arith/factor.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::complex {
namespace {

// A table of 2^20 entries costs about 5 MiB and a few milliseconds, and answers every Q(y)
// of the recursion's deep levels (y / t small) in O(1) instead of O(sqrt y).
constexpr Natural small_table = Natural{1} << 20;
constexpr Natural max_counter_y = 100'000'000'000'000ULL;  // 10^14: sqrt is 10^7

}  // namespace

SquarefreeCounter::SquarefreeCounter(Natural max_y) : max_y_(max_y) {
  if (max_y > max_counter_y)
    throw InvalidArgument("squarefree counts are limited to y <= 10^14, got " + std::to_string(max_y));
  table_limit_ = std::max<Natural>({integer_sqrt(max_y), std::min(max_y, small_table), 1});
  mu_.assign(table_limit_ + 1, 0);
  q_.assign(table_limit_ + 1, 0);
  arith::sieve_range(1, table_limit_ + 1, [&](const arith::SieveBlock& block) {
    for (std::size_t i = 0; i < block.size(); ++i) mu_[block.lo() + i] = static_cast<std::int8_t>(block.mu(i));
  });
  for (Natural d = 1; d <= table_limit_; ++d) q_[d] = q_[d - 1] + (mu_[d] != 0 ? 1U : 0U);
}

Count SquarefreeCounter::squarefree_count(Natural y) const {
  if (y > max_y_)
    throw InvalidArgument("Q(" + std::to_string(y) + ") is past the counter's bound " + std::to_string(max_y_));
  if (y <= table_limit_) return q_[y];
  // Inclusion-exclusion over the squares d^2 <= y; d <= sqrt(max_y) <= table_limit_. The terms
  // alternate in sign but the partial sums stay in (-y, 2y), well inside 64 bits.
  const Natural root = integer_sqrt(y);
  SignedSum total = 0;
  for (Natural d = 1; d <= root; ++d)
    if (mu_[d] != 0) total += mu_[d] * static_cast<SignedSum>(y / (d * d));
  return static_cast<Count>(total);
}

namespace {

// sum over t | P^inf with t <= y of lambda(t) Q(floor(y / t)), by depth-first search over the
// primes (index `from` on) and their powers; floor(floor(y / a) / b) = floor(y / (a b)).
SignedSum coprime_sum(const SquarefreeCounter& counter, const std::vector<Natural>& primes, std::size_t from,
                      Natural y, int sign) {
  SignedSum total = sign * static_cast<SignedSum>(counter.squarefree_count(y));
  for (std::size_t i = from; i < primes.size(); ++i) {
    const Natural p = primes[i];
    if (p > y) break;  // primes are increasing: no later prime divides a t <= y either
    int power_sign = -sign;
    for (Natural z = y / p; z > 0; z /= p, power_sign = -power_sign)
      total += coprime_sum(counter, primes, i + 1, z, power_sign);
  }
  return total;
}

}  // namespace

Count SquarefreeCounter::count_coprime_squarefree(const std::vector<Natural>& primes, Natural y) const {
  if (y > max_y_)
    throw InvalidArgument("coprime squarefree count at " + std::to_string(y) + " is past the counter's bound " +
                          std::to_string(max_y_));
  std::vector<Natural> sorted = primes;
  std::sort(sorted.begin(), sorted.end());
  return static_cast<Count>(coprime_sum(*this, sorted, 0, y, 1));
}

FaceNeighbourhood face_neighbourhood(Natural k, Natural n) {
  if (n < 1 || n > max_neighbourhood_n)
    throw InvalidArgument("face neighbourhoods need 1 <= n <= 10^10, got " + std::to_string(n));
  const SquarefreeCounter counter(n);
  return face_neighbourhood(counter, k, n);
}

FaceNeighbourhood face_neighbourhood(const SquarefreeCounter& counter, Natural k, Natural n) {
  if (k < 1) throw InvalidArgument("face neighbourhoods need k >= 1");
  if (n < 1 || n > counter.max_y())
    throw InvalidArgument("face neighbourhood at n = " + std::to_string(n) + " needs a counter up to it (it has " +
                          std::to_string(counter.max_y()) + ")");
  FaceNeighbourhood r;
  r.k = k;
  r.n = n;
  r.vertices = counter.squarefree_count(n) - 1;
  if (k < 2 || k > n) return r;
  std::vector<Natural> primes;
  for (const auto& [p, e] : arith::factor_u64(k)) {
    if (e > 1) return r;
    primes.push_back(p);
  }
  r.is_face = true;
  // Cofaces k m <= n: squarefree m in (1, n / k] coprime to k (m = 1 is k itself).
  r.cofaces = counter.count_coprime_squarefree(primes, n / k) - 1;
  // All 2^omega - 2 proper divisors d >= 2 of k are <= k <= n, hence vertices of G_n.
  r.divisibility_degree = (Count{1} << primes.size()) - 2 + r.cofaces;
  // Squarefree j in [1, n] sharing a prime with k, less j = k itself.
  r.shared_factor_degree = counter.squarefree_count(n) - counter.count_coprime_squarefree(primes, n) - 1;
  return r;
}

}  // namespace sqfc::complex
