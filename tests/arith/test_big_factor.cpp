// SPDX-License-Identifier: MIT
// Tests of parse_big_natural, factor_big, decimal_product and compare_decimal: the number syntax
// at any size, and FLINT's fmpz_factor against PARI's factor on random 64-, 128- and 200-bit
// integers.
#include "sqfc/arith/big_factor.hpp"

#include <flint/fmpz.h>

#include <gtest/gtest.h>

#include <cstdint>
#include <random>
#include <string>
#include <utility>
#include <vector>

#include "big_factor_test_support.hpp"
#include "oracles/pari_oracle.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::arith::compare_decimal;
using sqfc::arith::decimal_product;
using sqfc::arith::factor_big;
using sqfc::arith::parse_big_natural;
using sqfc::big_factor_test::as_pairs;
using sqfc::big_factor_test::compare_with_pari;
using sqfc::big_factor_test::random_cases;
using Pairs = sqfc::big_factor_test::Pairs;

TEST(ParseBigNatural, AcceptsTheNumberSyntaxAtAnySize) {
  // Values written out by hand (powers of ten) or from memory (2^64, OEIS A000079).
  const std::vector<std::pair<std::string, std::string>> cases = {
      {"0", "0"},
      {"7", "7"},
      {"000123", "123"},
      {"1e30", "1000000000000000000000000000000"},
      {"3E2", "300"},
      {"10^30", "1000000000000000000000000000000"},
      {"2^64", "18446744073709551616"},
      {"123456789012345678901234567890", "123456789012345678901234567890"},
      {"0e9999", "0"},
      {"1^99999999999999", "1"},
      {"0^5", "0"},
      {"5^0", "1"},
  };
  for (const auto& [text, value] : cases) EXPECT_EQ(parse_big_natural(text, "K"), value) << text;
  // 2^200 against 200 multiplications by 2 (a second path through FLINT: fmpz_mul, not pow).
  EXPECT_EQ(parse_big_natural("2^200", "K"), decimal_product(std::vector<std::string>(200, "2")));
  EXPECT_EQ(cases.size(), 12U);
}

TEST(ParseBigNatural, RejectsMalformedAndHugeValues) {
  const std::vector<std::string> malformed = {"", "abc", "1e", "e5", "^5", "2^", "1.5", "-3", "12a", "2^x", "1e3e4", " 5"};
  for (const auto& text : malformed) EXPECT_THROW(parse_big_natural(text, "K"), sqfc::InvalidArgument) << text;
  const std::vector<std::string> huge = {"2^4096", "1e1300", "10^99999999999", "3^99999", std::string(1300, '9')};
  for (const auto& text : huge) EXPECT_THROW(parse_big_natural(text, "K"), sqfc::OverflowError) << text.substr(0, 20);
  // The bound itself is allowed.
  EXPECT_EQ(parse_big_natural("2^4095", "K").size(), 1233U);  // floor(4095 log10 2) + 1, hand-computed
  EXPECT_EQ(malformed.size() + huge.size(), 17U);
}

TEST(DecimalHelpers, ProductAndComparison) {
  EXPECT_EQ(decimal_product({}), "1");
  EXPECT_EQ(decimal_product({"2", "3", "5", "7"}), "210");
  EXPECT_EQ(decimal_product({"18446744073709551616", "18446744073709551616"}),
            "340282366920938463463374607431768211456");  // 2^128, from memory (OEIS A000079)
  EXPECT_THROW(decimal_product({"12", "x"}), sqfc::InvalidArgument);
  EXPECT_LT(compare_decimal("99", "100"), 0);
  EXPECT_GT(compare_decimal("101", "100"), 0);
  EXPECT_EQ(compare_decimal("100", "100"), 0);
  EXPECT_LT(compare_decimal("123", "124"), 0);
}

TEST(FactorBig, SmallAndEdgeValues) {
  EXPECT_TRUE(factor_big("1").empty());
  EXPECT_THROW(factor_big("0"), sqfc::InvalidArgument);
  EXPECT_THROW(factor_big(""), sqfc::InvalidArgument);
  EXPECT_THROW(factor_big("12x"), sqfc::InvalidArgument);
  // Hand-computed factorisations.
  EXPECT_EQ(as_pairs(factor_big("12")), (Pairs{{"2", 2}, {"3", 1}}));
  EXPECT_EQ(as_pairs(factor_big("30")), (Pairs{{"2", 1}, {"3", 1}, {"5", 1}}));
  EXPECT_EQ(as_pairs(factor_big(parse_big_natural("2^200", "K"))), (Pairs{{"2", 200}}));
  EXPECT_EQ(as_pairs(factor_big(parse_big_natural("1e30", "K"))), (Pairs{{"2", 30}, {"5", 30}}));
  // 2^64 + 1 = 274177 * 67280421310721 (from memory; Landry 1880), checked against PARI too.
  const std::string f6 = "18446744073709551617";
  EXPECT_EQ(as_pairs(factor_big(f6)), (Pairs{{"274177", 1}, {"67280421310721", 1}}));
  EXPECT_EQ(as_pairs(factor_big(f6)), sqfc::oracles::pari_factor_decimal(f6));
}

TEST(FactorBig, MatchesPariOnRandom64BitIntegers) {
  const std::size_t count = 200 * sqfc::testing::test_multiplier();
  std::vector<std::string> values;
  auto rng = sqfc::testing::test_rng(641);
  for (std::size_t i = 0; i < count; ++i) values.push_back(sqfc::big_factor_test::random_integer(rng, 64));
  compare_with_pari(values, count);
}

TEST(FactorBig, MatchesPariOnRandom128BitIntegers) {
  // Half uniformly random, half products of primes of at most 40 bits; more and larger in
  // test_big_factor_slow.cpp.
  const std::size_t count = 6 * sqfc::testing::test_multiplier();
  compare_with_pari(random_cases(1281, count, 128, 40, false), count);
}

TEST(FactorBig, MatchesPariOnRandom200BitProducts) {
  // Products of random primes of at most 36 bits (a uniformly random 200-bit integer may hide a
  // hard 100-bit semiprime); bits(product) is 199..201.
  const std::size_t count = 6 * sqfc::testing::test_multiplier();
  const auto values = random_cases(2001, count, 200, 36, true);
  for (const auto& v : values) {
    fmpz_t x;
    fmpz_init(x);
    fmpz_set_str(x, v.c_str(), 10);
    EXPECT_GE(fmpz_bits(x), 199U) << v;
    EXPECT_LE(fmpz_bits(x), 201U) << v;
    fmpz_clear(x);
  }
  compare_with_pari(values, count);
}

}  // namespace
