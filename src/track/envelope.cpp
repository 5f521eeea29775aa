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
  std::int8_t dimension = -1;  // -1: no Betti number changes
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

// D(n) flips at each squarefree k >= 2 with mu(k) = +1, i.e. omega(k) even and >= 2.
constexpr bool flips_fredholm(arith::FactorCode code) noexcept {
  return arith::code_is_squarefree(code) && arith::code_omega(code) >= 2 && arith::code_omega(code) % 2 == 0;
}

int fredholm_of(const TrackerState& s) noexcept {
  Count positive = 0;
  for (int w = 2; w < config::omega_slots; w += 2) positive += s.odd_squarefree()[w] + s.even_squarefree()[w];
  return positive % 2 == 0 ? 1 : -1;
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

EnvelopePieceExtras EnvelopeBuilder::summarize_piece(Natural lo, const arith::FactorCode* codes, std::size_t count) const {
  EnvelopePieceExtras x;
  if (!options_.betti || count == 0) return x;
  std::array<std::int32_t, config::omega_slots> value{};
  // n = lo itself: every prefix starts there, so the extremes start from its values.
  const BettiStep first = betti_steps[lo & 1][codes[0]];
  if (first.dimension >= 0) value[first.dimension] = first.delta;
  x.low = value;
  x.high = value;
  x.low_n.fill(lo);
  x.high_n.fill(lo);
  for (std::size_t i = 1; i < count; ++i) {
    const Natural n = lo + i;
    const BettiStep step = betti_steps[n & 1][codes[i]];
    if (step.dimension < 0) continue;
    const int d = step.dimension;
    const std::int32_t v = value[d] += step.delta;
    // Strict comparisons keep the first n that attains each extreme.
    if (v > x.high[d]) x.high[d] = v, x.high_n[d] = n;
    if (v < x.low[d]) x.low[d] = v, x.low_n[d] = n;
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

void EnvelopeBuilder::add_piece(const TrackerState& before, const BlockSummary& s, const EnvelopePieceExtras& extras,
                                const arith::FactorCode* codes) {
  if (s.empty() || s.hi <= options_.first || s.lo > options_.last) return;
  SQFC_ASSERT(current_ < columns_.size());
  SQFC_ASSERT(s.lo >= axis_.column_start(current_) && s.hi <= axis_.column_end(current_));
  const bool column_start = s.lo == axis_.column_start(current_);
  if (column_start) start_column(before, codes);
  EnvelopeColumn& c = columns_[current_];

  // M: the summary gives the exact range of M over the piece; only a new extreme needs its
  // position, found by a scan that stops once it has it.
  const SignedSum m0 = before.mertens();
  const SignedSum high = m0 + s.prefix_high, low = m0 + s.prefix_low;
  bool need_high = high > c.mertens.max, need_low = low < c.mertens.min;

  // M(n)/sqrt(n): bounds from the range of M; a small slack keeps the floating-point test
  // conservative (the exact comparison happens in the scan).
  const double root_lo = std::sqrt(static_cast<double>(s.lo)), root_hi = std::sqrt(static_cast<double>(s.hi - 1));
  const double upper = high >= 0 ? static_cast<double>(high) / root_lo : static_cast<double>(high) / root_hi;
  const double lower = low <= 0 ? static_cast<double>(low) / root_lo : static_cast<double>(low) / root_hi;
  constexpr double slack = 1e-9;
  double scaled_max = scaled_value(c.scaled.max, c.scaled.max_n), scaled_min = scaled_value(c.scaled.min, c.scaled.min_n);
  const bool scan_scaled = upper > scaled_max - slack || lower < scaled_min + slack;

  // D(n) = +-1: the column needs the first n with the value it has not shown yet.
  const Count flips_after_first = fredholm_flips(s) - (column_start && flips_fredholm(codes[0]) ? 1 : 0);
  bool need_fredholm = c.fredholm.min == c.fredholm.max && flips_after_first > 0;

  if (need_high || need_low || scan_scaled || need_fredholm) {
    SignedSum m = m0;
    int d = fredholm_of(before);
    const std::size_t count = s.hi - s.lo;
    std::size_t i = 0;
    for (; i < count; ++i) {
      const Natural n = s.lo + i;
      const arith::FactorCode code = codes[i];
      m += arith::code_mu(code);
      if (need_high && m == high) c.mertens.max = high, c.mertens.max_n = n, need_high = false;
      if (need_low && m == low) c.mertens.min = low, c.mertens.min_n = n, need_low = false;
      if (flips_fredholm(code)) d = -d;
      if (need_fredholm && d != c.fredholm.first) {
        if (d < c.fredholm.min) c.fredholm.min = d, c.fredholm.min_n = n;
        else c.fredholm.max = d, c.fredholm.max_n = n;
        need_fredholm = false;
      }
      if (scan_scaled) {
        const double v = scaled_value(m, n);
        if (v > scaled_max - slack && compare_scaled(m, n, c.scaled.max, c.scaled.max_n) > 0)
          c.scaled.max = m, c.scaled.max_n = n, scaled_max = v;
        if (v < scaled_min + slack && compare_scaled(m, n, c.scaled.min, c.scaled.min_n) < 0)
          c.scaled.min = m, c.scaled.min_n = n, scaled_min = v;
      } else if (!need_high && !need_low && !need_fredholm) {
        ++i;
        break;
      }
    }
    scanned_ += i;
  }

  if (options_.betti) {
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
