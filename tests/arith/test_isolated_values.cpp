// SPDX-License-Identifier: MIT
// Tests of the isolated M(x), L(x), Q(x) and Fredholm sign (issue 3): every x <= 3000 against
// trial division with every kind of split, every x <= 2*10^4 and random x <= 2^24 against
// the segmented sieve, arguments next to powers of two, squares and cubes, published values,
// independence from the split and the thread count, M(x) - M(x-1) = mu(x) by factoring, the
// progress callback and the preconditions. Larger ranges are in test_isolated_values_slow.cpp.
#include "sqfc/arith/isolated_values.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <stdexcept>
#include <string>
#include <vector>

#include "arith/isolated_values_test_support.hpp"
#include "oracles/brute_force.hpp"
#include "oracles/published_csv.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/factor.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::IsolatedKernels;
using sqfc::arith::IsolatedOptions;
using sqfc::testing::split_limits;

IsolatedOptions with(Natural limit, unsigned threads = 1) {
  IsolatedOptions o;
  o.sieve_limit = limit;
  o.threads = threads;
  return o;
}

std::string data(const std::string& name) { return std::string(SQFC_TEST_DATA_DIR) + "/" + name; }

// One sieve pass to 2^24 + 1 shared by the tests that compare with the sieve.
const sqfc::testing::SievePrefix& shared_sieve() {
  static const sqfc::testing::SievePrefix prefix((Natural{1} << 24) + 1);
  return prefix;
}

TEST(IsolatedValues, EveryXUpTo3000AgainstTrialDivisionWithEverySplit) {
  const Natural n_max = 3000;
  const auto naive = sqfc::oracles::prefix_naive(n_max);
  std::uint64_t cases = 0;
  int fredholm = 1;  // prod_{2<=k<=x squarefree} -mu(k) (design.md identity 3)
  for (Natural x = 1; x <= n_max; ++x) {
    if (x >= 2 && naive.mu[x] != 0) fredholm *= -naive.mu[x];
    for (const Natural y : split_limits(x)) {
      const auto o = with(y, 1 + static_cast<unsigned>(x % 3));
      ASSERT_EQ(sqfc::arith::mertens_isolated(x, o), naive.mertens[x]) << "x=" << x << " Y=" << y;
      const auto ml = sqfc::arith::mertens_liouville_isolated(x, o);
      ASSERT_EQ(ml.mertens, naive.mertens[x]) << "x=" << x << " Y=" << y;
      ASSERT_EQ(ml.liouville, naive.liouville[x]) << "x=" << x << " Y=" << y;
      ++cases;
    }
    const auto q = sqfc::arith::squarefree_isolated(x);
    ASSERT_EQ(static_cast<std::int64_t>(q), naive.squarefree[x]) << "x=" << x;
    ASSERT_EQ(sqfc::arith::fredholm_from_counts(q, naive.mertens[x]), fredholm) << "x=" << x;
  }
  EXPECT_GE(cases, 3 * n_max);
}

TEST(IsolatedValues, EveryXUpTo20000AgainstTheSieveWithTheSmallestSplit) {
  const Natural n_max = 20000;
  const auto& sieve = shared_sieve();
  std::uint64_t cases = 0;
  for (Natural x = 3001; x <= n_max; ++x) {
    const auto limits = split_limits(x);
    const Natural y = limits.size() > 2 ? limits[2] : 0;  // isqrt(x) + 1 when valid
    const auto ml = sqfc::arith::mertens_liouville_isolated(x, with(y));
    ASSERT_EQ(ml.mertens, sieve.mertens[x]) << "x=" << x << " Y=" << y;
    ASSERT_EQ(ml.liouville, sieve.liouville[x]) << "x=" << x << " Y=" << y;
    ASSERT_EQ(sqfc::arith::squarefree_isolated(x), sieve.squarefree[x]) << "x=" << x;
    ++cases;
  }
  EXPECT_EQ(cases, n_max - 3000);
}

