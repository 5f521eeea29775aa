// SPDX-License-Identifier: MIT
// The identity suite: each identity of design.md section 2 by two independent routes over a range of n.
#include "sqfc/track/identity_suite.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <cstdint>
#include <exception>
#include <memory>
#include <mutex>
#include <thread>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/complex/face_neighbourhood.hpp"
#include "sqfc/complex/graph_enumeration.hpp"
#include "sqfc/complex/squarefree_vertices.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/linalg/bordered_green.hpp"
#include "sqfc/linalg/fredholm_checks.hpp"
#include "sqfc/linalg/green_closed_form.hpp"
#include "sqfc/linalg/spectrum.hpp"
#include "sqfc/topology/persistence.hpp"

namespace sqfc::track {
namespace {

constexpr int identity_count = 8;

// Sources, cited as in docs/math.md section 2.
constexpr const char* bjorner = "A. Bjorner, \"A cell complex in number theory\", Adv. Appl. Math. 46 (2011)";
constexpr const char* unimodularity = "unimodularity theorem for connection graphs of simplicial complexes (published 2016)";
constexpr const char* energy_theorem = "energy theorem for connection graphs (published 2017-2019)";
constexpr const char* spectrum_theorem = "inertia of connection graphs (published 2017); Sylvester's law of inertia for the pivots";
constexpr const char* green_star = "Green star formula g(x,y) = w(x) w(y) chi(St(x) & St(y)) (published), specialised in design.md identity 6";
constexpr const char* moebius = "classical, from Moebius inversion (G. H. Hardy and E. M. Wright, An Introduction to the Theory of Numbers, ch. XVI)";
constexpr const char* counting = "elementary counting (design.md identity 8): G_n edges at their upper end, H_n by inclusion-exclusion over common squarefree factors";

// The static description of one check.
struct CheckSpec {
  int identity;
  const char* name;
  const char* statement;
  const char* source;
  const char* routes;
};

const std::vector<CheckSpec>& check_specs() {
  static const std::vector<CheckSpec> specs = {
      {1, "euler_characteristic", "sum_d (-1)^d f_d(n) = sum_{2<=k<=n} -mu(k) = 1 - M(n)", bjorner,
       "f-vector of the table engine (segmented sieve) vs 1 - M(n) of the reference sieve (plain Eratosthenes)"},
      {2, "betti_persistence", "b_d(n) from the odd squarefree counts in (n/2, n] = bars of the filtration alive at n", bjorner,
       "Betti columns of the table engine vs direct persistent homology over Z/2 (column reduction of the boundary matrix)"},
      {2, "betti_odd_interval", "b~_d(n) = #{odd squarefree m in (n/2, n], omega(m) = d + 1}", bjorner,
       "Betti columns of the table engine vs the interval kept from the reference sieve"},
      {2, "betti0_odd_primes", "b_0(n) = 1 + #{odd primes in (n/2, n]} for n >= 2", bjorner,
       "b0 column of the table engine vs odd primes counted from the reference sieve"},
      {2, "mertens_odd_interval", "M(n) = sum of mu(m) over odd squarefree m in (n/2, n]", bjorner,
       "M(n) of the table engine vs the interval sum from the reference sieve"},
      {3, "fredholm_parity", "D(n) = prod_{2<=k<=n} -mu(k) = (-1)^((Q(n)+M(n))/2 - 1)", unimodularity,
       "fredholm column of the table engine vs the parity of Q(n) + M(n) from the reference sieve"},
      {3, "fredholm_flint", "det(1 + A(H_n)) = prod_{2<=k<=n} -mu(k)", unimodularity,
       "leading principal minors of 1 + A(H_n) by FLINT fraction-free elimination vs the product from the reference sieve"},
      {3, "fredholm_bordered", "det(1 + A(H_n)) = prod_{2<=k<=n} -mu(k)", unimodularity,
       "product of the Schur complements of the bordered exact inverse vs the product from the reference sieve"},
      {4, "energy_bordered", "sum of all entries of g_n = (1 + A(H_n))^-1 equals 1 - M(n)", energy_theorem,
       "entry sum of the bordered exact inverse (kept per step, and summed entry by entry at the last n) vs 1 - M(n) of the reference sieve"},
      {4, "energy_closed_form", "sum of all entries of g_n equals 1 - M(n)", energy_theorem,
       "entry sum from the closed-form Green statistics vs 1 - M(n) of the reference sieve"},
      {5, "inertia_pivots", "1 + A(H_n) has #even-dimensional faces positive and #odd-dimensional faces negative eigenvalues", spectrum_theorem,
       "signs of the bordering pivots (Sylvester) vs face counts by parity of omega from the reference sieve"},
      {5, "inertia_lapack", "1 + A(H_n) has #even-dimensional faces positive and #odd-dimensional faces negative eigenvalues, none zero", spectrum_theorem,
       "LAPACK eigenvalue signs with a verified backward-error margin vs face counts from the reference sieve"},
      {6, "green_closed_form", "g_n(x, y) = -mu(x) mu(y) mu(l) M_l(floor(n/l)) for l = lcm(x, y) <= n, else 0", green_star,
       "every entry of the bordered exact inverse vs the closed form"},
      {6, "green_inverse_certificate", "(1 + A(H_n)) g_n = I exactly", green_star,
       "integer product of 1 + A(H_n) with the bordered inverse vs the identity matrix"},
      {7, "mertens_divisor_sum", "sum_{d<=x} M(floor(x/d)) = 1", moebius,
       "M of the table engine summed over d (grouped by floor(x/d)) vs 1"},
      {7, "squarefree_formula", "Q(x) = sum_{d<=sqrt x} mu(d) floor(x/d^2)", moebius,
       "Q column of the table engine (running count) vs the divisor sum with mu of the reference sieve"},
      {7, "liouville_formula", "L(x) = sum_{d<=sqrt x} M(floor(x/d^2))", moebius,
       "L column of the table engine (running sum) vs the divisor sum with M of the reference sieve"},
      {7, "liouville_half_interval", "L(n) = sum of lambda(m) over m in (n/2, n] with an even power of 2", moebius,
       "L column of the table engine vs the interval sum from the reference sieve"},
      {8, "divisibility_edges", "edges(G_n) = sum_{2<=k<=n squarefree} (2^omega(k) - 2)", counting,
       "div_edges column of the table engine (formula) vs explicit enumeration of the pairs a | b"},
      {8, "shared_factor_edges", "edges(H_n) = sum_{d>=2 squarefree} -mu(d) C(S_d(n), 2)", counting,
       "inclusion-exclusion formula (squarefree counts without enumeration) vs explicit enumeration of the pairs with gcd > 1"},
  };
  return specs;
}

std::string decimal(Wide v) {
  if (v == 0) return "0";
  const bool negative = v < 0;
  WideUnsigned u = negative ? static_cast<WideUnsigned>(-(v + 1)) + 1 : static_cast<WideUnsigned>(v);
  std::string s;
  while (u) {
    s += static_cast<char>('0' + static_cast<int>(u % 10));
    u /= 10;
  }
  if (negative) s += '-';
  return {s.rbegin(), s.rend()};
}

std::string vector_text(const std::vector<SignedSum>& v) {
  std::string s = "[";
  for (std::size_t i = 0; i < v.size(); ++i) s += (i ? ", " : "") + std::to_string(v[i]);
  return s + "]";
}

// Records the comparisons of one check; applies the test corruption to the value under test.
class CheckRecorder {
 public:
  CheckRecorder(const CheckSpec& spec, const std::optional<IdentityCorruption>& corruption) {
    result_.identity = spec.identity;
    result_.name = spec.name;
    result_.statement = spec.statement;
    result_.source = spec.source;
    result_.routes = spec.routes;
    result_.from = 0;
    if (corruption && corruption->check == spec.name) corrupt_at_ = corruption->n;
  }
  void set_coverage(std::string coverage, bool reduced) {
    result_.coverage = std::move(coverage);
    result_.reduced_range = reduced;
  }
  /// One integer at n.
  void scalar(Natural n, Wide expected, Wide got) {
    if (n == corrupt_at_) got += 1;
    outcome(n, 1, expected == got, [&] { return decimal(expected); }, [&] { return decimal(got); });
  }
  /// One +-1 value at n (negated by the corruption).
  void sign(Natural n, int expected, int got) {
    if (n == corrupt_at_) got = -got;
    outcome(n, 1, expected == got, [&] { return std::to_string(expected); }, [&] { return std::to_string(got); });
  }
  /// A vector at n (the corruption adds 1 to its first component; only then is @p got copied).
  void vector(Natural n, const std::vector<SignedSum>& expected, const std::vector<SignedSum>& got) {
    if (n == corrupt_at_ && !got.empty()) {
      std::vector<SignedSum> changed = got;
      changed[0] += 1;
      outcome(n, expected.size(), expected == changed, [&] { return vector_text(expected); }, [&] { return vector_text(changed); });
      return;
    }
    outcome(n, expected.size(), expected == got, [&] { return vector_text(expected); }, [&] { return vector_text(got); });
  }
  /// A comparison made elsewhere (`count` values; texts describe the first difference).
  template <class Expected, class Got>
  void compared(Natural n, Count count, bool ok, Expected&& expected_text, Got&& got_text) {
    outcome(n, count, ok, expected_text, got_text);
  }
  [[nodiscard]] bool corrupts(Natural n) const noexcept { return n == corrupt_at_; }
  IdentityCheckResult take() { return std::move(result_); }

