// SPDX-License-Identifier: MIT
// The segmented, threaded mu sweep shared by the isolated M, L and Q (docs/algorithms/mertens-isolated.md).
#include "detail_mobius_sweep.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <cstring>
#include <exception>
#include <limits>
#include <mutex>
#include <string>
#include <thread>

#include "sqfc/arith/base_primes.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::arith::detail {
namespace {

// Values per segment: 16-bit sieve words (256 KiB) and the int32 table of M (512 KiB),
// so both stay in the 2 MiB L2 of the development machine while the lookups hit them.
constexpr std::size_t segment_length = std::size_t{1} << 17;
// Chunks per thread: a chunk is the unit a worker takes; more chunks balance the uneven
// lookup density (dense at small v) at the cost of one division pair per term per chunk.
constexpr Natural chunks_per_thread = 48;
constexpr std::uint32_t no_term = std::numeric_limits<std::uint32_t>::max();

// floor(x / n) for a quotient below 2^44, from one floating-point division and one
// correction: the double quotient is within 3 * 2^-53 relative of x/n, so its truncation is
// floor(x/n) or one off; r = x - q n (exact modulo 2^64, truly in (-n, 2n)) tells which.
inline Natural quotient_small(Natural x, double x_double, Natural n) noexcept {
  auto q = static_cast<Natural>(x_double / static_cast<double>(n));
  const auto r = static_cast<std::int64_t>(x - q * n);
  // Both corrections are rare (the double quotient is off only next to an integer), so the
  // branches predict well.
  if (r < 0) --q;
  else if (static_cast<Natural>(r) >= n) ++q;
  return q;
}

// floor(x / v) with a precomputed 1/v when v >= exact_from = floor(x / 2^50) + 1 (so the
// quotient is below 2^50 and the product within 3 * 2^-53 relative), hardware division below.
inline Natural quotient_by_inverse(Natural x, double x_double, Natural v, double inverse, Natural exact_from) noexcept {
  if (v < exact_from) return x / v;
  auto q = static_cast<Natural>(x_double * inverse);
  const auto r = static_cast<std::int64_t>(x - q * v);
  if (r < 0) --q;
  else if (static_cast<Natural>(r) >= v) ++q;
  return q;
}



// A mu-only segmented sieve, faster than SegmentedSieve because it keeps one 16-bit word per
// value: bits 0-11 the sum of round(64 log2 p) over the primes p found, bits 12-14 the number
// of squares p^2 found, bit 15 the parity of the number of primes (each prime adds 0x8000).
// Bounds: for n < 2^44 the log sum is at most 64 * 44 + 6 < 4096 and at most 7 squares divide
// n (the squares of the first 8 primes multiply to 9.4e13 > 2^44), so no field carries.
// After the primes p <= P = isqrt(hi - 1), a squarefree n is s * r with r = 1 or one prime
// r > P >= 1. With 12 primes at most the rounding error is at most 6 units of 1/64 bit, and
// r >= 2 lowers log2 s by a whole bit, so "log sum < 64 log2 n - 32" detects r exactly.
class MuSieveTables {
 public:
  explicit MuSieveTables(Natural max_n) {
    const auto root = integer_sqrt(max_n);
    for (const auto p : primes_up_to(root)) {
      if (p <= 13) continue;
      primes_.push_back(p);
      if (p < (1U << 14)) ++small_prime_count_;
      increments_.push_back(static_cast<std::uint16_t>(log_units(p) + 0x8000U));
    }
    for (const auto p : primes_up_to(root)) {
      if (p < 5) continue;
      squares_.push_back(static_cast<Natural>(p) * p);
    }
  }
  // The pattern does not depend on max_n: built once per process (thread-safe static init),
  // so that many small evaluations do not pay 360 KiB of set-up each.
  static const std::vector<std::uint16_t>& pattern() {
    static const std::vector<std::uint16_t> words = [] {
      std::vector<std::uint16_t> w(pattern_period, 0);
      for (const Natural p : {2ULL, 3ULL, 5ULL, 7ULL, 11ULL, 13ULL}) {
        const auto inc = static_cast<std::uint16_t>(log_units(p) + 0x8000U);
        for (Natural i = 0; i < pattern_period; i += p) w[i] = static_cast<std::uint16_t>(w[i] + inc);
      }
      for (const Natural q : {4ULL, 9ULL})
        for (Natural i = 0; i < pattern_period; i += q) w[i] = static_cast<std::uint16_t>(w[i] + 0x1000U);
      return w;
    }();
    return words;
  }
  // 4 * 9 * 5 * 7 * 11 * 13: the primes up to 13 and the squares 4 and 9 repeat with this period.
  static constexpr Natural pattern_period = 180180;
  static std::uint16_t log_units(Natural p) { return static_cast<std::uint16_t>(std::lround(64.0 * std::log2(static_cast<double>(p)))); }
  std::vector<std::uint32_t> primes_;
  std::size_t small_prime_count_ = 0;  // primes_ below 2^14, the L1 sub-block length
  std::vector<std::uint16_t> increments_;
  std::vector<Natural> squares_;
};

class MuSieve {
  static constexpr std::size_t sub_block = std::size_t{1} << 14;

