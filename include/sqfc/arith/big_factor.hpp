// SPDX-License-Identifier: MIT
/// @file big_factor.hpp  Parsing and factoring of positive integers of any size (FLINT fmpz).
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace sqfc::arith {

/// Values must stay below 2^max_big_natural_bits (at most this many bits). Factoring time, not memory, is what limits
/// useful inputs (it grows with the second largest prime factor); the bound only stops a
/// mistyped exponent such as 2^99999999 from allocating gigabytes. Allowed: any value >= 64.
inline constexpr unsigned max_big_natural_bits = 4096;

/// Parses a non-negative integer of any size in the command-line syntax of parse_natural:
/// plain digits, mantissa digits `e` exponent digits ("1e30"), or base `^` exponent ("2^200").
/// @param text  the text, without surrounding spaces
/// @param what  name of the quantity for error messages (e.g. "K")
/// @return the value as canonical decimal digits (no leading zeros; "0" for zero).
/// Pre: none; every malformed text is rejected (checked).
/// Complexity: O(b^2) word operations for a b-bit value at most (FLINT's conversions).
/// Throws: InvalidArgument when @p text is not of these forms; OverflowError when the value
/// has more than max_big_natural_bits bits.
std::string parse_big_natural(std::string_view text, std::string_view what);

/// One prime power p^e of a factorisation; p in decimal digits.
struct BigPrimePower {
  std::string prime;  ///< the prime, canonical decimal
  int exponent;       ///< e >= 1
};

/// Prime factorisation of a positive integer given in decimal, by FLINT's fmpz_factor.
/// @param decimal  canonical or non-canonical decimal digits of n (leading zeros allowed)
/// @return (prime, exponent) pairs in increasing prime order; empty for n = 1.
/// Pre: @p decimal is non-empty digits with value >= 1 (checked; InvalidArgument).
/// Complexity: trial division, then Pollard rho / ECM / quadratic sieve inside FLINT; fast when
/// the second largest prime factor has at most about 30 digits, unbounded in general.
/// Throws: InvalidArgument; InternalError if the product of the factors is not n (self-check).
std::vector<BigPrimePower> factor_big(std::string_view decimal);

/// The product of integers given in decimal ("1" for an empty list).
/// Pre: every item is non-empty digits (checked; InvalidArgument). Complexity: O(total size^2).
std::string decimal_product(const std::vector<std::string>& factors);

/// Compares two canonical decimal strings as numbers: negative, zero or positive.
/// Pre: both canonical (no leading zeros; assumed). Complexity: O(length).
int compare_decimal(std::string_view a, std::string_view b) noexcept;

}  // namespace sqfc::arith
