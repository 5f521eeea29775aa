// SPDX-License-Identifier: MIT
// M(x) by the elementary method of Helfgott and Thompson (arXiv:2101.08773): boxes on which
// x/(mn) is linear up to a small error, a segmented mu sieve to x/u for the rest.
#include "sqfc/arith/mertens_helfgott_thompson.hpp"

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

#include "detail_mobius_sweep.hpp"
#include "detail_mu_sieve.hpp"
#include "detail_sweep_kernels.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::arith {
namespace {

// Measured on the 2-core EPYC, December 2026 (grid over split 0.25..5 x^(2/5), tolerance
// 0.1..0.6, height 8..10^5 at x = 3e11, 10^13, 10^14; one thread): the vector quotient sums
// of the rows beat a box unless it is tall, so boxes start at height 160; the tolerance moves
// the time by less than the noise between 0.1 and 0.6.
constexpr double default_box_tolerance = 0.25;
constexpr unsigned default_min_box_height = 160;
// Box height and width caps: the class table has 4 a entries, and wider boxes gain nothing
// once the table is amortised.
constexpr Natural max_box_height = 2048;
constexpr Natural max_box_width = Natural{1} << 16;
// Convergent denominators up to this many times the box height: the slope error then moves
// the model by at most 1/(4q) over the box, so few classes are ever ambiguous.
constexpr Natural denominator_factor = 4;
// Classes with more members than this are corrected by bisection along the class.
constexpr Natural progression_direct_limit = 6;
// Boxes narrower than this are summed pair by pair (the tables would cost more).
constexpr Natural min_box_width = 16;

// Relative error allowance of the doubles in a box: c0 = x/(m0 n0), the slopes and beta_s are
// a few roundings of 2^-53 each; 1e-13 is hundreds of times that, and only widens the
// windows of pairs that are recomputed exactly.
constexpr double rounding_allowance = 1e-13;

// floor(v) and ceil(v) for |v| < 2^62 without a libm call (no SSE4.1 rounding by default).
inline std::int64_t floor_to_int(double v) {
  const auto t = static_cast<std::int64_t>(v);
  return static_cast<double>(t) > v ? t - 1 : t;
}
inline std::int64_t ceil_to_int(double v) {
  const auto t = static_cast<std::int64_t>(v);
  return static_cast<double>(t) < v ? t + 1 : t;
}

// The last continued-fraction convergent p/q of alpha with q <= max_q (gcd(p, q) = 1 always,
// because consecutive convergents satisfy p_i q_{i-1} - p_{i-1} q_i = +-1, whatever rounding
// did to the partial quotients).
void best_convergent(double alpha, std::int64_t max_q, std::int64_t& p, std::int64_t& q) {
  std::int64_t p_prev = 1, q_prev = 0;
  auto a0 = static_cast<std::int64_t>(std::floor(alpha));
  p = a0;
  q = 1;
  double rest = alpha - static_cast<double>(a0);
  for (int step = 0; step < 64 && rest > 1e-15; ++step) {
    const double inverse = 1.0 / rest;
    const auto ai = static_cast<std::int64_t>(std::floor(inverse));
    const std::int64_t q_next = ai * q + q_prev;
    if (ai <= 0 || q_next > max_q) break;
    const std::int64_t p_next = ai * p + p_prev;
    p_prev = p;
    q_prev = q;
    p = p_next;
    q = q_next;
    rest = inverse - static_cast<double>(ai);
  }
}

// v with (v * p) mod q = 1, for gcd(p, q) = 1 (extended Euclid).
std::int64_t inverse_mod(std::int64_t p, std::int64_t q) {
  std::int64_t a = ((p % q) + q) % q, b = q, x0 = 1, x1 = 0;
  while (b != 0) {
    const std::int64_t t = a / b;
    a -= t * b;
    std::swap(a, b);
    x0 -= t * x1;
    std::swap(x0, x1);
  }
  return ((x0 % q) + q) % q;
}

// The model step of a box for its squarefree columns, before any correction: per column n,
// beta = c0 + c2 (n - n0) (> 0, since n - n0 < n0 in a dyadic range), g = floor(beta),
// theta = q frac(beta), t = ceil(q - theta) clamped to [0, q], the sums of mu g and
// mu class_sum[t], and whether a narrow window (below, above < 1) holds a class to correct.
// A separate branch-free pass, so that the ambiguity test (true for a good share of the columns,
// at random) does not mispredict inside the arithmetic. GCC 12 does not vectorize it (the int64
// table reads); an intrinsics version is the next lever if the method is ever worth it.
struct ColumnSums {
  std::int64_t mu = 0, mu_g = 0, mu_class = 0;
};
struct ColumnPass {
  const std::uint32_t* n;
  const std::int8_t* mu;
  std::size_t count;
  double c0, c2, n0, q_double, below, above;
  std::int64_t q;
  const std::int64_t* class_sum;
  std::int64_t* g_out;
  std::int64_t* t_out;
  double* theta_out;
  std::uint8_t* ambiguous_out;
};

ColumnSums column_pass(const ColumnPass& c) {
  std::int64_t mu_sum = 0, mu_g = 0, mu_class = 0;
  for (std::size_t i = 0; i < c.count; ++i) {
    const double beta = c.c0 + c.c2 * (static_cast<double>(c.n[i]) - c.n0);
    const auto g = static_cast<std::int64_t>(beta);
    const double theta = (beta - static_cast<double>(g)) * c.q_double;
    const double v = c.q_double - theta;
    auto t = static_cast<std::int64_t>(v);
    t += static_cast<double>(t) < v ? 1 : 0;
    t = t < 0 ? 0 : (t > c.q ? c.q : t);
    const std::int64_t m = c.mu[i];
    mu_sum += m;
    mu_g += m * g;
    mu_class += m * c.class_sum[t];
    // Edge q: classes ceil(v - below) .. floor(v + above); edge 0: j = 0 when theta <= above;
    // edge 2q: when theta >= q + 1 - below.
    const double low = v - c.below, high = v + c.above;
    auto j_lo = static_cast<std::int64_t>(low);
    j_lo += static_cast<double>(j_lo) < low ? 1 : 0;
    auto j_hi = static_cast<std::int64_t>(high);
    j_hi = j_hi > c.q - 1 ? c.q - 1 : j_hi;
    const bool ambiguous = (j_lo <= j_hi) | (theta <= c.above) | (theta >= c.q_double + 1 - c.below);
    c.g_out[i] = g;
    c.t_out[i] = t;
    c.theta_out[i] = theta;
    c.ambiguous_out[i] = ambiguous ? 1 : 0;
  }
  return {mu_sum, mu_g, mu_class};
}

class DoubleSumOverBoxes {
 public:
  DoubleSumOverBoxes(Natural x, Natural u, const std::vector<std::int8_t>& mu, double tolerance, unsigned min_height,
                     HelfgottThompsonWork& work)
      : x_(x), u_(u), x_double_(static_cast<double>(x)), mu_(mu), tolerance_(tolerance), min_height_(min_height), work_(work),
        kernels_(detail::fastest_sweep_kernels()),
        plus_before_(static_cast<std::size_t>(u) + 2),
        minus_before_(static_cast<std::size_t>(u) + 2),
        squarefree_before_(static_cast<std::size_t>(u) + 2) {
    // The n <= u with mu(n) = 1 and with mu(n) = -1, so that a row sum is two quotient sums.
    for (Natural n = 1; n <= u; ++n) {
      plus_before_[n] = static_cast<std::uint32_t>(plus_.size());
      minus_before_[n] = static_cast<std::uint32_t>(minus_.size());
      if (mu[n] == 1) {
        plus_.push_back(n);
        plus_inverse_.push_back(1.0 / static_cast<double>(n));
      } else if (mu[n] == -1) {
        minus_.push_back(n);
        minus_inverse_.push_back(1.0 / static_cast<double>(n));
      }
    }
    for (Natural n = 1; n <= u; ++n) {
      squarefree_before_[n] = static_cast<std::uint32_t>(squarefree_.size());
      if (mu[n] != 0) {
        squarefree_.push_back(static_cast<std::uint32_t>(n));
        squarefree_mu_.push_back(mu[n]);
      }
    }
    squarefree_before_[u + 1] = static_cast<std::uint32_t>(squarefree_.size());
    plus_before_[u + 1] = static_cast<std::uint32_t>(plus_.size());
    minus_before_[u + 1] = static_cast<std::uint32_t>(minus_.size());
    class_sum_.resize(static_cast<std::size_t>(denominator_factor * max_box_height) + 2);
    h_.resize(max_box_height);
    j_.resize(max_box_height);
    progression_prefix_.resize(max_box_height);
    column_g_.resize(max_box_width);
    column_t_.resize(max_box_width);
    column_theta_.resize(max_box_width);
    column_ambiguous_.resize(max_box_width);
  }

