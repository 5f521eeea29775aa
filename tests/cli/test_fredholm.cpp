// SPDX-License-Identifier: MIT
// `sqfc fredholm` run as a program (issue 4): its rows, histogram file, Matrix Market dump and
// manifest, each value checked against facts computed here without the library (trial division,
// gcd over pairs, direct sums) or taken from published tables, plus its input errors.
#include <gtest/gtest.h>

#include <algorithm>
#include <cstdint>
#include <map>
#include <nlohmann/json.hpp>
#include <numeric>
#include <set>
#include <sstream>

#include "cli_runner.hpp"
#include "oracles/brute_force.hpp"

namespace sqfc::cli_test {
namespace {

using Matrix = std::vector<std::vector<std::int64_t>>;

// ---------------------------------------------------------------------------------------------
// Reading the outputs.

/// A CSV file of plain fields: header and rows, columns found by name.
struct Csv {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  [[nodiscard]] std::size_t column(const std::string& name) const {
    const auto it = std::find(header.begin(), header.end(), name);
    if (it == header.end()) throw std::runtime_error("no column " + name);
    return static_cast<std::size_t>(it - header.begin());
  }
  [[nodiscard]] const std::string& at(std::size_t row, const std::string& name) const { return rows.at(row).at(column(name)); }
  [[nodiscard]] std::int64_t number(std::size_t row, const std::string& name) const { return std::stoll(at(row, name)); }
};

Csv parse_csv(const std::string& text) {
  Csv csv;
  const auto lines = split_lines(text);
  if (lines.empty()) return csv;
  csv.header = split_fields(lines[0]);
  for (std::size_t i = 1; i < lines.size(); ++i) {
    csv.rows.push_back(split_fields(lines[i]));
    EXPECT_EQ(csv.rows.back().size(), csv.header.size()) << "line " << i + 1 << ": " << lines[i];
  }
  return csv;
}

/// The columns `sqfc fredholm` writes (issue 4, "Output"), in order.
const std::string fredholm_header =
    "n,vertices,edges,fredholm,energy,green_min,green_max,green_distinct,positive_eigenvalues,"
    "negative_eigenvalues,even_faces,odd_faces,flint_fredholm,spectrum_positive,spectrum_negative,"
    "spectrum_margin,div_fredholm,checks";

/// A Matrix Market file "coordinate integer symmetric": the dense matrix it describes, with
/// every format rule checked on the way (header line, comments, size line, 1-based entries in
/// the lower triangle, each position once, exactly as many as the size line says).
Matrix parse_matrix_market(const std::string& text, std::size_t expected_size) {
  const auto lines = split_lines(text);
  EXPECT_GE(lines.size(), 2u);
  if (lines.size() < 2) return {};
  EXPECT_EQ(lines[0], "%%MatrixMarket matrix coordinate integer symmetric");
  std::size_t i = 1;
  while (i < lines.size() && !lines[i].empty() && lines[i][0] == '%') ++i;
  EXPECT_LT(i, lines.size()) << "no size line";
  if (i >= lines.size()) return {};
  std::istringstream size_line(lines[i]);
  std::size_t rows = 0, columns = 0, entries = 0;
  std::string rest;
  EXPECT_TRUE(static_cast<bool>(size_line >> rows >> columns >> entries)) << lines[i];
  EXPECT_FALSE(size_line >> rest) << "extra text on the size line: " << lines[i];
  EXPECT_EQ(rows, expected_size);
  EXPECT_EQ(columns, expected_size);
  EXPECT_EQ(lines.size() - i - 1, entries) << "entry lines versus the size line";
  Matrix g(rows, std::vector<std::int64_t>(rows, 0));
  std::set<std::pair<std::size_t, std::size_t>> seen;
  for (std::size_t k = i + 1; k < lines.size(); ++k) {
    std::istringstream entry(lines[k]);
    std::size_t r = 0, c = 0;
    std::int64_t v = 0;
    EXPECT_TRUE(static_cast<bool>(entry >> r >> c >> v)) << lines[k];
    EXPECT_FALSE(entry >> rest) << "extra text: " << lines[k];
    EXPECT_TRUE(r >= 1 && c >= 1 && c <= r && r <= rows) << "not a 1-based lower-triangle position: " << lines[k];
    if (!(r >= 1 && c >= 1 && c <= r && r <= rows)) continue;
    EXPECT_TRUE(seen.insert({r, c}).second) << "position listed twice: " << lines[k];
    g[r - 1][c - 1] = v;
    g[c - 1][r - 1] = v;
  }
  return g;
}

struct Histogram {
  std::map<std::int64_t, std::int64_t> counts, diagonal;
};

/// Histogram file rows (n,value,count,diagonal_count) grouped by n.
std::map<std::int64_t, Histogram> parse_histograms(const std::string& text) {
  const auto csv = parse_csv(text);
  EXPECT_EQ(join(csv.header, ","), "n,value,count,diagonal_count");
  std::map<std::int64_t, Histogram> by_n;
  for (std::size_t r = 0; r < csv.rows.size(); ++r) {
    auto& h = by_n[csv.number(r, "n")];
    const auto value = csv.number(r, "value");
    EXPECT_EQ(h.counts.count(value), 0u) << "value " << value << " twice at n = " << csv.at(r, "n");
    h.counts[value] = csv.number(r, "count");
    if (const auto d = csv.number(r, "diagonal_count"); d != 0) h.diagonal[value] = d;
  }
  return by_n;
}

// ---------------------------------------------------------------------------------------------
// Independent facts: trial division (tests/oracles/brute_force.hpp), gcd over pairs, direct sums.

/// Everything about H_n for n <= n_max that the rows are checked against.
class Facts {
 public:
  explicit Facts(std::uint64_t n_max) : prefix_(oracles::prefix_naive(n_max)) {
    for (std::uint64_t k = 2; k <= n_max; ++k)
      if (prefix_.mu[k] != 0) vertices_.push_back(k);
    // edges_[i]: edges of H among vertices_[0..i], by testing gcd(a, b) > 1 for every pair.
    std::int64_t total = 0;
    for (std::size_t b = 0; b < vertices_.size(); ++b) {
      for (std::size_t a = 0; a < b; ++a) total += std::gcd(vertices_[a], vertices_[b]) > 1;
      edges_.push_back(total);
    }
  }
  [[nodiscard]] int mu(std::uint64_t k) const { return prefix_.mu.at(k); }
  [[nodiscard]] std::int64_t mertens(std::uint64_t n) const { return prefix_.mertens.at(n); }
  /// The squarefree k in [2, n], increasing: the vertex order of H_n.
  [[nodiscard]] std::vector<std::uint64_t> vertices(std::uint64_t n) const {
    return {vertices_.begin(), std::upper_bound(vertices_.begin(), vertices_.end(), n)};
  }
  /// Q(n) - 1 from the trial-division count.
  [[nodiscard]] std::int64_t vertex_count(std::uint64_t n) const { return prefix_.squarefree.at(n) - 1; }
  [[nodiscard]] std::int64_t edges(std::uint64_t n) const {
    const auto v = vertices(n).size();
    return v == 0 ? 0 : edges_[v - 1];
  }
  /// prod over squarefree k in [2, n] of -mu(k) (unimodularity of connection graphs, published 2016).
  [[nodiscard]] int fredholm(std::uint64_t n) const {
    int d = 1;
    for (const auto k : vertices(n)) d *= -mu(k);
    return d;
  }
  /// Faces of even and odd dimension of K_n from the enumerated f-vector.
  [[nodiscard]] std::pair<std::int64_t, std::int64_t> face_parity(std::uint64_t n) const {
    const auto f = oracles::f_vector_naive(n);
    std::int64_t even = 0, odd = 0;
    for (std::size_t d = 0; d < f.size(); ++d) (d % 2 ? odd : even) += static_cast<std::int64_t>(f[d]);
    return {even, odd};
  }
  /// M_l(y) = sum of mu(t) over t <= y with gcd(t, l) = 1, summed term by term.
  [[nodiscard]] std::int64_t mertens_coprime(std::uint64_t l, std::uint64_t y) const {
    std::int64_t s = 0;
    for (std::uint64_t t = 1; t <= y; ++t)
      if (std::gcd(t, l) == 1) s += mu(t);
    return s;
  }
  /// g_n by the closed form of design.md identity 6, -mu(x)mu(y)mu(l)M_l(n/l) for l = lcm <= n,
  /// each M_l by direct summation (memoised per l, since y = n/l is fixed for a given n).
  [[nodiscard]] Matrix green_by_formula(std::uint64_t n) const {
    const auto v = vertices(n);
    Matrix g(v.size(), std::vector<std::int64_t>(v.size(), 0));
    std::map<std::uint64_t, std::int64_t> memo;
    for (std::size_t i = 0; i < v.size(); ++i)
      for (std::size_t j = 0; j < v.size(); ++j) {
        const auto l = v[i] / std::gcd(v[i], v[j]) * v[j];
        if (l > n) continue;
        auto it = memo.find(l);
        if (it == memo.end()) it = memo.emplace(l, mertens_coprime(l, n / l)).first;
        g[i][j] = -mu(v[i]) * mu(v[j]) * mu(l) * it->second;
      }
    return g;
  }
  /// 1 + A(H_n), A by gcd.
  [[nodiscard]] Matrix one_plus_adjacency(std::uint64_t n) const {
    const auto v = vertices(n);
    Matrix m(v.size(), std::vector<std::int64_t>(v.size(), 0));
    for (std::size_t i = 0; i < v.size(); ++i)
      for (std::size_t j = 0; j < v.size(); ++j) m[i][j] = (i == j || std::gcd(v[i], v[j]) > 1) ? 1 : 0;
    return m;
  }