TEST(IsolatedValues, RandomXUpTo2To24AgainstTheSieve) {
  const Natural n_max = Natural{1} << 24;
  const auto& sieve = shared_sieve();
  auto rng = sqfc::testing::test_rng(3);
  std::uniform_int_distribution<Natural> pick(1, n_max);
  const std::uint64_t rounds = 40 * sqfc::testing::test_multiplier();
  std::uint64_t cases = 0;
  for (std::uint64_t i = 0; i < rounds; ++i) {
    const Natural x = pick(rng);
    const auto limits = split_limits(x);
    const Natural y = limits[static_cast<std::size_t>(rng() % limits.size())];
    const auto o = with(y, 1 + static_cast<unsigned>(rng() % 3));
    const auto ml = sqfc::arith::mertens_liouville_isolated(x, o);
    ASSERT_EQ(ml.mertens, sieve.mertens[x]) << "x=" << x << " Y=" << y << " " << sqfc::testing::seed_note();
    ASSERT_EQ(ml.liouville, sieve.liouville[x]) << "x=" << x << " Y=" << y << " " << sqfc::testing::seed_note();
    ASSERT_EQ(sqfc::arith::squarefree_isolated(x, o), sieve.squarefree[x]) << "x=" << x << " " << sqfc::testing::seed_note();
    ++cases;
  }
  EXPECT_EQ(cases, rounds);
}

TEST(IsolatedValues, NextToPowersOfTwoSquaresAndCubes) {
  const auto& sieve = shared_sieve();
  std::vector<Natural> xs;
  for (int k = 1; k <= 24; ++k)
    for (const Natural x : {(Natural{1} << k) - 1, Natural{1} << k, (Natural{1} << k) + 1}) xs.push_back(x);
  for (const Natural s : {2ULL, 3ULL, 97ULL, 1000ULL, 2047ULL, 4095ULL})
    for (const Natural x : {s * s - 1, s * s, s * s + 1}) xs.push_back(x);
  for (const Natural c : {2ULL, 7ULL, 100ULL, 255ULL})
    for (const Natural x : {c * c * c - 1, c * c * c, c * c * c + 1}) xs.push_back(x);
  std::uint64_t cases = 0;
  for (const Natural x : xs) {
    for (const Natural y : {Natural{0}, sqfc::integer_sqrt(x) + 1}) {
      if (y != 0 && x >= y && x / y + 1 >= y) continue;  // split not valid for this x
      const auto ml = sqfc::arith::mertens_liouville_isolated(x, with(y, 2));
      ASSERT_EQ(ml.mertens, sieve.mertens[x]) << "x=" << x << " Y=" << y;
      ASSERT_EQ(ml.liouville, sieve.liouville[x]) << "x=" << x << " Y=" << y;
      ++cases;
    }
    ASSERT_EQ(sqfc::arith::squarefree_isolated(x), sieve.squarefree[x]) << "x=" << x;
  }
  EXPECT_GE(cases, xs.size());
}

TEST(IsolatedValues, MertensAtPowersOfTenPublished) {
  std::uint64_t cases = 0;
  for (const auto* file : {"mertens_powers_of_ten.csv", "mertens_isolated_powers_of_ten.csv"}) {
    const auto table = sqfc::oracles::read_published_csv(data(file));  // OEIS A084237, see its source column
    for (std::size_t r = 0; r < table.rows.size(); ++r) {
      const auto k = table.integer(r, "k");
      if (k > 11) continue;  // 10^12 .. 10^13 in the slow test, 10^16 in tests/bench/bench_value.sh
      Natural x = 1;
      for (int i = 0; i < k; ++i) x *= 10;
      EXPECT_EQ(sqfc::arith::mertens_isolated(x, with(0, 2)), table.integer(r, "value")) << "x=10^" << k;
      ++cases;
    }
  }
  EXPECT_EQ(cases, 12U);
}

TEST(IsolatedValues, MertensAtPowersOfTwoPublished) {
  // OEIS A084236, k = 0..30 (tests/data/bfile/a084236_mertens_pow2.txt, from memory, checked
  // there against the trial-division oracle).
  std::uint64_t cases = 0;
  for (const auto& [k, value] : sqfc::testing::mertens_powers_of_two(data("bfile/a084236_mertens_pow2.txt"))) {
    EXPECT_EQ(sqfc::arith::mertens_isolated(Natural{1} << k, with(0, 2)), value) << "x=2^" << k;
    ++cases;
  }
  EXPECT_EQ(cases, 31U);
}

