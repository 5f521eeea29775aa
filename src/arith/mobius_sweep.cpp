// SPDX-License-Identifier: MIT
// The segmented, threaded mu sweep shared by the isolated M, L and Q (docs/algorithms/mertens-isolated.md).
#include "detail_mobius_sweep.hpp"
#include "detail_mu_sieve.hpp"
#include "detail_sweep_kernels.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <cstring>
#include <exception>
#include <limits>
#include <mutex>
#include <string>
#include <thread>
#include <tuple>
#include <utility>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::arith::detail {
namespace {

constexpr std::size_t segment_length = sweep_segment_length;
constexpr std::uint32_t no_term = std::numeric_limits<std::uint32_t>::max();

}  // namespace

Natural integer_cbrt(Natural x) noexcept {
  auto r = static_cast<Natural>(std::cbrt(static_cast<double>(x)));
  // Correct the floating-point root; (r+1)^3 <= x is tested without overflow through division.
  auto cube_at_most = [x](Natural c) { return c == 0 || (c <= x / c && c * c <= x / c); };
  while (r > 0 && !cube_at_most(r)) --r;
  while (cube_at_most(r + 1)) ++r;
  return r;
}

std::vector<std::int8_t> mu_table(Natural n) {
  if (n > config::max_sieve_n) throw InvalidArgument("mu table bound " + std::to_string(n) + " is above 10^16");
  // Eratosthenes with sign flips: small (n is at most about 2 x^(1/3)), so no segmentation.
  std::vector<std::int8_t> mu(static_cast<std::size_t>(n) + 1, 1);
  std::vector<bool> composite(static_cast<std::size_t>(n) + 1, false);
  mu[0] = 0;
  for (Natural p = 2; p <= n; ++p) {
    if (composite[static_cast<std::size_t>(p)]) continue;
    for (Natural k = p; k <= n; k += p) {
      if (k > p) composite[static_cast<std::size_t>(k)] = true;
      mu[static_cast<std::size_t>(k)] = static_cast<std::int8_t>(-mu[static_cast<std::size_t>(k)]);
    }
    if (p <= n / p)
      for (Natural k = p * p; k <= n; k += p * p) mu[static_cast<std::size_t>(k)] = 0;
  }
  return mu;
}

MobiusSweep::MobiusSweep(Natural limit) : limit_(limit) {
  // limit <= 2^44 keeps every lookup quotient below 2^44, where quotient_small is exact.
  if (limit < 2 || limit > (Natural{1} << 44))
    throw InvalidArgument("sweep limit " + std::to_string(limit) + " is outside [2, 2^44]");
}

void MobiusSweep::set_lookup_share(double c) {
  if (!(c > 0 && c <= 4)) throw InvalidArgument("lookup share " + std::to_string(c) + " is outside (0, 4]");
  lookup_share_ = c;
}

std::uint32_t MobiusSweep::add_slot() {
  constants_.push_back(0);
  return static_cast<std::uint32_t>(constants_.size() - 1);
}

void MobiusSweep::add_point(Natural v, SignedSum weight, std::uint32_t slot) {
  if (v < 1 || v >= limit_)
    throw InvalidArgument("sweep point " + std::to_string(v) + " is outside [1, " + std::to_string(limit_) + ")");
  if (weight != 0) points_.push_back({v, weight, slot});
}

void MobiusSweep::add_constant(std::uint32_t slot, Wide value) { constants_.at(slot) += value; }