 private:
  oracles::NaivePrefix prefix_;
  std::vector<std::uint64_t> vertices_;
  std::vector<std::int64_t> edges_;
};

/// Facts up to 2000, the largest n checked by gcd over pairs in the default suite.
const Facts& facts() {
  static const Facts f(2000);
  return f;
}

bool is_identity_product(const Matrix& a, const Matrix& b) {
  const auto size = a.size();
  if (b.size() != size) return false;
  for (std::size_t i = 0; i < size; ++i)
    for (std::size_t j = 0; j < size; ++j) {
      std::int64_t s = 0;
      for (std::size_t k = 0; k < size; ++k) s += a[i][k] * b[k][j];
      if (s != (i == j ? 1 : 0)) return false;
    }
  return true;
}

Histogram histogram_of(const Matrix& g) {
  Histogram h;
  for (std::size_t i = 0; i < g.size(); ++i)
    for (std::size_t j = 0; j < g.size(); ++j) {
      ++h.counts[g[i][j]];
      if (i == j) ++h.diagonal[g[i][j]];
    }
  return h;
}

// ---------------------------------------------------------------------------------------------
// Hand-computed Green functions (rows and columns: the squarefree k in [2, n], increasing).

// n = 3: vertices 2, 3; gcd(2, 3) = 1, so H_3 has no edge, 1 + A = 1 and g = 1, det 1.
const Matrix hand_green_3 = {{1, 0}, {0, 1}};
const Matrix hand_one_plus_a_3 = {{1, 0}, {0, 1}};

// n = 6: vertices 2, 3, 5, 6; edges 2-6 and 3-6 (5 is isolated). By cofactors:
// det(1 + A) = -1, and g = adj / det.
const Matrix hand_one_plus_a_6 = {
    {1, 0, 0, 1},
    {0, 1, 0, 1},
    {0, 0, 1, 0},
    {1, 1, 0, 1},
};
const Matrix hand_green_6 = {
    {0, -1, 0, 1},
    {-1, 0, 0, 1},
    {0, 0, 1, 0},
    {1, 1, 0, -1},
};

// n = 10: vertices 2, 3, 5, 6, 7, 10; edges 2-6, 2-10, 3-6, 5-10, 6-10 (7 is isolated).
// Inverse worked out by hand and checked by multiplying out (1 + A) g = 1 on paper; det = +1.
const Matrix hand_one_plus_a_10 = {
    {1, 0, 0, 1, 0, 1},
    {0, 1, 0, 1, 0, 0},
    {0, 0, 1, 0, 0, 1},
    {1, 1, 0, 1, 0, 1},
    {0, 0, 0, 0, 1, 0},
    {1, 0, 1, 1, 0, 1},
};
const Matrix hand_green_10 = {
    {-1, -1, -1, 1, 0, 1},
    {-1, 0, 0, 1, 0, 0},
    {-1, 0, 0, 0, 0, 1},
    {1, 1, 0, -1, 0, 0},
    {0, 0, 0, 0, 1, 0},
    {1, 0, 1, 0, 0, -1},
};

/// Hand-computed row values (counting vertices, gcd edges, mu signs and M(n) by hand).
struct HandRow {
  std::int64_t n, vertices, edges, fredholm, energy, even_faces, odd_faces;
  std::optional<std::int64_t> green_min, green_max, green_distinct;
};
const std::vector<HandRow>& hand_rows() {
  static const std::vector<HandRow> rows = {
      // M(3) = -1: energy 2; entries {0, 0, 1, 1}.
      {3, 2, 0, 1, 2, 2, 0, 0, 1, 2},
      // M(6) = -1: energy 2; entries of hand_green_6 take -1, 0, 1; one face of dimension 1 (6).
      {6, 4, 2, -1, 2, 3, 1, -1, 1, 3},
      // M(10) = -1: energy 2; faces of dimension 1: 6, 10.
      {10, 6, 5, 1, 2, 4, 2, -1, 1, 3},
      // n = 30: 18 squarefree k in [2, 30]; M(30) = -3 so energy 4; dimension 1: 6, 10, 14, 15,
      // 21, 22, 26 (7 of them, so det = (-1)^7), dimension 0: ten primes plus 30 (dimension 2).
      // Edges: per prime C(S_p, 2) = 21 + 10 + 6 + 3 + 1 + 1, minus one for each of 6, 10, 15
      // (pairs sharing two primes: {6, 30}, {10, 30}, {15, 30}) = 39.
      {30, 18, 39, -1, 4, 11, 7, std::nullopt, std::nullopt, std::nullopt},
  };
  return rows;
}

TEST(FredholmHand, HandMatricesAreInverses) {
  // Guards the hand work itself: (1 + A) g = 1 for each matrix above, and each 1 + A is the
  // gcd adjacency of the trial-division vertices.
  int checked = 0;
  for (const auto& [n, a, g] : std::vector<std::tuple<std::uint64_t, const Matrix*, const Matrix*>>{
           {3, &hand_one_plus_a_3, &hand_green_3}, {6, &hand_one_plus_a_6, &hand_green_6},
           {10, &hand_one_plus_a_10, &hand_green_10}}) {
    EXPECT_TRUE(is_identity_product(*a, *g)) << "n = " << n;
    EXPECT_EQ(*a, facts().one_plus_adjacency(n)) << "n = " << n;
    EXPECT_EQ(*g, facts().green_by_formula(n)) << "n = " << n;
    ++checked;
  }
  EXPECT_EQ(checked, 3);
}

// ---------------------------------------------------------------------------------------------
// The main run.

const std::vector<std::string> main_args = {"fredholm", "--to", "2000", "--at", "3,6,10,30,2000",
                                            "--green-stats", "--cross-check"};
const std::vector<std::int64_t> main_samples = {3, 6, 10, 30, 2000};

std::vector<std::string> with(std::vector<std::string> args, const std::vector<std::string>& more) {
  args.insert(args.end(), more.begin(), more.end());
  return args;
}

// Checks one row of a bordered run with green stats against the facts; returns the values checked.
int check_row_against_facts(const Csv& csv, std::size_t r, bool bordered) {
  const auto n = static_cast<std::uint64_t>(csv.number(r, "n"));
  const auto& f = facts();
  int checked = 0;
  auto expect = [&](const std::string& column, std::int64_t value, const char* source) {
    EXPECT_EQ(csv.number(r, column), value) << "n = " << n << ", " << column << " (" << source << ")";
    ++checked;
  };
  expect("vertices", f.vertex_count(n), "Q(n) - 1, trial division");
  expect("edges", f.edges(n), "gcd over all pairs");
  expect("fredholm", f.fredholm(n), "prod -mu(k), unimodularity of connection graphs, published 2016");
  expect("energy", 1 - f.mertens(n), "1 - M(n), energy theorem, published 2017/2019");
  const auto [even, odd] = f.face_parity(n);
  expect("even_faces", even, "enumerated f-vector");
  expect("odd_faces", odd, "enumerated f-vector");
  if (bordered) {
    // Sign counts of the spectrum = face parities (published 2017).
    expect("positive_eigenvalues", even, "even-dimensional faces, published 2017");
    expect("negative_eigenvalues", odd, "odd-dimensional faces, published 2017");
  } else {
    EXPECT_EQ(csv.at(r, "positive_eigenvalues"), "") << "closed form has no inertia, n = " << n;
    EXPECT_EQ(csv.at(r, "negative_eigenvalues"), "") << "closed form has no inertia, n = " << n;
    checked += 2;
  }
  // Green statistics of the closed form summed directly (its inverse property is checked at
  // n <= 100 in FredholmDump; at larger n the energy identity and the binary's cross-check).
  const auto g = f.green_by_formula(n);
  const auto h = histogram_of(g);
  if (g.empty()) return checked;
  expect("green_min", h.counts.begin()->first, "closed form by direct sums");
  expect("green_max", h.counts.rbegin()->first, "closed form by direct sums");
  expect("green_distinct", static_cast<std::int64_t>(h.counts.size()), "closed form by direct sums");
  return checked;
}

TEST(Fredholm, MainRunHeaderRowsAndFacts) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, with(main_args, {"--quiet", "--out", "-"}));
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "") << describe(r);
  EXPECT_EQ(list_dir(dir.work()).size(), 0u) << "standard output only, no manifest";
  const auto csv = parse_csv(r.out);
  EXPECT_EQ(join(csv.header, ","), fredholm_header);
  ASSERT_EQ(csv.rows.size(), main_samples.size());
  int checked = 0, rows = 0;
  for (std::size_t i = 0; i < csv.rows.size(); ++i) {
    EXPECT_EQ(csv.number(i, "n"), main_samples[i]);
    checked += check_row_against_facts(csv, i, true);
    // Every row says which checks ran: inertia, the entry-by-entry closed form, the determinant
    // parity and the energy, none failed.
    auto names = split_fields(csv.at(i, "checks"), ';');
    std::sort(names.begin(), names.end());
    EXPECT_EQ(names, (std::vector<std::string>{"closed_form", "energy", "fredholm_parity", "inertia"}))
        << csv.at(i, "checks");
    ++rows;
  }
  EXPECT_EQ(rows, 5);
  // 8 facts per row (2 of them eigenvalue counts) + 3 Green statistics on each row.
  EXPECT_EQ(checked, 5 * 11);
}

