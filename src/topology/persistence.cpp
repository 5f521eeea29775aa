// SPDX-License-Identifier: MIT
// Column reduction of the boundary matrix of a filtered divisor-closed family, twist order with clearing.
#include "sqfc/topology/persistence.hpp"

#include <algorithm>
#include <numeric>
#include <string>
#include <thread>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/topology/betti_counting.hpp"
#include "apparent_pairs.hpp"

namespace sqfc::topology {
namespace {

struct Entry {
  std::uint32_t face;    // the integer k of the boundary face
  std::uint8_t coefficient;  // in [1, p)
};

// Smallest prime factor of every k <= n (0 for 0 and 1).
std::vector<std::uint32_t> smallest_prime_factors(Natural n) {
  std::vector<std::uint32_t> spf(n + 1, 0);
  for (const auto p : arith::primes_up_to(integer_sqrt(n)))
    for (Natural m = p; m <= n; m += p)
      if (spf[m] == 0) spf[m] = p;
  for (Natural k = 2; k <= n; ++k)
    if (spf[k] == 0) spf[k] = static_cast<std::uint32_t>(k);
  return spf;
}

// The distinct primes of k in increasing order, or an empty count when k is not squarefree.
int squarefree_primes(const std::vector<std::uint32_t>& spf, Natural k, std::uint32_t* primes) {
  int w = 0;
  while (k > 1) {
    const auto p = spf[k];
    k /= p;
    if (k % p == 0) return -1;
    primes[w++] = p;
  }
  return w;
}

}  // namespace

PersistenceResult compute_persistence(Natural n, const FaceFamily& family, unsigned field) {
  return compute_persistence(n, family, field, ReductionOrder::apparent_pairs, 0);
}

PersistenceResult compute_persistence(Natural n, const FaceFamily& family, unsigned field, ReductionOrder order,
                                      unsigned threads) {
  if (n < 1 || n > 200'000'000ULL)
    throw InvalidArgument("homology is limited to 1 <= n <= 2*10^8, got " + std::to_string(n));
  if (field != 2 && field != 3) throw InvalidArgument("homology coefficients must be Z/2 or Z/3");
  if (family.coprime_to && *family.coprime_to == 0) throw InvalidArgument("--coprime-to must be at least 1");
  if (family.max_dimension && *family.max_dimension < 0) throw InvalidArgument("--max-dim must be at least 0");
  if (order == ReductionOrder::apparent_pairs) {
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    if (auto result = detail::persistence_by_apparent_pairs(n, family, field, threads)) return std::move(*result);
    order = ReductionOrder::twist;
  }
  const auto p = static_cast<std::uint8_t>(field);
  const auto spf = smallest_prime_factors(n);

  // Faces by dimension, each list increasing (filtration order within a dimension).
  std::vector<std::vector<std::uint32_t>> faces;
  std::uint32_t primes[16];
  for (Natural k = 2; k <= n; ++k) {
    const int w = squarefree_primes(spf, k, primes);
    if (w <= 0 || !detail::family_accepts(family, k, primes[w - 1], w)) continue;
    if (faces.size() < static_cast<std::size_t>(w)) faces.resize(static_cast<std::size_t>(w));
    faces[static_cast<std::size_t>(w - 1)].push_back(static_cast<std::uint32_t>(k));
  }

  PersistenceResult result;
  result.method = order;
  result.top_dimension = static_cast<int>(faces.size()) - 1;
  for (const auto& list : faces) result.faces_by_dimension.push_back(list.size());

  std::vector<std::uint32_t> pivot_of(n + 1, 0);  // column id + 1 whose pivot is k
  std::vector<bool> cleared(n + 1, false);        // k is the pivot of a column one dimension up
  std::vector<Entry> pool;                        // stored reduced columns, flat
  std::vector<std::uint64_t> pool_start{0};
  std::vector<Entry> column, sum;

  const auto add_scaled = [&](std::size_t id, std::uint8_t factor) {
    // column += factor * stored[id], both sorted by face.
    sum.clear();
    const Entry* a = column.data();
    const Entry* a_end = a + column.size();
    const Entry* b = pool.data() + pool_start[id];
    const Entry* b_end = pool.data() + pool_start[id + 1];
    while (a != a_end || b != b_end) {
      if (b == b_end || (a != a_end && a->face < b->face)) {
        sum.push_back(*a++);
      } else if (a == a_end || b->face < a->face) {
        sum.push_back({b->face, static_cast<std::uint8_t>((b->coefficient * factor) % p)});
        ++b;
      } else {
        const auto c = static_cast<std::uint8_t>((a->coefficient + b->coefficient * factor) % p);
        if (c) sum.push_back({a->face, c});
        ++a, ++b;
      }
    }
    column.swap(sum);
    ++result.column_additions;
  };

  // Reduces the column of face k (dimension d); returns true when it ends nonzero (k is
  // negative and pairs with its pivot).
  const auto reduce = [&](std::uint32_t k, int d) {
    // Boundary: k / p_i with sign (-1)^i, sorted by face (k / p_i decreases with i).
    column.clear();
    if (d > 0) {
      const int w = squarefree_primes(spf, k, primes);
      for (int i = w - 1; i >= 0; --i) {
        const std::uint8_t sign = (i % 2 == 0) ? 1 : static_cast<std::uint8_t>(p - 1);
        column.push_back({static_cast<std::uint32_t>(k / primes[i]), sign});
      }
    }
    // Cancel the pivot against the stored column that owns it, while one does. Each addition
    // removes the current pivot and leaves only smaller faces, so the loop ends after at most as
    // many steps as there are faces below k.
    while (!column.empty()) {
      const Entry low = column.back();
      const std::uint32_t owner = pivot_of[low.face];
      if (owner == 0) break;
      const Entry owner_low = pool[pool_start[owner] - 1];
      // factor = -low / owner_low (mod p); inverses mod 3: 1 -> 1, 2 -> 2.
      const std::uint8_t factor = static_cast<std::uint8_t>((p - (low.coefficient * owner_low.coefficient) % p) % p);
      add_scaled(owner - 1, factor);
    }
    if (column.empty()) return false;
    const std::uint32_t low = column.back().face;
    pool.insert(pool.end(), column.begin(), column.end());
    pool_start.push_back(pool.size());
    pivot_of[low] = static_cast<std::uint32_t>(pool_start.size() - 1);
    cleared[low] = true;
    result.bars.push_back({d - 1, low, k});
    return true;
  };

  if (order == ReductionOrder::twist) {
    for (int d = result.top_dimension; d >= 0; --d) {
      for (const auto k : faces[static_cast<std::size_t>(d)]) {
        if (cleared[k]) {
          ++result.cleared_columns;
          continue;
        }
        // With the dimension above done, a positive face that is not a pivot never dies.
        if (!reduce(k, d)) result.bars.push_back({d, k, 0});
      }
    }
  } else {
    // Filtration order over all dimensions; births are known to be essential only at the end.
    std::vector<std::pair<std::uint32_t, int>> positive;
    std::vector<std::size_t> cursor(faces.size(), 0);
    for (Natural k = 2; k <= n; ++k) {
      const int w = squarefree_primes(spf, k, primes);
      if (w <= 0) continue;
      const auto d = static_cast<std::size_t>(w - 1);
      if (d >= faces.size() || cursor[d] >= faces[d].size() || faces[d][cursor[d]] != k) continue;
      ++cursor[d];
      if (!reduce(static_cast<std::uint32_t>(k), w - 1)) positive.emplace_back(static_cast<std::uint32_t>(k), w - 1);
    }
    for (const auto& [k, d] : positive)
      if (!cleared[k]) result.bars.push_back({d, k, 0});
  }
  std::sort(result.bars.begin(), result.bars.end());
  return result;
}

std::vector<Count> betti_from_bars(const std::vector<Bar>& bars, Natural m, int top_dimension) {
  std::vector<Count> betti(static_cast<std::size_t>(std::max(top_dimension + 1, 1)), 0);
  for (const auto& bar : bars)
    if (bar.birth <= m && (bar.death == 0 || bar.death > m)) ++betti[static_cast<std::size_t>(bar.dimension)];
  return betti;
}

std::optional<Bar> first_bar_not_m_2m(const std::vector<Bar>& bars, Natural n) {
  // codes[k] = omega(k) + 1 for squarefree k, 0 otherwise.
  std::vector<std::uint8_t> codes(n + 1, 0);
  if (n >= 1)
    arith::sieve_range(1, n + 1, [&](const arith::SieveBlock& block) {
      for (std::size_t i = 0; i < block.size(); ++i)
        codes[block.lo() + i] = block.is_squarefree(i) ? static_cast<std::uint8_t>(block.omega(i) + 1) : 0;
    });
  for (const auto& bar : bars) {
    if (bar.death == 0) continue;
    const Natural m = bar.birth;
    const bool ok = m <= n && m % 2 == 1 && codes[m] != 0 && bar.death == 2 * m && bar.dimension == codes[m] - 2;
    if (!ok) return bar;
  }
  return std::nullopt;
}

std::vector<std::vector<Count>> betti_by_formula(const std::vector<Natural>& points, int top_dimension) {
  std::vector<std::vector<Count>> result;
  if (points.empty()) return result;
  for (std::size_t i = 0; i < points.size(); ++i)
    if (points[i] < 1 || points[i] > 200'000'000ULL || (i > 0 && points[i] <= points[i - 1]))
      throw InvalidArgument("formula Betti numbers need increasing points in [1, 2*10^8]");
  OddIntervalCounts counts{};
  std::size_t next = 0;
  arith::sieve_range(1, points.back() + 1, [&](const arith::SieveBlock& block) {
    for (std::size_t i = 0; i < block.size() && next < points.size(); ++i) {
      const Natural m = block.lo() + i;
      advance_interval_counts(counts, m, block.omega(i), block.is_squarefree(i));
      if (m != points[next]) continue;
      std::vector<Count> betti(static_cast<std::size_t>(std::max(top_dimension + 1, 1)), 0);
      for (int d = 0; d < static_cast<int>(betti.size()) && d + 1 < config::omega_slots; ++d)
        betti[static_cast<std::size_t>(d)] = static_cast<Count>(betti_from_interval_counts(counts, d));
      result.push_back(std::move(betti));
      ++next;
    }
  });
  return result;
}

}  // namespace sqfc::topology
