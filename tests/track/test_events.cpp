// SPDX-License-Identifier: MIT
// Tests of track/events: events from run_table against a brute-force event list, the first
// zeros of M against OEIS A028442, and compare_scaled against exact big-integer arithmetic.
#include "sqfc/track/events.hpp"

#include <gmp.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <tuple>
#include <random>
#include <set>
#include <string>
#include <vector>

#include "oracles/brute_force.hpp"
#include "oracles/event_list_naive.hpp"
#include "oracles/published_csv.hpp"
#include "oracles/squarefree_enumeration.hpp"
#include "oracles/test_support.hpp"
#include "sqfc/track/table_engine.hpp"
#include "track/collecting_sink.hpp"

namespace {

using sqfc::Count;
using sqfc::Natural;
using sqfc::SignedSum;
using sqfc::track::Event;
using sqfc::track::EventKind;
namespace oracles = sqfc::oracles;
namespace track = sqfc::track;

std::string data_path(const char* name) { return std::string(SQFC_TEST_DATA_DIR) + "/" + name; }

// omega(n) for squarefree n, -1 otherwise, by trial division.
std::vector<std::int8_t> omega_table_naive(Natural limit) {
  const auto p = oracles::prefix_naive(limit);
  std::vector<std::int8_t> omega(limit + 1, -1);
  for (Natural n = 1; n <= limit; ++n)
    if (p.mu[n] != 0) omega[n] = static_cast<std::int8_t>(p.omega[n]);
  return omega;
}

std::vector<Event> engine_events(Natural to, Natural from, unsigned threads, std::size_t block, Natural segment) {
  track::TableRunOptions o;
  o.to = to;
  o.from = from;
  o.threads = threads;
  o.block_size = block;
  o.segment_size = segment;
  o.events = true;
  sqfc::testing::CollectingSink sink;
  const auto report = track::run_table(o, sink);
  EXPECT_TRUE(report.all_checks_passed());
  EXPECT_EQ(report.events, sink.events.size());
  EXPECT_TRUE(sink.rows.empty());
  return sink.events;
}

bool by_n_then_kind(const Event& a, const Event& b) {
  return a.n != b.n ? a.n < b.n : static_cast<int>(a.kind) < static_cast<int>(b.kind);
}

// Compares two event lists as multisets ordered by (n, kind), and checks that the engine's
// list is already in increasing n. Returns the number of events compared.
Count expect_same_events(std::vector<Event> got, std::vector<Event> want, const std::string& what) {
  for (std::size_t i = 1; i < got.size(); ++i) EXPECT_LE(got[i - 1].n, got[i].n) << what << " at index " << i;
  std::stable_sort(got.begin(), got.end(), by_n_then_kind);
  std::stable_sort(want.begin(), want.end(), by_n_then_kind);
  EXPECT_EQ(got.size(), want.size()) << what;
  Count compared = 0;
  for (std::size_t i = 0; i < std::min(got.size(), want.size()); ++i) {
    const Event& g = got[i];
    const Event& w = want[i];
    const bool same = g.kind == w.kind && g.n == w.n && g.value == w.value;
    EXPECT_TRUE(same) << what << ": event " << i << " is (" << track::event_kind_name(g.kind) << ", " << g.n << ", "
                      << g.value << "), want (" << track::event_kind_name(w.kind) << ", " << w.n << ", " << w.value << ")";
    if (!same) return compared;
    EXPECT_DOUBLE_EQ(g.scaled, w.scaled) << what << " n = " << g.n;
    ++compared;
  }
  return compared;
}

TEST(Events, RunTableMatchesBruteForceOnSmallRanges) {
  // Trial division oracle; block size 2^10 so that the block test (may_fire_in) decides for
  // many blocks; every N is checked with one and two threads.
  int checked = 0;
  const auto omega = omega_table_naive(40'000);
  for (const Natural to : {Natural{1}, Natural{2}, Natural{3}, Natural{199}, Natural{200}, Natural{201}, Natural{1023},
                           Natural{1024}, Natural{1025}, Natural{40'000}}) {
    const std::vector<std::int8_t> prefix(omega.begin(), omega.begin() + static_cast<std::ptrdiff_t>(to + 1));
    const auto want = oracles::event_list_naive(prefix);
    for (const unsigned threads : {1U, 2U}) {
      const auto got = engine_events(to, 1, threads, 1024, 4096);
      EXPECT_EQ(expect_same_events(got, want, "N = " + std::to_string(to)), want.size());
      ++checked;
    }
  }
  EXPECT_EQ(checked, 20);
}

TEST(Events, RunTableMatchesBruteForceTo3Million) {
  // Depth-first enumeration oracle; several block and segment sizes, 1 and 2 threads.
  const Natural to = 3'000'000;
  const auto want = oracles::event_list_naive(oracles::squarefree_omega_table_dfs(to));
  ASSERT_GT(want.size(), 100U);
  int checked = 0;
  for (const auto& [threads, block, segment] : {std::tuple<unsigned, std::size_t, Natural>{1, 1024, 1024},
                                                {2, 1024, 65536}, {2, 1 << 14, 1 << 20}, {1, 1 << 17, 1 << 22}}) {
    const auto got = engine_events(to, 1, threads, block, segment);
    EXPECT_EQ(expect_same_events(got, want, "block " + std::to_string(block)), want.size());
    ++checked;
  }
  EXPECT_EQ(checked, 4);
}

TEST(Events, FromSuppressesEarlierEventsOnly) {
  // Events of a run from A are those of a run from 1 with n >= A; records still see n < A.
  const Natural to = 300'000;
  const auto omega = oracles::squarefree_omega_table_dfs(to);
  const auto all = oracles::event_list_naive(omega);
  int checked = 0;
  for (const Natural from : {Natural{2}, Natural{3}, Natural{40}, Natural{200}, Natural{201}, Natural{1024},
                             Natural{1025}, Natural{99'999}, Natural{to}}) {
    std::vector<Event> want;
    for (const auto& e : all)
      if (e.n >= from) want.push_back(e);
    EXPECT_EQ(want, oracles::event_list_naive(omega, from)) << from;  // the oracle's own filter agrees
    const auto got = engine_events(to, from, 2, 1024, 8192);
    EXPECT_EQ(expect_same_events(got, want, "from " + std::to_string(from)), want.size());
    ++checked;
  }
  EXPECT_EQ(checked, 9);
}

TEST(Events, FirstTwentyZerosOfMertens) {
  // tests/data/mertens_zeros.csv: OEIS A028442, the first 20 n with M(n) = 0.
  const auto table = oracles::read_published_csv(data_path("mertens_zeros.csv"));
  ASSERT_EQ(table.rows.size(), 20U);
  const Natural last = static_cast<Natural>(table.integer(19, "n"));
  // The published list against trial division first (so a mistyped table cannot pass).
  const auto prefix = oracles::prefix_naive(last);
  std::vector<Natural> naive_zeros;
  for (Natural n = 1; n <= last; ++n)
    if (prefix.mertens[n] == 0) naive_zeros.push_back(n);
  const auto got = engine_events(last, 1, 1, 1024, 1024);
  std::vector<Natural> engine_zeros;
  for (const auto& e : got)
    if (e.kind == EventKind::mertens_zero) engine_zeros.push_back(e.n);
  ASSERT_EQ(naive_zeros.size(), 20U);
  ASSERT_EQ(engine_zeros.size(), 20U);
  int checked = 0;
  for (std::size_t r = 0; r < 20; ++r) {
    const auto published = static_cast<Natural>(table.integer(r, "n"));
    EXPECT_EQ(naive_zeros[r], published) << table.text(r, "source");
    EXPECT_EQ(engine_zeros[r], published) << table.text(r, "source");
    ++checked;
  }
  EXPECT_EQ(checked, 20);
}

TEST(Events, FirstDimensionsAtPrimorials) {
  // First faces at the primorials (OEIS A002110), first homology at 2 and the odd
  // primorials (OEIS A070826), with direct Z/2 homology on both sides of 15 and 105.
  const Natural to = 1'000'000;
  const auto events = engine_events(to, 1, 2, 1 << 12, 1 << 16);
  std::vector<std::pair<Natural, SignedSum>> faces, homology;
  for (const auto& e : events) {
    if (e.kind == EventKind::first_face_dimension) faces.emplace_back(e.n, e.value);
    if (e.kind == EventKind::first_homology_dimension) homology.emplace_back(e.n, e.value);
  }
  EXPECT_EQ(faces, (std::vector<std::pair<Natural, SignedSum>>{{2, 0}, {6, 1}, {30, 2}, {210, 3}, {2310, 4}, {30030, 5}, {510510, 6}}));
  EXPECT_EQ(homology, (std::vector<std::pair<Natural, SignedSum>>{{2, 0}, {15, 1}, {105, 2}, {1155, 3}, {15015, 4}, {255255, 5}}));
  int checked = 0;
  for (const auto& [n, d] : {std::pair<Natural, std::size_t>{15, 1}, {105, 2}}) {
    auto before = oracles::betti_mod2_naive(n - 1);
    auto at = oracles::betti_mod2_naive(n);
    before.resize(4, 0);
    at.resize(4, 0);
    EXPECT_EQ(before[d], 0) << n;
    EXPECT_GT(at[d], 0) << n;
    ++checked;
  }
  EXPECT_EQ(checked, 2);
}

TEST(Events, EventKindNamesAreDistinct) {
  const EventKind kinds[] = {EventKind::mertens_zero, EventKind::mertens_high, EventKind::mertens_low,
                             EventKind::scaled_high, EventKind::scaled_low, EventKind::first_face_dimension,
                             EventKind::first_homology_dimension};
  std::set<std::string> names;
  for (const auto k : kinds) names.insert(std::string(track::event_kind_name(k)));
  EXPECT_EQ(names.size(), 7U);
  EXPECT_EQ(track::event_kind_name(EventKind::mertens_zero), "mertens_zero");
  EXPECT_EQ(track::event_kind_name(EventKind::first_homology_dimension), "first_homology_dimension");
}

// sign(m1/sqrt(n1) - m2/sqrt(n2)) exactly with GMP (reference library): compare signs, then
// m1^2 n2 with m2^2 n1 as big integers.
int compare_scaled_gmp(SignedSum m1, Natural n1, SignedSum m2, Natural n2) {
  const int s1 = (m1 > 0) - (m1 < 0), s2 = (m2 > 0) - (m2 < 0);
  if (s1 != s2) return s1 < s2 ? -1 : 1;
  if (s1 == 0) return 0;
  mpz_t a, b, t;
  mpz_inits(a, b, t, nullptr);
  mpz_set_si(a, m1);
  mpz_mul(a, a, a);
  mpz_set_ui(t, n2);
  mpz_mul(a, a, t);
  mpz_set_si(b, m2);
  mpz_mul(b, b, b);
  mpz_set_ui(t, n1);
  mpz_mul(b, b, t);
  const int c = mpz_cmp(a, b);
  mpz_clears(a, b, t, nullptr);
  const int magnitude = (c > 0) - (c < 0);
  return s1 > 0 ? magnitude : -magnitude;
}

// Random (m, n) with n in [1, n_max] and |m| <= m_max (m = 0 and small n included often).
std::pair<SignedSum, Natural> random_pair(std::mt19937_64& rng, SignedSum m_max, Natural n_max) {
  const Natural n = rng() % 4 == 0 ? std::uniform_int_distribution<Natural>(1, 1000)(rng)
                                   : std::uniform_int_distribution<Natural>(1, n_max)(rng);
  SignedSum m = 0;
  switch (rng() % 4) {
    case 0: m = std::uniform_int_distribution<SignedSum>(-3, 3)(rng); break;
    case 1: m = std::uniform_int_distribution<SignedSum>(-1000, 1000)(rng); break;
    default: m = std::uniform_int_distribution<SignedSum>(-m_max, m_max)(rng);
  }
  return {m, n};
}

void check_compare_scaled(std::uint64_t salt, SignedSum m_max, Natural n_max, Count trials) {
  auto rng = sqfc::testing::test_rng(salt);
  Count checked = 0, by_long_double = 0;
  for (Count t = 0; t < trials; ++t) {
    auto [m1, n1] = random_pair(rng, m_max, n_max);
    auto [m2, n2] = random_pair(rng, m_max, n_max);
    if (t % 5 == 0) {
      // An exact tie: m2 / sqrt(n2) = (k m1) / sqrt(k^2 n1), when it stays in range.
      const Natural k = std::uniform_int_distribution<Natural>(1, 1000)(rng);
      if (n1 <= n_max / (k * k) && std::abs(m1) <= m_max / static_cast<SignedSum>(k))
        m2 = m1 * static_cast<SignedSum>(k), n2 = n1 * k * k;
    }
    if (t % 7 == 0) m2 = m1 + (rng() % 2 ? 1 : -1), n2 = n1;  // neighbours
    const int want = compare_scaled_gmp(m1, n1, m2, n2);
    const int got = track::compare_scaled(m1, n1, m2, n2);
    ASSERT_EQ((got > 0) - (got < 0), want) << "compare_scaled(" << m1 << ", " << n1 << ", " << m2 << ", " << n2 << ") "
                                           << sqfc::testing::seed_note();
    // Antisymmetry.
    const int back = track::compare_scaled(m2, n2, m1, n1);
    ASSERT_EQ((back > 0) - (back < 0), -want) << m1 << " " << n1 << " " << m2 << " " << n2 << " " << sqfc::testing::seed_note();
    // Where long double separates the two values clearly, it must agree as well.
    const long double x = static_cast<long double>(m1) / std::sqrt(static_cast<long double>(n1));
    const long double y = static_cast<long double>(m2) / std::sqrt(static_cast<long double>(n2));
    if (std::fabs(x - y) > 1e-15L * (std::fabs(x) + std::fabs(y))) {
      ASSERT_EQ(want, x > y ? 1 : -1) << m1 << " " << n1 << " " << m2 << " " << n2 << " " << sqfc::testing::seed_note();
      ++by_long_double;
    }
    ++checked;
  }
  EXPECT_EQ(checked, trials);
  EXPECT_GT(by_long_double, trials / 2);  // most random pairs are far apart
}

TEST(Events, CompareScaledIsExactInTheRangeOfRuns) {
  // |M(n)| < sqrt(n) < 10^8 for every n <= 10^16 in any table the engine can make; here
  // |m| <= 2^27 and n <= 10^16.
  check_compare_scaled(31, SignedSum{1} << 27, sqfc::config::max_sieve_n, 200'000 * sqfc::testing::test_multiplier());
}

TEST(Events, CompareScaledIsExactForAll64BitInputs) {
  // events.hpp: exact for all 64-bit inputs with n1, n2 >= 1. Regression: the 128-bit
  // products of an earlier version wrapped first at M = 2^40, n = 2^48 (2^80 * 2^48 = 2^128),
  // where 2^40 / 2^24 = 2^16 > 1 / 2^24; both paths (|M| below and above 2^37) are crossed.
  const SignedSum m = SignedSum{1} << 40;
  const Natural n = Natural{1} << 48;
  EXPECT_GT(track::compare_scaled(m, n, 1, n), 0) << "compare_scaled(2^40, 2^48, 1, 2^48)";
  EXPECT_LT(track::compare_scaled(1, n, m, n), 0) << "compare_scaled(1, 2^48, 2^40, 2^48)";
  EXPECT_EQ(compare_scaled_gmp(m, n, 1, n), 1);  // the oracle agrees with the hand computation
  // Extremes: INT64_MIN and INT64_MAX, n = 2^64 - 1.
  const SignedSum lo = std::numeric_limits<SignedSum>::min(), hi = std::numeric_limits<SignedSum>::max();
  const Natural top = std::numeric_limits<Natural>::max();
  int extremes = 0;
  for (const auto& [m1, n1, m2, n2] : {std::tuple<SignedSum, Natural, SignedSum, Natural>{lo, top, lo, 1}, {lo, 1, lo + 1, 1},
                                       {hi, top, hi, top - 1}, {hi, 1, lo, 1}, {lo, top, -1, 1}, {hi, top, 1, 1},
                                       {lo, 4, lo / 2, 1}, {hi - 1, top, hi, top}}) {
    const int got = track::compare_scaled(m1, n1, m2, n2);
    EXPECT_EQ((got > 0) - (got < 0), compare_scaled_gmp(m1, n1, m2, n2)) << m1 << " " << n1 << " " << m2 << " " << n2;
    ++extremes;
  }
  EXPECT_EQ(extremes, 8);
  // Random pairs up to |M| = 2^40 and 2^62 over the whole 64-bit range of n.
  check_compare_scaled(32, SignedSum{1} << 40, sqfc::config::max_sieve_n, 100'000 * sqfc::testing::test_multiplier());
  check_compare_scaled(33, SignedSum{1} << 62, top, 100'000 * sqfc::testing::test_multiplier());
}

TEST(Events, CompareScaledZerosAndSigns) {
  int checked = 0;
  for (const auto& [m1, n1, m2, n2, want] :
       {std::tuple<SignedSum, Natural, SignedSum, Natural, int>{0, 1, 0, 5, 0}, {0, 7, 1, 1000000, -1},
        {0, 7, -1, 1000000, 1}, {-1, 1, 1, 1, -1}, {2, 4, 1, 1, 0}, {-3, 9, -1, 1, 0}, {1, 2, 1, 3, 1},
        {-1, 2, -1, 3, -1}, {5, 100, 1, 4, 0}}) {
    const int got = track::compare_scaled(m1, n1, m2, n2);
    EXPECT_EQ((got > 0) - (got < 0), want) << m1 << " " << n1 << " " << m2 << " " << n2;
    ++checked;
  }
  EXPECT_EQ(checked, 9);
}

}  // namespace