TEST(Fredholm, MainRunHandComputedRows) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, with(main_args, {"--quiet", "--out", "-"}));
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto csv = parse_csv(r.out);
  ASSERT_EQ(csv.rows.size(), main_samples.size());
  int checked = 0;
  for (const auto& hand : hand_rows()) {
    const auto i = static_cast<std::size_t>(std::find(main_samples.begin(), main_samples.end(), hand.n) - main_samples.begin());
    ASSERT_LT(i, csv.rows.size());
    const std::vector<std::pair<std::string, std::int64_t>> expected = {
        {"n", hand.n}, {"vertices", hand.vertices}, {"edges", hand.edges}, {"fredholm", hand.fredholm},
        {"energy", hand.energy}, {"even_faces", hand.even_faces}, {"odd_faces", hand.odd_faces},
        {"positive_eigenvalues", hand.even_faces}, {"negative_eigenvalues", hand.odd_faces}};
    for (const auto& [column, value] : expected) {
      EXPECT_EQ(csv.number(i, column), value) << "hand-computed, n = " << hand.n << ", " << column;
      ++checked;
    }
    if (hand.green_min) {
      EXPECT_EQ(csv.number(i, "green_min"), *hand.green_min) << "hand-computed, n = " << hand.n;
      EXPECT_EQ(csv.number(i, "green_max"), *hand.green_max) << "hand-computed, n = " << hand.n;
      EXPECT_EQ(csv.number(i, "green_distinct"), *hand.green_distinct) << "hand-computed, n = " << hand.n;
      checked += 3;
    }
  }
  EXPECT_EQ(checked, 4 * 9 + 3 * 3);
}

