// SPDX-License-Identifier: MIT
// Closed-form Green values of the shared-factor graph.
#include "sqfc/linalg/green_closed_form.hpp"

#include <numeric>
#include <string>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::linalg {
namespace {

// sum over t | l^infinity with t <= y of M(floor(y / t)), by depth-first search over the
// primes of l (index `from` on) and their powers.
std::int64_t smooth_sum(const std::vector<std::int32_t>& mertens, const std::uint32_t* primes, std::size_t count,
                        std::size_t from, Natural y) {
  std::int64_t total = mertens[y];
  for (std::size_t i = from; i < count; ++i) {
    const Natural p = primes[i];
    for (Natural z = y / p; z > 0; z /= p) total += smooth_sum(mertens, primes, count, i + 1, z);
  }
  return total;
}

// sum over t | d^infinity with t <= y of lambda(t) Q(floor(y / t)): the squarefree t' <= y
// coprime to d (the Dirichlet series prod_{p | d} 1/(1 + p^-s) times zeta(s)/zeta(2s)).
std::int64_t coprime_squarefree(const std::vector<std::uint32_t>& squarefree, const std::uint32_t* primes,
                                std::size_t count, std::size_t from, Natural y, int sign) {
  std::int64_t total = sign * static_cast<std::int64_t>(squarefree[y]);
  for (std::size_t i = from; i < count; ++i) {
    const Natural p = primes[i];
    int power_sign = -sign;
    for (Natural z = y / p; z > 0; z /= p, power_sign = -power_sign)
      total += coprime_squarefree(squarefree, primes, count, i + 1, z, power_sign);
  }
  return total;
}

}  // namespace

GreenClosedForm::GreenClosedForm(Natural n) : n_(n) {
  if (n < 1 || n > 200'000'000ULL)
    throw InvalidArgument("closed-form Green tables are limited to 1 <= n <= 2*10^8, got " + std::to_string(n));
  mertens_.assign(n + 1, 0);
  smallest_prime_.assign(n + 1, 0);
  squarefree_.assign(n + 1, 0);
  std::int64_t running = 0;
  std::uint32_t count = 0;
  arith::sieve_range(1, n + 1, [&](const arith::SieveBlock& block) {
    for (std::size_t i = 0; i < block.size(); ++i) {
      running += block.mu(i);
      count += block.is_squarefree(i) ? 1 : 0;
      mertens_[block.lo() + i] = static_cast<std::int32_t>(running);
      squarefree_[block.lo() + i] = count;
    }
  });
  // Smallest prime factors: primes p <= sqrt(n) mark their multiples; the rest are prime.
  for (const auto p : arith::primes_up_to(integer_sqrt(n)))
    for (Natural m = p; m <= n; m += p)
      if (smallest_prime_[m] == 0) smallest_prime_[m] = p;
  for (Natural k = 2; k <= n; ++k)
    if (smallest_prime_[k] == 0) smallest_prime_[k] = static_cast<std::uint32_t>(k);
}

std::vector<std::uint32_t> GreenClosedForm::prime_factors(Natural k) const {
  std::vector<std::uint32_t> primes;
  while (k > 1) {
    const auto p = smallest_prime_[k];
    primes.push_back(p);
    while (k % p == 0) k /= p;
  }
  return primes;
}

std::int64_t GreenClosedForm::mertens_coprime(Natural l, Natural y) const {
  std::uint32_t primes[16];
  std::size_t count = 0;
  for (Natural k = l; k > 1; k /= smallest_prime_[k]) primes[count++] = smallest_prime_[k];
  return smooth_sum(mertens_, primes, count, 0, y);
}

std::int64_t GreenClosedForm::entry_at(Natural m, Natural x, Natural y) const {
  if (m > n_) throw InvalidArgument("Green entries at n = " + std::to_string(m) + " need tables beyond " + std::to_string(n_));
  if (x < 2 || y < 2 || x > m || y > m || mu(x) == 0 || mu(y) == 0)
    throw InvalidArgument("Green entries need squarefree x, y in [2, " + std::to_string(m) + "]");
  const Natural l = x / std::gcd(x, y) * y;  // x, y <= 2*10^8, so l < 2^63
  if (l > m) return 0;
  return -static_cast<std::int64_t>(mu(x) * mu(y) * mu(l)) * mertens_coprime(l, m / l);
}

GreenStatistics GreenClosedForm::statistics_at(Natural m) const {
  if (m < 1 || m > n_) throw InvalidArgument("Green statistics at n = " + std::to_string(m) + " need tables up to it");
  GreenStatistics stats;
  stats.n = m;
  Count nonzero = 0;
  std::uint32_t primes[16];
  for (Natural l = 2; l <= m; ++l) {
    if (mu(l) == 0) continue;
    ++stats.vertices;
    std::size_t w = 0;
    for (Natural k = l; k > 1; k /= smallest_prime_[k]) primes[w++] = smallest_prime_[k];
    const std::int64_t v = smooth_sum(mertens_, primes, w, 0, m / l);
    // Ordered pairs (X, Y) of nonempty prime sets with union L, by parity of |X ∩ Y|:
    // sum_i C(w,i) 2^(w-i) = 3^w and sum_i (-1)^i C(w,i) 2^(w-i) = 1, less the 2 pairs with
    // X or Y empty (i = 0, even).
    Count three_w = 1;
    for (std::size_t i = 0; i < w; ++i) three_w *= 3;
    const Count even = (three_w + 1) / 2 - 2, odd = (three_w - 1) / 2;
    if (even) stats.histogram[-v] += even;
    if (odd) stats.histogram[v] += odd;
    nonzero += even + odd;
    stats.energy += static_cast<Wide>(v) * static_cast<Wide>(odd) - static_cast<Wide>(v) * static_cast<Wide>(even);
    // Diagonal: x = y = l, |X ∩ Y| = w.
    ++stats.diagonal_histogram[(w % 2 == 0) ? -v : v];
  }
  const Count total = stats.vertices * stats.vertices;
  if (total > nonzero) stats.histogram[0] += total - nonzero;
  return stats;
}

Count GreenClosedForm::shared_factor_edges_at(Natural m) const {
  if (m > n_) throw InvalidArgument("edge count at n = " + std::to_string(m) + " needs tables up to it");
  Wide total = 0;
  std::uint32_t primes[16];
  for (Natural d = 2; d <= m / 2; ++d) {
    if (mu(d) == 0) continue;
    std::size_t w = 0;
    for (Natural k = d; k > 1; k /= smallest_prime_[k]) primes[w++] = smallest_prime_[k];
    const auto s = static_cast<Wide>(coprime_squarefree(squarefree_, primes, w, 0, m / d, 1));
    total += -static_cast<Wide>(mu(d)) * s * (s - 1) / 2;
  }
  return static_cast<Count>(total);
}

}  // namespace sqfc::linalg