 private:
  template <class Expected, class Got>
  void outcome(Natural n, Count count, bool ok, Expected&& expected_text, Got&& got_text) {
    if (result_.points == 0) result_.from = n;
    result_.to = std::max(result_.to, n);
    ++result_.points;
    result_.compared += count;
    if (ok) return;
    if (result_.failed == 0) result_.first_failure = IdentityFailure{n, expected_text(), got_text()};
    ++result_.failed;
  }
  IdentityCheckResult result_;
  Natural corrupt_at_ = 0;  // 0: no corruption (no check visits n = 0)
};

// Reference arithmetic: a plain Eratosthenes sieve over every prime <= N, unsegmented, sharing
// no code with arith::SegmentedSieve (which works in cache blocks and detects the one prime
// above sqrt(n) by a log sum). One byte per n: bits 0-3 omega, bit 4 "has a square factor",
// bit 5 "Omega odd"; plus M(n) as 32-bit (|M(n)| < 2^31 for n <= 10^8).
class ReferenceSieve {
 public:
  explicit ReferenceSieve(Natural n) : bits_(n + 1, 0), mertens_(n + 1, 0) {
    for (Natural p = 2; p <= n; ++p) {
      if ((bits_[p] & 0x0F) != 0) continue;  // a smaller prime divides p
      for (Natural m = p; m <= n; m += p) ++bits_[m];  // omega; at most 8 distinct primes below 10^8
      for (Natural q = p;; q *= p) {
        for (Natural m = q; m <= n; m += q) bits_[m] ^= 0x20;
        if (q == p && q <= n / p)
          for (Natural m = q * p; m <= n; m += q * p) bits_[m] |= 0x10;
        if (q > n / p) break;
      }
    }
    for (Natural k = 1; k <= n; ++k) mertens_[k] = mertens_[k - 1] + mu(k);
  }
  [[nodiscard]] int omega(Natural k) const noexcept { return bits_[k] & 0x0F; }
  [[nodiscard]] bool squarefree(Natural k) const noexcept { return (bits_[k] & 0x10) == 0; }
  [[nodiscard]] int mu(Natural k) const noexcept { return squarefree(k) ? ((omega(k) & 1) ? -1 : 1) : 0; }
  [[nodiscard]] int lambda(Natural k) const noexcept { return (bits_[k] & 0x20) ? -1 : 1; }
  [[nodiscard]] bool prime(Natural k) const noexcept { return omega(k) == 1 && squarefree(k); }
  [[nodiscard]] SignedSum mertens(Natural k) const noexcept { return mertens_[k]; }