TEST(Fredholm, PowersOfTenAgainstPublishedValues) {
  // Closed form at 10^0 .. 10^4 (fast). Q(10^k) = 7, 61, 608, 6083 (OEIS A071172) so V = Q - 1;
  // M(10^k) = -1, 1, 2, -23 (OEIS A084237) so energy = 1 - M; det = (-1)^((Q+M)/2 - 1)
  // (design.md identity 3); even/odd faces = (Q - M)/2 and (Q + M)/2 - 1.
  struct Published {
    std::int64_t n, q, m;
  };
  const std::vector<Published> published = {{10, 7, -1}, {100, 61, 1}, {1000, 608, 2}, {10000, 6083, -23}};
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"fredholm", "--to", "1e4", "--log", "1", "--method", "closed", "--quiet", "--out", "-"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto csv = parse_csv(r.out);
  ASSERT_EQ(csv.rows.size(), 5u);  // 1, 10, 100, 1000, 10^4
  // n = 1: the empty graph; the empty product is 1 and M(1) = 1.
  EXPECT_EQ(csv.number(0, "n"), 1);
  EXPECT_EQ(csv.number(0, "vertices"), 0);
  EXPECT_EQ(csv.number(0, "fredholm"), 1);
  EXPECT_EQ(csv.number(0, "energy"), 0);
  int checked = 0;
  for (std::size_t i = 1; i < csv.rows.size(); ++i) {
    const auto& p = published[i - 1];
    EXPECT_EQ(csv.number(i, "n"), p.n);
    EXPECT_EQ(csv.number(i, "vertices"), p.q - 1) << "OEIS A071172, n = " << p.n;
    EXPECT_EQ(csv.number(i, "energy"), 1 - p.m) << "OEIS A084237, n = " << p.n;
    EXPECT_EQ(csv.number(i, "fredholm"), ((p.q + p.m) / 2 - 1) % 2 == 0 ? 1 : -1) << "n = " << p.n;
    EXPECT_EQ(csv.number(i, "even_faces"), (p.q - p.m) / 2) << "n = " << p.n;
    EXPECT_EQ(csv.number(i, "odd_faces"), (p.q + p.m) / 2 - 1) << "n = " << p.n;
    ++checked;
    // Up to 2000 also the edges by gcd over all pairs, and the trial-division counts agree with
    // the published ones (10^4 is in test_fredholm_slow.cpp).
    if (p.n <= 2000) {
      EXPECT_EQ(csv.number(i, "edges"), facts().edges(static_cast<std::uint64_t>(p.n))) << "gcd pairs, n = " << p.n;
      EXPECT_EQ(facts().vertex_count(static_cast<std::uint64_t>(p.n)), p.q - 1);
      EXPECT_EQ(facts().mertens(static_cast<std::uint64_t>(p.n)), p.m);
      ++checked;
    }
  }
  EXPECT_EQ(checked, 4 + 3);
}

