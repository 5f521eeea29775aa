// SPDX-License-Identifier: MIT
// Squarefree k <= x by omega(k), by recursion over prime prefixes with a table of pi at the
// quotients of x (docs/algorithms/omega-counting.md). Only odd counts are enumerated, at x and at
// floor(x/2): the even squarefree k <= x are 2j with j odd squarefree <= x/2, so the two odd
// enumerations give the full counts and the Betti numbers of K_x from one table.
#include "sqfc/arith/omega_counting.hpp"

#include <algorithm>
#include <array>
#include <atomic>
#include <cmath>
#include <exception>
#include <mutex>
#include <string>
#include <thread>

#include "sqfc/arith/prime_counting.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::arith {
namespace {

using OmegaArray = std::array<std::uint64_t, config::omega_slots + 1>;

// A run of siblings: the prefixes P * primes[j], j in [j_lo, j_hi), of the odd squarefree numbers
// counted at y = floor(x / scale), each with its whole subtree of extensions.
struct SiblingTask {
  Natural scale;   // 1 (counts at x) or 2 (counts at floor(x/2))
  Natural prefix;  // P, the product of the primes before primes[j] (odd, squarefree; 1 at the top)
  unsigned depth;  // number of primes in P
  std::uint32_t j_lo;
  std::uint32_t j_hi;
};

// Children of one task batch: enough to amortize the task hand-off, few enough that the first
// (largest) batches do not leave a thread idle at the end.
constexpr std::uint32_t siblings_per_task = 64;

// Below this x the enumeration takes microseconds and runs on the calling thread alone.
constexpr Natural small_x_single_thread = Natural{1} << 22;

class OddPrefixCounter {
 public:
  OddPrefixCounter(const PrimeCountTable& table) : table_(table), primes_(table.primes()), x_(table.x()) {}

  // First index past the children of prefix P (last prime index i) at scale c: children are the
  // primes p_j, j > i, with P * p_j^2 <= floor(x/c), the ones that leave room for a last prime above p_j.
  [[nodiscard]] std::uint32_t children_end(Natural scale, Natural prefix, std::uint32_t first) const {
    const Natural limit = x_ / (scale * prefix);
    std::uint32_t j = first;
    while (j < primes_.size() && Natural{primes_[j]} * primes_[j] <= limit) ++j;
    return j;
  }

  // Adds the odd squarefree P * p_j * (more primes) <= x/scale for j in [j_lo, j_hi) to out.
  void count_siblings(Natural scale, Natural prefix, unsigned depth, std::uint32_t j_lo, std::uint32_t j_hi,
                      OmegaArray& out) const {
    const Natural y = x_ / (scale * prefix);  // floor(x / (scale * P))
    std::uint32_t j = j_lo;
    // Siblings with children of their own. P * p_j * p_(j+1)^2 grows with j, so once a sibling
    // has no children, none of the later ones has.
    for (; j < j_hi; ++j) {
      const Natural q = prefix * primes_[j];
      // Last primes r > p_j with q * r <= x/scale: pi(floor(x / (scale * q))) - pi(p_j).
      out[depth + 2] += table_.pi_of_quotient(scale * q) - (j + 1);
      if (j + 1 >= primes_.size() || Natural{primes_[j + 1]} * primes_[j + 1] > y / primes_[j]) {
        ++j;
        break;
      }
      count_siblings(scale, q, depth + 1, j + 1, children_end(scale, q, j + 1), out);
    }
    // The leaves: sum of pi(floor(y / p_j)) - (j + 1). While scale * P * p_j <= large_count the
    // table holds the value by index; past it, floor(y / p_j) <= sqrt(x) is a small entry.
    Natural sum = 0;
    const Natural by_index_below = table_.large_count() / (scale * prefix);  // p_j <= this: by index
    for (; j < j_hi && primes_[j] <= by_index_below; ++j) sum += table_.pi_of_quotient(scale * prefix * primes_[j]) - (j + 1);
    // floor(y / p) by a double division and one correction: y < 2^53, quotient <= sqrt(x).
    const auto y_double = static_cast<double>(y);
    for (; j < j_hi; ++j) {
      const Natural p = primes_[j];
      auto v = static_cast<Natural>(y_double / static_cast<double>(p));
      if (v * p > y) --v;
      else if ((v + 1) * p <= y) ++v;
      sum += table_.pi_small(v) - (j + 1);
    }
    out[depth + 2] += sum;
  }

