// SPDX-License-Identifier: MIT
// Independent exact checks of det(1 + A) and of the Green function, with FLINT.
#include "sqfc/linalg/fredholm_checks.hpp"

#include <flint/fmpz.h>
#include <flint/fmpz_mat.h>
#include <flint/fmpz_poly.h>
#include <flint/nmod_mat.h>
#include <flint/ulong_extras.h>

#include <algorithm>
#include <numeric>
#include <thread>

#include "sqfc/core/error.hpp"
#include "sqfc/linalg/bordered_green.hpp"

namespace sqfc::linalg {
namespace {

// RAII owners of the FLINT objects, so that an exception cannot leak them.
struct FlintInteger {
  fmpz_t value;
  FlintInteger() { fmpz_init(value); }
  ~FlintInteger() { fmpz_clear(value); }
  FlintInteger(const FlintInteger&) = delete;
  FlintInteger& operator=(const FlintInteger&) = delete;
};

struct FlintMatrix {
  fmpz_mat_t value;
  explicit FlintMatrix(const SquareMatrix& m) {
    const auto d = static_cast<slong>(m.dimension);
    fmpz_mat_init(value, d, d);
    for (std::size_t i = 0; i < m.dimension; ++i)
      for (std::size_t j = 0; j < m.dimension; ++j)
        fmpz_set_si(fmpz_mat_entry(value, static_cast<slong>(i), static_cast<slong>(j)), static_cast<slong>(m.at(i, j)));
  }
  explicit FlintMatrix(std::size_t d) { fmpz_mat_init(value, static_cast<slong>(d), static_cast<slong>(d)); }
  ~FlintMatrix() { fmpz_mat_clear(value); }
  FlintMatrix(const FlintMatrix&) = delete;
  FlintMatrix& operator=(const FlintMatrix&) = delete;
};

ExactInteger to_exact(const fmpz_t x) {
  ExactInteger result;
  char* text = fmpz_get_str(nullptr, 10, x);
  result.decimal = text;
  flint_free(text);
  if (fmpz_fits_si(x)) result.value = static_cast<std::int64_t>(fmpz_get_si(x));
  return result;
}

void require_count(const std::vector<Natural>& vertices, std::size_t count) {
  if (count > vertices.size())
    throw InvalidArgument("the matrix needs " + std::to_string(count) + " vertices but only " +
                          std::to_string(vertices.size()) + " are given");
}

// The largest vertex used stands for n: it is the n of the smallest graph H_n with those vertices.
void require_n_at_most(const std::vector<Natural>& vertices, std::size_t count, Natural limit, const char* what) {
  require_count(vertices, count);
  if (count > 0 && vertices[count - 1] > limit)
    throw InvalidArgument(std::string(what) + " is limited to n <= " + std::to_string(limit) + ", got vertex " +
                          std::to_string(vertices[count - 1]));
}

void require_prime(std::uint64_t p) {
  if (p < 2 || !n_is_prime(static_cast<ulong>(p)))
    throw InvalidArgument("determinant modulus " + std::to_string(p) + " is not a prime");
}

// Rows [begin, end) of m * g compared with the identity, accumulating in Acc (int64 or 128 bits;
// the caller proved Acc cannot overflow). Each row of the product is a combination of the rows
// of g picked out by the nonzeros of m's row, so g is read row by row (contiguously).
template <class Acc>
bool rows_are_identity(const SquareMatrix& m, const SquareMatrix& g, std::size_t begin, std::size_t end) {
  const std::size_t d = m.dimension;
  std::vector<Acc> acc(d);
  for (std::size_t i = begin; i < end; ++i) {
    std::fill(acc.begin(), acc.end(), Acc{0});
    const std::int64_t* row = m.entries.data() + i * d;
    for (std::size_t j = 0; j < d; ++j) {
      const Acc c = row[j];
      if (c == 0) continue;
      const std::int64_t* g_row = g.entries.data() + j * d;
      if (c == 1) {
        for (std::size_t k = 0; k < d; ++k) acc[k] += g_row[k];
      } else {
        for (std::size_t k = 0; k < d; ++k) acc[k] += c * g_row[k];
      }
    }
    for (std::size_t k = 0; k < d; ++k)
      if (acc[k] != (k == i ? 1 : 0)) return false;
  }
  return true;
}

SquareMatrix green_as_matrix(const BorderedGreen& g) {
  SquareMatrix result(g.size());
  for (std::size_t i = 0; i < g.size(); ++i)
    for (std::size_t j = 0; j < g.size(); ++j) result.at(i, j) = g.entry(i, j);
  return result;
}

}  // namespace

SquareMatrix shared_factor_fredholm_matrix(const std::vector<Natural>& vertices, std::size_t count) {
  require_count(vertices, count);
  SquareMatrix m(count);
  for (std::size_t i = 0; i < count; ++i) {
    m.at(i, i) = 1;
    for (std::size_t j = 0; j < i; ++j)
      if (std::gcd(vertices[i], vertices[j]) > 1) m.at(i, j) = m.at(j, i) = 1;
  }
  return m;
}

SquareMatrix divisibility_fredholm_matrix(const std::vector<Natural>& vertices, std::size_t count) {
  require_count(vertices, count);
  SquareMatrix m(count);
  for (std::size_t i = 0; i < count; ++i) {
    m.at(i, i) = 1;
    // Vertices are distinct, so "divides" between two of them is always proper.
    for (std::size_t j = 0; j < i; ++j)
      if (vertices[i] % vertices[j] == 0 || vertices[j] % vertices[i] == 0) m.at(i, j) = m.at(j, i) = 1;
  }
  return m;
}

ExactInteger determinant_flint(const SquareMatrix& m) {
  FlintMatrix a(m);
  FlintInteger det;
  fmpz_mat_det(det.value, a.value);
  return to_exact(det.value);
}

std::vector<ExactInteger> leading_principal_minors_flint(const SquareMatrix& m) {
  std::vector<ExactInteger> minors;
  if (m.dimension == 0) return minors;
  FlintMatrix a(m), lu(m.dimension);
  FlintInteger den;
  std::vector<slong> perm(m.dimension);
  std::iota(perm.begin(), perm.end(), slong{0});
  // rank_check = 0: eliminate the whole matrix even if it is singular. fmpz_mat_fflu keeps the
  // diagonal pivot whenever it is nonzero (it takes the first row with a nonzero entry), so up to
  // the first exchange or skipped column the k-th pivot is the k-th leading principal minor.
  fmpz_mat_fflu(lu.value, den.value, perm.data(), a.value, 0);
  minors.reserve(m.dimension);
  for (std::size_t k = 0; k < m.dimension; ++k) {
    const auto kk = static_cast<slong>(k);
    if (perm[k] != kk || fmpz_is_zero(fmpz_mat_entry(lu.value, kk, kk))) {
      minors.push_back(ExactInteger::of(0));  // the leading block of size k + 1 is singular
      break;
    }
    minors.push_back(to_exact(fmpz_mat_entry(lu.value, kk, kk)));
  }
  return minors;
}

std::uint64_t determinant_mod_prime(const SquareMatrix& m, std::uint64_t p) {
  require_prime(p);
  if (m.dimension == 0) return 1 % p;
  nmod_mat_t a;
  const auto d = static_cast<slong>(m.dimension);
  nmod_mat_init(a, d, d, static_cast<mp_limb_t>(p));
  for (std::size_t i = 0; i < m.dimension; ++i)
    for (std::size_t j = 0; j < m.dimension; ++j) {
      const std::int64_t v = m.at(i, j);
      // Reduce |v| mod p in unsigned arithmetic, then negate mod p for negative v.
      const std::uint64_t magnitude = v < 0 ? 0 - static_cast<std::uint64_t>(v) : static_cast<std::uint64_t>(v);
      const std::uint64_t r = magnitude % p;
      nmod_mat_entry(a, static_cast<slong>(i), static_cast<slong>(j)) = (v < 0 && r != 0) ? p - r : r;
    }
  const std::uint64_t det = nmod_mat_det(a);
  nmod_mat_clear(a);
  return det;
}

bool is_inverse(const SquareMatrix& m, const SquareMatrix& g, unsigned threads) {
  if (m.dimension != g.dimension)
    throw InvalidArgument("is_inverse: dimensions " + std::to_string(m.dimension) + " and " +
                          std::to_string(g.dimension) + " differ");
  const std::size_t d = m.dimension;
  if (d == 0) return true;
  // |entry of m g| <= max |g| * (largest row sum of |m|): if that is below 2^63, 64 bits are exact.
  WideUnsigned max_g = 0, max_row = 0;
  for (const auto v : g.entries) max_g = std::max<WideUnsigned>(max_g, v < 0 ? -static_cast<Wide>(v) : v);
  for (std::size_t i = 0; i < d; ++i) {
    WideUnsigned row = 0;
    for (std::size_t j = 0; j < d; ++j) {
      const std::int64_t v = m.at(i, j);
      row += v < 0 ? -static_cast<Wide>(v) : v;
    }
    max_row = std::max(max_row, row);
  }
  // Both factors are below 2^64 * 2^32 resp. 2^64, so compare without forming a product that
  // could wrap: bound = max_g * max_row.
  const WideUnsigned limit64 = WideUnsigned{1} << 63, limit128 = WideUnsigned{1} << 126;
  const bool fits64 = max_row == 0 || max_g < limit64 / max_row;
  const bool fits128 = max_row == 0 || max_g < limit128 / max_row;
  if (!fits128) throw OverflowError("is_inverse: the product m * g could pass 2^126");

  const unsigned workers = std::max(1U, std::min<unsigned>(threads, static_cast<unsigned>(std::min<std::size_t>(d, 64))));
  std::vector<char> ok(workers, 1);
  const std::size_t chunk = (d + workers - 1) / workers;
  auto run = [&](unsigned t) {
    const std::size_t begin = std::min(d, t * chunk), end = std::min(d, begin + chunk);
    ok[t] = fits64 ? rows_are_identity<std::int64_t>(m, g, begin, end) : rows_are_identity<Wide>(m, g, begin, end);
  };
  std::vector<std::thread> pool;
  for (unsigned t = 1; t < workers; ++t) pool.emplace_back(run, t);
  run(0);
  for (auto& thread : pool) thread.join();
  return std::all_of(ok.begin(), ok.end(), [](char c) { return c != 0; });
}

bool certify_inverse(const std::vector<Natural>& vertices, const SquareMatrix& g, unsigned threads) {
  require_count(vertices, g.dimension);
  return is_inverse(shared_factor_fredholm_matrix(vertices, g.dimension), g, threads);
}

bool certify_inverse(const std::vector<Natural>& vertices, const BorderedGreen& g, unsigned threads) {
  require_count(vertices, g.size());
  return is_inverse(shared_factor_fredholm_matrix(vertices, g.size()), green_as_matrix(g), threads);
}

int determinant_sign_mod_prime(const std::vector<Natural>& vertices, std::size_t count, std::uint64_t p) {
  require_count(vertices, count);
  if (p == 2) throw InvalidArgument("the determinant sign needs an odd prime modulus (1 = -1 mod 2)");
  const std::uint64_t r = determinant_mod_prime(shared_factor_fredholm_matrix(vertices, count), p);
  return r == 1 ? 1 : r == p - 1 ? -1 : 0;
}

int certified_fredholm_determinant(const std::vector<Natural>& vertices, const BorderedGreen& g, unsigned threads,
                                   std::uint64_t p) {
  // Validate the modulus before the (longer) product check.
  if (p == 2) throw InvalidArgument("the determinant sign needs an odd prime modulus (1 = -1 mod 2)");
  require_prime(p);
  if (!certify_inverse(vertices, g, threads)) return 0;
  return determinant_sign_mod_prime(vertices, g.size(), p);
}

ExactInteger fredholm_determinant_flint(const std::vector<Natural>& vertices, std::size_t count) {
  require_n_at_most(vertices, count, max_exact_determinant_n, "the FLINT Fredholm determinant");
  return determinant_flint(shared_factor_fredholm_matrix(vertices, count));
}

std::vector<ExactInteger> fredholm_determinants_of_prefixes_flint(const std::vector<Natural>& vertices,
                                                                 std::size_t count) {
  require_n_at_most(vertices, count, max_exact_determinant_n, "the FLINT Fredholm determinants");
  return leading_principal_minors_flint(shared_factor_fredholm_matrix(vertices, count));
}

ExactInteger divisibility_fredholm_determinant(const std::vector<Natural>& vertices, std::size_t count) {
  require_n_at_most(vertices, count, max_exact_determinant_n, "the divisibility-graph Fredholm determinant");
  return determinant_flint(divisibility_fredholm_matrix(vertices, count));
}

std::vector<ExactInteger> characteristic_polynomial_flint(const SquareMatrix& m) {
  FlintMatrix a(m);
  fmpz_poly_t p;
  fmpz_poly_init(p);
  fmpz_mat_charpoly(p, a.value);
  std::vector<ExactInteger> coefficients;
  coefficients.reserve(m.dimension + 1);
  FlintInteger c;
  for (std::size_t k = 0; k <= m.dimension; ++k) {
    fmpz_poly_get_coeff_fmpz(c.value, p, static_cast<slong>(k));
    coefficients.push_back(to_exact(c.value));
  }
  fmpz_poly_clear(p);
  return coefficients;
}

std::vector<ExactInteger> characteristic_polynomial(const std::vector<Natural>& vertices, std::size_t count) {
  require_n_at_most(vertices, count, max_characteristic_polynomial_n, "the characteristic polynomial");
  SquareMatrix adjacency = shared_factor_fredholm_matrix(vertices, count);
  for (std::size_t i = 0; i < count; ++i) adjacency.at(i, i) = 0;
  return characteristic_polynomial_flint(adjacency);
}

ExactInteger reciprocal_zeta_value(const std::vector<ExactInteger>& charpoly, std::int64_t z) {
  if (charpoly.empty()) throw InvalidArgument("a characteristic polynomial has at least one coefficient");
  // Horner's rule taken over c_0, c_1, ..., c_V (lowest coefficient first) gives
  // sum_k c_k z^(V-k) = z^V p(1/z) = det(1 - z A).
  FlintInteger total, c;
  for (const auto& coefficient : charpoly) {
    if (fmpz_set_str(c.value, coefficient.decimal.c_str(), 10) != 0)
      throw InvalidArgument("not a decimal integer: '" + coefficient.decimal + "'");
    fmpz_mul_si(total.value, total.value, static_cast<slong>(z));
    fmpz_add(total.value, total.value, c.value);
  }
  return to_exact(total.value);
}

ZetaIdentityCheck check_zeta_identity(const std::vector<Natural>& vertices, std::size_t count) {
  ZetaIdentityCheck check;
  check.vertices = count;
  check.from_zeta = reciprocal_zeta_value(characteristic_polynomial(vertices, count), -1);
  check.from_determinant = determinant_flint(shared_factor_fredholm_matrix(vertices, count));
  return check;
}

}  // namespace sqfc::linalg