// ---------------------------------------------------------------------------------------------
// File outputs: the same run into a file, with histograms and the manifest.

TEST(Fredholm, FileOutputHistogramAndManifest) {
  ScratchDir stdout_dir, dir;
  const auto reference = run_sqfc(stdout_dir, with(main_args, {"--quiet", "--out", "-"}));
  ASSERT_EQ(reference.exit_code, 0) << describe(reference);
  const auto r = run_sqfc(dir, with(main_args, {"--quiet", "--histogram", "h.csv", "--out", "t.csv"}));
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.out, "");
  EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"h.csv", "t.csv", "t.csv.manifest.json"}));
  EXPECT_EQ(read_file(dir.path("t.csv")), reference.out) << "file and standard output differ";
  const auto csv = parse_csv(read_file(dir.path("t.csv")));
  ASSERT_EQ(csv.rows.size(), 5u);

  // Histograms: one block per sample; counts add up to V^2 and the diagonal counts to V; the
  // extremes and the number of values are the row's; sum value * count is the row's energy.
  const auto histograms = parse_histograms(read_file(dir.path("h.csv")));
  EXPECT_EQ(histograms.size(), 5u);
  int samples = 0;
  for (std::size_t i = 0; i < csv.rows.size(); ++i) {
    const auto n = csv.number(i, "n");
    const auto v = csv.number(i, "vertices");
    ASSERT_EQ(histograms.count(n), 1u) << "no histogram for n = " << n;
    const auto& h = histograms.at(n);
    std::int64_t total = 0, diagonal = 0, energy = 0;
    for (const auto& [value, count] : h.counts) total += count, energy += value * count;
    for (const auto& [value, count] : h.diagonal) {
      diagonal += count;
      EXPECT_GE(h.counts.at(value), count) << "diagonal count above the total, n = " << n;
    }
    EXPECT_EQ(total, v * v) << "n = " << n;
    EXPECT_EQ(diagonal, v) << "n = " << n;
    EXPECT_EQ(energy, csv.number(i, "energy")) << "n = " << n;
    EXPECT_EQ(h.counts.begin()->first, csv.number(i, "green_min")) << "n = " << n;
    EXPECT_EQ(h.counts.rbegin()->first, csv.number(i, "green_max")) << "n = " << n;
    EXPECT_EQ(static_cast<std::int64_t>(h.counts.size()), csv.number(i, "green_distinct")) << "n = " << n;
    // The whole distribution, entries and diagonal, against the closed form by direct sums.
    const auto expected = histogram_of(facts().green_by_formula(static_cast<std::uint64_t>(n)));
    EXPECT_EQ(h.counts, expected.counts) << "n = " << n;
    EXPECT_EQ(h.diagonal, expected.diagonal) << "n = " << n;
    ++samples;
  }
  EXPECT_EQ(samples, 5);
  // Hand-computed distributions: n = 6 from hand_green_6, n = 10 from hand_green_10.
  EXPECT_EQ(histograms.at(6).counts, (std::map<std::int64_t, std::int64_t>{{-1, 3}, {0, 8}, {1, 5}}));
  EXPECT_EQ(histograms.at(6).diagonal, (std::map<std::int64_t, std::int64_t>{{-1, 1}, {0, 2}, {1, 1}}));
  EXPECT_EQ(histograms.at(10).counts, (std::map<std::int64_t, std::int64_t>{{-1, 7}, {0, 20}, {1, 9}}));
  EXPECT_EQ(histograms.at(10).diagonal, (std::map<std::int64_t, std::int64_t>{{-1, 3}, {0, 2}, {1, 1}}));

  // The manifest (design.md section 4).
  nlohmann::json m;
  ASSERT_NO_THROW(m = nlohmann::json::parse(read_file(dir.path("t.csv.manifest.json"))));
  EXPECT_EQ(m.at("command"), "fredholm");
  EXPECT_EQ(m.at("command_line").get<std::vector<std::string>>(), r.argv);
  EXPECT_EQ(m.at("parameters").at("to"), 2000);
  EXPECT_EQ(m.at("parameters").at("method"), "bordered");
  EXPECT_EQ(m.at("parameters").at("sample_points"), 5);
  EXPECT_EQ(m.at("parameters").at("green_stats"), true);
  EXPECT_EQ(m.at("parameters").at("cross_check"), true);
  EXPECT_EQ(m.at("rows"), 5);
  EXPECT_EQ(m.at("outputs").at("table"), "t.csv");
  EXPECT_EQ(m.at("outputs").at("histogram"), "h.csv");
  EXPECT_EQ(m.at("checks_passed"), true);
  // Which checks ran, and how often: s = -mu(k) once per vertex up to 2000 (V = Q(2000) - 1 by
  // trial division), the others once per sample.
  const std::map<std::string, std::int64_t> expected_passes = {
      {"schur_sign", facts().vertex_count(2000)}, {"fredholm_parity", 5}, {"energy", 5}, {"inertia", 5},
      {"closed_form", 5}};
  std::map<std::string, std::int64_t> passes;
  for (const auto& c : m.at("checks")) {
    EXPECT_EQ(c.at("failed"), 0) << c.dump();
    EXPECT_TRUE(c.at("first_failure_n").is_null()) << c.dump();
    EXPECT_FALSE(c.at("statement").get<std::string>().empty()) << c.dump();
    passes[c.at("name").get<std::string>()] = c.at("passed").get<std::int64_t>();
  }
  EXPECT_EQ(passes, expected_passes);
}