 private:
  std::vector<std::uint8_t> bits_;
  std::vector<std::int32_t> mertens_;
};

// Splits progress over stages of given weights.
class StagedProgress {
 public:
  // Progress is reported as a share of `scale` (the suite's --to), so a bar reads like the table's.
  StagedProgress(const ProgressFn& fn, Natural scale, std::vector<double> weights)
      : fn_(fn), scale_(scale), weights_(std::move(weights)) {
    for (double w : weights_) total_ += w;
  }
  void report(std::size_t stage, double fraction) {
    if (!fn_) return;
    double done = 0;
    for (std::size_t i = 0; i < stage && i < weights_.size(); ++i) done += weights_[i];
    if (stage < weights_.size()) done += weights_[stage] * std::clamp(fraction, 0.0, 1.0);
    fn_(static_cast<Natural>(done / total_ * static_cast<double>(scale_)), scale_);
  }

 private:
  const ProgressFn& fn_;
  Natural scale_;
  std::vector<double> weights_;
  double total_ = 0;
};

// Runs body(x) for x in [lo, hi] on `threads` threads in chunks; rethrows the first exception.
template <class Body>
void parallel_for(Natural lo, Natural hi, unsigned threads, Body&& body) {
  if (hi < lo) return;
  constexpr Natural chunk = 2048;
  std::atomic<Natural> next{lo};
  std::exception_ptr error;
  std::mutex error_mutex;
  auto worker = [&] {
    try {
      for (;;) {
        const Natural start = next.fetch_add(chunk);
        if (start > hi) break;
        const Natural end = std::min(hi, start + chunk - 1);
        for (Natural x = start; x <= end; ++x) body(x);
      }
    } catch (...) {
      std::lock_guard<std::mutex> lock(error_mutex);
      if (!error) error = std::current_exception();
    }
  };
  std::vector<std::thread> pool;
  for (unsigned t = 1; t < threads; ++t) pool.emplace_back(worker);
  worker();
  for (auto& t : pool) t.join();
  if (error) std::rethrow_exception(error);
}

std::string every_n(Natural from, Natural to) {
  return "every n in [" + std::to_string(from) + ", " + std::to_string(to) + "]";
}

// The sink of the engine run: stores M, Q, L and makes the per-n comparisons against the reference.
class SuiteSink final : public TableSink {
 public:
  struct Checks {
    CheckRecorder* euler = nullptr;
    CheckRecorder* betti_persistence = nullptr;
    CheckRecorder* betti_interval = nullptr;
    CheckRecorder* betti0 = nullptr;
    CheckRecorder* mertens_interval = nullptr;
    CheckRecorder* fredholm_parity = nullptr;
    CheckRecorder* liouville_half = nullptr;
    CheckRecorder* divisibility = nullptr;
  };
  struct BarEvent {
    Natural n;
    int dimension;
    int delta;
  };

  SuiteSink(const ReferenceSieve& reference, Natural to, int top, Checks checks, std::vector<BarEvent> bar_events,
            Natural persistence_to, std::vector<std::uint64_t> divisibility_edges, bool store_sums)
      : reference_(reference), top_(top), checks_(checks), bar_events_(std::move(bar_events)),
        persistence_to_(persistence_to), divisibility_edges_(std::move(divisibility_edges)),
        mertens_(store_sums ? to + 1 : 0, 0), squarefree_(store_sums ? to + 1 : 0, 0), liouville_(store_sums ? to + 1 : 0, 0),
        persistence_betti_(top + 1, 0),
        interval_(config::omega_slots, 0), engine_betti_(top + 1, 0), expected_betti_(top + 1, 0) {}

