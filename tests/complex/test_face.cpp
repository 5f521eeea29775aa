// SPDX-License-Identifier: MIT
// Tests of describe_face: kinds, mu, omega, Omega, prime sets and boundaries, against trial
// division for every K <= 2000 and hand-computed large cases.
#include "sqfc/complex/face.hpp"

#include <gtest/gtest.h>

#include <cstdint>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::complex::describe_face;
using sqfc::complex::FaceKind;

TEST(DescribeFace, MatchesTrialDivisionUpTo2000) {
  std::size_t checked = 0, faces = 0;
  for (std::uint64_t k = 1; k <= 2000; ++k, ++checked) {
    const auto d = describe_face(std::to_string(k));
    const auto naive = sqfc::oracles::arithmetic_naive(k);
    ASSERT_EQ(d.mu, naive.mu) << k;
    ASSERT_EQ(d.omega, naive.omega) << k;
    ASSERT_EQ(d.big_omega, naive.big_omega) << k;
    ASSERT_EQ(d.squarefree, naive.mu != 0) << k;
    const FaceKind want = k == 1 ? FaceKind::empty : naive.mu != 0 ? FaceKind::face : FaceKind::not_a_face;
    ASSERT_EQ(d.kind, want) << k;
    if (d.kind != FaceKind::face) {
      EXPECT_TRUE(d.primes.empty() && d.boundary.empty() && d.dimension == -1) << k;
      continue;
    }
    ++faces;
    ASSERT_EQ(d.dimension, naive.omega - 1) << k;
    ASSERT_EQ(d.boundary.size(), d.primes.size()) << k;
    std::uint64_t product = 1;
    for (const auto& p : d.primes) product *= std::stoull(p);
    ASSERT_EQ(product, k);
    for (std::size_t i = 0; i < d.boundary.size(); ++i) {
      const auto& b = d.boundary[i];
      EXPECT_EQ(std::stoull(b.value), k / std::stoull(d.primes[i])) << k;
      EXPECT_EQ(b.removed_prime, d.primes[i]);
      EXPECT_EQ(b.dimension, d.dimension - 1);
      EXPECT_EQ(b.primes.size(), d.primes.size() - 1);
    }
  }
  EXPECT_EQ(checked, 2000U);
  EXPECT_EQ(faces, 1214U);  // Q(2000) - 1 with Q(2000) = 1215, hand-computed (a direct count)
}

TEST(DescribeFace, LargeValues) {
  // 2^64 + 1 = 274177 * 67280421310721 (from memory; Landry 1880): an edge of dimension 1.
  const auto f6 = describe_face("18446744073709551617");
  EXPECT_EQ(f6.kind, FaceKind::face);
  EXPECT_EQ(f6.dimension, 1);
  EXPECT_EQ(f6.mu, 1);
  ASSERT_EQ(f6.boundary.size(), 2U);
  EXPECT_EQ(f6.boundary[0].value, "67280421310721");
  EXPECT_EQ(f6.boundary[1].value, "274177");
  // 2^200 is no face; mu 0, Omega 200.
  const auto p = describe_face(sqfc::arith::parse_big_natural("2^200", "K"));
  EXPECT_EQ(p.kind, FaceKind::not_a_face);
  EXPECT_EQ(p.big_omega, 200);
  EXPECT_EQ(p.mu, 0);
  // A vertex: its boundary is the empty face 1.
  const auto v = describe_face("1000000007");  // prime, from memory (a common hashing modulus)
  ASSERT_EQ(v.kind, FaceKind::face);
  ASSERT_EQ(v.boundary.size(), 1U);
  EXPECT_EQ(v.boundary[0].value, "1");
  EXPECT_EQ(v.boundary[0].dimension, -1);
  EXPECT_THROW(describe_face("0"), sqfc::InvalidArgument);
}

}  // namespace