TEST(Fredholm, BorderedAndClosedAgreeOnEverySharedColumn) {
  // Every n <= 600 (rows) and the histogram file: the two methods must print the same numbers
  // wherever both define them; only the inertia columns (bordered only) and the list of checks
  // differ.
  ScratchDir dir;
  const std::vector<std::string> base = {"fredholm", "--to", "600", "--every", "1", "--green-stats", "--quiet"};
  const auto b = run_sqfc(dir, with(base, {"--method", "bordered", "--histogram", "hb.csv", "--out", "b.csv"}));
  const auto c = run_sqfc(dir, with(base, {"--method", "closed", "--histogram", "hc.csv", "--out", "c.csv"}));
  ASSERT_EQ(b.exit_code, 0) << describe(b);
  ASSERT_EQ(c.exit_code, 0) << describe(c);
  const auto bt = parse_csv(read_file(dir.path("b.csv")));
  const auto ct = parse_csv(read_file(dir.path("c.csv")));
  ASSERT_EQ(bt.rows.size(), 600u);
  ASSERT_EQ(ct.rows.size(), 600u);
  int compared = 0;
  for (std::size_t i = 0; i < bt.rows.size(); ++i)
    for (const std::string column : {"n", "vertices", "edges", "fredholm", "energy", "green_min", "green_max",
                                     "green_distinct", "even_faces", "odd_faces"}) {
      EXPECT_EQ(bt.at(i, column), ct.at(i, column)) << "n = " << bt.at(i, "n") << ", " << column;
      ++compared;
    }
  EXPECT_EQ(compared, 600 * 10);
  EXPECT_EQ(read_file(dir.path("hb.csv")), read_file(dir.path("hc.csv")));
  // And both against the facts at a spread of n.
  // Row i holds n = i + 1: n = 2, 3, 30, 105 (first 2-sphere), 210 (it is filled), 600.
  int values = 0;
  for (const std::size_t i : {1u, 2u, 29u, 104u, 209u, 599u}) {
    values += check_row_against_facts(bt, i, true);
    values += check_row_against_facts(ct, i, false);
  }
  EXPECT_EQ(values, 6 * 2 * 11);
}

// ---------------------------------------------------------------------------------------------
// The Matrix Market dump.

TEST(FredholmDump, EntriesEqualDirectSumsAndInvertOnePlusA) {
  // For each n <= 100 and each method: the file parses, its matrix equals the closed form summed
  // directly here, that matrix times 1 + A (gcd adjacency) is the identity, the entries add up
  // to 1 - M(n) (energy theorem, published 2017/2019), and n = 3, 6, 10 equal the hand matrices.
  const std::map<std::uint64_t, const Matrix*> hand = {{3, &hand_green_3}, {6, &hand_green_6}, {10, &hand_green_10}};
  int files = 0;
  for (const std::string method : {"bordered", "closed"})
    for (const std::uint64_t n : {2u, 3u, 6u, 10u, 30u, 64u, 100u}) {
      ScratchDir dir;
      const auto r = run_sqfc(dir, {"fredholm", "--to", "100", "--at", "100", "--method", method, "--dump-green",
                                    std::to_string(n), "g.mtx", "--quiet", "--out", "-"});
      ASSERT_EQ(r.exit_code, 0) << describe(r);
      // The dump point becomes a sample point of its own.
      const auto csv = parse_csv(r.out);
      std::set<std::int64_t> ns;
      for (std::size_t i = 0; i < csv.rows.size(); ++i) ns.insert(csv.number(i, "n"));
      EXPECT_EQ(ns, (std::set<std::int64_t>{static_cast<std::int64_t>(n), 100})) << method << " n = " << n;
      const auto vertices = facts().vertices(n);
      const auto g = parse_matrix_market(read_file(dir.path("g.mtx")), vertices.size());
      EXPECT_EQ(g, facts().green_by_formula(n)) << method << " n = " << n;
      EXPECT_TRUE(is_identity_product(facts().one_plus_adjacency(n), g)) << method << " n = " << n;
      std::int64_t energy = 0;
      for (const auto& row : g) energy = std::accumulate(row.begin(), row.end(), energy);
      EXPECT_EQ(energy, 1 - facts().mertens(n)) << method << " n = " << n;
      if (const auto it = hand.find(n); it != hand.end()) {
        EXPECT_EQ(g, *it->second) << "hand-computed, n = " << n;
      }
      ++files;
    }
  EXPECT_EQ(files, 14);
}

TEST(FredholmDump, SixByHandLineByLine) {
  // hand_green_6, lower triangle, column by column: the size line counts its 5 nonzero entries.
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"fredholm", "--to", "6", "--dump-green", "6", "g.mtx", "--quiet", "--out", "-"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  auto lines = split_lines(read_file(dir.path("g.mtx")));
  std::erase_if(lines, [](const std::string& l) { return !l.empty() && l[0] == '%' && l.rfind("%%", 0) != 0; });
  EXPECT_EQ(lines, (std::vector<std::string>{"%%MatrixMarket matrix coordinate integer symmetric", "4 4 5", "2 1 -1",
                                             "4 1 1", "4 2 1", "3 3 1", "4 4 -1"}));
}

// ---------------------------------------------------------------------------------------------
// Memory estimate of the bordered method: 4 V^2 bytes (bordered_green.hpp).

