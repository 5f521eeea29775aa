// SPDX-License-Identifier: MIT
// Tests of SquarefreeCounter and face_neighbourhood: Q(y) and coprime squarefree counts against
// direct counting and published values; cofaces and degrees in G_N and H_N against brute-force
// enumeration for every K <= 300 at sample N <= 3000, and the degree sum against the edge count.
#include "sqfc/complex/face_neighbourhood.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <numeric>
#include <vector>

#include "oracles/test_support.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::complex::face_neighbourhood;
using sqfc::complex::SquarefreeCounter;

// Squarefree by trial division over d^2 <= n (independent of the library's sieve).
bool is_squarefree_naive(std::uint64_t n) {
  for (std::uint64_t d = 2; d * d <= n; ++d)
    if (n % (d * d) == 0) return false;
  return true;
}

std::vector<std::uint64_t> distinct_primes_naive(std::uint64_t n) {
  std::vector<std::uint64_t> p;
  for (std::uint64_t d = 2; d * d <= n; ++d)
    if (n % d == 0) {
      p.push_back(d);
      while (n % d == 0) n /= d;
    }
  if (n > 1) p.push_back(n);
  return p;
}

TEST(SquarefreeCounter, TableValuesMatchTrialDivision) {
  const SquarefreeCounter counter(3000);
  std::uint64_t q = 0, checked = 0;
  EXPECT_EQ(counter.squarefree_count(0), 0U);
  for (std::uint64_t y = 1; y <= 3000; ++y, ++checked) {
    q += is_squarefree_naive(y) ? 1 : 0;
    ASSERT_EQ(counter.squarefree_count(y), q) << "y = " << y;
  }
  EXPECT_EQ(checked, 3000U);
  EXPECT_THROW((void)counter.squarefree_count(3001), sqfc::InvalidArgument);
}

TEST(SquarefreeCounter, FormulaPastTheTableMatchesDirectCounting) {
  const SquarefreeCounter counter(std::uint64_t{1} << 22);
  ASSERT_EQ(counter.table_limit(), std::uint64_t{1} << 20);
  std::uint64_t q = counter.squarefree_count(counter.table_limit()), checked = 0;
  for (std::uint64_t y = counter.table_limit() + 1; y <= counter.table_limit() + 600; ++y, ++checked) {
    q += is_squarefree_naive(y) ? 1 : 0;
    ASSERT_EQ(counter.squarefree_count(y), q) << "y = " << y;
  }
  EXPECT_EQ(checked, 600U);
}

