// SPDX-License-Identifier: MIT
/// @file envelope.hpp  Per-pixel-column extremes of the table series, built while tabulating.
#pragma once

#include <array>
#include <cstddef>
#include <vector>

#include "sqfc/arith/factor_code.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/types.hpp"
#include "sqfc/track/block_summary.hpp"
#include "sqfc/track/tracker_state.hpp"

namespace sqfc::track {

/// The pixel columns of a picture over n in [first, last]: column c holds the n in
/// [boundary(c), boundary(c + 1)), half-open. Linear columns have (nearly) equal widths; log
/// columns equal ratios. Boundaries come from floating point (they are a binning choice only;
/// every value reported for a column is exact). Columns are never empty: when two boundaries
/// would coincide (log columns below `width` values) the column is dropped, so columns() <= width.
/// Invariant: boundaries are strictly increasing, the first is `first`, the last `last + 1`.
class EnvelopeAxis {
 public:
  /// Pre: 1 <= first <= last < 2^63, width >= 1 (checked; InvalidArgument).
  /// Complexity: O(width) time and memory.
  EnvelopeAxis(Natural first, Natural last, unsigned width, bool log_x);

  [[nodiscard]] std::size_t columns() const noexcept { return boundaries_.size() - 1; }
  [[nodiscard]] Natural column_start(std::size_t c) const noexcept { return boundaries_[c]; }
  /// One past the last n of column c.
  [[nodiscard]] Natural column_end(std::size_t c) const noexcept { return boundaries_[c + 1]; }
  /// The smallest boundary > n, or 0 when n >= last + 1. Complexity: O(log width).
  [[nodiscard]] Natural next_boundary_after(Natural n) const noexcept;
  [[nodiscard]] const std::vector<Natural>& boundaries() const noexcept { return boundaries_; }
  [[nodiscard]] bool log_x() const noexcept { return log_x_; }
  [[nodiscard]] unsigned requested_width() const noexcept { return width_; }

 private:
  std::vector<Natural> boundaries_;
  unsigned width_;
  bool log_x_;
};

/// Extremes of one integer series over one column. `min_n` and `max_n` are the first n of the
/// column at which the extreme is attained for non-monotone series (M, M/sqrt(n), b_d, D); for
/// the non-decreasing series Q and f_d they are the column's first and last n, where the
/// extremes are attained too. For the scaled series M(n)/sqrt(n), `min` and `max` hold the
/// exact M values at `min_n` and `max_n`, and first/last the M values at the column's ends.
struct SeriesExtremes {
  SignedSum first = 0, last = 0, min = 0, max = 0;
  Natural min_n = 0, max_n = 0;
  friend bool operator==(const SeriesExtremes&, const SeriesExtremes&) = default;
};

/// Every series of one column [lo, hi).
struct EnvelopeColumn {
  Natural lo = 0, hi = 0;
  SeriesExtremes mertens, scaled, squarefree, fredholm;
  std::array<SeriesExtremes, config::omega_slots> faces{};  ///< f_d, d = 0..15
  std::array<SeriesExtremes, config::omega_slots> betti{};  ///< b_d, d = 0..14 (slot 15 unused)
  friend bool operator==(const EnvelopeColumn&, const EnvelopeColumn&) = default;
};

/// What to build.
struct EnvelopeOptions {
  Natural first = 1;    ///< first n covered
  Natural last = 1;     ///< last n covered
  unsigned width = 1200;  ///< pixel columns requested
  bool log_x = false;
  /// Betti extremes need a per-n pass over every block in the parallel sieve phase (the others
  /// only the block summaries and short targeted scans); false leaves the betti fields zero.
  bool betti = true;
};

/// A finished envelope.
struct Envelope {
  EnvelopeOptions options;
  std::vector<EnvelopeColumn> columns;
  Count scanned_values = 0;  ///< n visited by targeted scans in the ordered pass (cost figure)
};

/// Prefix extremes of one piece with their first positions, computed in the parallel phase.
/// Invariant: m_low/m_high are extremes of P(n) = M(n) - M(lo - 1), low[d]/high[d] those of
/// P_d(n) = b_d(n) - b_d(lo - 1), over n in [lo, hi), each with the first n attaining it.
struct EnvelopePieceExtras {
  bool has_mertens = false;  ///< m_* are set (with Betti extremes, whose pass pays for them)
  SignedSum m_low = 0, m_high = 0;
  Natural m_low_n = 0, m_high_n = 0;            ///< first n attaining m_low, m_high
  Natural m_low_last_n = 0, m_high_last_n = 0;  ///< last n attaining them
  std::array<std::int32_t, config::omega_slots> low{}, high{};
  std::array<Natural, config::omega_slots> low_n{}, high_n{};
};

/// Builds an envelope from the pieces of a run. The run must split its blocks at the axis
/// boundaries (for_each_piece) and hand every piece, in increasing n, to add_piece().
/// Invariant: the columns before the current one are final; each series' extremes equal those
/// of the per-n series over the part of the current column seen so far.
class EnvelopeBuilder {
 public:
  /// Pre: as EnvelopeAxis (checked).
  explicit EnvelopeBuilder(const EnvelopeOptions& options);