  static std::int8_t mu_of_word(unsigned x, int threshold) {
    const unsigned large = static_cast<int>(x & 0xFFFU) < threshold ? 1U : 0U;
    const unsigned odd = (x >> 15) ^ large;
    return static_cast<std::int8_t>(((x >> 12) & 7U) != 0 ? 0 : (odd != 0 ? -1 : 1));
  }

 public:
  MuSieve(const MuSieveTables& tables, std::size_t block)
      : t_(tables), prime_offset_(tables.primes_.size()), square_offset_(tables.squares_.size()), words_(block) {}

  void reset(Natural lo) {
    lo_ = lo;
    for (std::size_t i = 0; i < t_.primes_.size(); ++i) {
      const Natural p = t_.primes_[i];
      prime_offset_[i] = static_cast<std::uint32_t>((p - lo % p) % p);
    }
    for (std::size_t i = 0; i < t_.squares_.size(); ++i) {
      const Natural q = t_.squares_[i];
      square_offset_[i] = (q - lo % q) % q;
    }
  }

  // mu(n) for n in [lo, lo + len) into out, then advances lo. Pre: len <= block, lo + len - 1 <= max_n.
  void next(std::size_t len, std::int8_t* out) {
    std::uint16_t* w = words_.data();
    std::size_t phase = static_cast<std::size_t>(lo_ % MuSieveTables::pattern_period);
    for (std::size_t done = 0; done < len;) {
      const std::size_t run = std::min<std::size_t>(len - done, MuSieveTables::pattern_period - phase);
      std::memcpy(w + done, MuSieveTables::pattern().data() + phase, run * sizeof(std::uint16_t));
      done += run;
      phase = 0;
    }
    const Natural hi = lo_ + len;
    // Primes below the L1 sub-block length sieve one 32 KiB sub-block at a time (their hits
    // then stay in L1), the larger ones the whole segment in one go.
    const std::size_t small_count = t_.small_prime_count_;
    for (std::size_t sub = 0; sub < len; sub += sub_block) {
      const std::size_t sub_end = std::min(len, sub + sub_block);
      for (std::size_t i = 0; i < small_count; ++i) {
        const std::uint32_t p = t_.primes_[i];
        const std::uint16_t inc = t_.increments_[i];
        std::size_t j = sub + prime_offset_[i];
        for (; j < sub_end; j += p) w[j] = static_cast<std::uint16_t>(w[j] + inc);
        prime_offset_[i] = static_cast<std::uint32_t>(j - sub_end);
      }
    }
    for (std::size_t i = small_count; i < t_.primes_.size(); ++i) {
      const std::uint32_t p = t_.primes_[i];
      const std::uint16_t inc = t_.increments_[i];
      std::size_t j = prime_offset_[i];
      for (; j < len; j += p) w[j] = static_cast<std::uint16_t>(w[j] + inc);
      prime_offset_[i] = static_cast<std::uint32_t>(j - len);
    }
    for (std::size_t i = 0; i < t_.squares_.size(); ++i) {
      const Natural q = t_.squares_[i];
      Natural j = square_offset_[i];
      for (; j < len; j += q) w[j] = static_cast<std::uint16_t>(w[j] + 0x1000U);
      square_offset_[i] = j - len;
    }
    // Thresholds 64 log2 n - 32: per n below 2^20, else per run of 2^12 values, over which
    // 64 log2 n grows by less than 0.4 units (the margin is 26 units either way).
    constexpr Natural exact_below = Natural{1} << 20;
    constexpr std::size_t run_length = std::size_t{1} << 12;
    std::size_t i = 0;
    for (; i < len && lo_ + i < exact_below; ++i) {
      const int threshold = static_cast<int>(std::floor(64.0 * std::log2(static_cast<double>(lo_ + i)) - 32.0));
      out[i] = mu_of_word(w[i], threshold);
    }
    while (i < len) {
      const std::size_t stop = std::min(len, i + run_length);
      const auto threshold = static_cast<std::uint16_t>(std::floor(64.0 * std::log2(static_cast<double>(lo_ + i)) - 32.0));
      // Branch-free so that the compiler vectorizes it.
      for (; i < stop; ++i) {
        const std::uint16_t x = w[i];
        const std::uint16_t odd = static_cast<std::uint16_t>((x >> 15) ^ ((x & 0xFFFU) < threshold ? 1U : 0U));
        const std::int8_t sign = static_cast<std::int8_t>(1 - 2 * odd);
        out[i] = (x & 0x7000U) != 0 ? std::int8_t{0} : sign;
      }
    }
    lo_ = hi;
  }

