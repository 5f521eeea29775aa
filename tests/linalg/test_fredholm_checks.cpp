// SPDX-License-Identifier: MIT
// Tests of linalg/fredholm_checks: FLINT's determinants of 1 + A(H_n) against prod -mu(k)
// (design.md identity 3; unimodularity of connection graphs, published 2016) and against PARI's
// matdet; the certified route (exact inverse check plus the sign modulo a prime), including a
// mutated inverse that must fail; the characteristic polynomial and the Bowen–Lanford zeta
// identity det(1 + A) = 1/zeta(-1); the exploratory determinant of the divisibility graph G_n
// against PARI. Wider ranges are in test_fredholm_checks_slow.cpp.
#include "sqfc/linalg/fredholm_checks.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <limits>
#include <numeric>
#include <random>
#include <string>
#include <vector>

#include "linalg/linalg_test_support.hpp"
#include "oracles/pari_oracle.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/linalg/bordered_green.hpp"

namespace {

using sqfc::Natural;
using sqfc::linalg::ExactInteger;
using sqfc::linalg::SquareMatrix;
namespace linalg = sqfc::linalg;
namespace testing_support = sqfc::testing;

// Edges of H on the first `count` vertices, counted by gcd in the test.
std::int64_t edges_by_gcd(const std::vector<Natural>& vertices, std::size_t count) {
  std::int64_t edges = 0;
  for (std::size_t i = 0; i < count; ++i)
    for (std::size_t j = 0; j < i; ++j) edges += std::gcd(vertices[i], vertices[j]) > 1;
  return edges;
}

TEST(FredholmChecks, MatricesOfBothGraphsByDefinition) {
  // 1 + A(H_10) and 1 + A(G_10) on 2, 3, 5, 6, 7, 10 (hand-written; H_10 also in
  // test_bordered_green.cpp). G_10 lacks the edge 6 - 10 (neither divides the other).
  const std::vector<Natural> vertices{2, 3, 5, 6, 7, 10};
  EXPECT_EQ(linalg::shared_factor_fredholm_matrix(vertices, 6),
            testing_support::matrix_from_bits({"100101", "010100", "001001", "110101", "000010", "101101"}));
  EXPECT_EQ(linalg::divisibility_fredholm_matrix(vertices, 6),
            testing_support::matrix_from_bits({"100101", "010100", "001001", "110100", "000010", "101001"}));
  EXPECT_EQ(linalg::shared_factor_fredholm_matrix(vertices, 0).dimension, 0U);
  EXPECT_THROW(static_cast<void>(linalg::shared_factor_fredholm_matrix(vertices, 7)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::divisibility_fredholm_matrix(vertices, 7)), sqfc::InvalidArgument);
}

TEST(FredholmChecks, FmpzDeterminantIsProductOfMinusMuForEveryNUpTo150) {
  // Every n <= 300 in the slow file; here every squarefree n <= 150 (91 graphs).
  const Natural limit = 150;
  const testing_support::SquarefreeOracle oracle(limit);
  std::uint64_t checked = 0;
  for (std::size_t count = 1; count <= oracle.vertices.size(); ++count) {
    const auto det = linalg::fredholm_determinant_flint(oracle.vertices, count);
    ASSERT_EQ(det, ExactInteger::of(oracle.product_of_minus_mu(oracle.vertices[count - 1])))
        << "n = " << oracle.vertices[count - 1];
    ++checked;
  }
  EXPECT_EQ(checked, 91U);  // Q(150) = 92 (PARI/GP 2.15)
}

TEST(FredholmChecks, PrefixDeterminantsAreProductOfMinusMuForEveryNUpTo1000) {
  // One fraction-free elimination gives D(n) for every n (leading principal minors); every
  // n <= 2000 in the slow file.
  const Natural limit = 1000;
  const testing_support::SquarefreeOracle oracle(limit);
  const auto dets = linalg::fredholm_determinants_of_prefixes_flint(oracle.vertices, oracle.vertices.size());
  ASSERT_EQ(dets.size(), oracle.vertices.size());
  int product = 1;
  std::uint64_t checked = 0;
  for (std::size_t k = 0; k < dets.size(); ++k) {
    product *= -oracle.mu[oracle.vertices[k]];
    ASSERT_EQ(dets[k], ExactInteger::of(product)) << "n = " << oracle.vertices[k];
    ++checked;
  }
  EXPECT_EQ(checked, 607U);  // Q(1000) = 608 (OEIS A071172)
}

TEST(FredholmChecks, LeadingMinorsAgreeWithDeterminantsOfLeadingBlocks) {
  // Random integer matrices (entries in [-3, 3]): the k-th reported minor is fmpz_mat_det of the
  // leading k x k block; a zero minor ends the list.
  auto rng = testing_support::test_rng(41);
  std::uniform_int_distribution<int> entry(-3, 3), size(1, 9);
  const std::uint64_t trials = 40 * testing_support::test_multiplier();
  std::uint64_t minors_checked = 0, trials_run = 0;
  for (std::uint64_t t = 0; t < trials; ++t) {
    ++trials_run;
    const auto d = static_cast<std::size_t>(size(rng));
    SquareMatrix m(d);
    for (auto& e : m.entries) e = entry(rng);
    const auto minors = linalg::leading_principal_minors_flint(m);
    ASSERT_GE(minors.size(), 1U);
    ASSERT_LE(minors.size(), d);
    for (std::size_t k = 1; k <= minors.size(); ++k) {
      SquareMatrix block(k);
      for (std::size_t i = 0; i < k; ++i)
        for (std::size_t j = 0; j < k; ++j) block.at(i, j) = m.at(i, j);
      ASSERT_EQ(minors[k - 1], linalg::determinant_flint(block)) << "trial " << t << ", k = " << k << ", "
                                                                   << testing_support::seed_note();
      if (k < minors.size()) {
        ASSERT_NE(minors[k - 1].decimal, "0");
      }
      ++minors_checked;
    }
    if (minors.size() < d) {
      ASSERT_EQ(minors.back().decimal, "0");
    }
  }
  EXPECT_EQ(trials_run, trials);
  EXPECT_GE(minors_checked, trials);  // at least one minor per matrix
  // Hand-computed: [[0,1],[1,0]] has leading minors 0 (then stops); [[1,1],[1,1]] has 1, 0;
  // [[2,1],[1,1]] has 2, 1.
  EXPECT_EQ(linalg::leading_principal_minors_flint(testing_support::matrix_from_rows({{0, 1}, {1, 0}})),
            (std::vector<ExactInteger>{ExactInteger::of(0)}));
  EXPECT_EQ(linalg::leading_principal_minors_flint(testing_support::matrix_from_rows({{1, 1}, {1, 1}})),
            (std::vector<ExactInteger>{ExactInteger::of(1), ExactInteger::of(0)}));
  EXPECT_EQ(linalg::leading_principal_minors_flint(testing_support::matrix_from_rows({{2, 1}, {1, 1}})),
            (std::vector<ExactInteger>{ExactInteger::of(2), ExactInteger::of(1)}));
  EXPECT_TRUE(linalg::leading_principal_minors_flint(SquareMatrix(0)).empty());
}

TEST(FredholmChecks, PariMatdetAgreesOnSamples) {
  std::uint64_t checked = 0;
  for (const Natural n : {2, 6, 10, 30, 105, 210, 300}) {
    const testing_support::SquarefreeOracle oracle(n);
    const std::size_t v = oracle.vertices.size();
    const SquareMatrix h = linalg::shared_factor_fredholm_matrix(oracle.vertices, v);
    const auto flint = linalg::determinant_flint(h);
    EXPECT_EQ(sqfc::oracles::pari_determinant(h.entries, v), flint.decimal) << "n = " << n;
    EXPECT_EQ(flint, ExactInteger::of(oracle.product_of_minus_mu(n))) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, 7U);
  // A determinant far beyond 64 bits: a seeded random 14 x 14 matrix with entries in
  // [-10^6, 10^6] (|det| about 10^90); FLINT and PARI must print the same decimal.
  auto rng = testing_support::test_rng(14);
  std::uniform_int_distribution<std::int64_t> entry(-1'000'000, 1'000'000);
  SquareMatrix big(14);
  for (auto& e : big.entries) e = entry(rng);
  const auto flint = linalg::determinant_flint(big);
  EXPECT_EQ(sqfc::oracles::pari_determinant(big.entries, 14), flint.decimal) << testing_support::seed_note();
  EXPECT_FALSE(flint.value.has_value()) << flint.decimal;
  EXPECT_GT(flint.decimal.size(), 60U) << flint.decimal;
  // The 0 x 0 matrix has determinant 1 in both.
  EXPECT_EQ(sqfc::oracles::pari_determinant({}, 0), "1");
  EXPECT_EQ(linalg::determinant_flint(SquareMatrix(0)), ExactInteger::of(1));
}

TEST(FredholmChecks, CertifiedInverseAndSignAtN1000) {
  const Natural limit = 1000;  // n = 2000 in the slow file
  const testing_support::SquarefreeOracle oracle(limit);
  const auto& vertices = oracle.vertices;
  linalg::BorderedGreen g(vertices.size(), 1ULL << 30, 2);
  for (std::size_t i = 0; i < vertices.size(); ++i)
    g.add_vertex(sqfc::complex::shared_factor_neighbours_below(vertices, i));
  EXPECT_TRUE(linalg::certify_inverse(vertices, g, 2));
  // prod -mu(k) over the squarefree k in [2, 1000] (the oracle; design.md identity 3).
  const int expected = oracle.product_of_minus_mu(limit);
  EXPECT_EQ(linalg::determinant_sign_mod_prime(vertices, vertices.size()), expected);
  EXPECT_EQ(linalg::certified_fredholm_determinant(vertices, g, 2), expected);
  EXPECT_EQ(g.determinant(), expected);
}

TEST(FredholmChecks, CertificateFailsAfterOneEntryIsChanged) {
  // n = 300: the exact inverse passes; changing any single entry by +-1 must fail.
  const testing_support::SquarefreeOracle oracle(300);
  const auto& vertices = oracle.vertices;
  const std::size_t v = vertices.size();
  linalg::BorderedGreen g(v, 1 << 24);
  for (std::size_t i = 0; i < v; ++i) g.add_vertex(sqfc::complex::shared_factor_neighbours_below(vertices, i));
  const SquareMatrix exact = testing_support::green_matrix(g);
  ASSERT_TRUE(linalg::certify_inverse(vertices, exact));
  ASSERT_TRUE(linalg::certify_inverse(vertices, g));
  auto rng = testing_support::test_rng(300);
  std::uniform_int_distribution<std::size_t> index(0, v - 1);
  const std::uint64_t mutations = 20 * testing_support::test_multiplier();
  std::uint64_t rejected = 0;
  for (std::uint64_t t = 0; t < mutations; ++t) {
    SquareMatrix changed = exact;
    const std::size_t i = index(rng), j = index(rng);
    changed.at(i, j) += (t % 2 == 0) ? 1 : -1;
    EXPECT_FALSE(linalg::certify_inverse(vertices, changed, 2)) << i << ", " << j << ", " << testing_support::seed_note();
    rejected += !linalg::certify_inverse(vertices, changed, 1);
  }
  EXPECT_EQ(rejected, mutations);
  // The inverse of H_300 is not the inverse of another graph on as many vertices (the
  // squarefree numbers from 3 on), nor of the identity.
  const std::vector<Natural> shifted(vertices.begin() + 1, vertices.end());
  // Another graph on as many vertices: drop 2, add 301 = 7 * 43.
  std::vector<Natural> others(vertices.begin() + 1, vertices.end());
  others.push_back(301);
  EXPECT_FALSE(linalg::certify_inverse(others, exact));
  EXPECT_FALSE(linalg::certify_inverse(others, g));
  EXPECT_EQ(linalg::certified_fredholm_determinant(others, g), 0);
  EXPECT_EQ(linalg::certified_fredholm_determinant(vertices, g), oracle.product_of_minus_mu(300));
  EXPECT_THROW(static_cast<void>(linalg::certified_fredholm_determinant(vertices, g, 1, 2)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::certified_fredholm_determinant(vertices, g, 1, 91)), sqfc::InvalidArgument);
  EXPECT_FALSE(linalg::is_inverse(testing_support::identity(v), exact));
  EXPECT_TRUE(linalg::is_inverse(testing_support::identity(v), testing_support::identity(v)));
  EXPECT_THROW(static_cast<void>(linalg::certify_inverse(shifted, exact)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::is_inverse(SquareMatrix(2), SquareMatrix(3))), sqfc::InvalidArgument);
}

TEST(FredholmChecks, InverseCheckWithLargeEntriesUsesWideSums) {
  // [[a, b], [c, d]] with ad - bc = 1 and entries near 2^40: products near 2^80 need the 128-bit
  // path; (a, b, c, d) = (2^40 + 1, 2^40, 2^40, 2^40 - 1): ad - bc = 2^80 - 1 - 2^80 = -1, so the
  // inverse is -[[d, -b], [-c, a]] (hand-computed).
  const std::int64_t t = std::int64_t{1} << 40;
  const SquareMatrix m = testing_support::matrix_from_rows({{t + 1, t}, {t, t - 1}});
  SquareMatrix inverse = testing_support::matrix_from_rows({{-(t - 1), t}, {t, -(t + 1)}});
  EXPECT_TRUE(linalg::is_inverse(m, inverse));
  inverse.at(1, 1) += 1;
  EXPECT_FALSE(linalg::is_inverse(m, inverse));
  // Entries 2^63 - 1 in both 2 x 2 factors: a product entry could reach 2^127, past the
  // 128-bit bound the check allows (2^126), so it refuses.
  const std::int64_t huge = std::numeric_limits<std::int64_t>::max();
  const SquareMatrix h = testing_support::matrix_from_rows({{huge, huge}, {huge, huge}});
  EXPECT_THROW(static_cast<void>(linalg::is_inverse(h, h)), sqfc::OverflowError);
}

TEST(FredholmChecks, DeterminantModuloAPrime) {
  // Hand-computed: det [[2, 1], [1, 1]] = 1, det [[-1]] = -1 = p - 1, det [[1, 1], [1, 1]] = 0.
  const std::uint64_t p = linalg::default_determinant_prime;
  EXPECT_EQ(linalg::determinant_mod_prime(testing_support::matrix_from_rows({{2, 1}, {1, 1}}), p), 1U);
  EXPECT_EQ(linalg::determinant_mod_prime(testing_support::matrix_from_rows({{-1}}), p), p - 1);
  EXPECT_EQ(linalg::determinant_mod_prime(testing_support::matrix_from_rows({{1, 1}, {1, 1}}), p), 0U);
  EXPECT_EQ(linalg::determinant_mod_prime(testing_support::matrix_from_rows({{-7}}), 5), 3U);  // -7 = 3 mod 5
  EXPECT_EQ(linalg::determinant_mod_prime(SquareMatrix(0), 7), 1U);
  EXPECT_THROW(static_cast<void>(linalg::determinant_mod_prime(SquareMatrix(1), 15)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::determinant_mod_prime(SquareMatrix(1), 1)), sqfc::InvalidArgument);
  // The sign of D(n) at sample n, with the default prime and with p = 3.
  const testing_support::SquarefreeOracle oracle(600);
  std::uint64_t checked = 0;
  for (const Natural n : {2, 6, 10, 30, 105, 210, 420, 600}) {
    const std::size_t v = oracle.vertex_count(n);
    EXPECT_EQ(linalg::determinant_sign_mod_prime(oracle.vertices, v), oracle.product_of_minus_mu(n)) << n;
    EXPECT_EQ(linalg::determinant_sign_mod_prime(oracle.vertices, v, 3), oracle.product_of_minus_mu(n)) << n;
    ++checked;
  }
  EXPECT_EQ(checked, 8U);
  EXPECT_THROW(static_cast<void>(linalg::determinant_sign_mod_prime(oracle.vertices, 3, 2)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::determinant_sign_mod_prime(oracle.vertices, 3, 9)), sqfc::InvalidArgument);
  EXPECT_EQ(linalg::determinant_sign_mod_prime(oracle.vertices, 0), 1);  // empty graph: det 1
  // A residue that is neither 1 nor -1 gives 0. The integers 6, 15, 35, 14 share factors
  // cyclically (3, 5, 7, 2) and no others, so their gcd graph is the 4-cycle; its adjacency
  // eigenvalues 2, 0, 0, -2 give det(1 + A) = 3 * 1 * 1 * (-1) = -3 (hand-computed).
  const std::vector<Natural> cycle{6, 15, 35, 14};
  EXPECT_EQ(linalg::determinant_flint(linalg::shared_factor_fredholm_matrix(cycle, 4)), ExactInteger::of(-3));
  EXPECT_EQ(linalg::determinant_sign_mod_prime(cycle, 4), 0);
  EXPECT_EQ(linalg::determinant_sign_mod_prime(cycle, 4, 7), 0);
  EXPECT_EQ(linalg::determinant_sign_mod_prime(cycle, 4, 3), 0);
}

TEST(FredholmChecks, CharacteristicPolynomialAndZetaIdentityForEveryNUpTo120) {
  // Every n <= 300 in the slow file. Checks per graph: p is monic of degree V; the x^(V-1)
  // coefficient is -trace(A) = 0; the x^(V-2) coefficient is -(number of edges) (both from
  // expanding det(x - A), hand-derived); 1/zeta(-1) = (-1)^V p(-1) equals fmpz_mat_det of 1 + A
  // and prod -mu(k).
  const Natural limit = 120;
  const testing_support::SquarefreeOracle oracle(limit);
  std::uint64_t checked = 0;
  for (std::size_t count = 1; count <= oracle.vertices.size(); ++count) {
    const Natural n = oracle.vertices[count - 1];
    const auto p = linalg::characteristic_polynomial(oracle.vertices, count);
    ASSERT_EQ(p.size(), count + 1) << n;
    ASSERT_EQ(p[count], ExactInteger::of(1)) << n;
    ASSERT_EQ(p[count - 1], ExactInteger::of(0)) << n;
    if (count >= 2) {
      ASSERT_EQ(p[count - 2], ExactInteger::of(-edges_by_gcd(oracle.vertices, count))) << n;
    }
    const auto zeta = linalg::check_zeta_identity(oracle.vertices, count);
    ASSERT_TRUE(zeta.holds()) << n << ": " << zeta.from_zeta.decimal << " vs " << zeta.from_determinant.decimal;
    ASSERT_EQ(zeta.from_zeta, ExactInteger::of(oracle.product_of_minus_mu(n))) << n;
    ASSERT_EQ(linalg::reciprocal_zeta_value(p, -1), zeta.from_zeta) << n;
    ++checked;
  }
  EXPECT_EQ(checked, 74U);  // Q(120) = 75 (PARI/GP 2.15)
}

TEST(FredholmChecks, CharacteristicPolynomialHandCasesAndOtherZetaValues) {
  // Hand-computed: A of one edge has p = x^2 - 1; H_6 (the path 2 - 6 - 3 plus 5) has
  // p = x (x^3 - 2x) = x^4 - 2x^2, so det(1 + A) = (-1)^4 p(-1) = -1.
  EXPECT_EQ(linalg::characteristic_polynomial_flint(testing_support::matrix_from_rows({{0, 1}, {1, 0}})),
            (std::vector<ExactInteger>{ExactInteger::of(-1), ExactInteger::of(0), ExactInteger::of(1)}));
  const std::vector<Natural> six{2, 3, 5, 6};
  const auto p6 = linalg::characteristic_polynomial(six, 4);
  EXPECT_EQ(p6, (std::vector<ExactInteger>{ExactInteger::of(0), ExactInteger::of(0), ExactInteger::of(-2),
                                           ExactInteger::of(0), ExactInteger::of(1)}));
  EXPECT_EQ(linalg::reciprocal_zeta_value(p6, -1), ExactInteger::of(-1));
  EXPECT_EQ(linalg::reciprocal_zeta_value(p6, 0), ExactInteger::of(1));  // det(1 - 0 A) = 1
  // det(1 - z A) at z = 2, -3, 5 against fmpz_mat_det of 1 - z A directly, at n = 105.
  const testing_support::SquarefreeOracle oracle(105);
  const std::size_t v = oracle.vertices.size();
  const auto p = linalg::characteristic_polynomial(oracle.vertices, v);
  const SquareMatrix h = linalg::shared_factor_fredholm_matrix(oracle.vertices, v);
  int checked = 0;
  for (const std::int64_t z : {2, -3, 5}) {
    SquareMatrix m(v);
    for (std::size_t i = 0; i < v; ++i)
      for (std::size_t j = 0; j < v; ++j) m.at(i, j) = (i == j) ? 1 : -z * h.at(i, j);
    EXPECT_EQ(linalg::reciprocal_zeta_value(p, z), linalg::determinant_flint(m)) << "z = " << z;
    ++checked;
  }
  EXPECT_EQ(checked, 3);
  EXPECT_FALSE(linalg::reciprocal_zeta_value(p, 2).value.has_value());  // far beyond 64 bits
  EXPECT_EQ(linalg::characteristic_polynomial_flint(SquareMatrix(0)), (std::vector<ExactInteger>{ExactInteger::of(1)}));
  EXPECT_THROW(static_cast<void>(linalg::reciprocal_zeta_value({}, 1)), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::reciprocal_zeta_value({ExactInteger{"12x", std::nullopt}}, 1)),
               sqfc::InvalidArgument);
  // Refused beyond n = 300: the vertices of H_302 end with 301 = 7 * 43 and 302 = 2 * 151.
  const auto beyond = sqfc::complex::squarefree_vertices(302);
  EXPECT_THROW(static_cast<void>(linalg::characteristic_polynomial(beyond, beyond.size())), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::check_zeta_identity(beyond, beyond.size())), sqfc::InvalidArgument);
  EXPECT_NO_THROW(static_cast<void>(linalg::characteristic_polynomial(beyond, beyond.size() - 2)));
}

