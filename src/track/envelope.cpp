// SPDX-License-Identifier: MIT
// Pixel-column envelopes: axis boundaries, the parallel Betti pass and the ordered combination.
#include "sqfc/track/envelope.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include "sqfc/core/error.hpp"
#include "sqfc/topology/betti_counting.hpp"
#include "sqfc/track/events.hpp"

namespace sqfc::track {
namespace {

// Highest Betti index tracked: TableRow::betti holds d + 1 < omega_slots.
constexpr int betti_slots = config::omega_slots - 1;

// The Betti number that n changes, by (parity of n, code): an odd squarefree n with omega w
// enters the interval counts at w, an even one 2m lets m (omega w - 1) leave (identity 2,
// incremental form); count index 0 enters b_0 with a minus sign (betti_counting.hpp).
struct BettiStep {
  std::int8_t dimension = config::omega_slots - 1;  // the unused slot 15: no Betti number changes
  std::int8_t delta = 0;
};
constexpr std::array<std::array<BettiStep, arith::factor_code_count>, 2> make_betti_steps() {
  std::array<std::array<BettiStep, arith::factor_code_count>, 2> t{};
  for (int c = 0; c < arith::factor_code_count; ++c) {
    const auto code = static_cast<arith::FactorCode>(c);
    if (!arith::code_is_squarefree(code)) continue;
    const int w = arith::code_omega(code);
    // odd n: counts[w] += 1
    if (w == 0) t[1][c] = {0, -1};
    else if (w - 1 < betti_slots) t[1][c] = {static_cast<std::int8_t>(w - 1), 1};
    // even n: counts[w - 1] -= 1
    if (w >= 1) {
      if (w - 1 == 0) t[0][c] = {0, 1};
      else if (w - 2 < betti_slots) t[0][c] = {static_cast<std::int8_t>(w - 2), -1};
    }
  }
  return t;
}
constexpr auto betti_steps = make_betti_steps();

constexpr std::array<int, arith::factor_code_count> make_mu_table() {
  std::array<int, arith::factor_code_count> t{};
  for (int c = 0; c < arith::factor_code_count; ++c) t[c] = arith::code_mu(static_cast<arith::FactorCode>(c));
  return t;
}
constexpr auto mu_of_code = make_mu_table();

// D(n) flips at each squarefree k >= 2 with mu(k) = +1, i.e. omega(k) even and >= 2.
constexpr bool flips_fredholm(arith::FactorCode code) noexcept {
  return arith::code_is_squarefree(code) && arith::code_omega(code) >= 2 && arith::code_omega(code) % 2 == 0;
}

Count fredholm_flips(const BlockSummary& s) noexcept {
  Count flips = 0;
  for (int w = 2; w < config::omega_slots; w += 2) flips += s.odd_squarefree[w] + s.even_squarefree[w];
  return flips;
}

SeriesExtremes single(SignedSum v, Natural n) { return SeriesExtremes{v, v, v, v, n, n}; }

double scaled_value(SignedSum m, Natural n) { return static_cast<double>(m) / std::sqrt(static_cast<double>(n)); }

}  // namespace

EnvelopeAxis::EnvelopeAxis(Natural first, Natural last, unsigned width, bool log_x) : width_(width), log_x_(log_x) {
  if (first < 1 || first > last || last >= (Natural{1} << 63))
    throw InvalidArgument("envelope range [" + std::to_string(first) + ", " + std::to_string(last) + "] is not valid");
  if (width < 1) throw InvalidArgument("envelope width must be at least 1");
  boundaries_.reserve(width + 1);
  boundaries_.push_back(first);
  const Natural end = last + 1;
  const Natural span = end - first;
  const double log_first = std::log(static_cast<double>(first));
  const double log_ratio = std::log(static_cast<double>(end)) - log_first;
  for (unsigned c = 1; c < width; ++c) {
    Natural b = 0;
    if (!log_x) {
      b = first + static_cast<Natural>(static_cast<WideUnsigned>(span) * c / width);
    } else {
      const double x = std::exp(log_first + log_ratio * c / width);
      b = x >= static_cast<double>(end) ? end : static_cast<Natural>(std::ceil(x));
    }
    if (b > boundaries_.back() && b < end) boundaries_.push_back(b);
  }
  boundaries_.push_back(end);
}

Natural EnvelopeAxis::next_boundary_after(Natural n) const noexcept {
  const auto it = std::upper_bound(boundaries_.begin(), boundaries_.end(), n);
  return it == boundaries_.end() ? 0 : *it;
}

EnvelopeBuilder::EnvelopeBuilder(const EnvelopeOptions& options)
    : options_(options), axis_(options.first, options.last, options.width, options.log_x) {
  columns_.resize(axis_.columns());
}

namespace {

// Conditional moves rather than branches: new extremes come at unpredictable n. Strict
// comparisons keep first positions, non-strict ones last positions.
inline void track_mertens(EnvelopePieceExtras& x, SignedSum v, Natural n) noexcept {
  const bool up = v > x.m_high, down = v < x.m_low;
  x.m_high = up ? v : x.m_high;
  x.m_high_n = up ? n : x.m_high_n;
  x.m_low = down ? v : x.m_low;
  x.m_low_n = down ? n : x.m_low_n;
  x.m_high_last_n = v == x.m_high ? n : x.m_high_last_n;
  x.m_low_last_n = v == x.m_low ? n : x.m_low_last_n;
}

void start_mertens(EnvelopePieceExtras& x, SignedSum first, Natural lo) noexcept {
  x.has_mertens = true;
  x.m_low = x.m_high = first;
  x.m_low_n = x.m_high_n = x.m_low_last_n = x.m_high_last_n = lo;
}

}  // namespace

EnvelopePieceExtras EnvelopeBuilder::summarize_piece(Natural lo, const arith::FactorCode* codes, std::size_t count) const {
  EnvelopePieceExtras x;
  if (count == 0 || !options_.betti) return x;
  // n = lo itself: every prefix starts there, so the extremes start from its values.
  SignedSum m = mu_of_code[codes[0]];
  start_mertens(x, m, lo);
  std::array<std::int32_t, config::omega_slots> value{};
  const BettiStep first = betti_steps[lo & 1][codes[0]];
  value[static_cast<std::size_t>(first.dimension)] += first.delta;
  x.low = value;
  x.high = value;
  x.low_n.fill(lo);
  x.high_n.fill(lo);
  for (std::size_t i = 1; i < count; ++i) {
    const Natural n = lo + i;
    const arith::FactorCode code = codes[i];
    m += mu_of_code[code];
    track_mertens(x, m, n);
    // n that change no Betti number step the unused slot 15 by 0 (no branch).
    const BettiStep step = betti_steps[n & 1][code];
    const auto d = static_cast<std::size_t>(step.dimension);
    const std::int32_t v = value[d] += step.delta;
    const bool b_up = v > x.high[d], b_down = v < x.low[d];
    x.high[d] = b_up ? v : x.high[d];
    x.high_n[d] = b_up ? n : x.high_n[d];
    x.low[d] = b_down ? v : x.low[d];
    x.low_n[d] = b_down ? n : x.low_n[d];
  }
  return x;
}

void EnvelopeBuilder::start_column(const TrackerState& before, const arith::FactorCode* codes) {
  TrackerState at_first = before;
  at_first.step(codes[0]);
  const TableRow row = at_first.row();
  const Natural n = row.n;
  EnvelopeColumn& c = columns_[current_];
  c.lo = axis_.column_start(current_);
  c.hi = axis_.column_end(current_);
  c.mertens = single(row.mertens, n);
  c.scaled = single(row.mertens, n);
  c.squarefree = single(static_cast<SignedSum>(row.squarefree), n);
  c.fredholm = single(row.fredholm, n);
  for (int d = 0; d < config::omega_slots; ++d) c.faces[d] = single(static_cast<SignedSum>(row.faces[d]), n);
  if (options_.betti)
    for (int d = 0; d < betti_slots; ++d) c.betti[d] = single(row.betti[d], n);
}

void EnvelopeBuilder::finish_column(const TrackerState& before, const BlockSummary& s) {
  TrackerState after = before;
  after.apply(s);
  const TableRow row = after.row();
  const Natural n = row.n;
  EnvelopeColumn& c = columns_[current_];
  c.mertens.last = row.mertens;
  c.scaled.last = row.mertens;
  c.fredholm.last = row.fredholm;
  // Q and f_d never decrease: the maximum is the last value, attained at the column's last n.
  c.squarefree.last = c.squarefree.max = static_cast<SignedSum>(row.squarefree);
  c.squarefree.max_n = n;
  for (int d = 0; d < config::omega_slots; ++d) {
    c.faces[d].last = c.faces[d].max = static_cast<SignedSum>(row.faces[d]);
    c.faces[d].max_n = n;
  }
  if (options_.betti)
    for (int d = 0; d < betti_slots; ++d) c.betti[d].last = row.betti[d];
  ++current_;
}

void EnvelopeBuilder::add_piece(const TrackerState& before, const BlockSummary& s, const EnvelopePieceExtras& given,
                                const arith::FactorCode* codes) {
  if (s.empty() || s.hi <= options_.first || s.lo > options_.last) return;
  SQFC_ASSERT(current_ < columns_.size());
  SQFC_ASSERT(s.lo >= axis_.column_start(current_) && s.hi <= axis_.column_end(current_));
  const bool column_start = s.lo == axis_.column_start(current_);
  if (column_start) start_column(before, codes);
  EnvelopeColumn& c = columns_[current_];
  const std::size_t count = s.hi - s.lo;

  // M: exact extremes with their first and last positions from the parallel phase, or from a
  // scan here when the summary says the piece may change an extreme of M or M(n)/sqrt(n).
  const SignedSum m0 = before.mertens();
  const double root_lo = std::sqrt(static_cast<double>(s.lo)), root_hi = std::sqrt(static_cast<double>(s.hi - 1));
  // Floating-point slack keeps every test below conservative; decisions are exact (compare_scaled).
  constexpr double slack = 1e-9;
  // Necessary for m/sqrt(n) > s_max with n in the piece: m > s_max * sqrt(lo) when s_max >= 0,
  // m > s_max * sqrt(hi - 1) otherwise; symmetrically for the minimum.
  SignedSum above = 0, below = 0;
  auto thresholds = [&] {
    const double s_max = scaled_value(c.scaled.max, c.scaled.max_n), s_min = scaled_value(c.scaled.min, c.scaled.min_n);
    const double x = s_max * (s_max >= 0 ? root_lo : root_hi), y = s_min * (s_min <= 0 ? root_lo : root_hi);
    above = static_cast<SignedSum>(std::floor(x - slack * (1 + std::abs(x))));
    below = static_cast<SignedSum>(std::ceil(y + slack * (1 + std::abs(y))));
  };
  EnvelopePieceExtras scanned;
  const EnvelopePieceExtras* found = &given;
  if (!given.has_mertens) {
    thresholds();
    // Which positions can matter: the first n of a new M record; for M(n)/sqrt(n) the first n of
    // a level m >= 0 (earlier is larger) or the last n of a level m < 0 (later is larger), and
    // the mirror image for the minimum. Scans stop as soon as they have what they need.
    const SignedSum ph = m0 + s.prefix_high, pl = m0 + s.prefix_low;
    const bool high_first = ph > c.mertens.max || (ph > above && ph >= 0), high_last = ph > above && ph < 0;
    const bool low_first = pl < c.mertens.min || (pl < below && pl <= 0), low_last = pl < below && pl > 0;
    if (!(high_first || high_last || low_first || low_last)) {
      found = nullptr;  // nothing in this piece can change a column extreme of M or M(n)/sqrt(n)
    } else {
      start_mertens(scanned, 0, 0);
      scanned.m_high = s.prefix_high, scanned.m_low = s.prefix_low;
      Natural hf = 0, hl = 0, lf = 0, ll = 0;
      SignedSum p = 0;
      for (std::size_t i = 0; i < count && ((high_first && !hf) || (low_first && !lf)); ++i) {
        p += mu_of_code[codes[i]];
        if (p == s.prefix_high && !hf) hf = s.lo + i;
        if (p == s.prefix_low && !lf) lf = s.lo + i;
        ++scanned_;
      }
      p = s.mertens;  // P(hi - 1); walking down, P(n - 1) = P(n) - mu(n)
      for (std::size_t i = count; i-- > 0 && ((high_last && !hl) || (low_last && !ll));) {
        if (p == s.prefix_high && !hl) hl = s.lo + i;
        if (p == s.prefix_low && !ll) ll = s.lo + i;
        p -= mu_of_code[codes[i]];
        ++scanned_;
      }
      // A position not looked for stands in for its partner (offering it twice is harmless);
      // the M record test below only uses first positions, which are found when it can fire.
      scanned.m_high_n = hf ? hf : hl;
      scanned.m_high_last_n = hl ? hl : hf;
      scanned.m_low_n = lf ? lf : ll;
      scanned.m_low_last_n = ll ? ll : lf;
      if (!scanned.m_high_n) scanned.m_high_n = scanned.m_high_last_n = scanned.m_low_n ? scanned.m_low_n : scanned.m_low_last_n, scanned.m_high = s.prefix_low;
      if (!scanned.m_low_n) scanned.m_low_n = scanned.m_low_last_n = scanned.m_high_n, scanned.m_low = scanned.m_high;
      found = &scanned;
    }
  }
  if (found != nullptr) {
    const EnvelopePieceExtras& extras = *found;
    const SignedSum high = m0 + extras.m_high, low = m0 + extras.m_low;
    if (high > c.mertens.max) c.mertens.max = high, c.mertens.max_n = extras.m_high_n;
    if (low < c.mertens.min) c.mertens.min = low, c.mertens.min_n = extras.m_low_n;

    // M(n)/sqrt(n). Over the n of one level m, m/sqrt(n) is extreme at the level's first or last
    // n in the piece, so offering the first and last n of M's extremes settles those two levels.
    auto offer = [&](SignedSum m, Natural n) {
      if (compare_scaled(m, n, c.scaled.max, c.scaled.max_n) > 0) c.scaled.max = m, c.scaled.max_n = n;
      if (compare_scaled(m, n, c.scaled.min, c.scaled.min_n) < 0) c.scaled.min = m, c.scaled.min_n = n;
    };
    offer(high, extras.m_high_n);
    offer(high, extras.m_high_last_n);
    offer(low, extras.m_low_n);
    offer(low, extras.m_low_last_n);
    thresholds();
    // Levels high and low are settled; only a level strictly between them and the thresholds
    // (above < m < high or low < m < below) can still beat the column's extremes.
    if (above < high - 1 || below > low + 1) {
      SignedSum m = m0;
      for (std::size_t i = 0; i < count; ++i) {
        m += mu_of_code[codes[i]];
        if (m > above || m < below) {
          const Natural n = s.lo + i;
          // M hovers near its extremes for long stretches: a double test first, the exact one
          // only for values within the slack of the current extremes.
          const double v = scaled_value(m, n);
          if (v < scaled_value(c.scaled.max, c.scaled.max_n) - slack && v > scaled_value(c.scaled.min, c.scaled.min_n) + slack)
            continue;
          const SignedSum old_max = c.scaled.max, old_min = c.scaled.min;
          const Natural old_max_n = c.scaled.max_n, old_min_n = c.scaled.min_n;
          offer(m, n);
          if (c.scaled.max != old_max || c.scaled.max_n != old_max_n || c.scaled.min != old_min || c.scaled.min_n != old_min_n)
            thresholds();
        }
      }
      scanned_ += count;
    }
  }

  // D(n) = +-1: the column needs the first n with the value it has not shown yet.
  const Count flips_after_first = fredholm_flips(s) - (column_start && flips_fredholm(codes[0]) ? 1 : 0);
  if (c.fredholm.min == c.fredholm.max && flips_after_first > 0) {
    for (std::size_t i = column_start ? 1 : 0; i < count; ++i) {
      if (!flips_fredholm(codes[i])) continue;
      const Natural n = s.lo + i;
      const SignedSum other = -c.fredholm.first;  // the first flip after the column's first n shows it
      if (other < c.fredholm.min) c.fredholm.min = other, c.fredholm.min_n = n;
      else c.fredholm.max = other, c.fredholm.max_n = n;
      scanned_ += i + 1;
      break;
    }
  }

  if (options_.betti) {
    const EnvelopePieceExtras& extras = given;
    const auto& counts = before.interval_counts();
    for (int k = 0; k < betti_slots; ++k) {
      const SignedSum b0 = topology::betti_from_interval_counts(counts, k);
      const SignedSum piece_high = b0 + extras.high[k], piece_low = b0 + extras.low[k];
      if (piece_high > c.betti[k].max) c.betti[k].max = piece_high, c.betti[k].max_n = extras.high_n[k];
      if (piece_low < c.betti[k].min) c.betti[k].min = piece_low, c.betti[k].min_n = extras.low_n[k];
    }
  }
  if (s.hi == axis_.column_end(current_)) finish_column(before, s);
}

Envelope EnvelopeBuilder::take() {
  Envelope e;
  e.options = options_;
  e.columns = std::move(columns_);
  e.columns.resize(current_);  // only finished columns
  e.scanned_values = scanned_;
  columns_.clear();
  return e;
}

}  // namespace sqfc::track
