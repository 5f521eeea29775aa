// SPDX-License-Identifier: MIT
// Tests of count_by_omega and PrimeCountTable: the segmented sieve (an independent method) at
// every x <= 10^4, random x <= 10^8 and windows next to powers of two, squares and primes;
// published pi(10^k) and Q(10^k); thread-count invariance; the refusals. The largest arguments
// are in test_omega_counting_slow.cpp.
#include "sqfc/arith/omega_counting.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <utility>
#include <vector>

#include "arith/omega_counting_test_support.hpp"
#include "oracles/published_csv.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/base_primes.hpp"
#include "sqfc/arith/prime_counting.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::count_by_omega;
using sqfc::arith::PrimeCountTable;
using sqfc::testing::OmegaHistogram;
using sqfc::testing::same_counts;

TEST(PrimeCountTable, EveryQuotientAgainstTheSieveOfEratosthenes) {
  // pi(floor(x/j)) for every j and pi(v) for every v <= sqrt(x), against prefix counts of
  // primes_up_to (an independent sieve): every x <= 3000, then a few larger x.
  std::vector<Natural> xs;
  for (Natural x = 1; x <= 3000; ++x) xs.push_back(x);
  for (const Natural x : {Natural{65535}, Natural{65536}, Natural{65537}, Natural{1'000'000}, Natural{999'983},
                          Natural{1'018'081} /* 1009^2 */, Natural{1'018'080}, Natural{1 << 20}})
    xs.push_back(x);
  std::uint64_t checked = 0;
  for (const Natural x : xs) {
    const auto primes = sqfc::arith::primes_up_to(x);
    auto pi = [&](Natural v) {
      return static_cast<Natural>(std::upper_bound(primes.begin(), primes.end(), v) - primes.begin());
    };
    const PrimeCountTable table(x, x % 2 ? 1 : 2);
    ASSERT_EQ(table.x(), x);
    for (Natural j = 1; j <= x + 1; ++j) {
      ASSERT_EQ(table.pi_of_quotient(j), pi(x / j)) << "x = " << x << ", j = " << j;
      // Quotients repeat: jump to the last j with the same floor(x/j).
      if (j <= x) j = x / (x / j);
      ++checked;
    }
    for (Natural v = 0; v <= table.sqrt_x(); ++v) ASSERT_EQ(table.pi_small(v), pi(v)) << "x = " << x << ", v = " << v;
    ASSERT_EQ(table.primes().size(), pi(table.sqrt_x()));
  }
  EXPECT_EQ(xs.size(), 3008U);
  EXPECT_GT(checked, 200000U);
}

TEST(PrimeCountTable, PublishedPrimeCountsAtPowersOfTen) {
  // pi(10^k) for k <= 10 (tests/data/prime_counts_powers_of_ten.csv: OEIS A006880); larger k
  // in the slow file.
  const auto published = sqfc::oracles::read_published_csv(sqfc::testing::omega_data_path("prime_counts_powers_of_ten.csv"));
  int checked = 0;
  Natural x = 1;
  for (std::size_t row = 0; row < published.rows.size() && published.integer(row, "k") <= 10; ++row, x *= 10) {
    ASSERT_EQ(published.integer(row, "k"), static_cast<std::int64_t>(row));
    EXPECT_EQ(sqfc::arith::prime_count(x, 2), static_cast<Natural>(published.integer(row, "value"))) << "10^" << row;
    ++checked;
  }
  EXPECT_EQ(checked, 11);
}

TEST(PrimeCountTable, RefusesArgumentsOutsideTheVerifiedRange) {
  EXPECT_THROW(PrimeCountTable(0, 1), sqfc::InvalidArgument);
  EXPECT_THROW(PrimeCountTable(sqfc::arith::max_prime_count_x + 1, 1), sqfc::InvalidArgument);
  EXPECT_THROW(PrimeCountTable(~Natural{0}, 1), sqfc::InvalidArgument);
  EXPECT_THROW(PrimeCountTable(100, 0), sqfc::InvalidArgument);
  EXPECT_EQ(sqfc::arith::prime_count(1), 0U);
  EXPECT_EQ(sqfc::arith::prime_count(2), 1U);
}

TEST(OmegaCounting, EveryXUpTo10To4AgainstTheSieve) {
  constexpr Natural top = 10'000;
  OmegaHistogram running;
  std::uint64_t checked = 0;
  sqfc::arith::sieve_range(1, top + 1, [&](const sqfc::arith::SieveBlock& b) {
    for (std::size_t i = 0; i < b.size(); ++i) {
      const Natural x = b.lo() + i;
      if (b.is_squarefree(i)) running.add(x, b.omega(i));
      ASSERT_TRUE(same_counts(count_by_omega(x, static_cast<unsigned>(1 + x % 3)), running)) << "x = " << x;
      ++checked;
    }
  });
  EXPECT_EQ(checked, top);
}

TEST(OmegaCounting, RandomXUpTo10To7AgainstTheSieve) {
  // One sieve pass over [1, 10^7] collects the histogram at 40 random x (plus 10^7 itself);
  // the same to 10^8 is in the slow file.
  constexpr Natural top = 10'000'000;
  auto rng = sqfc::testing::test_rng(3001);
  std::uniform_int_distribution<Natural> pick(1, top);
  std::vector<Natural> xs;
  for (std::uint64_t i = 0; i < 40 * sqfc::testing::test_multiplier(); ++i) xs.push_back(pick(rng));
  xs.push_back(top);
  std::sort(xs.begin(), xs.end());
  xs.erase(std::unique(xs.begin(), xs.end()), xs.end());
  std::vector<OmegaHistogram> expected;
  OmegaHistogram running;
  std::size_t next = 0;
  sqfc::arith::sieve_range(1, top + 1, [&](const sqfc::arith::SieveBlock& b) {
    for (std::size_t i = 0; i < b.size(); ++i) {
      const Natural n = b.lo() + i;
      if (b.is_squarefree(i)) running.add(n, b.omega(i));
      while (next < xs.size() && xs[next] == n) expected.push_back(running), ++next;
    }
  });
  ASSERT_EQ(expected.size(), xs.size());
  for (std::size_t i = 0; i < xs.size(); ++i)
    EXPECT_TRUE(same_counts(count_by_omega(xs[i], 2), expected[i])) << "x = " << xs[i] << " " << sqfc::testing::seed_note();
  EXPECT_GE(xs.size(), 35U);
}

TEST(OmegaCounting, WindowsNextToPowersOfTwoSquaresAndPrimes) {
  // count_by_omega(b) = count_by_omega(a) + the sieve's histogram of (a, b]. Larger windows
  // (2^32, 2^40, 65521^2, 99991^2, 10^10 + 19, 10^13) are in the slow file.
  int checked = 0;
  // Powers of two: 2^24 and 2^30, one below and one above each.
  for (const int k : {24, 30}) {
    const Natural t = Natural{1} << k;
    checked += sqfc::testing::check_window(t - 500, {t - 1, t, t + 1}, 2);
  }
  // Squares, where floor(sqrt x) moves: 4093^2 and 32749^2 (the largest primes below 2^12 and
  // 2^15, from memory) and 30000^2 (a composite's square), with neighbours.
  for (const Natural q : {Natural{4093}, Natural{32749}, Natural{30000}})
    checked += sqfc::testing::check_window(q * q - 300, {q * q - 1, q * q, q * q + 1, q * q + q}, 2);
  // Primes: 2^31 - 1 (a Mersenne prime, from memory; the window sieve confirms omega = 1).
  const Natural mersenne = (Natural{1} << 31) - 1;
  checked += sqfc::testing::check_window(mersenne - 200, {mersenne - 1, mersenne, mersenne + 1}, 1);
  EXPECT_EQ(checked, 6 + 12 + 3);
  const auto at_mersenne = sqfc::testing::sieved_histogram(mersenne, mersenne + 1);
  EXPECT_EQ(at_mersenne.all[1], 1U);
}

TEST(OmegaCounting, SumsArePublishedSquarefreeCounts) {
  // sum over m = Q(10^k), k <= 9 (tests/data/squarefree_powers_of_ten.csv: OEIS A071172), and
  // the m = 1 entry is pi(10^k) (tests/data/prime_counts_powers_of_ten.csv: OEIS A006880).
  // Larger k are in the slow file.
  const auto q = sqfc::oracles::read_published_csv(sqfc::testing::omega_data_path("squarefree_powers_of_ten.csv"));
  const auto pi = sqfc::oracles::read_published_csv(sqfc::testing::omega_data_path("prime_counts_powers_of_ten.csv"));
  int checked = 0;
  Natural x = 1;
  for (std::size_t row = 0; row <= 9; ++row, x *= 10) {
    const auto c = count_by_omega(x, 2);
    ASSERT_EQ(q.integer(row, "k"), static_cast<std::int64_t>(row));
    EXPECT_EQ(sqfc::testing::total_squarefree(c), static_cast<Natural>(q.integer(row, "value"))) << "10^" << row;
    EXPECT_EQ(sqfc::testing::entry(c.squarefree_by_omega, 1), static_cast<Natural>(pi.integer(row, "value"))) << "10^" << row;
    EXPECT_EQ(c.squarefree_by_omega[0], 1U);
    EXPECT_EQ(c.odd_squarefree_by_omega[0], 1U);
    ++checked;
  }
  EXPECT_EQ(checked, 10);
}

TEST(OmegaCounting, LengthFollowsThePrimorials) {
  // 2*3*5 = 30 and 2*3*5*...*23*29 = 6469693230 (primorials, OEIS A002110, from memory); the
  // primorial of 31 is in the slow file.
  EXPECT_EQ(count_by_omega(1, 1).squarefree_by_omega.size(), 1U);
  EXPECT_EQ(count_by_omega(2, 1).squarefree_by_omega.size(), 2U);
  EXPECT_EQ(count_by_omega(29, 1).squarefree_by_omega.size(), 3U);
  EXPECT_EQ(count_by_omega(30, 1).squarefree_by_omega.size(), 4U);
  EXPECT_EQ(count_by_omega(30, 1).squarefree_by_omega.back(), 1U);
  EXPECT_EQ(count_by_omega(30, 1).odd_squarefree_by_omega.back(), 0U);
  const auto below = count_by_omega(6469693229ULL, 2);
  const auto at = count_by_omega(6469693230ULL, 2);
  EXPECT_EQ(below.squarefree_by_omega.size(), 10U);
  EXPECT_EQ(at.squarefree_by_omega.size(), 11U);
  EXPECT_EQ(at.squarefree_by_omega.back(), 1U);
  EXPECT_EQ(at.odd_squarefree_by_omega.size(), 11U);
  EXPECT_EQ(at.odd_squarefree_by_omega.back(), 0U);
}

TEST(OmegaCounting, SameAnswerForEveryThreadCount) {
  int checked = 0;
  for (const Natural x : {Natural{100'000'007}, Natural{1'234'567'891ULL}}) {
    const auto one = count_by_omega(x, 1);
    for (const unsigned threads : {2U, 3U, 7U}) {
      const auto many = count_by_omega(x, threads);
      EXPECT_EQ(many.squarefree_by_omega, one.squarefree_by_omega) << x << " threads " << threads;
      EXPECT_EQ(many.odd_squarefree_by_omega, one.odd_squarefree_by_omega) << x << " threads " << threads;
      ++checked;
    }
  }
  EXPECT_EQ(checked, 6);
}

TEST(OmegaCounting, OddUpperHalfAgainstTheSieve) {
  // #{odd squarefree k in (x/2, x] : omega(k) = m}, the reduced Betti numbers shifted by one,
  // against the sieve's histogram of (x/2, x]: every x <= 3000 from prefix histograms of one
  // sieve pass, and a few larger x from a sieve of the interval itself.
  constexpr Natural top = 3000;
  std::vector<OmegaHistogram> prefix(1);
  sqfc::arith::sieve_range(1, top + 1, [&](const sqfc::arith::SieveBlock& b) {
    for (std::size_t i = 0; i < b.size(); ++i) {
      prefix.push_back(prefix.back());
      if (b.is_squarefree(i)) prefix.back().add(b.lo() + i, b.omega(i));
    }
  });
  ASSERT_EQ(prefix.size(), top + 1);
  int checked = 0;
  for (Natural x = 1; x <= top; ++x) {
    const auto upper = sqfc::arith::odd_upper_half_by_omega(count_by_omega(x, 1));
    for (std::size_t m = 0; m < prefix[x].odd.size(); ++m)
      ASSERT_EQ(sqfc::testing::entry(upper, m), prefix[x].odd[m] - prefix[x / 2].odd[m]) << "x = " << x << ", omega " << m;
    ++checked;
  }
  for (const Natural x : {Natural{1'000'001}, Natural{33'554'432}, Natural{33'554'433}}) {
    const auto h = sqfc::testing::sieved_histogram(x / 2 + 1, x + 1);
    const auto upper = sqfc::arith::odd_upper_half_by_omega(count_by_omega(x, 2));
    for (std::size_t m = 0; m < h.odd.size(); ++m)
      ASSERT_EQ(sqfc::testing::entry(upper, m), h.odd[m]) << "x = " << x << ", omega " << m;
    ++checked;
  }
  EXPECT_EQ(checked, 3003);
}

TEST(OmegaCounting, ProgressIsMonotoneEndsAtTheTotalAndMayStopTheCount) {
  const Natural x = 500'000'000;
  for (const unsigned threads : {1U, 2U}) {
    std::vector<std::pair<Natural, Natural>> calls;
    const auto with = count_by_omega(x, threads, [&](Natural done, Natural total) { calls.emplace_back(done, total); });
    const auto without = count_by_omega(x, threads);
    EXPECT_EQ(with.squarefree_by_omega, without.squarefree_by_omega);
    EXPECT_EQ(with.odd_squarefree_by_omega, without.odd_squarefree_by_omega);
    ASSERT_GE(calls.size(), 10U) << threads;
    for (std::size_t i = 0; i < calls.size(); ++i) {
      EXPECT_EQ(calls[i].second, 1000U);
      if (i > 0) {
        EXPECT_GT(calls[i].first, calls[i - 1].first) << "call " << i;
      }
    }
    EXPECT_EQ(calls.back().first, 1000U);
    // A callback that throws stops the count; the exception comes out as it was thrown.
    int seen = 0;
    EXPECT_THROW(count_by_omega(x, threads,
                                [&](Natural done, Natural) {
                                  if (done > 700 && ++seen == 1) throw sqfc::IoError("stop");
                                }),
                 sqfc::IoError);
    EXPECT_EQ(seen, 1);
  }
  // The table alone reports entries done of entries in all rounds, ending at the total.
  std::vector<std::pair<Natural, Natural>> table_calls;
  const PrimeCountTable table(x, 1, [&](Natural done, Natural total) { table_calls.emplace_back(done, total); });
  ASSERT_FALSE(table_calls.empty());
  EXPECT_EQ(table_calls.back().first, table_calls.back().second);
  EXPECT_LE(table_calls.size(), 1100U);
}

TEST(OmegaCounting, RefusesArgumentsOutsideTheVerifiedRange) {
  EXPECT_THROW(count_by_omega(0, 1), sqfc::InvalidArgument);
  EXPECT_THROW(count_by_omega(sqfc::arith::max_omega_counting_x + 1, 2), sqfc::InvalidArgument);
  EXPECT_THROW(count_by_omega(~Natural{0}, 2), sqfc::InvalidArgument);
  EXPECT_THROW(count_by_omega(1000, 0), sqfc::InvalidArgument);
  try {
    count_by_omega(sqfc::arith::max_omega_counting_x + 1, 1);
    ADD_FAILURE() << "no exception";
  } catch (const sqfc::InvalidArgument& e) {
    EXPECT_NE(std::string(e.what()).find("10^14"), std::string::npos) << e.what();
    EXPECT_EQ(e.exit_code(), 2);
  }
}

}  // namespace
