// SPDX-License-Identifier: MIT
/// @file number_parse.hpp  Parsing of the command line's number syntax.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace sqfc {

/// Parses a non-negative integer written as plain digits ("1000000"), a power of ten
/// ("1e9", "3e12": mantissa digits then e then exponent digits), or a power ("10^9", "2^40").
/// @param text   the text, without surrounding spaces
/// @param what   name of the quantity, used in the error message (e.g. "--to")
/// @return the value, exactly.
/// Pre: none; every malformed text is rejected (checked).
/// Complexity: O(|text|).
/// Throws: InvalidArgument when @p text is not of these forms; OverflowError when the value
/// passes 2^64 - 1.
std::uint64_t parse_natural(std::string_view text, std::string_view what);

/// Parses a comma-separated list of numbers in the syntax of parse_natural.
/// Throws: InvalidArgument on an empty list or an empty item; see parse_natural.
std::vector<std::uint64_t> parse_natural_list(std::string_view text, std::string_view what);

}  // namespace sqfc