  [[nodiscard]] const EnvelopeAxis& axis() const noexcept { return axis_; }
  [[nodiscard]] bool wants_betti() const noexcept { return options_.betti; }

  /// Calls piece(offset, count) for the sub-ranges of [lo, lo + count) split at the axis
  /// boundaries (and at `first`), in order. Thread-safe (const).
  template <class Piece>
  void for_each_piece(Natural lo, std::size_t count, Piece&& piece) const;

  /// When wants_betti(): prefix extremes of each b_d (first positions) and of M (first and last
  /// positions) over the piece [lo, lo + count); nothing otherwise, and add_piece() then finds
  /// M's positions by a scan in the ordered pass, only in the pieces that need them.
  /// Thread-safe (const). Pre: count >= 1 (assumed). Complexity: O(count) time, O(1) memory.
  [[nodiscard]] EnvelopePieceExtras summarize_piece(Natural lo, const arith::FactorCode* codes, std::size_t count) const;

  /// Takes the piece `s` (codes[i] belongs to s.lo + i) after state `before` (before.n() == s.lo - 1).
  /// `extras` is summarize_piece() of the same piece. Pre: pieces arrive in order without gaps
  /// and none straddles an axis boundary (assumed; asserted in debug builds).
  /// Complexity: O(omega_slots), plus an integer scan of the piece when its bounds say a column
  /// extreme of M(n)/sqrt(n) may change inside it, plus a scan up to the first sign change of D
  /// when the column has shown one sign only.
  void add_piece(const TrackerState& before, const BlockSummary& s, const EnvelopePieceExtras& extras,
                 const arith::FactorCode* codes);

  /// The envelope; every column is final once the piece ending at `last` was added.
  [[nodiscard]] Envelope take();

 private:
  void start_column(const TrackerState& before, const arith::FactorCode* codes);
  void finish_column(const TrackerState& before, const BlockSummary& s);

  EnvelopeOptions options_;
  EnvelopeAxis axis_;
  std::vector<EnvelopeColumn> columns_;
  std::size_t current_ = 0;  // index of the column the next piece belongs to
  Count scanned_ = 0;
};

// ---------------------------------------------------------------------------------------------

template <class Piece>
void EnvelopeBuilder::for_each_piece(Natural lo, std::size_t count, Piece&& piece) const {
  std::size_t offset = 0;
  while (offset < count) {
    const Natural n = lo + offset;
    Natural cut = 0;
    if (n < options_.first) cut = options_.first;
    else cut = axis_.next_boundary_after(n);
    std::size_t take = count - offset;
    if (cut != 0 && cut - n < take) take = static_cast<std::size_t>(cut - n);
    piece(offset, take);
    offset += take;
  }
}

}  // namespace sqfc::track