void MobiusSweep::add_mertens_target(Natural x, std::uint32_t slot, const std::vector<std::int8_t>& mu) {
  if (x < limit_) {
    add_point(x, 1, slot);
    return;
  }
  const Natural u = split_for(x);
  if (integer_sqrt(x) >= limit_ || u >= limit_ || mu.size() <= u)
    throw InvalidArgument("Mertens target " + std::to_string(x) + " needs a sweep limit above " +
                          std::to_string(std::max(integer_sqrt(x), u)));
  // M(x) = M(u) - sum_{m <= u} mu(m) T_m with T_m = sum_{u/m < n <= x/m} M(floor(x/(mn)))
  // (Deléglise–Rivat 1996). Split T_m at t = max(c isqrt(x/m), floor(u/m)): n <= t are lookups
  // (arguments > x/(m(t+1)), < x/u <= limit); for n > t group by v = floor(x/(mn)) <= V = floor(xm/(t+1))
  // and sum by parts: sum_{v <= V} mu(v) floor(xm/v) - t M(V).
  add_point(u, 1, slot);
  for (Natural m = 1; m <= u; ++m) {
    const int mu_m = mu[static_cast<std::size_t>(m)];
    if (mu_m == 0) continue;
    Term term;
    term.xm = x / m;
    term.xm_double = static_cast<double>(term.xm);
    term.n_first = u / m + 1;
    // t = c isqrt(X): a lookup costs about four times a grouped pair, so the balance point
    // lies below sqrt(X) (c = 1 would make both parts equally long).
    const auto scaled_root = static_cast<Natural>(lookup_share_ * static_cast<double>(integer_sqrt(term.xm)));
    term.n_last = std::max(scaled_root, term.n_first - 1);
    term.v_max = term.xm / (term.n_last + 1);
    term.slot = slot;
    term.sign = -mu_m;
    if (term.n_first <= term.n_last) lookup_terms_.push_back(term);
    if (term.v_max >= 1) {
      mu_terms_.push_back(term);
      // t * M(V) enters with sign +mu(m); t <= isqrt(x) < 2^32 fits the weight.
      add_point(term.v_max, static_cast<SignedSum>(mu_m) * static_cast<SignedSum>(term.n_last), slot);
    }
  }
}

namespace {

// Costs of the three kinds of work in nanoseconds, measured at x = 10^15 on the 2-core
// development machine (AVX-512 kernels): one sieved value (with its share of the bookkeeping),
// one lookup, one (term, squarefree v) pair of the grouped sums. They only steer the task
// plan; the result does not depend on them.
constexpr double cost_per_sieved_value = 1.4;
constexpr double cost_per_lookup = 0.9;
constexpr double cost_per_grouped_pair = 0.2;
// Tasks per thread: the plan cuts the work into about this many tasks of equal estimated cost
// per thread, so the last task to finish leaves the other threads idle only briefly.
constexpr double tasks_per_thread = 32;
// No task below this estimated cost (about a millisecond): each task sieves its chunk again
// and files every lookup term, which small sweeps must not pay many times.
constexpr double min_task_cost = 1.0e6;
// Grouped sums walk the squarefree v of a segment in blocks of this many entries (16 bytes
// each), so that the block stays in L1/L2 while every term passes over it.
constexpr std::size_t grouped_block = 2048;
// A lookup run this short is summed inline; longer runs go to the vector kernel.
constexpr Natural short_run = 4;

// One unit of work: a chunk of whole segments, and one of `groups` shares of its lookup terms
// and grouped terms (group 0 also takes the points and reports the chunk's mu total).
struct Task {
  std::uint32_t chunk = 0;
  std::uint32_t group = 0;
  std::uint32_t groups = 1;
  double cost = 0;
};

// Lookups with argument >= B for B on a geometric grid, from which the planner estimates the
// lookups of each segment (C is close to linear in 1/B between grid points, as the lookup
// density of each term is about X / v^2).
class LookupDensity {
 public:
  LookupDensity(const std::vector<MobiusSweep::Term>& terms, Natural limit) {
    for (double b = 1; b < static_cast<double>(limit) * 2; b *= ratio) grid_.push_back(b);
    counts_.assign(grid_.size(), 0);
    for (std::size_t i = 0; i < grid_.size(); ++i) {
      const double inverse = 1.0 / grid_[i];
      double total = 0;
      for (const auto& t : terms) {
        const double n_top = std::min(static_cast<double>(t.n_last), t.xm_double * inverse);
        total += std::max(0.0, std::floor(n_top) - static_cast<double>(t.n_first) + 1);
      }
      counts_[i] = total;
    }
  }
  // Estimated lookups with argument >= b.
  [[nodiscard]] double at_least(double b) const {
    if (grid_.empty() || b <= grid_.front()) return counts_.empty() ? 0 : counts_.front();
    const auto it = std::upper_bound(grid_.begin(), grid_.end(), b);
    if (it == grid_.end()) return counts_.back();
    const auto i = static_cast<std::size_t>(it - grid_.begin());
    const double w = (1.0 / grid_[i - 1] - 1.0 / b) / (1.0 / grid_[i - 1] - 1.0 / grid_[i]);
    return counts_[i - 1] + w * (counts_[i] - counts_[i - 1]);
  }

