// SPDX-License-Identifier: MIT
// Base primes by a bit-packed sieve of Eratosthenes over the odd numbers.
#include "sqfc/arith/base_primes.hpp"

#include "sqfc/core/error.hpp"

namespace sqfc::arith {

std::vector<std::uint32_t> primes_up_to(std::uint64_t limit) {
  if (limit > 0xFFFFFFFFULL) throw InvalidArgument("base primes are limited to 2^32 - 1");
  std::vector<std::uint32_t> primes;
  if (limit < 2) return primes;
  primes.push_back(2);
  // Bit i stands for the odd number 2i + 1.
  const std::uint64_t odd_count = (limit + 1) / 2;
  std::vector<std::uint64_t> composite((odd_count + 63) / 64, 0);
  for (std::uint64_t i = 1; i < odd_count; ++i) {
    if (composite[i >> 6] >> (i & 63) & 1) continue;
    const std::uint64_t p = 2 * i + 1;
    primes.push_back(static_cast<std::uint32_t>(p));
    for (std::uint64_t j = p * p / 2; j < odd_count; j += p) composite[j >> 6] |= std::uint64_t{1} << (j & 63);
  }
  return primes;
}

}  // namespace sqfc::arith
