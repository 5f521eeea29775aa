// SPDX-License-Identifier: MIT
// Sample points: multiples, explicit lists and log-spaced points.
#include "sqfc/track/sample_schedule.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include <flint/fmpz.h>

#include "sqfc/core/error.hpp"

namespace sqfc::track {
namespace {

// (2p + 1)^k compared with 2^k 10^e, exactly: sign of the first minus the second.
int compare_half_step(Natural p, bool plus, unsigned long k, unsigned long e) {
  fmpz_t left, right, ten;
  fmpz_init(left);
  fmpz_init(right);
  fmpz_init_set_ui(ten, 10);
  fmpz_set_ui(left, p);
  fmpz_mul_2exp(left, left, 1);
  if (plus) fmpz_add_ui(left, left, 1);
  else fmpz_sub_ui(left, left, 1);
  fmpz_pow_ui(left, left, k);
  fmpz_pow_ui(right, ten, e);
  fmpz_mul_2exp(right, right, k);
  const int c = fmpz_cmp(left, right);
  fmpz_clear(left);
  fmpz_clear(right);
  fmpz_clear(ten);
  return c;
}

// round(10^(e/k)) exactly (halves cannot occur: 10^(e/k) is an integer or irrational).
// The long double estimate is right unless it lies near a half-integer or is too large for
// 64-bit mantissa accuracy; then p is corrected until (2p-1)^k <= 2^k 10^e < (2p+1)^k.
Natural rounded_power_of_ten(unsigned long e, unsigned long k) {
  const long double x = std::pow(10.0L, static_cast<long double>(e) / static_cast<long double>(k));
  auto p = static_cast<Natural>(std::floor(x + 0.5L));
  const long double fraction = x - std::floor(x);
  if (x < 0x1p53L && std::fabs(fraction - 0.5L) > 0.25L) return p;
  for (int guard = 0; guard < 64 && compare_half_step(p, true, k, e) <= 0; ++guard) ++p;
  for (int guard = 0; guard < 64 && p > 0 && compare_half_step(p, false, k, e) > 0; ++guard) --p;
  return p;
}

}  // namespace

SampleSchedule::SampleSchedule(Natural from, Natural to, std::optional<Natural> every, std::vector<Natural> at,
                               std::optional<unsigned> per_decade, bool include_end)
    : from_(from), to_(to), every_(every) {
  if (from < 1 || to < from)
    throw InvalidArgument("sample range [" + std::to_string(from) + ", " + std::to_string(to) + "] is empty");
  if (every && *every < 1) throw InvalidArgument("--every must be at least 1");
  listed_ = std::move(at);
  if (per_decade) {
    const unsigned k = *per_decade;
    if (k < 1 || k > 1000) throw InvalidArgument("--log must be between 1 and 1000 points per decade");
    Natural power = 1;
    for (unsigned decade = 0;; ++decade) {
      // Points round(10^(decade + j/k)) for j in [0, k); the power of ten itself is exact.
      listed_.push_back(power);
      for (unsigned j = 1; j < k; ++j) {
        const long double x = std::pow(10.0L, static_cast<long double>(decade) + static_cast<long double>(j) / k);
        if (x > static_cast<long double>(to) + 1.0L) break;
        listed_.push_back(rounded_power_of_ten(static_cast<unsigned long>(decade) * k + j, k));
      }
      if (power > to / 10) break;
      power *= 10;
    }
  }
  if (include_end) listed_.push_back(to);
  std::erase_if(listed_, [&](Natural n) { return n < from || n > to; });
  std::sort(listed_.begin(), listed_.end());
  listed_.erase(std::unique(listed_.begin(), listed_.end()), listed_.end());
}

std::optional<Natural> SampleSchedule::next_at_or_after(Natural n) const {
  n = std::max(n, from_);
  if (n > to_) return std::nullopt;
  std::optional<Natural> best;
  if (every_) {
    const Natural e = *every_;
    const Natural m = (n % e == 0) ? n : n + (e - n % e);
    if (m <= to_ && m >= n) best = m;
  }
  const auto it = std::lower_bound(listed_.begin(), listed_.end(), n);
  if (it != listed_.end() && (!best || *it < *best)) best = *it;
  return best;
}

Count SampleSchedule::size() const {
  Count count = listed_.size();
  if (every_) {
    const Natural e = *every_;
    const Count multiples = to_ / e - (from_ - 1) / e;
    const auto in_list = std::count_if(listed_.begin(), listed_.end(), [&](Natural n) { return n % e == 0; });
    count += multiples - static_cast<Count>(in_list);
  }
  return count;
}

}  // namespace sqfc::track
