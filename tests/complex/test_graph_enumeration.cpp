// SPDX-License-Identifier: MIT
// Tests of the streamed faces and edges of K_N, G_N, H_N and of their counts by identity 8:
// faces and edge sets against trial division and brute-force pair tests for every N <= 150,
// edge counts by formula against enumeration for every N <= 3000, the density of H_N near
// N = 10^4, vertex ranks, batching and the input limits.
#include "sqfc/complex/graph_enumeration.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <numeric>
#include <utility>
#include <vector>

#include "oracles/brute_force.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/linalg/green_closed_form.hpp"

namespace {

using namespace sqfc::complex;
using Pair = std::pair<std::uint64_t, std::uint64_t>;

bool is_squarefree_naive(std::uint64_t n) {
  for (std::uint64_t d = 2; d * d <= n; ++d)
    if (n % (d * d) == 0) return false;
  return true;
}

std::vector<std::uint64_t> primes_naive(std::uint64_t n) {
  std::vector<std::uint64_t> p;
  for (std::uint64_t d = 2; d * d <= n; ++d)
    if (n % d == 0) {
      p.push_back(d);
      while (n % d == 0) n /= d;
    }
  if (n > 1) p.push_back(n);
  return p;
}

std::vector<Pair> collect(void (*enumerate)(sqfc::Natural, const EdgeBatchVisitor&), std::uint64_t n) {
  std::vector<Pair> edges;
  enumerate(n, [&](std::span<const GraphEdge> batch) {
    for (const auto& e : batch) edges.emplace_back(e.a, e.b);
  });
  return edges;
}

// Brute force over all pairs a < b of squarefree integers in [2, n], in the library's order
// (increasing b, then increasing a).
std::vector<Pair> pairs_naive(std::uint64_t n, bool divisibility) {
  std::vector<Pair> edges;
  for (std::uint64_t b = 2; b <= n; ++b) {
    if (!is_squarefree_naive(b)) continue;
    for (std::uint64_t a = 2; a < b; ++a)
      if (is_squarefree_naive(a) && (divisibility ? b % a == 0 : std::gcd(a, b) > 1)) edges.emplace_back(a, b);
  }
  return edges;
}

TEST(GraphEnumeration, FacesMatchTrialDivision) {
  std::uint64_t checked = 0;
  for (std::uint64_t n = 0; n <= 150; ++n) {
    std::vector<std::uint64_t> seen;
    for_each_face(n, [&](const FaceView& f) {
      seen.push_back(f.k);
      EXPECT_EQ(std::vector<std::uint64_t>(f.primes.begin(), f.primes.end()), primes_naive(f.k)) << "k = " << f.k;
      EXPECT_EQ(f.dimension, static_cast<int>(f.primes.size()) - 1);
    });
    std::vector<std::uint64_t> expected;
    for (std::uint64_t k = 2; k <= n; ++k)
      if (is_squarefree_naive(k)) expected.push_back(k);
    ASSERT_EQ(seen, expected) << "n = " << n;
    EXPECT_EQ(count_vertices(n), expected.size()) << "n = " << n;
    checked += expected.size();
  }
  // Sum over n <= 150 of (Q(n) - 1): every face counted once per n it belongs to.
  std::uint64_t expected_checked = 0;
  for (std::uint64_t k = 2; k <= 150; ++k)
    if (is_squarefree_naive(k)) expected_checked += 151 - k;
  EXPECT_EQ(checked, expected_checked);
}

TEST(GraphEnumeration, FacesAcrossFactoringBlocks) {
  // N = 40000 spans three factoring blocks of 2^14; every face re-factored by trial division.
  std::uint64_t faces = 0, previous = 1;
  for_each_face(40000, [&](const FaceView& f) {
    ASSERT_GT(f.k, previous);
    previous = f.k;
    ASSERT_EQ(std::vector<std::uint64_t>(f.primes.begin(), f.primes.end()), primes_naive(f.k));
    ++faces;
  });
  std::uint64_t expected = 0;
  for (std::uint64_t k = 2; k <= 40000; ++k) expected += is_squarefree_naive(k);
  EXPECT_EQ(faces, expected);
  EXPECT_EQ(faces, count_vertices(40000));
}

TEST(GraphEnumeration, EdgeSetsMatchBruteForce) {
  std::uint64_t cases = 0;
  for (std::uint64_t n = 0; n <= 150; ++n) {
    ASSERT_EQ(collect(for_each_divisibility_edge, n), pairs_naive(n, true)) << "G_n, n = " << n;
    ASSERT_EQ(collect(for_each_shared_factor_edge, n), pairs_naive(n, false)) << "H_n, n = " << n;
    ++cases;
  }
  EXPECT_EQ(cases, 151U);
  // Hand-computed: G_10 = {2-6, 3-6, 2-10, 5-10}; H_10 adds 6-10.
  EXPECT_EQ(collect(for_each_divisibility_edge, 10), (std::vector<Pair>{{2, 6}, {3, 6}, {2, 10}, {5, 10}}));
  EXPECT_EQ(collect(for_each_shared_factor_edge, 10), (std::vector<Pair>{{2, 6}, {3, 6}, {2, 10}, {5, 10}, {6, 10}}));
}

TEST(GraphEnumeration, EdgeCountsByFormulaMatchEnumerationUpTo3000) {
  // One enumeration to 3000 in increasing b gives the edge count of every smaller N as a prefix.
  constexpr std::uint64_t top = 3000;
  std::vector<std::uint64_t> g(top + 1, 0), h(top + 1, 0);
  for_each_divisibility_edge(top, [&](std::span<const GraphEdge> batch) {
    for (const auto& e : batch) ++g[e.b];
  });
  for_each_shared_factor_edge(top, [&](std::span<const GraphEdge> batch) {
    for (const auto& e : batch) ++h[e.b];
  });
  const SquarefreeCounter counter(top);
  std::uint64_t cases = 0, g_total = 0, h_total = 0;
  for (std::uint64_t n = 0; n <= top; ++n) {
    g_total += g[n];
    h_total += h[n];
    ASSERT_EQ(count_divisibility_edges(n), g_total) << "G_n, n = " << n;
    ASSERT_EQ(count_shared_factor_edges_formula(counter, n), h_total) << "H_n, n = " << n;
    ++cases;
  }
  EXPECT_EQ(cases, top + 1);
  // The table layer's oracle (tests/oracles: sum of 2^omega - 2 by trial division) agrees at the top.
  EXPECT_EQ(g_total, sqfc::oracles::divisibility_edges_naive(top));
}

TEST(GraphEnumeration, DivisibilityCountOnBothSidesOfTheSievePath) {
  // count_divisibility_edges sums over the factoring pass below 2^16 and over the sieve above;
  // both against enumeration prefixes to 300000.
  const std::vector<std::uint64_t> ns = {65535, 65536, 65537, 100000, 299999, 300000};
  std::vector<std::uint64_t> per_b(300001, 0);
  for_each_divisibility_edge(300000, [&](std::span<const GraphEdge> batch) {
    for (const auto& e : batch) ++per_b[e.b];
  });
  std::uint64_t checked = 0;
  for (const auto n : ns) {
    const auto expected = std::accumulate(per_b.begin(), per_b.begin() + static_cast<std::ptrdiff_t>(n + 1), std::uint64_t{0});
    EXPECT_EQ(count_divisibility_edges(n), expected) << n;
    ++checked;
  }
  EXPECT_EQ(checked, ns.size());
  EXPECT_EQ(ns.size(), 6U);
  // The one-shot overload builds its own counter.
  EXPECT_EQ(count_shared_factor_edges_formula(3000), count_shared_factor_edges_formula(SquarefreeCounter(3000), 3000));
  EXPECT_THROW((void)count_shared_factor_edges_formula(SquarefreeCounter(100), 101), sqfc::InvalidArgument);
}

TEST(GraphEnumeration, SharedFactorCountMatchesGreenClosedForm) {
  // linalg::GreenClosedForm evaluates identity 8 with its own tables (M, spf, Q up to n).
  const sqfc::linalg::GreenClosedForm green(200000);
  const std::vector<std::uint64_t> ns = {4, 97, 1000, 9999, 65536, 123457, 200000};
  for (const auto n : ns) EXPECT_EQ(count_shared_factor_edges_formula(n), green.shared_factor_edges_at(n)) << n;
  EXPECT_EQ(ns.size(), 7U);
}

TEST(GraphEnumeration, SharedFactorGraphIsDenseNearTenToTheFour) {
  // Issue 7: about 22% of vertex pairs share a factor. Hand-computed limit: a pair of random
  // squarefree integers avoids p jointly with probability 1 - 1/(p+1)^2, and the product over
  // p of that is about 0.776, so the density tends to about 0.224.
  const std::uint64_t n = 10000;
  std::uint64_t edges = 0, batches = 0;
  for_each_shared_factor_edge(n, [&](std::span<const GraphEdge> batch) {
    ASSERT_LE(batch.size(), edge_batch_size);
    edges += batch.size();
    ++batches;
  });
  const std::uint64_t v = count_vertices(n);
  EXPECT_EQ(v, 6082U);  // Q(10^4) = 6083 (OEIS A071172)
  const double density = static_cast<double>(edges) / (static_cast<double>(v) * static_cast<double>(v - 1) / 2);
  EXPECT_GT(density, 0.20);
  EXPECT_LT(density, 0.24);
  EXPECT_EQ(edges, count_shared_factor_edges_formula(n));
  // Full batches except the last: no edge is handed over alone.
  EXPECT_EQ(batches, (edges + edge_batch_size - 1) / edge_batch_size);
}

TEST(GraphEnumeration, RankIsPositionAmongSquarefree) {
  const std::uint64_t n = 5000;
  const SquarefreeRank rank(n);
  std::uint64_t position = 0;
  for (std::uint64_t k = 2; k <= n; ++k) {
    ASSERT_EQ(rank.is_squarefree(k), is_squarefree_naive(k)) << k;
    if (is_squarefree_naive(k)) {
      ASSERT_EQ(rank.rank(k), ++position) << k;
    }
  }
  EXPECT_EQ(position, count_vertices(n));
}

TEST(GraphEnumeration, LimitsAreChecked) {
  const EdgeBatchVisitor ignore = [](std::span<const GraphEdge>) {};
  EXPECT_THROW(for_each_face(max_enumeration_n + 1, [](const FaceView&) {}), sqfc::InvalidArgument);
  EXPECT_THROW(for_each_divisibility_edge(max_enumeration_n + 1, ignore), sqfc::InvalidArgument);
  EXPECT_THROW(for_each_shared_factor_edge(max_shared_factor_enumeration_n + 1, ignore), sqfc::InvalidArgument);
  EXPECT_THROW((void)count_divisibility_edges(max_divisibility_count_n + 1), sqfc::InvalidArgument);
  EXPECT_THROW((void)count_shared_factor_edges_formula(max_shared_factor_count_n + 1), sqfc::InvalidArgument);
  EXPECT_THROW((void)count_vertices(100'000'000'000'001ULL), sqfc::InvalidArgument);
  EXPECT_THROW(SquarefreeRank(max_enumeration_n + 1), sqfc::InvalidArgument);
}

}  // namespace
