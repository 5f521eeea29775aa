// SPDX-License-Identifier: MIT
// Sample points: multiples, explicit lists and log-spaced points.
#include "sqfc/track/sample_schedule.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "sqfc/core/error.hpp"

namespace sqfc::track {

SampleSchedule::SampleSchedule(Natural from, Natural to, std::optional<Natural> every, std::vector<Natural> at,
                               std::optional<unsigned> per_decade, bool include_end)
    : from_(from), to_(to), every_(every) {
  if (from < 1 || to < from)
    throw InvalidArgument("sample range [" + std::to_string(from) + ", " + std::to_string(to) + "] is empty");
  if (every && *every < 1) throw InvalidArgument("--every must be at least 1");
  listed_ = std::move(at);
  if (per_decade) {
    const unsigned k = *per_decade;
    if (k < 1 || k > 1'000'000) throw InvalidArgument("--log must be between 1 and 10^6 points per decade");
    Natural power = 1;
    for (unsigned decade = 0;; ++decade) {
      // Points round(10^(decade + j/k)) for j in [0, k); the power of ten itself is exact.
      listed_.push_back(power);
      for (unsigned j = 1; j < k; ++j) {
        const long double x = std::pow(10.0L, static_cast<long double>(decade) + static_cast<long double>(j) / k);
        if (x > static_cast<long double>(to)) break;
        listed_.push_back(static_cast<Natural>(std::llround(x)));
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
