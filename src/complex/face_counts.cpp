// SPDX-License-Identifier: MIT
// Primorials and face dimensions of the squarefree complex.
#include "sqfc/complex/face_counts.hpp"

#include <array>
#include <string>

#include "sqfc/core/error.hpp"

namespace sqfc::complex {
namespace {
constexpr std::array<Natural, 16> first_primes = {2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53};
}

Natural primorial(int m) {
  if (m < 0 || m > 15) throw InvalidArgument("primorial index " + std::to_string(m) + " is outside [0, 15]");
  Natural product = 1;
  for (int i = 0; i < m; ++i) product *= first_primes[i];
  return product;
}

Natural odd_primorial(int m) {
  if (m < 0 || m > 14) throw InvalidArgument("odd primorial index " + std::to_string(m) + " is outside [0, 14]");
  Natural product = 1;
  for (int i = 1; i <= m; ++i) product *= first_primes[i];
  return product;
}

int max_face_dimension(Natural n) {
  int m = 0;
  while (m < 15 && primorial(m + 1) <= n) ++m;
  return m - 1;
}

}  // namespace sqfc::complex