 private:
  static constexpr double ratio = 1.0905077326652577;  // 2^(1/8)
  std::vector<double> grid_, counts_;
};

}  // namespace

std::vector<Wide> MobiusSweep::run(unsigned threads, const std::function<void(double)>& progress) {
  if (threads < 1) throw InvalidArgument("thread count must be at least 1");
  const SweepKernels kernels = kernels_;
  const std::size_t slot_count = constants_.size();
  std::sort(points_.begin(), points_.end(), [](const Point& a, const Point& b) { return a.v < b.v; });
  std::sort(mu_terms_.begin(), mu_terms_.end(), [](const Term& a, const Term& b) { return a.v_max > b.v_max; });

  // --- Plan: estimated cost per segment, chunks of about equal cost, and a dense chunk
  // (a single segment costing several targets) split into groups of its terms.
  const Natural range = limit_ - 1;  // values 1 .. limit - 1
  const Natural segment_total = (range + segment_length - 1) / segment_length;
  std::vector<double> mu_v_prefix(mu_terms_.size() + 1, 0);  // prefix sums of v_max (sorted down)
  for (std::size_t j = 0; j < mu_terms_.size(); ++j) mu_v_prefix[j + 1] = mu_v_prefix[j] + static_cast<double>(mu_terms_[j].v_max);
  // The number of grouped terms with v_max >= v: a prefix of mu_terms_, sorted down by v_max.
  auto grouped_terms_reaching = [this](Natural v) {
    return static_cast<std::size_t>(
        std::partition_point(mu_terms_.begin(), mu_terms_.end(), [v](const Term& t) { return t.v_max >= v; }) - mu_terms_.begin());
  };
  // Squarefree pairs (term, v) of the grouped sums with v in [a, b), about 6/pi^2 of all pairs.
  auto grouped_pairs = [&](Natural a, Natural b) {
    if (mu_terms_.empty() || mu_terms_.front().v_max < a) return 0.0;
    const std::size_t full = grouped_terms_reaching(b - 1), partial = grouped_terms_reaching(a);
    const double pairs = static_cast<double>(full) * static_cast<double>(b - a) + (mu_v_prefix[partial] - mu_v_prefix[full]) -
                         static_cast<double>(partial - full) * static_cast<double>(a - 1);
    return 0.608 * pairs;
  };
  const LookupDensity density(lookup_terms_, limit_);
  std::vector<double> segment_cost(segment_total);
  double total_cost = 0;
  for (Natural s = 0; s < segment_total; ++s) {
    const Natural a = 1 + s * segment_length;
    const Natural b = std::min(limit_, a + segment_length);
    const double lookups = std::max(0.0, density.at_least(static_cast<double>(a)) - density.at_least(static_cast<double>(b)));
    segment_cost[s] = cost_per_sieved_value * static_cast<double>(b - a) + cost_per_lookup * lookups +
                      cost_per_grouped_pair * grouped_pairs(a, b);
    total_cost += segment_cost[s];
  }
  const double target = std::max(min_task_cost, total_cost / (tasks_per_thread * threads));
  std::vector<Natural> chunk_first_segment;
  std::vector<Task> tasks;
  {
    double acc = 0;
    Natural first = 0;
    for (Natural s = 0; s < segment_total; ++s) {
      acc += segment_cost[s];
      if (acc < target && s + 1 < segment_total) continue;
      const auto chunk = static_cast<std::uint32_t>(chunk_first_segment.size());
      chunk_first_segment.push_back(first);
      const auto groups = threads == 1 ? 1U : static_cast<std::uint32_t>(std::clamp(std::lround(acc / target), 1L, 4096L));
      for (std::uint32_t g = 0; g < groups; ++g) tasks.push_back({chunk, g, groups, acc / groups});
      acc = 0;
      first = s + 1;
    }
    chunk_first_segment.push_back(segment_total);
  }
  const std::size_t chunk_count = chunk_first_segment.size() - 1;
  // Largest first, so that the tail of the run is made of small tasks.
  std::stable_sort(tasks.begin(), tasks.end(), [](const Task& a, const Task& b) { return a.cost > b.cost; });

  // Per chunk: the sum of mu over it and, per slot, the total weight of its M lookups; the
  // lookups read M relative to the chunk start, so the chunk's base M(A - 1) is added at the end.
  std::vector<SignedSum> chunk_mu(chunk_count, 0);
  std::vector<Wide> chunk_weight(chunk_count * slot_count, 0);

  const MuSieveTables tables(limit_ - 1);
  std::atomic<std::size_t> next_task{0};
  std::atomic<bool> failed{false};
  std::mutex mutex;  // guards chunk_mu, chunk_weight, totals, progress, first_error
  double cost_done = 0;
  std::exception_ptr first_error;
  std::vector<Wide> totals(constants_);

  auto worker = [&]() {
    try {
      // Buffers sized to the range for small sweeps, so many small evaluations stay cheap.
      const auto buffer = static_cast<std::size_t>(std::min<Natural>(segment_length, range));
      MuSieve sieve(tables, buffer);
      std::vector<std::int8_t> codes(buffer);
      std::vector<std::int32_t> m_local(buffer);
      std::vector<Natural> plus_v, minus_v;
      std::vector<double> plus_inv, minus_inv;
      std::vector<Natural> cur_n(lookup_terms_.size()), next_v(lookup_terms_.size());
      std::vector<double> share(std::max(lookup_terms_.size(), mu_terms_.size()));
      std::vector<std::uint32_t> link(lookup_terms_.size());
      std::vector<std::uint32_t> heads;
      std::vector<Wide> local(slot_count, 0);
      std::vector<Wide> weight(slot_count, 0);
      std::vector<SignedSum> seg_sum(slot_count), seg_count(slot_count);

      // The part of items [0, count) that belongs to group g of `groups`: cut where the running
      // sum of the items' work passes g / groups of the total.
      auto group_range = [&](std::size_t count, std::uint32_t g, std::uint32_t groups) -> std::pair<std::size_t, std::size_t> {
        if (groups == 1) return {0, count};
        double total = 0;
        for (std::size_t j = 0; j < count; ++j) total += share[j];
        if (total <= 0) return g == 0 ? std::pair<std::size_t, std::size_t>{0, count} : std::pair<std::size_t, std::size_t>{0, 0};
        std::size_t lo = count, hi = count;
        double run = 0;
        for (std::size_t j = 0; j < count; ++j) {
          const auto owner = std::min<std::uint32_t>(groups - 1, static_cast<std::uint32_t>((run + share[j] / 2) / total * groups));
          run += share[j];
          if (owner == g && lo == count) lo = j;
          if (owner > g) {
            hi = j;
            break;
          }
        }
        if (lo == count) return {0, 0};
        return {lo, hi};
      };

      while (!failed.load(std::memory_order_relaxed)) {
        const std::size_t task_index = next_task.fetch_add(1);
        if (task_index >= tasks.size()) break;
        const Task task = tasks[task_index];
        const Natural chunk_lo = 1 + chunk_first_segment[task.chunk] * segment_length;
        const Natural chunk_hi = std::min(limit_, 1 + chunk_first_segment[task.chunk + 1] * segment_length);
        const std::size_t segments = static_cast<std::size_t>((chunk_hi - chunk_lo + segment_length - 1) / segment_length);
        heads.assign(segments, no_term);
        std::fill(weight.begin(), weight.end(), 0);

        // Lookup terms: n in [n_lo, n_hi] have floor(xm/n) in [chunk_lo, chunk_hi).
        auto chunk_n_range = [&](const Term& t) -> std::pair<Natural, Natural> {
          // n_hi = min(n_last, floor(xm / chunk_lo)), n_lo = max(n_first, floor(xm / chunk_hi) + 1),
          // compared in 128 bits first so that every division done has a quotient below 2^32.
          if (static_cast<WideUnsigned>(t.n_first) * chunk_lo > t.xm) return {1, 0};
          if (static_cast<WideUnsigned>(t.n_last) * chunk_hi <= t.xm) return {1, 0};
          const Natural n_hi = static_cast<WideUnsigned>(t.n_last) * chunk_lo <= t.xm ? t.n_last : t.xm / chunk_lo;
          const Natural n_lo = static_cast<WideUnsigned>(t.n_first) * chunk_hi > t.xm ? t.n_first : t.xm / chunk_hi + 1;
          return {n_lo, n_hi};
        };
        std::size_t look_lo = 0, look_hi = lookup_terms_.size();
        if (task.groups > 1) {
          for (std::size_t j = 0; j < lookup_terms_.size(); ++j) {
            const auto [n_lo, n_hi] = chunk_n_range(lookup_terms_[j]);
            share[j] = n_hi >= n_lo ? static_cast<double>(n_hi - n_lo + 1) + 8 : 0;
          }
          std::tie(look_lo, look_hi) = group_range(lookup_terms_.size(), task.group, task.groups);
        }
        // Each term joins the bucket of the segment holding its first lookup in the chunk.
        for (std::size_t j = look_lo; j < look_hi; ++j) {
          const Term& t = lookup_terms_[j];
          const auto [n_lo, n_hi] = chunk_n_range(t);
          if (n_hi < n_lo) continue;
          cur_n[j] = n_hi;
          next_v[j] = quotient_small(t.xm, t.xm_double, n_hi);
          const auto s = static_cast<std::size_t>((next_v[j] - chunk_lo) / segment_length);
          link[j] = heads[s];
          heads[s] = static_cast<std::uint32_t>(j);
        }
        const std::size_t mu_in_chunk = grouped_terms_reaching(chunk_lo);
        std::size_t mu_lo = 0, mu_hi = mu_in_chunk;
        if (task.groups > 1) {
          for (std::size_t j = 0; j < mu_in_chunk; ++j)
            share[j] = static_cast<double>(std::min(mu_terms_[j].v_max, chunk_hi - 1) - chunk_lo + 1);
          std::tie(mu_lo, mu_hi) = group_range(mu_in_chunk, task.group, task.groups);
        }
        const bool with_points = task.group == 0;
        auto point = std::lower_bound(points_.begin(), points_.end(), chunk_lo, [](const Point& p, Natural v) { return p.v < v; });

        sieve.reset(chunk_lo);
        SignedSum base = 0;  // M(a - 1) - M(chunk_lo - 1)
        for (std::size_t s = 0; s < segments; ++s) {
          const Natural a = chunk_lo + s * segment_length;
          const auto len = static_cast<std::size_t>(std::min<Natural>(segment_length, chunk_hi - a));
          sieve.next(len, codes.data());
          const Natural b = a + len;
          const std::int32_t running = prefix_sums(kernels, codes.data(), len, m_local.data());
          std::fill(seg_sum.begin(), seg_sum.end(), 0);
          std::fill(seg_count.begin(), seg_count.end(), 0);

          // Lookup runs: the n with floor(xm/n) in [a, b) are [max(n_first, floor(xm/b) + 1), cur_n];
          // sum them, then re-file the term at its next argument (>= b).
          // Per term and segment at most 2 len lookups of |M_local| <= len: the int64 sums hold.
          for (std::uint32_t j = heads[s]; j != no_term;) {
            const std::uint32_t after = link[j];
            const Term& t = lookup_terms_[j];
            const Natural n_high = cur_n[j];
            const Natural below = quotient_small(t.xm, t.xm_double, b);  // < n_high + 1 < 2^33
            const Natural n_low = std::max(t.n_first, below + 1);
            SignedSum sum = 0;
            if (n_high - n_low < short_run) {
              sum = m_local[static_cast<std::size_t>(next_v[j] - a)];
              for (Natural n = n_low; n < n_high; ++n) sum += m_local[static_cast<std::size_t>(quotient_small(t.xm, t.xm_double, n) - a)];
            } else {
              sum = lookup_run_sum(kernels, t.xm, t.xm_double, n_low, n_high, a, m_local.data());
            }
            seg_sum[t.slot] += t.sign * sum;
            seg_count[t.slot] += t.sign * static_cast<SignedSum>(n_high - n_low + 1);
            if (n_low > t.n_first) {
              const Natural n = n_low - 1;
              const Natural v = quotient_small(t.xm, t.xm_double, n);
              if (v < chunk_hi) {
                cur_n[j] = n;
                next_v[j] = v;
                const auto next_s = static_cast<std::size_t>((v - chunk_lo) / segment_length);
                link[j] = heads[next_s];
                heads[next_s] = j;
              }
            }
            j = after;
          }
          for (std::size_t k = 0; k < slot_count; ++k) {
            if (seg_count[k] == 0 && seg_sum[k] == 0) continue;
            local[k] += static_cast<Wide>(seg_sum[k]) + static_cast<Wide>(seg_count[k]) * base;
            weight[k] += seg_count[k];
          }

          // Mu-weighted quotient sums over v <= v_max, split by the sign of mu(v).
          if (mu_lo < mu_hi && mu_terms_[mu_lo].v_max >= a) {
            const Natural v_top = std::min(mu_terms_[mu_lo].v_max, b - 1);
            plus_v.clear(), minus_v.clear(), plus_inv.clear(), minus_inv.clear();
            for (std::size_t i = 0; i + a <= v_top; ++i) {
              const int mu = codes[i];
              if (mu == 0) continue;
              const Natural v = a + i;
              (mu > 0 ? plus_v : minus_v).push_back(v);
              (mu > 0 ? plus_inv : minus_inv).push_back(1.0 / static_cast<double>(v));
            }
            // Blocks of entries outside, terms inside: the block stays in cache for every term.
            auto add_signed_quotients = [&](const std::vector<Natural>& vs, const std::vector<double>& invs, bool negative) {
              for (std::size_t first = 0; first < vs.size(); first += grouped_block) {
                const std::size_t last = std::min(vs.size(), first + grouped_block);
                const Natural block_v0 = vs[first];
                for (std::size_t j = mu_lo; j < mu_hi; ++j) {
                  const Term& t = mu_terms_[j];
                  if (t.v_max < block_v0) break;  // sorted down: no later term reaches this block
                  const auto end = t.v_max >= vs[last - 1]
                                       ? last
                                       : static_cast<std::size_t>(std::upper_bound(vs.begin() + static_cast<std::ptrdiff_t>(first),
                                                                                   vs.begin() + static_cast<std::ptrdiff_t>(last), t.v_max) -
                                                                  vs.begin());
                  // Quotients of 2^48 or more (tiny v only) by hardware division, the rest by
                  // the inverse kernel, whose precondition is a quotient below 2^48.
                  const Natural exact_from = (t.xm >> 48) + 1;
                  std::size_t i = first;
                  WideUnsigned sum = 0;
                  for (; i < end && vs[i] < exact_from; ++i) sum += t.xm / vs[i];
                  if (i < end) sum += quotient_sum(kernels, t.xm, t.xm_double, vs.data() + i, invs.data() + i, end - i);
                  const bool subtract = (t.sign < 0) != negative;
                  local[t.slot] += subtract ? -static_cast<Wide>(sum) : static_cast<Wide>(sum);
                }
              }
            };
            add_signed_quotients(plus_v, plus_inv, false);
            add_signed_quotients(minus_v, minus_inv, true);
          }

          // Points: weight * M(v), with M(v) = M(chunk_lo - 1) + base + m_local.
          if (with_points) {
            for (; point != points_.end() && point->v < b; ++point) {
              const SignedSum m_here = base + m_local[static_cast<std::size_t>(point->v - a)];
              local[point->slot] += static_cast<Wide>(point->weight) * m_here;
              weight[point->slot] += point->weight;
            }
          }
          base += running;
        }
        std::lock_guard<std::mutex> lock(mutex);
        if (task.group == 0) chunk_mu[task.chunk] = base;
        for (std::size_t k = 0; k < slot_count; ++k) chunk_weight[task.chunk * slot_count + k] += weight[k];
        cost_done += task.cost;
        if (progress) progress(std::min(1.0, cost_done / total_cost));
      }
      std::lock_guard<std::mutex> lock(mutex);
      for (std::size_t k = 0; k < slot_count; ++k) totals[k] += local[k];
    } catch (...) {
      std::lock_guard<std::mutex> lock(mutex);
      if (!first_error) first_error = std::current_exception();
      failed.store(true);
    }
  };

  const auto worker_count = static_cast<unsigned>(std::min<std::size_t>(threads, tasks.size()));
  if (worker_count <= 1) {
    worker();
  } else {
    std::vector<std::thread> pool;
    pool.reserve(worker_count);
    for (unsigned t = 0; t < worker_count; ++t) pool.emplace_back(worker);
    for (auto& thread : pool) thread.join();
  }
  if (first_error) std::rethrow_exception(first_error);

  // Chunk bases in order: M(chunk_lo - 1) is the sum of mu over the chunks before it.
  SignedSum chunk_base = 0;
  for (std::size_t c = 0; c < chunk_count; ++c) {
    for (std::size_t k = 0; k < slot_count; ++k) totals[k] += chunk_weight[c * slot_count + k] * chunk_base;
    chunk_base += chunk_mu[c];
  }
  return totals;
}

}  // namespace sqfc::arith::detail
