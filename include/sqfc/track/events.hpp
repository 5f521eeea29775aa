// SPDX-License-Identifier: MIT
/// @file events.hpp  Events of a run: zeros and records of M(n), first faces and homology per dimension.
#pragma once

#include <cmath>
#include <cstdint>
#include <string_view>

#include "sqfc/arith/factor_code.hpp"
#include "sqfc/core/types.hpp"
#include "sqfc/track/block_summary.hpp"
#include "sqfc/track/tracker_state.hpp"

namespace sqfc::track {

/// What happened at an n.
enum class EventKind : std::uint8_t {
  mertens_zero,              ///< M(n) = 0
  mertens_high,              ///< M(n) > M(k) for all 1 <= k < n (n >= 2)
  mertens_low,               ///< M(n) < M(k) for all 1 <= k < n (n >= 2)
  scaled_high,               ///< M(n)/sqrt(n) above all earlier values with k >= 200 (n > 200)
  scaled_low,                ///< M(n)/sqrt(n) below all earlier values with k >= 200 (n > 200)
  first_face_dimension,      ///< K_n has its first face of dimension d (value d)
  first_homology_dimension,  ///< b_d(K_n) > 0 for the first time (value d)
};

/// The name written into events files (docs/output-formats.md).
std::string_view event_kind_name(EventKind kind) noexcept;

/// One event. `value` is M(n) for the Mertens kinds and d for the dimension kinds; `scaled`
/// is M(n)/sqrt(n) for the scaled kinds (0 otherwise).
struct Event {
  EventKind kind;
  Natural n;
  SignedSum value;
  double scaled;
  friend bool operator==(const Event&, const Event&) = default;
};

/// The records an EventDetector keeps after some n: enough to continue a run from a checkpoint
/// or on another process. The scaled records are exact pairs (M, n).
struct EventRecords {
  SignedSum high = 0, low = 0;  ///< max and min of M over [1, n]
  SignedSum scaled_high_m = 0, scaled_low_m = 0;
  Natural scaled_high_n = 0, scaled_low_n = 0;  ///< 0 before n reaches scaled_start
  std::uint32_t face_dims_seen = 0, homology_dims_seen = 0;  ///< bit d: dimension d seen
  friend bool operator==(const EventRecords&, const EventRecords&) = default;
};

/// Follows the running records and first appearances over consecutive n.
/// Invariant: its records describe every n observed so far, and no event can occur inside a
/// block that may_fire_in() rejected, so skipping such a block keeps the records exact.
class EventDetector {
 public:
  /// First n for the scaled records M(n)/sqrt(n).
  static constexpr Natural scaled_start = 200;

  EventDetector() = default;
  /// Continues from saved records (the cached doubles are recomputed exactly as observe() does).
  explicit EventDetector(const EventRecords& saved);
  /// The records after the last observed n. Complexity: O(1).
  [[nodiscard]] EventRecords records() const noexcept;

  /// False only when no event can happen in block `s` after the state `before`.
  /// Conservative: true may still yield no event. Complexity: O(omega_slots).
  [[nodiscard]] bool may_fire_in(const TrackerState& before, const BlockSummary& s) const;

  /// Observes n = state.n() (with factor code @p code) right after TrackerState::step, and calls
  /// emit(const Event&) for each event when @p report is true (records update either way).
  /// Pre: every n from 1 on was observed or lies in a block may_fire_in() rejected (assumed).
  template <class Emit>
  void observe(const TrackerState& state, arith::FactorCode code, bool report, Emit&& emit);

 private:
  SignedSum high_ = 0, low_ = 0;  // extremes of M over [1, n]
  // Scaled records as exact pairs (M, n); the doubles cache M / sqrt(n) for the block test.
  SignedSum scaled_high_m_ = 0, scaled_low_m_ = 0;
  Natural scaled_high_n_ = 0, scaled_low_n_ = 0;
  double scaled_high_ = 0, scaled_low_ = 0;
  std::uint32_t face_dims_seen_ = 0, homology_dims_seen_ = 0;
};

/// Compares M1/sqrt(n1) with M2/sqrt(n2) exactly: negative, zero or positive like a - b.
/// Pre: n1, n2 >= 1 (assumed). Exact for all 64-bit inputs: 128-bit products when |M| < 2^37
/// (always in the sieve range, where |M(n)| < 2^27), 256-bit Boost.Multiprecision otherwise.
int compare_scaled(SignedSum m1, Natural n1, SignedSum m2, Natural n2) noexcept;

// ---------------------------------------------------------------------------------------------

template <class Emit>
void EventDetector::observe(const TrackerState& state, arith::FactorCode code, bool report, Emit&& emit) {
  const Natural n = state.n();
  const SignedSum m = state.mertens();
  if (n == 1) {
    high_ = low_ = m;
  } else {
    if (m == 0 && report) emit(Event{EventKind::mertens_zero, n, 0, 0.0});
    if (m > high_) {
      high_ = m;
      if (report) emit(Event{EventKind::mertens_high, n, m, 0.0});
    }
    if (m < low_) {
      low_ = m;
      if (report) emit(Event{EventKind::mertens_low, n, m, 0.0});
    }
  }
  if (n >= scaled_start) {
    const double scaled = static_cast<double>(m) / std::sqrt(static_cast<double>(n));
    if (n == scaled_start) {
      scaled_high_m_ = scaled_low_m_ = m;
      scaled_high_n_ = scaled_low_n_ = n;
      scaled_high_ = scaled_low_ = scaled;
    } else {
      if (compare_scaled(m, n, scaled_high_m_, scaled_high_n_) > 0) {
        scaled_high_m_ = m, scaled_high_n_ = n, scaled_high_ = scaled;
        if (report) emit(Event{EventKind::scaled_high, n, m, scaled});
      }
      if (compare_scaled(m, n, scaled_low_m_, scaled_low_n_) < 0) {
        scaled_low_m_ = m, scaled_low_n_ = n, scaled_low_ = scaled;
        if (report) emit(Event{EventKind::scaled_low, n, m, scaled});
      }
    }
  }
  if (arith::code_is_squarefree(code) && n >= 2) {
    const int w = arith::code_omega(code);
    const std::uint32_t face_bit = 1U << (w - 1);
    if (!(face_dims_seen_ & face_bit)) {
      face_dims_seen_ |= face_bit;
      if (report) emit(Event{EventKind::first_face_dimension, n, w - 1, 0.0});
    }
    // b_0 > 0 from n = 2 on; b_d for d >= 1 first when an odd squarefree n with omega d + 1 enters.
    const int d = (n == 2) ? 0 : ((n & 1) && w >= 2 ? w - 1 : -1);
    if (d >= 0 && !(homology_dims_seen_ & (1U << d))) {
      homology_dims_seen_ |= 1U << d;
      if (report) emit(Event{EventKind::first_homology_dimension, n, d, 0.0});
    }
  }
}

}  // namespace sqfc::track
