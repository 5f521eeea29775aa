// SPDX-License-Identifier: MIT
/// @file fredholm_checks.hpp  Independent exact checks of the Fredholm determinant and Green function
/// of H_n (and the exploratory determinant of G_n), computed with FLINT instead of by bordering.
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::linalg {

class BorderedGreen;

/// A dense square integer matrix, row-major: entry (i, j) is entries[i * dimension + j].
/// Invariant: entries.size() == dimension * dimension.
struct SquareMatrix {
  std::size_t dimension = 0;
  std::vector<std::int64_t> entries;

  SquareMatrix() = default;
  /// The zero matrix of the given dimension. Complexity: 8 * dimension^2 bytes.
  explicit SquareMatrix(std::size_t dim) : dimension(dim), entries(dim * dim, 0) {}
  /// Entry (i, j), 0-based. Pre: i, j < dimension (assumed).
  [[nodiscard]] std::int64_t& at(std::size_t i, std::size_t j) noexcept { return entries[i * dimension + j]; }
  [[nodiscard]] std::int64_t at(std::size_t i, std::size_t j) const noexcept { return entries[i * dimension + j]; }
  friend bool operator==(const SquareMatrix&, const SquareMatrix&) = default;
};

/// An exact integer of any size: always its decimal text, and its value when it fits 64 bits.
struct ExactInteger {
  std::string decimal;                ///< e.g. "-1", "0", "123456789012345678901234567890"
  std::optional<std::int64_t> value;  ///< set exactly when the integer lies in [-2^63, 2^63)
  /// The integer v.
  static ExactInteger of(std::int64_t v) { return {std::to_string(v), v}; }
  friend bool operator==(const ExactInteger&, const ExactInteger&) = default;
};

/// Largest n (the last vertex used) that the FLINT determinant routines on graphs accept: 2000,
/// the range of issue 4. fmpz_mat_det of 1 + A(H_2000) (1214 vertices) takes 25-29 s on one core
/// (development machine, g++ 12.2, Release, FLINT 2.9, 2026-12).
inline constexpr Natural max_exact_determinant_n = 2000;
/// Largest n that characteristic_polynomial accepts: 300 (182 vertices, about 0.1 s).
inline constexpr Natural max_characteristic_polynomial_n = 300;
/// The modulus used when none is given: the least prime above 2^62 (FLINT's n_nextprime).
inline constexpr std::uint64_t default_determinant_prime = 4611686018427388039ULL;

/// 1 + A(H) on vertices [0, count): 1 on the diagonal, 1 where gcd(x, y) > 1, else 0.
/// Pre: count <= vertices.size() (checked; InvalidArgument); vertices squarefree, >= 2 (assumed).
/// Complexity: O(count^2 log max) time, 8 count^2 bytes.
SquareMatrix shared_factor_fredholm_matrix(const std::vector<Natural>& vertices, std::size_t count);

/// 1 + A(G) on vertices [0, count): 1 on the diagonal, 1 where one vertex properly divides the other.
/// Pre and complexity as shared_factor_fredholm_matrix.
SquareMatrix divisibility_fredholm_matrix(const std::vector<Natural>& vertices, std::size_t count);

/// det(m) exactly by FLINT's fmpz_mat_det (1 for the 0 x 0 matrix).
/// Complexity: FLINT's; for a 0/1 matrix about V^3 word operations times the number of
/// primes its determinant bound needs (25-29 s for V = 1214 on one core).
ExactInteger determinant_flint(const SquareMatrix& m);

/// The leading principal minors det(m[0..k, 0..k]) for k = 1, 2, ..., from one fraction-free
/// (Bareiss) elimination by FLINT's fmpz_mat_fflu: with no row exchange, the k-th pivot of that
/// elimination is the k-th leading principal minor (Sylvester's determinant identity).
/// @return entry k - 1 is the minor of size k. Stops after the first zero minor (FLINT then
///         exchanges rows and later pivots are minors of another matrix), so the result is
///         shorter than m.dimension exactly when some leading minor is 0, and then ends with "0".
/// Complexity: O(V^3) operations on integers as large as the minors of m; memory O(V^2).
/// For 1 + A(H_2000) all minors are +-1 and it takes about 1.4 s.
std::vector<ExactInteger> leading_principal_minors_flint(const SquareMatrix& m);

/// det(m) modulo a prime p, by FLINT's nmod_mat_det; entries are reduced mod p first.
/// @return the residue in [0, p).
/// Pre: p prime (checked by n_is_prime; InvalidArgument). Complexity: O(V^3) word operations
/// (about 0.4 s for V = 1214).
std::uint64_t determinant_mod_prime(const SquareMatrix& m, std::uint64_t p);

/// True when m * g = I exactly (integer products, no rounding): then det m = +-1, because
/// det m * det g = 1 with both integers. Rows of m are taken sparsely (its nonzero entries).
/// The product is summed in 64 bits when max |g| * max row sum of |m| < 2^63 (always so for
/// the Green functions here), otherwise in 128 bits; if even that could overflow it throws.
/// @param threads worker threads for the row ranges (>= 1; 0 counts as 1).
/// Pre: equal dimensions (checked; InvalidArgument).
/// Complexity: O(V * nnz(m)) operations; 0.15 s for 1 + A(H_2000) on two threads.
/// Throws: OverflowError when even 128 bits could overflow.
bool is_inverse(const SquareMatrix& m, const SquareMatrix& g, unsigned threads = 1);

/// Certificate that `g` (its first g.size() vertices) is the inverse of 1 + A(H) on
/// vertices [0, g.size()): forms both matrices and calls is_inverse.
/// Pre: g.size() <= vertices.size() (checked; InvalidArgument).
/// Complexity: O(V^2 log max) to form the matrices, 16 V^2 bytes, then as is_inverse.
bool certify_inverse(const std::vector<Natural>& vertices, const BorderedGreen& g, unsigned threads = 1);
/// The same for a candidate inverse given as a matrix (dimension = number of vertices used).
bool certify_inverse(const std::vector<Natural>& vertices, const SquareMatrix& g, unsigned threads = 1);

/// The sign of det(1 + A(H)) on vertices [0, count) read modulo the prime p:
/// +1 when det = 1 mod p, -1 when det = -1 mod p, 0 otherwise. Together with a certified integral
/// inverse (which proves det = +-1) this proves the sign, as 1 != -1 mod p for p > 2.
/// Pre: count <= vertices.size(), p an odd prime (checked; InvalidArgument).
/// Complexity: as determinant_mod_prime.
int determinant_sign_mod_prime(const std::vector<Natural>& vertices, std::size_t count,
                               std::uint64_t p = default_determinant_prime);

/// det(1 + A(H)) of the graph that `g` holds, proven without trusting the bordering: +-1 when
/// certify_inverse holds and the residue mod p is +-1, and 0 when either fails.
/// Pre: as certify_inverse and determinant_sign_mod_prime. Complexity: both of those.
int certified_fredholm_determinant(const std::vector<Natural>& vertices, const BorderedGreen& g,
                                   unsigned threads = 1, std::uint64_t p = default_determinant_prime);

/// det(1 + A(H)) on vertices [0, count) by fmpz_mat_det (design.md identity 3 says it is
/// prod -mu(k); this routine does not assume so).
/// Pre: count <= vertices.size(); the last vertex used is <= max_exact_determinant_n
/// (both checked; InvalidArgument). Complexity: as determinant_flint.
ExactInteger fredholm_determinant_flint(const std::vector<Natural>& vertices, std::size_t count);

/// det(1 + A(H)) for every prefix: entry k - 1 is the determinant on vertices [0, k), that is
/// D(n) for n = vertices[k - 1], by leading_principal_minors_flint of the largest matrix.
/// Pre: as fredholm_determinant_flint. Complexity: as leading_principal_minors_flint.
std::vector<ExactInteger> fredholm_determinants_of_prefixes_flint(const std::vector<Natural>& vertices,
                                                                 std::size_t count);

/// det(1 + A(G)) of the divisibility graph on vertices [0, count), exactly, by fmpz_mat_det.
/// Exploratory: no theorem claims its value (it is 0 at n = 1000 and n = 2000).
/// Pre: as fredholm_determinant_flint. Complexity: as determinant_flint (about 9 s for n = 2000).
ExactInteger divisibility_fredholm_determinant(const std::vector<Natural>& vertices, std::size_t count);

/// Coefficients of p(x) = det(x - A(H)) on vertices [0, count) by fmpz_mat_charpoly:
/// entry k is the coefficient of x^k, k = 0..count (so the last entry is 1).
/// Pre: count <= vertices.size(); the last vertex used is <= max_characteristic_polynomial_n
/// (checked; InvalidArgument). Complexity: FLINT's multimodular method, O(V^4) at worst.
std::vector<ExactInteger> characteristic_polynomial(const std::vector<Natural>& vertices, std::size_t count);
/// The same for any square matrix (no size limit).
std::vector<ExactInteger> characteristic_polynomial_flint(const SquareMatrix& m);

/// det(1 - z A) = z^V p(1/z) = sum_k c_k z^(V-k) for the characteristic polynomial p = sum c_k x^k
/// of a V x V matrix A: the reciprocal of the Bowen–Lanford zeta function zeta(z) = 1/det(1 - z A).
/// At z = -1 it is det(1 + A) = (-1)^V p(-1).
/// Pre: charpoly nonempty with decimal coefficients (checked; InvalidArgument). Complexity: O(V) big-integer operations.
ExactInteger reciprocal_zeta_value(const std::vector<ExactInteger>& charpoly, std::int64_t z);

/// Result of the Bowen–Lanford zeta check det(1 + A) = 1/zeta(-1) on one graph.
struct ZetaIdentityCheck {
  std::size_t vertices = 0;
  ExactInteger from_zeta;        ///< 1/zeta(-1) = (-1)^V p(-1) from the characteristic polynomial
  ExactInteger from_determinant; ///< det(1 + A) by fmpz_mat_det
  [[nodiscard]] bool holds() const { return from_zeta == from_determinant; }
};

/// Computes both sides of det(1 + A(H)) = 1/zeta(-1) on vertices [0, count).
/// Pre and complexity: as characteristic_polynomial.
ZetaIdentityCheck check_zeta_identity(const std::vector<Natural>& vertices, std::size_t count);

}  // namespace sqfc::linalg