  void on_row(const TableRow& r) override {
    const Natural n = r.n;
    if (!mertens_.empty()) {
      mertens_[n] = static_cast<std::int32_t>(r.mertens);
      squarefree_[n] = static_cast<std::uint32_t>(r.squarefree);
      liouville_[n] = static_cast<std::int32_t>(r.liouville);
    }
    advance_reference(n);
    const SignedSum reference_mertens = reference_.mertens(n);
    for (int d = 0; d <= top_; ++d) engine_betti_[static_cast<std::size_t>(d)] = r.betti[static_cast<std::size_t>(d)];

    if (checks_.euler) {
      SignedSum alternating = 0;
      for (int d = 0; d < config::omega_slots; ++d)
        alternating += (d % 2 == 0 ? 1 : -1) * static_cast<SignedSum>(r.faces[static_cast<std::size_t>(d)]);
      checks_.euler->scalar(n, 1 - reference_mertens, alternating);
    }
    if (checks_.betti_persistence && n <= persistence_to_) {
      while (next_bar_ < bar_events_.size() && bar_events_[next_bar_].n <= n) {
        persistence_betti_[static_cast<std::size_t>(bar_events_[next_bar_].dimension)] += bar_events_[next_bar_].delta;
        ++next_bar_;
      }
      checks_.betti_persistence->vector(n, persistence_betti_, engine_betti_);
    }
    if (checks_.betti_interval) {
      // Unreduced: b_0 = reduced + 1 for the nonempty complex (n >= 2), and K_1 is empty.
      for (int d = 0; d <= top_; ++d) expected_betti_[static_cast<std::size_t>(d)] = interval_[static_cast<std::size_t>(d + 1)];
      if (n >= 2) expected_betti_[0] += 1;
      checks_.betti_interval->vector(n, expected_betti_, engine_betti_);
    }
    if (checks_.betti0 && n >= 2) checks_.betti0->scalar(n, 1 + odd_primes_, r.betti[0]);
    if (checks_.mertens_interval) checks_.mertens_interval->scalar(n, interval_mu_, r.mertens);
    if (checks_.fredholm_parity) {
      const SignedSum exponent = (static_cast<SignedSum>(reference_squarefree_) + reference_mertens) / 2 - 1;
      checks_.fredholm_parity->sign(n, exponent % 2 == 0 ? 1 : -1, r.fredholm);
    }
    if (checks_.liouville_half) checks_.liouville_half->scalar(n, half_liouville_, r.liouville);
    if (checks_.divisibility && n < divisibility_edges_.size())
      checks_.divisibility->scalar(n, static_cast<Wide>(divisibility_edges_[n]), static_cast<Wide>(r.div_edges));
  }
  void on_event(const Event&) override {}

  std::vector<std::int32_t>& mertens() { return mertens_; }
  std::vector<std::uint32_t>& squarefree() { return squarefree_; }
  std::vector<std::int32_t>& liouville() { return liouville_; }

 private:
  // The interval (n/2, n] moves from ((n-1)/2, n-1]: n enters; for even n, n/2 leaves.
  void advance_reference(Natural n) {
    if (reference_.squarefree(n)) ++reference_squarefree_;
    enter(n, +1);
    if (n % 2 == 0) enter(n / 2, -1);
  }
  void enter(Natural m, int delta) {
    if (m % 2 == 1 && reference_.squarefree(m)) {
      interval_[static_cast<std::size_t>(reference_.omega(m))] += delta;
      interval_mu_ += delta * reference_.mu(m);
      if (reference_.prime(m)) odd_primes_ += delta;
    }
    // Liouville over (n/2, n] restricted to m with an even power of 2.
    int twos = 0;
    for (Natural t = m; t % 2 == 0; t /= 2) ++twos;
    if (twos % 2 == 0) half_liouville_ += delta * reference_.lambda(m);
  }