  // sum_{m, n <= u} mu(m) mu(n) floor(x/(mn)): the diagonal plus twice the pairs m < n.
  Wide sum() {
    Wide diagonal = 0;
    for (Natural m = 1; m <= u_; ++m)
      if (mu_[m] != 0) diagonal += static_cast<Wide>(x_ / (m * m));
    Wide upper = 0;
    // n in dyadic ranges [n_lo, n_hi): the box height allowed grows like n^(1/3), so each
    // range gets its own strips.
    for (Natural n_lo = 1; n_lo <= u_; n_lo *= 2) {
      const Natural n_hi = std::min(2 * n_lo, u_ + 1);
      for (Natural m0 = 1; m0 + 1 < n_hi;) {
        Natural a = std::min({allowed_height(m0, n_lo), max_box_height, n_hi - 1 - m0});
        if (a < min_height_) {
          upper += row_sum(m0, std::max(n_lo, m0 + 1), n_hi);
          ++m0;
          continue;
        }
        // Pairs of the strip next to the diagonal (m < n < m0 + a) one by one.
        for (Natural m = m0; m < m0 + a; ++m) upper += row_sum(m, std::max(n_lo, m + 1), std::min(n_hi, m0 + a));
        for (Natural n0 = std::max(n_lo, m0 + a); n0 < n_hi;) {
          const Natural b = std::min({allowed_width(m0, n0, a), max_box_width, n_hi - n0});
          if (b < min_box_width) {
            const Natural stop = std::min(n_hi, n0 + min_box_width);
            for (Natural m = m0; m < m0 + a; ++m) upper += row_sum(m, n0, stop);
            n0 = stop;
            continue;
          }
          upper += box_sum(m0, a, n0, b);
          n0 += b;
        }
        m0 += a;
      }
    }
    return diagonal + 2 * upper;
  }

