// SPDX-License-Identifier: MIT
// Tests of track/tracker_state: one-n steps against block jumps, and every column of the row
// against trial division, pair testing and direct enumeration.
#include "sqfc/track/tracker_state.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <random>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/squarefree_enumeration.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/track/block_summary.hpp"

namespace {

using sqfc::Count;
using sqfc::Natural;
using sqfc::SignedSum;
using sqfc::arith::FactorCode;
using sqfc::track::TableRow;
using sqfc::track::TrackerState;
namespace oracles = sqfc::oracles;
namespace config = sqfc::config;

// Factor codes of n = 1..limit by trial division (index n - 1): independent of the sieve.
std::vector<FactorCode> naive_codes(Natural limit) {
  std::vector<FactorCode> codes;
  for (Natural n = 1; n <= limit; ++n) {
    const auto a = oracles::arithmetic_naive(n);
    codes.push_back(sqfc::arith::make_factor_code(a.omega, a.mu != 0, a.big_omega));
  }
  return codes;
}

// Factor codes of n = 1..limit from the library sieve.
std::vector<FactorCode> sieve_codes(Natural limit) {
  std::vector<FactorCode> codes;
  codes.reserve(limit);
  sqfc::arith::sieve_range(1, limit + 1, [&](const sqfc::arith::SieveBlock& b) {
    for (std::size_t i = 0; i < b.size(); ++i) codes.push_back(b.code(i));
  });
  return codes;
}

SignedSum alternating_sum(const auto& values) {
  SignedSum total = 0;
  for (std::size_t d = 0; d < values.size(); ++d) total += (d % 2 ? -1 : 1) * static_cast<SignedSum>(values[d]);
  return total;
}

TEST(TrackerState, InitialStateAndRowAtOne) {
  TrackerState s;
  EXPECT_EQ(s.n(), 0U);
  EXPECT_EQ(s.mertens(), 0);
  EXPECT_EQ(s.squarefree(), 0U);
  s.step(sqfc::arith::make_factor_code(0, true, 0));  // n = 1
  const TableRow r = s.row();
  // K_1 is the empty complex: no faces, no homology, chi = 0, empty product D = 1.
  EXPECT_EQ(r.n, 1U);
  EXPECT_EQ(r.mu, 1);
  EXPECT_EQ(r.mertens, 1);
  EXPECT_EQ(r.euler, 0);
  EXPECT_EQ(r.squarefree, 1U);
  EXPECT_EQ(r.liouville, 1);
  EXPECT_EQ(r.fredholm, 1);
  EXPECT_EQ(r.div_edges, 0U);
  int checked = 0;
  for (int d = 0; d < config::omega_slots; ++d, ++checked) {
    EXPECT_EQ(r.faces[static_cast<std::size_t>(d)], 0U) << d;
    EXPECT_EQ(r.betti[static_cast<std::size_t>(d)], 0) << d;
  }
  EXPECT_EQ(checked, config::omega_slots);
}

TEST(TrackerState, StepAndApplyAgreeOnRandomSplits) {
  const Natural limit = 100'000;
  const auto codes = sieve_codes(limit);
  auto rng = sqfc::testing::test_rng(11);
  const Count trials = 20 * sqfc::testing::test_multiplier();
  Count checked = 0;
  for (Count t = 0; t < trials; ++t) {
    // Stepping state and jumping state meet at every cut, the jumps covering random blocks
    // (empty ones included).
    TrackerState stepped, jumped;
    Natural next = 1;
    Count boundaries = 0;
    while (next <= limit) {
      const Natural length = std::uniform_int_distribution<Natural>(0, t % 2 ? 50 : 5000)(rng);
      const Natural hi = std::min(limit + 1, next + length);
      for (Natural n = next; n < hi; ++n) stepped.step(codes[n - 1]);
      jumped.apply(sqfc::track::summarize_codes(next, codes.data() + (next - 1), hi - next));
      ASSERT_EQ(stepped, jumped) << "block [" << next << ", " << hi << ") " << sqfc::testing::seed_note();
      next = hi;
      ++boundaries;
    }
    ASSERT_EQ(stepped.n(), limit);
    ASSERT_GT(boundaries, 0U);
    ++checked;
  }
  EXPECT_EQ(checked, trials);
}

TEST(TrackerState, ApplyChecksTheStartOfTheBlock) {
  const auto codes = naive_codes(100);
  // (state n, block lo, block length) with lo != n + 1: gaps and overlaps, empty or not.
  const Natural cases[][3] = {{0, 2, 5}, {0, 3, 0}, {10, 10, 5}, {10, 12, 5}, {10, 1, 10}, {10, 12, 0}};
  int checked = 0;
  for (const auto& [n, lo, length] : cases) {
    TrackerState s;
    if (n > 0) s.apply(sqfc::track::summarize_codes(1, codes.data(), n));
    const TrackerState before = s;
    EXPECT_THROW(s.apply(sqfc::track::summarize_codes(lo, codes.data() + (lo - 1), length)), sqfc::InvalidArgument)
        << "n = " << n << ", block [" << lo << ", " << lo + length << ")";
    EXPECT_EQ(s, before);  // a rejected block changes nothing
    ++checked;
  }
  EXPECT_EQ(checked, 6);
  // An empty block at the right place is accepted and changes nothing.
  TrackerState s;
  s.apply(sqfc::track::summarize_codes(1, codes.data(), 10));
  const TrackerState before = s;
  s.apply(sqfc::track::summarize_codes(11, codes.data() + 10, 0));
  EXPECT_EQ(s, before);
}

TEST(TrackerState, RowsMatchBruteForceForEveryNUpTo2000) {
  const Natural limit = 2000;
  const auto prefix = oracles::prefix_naive(limit);
  const auto codes = naive_codes(limit);
  TrackerState s;
  std::vector<Natural> squarefree_seen;  // squarefree k in [2, n]
  Count pair_edges = 0;                  // pairs a | b tested one by one, a < b <= n
  SignedSum fredholm = 1;                // prod over squarefree k in [2, n] of -mu(k)
  Natural checked = 0;
  for (Natural n = 1; n <= limit; ++n) {
    s.step(codes[n - 1]);
    if (n >= 2 && prefix.mu[n] != 0) {
      for (const Natural a : squarefree_seen)
        if (n % a == 0) ++pair_edges;
      squarefree_seen.push_back(n);
      fredholm *= -prefix.mu[n];
    }
    const TableRow r = s.row();
    ASSERT_EQ(r.n, n);
    ASSERT_EQ(r.mu, prefix.mu[n]) << n;
    ASSERT_EQ(r.mertens, prefix.mertens[n]) << n;
    ASSERT_EQ(r.euler, 1 - prefix.mertens[n]) << n;
    ASSERT_EQ(r.squarefree, static_cast<Count>(prefix.squarefree[n])) << n;
    ASSERT_EQ(r.liouville, prefix.liouville[n]) << n;
    ASSERT_EQ(r.fredholm, fredholm) << n;
    auto faces = oracles::f_vector_naive(n);
    faces.resize(config::omega_slots, 0);
    for (int d = 0; d < config::omega_slots; ++d) ASSERT_EQ(r.faces[static_cast<std::size_t>(d)], faces[static_cast<std::size_t>(d)]) << n << " f" << d;
    // Reduced b_d = odd squarefree m in (n/2, n] with omega(m) = d + 1; b_0 adds the one
    // component of a nonempty complex (design.md identity 2), counted directly here.
    std::vector<SignedSum> betti(config::omega_slots, 0);
    for (Natural m = n / 2 + 1; m <= n; ++m)
      if ((m & 1) && m >= 3 && prefix.mu[m] != 0) ++betti[static_cast<std::size_t>(prefix.omega[m] - 1)];
    if (n >= 2) ++betti[0];
    for (int d = 0; d < config::omega_slots; ++d) ASSERT_EQ(r.betti[static_cast<std::size_t>(d)], betti[static_cast<std::size_t>(d)]) << n << " b" << d;
    ASSERT_EQ(r.div_edges, pair_edges) << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
  // The incremental pair count above is itself the oracle's all-pairs count at the end.
  EXPECT_EQ(pair_edges, oracles::divisibility_edges_naive(limit));
}

TEST(TrackerState, DivisibilityEdgesMatchPairTestingForEveryNUpTo500) {
  // divisibility_edges_naive tests every pair anew for each n (O(n^2) each); every n to 2000
  // in test_tracker_state_slow.cpp.
  const Natural limit = 500;
  const auto codes = naive_codes(limit);
  TrackerState s;
  Natural checked = 0;
  for (Natural n = 1; n <= limit; ++n) {
    s.step(codes[n - 1]);
    ASSERT_EQ(s.row().div_edges, oracles::divisibility_edges_naive(n)) << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
}

TEST(TrackerState, RowsMatchDirectHomologyForEveryNUpTo300) {
  // Betti numbers of the row against the direct Z/2 homology of K_n.
  const Natural limit = 300;
  const auto codes = naive_codes(limit);
  TrackerState s;
  Natural checked = 0;
  for (Natural n = 1; n <= limit; ++n) {
    s.step(codes[n - 1]);
    auto direct = oracles::betti_mod2_naive(n);
    direct.resize(config::omega_slots, 0);
    const TableRow r = s.row();
    for (int d = 0; d < config::omega_slots; ++d) ASSERT_EQ(r.betti[static_cast<std::size_t>(d)], direct[static_cast<std::size_t>(d)]) << n << " b" << d;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
}

TEST(TrackerState, EulerPoincareAndFredholmParityAtEveryN) {
  // sum (-1)^d b_d = sum (-1)^d f_d = chi = 1 - M(n) (Euler-Poincare; design.md identity 1),
  // and D(n) = (-1)^((Q(n) + M(n))/2 - 1) (design.md identity 3), at every n <= 10^6.
  const Natural limit = 1'000'000;
  const auto codes = sieve_codes(limit);
  TrackerState s;
  Natural checked = 0;
  for (Natural n = 1; n <= limit; ++n) {
    s.step(codes[n - 1]);
    const TableRow r = s.row();
    ASSERT_EQ(alternating_sum(r.betti), r.euler) << n;
    ASSERT_EQ(alternating_sum(r.faces), r.euler) << n;
    ASSERT_EQ(r.euler, 1 - r.mertens) << n;
    const SignedSum total = static_cast<SignedSum>(r.squarefree) + r.mertens;
    ASSERT_EQ(total % 2, 0) << n;  // Q + M = 2 * #{mu = +1}
    ASSERT_EQ(r.fredholm, (total / 2 - 1) % 2 == 0 ? 1 : -1) << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
}

TEST(TrackerState, CountsAtPowersOfTenMatchEnumeration) {
  // f-vector, Q, M, b_d and divisibility edges at 10^3 .. 10^6 against the depth-first
  // enumeration of squarefree products (tests/oracles/squarefree_enumeration.hpp); f-vectors
  // to 10^5 also against trial division. 10^7, 10^8 in test_tracker_state_slow.cpp.
  const Natural limit = 1'000'000;
  const auto codes = sieve_codes(limit);
  TrackerState s;
  Natural power = 1000;
  int checked = 0;
  for (Natural n = 1; n <= limit; ++n) {
    s.step(codes[n - 1]);
    if (n != power) continue;
    power *= 10;
    const TableRow r = s.row();
    const auto census = oracles::squarefree_census_dfs(n);
    EXPECT_EQ(r.squarefree, census.squarefree) << n;
    EXPECT_EQ(r.mertens, census.mertens) << n;
    EXPECT_EQ(r.div_edges, census.divisibility_pairs) << n;
    auto faces = census.faces;
    faces.resize(config::omega_slots, 0);
    for (int d = 0; d < config::omega_slots; ++d) EXPECT_EQ(r.faces[static_cast<std::size_t>(d)], faces[static_cast<std::size_t>(d)]) << n << " f" << d;
    auto odd = census.odd_upper;
    odd.resize(config::omega_slots + 1, 0);
    EXPECT_EQ(r.betti[0], static_cast<SignedSum>(odd[1]) + 1) << n;
    for (int d = 1; d + 1 < config::omega_slots; ++d) EXPECT_EQ(r.betti[static_cast<std::size_t>(d)], static_cast<SignedSum>(odd[static_cast<std::size_t>(d) + 1])) << n << " b" << d;
    if (n <= 100'000) {  // 10^6 by trial division takes 0.5 s: test_tracker_state_slow.cpp
      auto naive = oracles::f_vector_naive(n);
      naive.resize(config::omega_slots, 0);
      for (int d = 0; d < config::omega_slots; ++d) EXPECT_EQ(r.faces[static_cast<std::size_t>(d)], naive[static_cast<std::size_t>(d)]) << n << " f" << d;
    }
    ++checked;
  }
  EXPECT_EQ(checked, 4);
}

}  // namespace