  const ReferenceSieve& reference_;
  int top_;
  Checks checks_;
  std::vector<BarEvent> bar_events_;
  std::size_t next_bar_ = 0;
  Natural persistence_to_;
  std::vector<std::uint64_t> divisibility_edges_;
  std::vector<std::int32_t> mertens_;
  std::vector<std::uint32_t> squarefree_;
  std::vector<std::int32_t> liouville_;
  std::vector<SignedSum> persistence_betti_;
  std::vector<SignedSum> interval_;
  std::vector<SignedSum> engine_betti_, expected_betti_;  // per-row buffers, reused
  SignedSum interval_mu_ = 0, odd_primes_ = 0, half_liouville_ = 0;
  Count reference_squarefree_ = 0;
};

// The n at which the literal arithmetic formulas are evaluated: every n <= A, then `samples`
// evenly spaced n in (A, to], the last being `to`.
std::vector<Natural> arithmetic_points(Natural to, Natural every_to, Count samples) {
  std::vector<Natural> points;
  const Natural dense = std::min(to, every_to);
  for (Natural x = 1; x <= dense; ++x) points.push_back(x);
  if (to > dense && samples > 0) {
    const Natural span = to - dense;
    const Count count = std::min<Count>(samples, span);
    for (Count j = 1; j <= count; ++j) {
      const Natural x = dense + static_cast<Natural>((static_cast<WideUnsigned>(span) * j + count - 1) / count);
      if (x != points.back()) points.push_back(x);
    }
  }
  return points;
}

std::string sample_coverage(Natural to, Natural every_to, Count samples) {
  const Natural dense = std::min(to, every_to);
  std::string s = every_n(1, dense);
  if (to > dense) s += ", then " + std::to_string(std::min<Count>(samples, to - dense)) + " evenly spaced n in (" +
                       std::to_string(dense) + ", " + std::to_string(to) + "] ending at " + std::to_string(to);
  return s;
}

}  // namespace

bool IdentitySuiteReport::passed() const noexcept {
  if (!engine_checks_failed.empty()) return false;
  return std::all_of(checks.begin(), checks.end(), [](const IdentityCheckResult& c) { return c.failed == 0; });
}

std::string_view identity_short_name(int i) {
  static constexpr std::string_view names[] = {"euler", "betti", "unimodularity", "energy", "spectrum", "green", "arithmetic", "counts"};
  if (i < 1 || i > identity_count) throw InvalidArgument("identity number " + std::to_string(i) + " is outside 1..8");
  return names[i - 1];
}

std::string_view identity_title(int i) {
  static constexpr std::string_view titles[] = {"Euler characteristic", "Homotopy type and Betti numbers", "Unimodularity",
                                                "Energy", "Spectrum (inertia)", "Green function in closed form",
                                                "Arithmetic", "Edge counts"};
  if (i < 1 || i > identity_count) throw InvalidArgument("identity number " + std::to_string(i) + " is outside 1..8");
  return titles[i - 1];
}

std::vector<int> parse_identity_list(std::string_view text) {
  std::vector<int> list;
  std::size_t start = 0;
  while (start <= text.size()) {
    const auto end = std::min(text.find(',', start), text.size());
    const std::string item(text.substr(start, end - start));
    int found = 0;
    for (int i = 1; i <= identity_count; ++i)
      if (item == std::to_string(i) || item == identity_short_name(i)) found = i;
    if (found == 0)
      throw InvalidArgument("--only: unknown identity '" + item +
                            "' (use 1..8 or euler, betti, unimodularity, energy, spectrum, green, arithmetic, counts)");
    list.push_back(found);
    start = end + 1;
  }
  std::sort(list.begin(), list.end());
  list.erase(std::unique(list.begin(), list.end()), list.end());
  return list;
}

std::vector<std::string> identity_check_names(int i) {
  identity_short_name(i);  // validates i
  std::vector<std::string> names;
  for (const auto& s : check_specs())
    if (s.identity == i) names.emplace_back(s.name);
  return names;
}

IdentitySuiteReport run_identity_suite(const IdentitySuiteOptions& options, const ProgressFn& progress) {
  const Natural N = options.to;
  if (N < 1 || N > max_identity_suite_n)
    throw InvalidArgument("--to " + std::to_string(N) + " is outside the identity suite's range [1, 10^8]");
  if (options.threads < 1) throw InvalidArgument("--threads must be at least 1");
  std::vector<int> identities = options.identities;
  for (int i : identities) identity_short_name(i);
  if (identities.empty())
    for (int i = 1; i <= identity_count; ++i) identities.push_back(i);
  std::sort(identities.begin(), identities.end());
  identities.erase(std::unique(identities.begin(), identities.end()), identities.end());
  const auto selected = [&](int i) { return std::binary_search(identities.begin(), identities.end(), i); };
  if (options.corruption) {
    const auto& specs = check_specs();
    const auto spec = std::find_if(specs.begin(), specs.end(), [&](const CheckSpec& s) { return options.corruption->check == s.name; });
    if (spec == specs.end()) throw InvalidArgument("--inject-fault: unknown check '" + options.corruption->check + "'");
    // A fault in a check that does not run would let a mutation test pass for the wrong reason.
    if (!selected(spec->identity))
      throw InvalidArgument("--inject-fault: check '" + options.corruption->check + "' belongs to identity " +
                            std::to_string(spec->identity) + ", which is not selected");
  }
  const IdentitySuiteBounds& b = options.bounds;

  // One recorder per check of the selected identities, in the order of check_specs().
  std::vector<std::unique_ptr<CheckRecorder>> recorders;
  std::vector<CheckRecorder*> by_spec(check_specs().size(), nullptr);
  for (std::size_t i = 0; i < check_specs().size(); ++i)
    if (selected(check_specs()[i].identity)) {
      recorders.push_back(std::make_unique<CheckRecorder>(check_specs()[i], options.corruption));
      by_spec[i] = recorders.back().get();
    }
  // The recorder of a check, or nullptr when its identity is not selected.
  auto get = [&](std::string_view name) -> CheckRecorder* {
    for (std::size_t i = 0; i < check_specs().size(); ++i)
      if (name == check_specs()[i].name) return by_spec[i];
    throw InternalError("unknown identity check " + std::string(name));
  };

  StagedProgress staged(progress, N, {1, 1, 1, 4, 6, 3, 1, 1});
  const unsigned threads = options.threads;
  const int top = std::max(0, complex::max_face_dimension(N));

  // Stage 0: the reference sieve.
  staged.report(0, 0);
  const ReferenceSieve reference(N);

  // Stage 1: direct persistent homology, turned into birth/death events in n.
  staged.report(1, 0);
  const Natural persistence_to = std::min(N, b.persistence_to);
  std::vector<SuiteSink::BarEvent> bar_events;
  if (auto* c = get("betti_persistence")) {
    const auto result = topology::compute_persistence(persistence_to, topology::FaceFamily{}, 2);
    for (const auto& bar : result.bars) {
      if (bar.dimension > top) throw InternalError("persistence bar above the top face dimension");
      bar_events.push_back({bar.birth, bar.dimension, +1});
      if (bar.death != 0) bar_events.push_back({bar.death, bar.dimension, -1});
    }
    std::sort(bar_events.begin(), bar_events.end(), [](const auto& x, const auto& y) { return x.n < y.n; });
    c->set_coverage(every_n(1, persistence_to) + " (b_0..b_" + std::to_string(top) + ")", persistence_to < N);
  }

  // Stage 2: the divisibility edges, enumerated pair by pair and counted at their upper end b.
  staged.report(2, 0);
  const Natural divisibility_to = std::min(N, b.divisibility_enumeration_to);
  std::vector<std::uint64_t> divisibility_edges;
  if (auto* c = get("divisibility_edges")) {
    divisibility_edges.assign(divisibility_to + 1, 0);
    complex::for_each_divisibility_edge(divisibility_to, [&](std::span<const complex::GraphEdge> edges) {
      for (const auto& e : edges) ++divisibility_edges[e.b];
    });
    for (Natural n = 1; n <= divisibility_to; ++n) divisibility_edges[n] += divisibility_edges[n - 1];
    c->set_coverage(every_n(1, divisibility_to), divisibility_to < N);
  }

  // Stage 3: the table engine at every n, compared row by row.
  staged.report(3, 0);
  SuiteSink::Checks row_checks{get("euler_characteristic"), get("betti_persistence"), get("betti_odd_interval"),
                               get("betti0_odd_primes"), get("mertens_odd_interval"), get("fredholm_parity"),
                               get("liouville_half_interval"), get("divisibility_edges")};
  for (auto* c : {row_checks.euler, row_checks.betti_interval, row_checks.mertens_interval, row_checks.fredholm_parity,
                  row_checks.liouville_half})
    if (c) c->set_coverage(every_n(1, N), false);
  if (row_checks.betti_interval) row_checks.betti_interval->set_coverage(every_n(1, N) + " (b_0..b_" + std::to_string(top) + ")", false);
  if (row_checks.betti0) row_checks.betti0->set_coverage(every_n(2, N), false);
  // M, Q and L of the engine are kept (12 bytes per n) only for the divisor sums of identity 7.
  SuiteSink sink(reference, N, top, row_checks, std::move(bar_events), persistence_to, std::move(divisibility_edges),
                 selected(7));
  TableRunOptions run;
  run.to = N;
  run.threads = threads;
  run.samples = SampleSchedule(1, N, Natural{1}, {}, std::nullopt, true);
  run.self_checks = true;
  const TableRunReport engine = run_table(run, sink, [&](Natural done, Natural total) {
    staged.report(3, static_cast<double>(done) / static_cast<double>(total));
  });
  IdentitySuiteReport report;
  report.to = N;
  report.identities = identities;
  report.corruption = options.corruption;
  for (const auto& c : engine.checks)
    if (c.failed) report.engine_checks_failed.push_back(c.name);

  // Stage 4: the literal arithmetic formulas (identity 7), in parallel, then recorded in order.
  staged.report(4, 0);
  if (selected(7)) {
    const auto points = arithmetic_points(N, b.arithmetic_every_n_to, b.arithmetic_samples);
    std::vector<SignedSum> divisor_sum(points.size()), squarefree_sum(points.size()), liouville_sum(points.size());
    const auto& M = sink.mertens();
    auto evaluate = [&](Natural i) {
      const auto x = static_cast<std::uint32_t>(points[i]);  // x <= 10^8 < 2^32
      // Sum over d <= r = floor(sqrt x) directly; every larger d has q = floor(x/d) <= x/(r+1),
      // and the d > r with quotient q are the (max(x/(q+1), r), x/q]: about 2 sqrt(x) divisions.
      auto r = static_cast<std::uint32_t>(std::sqrt(static_cast<double>(x)));
      while (static_cast<std::uint64_t>(r) * r > x) --r;
      while (static_cast<std::uint64_t>(r + 1) * (r + 1) <= x) ++r;
      SignedSum f = 0;
      for (std::uint32_t d = 1; d <= r; ++d) f += M[x / d];
      const std::uint32_t q_max = x / (r + 1);
      std::uint32_t upper = x;  // floor(x/q) for the current q
      for (std::uint32_t q = 1; q <= q_max; ++q) {
        const std::uint32_t lower = std::max(x / (q + 1), r);
        f += static_cast<SignedSum>(upper - lower) * M[q];
        upper = x / (q + 1);
      }
      SignedSum s = 0, l = 0;
      for (std::uint32_t d = 1; static_cast<std::uint64_t>(d) * d <= x; ++d) {
        const std::uint32_t y = x / (d * d);
        s += reference.mu(d) * static_cast<SignedSum>(y);
        l += reference.mertens(y);
      }
      divisor_sum[i] = f;
      squarefree_sum[i] = s;
      liouville_sum[i] = l;
    };
    // The work per x grows as sqrt(x); batches of equal work let the progress move evenly.
    constexpr int batches = 16;
    std::size_t begin = 0;
    for (int k = 1; k <= batches; ++k) {
      const double share = std::pow(static_cast<double>(k) / batches, 2.0 / 3.0);
      std::size_t end = k == batches ? points.size() : static_cast<std::size_t>(share * static_cast<double>(points.size()));
      end = std::max(end, begin);
      if (end > begin) parallel_for(begin, end - 1, threads, evaluate);
      begin = end;
      staged.report(4, static_cast<double>(k) / batches);
    }
    const std::string coverage = sample_coverage(N, b.arithmetic_every_n_to, b.arithmetic_samples);
    const bool reduced = N > b.arithmetic_every_n_to;
    auto* mds = get("mertens_divisor_sum");
    auto* sqf = get("squarefree_formula");
    auto* liv = get("liouville_formula");
    mds->set_coverage(coverage, reduced);
    sqf->set_coverage(coverage, reduced);
    liv->set_coverage(coverage, reduced);
    for (std::size_t i = 0; i < points.size(); ++i) {
      const Natural x = points[i];
      mds->scalar(x, 1, divisor_sum[i]);
      sqf->scalar(x, squarefree_sum[i], sink.squarefree()[x]);
      liv->scalar(x, liouville_sum[i], sink.liouville()[x]);
    }
  }

  // Stage 5: the bordered exact inverse of 1 + A(H_n), one vertex at a time (identities 3-6).
  staged.report(5, 0);
  const Natural bordered_to = std::min(N, b.bordered_to);
  const Natural flint_to = std::min(N, b.flint_determinant_to);
  const Natural lapack_last = b.lapack_last_n <= N ? b.lapack_last_n : 0;
  const Natural vertices_to = std::max({bordered_to, flint_to, std::min(N, b.lapack_every_n_to), lapack_last});
  const auto vertices = complex::squarefree_vertices(vertices_to);
  const bool need_bordered = selected(3) || selected(4) || selected(5) || selected(6);
  const Natural closed_energy_to = selected(4) ? std::min(N, b.closed_energy_to) : 0;
  std::unique_ptr<linalg::GreenClosedForm> closed;
  if (selected(6) || closed_energy_to > 0) closed = std::make_unique<linalg::GreenClosedForm>(std::max(bordered_to, closed_energy_to));
  if (need_bordered) {
    auto* det = get("fredholm_bordered");
    auto* energy = get("energy_bordered");
    auto* pivots = get("inertia_pivots");
    auto* green = get("green_closed_form");
    auto* certificate = get("green_inverse_certificate");
    const bool reduced = bordered_to < N;
    for (auto* c : {det, energy, pivots})
      if (c) c->set_coverage(every_n(1, bordered_to), reduced);
    if (green) green->set_coverage("every entry, at every n in [2, " + std::to_string(std::min(bordered_to, b.green_every_n_to)) +
                                       "] and at n = " + std::to_string(bordered_to), reduced);
    if (certificate) certificate->set_coverage("n = " + std::to_string(bordered_to), reduced);
    std::size_t count = 0;
    while (count < vertices.size() && vertices[count] <= bordered_to) ++count;
    linalg::BorderedGreen g(count, ~std::uint64_t{0}, threads);
    int sign_product = 1;
    Count even_faces = 0, odd_faces = 0;
    for (Natural n = 1; n <= bordered_to; ++n) {
      if (n >= 2 && reference.squarefree(n)) {
        sign_product *= -reference.mu(n);
        (reference.omega(n) % 2 == 1 ? even_faces : odd_faces) += 1;
        g.add_vertex(complex::shared_factor_neighbours_below(vertices, g.size()));
      }
      if (det) det->sign(n, sign_product, g.determinant());
      if (pivots)
        pivots->vector(n, {static_cast<SignedSum>(even_faces), static_cast<SignedSum>(odd_faces)},
                       {static_cast<SignedSum>(g.positive_pivots()), static_cast<SignedSum>(g.negative_pivots())});
      const SignedSum chi = 1 - reference.mertens(n);
      if (energy) {
        if (n == bordered_to) {
          Wide explicit_sum = 0;
          for (std::size_t i = 0; i < g.size(); ++i)
            for (std::size_t j = 0; j < g.size(); ++j) explicit_sum += g.entry(i, j);
          energy->vector(n, {chi, chi}, {static_cast<SignedSum>(g.energy()), static_cast<SignedSum>(explicit_sum)});
        } else {
          energy->scalar(n, chi, g.energy());
        }
      }
      if (green && n >= 2 && (n <= b.green_every_n_to || n == bordered_to)) {
        const std::size_t v = g.size();
        bool ok = true;
        std::size_t bad_i = 0, bad_j = 0;
        std::int64_t bad_expected = 0, bad_got = 0;
        for (std::size_t i = 0; i < v && ok; ++i)
          for (std::size_t j = 0; j < v; ++j) {
            std::int64_t got = g.entry(i, j);
            if (i == 0 && j == 0 && green->corrupts(n)) got += 1;
            const std::int64_t expected = closed->entry_at(n, vertices[i], vertices[j]);
            if (got != expected) {
              ok = false;
              bad_i = i, bad_j = j, bad_expected = expected, bad_got = got;
              break;
            }
          }
        const auto where = [&] { return "g(" + std::to_string(vertices[bad_i]) + ", " + std::to_string(vertices[bad_j]) + ") = "; };
        green->compared(n, static_cast<Count>(v) * v, ok, [&] { return where() + std::to_string(bad_expected); },
                        [&] { return where() + std::to_string(bad_got); });
      }
      if (certificate && n == bordered_to) {
        const int certified = linalg::certify_inverse(vertices, g, threads) ? 1 : 0;
        certificate->scalar(n, 1, certified);
      }
      if ((n & 63) == 0) staged.report(5, std::pow(static_cast<double>(n) / static_cast<double>(bordered_to), 3.0));
    }
  }

  // Stage 6: FLINT minors (identity 3), LAPACK inertia (identity 5).
  staged.report(6, 0);
  if (auto* c = get("fredholm_flint")) {
    std::size_t count = 0;
    while (count < vertices.size() && vertices[count] <= flint_to) ++count;
    const auto minors = count == 0 ? std::vector<linalg::ExactInteger>{} : linalg::fredholm_determinants_of_prefixes_flint(vertices, count);
    c->set_coverage(every_n(1, flint_to), flint_to < N);
    int sign_product = 1;
    std::size_t k = 0;  // vertices in H_n
    for (Natural n = 1; n <= flint_to; ++n) {
      if (n >= 2 && reference.squarefree(n)) {
        sign_product *= -reference.mu(n);
        ++k;
      }
      linalg::ExactInteger d = k == 0 ? linalg::ExactInteger::of(1)
                                      : (k <= minors.size() ? minors[k - 1] : linalg::ExactInteger{"(no minor: elimination stopped)", {}});
      if (d.value && (*d.value == 1 || *d.value == -1)) {
        c->sign(n, sign_product, static_cast<int>(*d.value));
      } else {
        c->compared(n, 1, false, [&] { return std::to_string(sign_product); }, [&] { return d.decimal; });
      }
    }
  }
  if (auto* c = get("inertia_lapack")) {
    const Natural every_to = std::min(N, b.lapack_every_n_to);
    std::vector<Natural> points;
    for (Natural n = 2; n <= every_to; ++n) points.push_back(n);
    if (lapack_last > every_to) points.push_back(lapack_last);
    c->set_coverage(every_n(2, every_to) + (lapack_last > every_to ? " and n = " + std::to_string(lapack_last) : ""),
                    every_to < N);
    for (const Natural n : points) {
      std::size_t count = 0;
      Count even_faces = 0, odd_faces = 0;
      while (count < vertices.size() && vertices[count] <= n) {
        (reference.omega(vertices[count]) % 2 == 1 ? even_faces : odd_faces) += 1;
        ++count;
      }
      const auto signs = linalg::fredholm_spectrum_signs(vertices, count);
      c->vector(n, {static_cast<SignedSum>(even_faces), static_cast<SignedSum>(odd_faces), 1},
                {static_cast<SignedSum>(signs.positive), static_cast<SignedSum>(signs.negative), signs.verified ? 1 : 0});
    }
  }

  // Stage 7: closed-form energy (identity 4) and H_n edges (identity 8).
  staged.report(7, 0);
  if (auto* c = get("energy_closed_form"); c && closed_energy_to > 0) {
    std::vector<Natural> points;
    const Natural every_to = std::min(closed_energy_to, b.closed_energy_every_n_to);
    for (Natural n = 1; n <= every_to; ++n) points.push_back(n);
    if (closed_energy_to > every_to && b.closed_energy_samples > 0) {
      // Log-spaced above every_to, ending at closed_energy_to.
      const double ratio = std::log(static_cast<double>(closed_energy_to) / static_cast<double>(every_to));
      for (Count j = 1; j <= b.closed_energy_samples; ++j) {
        auto x = static_cast<Natural>(std::llround(static_cast<double>(every_to) *
                                                   std::exp(ratio * static_cast<double>(j) / static_cast<double>(b.closed_energy_samples))));
        x = std::min(std::max(x, points.back() + 1), closed_energy_to);
        if (j == b.closed_energy_samples) x = closed_energy_to;
        if (x > points.back()) points.push_back(x);
      }
    }
    c->set_coverage(every_n(1, every_to) + (closed_energy_to > every_to
                                                ? ", then " + std::to_string(points.size() - every_to) + " log-spaced n up to " +
                                                      std::to_string(closed_energy_to)
                                                : std::string()),
                    closed_energy_to < N || closed_energy_to > every_to);
    for (const Natural n : points) c->scalar(n, 1 - reference.mertens(n), closed->statistics_at(n).energy);
  }
  if (auto* c = get("shared_factor_edges")) {
    const Natural shared_to = std::min(N, b.shared_factor_to);
    std::vector<std::uint64_t> enumerated(shared_to + 1, 0);
    complex::for_each_shared_factor_edge(shared_to, [&](std::span<const complex::GraphEdge> edges) {
      for (const auto& e : edges) ++enumerated[e.b];
    });
    for (Natural n = 1; n <= shared_to; ++n) enumerated[n] += enumerated[n - 1];
    const complex::SquarefreeCounter counter(shared_to);
    c->set_coverage(every_n(1, shared_to), shared_to < N);
    std::vector<Count> formula(shared_to + 1, 0);
    parallel_for(1, shared_to, threads, [&](Natural n) { formula[n] = complex::count_shared_factor_edges_formula(counter, n); });
    for (Natural n = 1; n <= shared_to; ++n) c->scalar(n, static_cast<Wide>(enumerated[n]), static_cast<Wide>(formula[n]));
  }
  staged.report(8, 0);

  for (auto& r : recorders) report.checks.push_back(r->take());
  std::stable_sort(report.checks.begin(), report.checks.end(),
                   [](const IdentityCheckResult& x, const IdentityCheckResult& y) { return x.identity < y.identity; });
  return report;
}

}  // namespace sqfc::track