TEST(FredholmChecks, DivisibilityDeterminantAgainstPariAndHandCases) {
  // Exploratory (no theorem). Hand-computed: G_6 is the path 2 - 6 - 3 plus 5, det -1; G_10 is the
  // path 3 - 6 - 2 - 10 - 5 plus 7, and det(1 + A(P_k)) = D_{k-1} - D_{k-2} (D_0 = D_1 = 1) gives
  // D_5 = 0.
  const testing_support::SquarefreeOracle oracle(400);
  EXPECT_EQ(linalg::divisibility_fredholm_determinant(oracle.vertices, oracle.vertex_count(6)), ExactInteger::of(-1));
  EXPECT_EQ(linalg::divisibility_fredholm_determinant(oracle.vertices, oracle.vertex_count(10)), ExactInteger::of(0));
  std::uint64_t checked = 0;
  for (const Natural n : {2, 6, 10, 30, 60, 105, 210, 300, 400}) {
    const std::size_t v = oracle.vertex_count(n);
    const SquareMatrix g = linalg::divisibility_fredholm_matrix(oracle.vertices, v);
    EXPECT_EQ(linalg::divisibility_fredholm_determinant(oracle.vertices, v).decimal,
              sqfc::oracles::pari_determinant(g.entries, v))
        << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, 9U);
}

TEST(FredholmChecks, RangeLimitsAreEnforced) {
  // 2002 = 2 * 7 * 11 * 13 is squarefree: the vertices of H_2002 end beyond the n <= 2000 limit.
  const auto vertices = sqfc::complex::squarefree_vertices(2002);
  ASSERT_EQ(vertices.back(), 2002U);
  EXPECT_THROW(static_cast<void>(linalg::fredholm_determinant_flint(vertices, vertices.size())), sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::fredholm_determinants_of_prefixes_flint(vertices, vertices.size())),
               sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::divisibility_fredholm_determinant(vertices, vertices.size())),
               sqfc::InvalidArgument);
  EXPECT_THROW(static_cast<void>(linalg::fredholm_determinant_flint(vertices, vertices.size() + 1)),
               sqfc::InvalidArgument);
  EXPECT_EQ(linalg::fredholm_determinant_flint(vertices, 0), ExactInteger::of(1));
  try {
    static_cast<void>(linalg::fredholm_determinant_flint(vertices, vertices.size()));
  } catch (const sqfc::InvalidArgument& e) {
    EXPECT_NE(std::string(e.what()).find("n <= 2000"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("2002"), std::string::npos) << e.what();
  }
}

}  // namespace