 private:
  // Height a with 3 a^3 x / (m0^3 n0) <= tolerance: the error term c0 a rho^2 of the box
  // criterion below at its share when rho and sigma are equal.
  Natural allowed_height(Natural m0, Natural n0) const {
    const double m = static_cast<double>(m0);
    const double a = std::cbrt(tolerance_ * m * m * m * static_cast<double>(n0) / (3.0 * x_double_));
    return a < 1 ? Natural{1} : static_cast<Natural>(a);
  }

  // Width b with c0 a (rho^2 + rho sigma + sigma^2) <= tolerance, c0 = x/(m0 n0),
  // rho = (a-1)/m0, sigma = (b-1)/n0: the quadratic error times the height stays bounded.
  Natural allowed_width(Natural m0, Natural n0, Natural a) const {
    const double c0 = x_double_ / (static_cast<double>(m0) * static_cast<double>(n0));
    const double rho = static_cast<double>(a - 1) / static_cast<double>(m0);
    const double g = tolerance_ / (c0 * static_cast<double>(a));
    const double disc = 4 * g - 3 * rho * rho;
    if (disc <= 0) return 0;
    const double sigma = (-rho + std::sqrt(disc)) / 2;
    if (sigma <= 0) return 0;
    const double b = sigma * static_cast<double>(n0) + 1;
    return b > static_cast<double>(max_box_width) ? max_box_width : static_cast<Natural>(b);
  }

  // sum_{n_lo <= n < n_hi} mu(m) mu(n) floor(x/(mn)) = mu(m) (sum over mu(n) = 1 minus sum over
  // mu(n) = -1) of floor(floor(x/m) / n); the vector kernel needs quotients below 2^48.
  Wide row_sum(Natural m, Natural n_lo, Natural n_hi) {
    if (mu_[m] == 0 || n_hi <= n_lo) return 0;
    work_.direct_pairs += n_hi - n_lo;
    const Natural y = x_ / m;
    Wide total = 0;
    const Natural n_fast = std::min(n_hi, std::max(n_lo, y / (Natural{1} << 48) + 1));
    for (Natural n = n_lo; n < n_fast; ++n) total += mu_[n] * static_cast<Wide>(y / n);
    if (n_fast < n_hi) {
      const double y_double = static_cast<double>(y);
      total += list_sum(y, y_double, plus_, plus_inverse_, plus_before_[n_fast], plus_before_[n_hi]);
      total -= list_sum(y, y_double, minus_, minus_inverse_, minus_before_[n_fast], minus_before_[n_hi]);
    }
    return mu_[m] * total;
  }