 private:
  const PrimeCountTable& table_;
  const std::vector<std::uint32_t>& primes_;
  Natural x_;
};

// Walks the prefixes with scale * P * p_j <= threshold on the calling thread (their own counts go
// straight into out) and cuts every run of lighter siblings into tasks.
void plan_tasks(const OddPrefixCounter& counter, const PrimeCountTable& table, Natural scale, Natural prefix,
                unsigned depth, std::uint32_t first, Natural threshold, OmegaArray& out,
                std::vector<SiblingTask>& tasks) {
  const auto& primes = table.primes();
  const std::uint32_t end = counter.children_end(scale, prefix, first);
  std::uint32_t j = first;
  for (; j < end && scale * prefix * primes[j] <= threshold; ++j) {
    const Natural q = prefix * primes[j];
    out[depth + 2] += table.pi_of_quotient(scale * q) - (j + 1);
    plan_tasks(counter, table, scale, q, depth + 1, j + 1, threshold, out, tasks);
  }
  for (; j < end; j += siblings_per_task)
    tasks.push_back({scale, prefix, depth, j, std::min<std::uint32_t>(end, j + siblings_per_task)});
}

// Largest m with the product of the first m primes <= x.
std::size_t max_omega(Natural x) {
  static constexpr std::array<Natural, 16> primes = {2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53};
  std::size_t m = 0;
  Natural product = 1;
  while (m < primes.size() && product <= x / primes[m]) product *= primes[m++];
  return m;
}

}  // namespace

OmegaCounts count_by_omega(std::uint64_t x, unsigned threads) { return count_by_omega(x, threads, CountProgressFn{}); }

