// SPDX-License-Identifier: MIT
// Parsing and factoring of arbitrary-size integers through FLINT's fmpz and fmpz_factor.
#include "sqfc/arith/big_factor.hpp"

#include <flint/fmpz.h>
#include <flint/fmpz_factor.h>

#include <algorithm>
#include <cstdint>
#include <string>

#include "sqfc/core/error.hpp"

namespace sqfc::arith {
namespace {

// RAII holders, so that an exception between init and clear leaks nothing.
struct BigInt {
  fmpz_t v;
  BigInt() { fmpz_init(v); }
  ~BigInt() { fmpz_clear(v); }
  BigInt(const BigInt&) = delete;
  BigInt& operator=(const BigInt&) = delete;
};

struct Factors {
  fmpz_factor_t f;
  Factors() { fmpz_factor_init(f); }
  ~Factors() { fmpz_factor_clear(f); }
  Factors(const Factors&) = delete;
  Factors& operator=(const Factors&) = delete;
};

std::string to_decimal(const fmpz_t x) {
  char* text = fmpz_get_str(nullptr, 10, x);
  std::string s(text);
  flint_free(text);
  return s;
}

bool all_digits(std::string_view s) {
  return !s.empty() && std::all_of(s.begin(), s.end(), [](char c) { return c >= '0' && c <= '9'; });
}

std::string quoted(std::string_view what, std::string_view text) {
  return std::string(what) + ": '" + std::string(text) + "'";
}

[[noreturn]] void not_a_number(std::string_view what, std::string_view text) {
  throw InvalidArgument(quoted(what, text) + " is not a number (use digits, 1e30, 10^30 or 2^200)");
}

[[noreturn]] void too_large(std::string_view what, std::string_view text) {
  throw OverflowError(quoted(what, text) + " is too large (2^" + std::to_string(max_big_natural_bits) + " or more)");
}

// Digits into x; the caller has checked that they are digits. A digit string of more than
// max_bits * log10(2) + 1 digits is too large whatever it holds, so it is refused before FLINT
// converts it (the conversion is quadratic).
void set_digits(fmpz_t x, std::string_view digits, std::string_view what, std::string_view whole) {
  const auto first = digits.find_first_not_of('0');
  if (first == std::string_view::npos) {
    fmpz_zero(x);
    return;
  }
  const std::string significant(digits.substr(first));
  if (significant.size() > max_big_natural_bits * 30103ULL / 100000ULL + 2) too_large(what, whole);
  if (fmpz_set_str(x, significant.c_str(), 10) != 0) not_a_number(what, whole);
  if (fmpz_bits(x) > max_big_natural_bits) too_large(what, whole);
}

// An exponent: digits, at most 9 of them after leading zeros (anything longer overflows the
// bit bound for every base >= 2, and bases 0 and 1 are handled before the power is taken).
std::uint64_t exponent_value(std::string_view digits, std::string_view what, std::string_view whole) {
  if (!all_digits(digits)) not_a_number(what, whole);
  const auto first = digits.find_first_not_of('0');
  if (first == std::string_view::npos) return 0;
  if (digits.size() - first > 9) return 1'000'000'000ULL;  // beyond any allowed exponent
  return std::stoull(std::string(digits.substr(first)));
}

// x = base^exponent with the bit bound checked before the power is formed:
// bits(base^e) >= e * (bits(base) - 1) + 1, so a bound violation is detected from e alone.
void set_power(fmpz_t x, const fmpz_t base, std::uint64_t exponent, std::string_view what, std::string_view whole) {
  if (exponent == 0) {
    fmpz_one(x);
    return;
  }
  if (fmpz_is_zero(base) || fmpz_is_one(base)) {
    fmpz_set(x, base);
    return;
  }
  const auto base_bits = static_cast<std::uint64_t>(fmpz_bits(base));
  if (exponent > max_big_natural_bits || (exponent - 1) * (base_bits - 1) + 1 > max_big_natural_bits)
    too_large(what, whole);
  fmpz_pow_ui(x, base, static_cast<ulong>(exponent));
  if (fmpz_bits(x) > max_big_natural_bits) too_large(what, whole);
}

}  // namespace

std::string parse_big_natural(std::string_view text, std::string_view what) {
  if (text.empty()) throw InvalidArgument(std::string(what) + ": empty value");
  BigInt value;
  if (const auto caret = text.find('^'); caret != std::string_view::npos) {
    const auto base_text = text.substr(0, caret);
    if (!all_digits(base_text)) not_a_number(what, text);
    BigInt base;
    set_digits(base.v, base_text, what, text);
    set_power(value.v, base.v, exponent_value(text.substr(caret + 1), what, text), what, text);
  } else if (const auto e = text.find_first_of("eE"); e != std::string_view::npos) {
    const auto mantissa_text = text.substr(0, e);
    if (!all_digits(mantissa_text)) not_a_number(what, text);
    BigInt mantissa, ten, scale;
    set_digits(mantissa.v, mantissa_text, what, text);
    const auto exponent = exponent_value(text.substr(e + 1), what, text);
    if (fmpz_is_zero(mantissa.v)) return "0";  // 0e5000 is 0, not an overflow
    fmpz_set_ui(ten.v, 10);
    set_power(scale.v, ten.v, exponent, what, text);
    fmpz_mul(value.v, mantissa.v, scale.v);
    if (fmpz_bits(value.v) > max_big_natural_bits) too_large(what, text);
  } else {
    if (!all_digits(text)) not_a_number(what, text);
    set_digits(value.v, text, what, text);
  }
  return to_decimal(value.v);
}

std::vector<BigPrimePower> factor_big(std::string_view decimal) {
  if (!all_digits(decimal)) throw InvalidArgument("factor_big: '" + std::string(decimal) + "' is not decimal digits");
  BigInt n;
  if (fmpz_set_str(n.v, std::string(decimal).c_str(), 10) != 0)
    throw InvalidArgument("factor_big: '" + std::string(decimal) + "' is not decimal digits");
  if (fmpz_is_zero(n.v)) throw InvalidArgument("cannot factor 0");
  std::vector<BigPrimePower> result;
  if (fmpz_is_one(n.v)) return result;
  Factors factors;
  fmpz_factor(factors.f, n.v);
  // FLINT does not promise an order; sort the indices by prime, and re-multiply as a
  // self-check (cheap next to the factoring itself).
  std::vector<slong> order(static_cast<std::size_t>(factors.f->num));
  for (slong i = 0; i < factors.f->num; ++i) order[static_cast<std::size_t>(i)] = i;
  std::sort(order.begin(), order.end(),
            [&](slong a, slong b) { return fmpz_cmp(factors.f->p + a, factors.f->p + b) < 0; });
  BigInt product, power;
  fmpz_one(product.v);
  for (const slong i : order) {
    result.push_back({to_decimal(factors.f->p + i), static_cast<int>(factors.f->exp[i])});
    fmpz_pow_ui(power.v, factors.f->p + i, factors.f->exp[i]);
    fmpz_mul(product.v, product.v, power.v);
  }
  if (!fmpz_equal(product.v, n.v) || factors.f->sign != 1)
    throw InternalError("fmpz_factor returned factors whose product is not " + std::string(decimal));
  for (std::size_t i = 1; i < result.size(); ++i)
    if (result[i].prime == result[i - 1].prime)
      throw InternalError("fmpz_factor returned the prime " + result[i].prime + " twice");
  return result;
}

std::string decimal_product(const std::vector<std::string>& factors) {
  BigInt product, x;
  fmpz_one(product.v);
  for (const auto& f : factors) {
    if (!all_digits(f) || fmpz_set_str(x.v, f.c_str(), 10) != 0)
      throw InvalidArgument("decimal_product: '" + f + "' is not decimal digits");
    fmpz_mul(product.v, product.v, x.v);
  }
  return to_decimal(product.v);
}

int compare_decimal(std::string_view a, std::string_view b) noexcept {
  if (a.size() != b.size()) return a.size() < b.size() ? -1 : 1;
  return a.compare(b) < 0 ? -1 : (a == b ? 0 : 1);
}

}  // namespace sqfc::arith
