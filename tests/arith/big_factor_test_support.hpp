// SPDX-License-Identifier: MIT
// Random integers of controlled shape for the FLINT-against-PARI factoring tests.
#pragma once

#include <flint/fmpz.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <string>
#include <utility>
#include <vector>

#include "oracles/pari_oracle.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/big_factor.hpp"

namespace sqfc::big_factor_test {

using sqfc::arith::factor_big;

using Pairs = std::vector<std::pair<std::string, int>>;

inline Pairs as_pairs(const std::vector<sqfc::arith::BigPrimePower>& f) {
  Pairs p;
  for (const auto& x : f) p.emplace_back(x.prime, x.exponent);
  return p;
}

// A uniformly random integer with exactly `bits` bits (top bit set), in decimal.
inline std::string random_integer(std::mt19937_64& rng, unsigned bits) {
  std::string binary(bits, '0');
  binary[0] = '1';
  for (unsigned i = 1; i < bits; ++i) binary[i] = (rng() & 1) ? '1' : '0';
  fmpz_t x;
  fmpz_init(x);
  fmpz_set_str(x, binary.c_str(), 2);
  char* text = fmpz_get_str(nullptr, 10, x);
  std::string s(text);
  flint_free(text);
  fmpz_clear(x);
  return s;
}

// The next prime after a random integer of `bits` bits (FLINT's fmpz_nextprime, proved).
inline std::string random_prime(std::mt19937_64& rng, unsigned bits) {
  const std::string start = random_integer(rng, bits);
  fmpz_t x, p;
  fmpz_init(x);
  fmpz_init(p);
  fmpz_set_str(x, start.c_str(), 10);
  fmpz_nextprime(p, x, 1);
  char* text = fmpz_get_str(nullptr, 10, p);
  std::string s(text);
  flint_free(text);
  fmpz_clear(x);
  fmpz_clear(p);
  return s;
}

// A product of random primes of 2..max_prime_bits bits (some squared) with bits(product) in
// [bits - 1, bits + 1]: every prime is small enough for both libraries to find it fast.
inline std::string random_product(std::mt19937_64& rng, unsigned bits, unsigned max_prime_bits) {
  fmpz_t product, p;
  fmpz_init(product);
  fmpz_init(p);
  fmpz_one(product);
  for (int guard = 0; guard < 1000; ++guard) {
    const unsigned have = static_cast<unsigned>(fmpz_bits(product));
    if (have + 2 > bits) break;
    const unsigned b = std::min<unsigned>(2 + static_cast<unsigned>(rng() % (max_prime_bits - 1)), bits - have);
    fmpz_set_str(p, random_prime(rng, b).c_str(), 10);
    const int e = (rng() % 6 == 0 && have + 2 * b + 1 <= bits) ? 2 : 1;
    for (int i = 0; i < e; ++i) fmpz_mul(product, product, p);
  }
  char* text = fmpz_get_str(nullptr, 10, product);
  std::string s(text);
  flint_free(text);
  fmpz_clear(product);
  fmpz_clear(p);
  return s;
}

// FLINT against PARI (pari_factor_decimal) on random integers of each size.
inline void compare_with_pari(const std::vector<std::string>& values, std::size_t expected) {
  std::size_t checked = 0;
  for (const auto& n : values) {
    EXPECT_EQ(as_pairs(factor_big(n)), sqfc::oracles::pari_factor_decimal(n)) << "n = " << n << ' ' << sqfc::testing::seed_note();
    ++checked;
  }
  EXPECT_EQ(checked, expected);
}


/// n random integers of `bits` bits: uniformly random for odd i, products of primes of at most
/// `max_prime_bits` bits (bits(product) in [bits - 1, bits + 1]) for even i, or all products.
inline std::vector<std::string> random_cases(std::uint64_t salt, std::size_t n, unsigned bits, unsigned max_prime_bits,
                                             bool products_only) {
  auto rng = sqfc::testing::test_rng(salt);
  std::vector<std::string> values;
  for (std::size_t i = 0; i < n; ++i)
    values.push_back(!products_only && i % 2 ? random_integer(rng, bits) : random_product(rng, bits, max_prime_bits));
  return values;
}

}  // namespace sqfc::big_factor_test
