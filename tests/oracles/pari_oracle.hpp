// SPDX-License-Identifier: MIT
// PARI/GP (libpari) as a reference library for tests: arithmetic functions, factorisations,
// primality and prime counts of 64-bit integers, and determinants of integer matrices.
//
// Only plain C++ types cross this header: PARI and FLINT both define `ulong`, so pari.h is
// included by pari_oracle.cpp alone and no test translation unit ever sees it.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

namespace sqfc::oracles {

/// mu(n), omega(n) and Omega(n) as PARI computes them.
struct PariArithmetic {
  int mu;
  int omega;
  int big_omega;
};

/// PARI's moebius, omega and bigomega of one integer (applied to PARI's factor(n)).
/// Pre: n >= 1 (checked; std::invalid_argument).
/// Thread-safety: PARI keeps its stack per thread (the Debian build is the TLS one), so every
/// call must come from the thread that made the first call (checked; std::logic_error).
PariArithmetic pari_arithmetic(std::uint64_t n);

/// The same for every n in the half-open range [lo, hi), index i standing for n = lo + i.
/// Pre: 1 <= lo <= hi (checked; std::invalid_argument). Thread-safety: as pari_arithmetic.
std::vector<PariArithmetic> pari_arithmetic_range(std::uint64_t lo, std::uint64_t hi);

/// PARI's factor(n) as (prime, exponent) pairs in increasing prime order; empty for n = 1.
/// Pre: n >= 1 (checked; std::invalid_argument). Thread-safety: as pari_arithmetic.
std::vector<std::pair<std::uint64_t, int>> pari_factor(std::uint64_t n);

/// PARI's factor(n) for an integer of any size given in decimal digits: (prime in decimal,
/// exponent) pairs in increasing prime order; empty for n = 1.
/// Pre: @p decimal is non-empty digits with value >= 1 (checked; std::invalid_argument).
/// Thread-safety: as pari_arithmetic.
std::vector<std::pair<std::string, int>> pari_factor_decimal(const std::string& decimal);

/// PARI's isprime(n): a proven answer (BPSW is a proof below 2^64). Thread-safety: as above.
bool pari_is_prime(std::uint64_t n);

/// PARI's primepi(x): the number of primes p <= x. Thread-safety: as above.
std::uint64_t pari_prime_count(std::uint64_t x);

/// PARI's matdet (det) of the dimension x dimension integer matrix whose row-major entries are
/// given, as a decimal string ("1" for the 0 x 0 matrix).
/// Pre: entries.size() == dimension^2 (checked; std::invalid_argument); the matrix and PARI's
/// work on it fit the PARI stack (256 MiB: enough for the 0/1 matrices of H_2000 and G_2000,
/// 1214 x 1214). Thread-safety: as above.
std::string pari_determinant(const std::vector<std::int64_t>& entries, std::size_t dimension);

}  // namespace sqfc::oracles
