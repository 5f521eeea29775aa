// SPDX-License-Identifier: MIT
// A positive integer as a face of the squarefree complex: its prime set, dimension and boundary.
#include "sqfc/complex/face.hpp"

#include <utility>

#include "sqfc/core/error.hpp"

namespace sqfc::complex {

FaceDescription describe_face(const std::string& decimal) {
  return describe_face_from(decimal, arith::factor_big(decimal));
}

FaceDescription describe_face_from(const std::string& decimal, std::vector<arith::BigPrimePower> factorisation) {
  FaceDescription d;
  d.value = decimal;
  d.factorisation = std::move(factorisation);
  d.omega = static_cast<int>(d.factorisation.size());
  d.big_omega = 0;
  d.squarefree = true;
  for (const auto& f : d.factorisation) {
    d.big_omega += f.exponent;
    d.squarefree = d.squarefree && f.exponent == 1;
  }
  d.mu = !d.squarefree ? 0 : (d.omega % 2 == 0 ? 1 : -1);
  d.dimension = -1;
  if (d.factorisation.empty()) {
    d.kind = FaceKind::empty;
    return d;
  }
  if (!d.squarefree) {
    d.kind = FaceKind::not_a_face;
    return d;
  }
  d.kind = FaceKind::face;
  d.dimension = d.omega - 1;
  for (const auto& f : d.factorisation) d.primes.push_back(f.prime);
  // K / p is the product of the other primes: multiplying is exact and needs no division.
  for (std::size_t i = 0; i < d.primes.size(); ++i) {
    BoundaryFace b;
    b.removed_prime = d.primes[i];
    for (std::size_t j = 0; j < d.primes.size(); ++j)
      if (j != i) b.primes.push_back(d.primes[j]);
    b.value = arith::decimal_product(b.primes);
    b.dimension = d.dimension - 1;
    d.boundary.push_back(std::move(b));
  }
  return d;
}

}  // namespace sqfc::complex
