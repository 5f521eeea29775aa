// SPDX-License-Identifier: MIT
// The accepted edge of primes_up_to: the largest limit, 2^32 - 1 (about 30 s and 1.3 GB).
#include <gtest/gtest.h>

#include <cstdint>

#include "oracles/pari_oracle.hpp"
#include "sqfc/arith/base_primes.hpp"

namespace {

TEST(BasePrimesSlow, LargestAcceptedLimit) {
  const auto primes = sqfc::arith::primes_up_to(0xFFFFFFFFULL);
  // pi(2^32) = 203280221: OEIS A007053 (2^32 itself is even, so pi(2^32 - 1) is the same).
  ASSERT_EQ(primes.size(), 203280221U);
  // The largest prime below 2^32 is 4294967291 (from memory); PARI confirms it and that the
  // four numbers above it are composite.
  EXPECT_EQ(primes.back(), 4294967291U);
  EXPECT_TRUE(sqfc::oracles::pari_is_prime(4294967291ULL));
  int checked = 0;
  for (std::uint64_t n = 4294967292ULL; n <= 0xFFFFFFFFULL; ++n, ++checked) EXPECT_FALSE(sqfc::oracles::pari_is_prime(n));
  EXPECT_EQ(checked, 4);
  // The last 1000 listed primes are exactly PARI's primes in that stretch.
  std::uint64_t listed = 0;
  std::size_t index = primes.size() - 1000;
  for (std::uint64_t n = primes[index]; n <= 0xFFFFFFFFULL; ++n) {
    if (!sqfc::oracles::pari_is_prime(n)) continue;
    ASSERT_EQ(primes[index], n);
    ++index;
    ++listed;
  }
  EXPECT_EQ(listed, 1000U);
}

}  // namespace