 private:
  const MuSieveTables& t_;
  std::vector<std::uint32_t> prime_offset_;
  std::vector<Natural> square_offset_;
  std::vector<std::uint16_t> words_;
  Natural lo_ = 1;
};

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
  // (Deléglise–Rivat 1996). Split T_m at t = max(isqrt(x/m), floor(u/m)): n <= t are lookups
  // (arguments >= t, < x/u <= limit); for n > t group by v = floor(x/(mn)) <= V = floor(xm/(t+1))
  // and sum by parts: sum_{v <= V} mu(v) floor(xm/v) - t M(V).
  add_point(u, 1, slot);
  for (Natural m = 1; m <= u; ++m) {
    const int mu_m = mu[static_cast<std::size_t>(m)];
    if (mu_m == 0) continue;
    Term term;
    term.xm = x / m;
    term.xm_double = static_cast<double>(term.xm);
    term.n_first = u / m + 1;
    term.n_last = std::max(integer_sqrt(term.xm), term.n_first - 1);
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

std::vector<Wide> MobiusSweep::run(unsigned threads, const std::function<void(double)>& progress) {
  if (threads < 1) throw InvalidArgument("thread count must be at least 1");
  const std::size_t slot_count = constants_.size();
  std::sort(points_.begin(), points_.end(), [](const Point& a, const Point& b) { return a.v < b.v; });
  std::sort(mu_terms_.begin(), mu_terms_.end(), [](const Term& a, const Term& b) { return a.v_max > b.v_max; });
  const Natural mu_range_end = mu_terms_.empty() ? 0 : mu_terms_.front().v_max + 1;

  // Chunks: multiples of the segment length, about chunks_per_thread per thread.
  const Natural range = limit_ - 1;  // values 1 .. limit - 1
  const Natural target_chunks = std::max<Natural>(1, chunks_per_thread * threads);
  Natural chunk_length = (range + target_chunks - 1) / target_chunks;
  chunk_length = std::max<Natural>(segment_length, (chunk_length + segment_length - 1) / segment_length * segment_length);
  const Natural chunk_count = (range + chunk_length - 1) / chunk_length;

  // Per chunk: the sum of mu over it and, per slot, the total weight of its M lookups; the
  // lookups read M relative to the chunk start, so the chunk's base M(A - 1) is added at the end.
  std::vector<SignedSum> chunk_mu(chunk_count, 0);
  std::vector<Wide> chunk_weight(chunk_count * slot_count, 0);

  const MuSieveTables tables(limit_ - 1);
  std::atomic<Natural> next_chunk{0};
  std::atomic<bool> failed{false};
  std::mutex mutex;  // guards totals, progress, first_error
  Natural chunks_done = 0;
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
      std::vector<std::uint32_t> link(lookup_terms_.size());
      std::vector<std::uint32_t> heads;
      std::vector<Wide> local(slot_count, 0);
      std::vector<Wide> weight(slot_count, 0);
      std::vector<SignedSum> seg_sum(slot_count), seg_count(slot_count);

      while (!failed.load(std::memory_order_relaxed)) {
        const Natural c = next_chunk.fetch_add(1);
        if (c >= chunk_count) break;
        const Natural chunk_lo = 1 + c * chunk_length;
        const Natural chunk_hi = std::min(limit_, chunk_lo + chunk_length);
        const std::size_t segments = static_cast<std::size_t>((chunk_hi - chunk_lo + segment_length - 1) / segment_length);
        heads.assign(segments, no_term);
        // Collected per worker and stored once per chunk: rows of neighbouring chunks share
        // cache lines, and writing them per segment from two threads thrashes.
        std::fill(weight.begin(), weight.end(), 0);

        // Each term joins the bucket of the segment holding its first lookup in the chunk:
        // the largest n <= n_last with floor(xm/n) >= chunk_lo.
        for (std::size_t j = 0; j < lookup_terms_.size(); ++j) {
          const Term& t = lookup_terms_[j];
          const Natural n_hi = std::min(t.n_last, t.xm / chunk_lo);
          const Natural n_lo = std::max(t.n_first, t.xm / chunk_hi + 1);
          if (n_hi < n_lo) continue;
          cur_n[j] = n_hi;
          next_v[j] = t.xm / n_hi;
          const auto s = static_cast<std::size_t>((next_v[j] - chunk_lo) / segment_length);
          link[j] = heads[s];
          heads[s] = static_cast<std::uint32_t>(j);
        }
        auto point = std::lower_bound(points_.begin(), points_.end(), chunk_lo, [](const Point& p, Natural v) { return p.v < v; });

        sieve.reset(chunk_lo);
        SignedSum base = 0;  // M(a - 1) - M(chunk_lo - 1)
        for (std::size_t s = 0; s < segments; ++s) {
          const Natural a = chunk_lo + s * segment_length;
          const auto len = static_cast<std::size_t>(std::min<Natural>(segment_length, chunk_hi - a));
          sieve.next(len, codes.data());
          const Natural b = a + len;
          std::int32_t running = 0;
          for (std::size_t i = 0; i < len; ++i) {
            running += codes[i];
            m_local[i] = running;
          }
          std::fill(seg_sum.begin(), seg_sum.end(), 0);
          std::fill(seg_count.begin(), seg_count.end(), 0);

          // Lookup ranges: walk n down while floor(xm/n) stays in this segment, then re-file.
          // Per term and segment at most len lookups of |M_local| <= len: the int64 sums hold.
          for (std::uint32_t j = heads[s]; j != no_term;) {
            const std::uint32_t after = link[j];
            const Term& t = lookup_terms_[j];
            Natural n = cur_n[j];
            Natural v = next_v[j];
            SignedSum sum = 0, count = 0;
            bool finished = false;
            for (;;) {
              sum += m_local[static_cast<std::size_t>(v - a)];
              ++count;
              if (n == t.n_first) {
                finished = true;
                break;
              }
              --n;
              v = quotient_small(t.xm, t.xm_double, n);
              if (v >= b) break;
            }
            seg_sum[t.slot] += t.sign * sum;
            seg_count[t.slot] += t.sign * count;
            if (!finished && v < chunk_hi) {
              cur_n[j] = n;
              next_v[j] = v;
              const auto next_s = static_cast<std::size_t>((v - chunk_lo) / segment_length);
              link[j] = heads[next_s];
              heads[next_s] = j;
            }
            j = after;
          }
          for (std::size_t k = 0; k < slot_count; ++k) {
            if (seg_count[k] == 0 && seg_sum[k] == 0) continue;
            local[k] += static_cast<Wide>(seg_sum[k]) + static_cast<Wide>(seg_count[k]) * base;
            weight[k] += seg_count[k];
          }

          // Mu-weighted quotient sums over v <= v_max, split by the sign of mu(v).
          if (a < mu_range_end) {
            plus_v.clear(), minus_v.clear(), plus_inv.clear(), minus_inv.clear();
            for (std::size_t i = 0; i < len; ++i) {
              const int mu = codes[i];
              if (mu == 0) continue;
              const Natural v = a + i;
              (mu > 0 ? plus_v : minus_v).push_back(v);
              (mu > 0 ? plus_inv : minus_inv).push_back(1.0 / static_cast<double>(v));
            }
            for (const Term& t : mu_terms_) {
              if (t.v_max < a) break;
              const Natural top = std::min(t.v_max, b - 1);
              WideUnsigned plus = 0, minus = 0;
              const Natural exact_from = (t.xm >> 50) + 1;
              for (std::size_t i = 0; i < plus_v.size() && plus_v[i] <= top; ++i)
                plus += quotient_by_inverse(t.xm, t.xm_double, plus_v[i], plus_inv[i], exact_from);
              for (std::size_t i = 0; i < minus_v.size() && minus_v[i] <= top; ++i)
                minus += quotient_by_inverse(t.xm, t.xm_double, minus_v[i], minus_inv[i], exact_from);
              const Wide net = static_cast<Wide>(plus) - static_cast<Wide>(minus);
              local[t.slot] += t.sign > 0 ? net : -net;
            }
          }

          // Points: weight * M(v), with M(v) = M(chunk_lo - 1) + base + m_local.
          for (; point != points_.end() && point->v < b; ++point) {
            const SignedSum m_here = base + m_local[static_cast<std::size_t>(point->v - a)];
            local[point->slot] += static_cast<Wide>(point->weight) * m_here;
            weight[point->slot] += point->weight;
          }
          base += running;
        }
        std::lock_guard<std::mutex> lock(mutex);
        chunk_mu[c] = base;
        std::copy(weight.begin(), weight.end(), chunk_weight.begin() + static_cast<std::ptrdiff_t>(c * slot_count));
        ++chunks_done;
        if (progress) progress(static_cast<double>(chunks_done) / static_cast<double>(chunk_count));
      }
      std::lock_guard<std::mutex> lock(mutex);
      for (std::size_t k = 0; k < slot_count; ++k) totals[k] += local[k];
    } catch (...) {
      std::lock_guard<std::mutex> lock(mutex);
      if (!first_error) first_error = std::current_exception();
      failed.store(true);
    }
  };

  const auto worker_count = static_cast<unsigned>(std::min<Natural>(threads, chunk_count));
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
  for (Natural c = 0; c < chunk_count; ++c) {
    for (std::size_t k = 0; k < slot_count; ++k) totals[k] += chunk_weight[c * slot_count + k] * chunk_base;
    chunk_base += chunk_mu[c];
  }
  return totals;
}

}  // namespace sqfc::arith::detail
