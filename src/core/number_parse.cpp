// SPDX-License-Identifier: MIT
// The number syntax of the command line: digits, 1e9, 10^9, 2^40.
#include "sqfc/core/number_parse.hpp"

#include "sqfc/core/error.hpp"

namespace sqfc {
namespace {

std::string quoted(std::string_view what, std::string_view text) {
  return std::string(what) + ": '" + std::string(text) + "'";
}

// Plain decimal digits; the caller names the whole token in errors.
std::uint64_t parse_digits(std::string_view digits, std::string_view what, std::string_view whole) {
  if (digits.empty())
    throw InvalidArgument(quoted(what, whole) + " is not a number (use digits, 1e9, 10^9 or 2^40)");
  std::uint64_t value = 0;
  for (char c : digits) {
    if (c < '0' || c > '9')
      throw InvalidArgument(quoted(what, whole) + " is not a number (use digits, 1e9, 10^9 or 2^40)");
    if (__builtin_mul_overflow(value, std::uint64_t{10}, &value) ||
        __builtin_add_overflow(value, static_cast<std::uint64_t>(c - '0'), &value))
      throw OverflowError(quoted(what, whole) + " is too large (above 2^64 - 1)");
  }
  return value;
}

std::uint64_t power(std::uint64_t base, std::uint64_t exponent, std::string_view what, std::string_view whole) {
  std::uint64_t result = 1;
  for (std::uint64_t i = 0; i < exponent; ++i) {
    if (__builtin_mul_overflow(result, base, &result))
      throw OverflowError(quoted(what, whole) + " is too large (above 2^64 - 1)");
    if (result == 0 || result == 1) break;  // 0^k and 1^k stay put; avoids long loops
  }
  return result;
}

}  // namespace

std::uint64_t parse_natural(std::string_view text, std::string_view what) {
  if (text.empty()) throw InvalidArgument(std::string(what) + ": empty value");
  if (const auto caret = text.find('^'); caret != std::string_view::npos) {
    const auto base = parse_digits(text.substr(0, caret), what, text);
    const auto exponent = parse_digits(text.substr(caret + 1), what, text);
    return power(base, exponent, what, text);
  }
  if (const auto e = text.find_first_of("eE"); e != std::string_view::npos) {
    const auto mantissa = parse_digits(text.substr(0, e), what, text);
    const auto exponent = parse_digits(text.substr(e + 1), what, text);
    if (mantissa == 0) return 0;  // 0e20 is 0, not an overflow of 10^20
    const auto scale = power(10, exponent, what, text);
    std::uint64_t value = 0;
    if (__builtin_mul_overflow(mantissa, scale, &value))
      throw OverflowError(quoted(what, text) + " is too large (above 2^64 - 1)");
    return value;
  }
  return parse_digits(text, what, text);
}

std::vector<std::uint64_t> parse_natural_list(std::string_view text, std::string_view what) {
  std::vector<std::uint64_t> values;
  if (text.empty()) throw InvalidArgument(std::string(what) + ": empty list");
  std::size_t start = 0;
  while (true) {
    const auto comma = text.find(',', start);
    const auto item = text.substr(start, comma == std::string_view::npos ? std::string_view::npos : comma - start);
    if (item.empty()) throw InvalidArgument(std::string(what) + ": empty item in list '" + std::string(text) + "'");
    values.push_back(parse_natural(item, what));
    if (comma == std::string_view::npos) break;
    start = comma + 1;
  }
  return values;
}

}  // namespace sqfc