  Wide list_sum(Natural y, double y_double, const std::vector<Natural>& v, const std::vector<double>& inverse, std::uint32_t from,
                std::uint32_t to) const {
    Wide total = 0;
    constexpr std::uint32_t chunk = std::uint32_t{1} << 17;  // the kernel's lane sums cannot carry
    for (std::uint32_t i = from; i < to; i += chunk) {
      const std::uint32_t count = std::min(chunk, to - i);
      total += static_cast<Wide>(detail::quotient_sum(kernels_, y, y_double, v.data() + i, inverse.data() + i, count));
    }
    return total;
  }

  // sum over m0 <= m < m0 + a, n0 <= n < n0 + b of mu(m) mu(n) floor(x/(mn)); every n > every m.
  // With r = m - m0, s = n - n0: x/(mn) = beta_s + alpha r + e(r, s), beta_s = c0 + c2 s,
  // alpha = -c0/m0, c2 = -c0/n0, 0 <= e <= E (x/(mn) is convex, the plane is its tangent).
  // alpha = p/q + delta with q <= 4a; p r = q h_r + j_r (0 <= j_r < q), beta_s = g_s + theta_s/q.
  // Model: floor = h_r + g_s + [j_r >= t_s], t_s = ceil(q - theta_s). It is right unless
  // theta_s + j_r lies in [e q - q eta_high, e q - q eta_low] for an integer edge e (the range
  // of eta = delta r + e(r, s) and the rounding); those classes are recomputed pair by pair.
  Wide box_sum(Natural m0, Natural a, Natural n0, Natural b) {
    ++work_.boxes;
    work_.box_pairs += a * b;
    const double c0 = x_double_ / (static_cast<double>(m0) * static_cast<double>(n0));
    const double alpha = -c0 / static_cast<double>(m0);
    const double c2 = -c0 / static_cast<double>(n0);
    const double rho = static_cast<double>(a - 1) / static_cast<double>(m0);
    const double sigma = static_cast<double>(b - 1) / static_cast<double>(n0);
    const double quadratic = c0 * (rho * rho + rho * sigma + sigma * sigma + rho * sigma * (rho + sigma));

    std::int64_t p = 0, q = 1;
    best_convergent(alpha, static_cast<std::int64_t>(denominator_factor * a), p, q);
    // eta = delta r + e lies in [eta_low, eta_high]: e >= 0, and delta r has the sign of delta.
    const double delta = alpha - static_cast<double>(p) / static_cast<double>(q);
    const double slope_slack = rounding_allowance * (std::abs(alpha) + 1) * static_cast<double>(a);
    const double value_slack = rounding_allowance * (c0 + 1);
    const double eta_low = std::min(0.0, delta * static_cast<double>(a - 1)) - slope_slack - value_slack;
    const double eta_high = std::max(0.0, delta * static_cast<double>(a - 1)) + quadratic * (1 + 1e-9) + slope_slack + value_slack;
    // theta + j + q eta crosses edge * q only for theta + j in [edge q - q eta_high, edge q - q eta_low].
    const double below = static_cast<double>(q) * eta_high + 1e-7;
    const double above = -static_cast<double>(q) * eta_low + 1e-7;
    const auto first_edge = static_cast<std::int64_t>(std::floor(eta_low));
    const auto last_edge = static_cast<std::int64_t>(std::ceil(2 + eta_high));

    // Rows: h_r, j_r and the class sums of mu.
    const std::int64_t p_mod = ((p % q) + q) % q;
    const std::int64_t p_div = (p - p_mod) / q;
    std::fill(class_sum_.begin(), class_sum_.begin() + q + 1, 0);
    std::int64_t mu_rows = 0, mu_h_rows = 0;
    {
      std::int64_t h = 0, j = 0;
      for (Natural r = 0; r < a; ++r) {
        h_[r] = h;
        j_[r] = static_cast<std::int32_t>(j);
        const int m_mu = mu_[m0 + r];
        mu_rows += m_mu;
        mu_h_rows += m_mu * h;
        class_sum_[static_cast<std::size_t>(j)] += m_mu;
        h += p_div;
        j += p_mod;
        if (j >= q) {
          j -= q;
          ++h;
        }
      }
    }
    // Sums of mu along each class (r, r - q, r - 2q, ...), for classes too long to correct
    // member by member.
    if (a > progression_direct_limit * static_cast<Natural>(q))
      for (Natural r = 0; r < a; ++r)
        progression_prefix_[r] = mu_[m0 + r] + (r >= static_cast<Natural>(q) ? progression_prefix_[r - static_cast<Natural>(q)] : 0);
    // class_sum_[t] = sum of mu_r over the rows with j_r >= t.
    for (std::int64_t t = q - 1; t >= 0; --t) class_sum_[t] += class_sum_[t + 1];
    const std::int64_t p_inverse = inverse_mod(p, q);
    work_.box_table_entries += a + static_cast<Natural>(q);
    const double q_double = static_cast<double>(q);

    std::int64_t mu_cols = 0, mu_g_cols = 0, model_classes = 0, correction = 0;
    // Exact quotients by one double division when they stay below 2^44 (always, in practice).
    const bool small_quotients = c0 < 1e13;
    // The exact floor minus the model over the members of class j in column n.
    auto correct_class = [&](std::int64_t j, Natural n, int n_mu, std::int64_t g, std::int64_t t) {
      const auto r_first = static_cast<Natural>((j * p_inverse) % q);
      if (r_first >= a) return;
      const Natural members = (a - 1 - r_first) / static_cast<Natural>(q) + 1;
      const std::int64_t base = h_[r_first] + g + (j >= t ? 1 : 0);
      if (members > progression_direct_limit) {
        correction += n_mu * progression_correction(m0, r_first, members, p, q, n, base);
        return;
      }
      // Along the class h_r grows by p per member.
      std::int64_t model = base;
      for (Natural r = r_first; r < a; r += static_cast<Natural>(q), model += p) {
        const int m_mu = mu_[m0 + r];
        if (m_mu == 0) continue;
        ++work_.corrections;
        const Natural mn = (m0 + r) * n;
        const auto exact = static_cast<std::int64_t>(small_quotients ? detail::quotient_small(x_, x_double_, mn) : x_ / mn);
        correction += m_mu * n_mu * (exact - model);
      }
    };
    // Narrow windows (the usual case): only edges 0, q and 2q matter, edge 0 only for j = 0.
    const bool narrow = below < 1 && above < 1;
    const std::uint32_t column_begin = squarefree_before_[n0];
    const std::uint32_t column_end = squarefree_before_[n0 + b];
    if (narrow) {
      const ColumnPass pass{squarefree_.data() + column_begin, squarefree_mu_.data() + column_begin, column_end - column_begin,
                            c0, c2, static_cast<double>(n0), q_double, below, above, q, class_sum_.data(),
                            column_g_.data(), column_t_.data(), column_theta_.data(), column_ambiguous_.data()};
      const ColumnSums sums = column_pass(pass);
      mu_cols = sums.mu;
      mu_g_cols = sums.mu_g;
      model_classes = sums.mu_class;
      for (std::uint32_t i = 0; i < column_end - column_begin; ++i) {
        if (column_ambiguous_[i] == 0) continue;
        const Natural n = squarefree_[column_begin + i];
        const int n_mu = squarefree_mu_[column_begin + i];
        const std::int64_t g = column_g_[i], t = column_t_[i];
        const double theta = column_theta_[i];
        std::int64_t done_below = 0;
        if (theta <= above) {
          correct_class(0, n, n_mu, g, t);
          done_below = 1;
        }
        const std::int64_t j_lo = std::max(done_below, ceil_to_int(q_double - theta - below));
        const std::int64_t j_hi = std::min<std::int64_t>(q - 1, floor_to_int(q_double - theta + above));
        for (std::int64_t j = j_lo; j <= j_hi; ++j) correct_class(j, n, n_mu, g, t);
        done_below = std::max(done_below, j_hi + 1);
        if (theta >= q_double + 1 - below)
          for (std::int64_t j = std::max(done_below, ceil_to_int(2 * q_double - theta - below)); j < q; ++j)
            correct_class(j, n, n_mu, g, t);
      }
    }
    for (std::uint32_t index = narrow ? column_end : column_begin; index < column_end; ++index) {
      const Natural n = squarefree_[index];
      const int n_mu = squarefree_mu_[index];
      const double beta = c0 + c2 * static_cast<double>(n - n0);
      const std::int64_t g = floor_to_int(beta);
      const double theta = (beta - static_cast<double>(g)) * q_double;
      const std::int64_t t = std::clamp<std::int64_t>(ceil_to_int(q_double - theta), 0, q);
      mu_cols += n_mu;
      mu_g_cols += n_mu * g;
      model_classes += n_mu * class_sum_[static_cast<std::size_t>(t)];
      // Classes j whose theta + j lies in the window [e q - q eta_high, e q - q eta_low] of an
      // edge e that theta + j + q eta can cross. Windows move up with e; where they overlap
      // (eta wider than 1), each class is taken once.
      std::int64_t done_below = 0;
      const std::int64_t edge_lo = std::max(first_edge, ceil_to_int((theta - above) / q_double));
      const std::int64_t edge_hi = std::min(last_edge, floor_to_int((q_double - 1 + theta + below) / q_double));
      for (auto edge = edge_lo; edge <= edge_hi; ++edge) {
        const double centre = static_cast<double>(edge) * q_double - theta;
        const std::int64_t j_lo = std::max(done_below, ceil_to_int(centre - below));
        const std::int64_t j_hi = std::min<std::int64_t>(q - 1, floor_to_int(centre + above));
        done_below = std::max(done_below, j_hi + 1);
        for (std::int64_t j = j_lo; j <= j_hi; ++j) correct_class(j, n, n_mu, g, t);
      }
    }
    work_.box_columns += column_end - squarefree_before_[n0];
    return static_cast<Wide>(mu_cols) * mu_h_rows + static_cast<Wide>(mu_rows) * mu_g_cols + model_classes + correction;
  }

