// SPDX-License-Identifier: MIT
// Tests of parse_natural and parse_natural_list: the command line's number syntax.
#include "sqfc/core/number_parse.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <limits>
#include <random>
#include <string>
#include <vector>

#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/types.hpp"

namespace {

using sqfc::parse_natural;
using sqfc::parse_natural_list;
constexpr std::uint64_t u64_max = std::numeric_limits<std::uint64_t>::max();

struct Accepted {
  const char* text;
  std::uint64_t value;
};

// Exact powers by repeated multiplication in 128 bits: independent of the parser's loop.
std::uint64_t exact_power(std::uint64_t base, unsigned exponent) {
  sqfc::WideUnsigned r = 1;
  for (unsigned i = 0; i < exponent; ++i) r *= base;
  return static_cast<std::uint64_t>(r);
}

TEST(NumberParse, AcceptsEveryDocumentedForm) {
  // Values of the form "10^k" are written out by hand; 2^64 - 1 = 18446744073709551615 and
  // 2^63 = 9223372036854775808 are from memory and re-derived by exact_power below.
  const std::vector<Accepted> cases = {
      {"0", 0},
      {"1", 1},
      {"7", 7},
      {"0007", 7},
      {"1000000", 1000000},
      {"1e9", 1000000000},
      {"1E9", 1000000000},
      {"3e12", 3000000000000},
      {"5e0", 5},
      {"0e5", 0},
      {"1e19", 10000000000000000000ULL},
      {"18e18", 18000000000000000000ULL},
      {"1844674407370955161e1", 18446744073709551610ULL},
      {"10^9", 1000000000},
      {"10^0", 1},
      {"2^40", 1099511627776ULL},
      {"2^0", 1},
      {"2^63", 9223372036854775808ULL},
      {"0^5", 0},
      {"1^18446744073709551615", 1},
      {"0^18446744073709551615", 0},
      {"4294967295^2", 18446744065119617025ULL},
      {"18446744073709551615", u64_max},
      {"18446744073709551615^1", u64_max},
      {"18446744073709551615e0", u64_max},
  };
  for (const auto& c : cases) EXPECT_EQ(parse_natural(c.text, "--to"), c.value) << c.text;
  EXPECT_EQ(exact_power(2, 63), 9223372036854775808ULL);
  EXPECT_EQ(exact_power(2, 40), 1099511627776ULL);
  EXPECT_EQ(exact_power(4294967295ULL, 2), 18446744065119617025ULL);
  EXPECT_EQ(exact_power(2, 32) * 4294967295ULL + 4294967295ULL, u64_max);
  EXPECT_EQ(cases.size(), 25U);
}

TEST(NumberParse, AllThreeFormsAgreeOnEveryRepresentablePower) {
  // For every base b in [2, 20] and every exponent with b^k < 2^64: "b^k" gives b^k, and for
  // b = 10 also "1ek", "10^k" and the written-out digits agree.
  int checked = 0;
  for (std::uint64_t b = 2; b <= 20; ++b) {
    sqfc::WideUnsigned power = 1;
    for (unsigned k = 0; power <= u64_max; ++k, power *= b) {
      const auto expected = static_cast<std::uint64_t>(power);
      const std::string text = std::to_string(b) + "^" + std::to_string(k);
      ASSERT_EQ(parse_natural(text, "x"), expected) << text;
      ASSERT_EQ(parse_natural(std::to_string(expected), "x"), expected);
      if (b == 10) {
        ASSERT_EQ(parse_natural("1e" + std::to_string(k), "x"), expected) << k;
      }
      ++checked;
    }
    // The first power past 2^64 - 1 overflows.
    unsigned k = 0;
    for (sqfc::WideUnsigned p = 1; p <= u64_max; p *= b) ++k;
    const std::string over = std::to_string(b) + "^" + std::to_string(k);
    EXPECT_THROW(parse_natural(over, "x"), sqfc::OverflowError) << over;
    ++checked;
  }
  // Sum over b = 2..20 of (number of b^k <= 2^64 - 1) plus one overflow case per base.
  int expected = 0;
  for (std::uint64_t b = 2; b <= 20; ++b) {
    sqfc::WideUnsigned p = 1;
    while (p <= u64_max) p *= b, ++expected;
    ++expected;
  }
  EXPECT_EQ(checked, expected);
  // Hand count of the k with b^k <= 2^64 - 1 per base, plus the 19 overflow cases.
  EXPECT_EQ(expected, 64 + 41 + 32 + 28 + 25 + 23 + 22 + 21 + 20 + 19 + 18 + 18 + 17 + 17 + 16 + 16 + 16 + 16 + 15 + 19);
}

TEST(NumberParse, RandomDigitStringsRoundTrip) {
  auto rng = sqfc::testing::test_rng(101);
  std::uniform_int_distribution<std::uint64_t> any;
  std::uniform_int_distribution<int> shift(0, 63);
  const std::uint64_t count = 20000 * sqfc::testing::test_multiplier();
  std::uint64_t checked = 0;
  for (std::uint64_t i = 0; i < count; ++i) {
    const std::uint64_t v = any(rng) >> shift(rng);
    ASSERT_EQ(parse_natural(std::to_string(v), "x"), v) << sqfc::testing::seed_note();
    // Trailing zeros moved into an exponent: v * 10^k as "<v>e<k>" while it fits (k <= 19,
    // 10^19 < 2^64 < 10^20; a zero mantissa with k >= 20 is the regression test below).
    sqfc::WideUnsigned scaled = v;
    for (unsigned k = 0; scaled <= u64_max && k < 20; ++k, scaled *= 10) {
      const std::string text = std::to_string(v) + "e" + std::to_string(k);
      ASSERT_EQ(parse_natural(text, "x"), static_cast<std::uint64_t>(scaled)) << text << " " << sqfc::testing::seed_note();
    }
    if (v != 0 && scaled > u64_max) {
      const std::string text = std::to_string(v) + "e25";
      ASSERT_THROW(parse_natural(text, "x"), sqfc::OverflowError) << text << " " << sqfc::testing::seed_note();
    }
    ++checked;
  }
  EXPECT_EQ(checked, count);
}

TEST(NumberParse, OverflowNearTwoToThe64) {
  const std::vector<const char*> too_large = {
      "18446744073709551616",   // 2^64
      "18446744073709551625",   // 2^64 + 9
      "18446744073709551620",   // first multiple of 10 above
      "99999999999999999999",   // 20 nines
      "184467440737095516150",  // (2^64 - 1) * 10
      "2^64",
      "4294967296^2",           // (2^32)^2
      "2^18446744073709551615",
      "3^41",                   // 3^40 < 2^64 < 3^41
      "1e20",
      "2e19",
      "1844674407370955162e1",
      "18446744073709551615e1",
      "10^20",
  };
  for (const char* text : too_large) {
    EXPECT_THROW(parse_natural(text, "--to"), sqfc::OverflowError) << text;
  }
  EXPECT_EQ(too_large.size(), 14U);
}

TEST(NumberParse, RejectsJunk) {
  const std::vector<const char*> junk = {
      "",    "1e",  "e",    "e5",  "E",    "^",    "^3",   "3^",  "2^^3", "2^3^4", "1.5e3", "1.5",
      "-5",  "+5",  " 7",   "7 ",  "7\t",  "\n7",  "1 000", "1,5", "0x10", "1e-3", "1e+3", "1e3e",
      "1e2^3", "2^1e3", "ten", "1_000", "10^-1", "٣",  "1e9 ", "2 ^40",
  };
  for (const char* text : junk) {
    try {
      parse_natural(text, "--from");
      ADD_FAILURE() << "accepted '" << text << "'";
    } catch (const sqfc::OverflowError&) {
      ADD_FAILURE() << "'" << text << "' reported as overflow instead of invalid";
    } catch (const sqfc::InvalidArgument& e) {
      // The message names the option, for the CLI's stderr, and is one line unless the
      // input itself held a line break (it is quoted verbatim).
      const std::string message = e.what();
      EXPECT_NE(message.find("--from"), std::string::npos) << message;
      if (std::string(text).find('\n') == std::string::npos) {
        EXPECT_EQ(message.find('\n'), std::string::npos) << message;
      }
      EXPECT_EQ(e.exit_code(), sqfc::exit_code::bad_input);
    }
  }
  EXPECT_EQ(junk.size(), 32U);
}

TEST(NumberParse, ErrorsCarryTheOptionNameTheTextAndExitCodeTwo) {
  try {
    parse_natural("12x", "--every");
    FAIL() << "accepted 12x";
  } catch (const sqfc::InvalidArgument& e) {
    const std::string message = e.what();
    EXPECT_NE(message.find("--every"), std::string::npos) << message;
    EXPECT_NE(message.find("12x"), std::string::npos) << message;
    EXPECT_EQ(e.exit_code(), 2);
  }
  try {
    parse_natural("2^64", "--to");
    FAIL() << "accepted 2^64";
  } catch (const sqfc::OverflowError& e) {
    const std::string message = e.what();
    EXPECT_NE(message.find("--to"), std::string::npos) << message;
    EXPECT_NE(message.find("2^64"), std::string::npos) << message;
    EXPECT_EQ(e.exit_code(), 2);
  }
}

TEST(NumberParseList, SplitsOnCommas) {
  EXPECT_EQ(parse_natural_list("5", "--at"), (std::vector<std::uint64_t>{5}));
  EXPECT_EQ(parse_natural_list("1,2,3", "--at"), (std::vector<std::uint64_t>{1, 2, 3}));
  EXPECT_EQ(parse_natural_list("1e3,2^4,7,0", "--at"), (std::vector<std::uint64_t>{1000, 16, 7, 0}));
  EXPECT_EQ(parse_natural_list("3,1,3", "--at"), (std::vector<std::uint64_t>{3, 1, 3}));  // order and repeats kept
  EXPECT_EQ(parse_natural_list("18446744073709551615,0", "--at"), (std::vector<std::uint64_t>{u64_max, 0}));

  // A long random list round-trips.
  auto rng = sqfc::testing::test_rng(102);
  std::uniform_int_distribution<std::uint64_t> any;
  std::vector<std::uint64_t> values(500);
  std::string text;
  for (auto& v : values) {
    v = any(rng);
    if (!text.empty()) text += ',';
    text += std::to_string(v);
  }
  EXPECT_EQ(parse_natural_list(text, "--at"), values) << sqfc::testing::seed_note();
  EXPECT_EQ(values.size(), 500U);
}

TEST(NumberParseList, RejectsEmptyItemsAndBadItems) {
  const std::vector<const char*> invalid = {"", ",", ",,", "1,", ",1", "1,,2", "1, 2", " 1,2", "1,2 ", "1;2", "1,x", "1,1e"};
  for (const char* text : invalid) EXPECT_THROW(parse_natural_list(text, "--at"), sqfc::InvalidArgument) << text;
  EXPECT_EQ(invalid.size(), 12U);
  // An item that overflows is reported as overflow, whatever its position.
  const std::vector<const char*> overflowing = {"2^64", "1,2^64", "2^64,1", "1,18446744073709551616,3"};
  for (const char* text : overflowing) EXPECT_THROW(parse_natural_list(text, "--at"), sqfc::OverflowError) << text;
  EXPECT_EQ(overflowing.size(), 4U);
}

// Regression (found while writing these tests): the header promises OverflowError whenever
// a number of an accepted form passes 2^64 - 1, but a digit string of more than 40 digits is
// rejected as InvalidArgument. Smallest failing input: "1" followed by 40 zeros (41 digits).
TEST(NumberParseRegression, FortyOneDigitNumberIsAnOverflow) {
  const std::string ten_to_40 = "1" + std::string(40, '0');
  EXPECT_THROW(parse_natural(ten_to_40, "--to"), sqfc::OverflowError);
  // 40 digits is still reported as overflow (the length cut-off is not reached).
  const std::string ten_to_39 = "1" + std::string(39, '0');
  EXPECT_THROW(parse_natural(ten_to_39, "--to"), sqfc::OverflowError);
}

// Regression (found while writing these tests): "0e20" is 0, which fits, but the parser
// computes 10^20 before multiplying by the mantissa and throws OverflowError. Smallest
// failing input: "0e20" ("0e19" works because 10^19 < 2^64).
TEST(NumberParseRegression, ZeroMantissaWithLargeExponentIsZero) {
  EXPECT_EQ(parse_natural("0e19", "--from"), 0U);
  EXPECT_EQ(parse_natural("0e20", "--from"), 0U);
}

}  // namespace