TEST(IsolatedValues, SquarefreeAtPowersOfTenPublished) {
  std::uint64_t cases = 0;
  for (const auto* file : {"squarefree_powers_of_ten.csv", "squarefree_isolated_powers_of_ten.csv"}) {
    const auto table = sqfc::oracles::read_published_csv(data(file));  // OEIS A071172, see its source column
    for (std::size_t r = 0; r < table.rows.size(); ++r) {
      const auto k = table.integer(r, "k");
      if (k > 15) continue;  // 10^16 .. 10^18 in the slow test
      Natural x = 1;
      for (int i = 0; i < k; ++i) x *= 10;
      EXPECT_EQ(std::to_string(sqfc::arith::squarefree_isolated(x, with(0, 2))), table.text(r, "value")) << "x=10^" << k;
      ++cases;
    }
  }
  EXPECT_EQ(cases, 16U);
}

TEST(IsolatedValues, LiouvilleAtPowersOfTenAndPolyaCounterexample) {
  std::uint64_t cases = 0;
  const auto table = sqfc::oracles::read_published_csv(data("liouville_powers_of_ten.csv"));  // OEIS A090410
  for (std::size_t r = 0; r < table.rows.size(); ++r) {
    Natural x = 1;
    for (int i = 0; i < table.integer(r, "k"); ++i) x *= 10;
    EXPECT_EQ(sqfc::arith::liouville_isolated(x, with(0, 2)), table.integer(r, "value")) << "x=" << x;
    ++cases;
  }
  // The smallest n > 1 with L(n) > 0 is 906150257, where L = 1 (M. Tanaka, Tokyo J. Math. 3
  // (1980); from memory).
  EXPECT_EQ(sqfc::arith::liouville_isolated(906150257, with(0, 2)), 1);
  EXPECT_EQ(sqfc::arith::liouville_isolated(906150256, with(0, 2)), 0);
  EXPECT_GE(cases, 8U);
}

