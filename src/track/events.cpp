// SPDX-License-Identifier: MIT
// Event names, exact comparison of M(n)/sqrt(n), and the block test.
#include "sqfc/track/events.hpp"

#include <boost/multiprecision/cpp_int.hpp>

namespace sqfc::track {

std::string_view event_kind_name(EventKind kind) noexcept {
  switch (kind) {
    case EventKind::mertens_zero: return "mertens_zero";
    case EventKind::mertens_high: return "mertens_high";
    case EventKind::mertens_low: return "mertens_low";
    case EventKind::scaled_high: return "scaled_high";
    case EventKind::scaled_low: return "scaled_low";
    case EventKind::first_face_dimension: return "first_face_dimension";
    case EventKind::first_homology_dimension: return "first_homology_dimension";
  }
  return "unknown";
}

int compare_scaled(SignedSum m1, Natural n1, SignedSum m2, Natural n2) noexcept {
  const int s1 = (m1 > 0) - (m1 < 0);
  const int s2 = (m2 > 0) - (m2 < 0);
  if (s1 != s2) return s1 < s2 ? -1 : 1;
  if (s1 == 0) return 0;
  // |m| without overflow at INT64_MIN.
  const std::uint64_t abs1 = m1 < 0 ? static_cast<std::uint64_t>(-(m1 + 1)) + 1 : static_cast<std::uint64_t>(m1);
  const std::uint64_t abs2 = m2 < 0 ? static_cast<std::uint64_t>(-(m2 + 1)) + 1 : static_cast<std::uint64_t>(m2);
  int magnitude = 0;
  constexpr std::uint64_t fast_limit = std::uint64_t{1} << 37;
  if (abs1 < fast_limit && abs2 < fast_limit) {
    // m^2 < 2^74 and n < 2^64 would overflow; n < 2^54 holds in the sieve range, and larger n
    // take the exact path below.
    if (n1 < (std::uint64_t{1} << 54) && n2 < (std::uint64_t{1} << 54)) {
      const WideUnsigned a = static_cast<WideUnsigned>(abs1) * abs1 * n2;
      const WideUnsigned b = static_cast<WideUnsigned>(abs2) * abs2 * n1;
      magnitude = (a > b) - (a < b);
      return s1 > 0 ? magnitude : -magnitude;
    }
  }
  using boost::multiprecision::uint256_t;
  const uint256_t a = uint256_t(abs1) * abs1 * n2;
  const uint256_t b = uint256_t(abs2) * abs2 * n1;
  magnitude = (a > b) - (a < b);
  return s1 > 0 ? magnitude : -magnitude;
}

EventDetector::EventDetector(const EventRecords& saved)
    : high_(saved.high),
      low_(saved.low),
      scaled_high_m_(saved.scaled_high_m),
      scaled_low_m_(saved.scaled_low_m),
      scaled_high_n_(saved.scaled_high_n),
      scaled_low_n_(saved.scaled_low_n),
      face_dims_seen_(saved.face_dims_seen),
      homology_dims_seen_(saved.homology_dims_seen) {
  // Same expression as observe(), so the restored doubles are bit-identical to the original ones.
  if (scaled_high_n_ > 0)
    scaled_high_ = static_cast<double>(scaled_high_m_) / std::sqrt(static_cast<double>(scaled_high_n_));
  if (scaled_low_n_ > 0)
    scaled_low_ = static_cast<double>(scaled_low_m_) / std::sqrt(static_cast<double>(scaled_low_n_));
}

EventRecords EventDetector::records() const noexcept {
  return {high_, low_, scaled_high_m_, scaled_low_m_, scaled_high_n_, scaled_low_n_, face_dims_seen_, homology_dims_seen_};
}

bool EventDetector::may_fire_in(const TrackerState& before, const BlockSummary& s) const {
  if (s.empty()) return false;
  if (s.lo <= 2) return true;  // initialisation at n = 1 and b_0 at n = 2
  const SignedSum m0 = before.mertens();
  const SignedSum block_high = m0 + s.prefix_high;
  const SignedSum block_low = m0 + s.prefix_low;
  if (block_low <= 0 && block_high >= 0) return true;
  if (block_high > high_ || block_low < low_) return true;
  const Natural last = s.hi - 1;
  if (last >= scaled_start) {
    if (s.lo <= scaled_start) return true;
    // Bounds of M(n)/sqrt(n) over the block from the bounds of M(n); a small slack keeps the
    // floating-point test conservative (the exact comparison happens in observe()).
    const double root_lo = std::sqrt(static_cast<double>(s.lo));
    const double root_hi = std::sqrt(static_cast<double>(last));
    const auto high = static_cast<double>(block_high);
    const auto low = static_cast<double>(block_low);
    const double upper = block_high >= 0 ? high / root_lo : high / root_hi;
    const double lower = block_low <= 0 ? low / root_lo : low / root_hi;
    constexpr double slack = 1e-9;
    if (upper >= scaled_high_ - slack || lower <= scaled_low_ + slack) return true;
  }
  for (int w = 1; w < config::omega_slots; ++w) {
    if (s.odd_squarefree[w] + s.even_squarefree[w] > 0 && !(face_dims_seen_ & (1U << (w - 1)))) return true;
    if (w >= 2 && s.odd_squarefree[w] > 0 && !(homology_dims_seen_ & (1U << (w - 1)))) return true;
  }
  return false;
}

}  // namespace sqfc::track