TEST(SquarefreeCounter, PublishedPowersOfTen) {
  // Q(10^k), OEIS A071172 (from memory; the same values as tests/data/squarefree_powers_of_ten.csv).
  const SquarefreeCounter counter(1'000'000'000ULL);
  const std::vector<std::pair<std::uint64_t, std::uint64_t>> published = {
      {10, 7}, {1000, 608}, {1'000'000, 607926}, {10'000'000, 6079291}, {100'000'000, 60792694}, {1'000'000'000, 607927124}};
  for (const auto& [y, q] : published) EXPECT_EQ(counter.squarefree_count(y), q) << "y = " << y;
  EXPECT_EQ(published.size(), 6U);
}

TEST(SquarefreeCounter, CoprimeCountsMatchASieveBeyondTheTable) {
  // Squarefree flags up to 2^20 + 2^18 by crossing out multiples of d^2 (a different method from the
  // library's segmented sieve), then the counts coprime to a few prime sets, table and formula.
  const std::uint64_t y_max = (std::uint64_t{1} << 20) + (std::uint64_t{1} << 18);
  std::vector<bool> squarefree(y_max + 1, true);
  for (std::uint64_t d = 2; d * d <= y_max; ++d)
    for (std::uint64_t m = d * d; m <= y_max; m += d * d) squarefree[m] = false;
  const SquarefreeCounter counter(y_max);
  const std::vector<std::vector<std::uint64_t>> prime_sets = {{}, {2}, {97}, {2, 3, 5}, {2, 3, 5, 7, 11}, {3, 1009}};
  const std::vector<std::uint64_t> ys = {0, 1, 2, 30, 1000, (1U << 20) - 1, (1U << 20) + 1, 1'200'001, y_max};
  std::size_t checked = 0;
  for (const auto& primes : prime_sets) {
    const std::uint64_t product = std::accumulate(primes.begin(), primes.end(), std::uint64_t{1}, std::multiplies<>());
    std::vector<bool> coprime(y_max + 1, true);
    for (const auto p : primes)
      for (std::uint64_t m = p; m <= y_max; m += p) coprime[m] = false;
    std::vector<std::uint32_t> running(y_max + 1, 0);
    for (std::uint64_t t = 1; t <= y_max; ++t) running[t] = running[t - 1] + ((squarefree[t] && coprime[t]) ? 1 : 0);
    for (const auto y : ys) {
      EXPECT_EQ(counter.count_coprime_squarefree(primes, y), running[y]) << "P = " << product << ", y = " << y;
      ++checked;
    }
  }
  EXPECT_EQ(checked, prime_sets.size() * ys.size());
}

// Brute-force neighbourhood of k in K_n: every j in [2, n] is looked at (n <= 3000).
sqfc::complex::FaceNeighbourhood neighbourhood_naive(std::uint64_t k, std::uint64_t n) {
  static const std::vector<bool> table = [] {
    std::vector<bool> t(3001);
    for (std::uint64_t j = 1; j <= 3000; ++j) t[j] = is_squarefree_naive(j);
    return t;
  }();
  const auto is_squarefree_naive = [](std::uint64_t j) { return static_cast<bool>(table.at(j)); };
  sqfc::complex::FaceNeighbourhood r;
  r.k = k;
  r.n = n;
  for (std::uint64_t j = 2; j <= n; ++j) r.vertices += is_squarefree_naive(j) ? 1 : 0;
  if (k < 2 || k > n || !is_squarefree_naive(k)) return r;
  r.is_face = true;
  for (std::uint64_t d = 2; d < k; ++d)
    if (k % d == 0) ++r.divisibility_degree;  // every divisor of a squarefree k is squarefree
  for (std::uint64_t j = 2; j <= n; ++j) {
    if (j == k || !is_squarefree_naive(j)) continue;
    if (j % k == 0) ++r.cofaces, ++r.divisibility_degree;
    if (std::gcd(j, k) > 1) ++r.shared_factor_degree;
  }
  return r;
}

TEST(FaceNeighbourhood, MatchesEnumerationForEveryKUpTo300) {
  const std::vector<std::uint64_t> ns = {1, 2, 3, 6, 29, 30, 31, 105, 210, 299, 300, 301, 1000, 2310, 2999, 3000};
  const SquarefreeCounter counter(3000);
  std::size_t checked = 0, faces = 0;
  for (const auto n : ns)
    for (std::uint64_t k = 1; k <= 300; ++k) {
      const auto got = face_neighbourhood(counter, k, n);
      const auto want = neighbourhood_naive(k, n);
      ASSERT_EQ(got.is_face, want.is_face) << "k = " << k << ", n = " << n;
      ASSERT_EQ(got.vertices, want.vertices) << "k = " << k << ", n = " << n;
      ASSERT_EQ(got.cofaces, want.cofaces) << "k = " << k << ", n = " << n;
      ASSERT_EQ(got.divisibility_degree, want.divisibility_degree) << "k = " << k << ", n = " << n;
      ASSERT_EQ(got.shared_factor_degree, want.shared_factor_degree) << "k = " << k << ", n = " << n;
      ++checked;
      faces += got.is_face ? 1 : 0;
    }
  EXPECT_EQ(checked, ns.size() * 300);
  EXPECT_EQ(faces, 1527U);  // sum over the ns of Q(min(n, 300)) - 1, hand-computed (direct count)
}

TEST(FaceNeighbourhood, DegreeSumsAreTwiceTheEdgeCounts) {
  // Sum of H-degrees = 2 edges(H_n) (library pair count, and pairs by gcd here); sum of
  // G-degrees = 2 sum (2^omega - 2) (design.md identity 8).
  const std::vector<std::uint64_t> ns = {2, 30, 210, 1000, 3000};
  const SquarefreeCounter counter(3000);
  std::size_t checked = 0;
  for (const auto n : ns) {
    const auto vertices = sqfc::complex::squarefree_vertices(n);
    std::uint64_t h_sum = 0, g_sum = 0, g_edges = 0, h_pairs = 0;
    for (const auto k : vertices) {
      const auto r = face_neighbourhood(counter, k, n);
      h_sum += r.shared_factor_degree;
      g_sum += r.divisibility_degree;
      g_edges += (std::uint64_t{1} << distinct_primes_naive(k).size()) - 2;
    }
    for (std::size_t i = 0; i < vertices.size(); ++i)
      for (std::size_t j = i + 1; j < vertices.size(); ++j) h_pairs += std::gcd(vertices[i], vertices[j]) > 1 ? 1 : 0;
    EXPECT_EQ(h_sum, 2 * h_pairs) << "n = " << n;
    EXPECT_EQ(h_sum, 2 * sqfc::complex::count_shared_factor_edges(vertices, vertices.size())) << "n = " << n;
    EXPECT_EQ(g_sum, 2 * g_edges) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, ns.size());
}

TEST(FaceNeighbourhood, LargeNConsistency) {
  // At n = 10^10 (the limit): for a prime p, the faces sharing a prime with p are exactly its
  // cofaces; the odd and even squarefree numbers up to n add up to Q(n).
  const std::uint64_t n = sqfc::complex::max_neighbourhood_n;
  const SquarefreeCounter counter(n);
  std::size_t checked = 0;
  for (const std::uint64_t p : {2ULL, 3ULL, 101ULL, 99991ULL, 9999999967ULL}) {
    ASSERT_EQ(distinct_primes_naive(p), std::vector<std::uint64_t>{p}) << p << " is not prime";
    const auto r = face_neighbourhood(counter, p, n);
    EXPECT_TRUE(r.is_face);
    EXPECT_EQ(r.shared_factor_degree, r.cofaces) << "p = " << p;
    EXPECT_EQ(r.divisibility_degree, r.cofaces) << "p = " << p;
    ++checked;
  }
  const auto odd = counter.count_coprime_squarefree({2}, n), odd_half = counter.count_coprime_squarefree({2}, n / 2);
  EXPECT_EQ(odd + odd_half, counter.squarefree_count(n));
  // 30 = 2*3*5: cofaces are squarefree m <= n/30 coprime to 30, and H counts j sharing 2, 3 or 5:
  // by inclusion-exclusion over the subsets of {2, 3, 5} of the squarefree multiples of each.
  const auto r = face_neighbourhood(counter, 30, n);
  auto multiples = [&](std::uint64_t d, std::vector<std::uint64_t> primes) { return counter.count_coprime_squarefree(primes, n / d); };
  const std::int64_t inclusion_exclusion = static_cast<std::int64_t>(multiples(2, {2}) + multiples(3, {3}) + multiples(5, {5})) -
                                           static_cast<std::int64_t>(multiples(6, {2, 3}) + multiples(10, {2, 5}) + multiples(15, {3, 5})) +
                                           static_cast<std::int64_t>(multiples(30, {2, 3, 5}));
  EXPECT_EQ(static_cast<std::int64_t>(r.shared_factor_degree) + 1, inclusion_exclusion);
  EXPECT_EQ(checked, 5U);
}

TEST(FaceNeighbourhood, RejectsBadArguments) {
  EXPECT_THROW(face_neighbourhood(30, 0), sqfc::InvalidArgument);
  EXPECT_THROW(face_neighbourhood(30, sqfc::complex::max_neighbourhood_n + 1), sqfc::InvalidArgument);
  EXPECT_THROW(face_neighbourhood(0, 100), sqfc::InvalidArgument);
  const SquarefreeCounter counter(100);
  EXPECT_THROW(face_neighbourhood(counter, 5, 101), sqfc::InvalidArgument);
  EXPECT_THROW(SquarefreeCounter(100'000'000'000'001ULL), sqfc::InvalidArgument);
  // K = 1 (the empty face), a non-squarefree K and K > n are no vertices of K_n.
  EXPECT_FALSE(face_neighbourhood(counter, 1, 100).is_face);
  EXPECT_FALSE(face_neighbourhood(counter, 12, 100).is_face);
  EXPECT_FALSE(face_neighbourhood(counter, 101, 100).is_face);
  EXPECT_EQ(face_neighbourhood(counter, 101, 100).cofaces, 0U);
}

}  // namespace
