// SPDX-License-Identifier: MIT
// The inner loops of the mu sweep (src/arith/sweep_kernels.cpp) against plain integer
// division: quotients that are exact integers, one below an integer, next to 2^44 and 2^48,
// dividends near 2^64, and random cases; the AVX2 and AVX-512 versions where the CPU has them.
// Expected values: the oracle is the hardware division x / n computed in the test; no outside value is used.
#include <gtest/gtest.h>

#include <cstdint>
#include <cstdlib>
#include <memory>
#include <random>
#include <vector>

#include "../../src/arith/detail_sweep_kernels.hpp"

namespace {

using sqfc::Natural;
using sqfc::arith::detail::SweepKernels;

std::vector<SweepKernels> kernels_here() {
  std::vector<SweepKernels> k = {SweepKernels::portable};
  if (sqfc::arith::detail::avx2_sweep_kernels_available()) k.push_back(SweepKernels::avx2);
  if (sqfc::arith::detail::fastest_sweep_kernels() == SweepKernels::avx512) k.push_back(SweepKernels::avx512);
  return k;
}

// One lookup run checked against division. Only the entries at the true quotients are
// nonzero (distinct values), so a quotient off by one changes the sum; the table is calloc'd,
// so the untouched part of a wide range costs no memory.
void expect_lookup_run(SweepKernels k, Natural x, Natural n_low, Natural n_high) {
  const Natural a = x / n_high;
  const auto size = static_cast<std::size_t>(x / n_low - a + 2);
  std::unique_ptr<std::int32_t, decltype(&std::free)> table(static_cast<std::int32_t*>(std::calloc(size, sizeof(std::int32_t))), &std::free);
  ASSERT_NE(table, nullptr);
  std::int64_t expected = 0;
  for (Natural n = n_low; n <= n_high; ++n) {
    const auto i = static_cast<std::size_t>(x / n - a);
    table.get()[i] = static_cast<std::int32_t>(n % 1000 + 1);
  }
  for (Natural n = n_low; n <= n_high; ++n) expected += table.get()[static_cast<std::size_t>(x / n - a)];
  EXPECT_EQ(sqfc::arith::detail::lookup_run_sum(k, x, static_cast<double>(x), n_low, n_high, a, table.get()), expected)
      << "x=" << x << " n=[" << n_low << "," << n_high << "]";
}

TEST(SweepKernels, LookupRunsMatchDivision) {
  std::mt19937_64 rng(44);
  for (const auto k : kernels_here()) {
    // Exact multiples, one below, one above; quotients next to 2^44 with x near 2^64.
    expect_lookup_run(k, Natural{1'000'000} * 720'720, 700'000, 720'731);
    expect_lookup_run(k, Natural{1'000'000} * 720'720 - 1, 700'000, 720'731);
    expect_lookup_run(k, Natural{1'000'000} * 720'720 + 1, 700'000, 720'731);
    const Natural near_top = ~Natural{0} - 12345;  // 2^64 - 12346
    expect_lookup_run(k, near_top, Natural{1} << 22, (Natural{1} << 22) + 37);  // quotients near 2^42
    expect_lookup_run(k, near_top, Natural{1} << 32, (Natural{1} << 32) + 1000);  // quotients near 2^32
    for (int i = 0; i < 300; ++i) {
      const Natural n_low = std::uniform_int_distribution<Natural>(1, 1'000'000)(rng);
      const Natural n_high = n_low + std::uniform_int_distribution<Natural>(0, 40)(rng);
      const Natural q = std::uniform_int_distribution<Natural>(n_high, n_high + 5000)(rng);
      const Natural x = n_high * q + std::uniform_int_distribution<Natural>(0, 2)(rng) - 1;  // next to a multiple
      expect_lookup_run(k, x, n_low, n_high);
    }
    // x above 2^53, an exact multiple of an n in the run (or one off): x rounds to a double
    // above or below x, so the truncated quotient is one too high or one too low, and both
    // corrections are needed.
    for (int i = 0; i < 300; ++i) {
      const Natural n_low = std::uniform_int_distribution<Natural>(Natural{1} << 25, Natural{1} << 26)(rng);
      const Natural n_high = n_low + std::uniform_int_distribution<Natural>(16, 40)(rng);
      const Natural n_mid = std::uniform_int_distribution<Natural>(n_low, n_high)(rng);
      const Natural q = std::uniform_int_distribution<Natural>(Natural{1} << 30, Natural{1} << 37)(rng);
      const Natural x = n_mid * q + std::uniform_int_distribution<Natural>(0, 2)(rng) - 1;
      expect_lookup_run(k, x, n_low, n_high);
    }
  }
}

TEST(SweepKernels, QuotientSumsMatchDivision) {
  std::mt19937_64 rng(48);
  for (const auto k : kernels_here()) {
    for (int i = 0; i < 200; ++i) {
      const Natural x = i % 2 == 0 ? std::uniform_int_distribution<Natural>(1, ~Natural{0})(rng)
                                   : std::uniform_int_distribution<Natural>(1, Natural{1} << 40)(rng);
      const Natural v_min = (x >> 48) + 1;  // quotients below 2^48
      std::vector<Natural> v;
      std::vector<double> inverse;
      const auto count = std::uniform_int_distribution<std::size_t>(0, 70)(rng);
      Natural next = v_min + std::uniform_int_distribution<Natural>(0, 1000)(rng);
      for (std::size_t j = 0; j < count; ++j) {
        v.push_back(next);
        inverse.push_back(1.0 / static_cast<double>(next));
        next += 1 + std::uniform_int_distribution<Natural>(0, 3)(rng);
      }
      sqfc::WideUnsigned expected = 0;
      for (const Natural d : v) expected += x / d;
      EXPECT_TRUE(sqfc::arith::detail::quotient_sum(k, x, static_cast<double>(x), v.data(), inverse.data(), v.size()) == expected)
          << "x=" << x << " count=" << count;
    }
    // Dividends above 2^53 that are exact multiples of (or one off) the divisors.
    for (int i = 0; i < 200; ++i) {
      std::vector<Natural> v;
      std::vector<double> inverse;
      std::vector<Natural> xs;
      const Natural d0 = std::uniform_int_distribution<Natural>(Natural{1} << 16, Natural{1} << 30)(rng);
      const Natural q = std::uniform_int_distribution<Natural>(Natural{1} << 34, Natural{1} << 47)(rng);
      const Natural x = d0 * q + std::uniform_int_distribution<Natural>(0, 2)(rng) - 1;
      for (Natural d = d0; d < d0 + 20; ++d) v.push_back(d), inverse.push_back(1.0 / static_cast<double>(d));
      sqfc::WideUnsigned expected = 0;
      for (const Natural d : v) expected += x / d;
      EXPECT_TRUE(sqfc::arith::detail::quotient_sum(k, x, static_cast<double>(x), v.data(), inverse.data(), v.size()) == expected)
          << "x=" << x << " d0=" << d0;
    }
    // Divisors of x itself: every quotient an exact integer.
    const Natural x = Natural{2} * 3 * 5 * 7 * 11 * 13 * 17 * 19 * 23 * 29 * 31 * 37 * 41 * 43 * 47;
    std::vector<Natural> v;
    std::vector<double> inverse;
    for (Natural d = 1; d <= 50'000; ++d)
      if (x % d == 0 && x / d < (Natural{1} << 48)) v.push_back(d), inverse.push_back(1.0 / static_cast<double>(d));
    sqfc::WideUnsigned expected = 0;
    for (const Natural d : v) expected += x / d;
    EXPECT_TRUE(sqfc::arith::detail::quotient_sum(k, x, static_cast<double>(x), v.data(), inverse.data(), v.size()) == expected);
  }
}

TEST(SweepKernels, PrefixSumsMatchTheRunningSum) {
  std::mt19937_64 rng(17);
  for (const auto k : kernels_here())
    for (const std::size_t len : {0UL, 1UL, 15UL, 16UL, 17UL, 1000UL, 131072UL}) {
      std::vector<std::int8_t> mu(len);
      for (auto& m : mu) m = static_cast<std::int8_t>(std::uniform_int_distribution<int>(-1, 1)(rng));
      std::vector<std::int32_t> out(len), expected(len);
      std::int32_t running = 0;
      for (std::size_t i = 0; i < len; ++i) expected[i] = running += mu[i];
      EXPECT_EQ(sqfc::arith::detail::prefix_sums(k, mu.data(), len, out.data()), running) << "len=" << len;
      EXPECT_EQ(out, expected) << "len=" << len;
    }
}

}  // namespace