  // sum over the members r_i = r0 + q i (i < count) of one class of mu(m0 + r_i) times
  // (floor(x/((m0 + r_i) n)) - p i - base), the exact floor minus the model. The function
  // G(i) = x/((m0 + r_i) n) - p i is convex in i, so floor(G) falls up to the first i where
  // G(i+1) - G(i) = -x q/(n m_i m_{i+1}) - p >= 0 and rises after it: the turn is found by
  // bisection on that (exact, 128-bit) sign, and each monotone piece splits into runs of one
  // value by bisection too, so a long class costs O(levels log count) exact quotients, not count.
  std::int64_t progression_correction(Natural m0, Natural r0, Natural count, std::int64_t p, std::int64_t q, Natural n,
                                      std::int64_t base) {
    ++work_.long_classes;
    const auto step = static_cast<Natural>(q);
    auto level = [&](Natural i) {
      ++work_.corrections;
      const Natural m = m0 + r0 + step * i;
      return static_cast<std::int64_t>(x_ / (m * n)) - p * static_cast<std::int64_t>(i) - base;
    };
    auto mu_between = [&](Natural i_lo, Natural i_hi) {  // inclusive
      return progression_prefix_[r0 + step * i_hi] - (i_lo > 0 ? progression_prefix_[r0 + step * (i_lo - 1)] : 0);
    };
    Natural turn = count - 1;
    if (p < 0) {
      auto rising = [&](Natural i) {
        const Natural m = m0 + r0 + step * i;
        return static_cast<Wide>(-p) * static_cast<Wide>(n) * static_cast<Wide>(m) * static_cast<Wide>(m + step) >=
               static_cast<Wide>(x_) * q;
      };
      Natural lo = 0, hi = count - 1;
      while (lo < hi) {
        const Natural mid = lo + (hi - lo) / 2;
        if (rising(mid)) hi = mid;
        else lo = mid + 1;
      }
      turn = lo;
    }
    std::int64_t total = 0;
    auto monotone_piece = [&](Natural lo, Natural hi) {
      while (lo <= hi) {
        const std::int64_t value = level(lo);
        Natural last = lo;
        if (level(hi) == value) {
          last = hi;
        } else {
          Natural upper = hi - 1;
          while (last < upper) {
            const Natural mid = last + (upper - last + 1) / 2;
            if (level(mid) == value) last = mid;
            else upper = mid - 1;
          }
        }
        if (value != 0) total += value * mu_between(lo, last);
        lo = last + 1;
      }
    };
    monotone_piece(0, turn);
    if (turn + 1 < count) monotone_piece(turn + 1, count - 1);
    return total;
  }

