// SPDX-License-Identifier: MIT
/// @file face.hpp  One positive integer K seen as a face of the squarefree complex (any size).
#pragma once

#include <string>
#include <vector>

#include "sqfc/arith/big_factor.hpp"

namespace sqfc::complex {

/// What K is in the squarefree complex: K = 1 is the empty face (dimension -1, a face of no
/// K_n, whose faces start at 2); a squarefree K >= 2 is the face {p1, ..., pm}; a K divisible
/// by a square is no face at all.
enum class FaceKind { empty, face, not_a_face };

/// One boundary face K / p of a face K (design.md section 1).
struct BoundaryFace {
  std::string removed_prime;        ///< p, decimal
  std::string value;                ///< K / p, decimal ("1" when K is a vertex)
  std::vector<std::string> primes;  ///< the prime set of K / p, increasing (empty for "1")
  int dimension;                    ///< omega(K) - 2 (-1: the empty face)
};

/// The description of K as a face.
/// Invariant: kind == face exactly when K >= 2 and every exponent is 1; then primes lists the
/// factorisation's primes, dimension = omega - 1 and boundary has one entry per prime, in the
/// order of the primes; for the other kinds primes and boundary are empty and dimension is -1.
struct FaceDescription {
  std::string value;                                 ///< K, canonical decimal
  std::vector<arith::BigPrimePower> factorisation;   ///< increasing primes; empty for K = 1
  FaceKind kind;
  bool squarefree;                                   ///< no exponent above 1 (true for K = 1)
  int mu;                                            ///< Moebius function mu(K)
  int omega;                                         ///< distinct primes of K
  int big_omega;                                     ///< primes of K with multiplicity
  int dimension;                                     ///< omega - 1 for a face, -1 otherwise
  std::vector<std::string> primes;                   ///< the vertex set of the face
  std::vector<BoundaryFace> boundary;                ///< the faces K / p
};

/// Factors K (FLINT fmpz_factor) and describes it as a face.
/// @param decimal  K in decimal digits (as parse_big_natural returns it)
/// Pre: K >= 1 (checked; InvalidArgument).
/// Complexity: that of arith::factor_big, plus O(omega^2 * size of K) for the boundary.
/// Throws: InvalidArgument; see arith::factor_big.
FaceDescription describe_face(const std::string& decimal);

/// The face description of K from a known factorisation (no factoring). Pre: factorisation is
/// that of K, increasing primes (assumed). Complexity: O(omega^2 * size of K).
FaceDescription describe_face_from(const std::string& decimal, std::vector<arith::BigPrimePower> factorisation);

}  // namespace sqfc::complex