TEST(FredholmMemory, RefusalNamesTheEstimateAndTheOtherMethod) {
  // V = Q(10^4) - 1 = 6082 (OEIS A071172): 4 * 6082^2 = 147962896 bytes = 141.1 MiB.
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"fredholm", "--to", "1e4", "--method", "bordered", "--memory-limit", "1e6", "--quiet",
                                "--out", "x.csv", "--histogram", "h.csv", "--dump-green", "10", "g.mtx"});
  EXPECT_EQ(r.exit_code, 2) << describe(r);
  EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << describe(r);
  EXPECT_NE(r.err.find("141.1 MiB"), std::string::npos) << describe(r);
  EXPECT_NE(r.err.find("--method closed"), std::string::npos) << describe(r);
  EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{}) << "no output and no *.part-* file";
}

TEST(FredholmMemory, LimitIsInclusive) {
  // V = Q(100) - 1 = 60 (OEIS A071172): 4 * 60^2 = 14400 bytes is enough, 14399 is not.
  int checked = 0;
  for (const auto& [limit, code] : std::vector<std::pair<std::string, int>>{{"14400", 0}, {"14399", 2}}) {
    ScratchDir dir;
    const auto r = run_sqfc(dir, {"fredholm", "--to", "100", "--method", "bordered", "--memory-limit", limit, "--quiet",
                                  "--out", "x.csv"});
    EXPECT_EQ(r.exit_code, code) << describe(r);
    if (code == 2) {
      EXPECT_NE(r.err.find("--method closed"), std::string::npos) << describe(r);
      EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{});
    } else {
      const auto csv = parse_csv(read_file(dir.path("x.csv")));
      ASSERT_FALSE(csv.rows.empty());
      EXPECT_EQ(csv.number(csv.rows.size() - 1, "n"), 100);
      EXPECT_EQ(csv.number(csv.rows.size() - 1, "vertices"), 60);
    }
    ++checked;
  }
  EXPECT_EQ(checked, 2);
}

TEST(FredholmMemory, RefusalWritesNothingToStandardOutput) {
  // An input error prints one line on stderr and nothing else (design.md section 4); with
  // --out - the refusal must not leave a table header on stdout either.
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"fredholm", "--to", "1e4", "--method", "bordered", "--memory-limit", "1e6", "--quiet",
                                "--out", "-"});
  EXPECT_EQ(r.exit_code, 2) << describe(r);
  EXPECT_EQ(r.out, "") << describe(r);
}

TEST(FredholmMemory, RefusalStatesThePositiveLimitAsPositive) {
  // A limit of 10^6 bytes is about 0.95 MiB; a message saying the limit is "0 MiB" misstates it.
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"fredholm", "--to", "1e4", "--method", "bordered", "--memory-limit", "1e6", "--quiet",
                                "--out", "x.csv"});
  EXPECT_EQ(r.exit_code, 2) << describe(r);
  EXPECT_EQ(r.err.find("limit of 0 MiB"), std::string::npos) << describe(r);
}

// ---------------------------------------------------------------------------------------------
// Input errors: exit 2, one line on stderr naming the option or value, nothing on stdout, no
// output and no *.part-* file.

enum class Setup { none, old_output, out_is_directory, manifest_is_directory };

struct ErrorCase {
  std::string name;
  std::vector<std::string> args;
  std::vector<std::string> must_mention;
  Setup setup = Setup::none;
};

std::vector<std::string> outputs(std::vector<std::string> args) {
  return with(std::move(args), {"--quiet", "--out", "x.csv", "--histogram", "h.csv"});
}