TEST(IsolatedValues, SameResultForEverySplitAndThreadCount) {
  const Natural x = 3'000'012'345ULL;
  const auto reference = sqfc::arith::mertens_liouville_isolated(x, with(0, 1));
  std::uint64_t cases = 0;
  for (const Natural y : {Natural{100'000}, Natural{1'000'000}, Natural{5'000'000}})
    for (const unsigned threads : {1U, 2U, 3U}) {
      const auto r = sqfc::arith::mertens_liouville_isolated(x, with(y, threads));
      EXPECT_EQ(r.mertens, reference.mertens) << "Y=" << y << " threads=" << threads;
      EXPECT_EQ(r.liouville, reference.liouville) << "Y=" << y << " threads=" << threads;
      ++cases;
    }
  EXPECT_EQ(sqfc::arith::mertens_isolated(x, with(0, 2)), reference.mertens);
  EXPECT_EQ(cases, 9U);
}

TEST(IsolatedValues, SameResultWithEveryKernelAndLookupShare) {
  // The portable scalar loops against the AVX2 and the fastest (AVX-512 where the CPU has it)
  // ones, and the lookup/grouped split moved from nearly all grouped to nearly all lookups:
  // M, L and Q must not move.
  std::vector<IsolatedKernels> kernels = {IsolatedKernels::fastest};
  if (sqfc::arith::isolated_kernels_available(IsolatedKernels::avx2)) kernels.push_back(IsolatedKernels::avx2);
  std::mt19937_64 rng(20261202);
  std::uint64_t cases = 0;
  for (int i = 0; i < 24; ++i) {
    const Natural x = std::uniform_int_distribution<Natural>(1'000'000, 20'000'000'000ULL)(rng);
    IsolatedOptions portable = with(0, 1);
    portable.kernels = IsolatedKernels::portable;
    const auto reference = sqfc::arith::mertens_liouville_isolated(x, portable);
    const auto q_reference = sqfc::arith::squarefree_isolated(x, portable);
    for (const auto k : kernels) {
      for (const double share : {0.0, 0.05, 1.0, 3.5}) {
        IsolatedOptions o = with(0, 1 + static_cast<unsigned>(i % 2));
        o.lookup_share = share;
        o.kernels = k;
        const auto r = sqfc::arith::mertens_liouville_isolated(x, o);
        EXPECT_EQ(r.mertens, reference.mertens) << "x=" << x << " share=" << share;
        EXPECT_EQ(r.liouville, reference.liouville) << "x=" << x << " share=" << share;
        EXPECT_EQ(sqfc::arith::squarefree_isolated(x, o), q_reference) << "x=" << x << " share=" << share;
        ++cases;
      }
    }
  }
  EXPECT_EQ(cases, 96U * kernels.size());
  for (const auto k : {IsolatedKernels::fastest, IsolatedKernels::avx2, IsolatedKernels::portable}) {
    if (!sqfc::arith::isolated_kernels_available(k)) continue;
    IsolatedOptions o = with(0, 2);
    o.kernels = k;
    EXPECT_EQ(sqfc::arith::mertens_isolated(10'000'000'000'000ULL, o), 599582);  // OEIS A084237
  }
}

TEST(IsolatedValues, ConsecutiveDifferencesAreMuByFactoring) {
  // M(x) - M(x - 1) = mu(x) and L(x) - L(x - 1) = lambda(x), mu and lambda of x by FLINT factoring.
  std::uint64_t cases = 0;
  for (const Natural x : {Natural{1'000'000'007}, Natural{4'294'967'297}, Natural{9'999'999'999}, Natural{10'000'000'000}}) {
    const auto a = sqfc::arith::mertens_liouville_isolated(x - 1, with(0, 2));
    const auto b = sqfc::arith::mertens_liouville_isolated(x, with(0, 2));
    const auto v = sqfc::arith::arithmetic_values(x);
    EXPECT_EQ(b.mertens - a.mertens, v.mu) << "x=" << x;
    EXPECT_EQ(b.liouville - a.liouville, (v.big_omega % 2 == 0) ? 1 : -1) << "x=" << x;
    ++cases;
  }
  EXPECT_EQ(cases, 4U);
}

TEST(IsolatedValues, ProgressReachesOneAndAThrowStopsTheRun) {
  std::vector<double> seen;
  IsolatedOptions o = with(0, 2);
  o.progress = [&seen](double f) { seen.push_back(f); };
  EXPECT_EQ(sqfc::arith::mertens_isolated(10'000'000'000ULL, o), -33722);  // OEIS A084237
  ASSERT_FALSE(seen.empty());
  EXPECT_TRUE(std::is_sorted(seen.begin(), seen.end()));
  EXPECT_DOUBLE_EQ(seen.back(), 1.0);
  o.progress = [](double) { throw std::runtime_error("stop"); };
  EXPECT_THROW(sqfc::arith::mertens_isolated(10'000'000'000ULL, o), std::runtime_error);
  EXPECT_THROW(sqfc::arith::squarefree_isolated(10'000'000'000ULL, o), std::runtime_error);
}

TEST(IsolatedValues, PreconditionsAreChecked) {
  using sqfc::InvalidArgument;
  EXPECT_THROW(sqfc::arith::mertens_isolated(0), InvalidArgument);
  EXPECT_THROW(sqfc::arith::mertens_isolated(sqfc::arith::max_isolated_mertens_x + 1), InvalidArgument);
  EXPECT_THROW(sqfc::arith::liouville_isolated(0), InvalidArgument);
  EXPECT_THROW(sqfc::arith::liouville_isolated(sqfc::arith::max_isolated_liouville_x + 1), InvalidArgument);
  EXPECT_THROW(sqfc::arith::mertens_liouville_isolated(sqfc::arith::max_isolated_liouville_x + 1), InvalidArgument);
  EXPECT_THROW(sqfc::arith::squarefree_isolated(0), InvalidArgument);
  EXPECT_THROW(sqfc::arith::squarefree_isolated(sqfc::arith::max_isolated_squarefree_x + 1), InvalidArgument);
  EXPECT_THROW(sqfc::arith::mertens_isolated(1'000'000, with(1000)), InvalidArgument);  // Y = isqrt(x)
  // Above the sweep's 2^44 (lookup quotients must stay below it): refused before any work.
  EXPECT_THROW(sqfc::arith::mertens_isolated(1'000'000'000'000'000'000ULL, with((Natural{1} << 44) + 1)), InvalidArgument);
  EXPECT_THROW(sqfc::arith::mertens_isolated(1'000'000, with(0, 0)), InvalidArgument);  // no threads
  IsolatedOptions bad_share;
  bad_share.lookup_share = 4.5;
  EXPECT_THROW(sqfc::arith::mertens_isolated(1'000'000, bad_share), InvalidArgument);
  bad_share.lookup_share = -1;
  EXPECT_THROW(sqfc::arith::mertens_isolated(1'000'000, bad_share), InvalidArgument);
  EXPECT_THROW(sqfc::arith::fredholm_from_counts(2, 1), sqfc::InternalError);           // Q + M odd
  EXPECT_EQ(sqfc::arith::fredholm_from_counts(1, 1), 1);  // x = 1: the empty product
}

}  // namespace
