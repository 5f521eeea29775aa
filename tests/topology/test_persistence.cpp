// SPDX-License-Identifier: MIT
// Persistence of the filtration against direct Z/2 homology, the odd-squarefree formula and
// filtered families (each checked against a dense rank oracle written here).
#include "sqfc/topology/persistence.hpp"

#include <gtest/gtest.h>

#include <map>
#include <numeric>

#include "oracles/brute_force.hpp"
#include "sqfc/core/error.hpp"

namespace {

using sqfc::Natural;
using sqfc::topology::Bar;
using sqfc::topology::FaceFamily;

// Betti numbers over Z/2 of the family's complex on [2, n], by dense elimination of the
// boundary matrices (shares no code with compute_persistence).
std::vector<std::int64_t> family_betti_naive(Natural n, const FaceFamily& family, int top) {
  std::map<int, std::vector<Natural>> faces;
  std::map<Natural, std::size_t> index;
  for (Natural k = 2; k <= n; ++k) {
    const auto a = sqfc::oracles::arithmetic_naive(k);
    if (a.mu == 0) continue;
    Natural largest = 1, m = k;
    for (Natural q = 2; q <= m; ++q)
      if (m % q == 0) largest = q, m /= q;
    if (family.smooth_bound && largest > *family.smooth_bound) continue;
    if (family.coprime_to && std::gcd(k, *family.coprime_to) != 1) continue;
    if (family.max_dimension && a.omega - 1 > *family.max_dimension) continue;
    index[k] = faces[a.omega - 1].size();
    faces[a.omega - 1].push_back(k);
  }
  auto rank = [&](int d) -> std::size_t {  // rank of the boundary from dimension d to d - 1
    if (d <= 0 || !faces.count(d) || !faces.count(d - 1)) return 0;
    const auto& cols = faces[d - 1];
    std::vector<std::vector<bool>> rows;
    for (const auto k : faces[d]) {
      std::vector<bool> row(cols.size(), false);
      Natural m = k;
      for (Natural q = 2; q <= m; ++q)
        if (m % q == 0) m /= q, row[index.at(k / q)] = true;
      rows.push_back(row);
    }
    std::size_t r = 0;
    for (std::size_t c = 0; c < cols.size() && r < rows.size(); ++c) {
      std::size_t pivot = r;
      while (pivot < rows.size() && !rows[pivot][c]) ++pivot;
      if (pivot == rows.size()) continue;
      std::swap(rows[r], rows[pivot]);
      for (std::size_t i = 0; i < rows.size(); ++i)
        if (i != r && rows[i][c])
          for (std::size_t j = 0; j < cols.size(); ++j) rows[i][j] = rows[i][j] != rows[r][j];
      ++r;
    }
    return r;
  };
  std::vector<std::int64_t> betti(static_cast<std::size_t>(top + 1), 0);
  for (int d = 0; d <= top; ++d) {
    const auto f = faces.count(d) ? faces[d].size() : 0;
    betti[d] = static_cast<std::int64_t>(f) - static_cast<std::int64_t>(rank(d)) - static_cast<std::int64_t>(rank(d + 1));
  }
  return betti;
}

TEST(Persistence, BettiFromBarsEqualDirectZ2HomologyForEveryNUpTo250) {
  const Natural n_max = 250;
  const auto result = sqfc::topology::compute_persistence(n_max, {}, 2);
  int checked = 0;
  for (Natural n = 2; n <= n_max; ++n) {
    const auto naive = sqfc::oracles::betti_mod2_naive(n);  // dense Z/2 elimination (tests/oracles)
    const auto bars = sqfc::topology::betti_from_bars(result.bars, n, result.top_dimension);
    for (std::size_t d = 0; d < bars.size(); ++d) {
      const std::int64_t expected = d < naive.size() ? naive[d] : 0;
      ASSERT_EQ(static_cast<std::int64_t>(bars[d]), expected) << "n = " << n << ", d = " << d;
    }
    ++checked;
  }
  EXPECT_EQ(checked, 249);
}

TEST(Persistence, FiniteBarsAreMTo2MAndBettiMatchTheFormula) {
  const Natural n = 100000;
  const auto result = sqfc::topology::compute_persistence(n, {}, 2);
  EXPECT_FALSE(sqfc::topology::first_bar_not_m_2m(result.bars, n).has_value());
  std::vector<Natural> points = {1, 2, 104, 105, 209, 210, 1155, 15015, 99999, 100000};
  const auto formula = sqfc::topology::betti_by_formula(points, result.top_dimension);
  ASSERT_EQ(formula.size(), points.size());
  for (std::size_t i = 0; i < points.size(); ++i)
    EXPECT_EQ(sqfc::topology::betti_from_bars(result.bars, points[i], result.top_dimension), formula[i]) << points[i];
  // b2(104) = 0, b2(105) = 1: the 2-sphere of 3*5*7 (common knowledge of the field), filled at 210.
  EXPECT_EQ(formula[2][2], 0U);
  EXPECT_EQ(formula[3][2], 1U);
  EXPECT_EQ(formula[5][2] + 1, formula[4][2]);
  // Every face is paired or essential: bars = faces - finite bars.
  Natural faces = 0, finite = 0;
  for (const auto f : result.faces_by_dimension) faces += f;
  for (const auto& b : result.bars) finite += b.death != 0;
  EXPECT_EQ(result.bars.size(), faces - finite);
}

TEST(Persistence, AMisplacedBarIsReported) {
  std::vector<Bar> bars = {{0, 2, 0}, {0, 3, 6}, {1, 15, 30}, {1, 21, 40}};
  const auto bad = sqfc::topology::first_bar_not_m_2m(bars, 100);
  ASSERT_TRUE(bad.has_value());
  EXPECT_EQ(bad->birth, 21U);
  bars[3] = {0, 21, 42};  // dimension must be omega(21) - 1 = 1
  EXPECT_EQ(sqfc::topology::first_bar_not_m_2m(bars, 100)->birth, 21U);
  bars[3] = {1, 21, 42};
  EXPECT_FALSE(sqfc::topology::first_bar_not_m_2m(bars, 100).has_value());
}

TEST(Persistence, ThreeAndTwoCoefficientsGiveTheSameBarcode) {
  // No torsion: the Z/3 barcode equals the Z/2 one (issue 7 asks for Z/3 up to 10^4).
  const auto two = sqfc::topology::compute_persistence(10000, {}, 2);
  const auto three = sqfc::topology::compute_persistence(10000, {}, 3);
  EXPECT_EQ(two.bars, three.bars);
  EXPECT_GT(two.bars.size(), 4000U);
}

TEST(Persistence, FamiliesAgreeWithDenseHomology) {
  const std::vector<FaceFamily> families = {
      {Natural{5}, std::nullopt, std::nullopt}, {Natural{7}, std::nullopt, std::nullopt},
      {Natural{13}, std::nullopt, std::nullopt}, {std::nullopt, Natural{2}, std::nullopt},
      {std::nullopt, Natural{6}, std::nullopt}, {std::nullopt, Natural{35}, std::nullopt},
      {std::nullopt, std::nullopt, 0},          {std::nullopt, std::nullopt, 1},
      {Natural{11}, Natural{3}, 1}};
  int checked = 0;
  for (const auto& family : families)
    for (const Natural n : {30ULL, 105ULL, 211ULL, 300ULL}) {
      for (const unsigned field : {2U, 3U}) {
        const auto result = sqfc::topology::compute_persistence(n, family, field);
        const int top = std::max(result.top_dimension, 0);
        const auto bars = sqfc::topology::betti_from_bars(result.bars, n, top);
        const auto naive = family_betti_naive(n, family, top);
        for (int d = 0; d <= top; ++d) EXPECT_EQ(static_cast<std::int64_t>(bars[d]), naive[d]) << "n = " << n << " d = " << d;
        ++checked;
      }
    }
  EXPECT_EQ(checked, 9 * 4 * 2);
}

TEST(Persistence, Preconditions) {
  EXPECT_THROW(sqfc::topology::compute_persistence(0, {}, 2), sqfc::InvalidArgument);
  EXPECT_THROW(sqfc::topology::compute_persistence(200'000'001ULL, {}, 2), sqfc::InvalidArgument);
  EXPECT_THROW(sqfc::topology::compute_persistence(10, {}, 5), sqfc::InvalidArgument);
  EXPECT_THROW(sqfc::topology::betti_by_formula({5, 3}, 2), sqfc::InvalidArgument);
  const auto empty = sqfc::topology::compute_persistence(1, {}, 2);
  EXPECT_TRUE(empty.bars.empty());
}

}  // namespace

namespace {

TEST(Persistence, StandardAndTwistOrdersGiveTheSameBars) {
  int checked = 0;
  for (const Natural n : {1ULL, 2ULL, 30ULL, 1000ULL, 20000ULL})
    for (const unsigned field : {2U, 3U}) {
      const auto twist = sqfc::topology::compute_persistence(n, {}, field, sqfc::topology::ReductionOrder::twist);
      const auto standard = sqfc::topology::compute_persistence(n, {}, field, sqfc::topology::ReductionOrder::standard);
      EXPECT_EQ(twist.bars, standard.bars) << "n = " << n << " field " << field;
      EXPECT_EQ(standard.cleared_columns, 0U);
      ++checked;
    }
  const FaceFamily family{Natural{13}, Natural{3}, std::nullopt};
  EXPECT_EQ(sqfc::topology::compute_persistence(1000, family, 2, sqfc::topology::ReductionOrder::twist).bars,
            sqfc::topology::compute_persistence(1000, family, 2, sqfc::topology::ReductionOrder::standard).bars);
  EXPECT_EQ(checked, 10);
}

}  // namespace
