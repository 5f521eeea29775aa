// SPDX-License-Identifier: MIT
// The sieve against trial division and FLINT at every n <= 10^6 (about 1 s, hence `slow`; the
// default suite's test_sieve.cpp does the same up to 2*10^5).
#include <gtest/gtest.h>

#include <cstdint>
#include <string>

#include "arith/sieve_test_support.hpp"
#include "oracles/brute_force.hpp"
#include "sqfc/arith/factor.hpp"
#include "sqfc/arith/sieve.hpp"

namespace {

using sqfc::Natural;

TEST(SieveExhaustiveSlow, EveryNUpToOneMillion) {
  const Natural hi = 1'000'001;
  const sqfc::arith::SieveTables tables(hi - 1);
  std::uint64_t blocks = 0;
  const auto values = sqfc::testing::sieve_values(tables, 1, hi, 1U << 17, &blocks);
  ASSERT_EQ(values.size(), 1'000'000U);
  EXPECT_EQ(blocks, 8U);  // ceil(10^6 / 2^17)
  std::string report;
  EXPECT_EQ(sqfc::testing::count_mismatches(values, 1, [](Natural n) { return sqfc::oracles::arithmetic_naive(n); }, &report),
            0U)
      << report;
  EXPECT_EQ(sqfc::testing::count_mismatches(values, 1, [](Natural n) { return sqfc::arith::arithmetic_values(n); }, &report),
            0U)
      << report;
  // The smallest block size gives the same values.
  EXPECT_TRUE(sqfc::testing::same_values(sqfc::testing::sieve_values(tables, 1, hi, 1U << 10), values));
  // Summary counts at 10^6: 607926 squarefree (OEIS A071172) and M(10^6) = 212 (OEIS
  // A084237), both from memory and in tests/data/*_powers_of_ten.csv.
  std::int64_t mertens = 0;
  std::uint64_t squarefree = 0;
  for (const auto& v : values) mertens += v.mu, squarefree += v.squarefree ? 1 : 0;
  EXPECT_EQ(squarefree, 607926U);
  EXPECT_EQ(mertens, 212);
}

}  // namespace
