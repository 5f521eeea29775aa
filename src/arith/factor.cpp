// SPDX-License-Identifier: MIT
// Factoring of 64-bit integers through FLINT's ulong_extras.
#include "sqfc/arith/factor.hpp"

#include <flint/ulong_extras.h>

#include <algorithm>

#include "sqfc/core/error.hpp"

namespace sqfc::arith {

std::vector<std::pair<std::uint64_t, int>> factor_u64(std::uint64_t n) {
  if (n == 0) throw InvalidArgument("cannot factor 0");
  std::vector<std::pair<std::uint64_t, int>> result;
  if (n == 1) return result;
  n_factor_t factors;
  n_factor_init(&factors);
  n_factor(&factors, n, 1);  // proved primality of the factors
  for (int i = 0; i < factors.num; ++i) result.emplace_back(factors.p[i], static_cast<int>(factors.exp[i]));
  std::sort(result.begin(), result.end());
  return result;
}

ArithmeticValues arithmetic_values(std::uint64_t n) {
  ArithmeticValues v{0, 0, 0};
  bool squarefree = true;
  for (const auto& [p, e] : factor_u64(n)) {
    ++v.omega;
    v.big_omega += e;
    squarefree = squarefree && e == 1;
  }
  v.mu = squarefree ? (v.omega % 2 == 0 ? 1 : -1) : 0;
  return v;
}

}  // namespace sqfc::arith
