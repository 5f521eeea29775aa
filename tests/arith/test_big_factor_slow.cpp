// SPDX-License-Identifier: MIT
// Longer FLINT-against-PARI factoring runs: 128-bit random integers and 200-bit products of
// primes of up to 50 bits (the default suite runs a few of each with smaller primes).
// Expected values: PARI's factor (reference library, tests/oracles/pari_oracle.hpp) and, for the
// products, the primes the test multiplied together.
#include <gtest/gtest.h>

#include "big_factor_test_support.hpp"

namespace {

using sqfc::big_factor_test::compare_with_pari;
using sqfc::big_factor_test::random_cases;

TEST(FactorBigSlow, MatchesPariOnRandom128BitIntegers) {
  const std::size_t count = 60 * sqfc::testing::test_multiplier();
  compare_with_pari(random_cases(11281, count, 128, 64, false), count);
}

TEST(FactorBigSlow, MatchesPariOnRandom200BitProducts) {
  const std::size_t count = 60 * sqfc::testing::test_multiplier();
  compare_with_pari(random_cases(12001, count, 200, 50, true), count);
}

}  // namespace