  Natural x_, u_;
  double x_double_;
  const std::vector<std::int8_t>& mu_;
  double tolerance_;
  unsigned min_height_;
  HelfgottThompsonWork& work_;
  detail::SweepKernels kernels_;
  std::vector<Natural> plus_, minus_;
  std::vector<double> plus_inverse_, minus_inverse_;
  std::vector<std::uint32_t> plus_before_, minus_before_;  // entries below n
  std::vector<std::uint32_t> squarefree_before_;            // squarefree n' < n
  std::vector<std::uint32_t> squarefree_;
  std::vector<std::int8_t> squarefree_mu_;
  std::vector<std::int64_t> class_sum_;
  std::vector<std::int64_t> h_;
  std::vector<std::int32_t> j_;
  std::vector<std::int64_t> progression_prefix_;
  std::vector<std::int64_t> column_g_, column_t_;  // per squarefree column of a box
  std::vector<double> column_theta_;
  std::vector<std::uint8_t> column_ambiguous_;
};

// sum_{d <= u} mu(d) sum_{u < a <= W} mu(a) floor(x/(ad))
//   = sum_d mu(d) [ c1_d M(W) - K_d M(u) + sum_{c1_d < k <= K_d} M(floor(y_d/k)) ],
// y_d = floor(x/d), K_d = floor(y_d/(u+1)), c1_d = floor(y_d/W): the k with a value at least
// W see M(W), the rest M(value) from the sweep. Values below sqrt(y_d) are visited per value t
// with the number of k giving it, floor(y/t) - floor(y/(t+1)), instead of per k.
struct SieveSum {
  Wide sum = 0;
  SignedSum mertens_u = 0;
  SignedSum mertens_w = 0;
};

SieveSum sieve_sum(Natural x, Natural u, const std::vector<std::int8_t>& mu, HelfgottThompsonWork& work) {
  const Natural w = x / u;
  constexpr std::size_t segment = detail::sweep_segment_length;
  SieveSum out;
  for (Natural m = 1; m <= u; ++m) out.mertens_u += mu[m];

  struct Divisor {
    Natural y;          // floor(x/d)
    double y_double;
    Natural t;          // next value of the per-value phase
    Natural t_end;      // that phase covers [u+1, t_end)
    Natural k;          // next k of the per-k phase (values floor(y/k) increase as k falls)
    Natural k_stop;     // c1: the per-k phase ends at k = k_stop
    std::int8_t mu;
  };
  std::vector<Divisor> divisors;
  Wide coefficient_w = 0, coefficient_u = 0;
  for (Natural d = 1; d <= u; ++d) {
    if (mu[d] == 0) continue;
    const Natural y = x / d;
    const Natural k_all = y / (u + 1);
    const Natural c1 = y / w;
    coefficient_w += mu[d] * static_cast<Wide>(c1);
    coefficient_u += mu[d] * static_cast<Wide>(k_all);
    const Natural t_end = std::min(w, std::max(u + 1, integer_sqrt(y) + 1));
    const Natural k_first = std::min(k_all, y / t_end);
    if (t_end <= u + 1 && k_first <= c1) continue;
    divisors.push_back({y, static_cast<double>(y), u + 1, t_end, k_first, c1, mu[d]});
  }
  auto next_value = [](const Divisor& v) -> Natural {
    if (v.t < v.t_end) return v.t;
    if (v.k > v.k_stop) return v.y / v.k;
    return 0;
  };
  const Natural first = u + 1;
  const auto segments = static_cast<std::size_t>((w - first) / segment + 1);
  std::vector<std::vector<std::uint32_t>> buckets(segments);
  for (std::size_t i = 0; i < divisors.size(); ++i) {
    const Natural v = next_value(divisors[i]);
    buckets[static_cast<std::size_t>((v - first) / segment)].push_back(static_cast<std::uint32_t>(i));
  }

  const detail::MuSieveTables tables(w);
  detail::MuSieve sieve(tables, segment);
  sieve.reset(first);
  std::vector<std::int8_t> mu_block(segment);
  std::vector<SignedSum> m_block(segment);
  SignedSum running = out.mertens_u;
  Wide lookups = 0;
  for (std::size_t index = 0; index < segments; ++index) {
    const Natural lo = first + index * segment;
    const Natural hi = std::min<Natural>(lo + segment, w + 1);
    const auto len = static_cast<std::size_t>(hi - lo);
    sieve.next(len, mu_block.data());
    for (std::size_t i = 0; i < len; ++i) {
      running += mu_block[i];
      m_block[i] = running;
    }
    std::vector<std::uint32_t> here;
    here.swap(buckets[index]);
    for (const std::uint32_t id : here) {
      Divisor& v = divisors[id];
      std::int64_t acc = 0;
      if (v.t < v.t_end) {
        Natural previous = detail::quotient_small(v.y, v.y_double, v.t);
        const Natural stop = std::min(v.t_end, hi);
        work.lookups += stop - v.t;
        for (; v.t < stop; ++v.t) {
          const Natural next = detail::quotient_small(v.y, v.y_double, v.t + 1);
          acc += m_block[v.t - lo] * static_cast<std::int64_t>(previous - next);
          previous = next;
        }
      }
      if (v.t >= v.t_end) {
        for (; v.k > v.k_stop; --v.k) {
          const Natural value = detail::quotient_small(v.y, v.y_double, v.k);
          if (value >= hi) break;
          acc += m_block[value - lo];
          ++work.lookups;
        }
      }
      lookups += v.mu * static_cast<Wide>(acc);
      const Natural v_next = next_value(v);
      if (v_next != 0) buckets[static_cast<std::size_t>((v_next - first) / segment)].push_back(id);
    }
  }
  out.mertens_w = running;
  out.sum = coefficient_w * out.mertens_w - coefficient_u * out.mertens_u + lookups;
  return out;
}

}  // namespace