const std::vector<ErrorCase>& error_cases() {
  static const std::vector<ErrorCase> cases = {
      // --to lies in [1, 2*10^8] (cmd_fredholm.cpp; the closed-form tables take 12 bytes per integer).
      {"to_zero", outputs({"fredholm", "--to", "0"}), {"--to", "0"}},
      {"to_3e8", outputs({"fredholm", "--to", "3e8"}), {"--to", "3e8"}},
      {"to_one_past_bound", outputs({"fredholm", "--to", "200000001"}), {"--to", "200000001"}},
      {"to_malformed", outputs({"fredholm", "--to", "2e"}), {"--to", "2e"}},
      {"to_missing", outputs({"fredholm", "--at", "10"}), {"--to"}},
      {"method_junk", outputs({"fredholm", "--to", "100", "--method", "junk"}), {"--method", "junk"}},
      {"method_empty", outputs({"fredholm", "--to", "100", "--method", ""}), {"--method"}},
      {"cross_check_closed",
       outputs({"fredholm", "--to", "2000", "--method", "closed", "--cross-check"}),
       {"--cross-check", "--method bordered"}},
      // Above 10^4 the default method is the closed form, so --cross-check alone is refused too.
      {"cross_check_default_closed", outputs({"fredholm", "--to", "20000", "--cross-check"}), {"--cross-check"}},
      {"dump_missing_file", {"fredholm", "--to", "100", "--quiet", "--out", "x.csv", "--dump-green", "6"}, {"--dump-green"}},
      {"dump_no_arguments", {"fredholm", "--to", "100", "--quiet", "--out", "x.csv", "--dump-green"}, {"--dump-green"}},
      {"dump_past_to", outputs({"fredholm", "--to", "2000", "--dump-green", "3000", "g.mtx"}), {"--dump-green", "3000"}},
      {"dump_zero", outputs({"fredholm", "--to", "2000", "--dump-green", "0", "g.mtx"}), {"--dump-green", "0"}},
      {"dump_malformed", outputs({"fredholm", "--to", "2000", "--dump-green", "6x", "g.mtx"}), {"--dump-green", "6x"}},
      {"dump_empty_file", outputs({"fredholm", "--to", "2000", "--dump-green", "6", ""}), {"--dump-green"}},
      {"dump_unwritable",
       outputs({"fredholm", "--to", "100", "--dump-green", "6", "/nonexistent/dir/g.mtx"}),
       {"/nonexistent/dir/g.mtx"}},
      {"memory_limit_malformed", outputs({"fredholm", "--to", "100", "--memory-limit", "1x"}), {"--memory-limit", "1x"}},
      {"memory_limit_zero", outputs({"fredholm", "--to", "100", "--memory-limit", "0"}), {"--memory-limit", "0"}},
      {"memory_limit_negative", outputs({"fredholm", "--to", "100", "--memory-limit", "-5"}), {"--memory-limit", "-5"}},
      {"memory_limit_empty", outputs({"fredholm", "--to", "100", "--memory-limit", ""}), {"--memory-limit"}},
      {"memory_limit_2_pow_64", outputs({"fredholm", "--to", "100", "--memory-limit", "2^64"}), {"--memory-limit", "2^64"}},
      // The bordered matrix over the limit: the estimate (4 * 6082^2 bytes, V = Q(10^4) - 1 by
      // OEIS A071172) and the method to use instead.
      {"memory_refusal",
       outputs({"fredholm", "--to", "1e4", "--method", "bordered", "--memory-limit", "1e6"}),
       {"141.1 MiB", "--method closed"}},
      {"memory_refusal_keeps_old_output",
       outputs({"fredholm", "--to", "1e4", "--method", "bordered", "--memory-limit", "1e6"}),
       {"--method closed"},
       Setup::old_output},
      // Empty sample sets: no multiple of 3000 in [1, 2000], no listed point in [1, 2000].
      {"every_past_to", outputs({"fredholm", "--to", "2000", "--every", "3000"}), {"--every", "3000"}},
      {"at_past_to", outputs({"fredholm", "--to", "2000", "--at", "5000"}), {"--at", "5000"}},
      {"at_empty_list", outputs({"fredholm", "--to", "2000", "--at", ","}), {"--at"}},
      {"log_zero", outputs({"fredholm", "--to", "2000", "--log", "0"}), {"--log", "0"}},
      {"threads_zero", outputs({"fredholm", "--to", "2000", "--threads", "0"}), {"--threads", "0"}},
      // Unwritable outputs.
      {"out_in_missing_folder",
       {"fredholm", "--to", "100", "--quiet", "--out", "/nonexistent/dir/x.csv"},
       {"/nonexistent/dir/x.csv"}},
      {"out_is_directory", {"fredholm", "--to", "100", "--quiet", "--out", "x.csv"}, {"x.csv"}, Setup::out_is_directory},
      {"manifest_is_directory",
       {"fredholm", "--to", "100", "--quiet", "--out", "x.csv"},
       {"x.csv.manifest.json"},
       Setup::manifest_is_directory},
      {"histogram_in_missing_folder",
       {"fredholm", "--to", "100", "--quiet", "--out", "x.csv", "--histogram", "/nonexistent/dir/h.csv"},
       {"/nonexistent/dir/h.csv"}},
      {"out_empty", {"fredholm", "--to", "100", "--quiet", "--out", ""}, {"--out"}},
      {"histogram_empty", {"fredholm", "--to", "100", "--quiet", "--out", "x.csv", "--histogram", ""}, {"--histogram"}},
      {"unknown_option", outputs({"fredholm", "--to", "100", "--bogus"}), {"--bogus"}},
      // 2*10^8 itself passes the range check: the one error is the method.
      {"bound_itself_accepted", outputs({"fredholm", "--to", "2e8", "--method", "junk"}), {"junk"}},
  };
  return cases;
}

constexpr const char* old_contents = "old contents\n";

int check_error_case(const ErrorCase& c) {
  ScratchDir dir;
  switch (c.setup) {
    case Setup::none: break;
    case Setup::old_output: std::ofstream(dir.path("x.csv")) << old_contents; break;
    case Setup::out_is_directory: std::filesystem::create_directory(dir.path("x.csv")); break;
    case Setup::manifest_is_directory: std::filesystem::create_directory(dir.path("x.csv.manifest.json")); break;
  }
  const auto before = list_dir(dir.work());
  const auto r = run_sqfc(dir, c.args);
  int checks = 0;
  EXPECT_EQ(r.exit_code, 2) << describe(r);
  EXPECT_EQ(r.out, "") << describe(r);
  EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << describe(r);
  EXPECT_TRUE(r.err.size() > 1 && r.err.back() == '\n') << describe(r);
  checks += 4;
  for (const auto& word : c.must_mention) {
    EXPECT_NE(r.err.find(word), std::string::npos) << "missing '" << word << "'\n" << describe(r);
    ++checks;
  }
  const auto after = list_dir(dir.work());
  EXPECT_EQ(after, before) << describe(r);
  EXPECT_TRUE(std::none_of(after.begin(), after.end(),
                           [](const std::string& name) { return name.find(".part-") != std::string::npos; }))
      << "partial file left: " << join(after, " ");
  checks += 2;
  if (c.setup == Setup::old_output) {
    EXPECT_EQ(read_file(dir.path("x.csv")), old_contents);
    ++checks;
  }
  EXPECT_FALSE(std::filesystem::exists("/nonexistent")) << describe(r);
  return checks + 1;
}

class FredholmError : public ::testing::TestWithParam<std::size_t> {};

TEST_P(FredholmError, ExitTwoOneLineNoFiles) {
  const auto& c = error_cases().at(GetParam());
  const int checks = check_error_case(c);
  EXPECT_EQ(static_cast<std::size_t>(checks), 4 + c.must_mention.size() + 2 + (c.setup == Setup::old_output) + 1);
}

std::string case_name(const ::testing::TestParamInfo<std::size_t>& param) { return error_cases().at(param.param).name; }

INSTANTIATE_TEST_SUITE_P(Cases, FredholmError, ::testing::Range<std::size_t>(0, error_cases().size()), case_name);

TEST(FredholmErrors, CaseCount) { EXPECT_EQ(error_cases().size(), 36u); }

}  // namespace
}  // namespace sqfc::cli_test
