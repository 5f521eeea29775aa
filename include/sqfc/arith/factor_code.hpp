// SPDX-License-Identifier: MIT
/// @file factor_code.hpp  A one-byte summary of the factorisation of n, as the sieve emits it.
#pragma once

#include <cstdint>

namespace sqfc::arith {

/// Packed per-n byte: bits 0-3 omega(n) (at most 13 for n <= 10^16), bit 4 set when n is
/// squarefree, bit 5 set when Omega(n) is odd (lambda(n) = -1). Bits 6-7 are zero.
using FactorCode = std::uint8_t;

inline constexpr FactorCode code_squarefree_bit = 0x10;
inline constexpr FactorCode code_lambda_odd_bit = 0x20;
/// Number of distinct codes (bits 0-5).
inline constexpr int factor_code_count = 64;

/// omega(n) from its code.
constexpr int code_omega(FactorCode c) noexcept { return c & 0x0F; }
/// True when n is squarefree.
constexpr bool code_is_squarefree(FactorCode c) noexcept { return (c & code_squarefree_bit) != 0; }
/// lambda(n) = (-1)^Omega(n) from its code.
constexpr int code_liouville(FactorCode c) noexcept { return (c & code_lambda_odd_bit) ? -1 : 1; }
/// mu(n) from its code: 0 unless squarefree, else (-1)^omega(n).
constexpr int code_mu(FactorCode c) noexcept {
  return code_is_squarefree(c) ? ((c & 1) ? -1 : 1) : 0;
}
/// The code of an integer with the given omega, squarefreeness and Omega.
constexpr FactorCode make_factor_code(int omega, bool squarefree, int big_omega) noexcept {
  return static_cast<FactorCode>(omega | (squarefree ? code_squarefree_bit : 0) |
                                 ((big_omega & 1) ? code_lambda_odd_bit : 0));
}

}  // namespace sqfc::arith
