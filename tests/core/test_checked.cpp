// SPDX-License-Identifier: MIT
// Tests of the checked arithmetic helpers: integer_sqrt, floor_log2, checked_add/mul,
// to_string_wide.
#include "sqfc/core/checked.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <limits>
#include <random>
#include <string>
#include <vector>

#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Wide;
using sqfc::WideUnsigned;
constexpr std::uint64_t u64_max = std::numeric_limits<std::uint64_t>::max();
constexpr std::int64_t i64_max = std::numeric_limits<std::int64_t>::max();
constexpr std::int64_t i64_min = std::numeric_limits<std::int64_t>::min();

// The defining property of floor(sqrt(n)), in exact 128-bit arithmetic.
bool is_floor_sqrt(std::uint64_t n, std::uint64_t r) {
  const WideUnsigned w = r;
  return w * w <= n && (w + 1) * (w + 1) > n;
}

TEST(IntegerSqrt, ExhaustiveBelowTwoToThe22) {
  // Walk n upwards keeping r with r^2 <= n < (r + 1)^2: no floating point involved.
  const std::uint64_t limit = std::uint64_t{1} << 22;
  std::uint64_t r = 0;
  std::uint64_t checked = 0;
  for (std::uint64_t n = 0; n < limit; ++n) {
    if ((r + 1) * (r + 1) == n) ++r;
    ASSERT_EQ(sqfc::integer_sqrt(n), r) << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
  EXPECT_EQ(r, 2047U);  // 2047^2 = 4190209 <= 2^22 - 1 < 2048^2
}

TEST(IntegerSqrt, SquaresAndTheirNeighboursUpToTwoToThe64) {
  // r^2 - 1, r^2, r^2 + 1 for r = every value near 2^32, every power of two +- 2, and random
  // r < 2^32, where a floating-point root is most likely to be off by one.
  std::vector<std::uint64_t> roots;
  for (std::uint64_t r = (std::uint64_t{1} << 32) - 5000; r < (std::uint64_t{1} << 32); ++r) roots.push_back(r);
  for (int k = 2; k < 32; ++k)
    for (int d = -2; d <= 2; ++d) roots.push_back((std::uint64_t{1} << k) + static_cast<std::uint64_t>(d));
  // 3037000499 = floor(sqrt(2^63)) (from memory; the check below re-derives it).
  roots.push_back(3037000499ULL);
  roots.push_back(3037000500ULL);
  auto rng = sqfc::testing::test_rng(201);
  std::uniform_int_distribution<std::uint64_t> below_2_32(1, (std::uint64_t{1} << 32) - 1);
  const std::uint64_t random_roots = 20000 * sqfc::testing::test_multiplier();
  for (std::uint64_t i = 0; i < random_roots; ++i) roots.push_back(below_2_32(rng));

  std::uint64_t checked = 0;
  for (const auto r : roots) {
    const std::uint64_t square = r * r;  // r < 2^32, exact
    ASSERT_EQ(sqfc::integer_sqrt(square), r) << r << " " << sqfc::testing::seed_note();
    ASSERT_EQ(sqfc::integer_sqrt(square - 1), r - 1) << r << " " << sqfc::testing::seed_note();
    ASSERT_EQ(sqfc::integer_sqrt(square + 1), r) << r << " " << sqfc::testing::seed_note();
    checked += 3;
  }
  EXPECT_EQ(checked, 3 * (5000 + 30 * 5 + 2 + random_roots));

  // The very top: (2^32 - 1)^2 = 2^64 - 2^33 + 1 is the largest square below 2^64.
  EXPECT_EQ(sqfc::integer_sqrt(u64_max), 4294967295U);
  EXPECT_EQ(sqfc::integer_sqrt(u64_max - 1), 4294967295U);
  EXPECT_EQ(sqfc::integer_sqrt(18446744065119617025ULL), 4294967295U);
  EXPECT_EQ(sqfc::integer_sqrt(18446744065119617024ULL), 4294967294U);
  EXPECT_TRUE(is_floor_sqrt(std::uint64_t{1} << 63, 3037000499ULL));
  EXPECT_EQ(sqfc::integer_sqrt(std::uint64_t{1} << 63), 3037000499ULL);
}

TEST(IntegerSqrt, RandomSixtyFourBitValues) {
  auto rng = sqfc::testing::test_rng(202);
  std::uniform_int_distribution<std::uint64_t> any;
  std::uniform_int_distribution<int> shift(0, 63);
  const std::uint64_t count = 200000 * sqfc::testing::test_multiplier();
  std::uint64_t checked = 0;
  for (std::uint64_t i = 0; i < count; ++i) {
    const std::uint64_t n = any(rng) >> shift(rng);
    ASSERT_TRUE(is_floor_sqrt(n, sqfc::integer_sqrt(n))) << n << " " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, count);
}

TEST(FloorLog2, PowersOfTwoAndNeighbours) {
  std::uint64_t checked = 0;
  for (int k = 0; k < 64; ++k) {
    const std::uint64_t p = std::uint64_t{1} << k;
    ASSERT_EQ(sqfc::floor_log2(p), k);
    ASSERT_EQ(sqfc::floor_log2(p | (p - 1)), k);  // 2^(k+1) - 1
    if (k >= 1) {
      ASSERT_EQ(sqfc::floor_log2(p - 1), k - 1) << k;
      ASSERT_EQ(sqfc::floor_log2(p + 1), k) << k;
    }
    checked += 1 + 1 + (k >= 1 ? 2 : 0);
  }
  EXPECT_EQ(checked, 64U * 4 - 2);
  EXPECT_EQ(sqfc::floor_log2(1), 0);
  EXPECT_EQ(sqfc::floor_log2(u64_max), 63);
  EXPECT_EQ(sqfc::floor_log2(10'000'000'000'000'000ULL), 53);  // 2^53 = 9.007e15 <= 10^16 < 2^54
}

TEST(FloorLog2, RandomAgainstShifting) {
  auto rng = sqfc::testing::test_rng(203);
  std::uniform_int_distribution<std::uint64_t> any(1, u64_max);
  std::uniform_int_distribution<int> shift(0, 63);
  const std::uint64_t count = 100000 * sqfc::testing::test_multiplier();
  std::uint64_t checked = 0;
  for (std::uint64_t i = 0; i < count; ++i) {
    std::uint64_t n = any(rng) >> shift(rng);
    if (n == 0) n = 1;
    int expected = -1;
    for (std::uint64_t m = n; m != 0; m >>= 1) ++expected;
    ASSERT_EQ(sqfc::floor_log2(n), expected) << n << " " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, count);
}

TEST(CheckedArithmetic, UnsignedAddAtTheBoundary) {
  EXPECT_EQ(sqfc::checked_add(u64_max, std::uint64_t{0}), u64_max);
  EXPECT_EQ(sqfc::checked_add(u64_max - 5, std::uint64_t{5}), u64_max);
  EXPECT_EQ(sqfc::checked_add(std::uint64_t{0}, std::uint64_t{0}), 0U);
  EXPECT_THROW(sqfc::checked_add(u64_max, std::uint64_t{1}), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_add(u64_max - 5, std::uint64_t{6}), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_add(u64_max, u64_max), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_add(std::uint64_t{1} << 63, std::uint64_t{1} << 63), sqfc::OverflowError);
  try {
    sqfc::checked_add(u64_max, std::uint64_t{1}, "running count");
    FAIL() << "no overflow reported";
  } catch (const sqfc::OverflowError& e) {
    EXPECT_NE(std::string(e.what()).find("running count"), std::string::npos) << e.what();
    EXPECT_EQ(e.exit_code(), sqfc::exit_code::bad_input);
  }
}

TEST(CheckedArithmetic, SignedAddAtBothBoundaries) {
  EXPECT_EQ(sqfc::checked_add(i64_max, std::int64_t{0}), i64_max);
  EXPECT_EQ(sqfc::checked_add(i64_min, i64_max), -1);
  EXPECT_EQ(sqfc::checked_add(i64_min, std::int64_t{0}), i64_min);
  EXPECT_EQ(sqfc::checked_add(std::int64_t{-5}, std::int64_t{3}), -2);
  EXPECT_THROW(sqfc::checked_add(i64_max, std::int64_t{1}), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_add(i64_min, std::int64_t{-1}), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_add(i64_min, i64_min), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_add(i64_max, i64_max), sqfc::OverflowError);
  try {
    sqfc::checked_add(i64_min, std::int64_t{-1}, "Mertens sum");
    FAIL() << "no overflow reported";
  } catch (const sqfc::OverflowError& e) {
    EXPECT_NE(std::string(e.what()).find("Mertens sum"), std::string::npos) << e.what();
  }
}

TEST(CheckedArithmetic, MultiplyAtTheBoundary) {
  const std::uint64_t two_32 = std::uint64_t{1} << 32;
  EXPECT_EQ(sqfc::checked_mul(two_32 - 1, two_32 + 1), u64_max);  // 2^64 - 1
  EXPECT_EQ(sqfc::checked_mul(u64_max, std::uint64_t{1}), u64_max);
  EXPECT_EQ(sqfc::checked_mul(u64_max, std::uint64_t{0}), 0U);
  EXPECT_EQ(sqfc::checked_mul(std::uint64_t{0}, u64_max), 0U);
  EXPECT_EQ(sqfc::checked_mul(std::uint64_t{1} << 63, std::uint64_t{1}), std::uint64_t{1} << 63);
  EXPECT_THROW(sqfc::checked_mul(two_32, two_32), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_mul(std::uint64_t{1} << 63, std::uint64_t{2}), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_mul(u64_max, std::uint64_t{2}), sqfc::OverflowError);
  EXPECT_THROW(sqfc::checked_mul(two_32 + 1, two_32), sqfc::OverflowError);
  try {
    sqfc::checked_mul(two_32, two_32, "block offset");
    FAIL() << "no overflow reported";
  } catch (const sqfc::OverflowError& e) {
    EXPECT_NE(std::string(e.what()).find("block offset"), std::string::npos) << e.what();
  }
}

TEST(CheckedArithmetic, RandomAgainst128BitResults) {
  auto rng = sqfc::testing::test_rng(204);
  std::uniform_int_distribution<std::uint64_t> any;
  std::uniform_int_distribution<int> shift(0, 63);
  const std::uint64_t count = 100000 * sqfc::testing::test_multiplier();
  std::uint64_t checked = 0;
  std::uint64_t overflows = 0;
  for (std::uint64_t i = 0; i < count; ++i) {
    const std::uint64_t a = any(rng) >> shift(rng);
    const std::uint64_t b = any(rng) >> shift(rng);
    const WideUnsigned sum = WideUnsigned{a} + b;
    const WideUnsigned product = WideUnsigned{a} * b;
    if (sum > u64_max) {
      ASSERT_THROW(sqfc::checked_add(a, b), sqfc::OverflowError) << a << " + " << b << " " << sqfc::testing::seed_note();
      ++overflows;
    } else {
      ASSERT_EQ(sqfc::checked_add(a, b), static_cast<std::uint64_t>(sum)) << a << " + " << b;
    }
    if (product > u64_max) {
      ASSERT_THROW(sqfc::checked_mul(a, b), sqfc::OverflowError) << a << " * " << b << " " << sqfc::testing::seed_note();
      ++overflows;
    } else {
      ASSERT_EQ(sqfc::checked_mul(a, b), static_cast<std::uint64_t>(product)) << a << " * " << b;
    }
    const auto sa = static_cast<std::int64_t>(any(rng)) >> shift(rng);
    const auto sb = static_cast<std::int64_t>(any(rng)) >> shift(rng);
    const Wide signed_sum = Wide{sa} + sb;
    if (signed_sum > i64_max || signed_sum < i64_min) {
      ASSERT_THROW(sqfc::checked_add(sa, sb), sqfc::OverflowError) << sa << " + " << sb << " " << sqfc::testing::seed_note();
      ++overflows;
    } else {
      ASSERT_EQ(sqfc::checked_add(sa, sb), static_cast<std::int64_t>(signed_sum)) << sa << " + " << sb;
    }
    checked += 3;
  }
  EXPECT_EQ(checked, 3 * count);
  // Both outcomes occur: the sample reaches the boundary from both sides.
  EXPECT_GT(overflows, count / 20);
  EXPECT_LT(overflows, 3 * count - count / 20);
}

// Reference decimal text of a 128-bit value: split the magnitude into base-10^18 limbs and
// print each with std::to_string, zero-padded (shares nothing with the digit loop tested).
std::string reference_decimal(Wide value) {
  const bool negative = value < 0;
  WideUnsigned m = negative ? WideUnsigned{0} - static_cast<WideUnsigned>(value) : static_cast<WideUnsigned>(value);
  const std::uint64_t limb = 1'000'000'000'000'000'000ULL;
  std::vector<std::uint64_t> limbs;
  do {
    limbs.push_back(static_cast<std::uint64_t>(m % limb));
    m /= limb;
  } while (m != 0);
  std::string text = negative ? "-" : "";
  text += std::to_string(limbs.back());
  for (std::size_t i = limbs.size() - 1; i-- > 0;) {
    const std::string part = std::to_string(limbs[i]);
    text += std::string(18 - part.size(), '0') + part;
  }
  return text;
}

TEST(ToStringWide, FixedValues) {
  const Wide wide_max = static_cast<Wide>(~WideUnsigned{0} >> 1);
  const Wide wide_min = -wide_max - 1;
  EXPECT_EQ(sqfc::to_string_wide(0), "0");
  EXPECT_EQ(sqfc::to_string_wide(1), "1");
  EXPECT_EQ(sqfc::to_string_wide(-1), "-1");
  EXPECT_EQ(sqfc::to_string_wide(9), "9");
  EXPECT_EQ(sqfc::to_string_wide(10), "10");
  EXPECT_EQ(sqfc::to_string_wide(-10), "-10");
  // 2^127 - 1 and -2^127 (from memory; also re-derived by reference_decimal).
  EXPECT_EQ(sqfc::to_string_wide(wide_max), "170141183460469231731687303715884105727");
  EXPECT_EQ(sqfc::to_string_wide(wide_min), "-170141183460469231731687303715884105728");
  EXPECT_EQ(reference_decimal(wide_max), "170141183460469231731687303715884105727");
  EXPECT_EQ(reference_decimal(wide_min), "-170141183460469231731687303715884105728");
  // Past 64 bits: 2^64 = 18446744073709551616 (from memory).
  EXPECT_EQ(sqfc::to_string_wide(Wide{1} << 64), "18446744073709551616");
  EXPECT_EQ(sqfc::to_string_wide(-(Wide{1} << 64)), "-18446744073709551616");
  EXPECT_EQ(sqfc::to_string_wide(Wide{i64_min}), std::to_string(i64_min));
  EXPECT_EQ(sqfc::to_string_wide(Wide{u64_max}), std::to_string(u64_max));

  // Every power of ten, and its neighbours, that fits.
  int checked = 0;
  Wide p = 1;
  for (int k = 0; k <= 38; ++k, p *= 10) {
    const std::string ones = "1" + std::string(static_cast<std::size_t>(k), '0');
    ASSERT_EQ(sqfc::to_string_wide(p), ones);
    ASSERT_EQ(sqfc::to_string_wide(-p), "-" + ones);
    if (k >= 1) {
      ASSERT_EQ(sqfc::to_string_wide(p - 1), std::string(static_cast<std::size_t>(k), '9'));
    }
    ++checked;
  }
  EXPECT_EQ(checked, 39);
}

TEST(ToStringWide, RandomValuesMatchTheReferenceAndParseBack) {
  auto rng = sqfc::testing::test_rng(205);
  std::uniform_int_distribution<std::uint64_t> any;
  std::uniform_int_distribution<int> shift(0, 127);
  const std::uint64_t count = 50000 * sqfc::testing::test_multiplier();
  std::uint64_t checked = 0;
  for (std::uint64_t i = 0; i < count; ++i) {
    const WideUnsigned bits = (WideUnsigned{any(rng)} << 64) | any(rng);
    const Wide value = static_cast<Wide>(bits) >> shift(rng);
    const std::string text = sqfc::to_string_wide(value);
    ASSERT_EQ(text, reference_decimal(value)) << sqfc::testing::seed_note();
    // Parse back digit by digit (negatives accumulate downwards so -2^127 does not overflow).
    const bool negative = text[0] == '-';
    Wide back = 0;
    for (std::size_t j = negative ? 1 : 0; j < text.size(); ++j) {
      ASSERT_TRUE(text[j] >= '0' && text[j] <= '9') << text;
      back = back * 10 + (negative ? -(text[j] - '0') : (text[j] - '0'));
    }
    ASSERT_TRUE(back == value) << text << " " << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, count);
}

}  // namespace
