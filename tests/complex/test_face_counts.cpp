// SPDX-License-Identifier: MIT
// Tests of complex/face_counts: primorials, odd primorials, the top face dimension of K_n and
// the divisibility edges a face contributes.
#include "sqfc/complex/face_counts.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <limits>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/published_csv.hpp"
#include "oracles/squarefree_enumeration.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/types.hpp"

namespace {

using sqfc::Natural;
namespace cx = sqfc::complex;
namespace oracles = sqfc::oracles;

std::string data_path(const char* name) { return std::string(SQFC_TEST_DATA_DIR) + "/" + name; }

// The first 16 primes by the oracle's own sieve of Eratosthenes.
std::vector<std::uint32_t> first_primes(std::size_t count) {
  auto primes = oracles::primes_up_to_naive(100);
  primes.resize(count);
  return primes;
}

TEST(FaceCounts, PrimorialsMatchPublishedValues) {
  // tests/data/primorials.csv: OEIS A002110, m = 0..15.
  const auto table = oracles::read_published_csv(data_path("primorials.csv"));
  const auto primes = first_primes(16);
  std::size_t checked = 0;
  for (std::size_t r = 0; r < table.rows.size(); ++r) {
    const int m = static_cast<int>(table.integer(r, "m"));
    const auto published = static_cast<Natural>(table.integer(r, "value"));
    EXPECT_EQ(cx::primorial(m), published) << "m = " << m << " (" << table.text(r, "source") << ")";
    // The published value must itself be the product of the first m primes (independent check
    // of the table, in 128 bits so that no product can wrap).
    sqfc::WideUnsigned product = 1;
    for (int i = 0; i < m; ++i) product *= primes[static_cast<std::size_t>(i)];
    EXPECT_TRUE(product == published) << "m = " << m;
    ++checked;
  }
  EXPECT_EQ(checked, 16U);
}

TEST(FaceCounts, OddPrimorialsMatchPublishedValues) {
  // tests/data/odd_primorials.csv: OEIS A070826 (a(m+1) = product of the first m odd primes).
  const auto table = oracles::read_published_csv(data_path("odd_primorials.csv"));
  const auto primes = first_primes(16);
  std::size_t checked = 0;
  for (std::size_t r = 0; r < table.rows.size(); ++r) {
    const int m = static_cast<int>(table.integer(r, "m"));
    const auto published = static_cast<Natural>(table.integer(r, "value"));
    EXPECT_EQ(cx::odd_primorial(m), published) << "m = " << m << " (" << table.text(r, "source") << ")";
    sqfc::WideUnsigned product = 1;
    for (int i = 1; i <= m; ++i) product *= primes[static_cast<std::size_t>(i)];
    EXPECT_TRUE(product == published) << "m = " << m;
    ++checked;
  }
  EXPECT_EQ(checked, 15U);
}

TEST(FaceCounts, PrimorialIndexOutsideRangeThrows) {
  int checked = 0;
  for (const int m : {-1, 16, 17, std::numeric_limits<int>::min(), std::numeric_limits<int>::max()}) {
    EXPECT_THROW(static_cast<void>(cx::primorial(m)), sqfc::InvalidArgument) << m;
    ++checked;
  }
  for (const int m : {-1, 15, 16, std::numeric_limits<int>::min(), std::numeric_limits<int>::max()}) {
    EXPECT_THROW(static_cast<void>(cx::odd_primorial(m)), sqfc::InvalidArgument) << m;
    ++checked;
  }
  // The largest accepted indices do not throw and do not wrap (values from the tables above).
  EXPECT_NO_THROW(static_cast<void>(cx::primorial(15)));
  EXPECT_NO_THROW(static_cast<void>(cx::odd_primorial(14)));
  EXPECT_EQ(checked, 10);
}

TEST(FaceCounts, SmallestSquarefreeWithOmegaIsThePrimorial) {
  // The defining property, by trial division: the first k >= 1 that is squarefree with
  // omega(k) = m is primorial(m), for every m whose primorial is below 10^5.
  const Natural limit = 100'000;
  const auto prefix = oracles::prefix_naive(limit);
  std::vector<Natural> first(8, 0);
  for (Natural k = 1; k <= limit; ++k)
    if (prefix.mu[k] != 0 && first[static_cast<std::size_t>(prefix.omega[k])] == 0)
      first[static_cast<std::size_t>(prefix.omega[k])] = k;
  int checked = 0;
  for (int m = 0; m <= 6; ++m) {  // primorial(6) = 30030 <= 10^5 < primorial(7)
    EXPECT_EQ(cx::primorial(m), first[static_cast<std::size_t>(m)]) << m;
    ++checked;
  }
  // Same for odd squarefree k and the odd primorials (odd_primorial(5) = 15015 <= 10^5).
  std::vector<Natural> first_odd(8, 0);
  for (Natural k = 1; k <= limit; k += 2)
    if (prefix.mu[k] != 0 && first_odd[static_cast<std::size_t>(prefix.omega[k])] == 0)
      first_odd[static_cast<std::size_t>(prefix.omega[k])] = k;
  for (int m = 0; m <= 5; ++m) {
    EXPECT_EQ(cx::odd_primorial(m), first_odd[static_cast<std::size_t>(m)]) << m;
    ++checked;
  }
  EXPECT_EQ(checked, 13);
}

TEST(FaceCounts, MaxFaceDimensionAtEveryPrimorialBoundary) {
  int checked = 0;
  EXPECT_EQ(cx::max_face_dimension(0), -1);  // empty complex
  EXPECT_EQ(cx::max_face_dimension(1), -1);  // K_1 is empty
  checked += 2;
  for (int m = 1; m <= 15; ++m) {
    const Natural p = cx::primorial(m);
    EXPECT_EQ(cx::max_face_dimension(p - 1), m - 2) << "n = primorial(" << m << ") - 1";
    EXPECT_EQ(cx::max_face_dimension(p), m - 1) << "n = primorial(" << m << ")";
    EXPECT_EQ(cx::max_face_dimension(p + 1), m - 1) << "n = primorial(" << m << ") + 1";
    checked += 3;
  }
  // The top of the 64-bit range: the 16th primorial (3.3e19) passes 2^64 - 1.
  EXPECT_EQ(cx::max_face_dimension(std::numeric_limits<Natural>::max()), 14);
  ++checked;
  EXPECT_EQ(checked, 48);
}

TEST(FaceCounts, MaxFaceDimensionMatchesEnumerationForEveryN) {
  // Largest omega(k) - 1 over squarefree k in [2, n], by trial division, for every n <= 40000.
  const Natural limit = 40'000;
  const auto prefix = oracles::prefix_naive(limit);
  int top = -1;
  Natural checked = 0;
  for (Natural n = 1; n <= limit; ++n) {
    if (n >= 2 && prefix.mu[n] != 0) top = std::max(top, prefix.omega[n] - 1);
    ASSERT_EQ(cx::max_face_dimension(n), top) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
}

TEST(FaceCounts, DivisibilityEdgesBelowCountsProperDivisors) {
  // For every squarefree k in [2, 5000]: the number of divisors a of k with 2 <= a < k (all
  // squarefree, since k is) equals divisibility_edges_below(omega(k)).
  const Natural limit = 5000;
  const auto prefix = oracles::prefix_naive(limit);
  Natural checked = 0;
  for (Natural k = 2; k <= limit; ++k) {
    if (prefix.mu[k] == 0) continue;
    sqfc::Count divisors = 0;
    for (Natural a = 2; a < k; ++a)
      if (k % a == 0) ++divisors;
    ASSERT_EQ(cx::divisibility_edges_below(prefix.omega[k]), divisors) << "k = " << k;
    ++checked;
  }
  EXPECT_EQ(checked, static_cast<Natural>(prefix.squarefree[limit] - 1));  // all but k = 1
  // Every allowed m: 2^m - 2 subsets of the m primes that are neither empty nor full.
  int values = 0;
  for (int m = 1; m <= 15; ++m) {
    sqfc::Count subsets = 0;
    for (std::uint32_t mask = 1; mask + 1 < (1U << m); ++mask) ++subsets;
    EXPECT_EQ(cx::divisibility_edges_below(m), subsets) << m;
    ++values;
  }
  EXPECT_EQ(values, 15);
  static_assert(cx::divisibility_edges_below(1) == 0, "a vertex has no face below it");
  static_assert(cx::divisibility_edges_below(3) == 6, "a triangle: 3 vertices and 3 edges");
}

}  // namespace