OmegaCounts count_by_omega(std::uint64_t x, unsigned threads, const CountProgressFn& progress) {
  if (x < 1) throw InvalidArgument("counting squarefree integers by omega needs x >= 1");
  if (x > max_omega_counting_x)
    throw InvalidArgument("counting squarefree integers by omega is verified only up to x = 10^14, got " +
                          std::to_string(x));
  if (threads < 1) throw InvalidArgument("thread count must be at least 1");

  // Progress in thousandths: the table to 600 (it takes about 60 % of the time at 10^12-10^14,
  // 2-core Xeon KVM, 2026-12), the recursion to 1000.
  constexpr Natural progress_total = 1000;
  constexpr Natural progress_table = 600;
  Natural reported = 0;
  auto report = [&](Natural value) {
    if (progress && value > reported) progress(reported = value, progress_total);
  };
  CountProgressFn table_progress;
  if (progress)
    table_progress = [&](Natural done, Natural total) { report(total ? done * progress_table / total : 0); };
  const PrimeCountTable table(x, threads, table_progress);
  report(progress_table);
  const OddPrefixCounter counter(table);
  // odd[s - 1][m]: odd squarefree k <= floor(x/s) with omega(k) = m, s = 1, 2.
  std::array<OmegaArray, 2> odd{};
  std::vector<SiblingTask> tasks;
  // Prefixes with scale * P <= x^0.4 are few (about x^0.4) and carry the heavy subtrees; they are
  // planned here so that every task left is light (its subtrees count below floor(x^0.6)).
  const Natural threshold = static_cast<Natural>(std::pow(static_cast<double>(x), 0.4)) + 1;
  for (Natural scale = 1; scale <= 2; ++scale) {
    const Natural y = x / scale;
    OmegaArray& out = odd[scale - 1];
    if (y >= 1) out[0] = 1;                                             // k = 1
    if (y >= 3) out[1] = table.pi_of_quotient(scale) - 1;               // odd primes <= y
    plan_tasks(counter, table, scale, 1, 0, 1, threshold, out, tasks);  // index 1: the prime 3
  }
  // Heaviest first (smallest scale * P * p_j_lo), so the tail of the run is made of small tasks.
  std::stable_sort(tasks.begin(), tasks.end(), [&](const SiblingTask& a, const SiblingTask& b) {
    return a.scale * a.prefix * table.primes()[a.j_lo] < b.scale * b.prefix * table.primes()[b.j_lo];
  });

  // Below small_x_single_thread the whole enumeration is shorter than starting a thread.
  const unsigned workers = x < small_x_single_thread
                               ? 1U
                               : static_cast<unsigned>(std::max<std::size_t>(1, std::min<std::size_t>(threads, tasks.size())));
  std::vector<std::array<OmegaArray, 2>> partial(workers, std::array<OmegaArray, 2>{});
  std::atomic<std::size_t> next{0};
  std::atomic<bool> stop{false};
  auto run = [&](unsigned w) {
    for (std::size_t t = next.fetch_add(1); t < tasks.size() && !stop.load(std::memory_order_relaxed);
         t = next.fetch_add(1)) {
      const SiblingTask& task = tasks[t];
      counter.count_siblings(task.scale, task.prefix, task.depth, task.j_lo, task.j_hi, partial[w][task.scale - 1]);
      // Only the calling thread reports, so progress is never called concurrently.
      if (w == 0) report(progress_table + (progress_total - progress_table) * std::min(t + 1, tasks.size()) / std::max<std::size_t>(1, tasks.size()));
    }
  };
  if (workers == 1) {
    run(0);
  } else {
    std::vector<std::thread> pool;
    pool.reserve(workers - 1);
    for (unsigned w = 1; w < workers; ++w) pool.emplace_back(run, w);
    std::exception_ptr error;
    try {
      run(0);
    } catch (...) {
      // A throwing progress callback: stop the others, then rethrow.
      error = std::current_exception();
      stop.store(true);
    }
    for (auto& thread : pool) thread.join();
    if (error) std::rethrow_exception(error);
  }
  report(progress_total);
  for (const auto& p : partial)
    for (std::size_t s = 0; s < 2; ++s)
      for (std::size_t m = 0; m < odd[s].size(); ++m) odd[s][m] += p[s][m];

  const std::size_t length = max_omega(x) + 1;
  OmegaCounts counts;
  counts.squarefree_by_omega.assign(length, 0);
  counts.odd_squarefree_by_omega.assign(length, 0);
  for (std::size_t m = 0; m < length; ++m) {
    counts.odd_squarefree_by_omega[m] = odd[0][m];
    // Even k = 2j, j odd squarefree <= floor(x/2) with omega(j) = m - 1.
    counts.squarefree_by_omega[m] = odd[0][m] + (m >= 1 ? odd[1][m - 1] : 0);
  }
  // Nothing may sit beyond the length: that would mean a wrong max_omega.
  for (std::size_t m = length; m < odd[0].size(); ++m)
    if (odd[0][m] != 0 || odd[1][m - 1] != 0) throw InternalError("omega count beyond the largest possible omega");
  return counts;
}

std::vector<std::uint64_t> odd_upper_half_by_omega(const OmegaCounts& counts) {
  const std::size_t length = counts.odd_squarefree_by_omega.size();
  std::vector<std::uint64_t> upper(length, 0);
  for (std::size_t m = 0; m < length; ++m) {
    // Odd squarefree <= x/2 with omega m = even squarefree <= x with omega m + 1.
    const std::uint64_t at_half =
        m + 1 < length ? counts.squarefree_by_omega[m + 1] - counts.odd_squarefree_by_omega[m + 1] : 0;
    upper[m] = counts.odd_squarefree_by_omega[m] - at_half;
  }
  return upper;
}

}  // namespace sqfc::arith