Natural default_helfgott_thompson_split(Natural x) {
  const double target = 0.5 * std::pow(static_cast<double>(x), 0.4);
  Natural u = target < 1 ? Natural{1} : static_cast<Natural>(target);
  // u (u + 1) <= x keeps floor(x/u) > u; x/u < 2^43 keeps the sieve in range.
  while (u > 1 && u * (u + 1) > x) --u;
  while (x / u >= (Natural{1} << 43)) ++u;
  return u;
}

SignedSum mertens_isolated_helfgott_thompson(Natural x, const HelfgottThompsonOptions& options, HelfgottThompsonWork* work) {
  if (x < 1 || x > max_helfgott_thompson_x)
    throw InvalidArgument("Mertens argument " + std::to_string(x) + " is outside the supported range [1, " +
                          std::to_string(max_helfgott_thompson_x) + "] of the Helfgott-Thompson method");
  HelfgottThompsonWork local;
  HelfgottThompsonWork& counts = work != nullptr ? *work : local;
  counts = {};
  if (x < 6) {
    const auto mu = detail::mu_table(x);
    SignedSum m = 0;
    for (Natural k = 1; k <= x; ++k) m += mu[k];
    return m;
  }
  const Natural u = options.split != 0 ? options.split : default_helfgott_thompson_split(x);
  if (u < 1 || u > x / (u + 1) || x / u >= (Natural{1} << 43))
    throw InvalidArgument("split " + std::to_string(u) + " of the Helfgott-Thompson method needs u (u + 1) <= x and x/u < 2^43");
  const double tolerance = options.box_tolerance != 0 ? options.box_tolerance : default_box_tolerance;
  if (!(tolerance > 0 && tolerance <= 4)) throw InvalidArgument("box tolerance must be in (0, 4]");
  const unsigned min_height = options.min_box_height != 0 ? options.min_box_height : default_min_box_height;
  if (min_height < 2) throw InvalidArgument("smallest box height must be at least 2");
  counts.split = u;
  counts.sieve_limit = x / u;

  const auto mu = detail::mu_table(u);
  DoubleSumOverBoxes boxes(x, u, mu, tolerance, min_height, counts);
  const Wide square = boxes.sum();
  const SieveSum rest = sieve_sum(x, u, mu, counts);
  const Wide m = static_cast<Wide>(rest.mertens_u) + rest.mertens_w - square - rest.sum;
  return static_cast<SignedSum>(m);
}

}  // namespace sqfc::arith
