// SPDX-License-Identifier: MIT
/// @file factor.hpp  Factorisation of single integers with FLINT, and the arithmetic functions it gives.
#pragma once

#include <cstdint>
#include <utility>
#include <vector>

namespace sqfc::arith {

/// Prime factorisation of n as (prime, exponent) pairs in increasing prime order; empty for n = 1.
/// Pre: n >= 1 (checked; InvalidArgument).
/// Complexity: FLINT's n_factor (trial division, then SQUFOF/ECM); fast for 64-bit n.
std::vector<std::pair<std::uint64_t, int>> factor_u64(std::uint64_t n);

/// Arithmetic functions of one integer, from its factorisation.
struct ArithmeticValues {
  int mu;         ///< Moebius function
  int omega;      ///< distinct prime factors
  int big_omega;  ///< prime factors with multiplicity
};

/// mu, omega and Omega of n by factoring it. Pre: n >= 1 (checked). Complexity: as factor_u64.
ArithmeticValues arithmetic_values(std::uint64_t n);

}  // namespace sqfc::arith
