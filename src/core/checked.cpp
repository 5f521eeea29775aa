// SPDX-License-Identifier: MIT
// Exact integer square root and 128-bit printing.
#include "sqfc/core/checked.hpp"

#include <algorithm>
#include <cmath>

namespace sqfc {

std::uint64_t integer_sqrt(std::uint64_t n) noexcept {
  auto r = static_cast<std::uint64_t>(std::sqrt(static_cast<long double>(n)));
  // The long double root is within one of the truth; fix it with exact 128-bit squares.
  while (r > 0 && static_cast<WideUnsigned>(r) * r > n) --r;
  while (static_cast<WideUnsigned>(r + 1) * (r + 1) <= n) ++r;
  return r;
}

std::string to_string_wide(Wide value) {
  if (value == 0) return "0";
  const bool negative = value < 0;
  WideUnsigned magnitude = negative ? static_cast<WideUnsigned>(-(value + 1)) + 1 : static_cast<WideUnsigned>(value);
  std::string digits;
  while (magnitude > 0) {
    digits.push_back(static_cast<char>('0' + static_cast<int>(magnitude % 10)));
    magnitude /= 10;
  }
  if (negative) digits.push_back('-');
  std::reverse(digits.begin(), digits.end());
  return digits;
}

}  // namespace sqfc
