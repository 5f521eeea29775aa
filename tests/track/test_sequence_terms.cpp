// SPDX-License-Identifier: MIT
// Tests of track/sequence_terms: names, and values at requested indices against the brute-force
// oracles (trial division, enumeration of faces, Z/2 homology), limits and domains.
#include "sqfc/track/sequence_terms.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <limits>
#include <random>

#include "oracles/brute_force.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"

namespace {

namespace track = sqfc::track;
using K = track::Sequence::Kind;
using track::TermStatus;

TEST(SequenceTerms, NamesRoundTrip) {
  std::vector<std::string> names = {"mertens",    "mertens_pow10",    "mertens_pow2", "mertens_zeros",
                                    "squarefree", "squarefree_pow10", "liouville"};
  for (int d = 0; d < 16; ++d) names.push_back("f" + std::to_string(d)), names.push_back("b" + std::to_string(d));
  for (const auto& name : names) {
    EXPECT_EQ(track::sequence_name(track::parse_sequence(name)), name);
    EXPECT_FALSE(track::sequence_description(track::parse_sequence(name)).empty());
  }
  EXPECT_EQ(names.size(), 39u);
  EXPECT_EQ(track::parse_sequence("b2"), (track::Sequence{K::betti, 2}));
  for (const char* bad : {"", "f", "b16", "f-1", "f01", "mertens ", "Mertens", "f1x", "zeros", "b100"})
    EXPECT_THROW(track::parse_sequence(bad), sqfc::InvalidArgument) << bad;
}

TEST(SequenceTerms, PrefixSequencesMatchTrialDivision) {
  // Random indices in [1, 3000] with repeats, in random order, plus the edges 0, 1 and 3000.
  const std::uint64_t top = 3000;
  const auto naive = sqfc::oracles::prefix_naive(top);
  auto rng = sqfc::testing::test_rng(5);
  std::vector<std::int64_t> indices = {0, 1, 3000, 1};
  std::uniform_int_distribution<std::int64_t> pick(1, static_cast<std::int64_t>(top));
  for (int i = 0; i < 400; ++i) indices.push_back(pick(rng));
  int checked = 0;
  for (const auto kind : {K::mertens, K::squarefree, K::liouville}) {
    const auto values = track::evaluate_sequence_terms({kind, 0}, indices, top, 2);
    ASSERT_EQ(values.size(), indices.size());
    for (std::size_t i = 0; i < indices.size(); ++i) {
      const auto n = static_cast<std::size_t>(indices[i]);
      const std::int64_t want = n == 0 ? 0
                                : kind == K::mertens  ? naive.mertens[n]
                                : kind == K::squarefree ? naive.squarefree[n]
                                                        : naive.liouville[n];
      ASSERT_EQ(values[i].status, TermStatus::computed) << "n = " << n << ' ' << sqfc::testing::seed_note();
      EXPECT_EQ(values[i].value, want) << "n = " << n << ' ' << sqfc::testing::seed_note();
      EXPECT_EQ(values[i].n, n);
      ++checked;
    }
  }
  EXPECT_EQ(checked, 3 * 404);
}

TEST(SequenceTerms, FacesAndBettiMatchEnumerationAndHomology) {
  // Every n in [1, 240]: f_d by enumeration, b_d by Z/2 elimination (Bjorner: K_n is a wedge of
  // spheres, so Z/2 Betti numbers are the integral ones).
  std::vector<std::int64_t> indices;
  for (std::int64_t n = 1; n <= 240; ++n) indices.push_back(n);
  std::vector<std::vector<track::TermValue>> faces, betti;
  for (int d = 0; d <= 3; ++d) {
    faces.push_back(track::evaluate_sequence_terms({K::faces, d}, indices, 240, 1));
    betti.push_back(track::evaluate_sequence_terms({K::betti, d}, indices, 240, 1));
  }
  int checked = 0;
  for (std::size_t i = 0; i < indices.size(); ++i) {
    const auto n = static_cast<std::uint64_t>(indices[i]);
    const auto f = sqfc::oracles::f_vector_naive(n);
    const auto b = sqfc::oracles::betti_mod2_naive(n);
    for (std::size_t d = 0; d <= 3; ++d) {
      const std::int64_t want_f = d < f.size() ? static_cast<std::int64_t>(f[d]) : 0;
      const std::int64_t want_b = d < b.size() ? b[d] : 0;
      EXPECT_EQ(faces[d][i].value, want_f) << "f" << d << "(" << n << ")";
      EXPECT_EQ(betti[d][i].value, want_b) << "b" << d << "(" << n << ")";
      ++checked;
    }
  }
  EXPECT_EQ(checked, 4 * 240);
}

TEST(SequenceTerms, PowersAndZerosMatchTrialDivision) {
  const std::uint64_t top = 1 << 16;
  const auto naive = sqfc::oracles::prefix_naive(top);
  std::vector<std::int64_t> ks;
  for (std::int64_t k = -1; k <= 17; ++k) ks.push_back(k);
  int checked = 0;
  const auto pow2 = track::evaluate_sequence_terms({K::mertens_pow2, 0}, ks, top, 2);
  const auto pow10 = track::evaluate_sequence_terms({K::mertens_pow10, 0}, ks, top, 2);
  const auto q10 = track::evaluate_sequence_terms({K::squarefree_pow10, 0}, ks, top, 2);
  for (std::size_t i = 0; i < ks.size(); ++i) {
    const std::int64_t k = ks[i];
    if (k < 0) {
      EXPECT_EQ(pow2[i].status, TermStatus::outside_domain);
      EXPECT_EQ(pow10[i].status, TermStatus::outside_domain);
      EXPECT_EQ(q10[i].status, TermStatus::outside_domain);
      ++checked;
      continue;
    }
    const std::uint64_t p2 = std::uint64_t{1} << k;
    if (p2 <= top) {
      ASSERT_EQ(pow2[i].status, TermStatus::computed);
      EXPECT_EQ(pow2[i].n, p2);
      EXPECT_EQ(pow2[i].value, naive.mertens[p2]) << "M(2^" << k << ")";
    } else {
      EXPECT_EQ(pow2[i].status, TermStatus::beyond_limit) << k;
    }
    std::uint64_t p10 = 1;
    for (std::int64_t j = 0; j < k && p10 <= top; ++j) p10 *= 10;
    if (p10 <= top) {
      EXPECT_EQ(pow10[i].value, naive.mertens[p10]) << "M(10^" << k << ")";
      EXPECT_EQ(q10[i].value, naive.squarefree[p10]) << "Q(10^" << k << ")";
    } else {
      EXPECT_EQ(pow10[i].status, TermStatus::beyond_limit) << k;
      EXPECT_EQ(q10[i].status, TermStatus::beyond_limit) << k;
    }
    ++checked;
  }
  EXPECT_EQ(checked, 19);

  // Zeros: the k-th n with M(n) = 0 by scanning the oracle's M; the 10^6-th zero is not below 2^16.
  std::vector<std::uint64_t> zeros;
  for (std::uint64_t n = 1; n <= top; ++n)
    if (naive.mertens[n] == 0) zeros.push_back(n);
  ASSERT_GT(zeros.size(), 100u);
  std::vector<std::int64_t> zk = {0, -3, 1, 2, 50, static_cast<std::int64_t>(zeros.size()), 1000000, 7};
  const auto z = track::evaluate_sequence_terms({K::mertens_zeros, 0}, zk, top, 2);
  ASSERT_EQ(z.size(), zk.size());
  EXPECT_EQ(z[0].status, TermStatus::outside_domain);
  EXPECT_EQ(z[1].status, TermStatus::outside_domain);
  int zero_checked = 0;
  for (const std::size_t i : {2u, 3u, 4u, 5u, 7u}) {
    ASSERT_EQ(z[i].status, TermStatus::computed) << "k = " << zk[i];
    EXPECT_EQ(z[i].value, static_cast<std::int64_t>(zeros[static_cast<std::size_t>(zk[i] - 1)])) << "k = " << zk[i];
    ++zero_checked;
  }
  EXPECT_EQ(zero_checked, 5);
  EXPECT_EQ(z[6].status, TermStatus::beyond_limit);
}

TEST(SequenceTerms, LimitsAndPreconditions) {
  const auto v = track::evaluate_sequence_terms({K::mertens, 0}, {5, 11, -1, 10}, 10, 1);
  ASSERT_EQ(v.size(), 4u);
  EXPECT_EQ(v[0].status, TermStatus::computed);
  EXPECT_EQ(v[0].value, -2);  // M(5) = 1 - 1 - 1 + 0 - 1 (OEIS A002321)
  EXPECT_EQ(v[1].status, TermStatus::beyond_limit);
  EXPECT_EQ(v[1].n, 11u);
  EXPECT_EQ(v[2].status, TermStatus::outside_domain);
  EXPECT_EQ(v[3].value, -1);  // M(10) (OEIS A002321)
  // Huge exponents end as beyond the limit, without overflow.
  const auto big = track::evaluate_sequence_terms({K::mertens_pow10, 0}, {std::numeric_limits<std::int64_t>::max()}, 100, 1);
  EXPECT_EQ(big[0].status, TermStatus::beyond_limit);
  EXPECT_THROW(track::evaluate_sequence_terms({K::mertens, 0}, {1}, 0, 1), sqfc::InvalidArgument);
  EXPECT_THROW(track::evaluate_sequence_terms({K::mertens, 0}, {1}, 10'000'000'000'000'001ULL, 1), sqfc::InvalidArgument);
  EXPECT_THROW(track::evaluate_sequence_terms({K::mertens, 0}, {1}, 10, 0), sqfc::InvalidArgument);
  EXPECT_THROW(track::evaluate_sequence_terms({K::faces, 16}, {1}, 10, 1), sqfc::InvalidArgument);
  EXPECT_TRUE(track::evaluate_sequence_terms({K::mertens, 0}, {}, 10, 1).empty());
}

}  // namespace
