// SPDX-License-Identifier: MIT
// Slow checks of track/tracker_state: pair testing for every n <= 2000, trial division at
// 10^6 and the depth-first enumeration of squarefree products at 10^7 and 10^8.
#include <gtest/gtest.h>

#include <cstdint>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/squarefree_enumeration.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/track/tracker_state.hpp"

namespace {

using sqfc::Natural;
using sqfc::SignedSum;
using sqfc::track::TrackerState;
namespace oracles = sqfc::oracles;
namespace config = sqfc::config;

// Steps a tracker over the sieve's codes of [1, limit] and calls at(row) at each power of ten
// from 10^3 on. Returns the number of powers visited.
template <class At>
int run_to(Natural limit, At at) {
  TrackerState s;
  Natural power = 1000;
  int visited = 0;
  sqfc::arith::sieve_range(1, limit + 1, [&](const sqfc::arith::SieveBlock& b) {
    for (std::size_t i = 0; i < b.size(); ++i) {
      s.step(b.code(i));
      if (s.n() == power) {
        at(s.row());
        power *= 10;
        ++visited;
      }
    }
  });
  return visited;
}

TEST(TrackerStateSlow, DivisibilityEdgesMatchPairTestingForEveryNUpTo2000) {
  const Natural limit = 2000;
  TrackerState s;
  Natural checked = 0;
  for (Natural n = 1; n <= limit; ++n) {
    const auto a = oracles::arithmetic_naive(n);
    s.step(sqfc::arith::make_factor_code(a.omega, a.mu != 0, a.big_omega));
    ASSERT_EQ(s.row().div_edges, oracles::divisibility_edges_naive(n)) << n;
    ++checked;
  }
  EXPECT_EQ(checked, limit);
}

TEST(TrackerStateSlow, FacesAtAMillionMatchTrialDivision) {
  int checked = 0;
  run_to(1'000'000, [&](const sqfc::track::TableRow& r) {
    if (r.n != 1'000'000) return;
    auto naive = oracles::f_vector_naive(r.n);
    naive.resize(config::omega_slots, 0);
    for (int d = 0; d < config::omega_slots; ++d)
      EXPECT_EQ(r.faces[static_cast<std::size_t>(d)], naive[static_cast<std::size_t>(d)]) << "f" << d;
    ++checked;
  });
  EXPECT_EQ(checked, 1);
}

TEST(TrackerStateSlow, CountsTo10To8MatchEnumeration) {
  int checked = 0;
  const int visited = run_to(100'000'000, [&](const sqfc::track::TableRow& r) {
    if (r.n < 10'000'000) return;
    const auto census = oracles::squarefree_census_dfs(r.n);
    EXPECT_EQ(r.squarefree, census.squarefree) << r.n;
    EXPECT_EQ(r.mertens, census.mertens) << r.n;
    EXPECT_EQ(r.div_edges, census.divisibility_pairs) << r.n;
    auto faces = census.faces;
    faces.resize(config::omega_slots, 0);
    for (int d = 0; d < config::omega_slots; ++d)
      EXPECT_EQ(r.faces[static_cast<std::size_t>(d)], faces[static_cast<std::size_t>(d)]) << r.n << " f" << d;
    auto odd = census.odd_upper;
    odd.resize(config::omega_slots + 1, 0);
    EXPECT_EQ(r.betti[0], static_cast<SignedSum>(odd[1]) + 1) << r.n;
    for (int d = 1; d + 1 < config::omega_slots; ++d)
      EXPECT_EQ(r.betti[static_cast<std::size_t>(d)], static_cast<SignedSum>(odd[static_cast<std::size_t>(d) + 1])) << r.n << " b" << d;
    ++checked;
  });
  EXPECT_EQ(visited, 6);  // 10^3 .. 10^8
  EXPECT_EQ(checked, 2);  // 10^7 and 10^8
}

}  // namespace
