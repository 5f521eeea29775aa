// SPDX-License-Identifier: MIT
// Sequence names and their evaluation at requested indices through one run of the table engine.
#include "sqfc/track/sequence_terms.hpp"

#include <algorithm>
#include <charconv>
#include <optional>

#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::track {
namespace {

using Kind = Sequence::Kind;

struct Named {
  std::string_view name;
  Kind kind;
};
constexpr Named named_sequences[] = {
    {"mertens", Kind::mertens},         {"mertens_pow10", Kind::mertens_pow10},
    {"mertens_pow2", Kind::mertens_pow2}, {"mertens_zeros", Kind::mertens_zeros},
    {"squarefree", Kind::squarefree},   {"squarefree_pow10", Kind::squarefree_pow10},
    {"liouville", Kind::liouville},
};

// base^k when it is at most `limit`, otherwise nullopt (no overflow: the loop stops at limit).
std::optional<Natural> power_within(Natural base, std::int64_t k, Natural limit) {
  Natural x = 1;
  for (std::int64_t i = 0; i < k; ++i) {
    if (x > limit / base) return std::nullopt;
    x *= base;
  }
  return x <= limit ? std::optional<Natural>(x) : std::nullopt;
}

SignedSum row_value(const Sequence& s, const TableRow& row) {
  switch (s.kind) {
    case Kind::mertens:
    case Kind::mertens_pow10:
    case Kind::mertens_pow2: return row.mertens;
    case Kind::squarefree:
    case Kind::squarefree_pow10: return static_cast<SignedSum>(row.squarefree);
    case Kind::liouville: return row.liouville;
    case Kind::faces: return static_cast<SignedSum>(row.faces[static_cast<std::size_t>(s.dimension)]);
    case Kind::betti: return row.betti[static_cast<std::size_t>(s.dimension)];
    case Kind::mertens_zeros: break;
  }
  throw InternalError("row_value: zeros are not a row column");
}

// The engine's own identity checks ran on every sampled row; a failure is a bug, not a mismatch.
void require_checks(const TableRunReport& report) {
  for (const auto& c : report.checks)
    if (c.failed)
      throw InternalError("engine self-check " + c.name + " failed at n = " + std::to_string(c.first_failure));
}

class RowCollector : public TableSink {
 public:
  explicit RowCollector(const Sequence& s) : sequence_(s) {}
  void on_row(const TableRow& row) override { values_.emplace_back(row.n, row_value(sequence_, row)); }
  void on_event(const Event&) override {}
  [[nodiscard]] const std::vector<std::pair<Natural, SignedSum>>& values() const { return values_; }

 private:
  const Sequence& sequence_;
  std::vector<std::pair<Natural, SignedSum>> values_;  // increasing n: rows arrive in order
};

// Thrown by ZeroCollector to end the run once enough zeros are known; caught right around run_table.
struct EnoughZeros {};

class ZeroCollector : public TableSink {
 public:
  explicit ZeroCollector(Count wanted) : wanted_(wanted) {}
  void on_row(const TableRow&) override {}
  void on_event(const Event& e) override {
    if (e.kind != EventKind::mertens_zero) return;
    zeros_.push_back(e.n);
    if (zeros_.size() >= wanted_) throw EnoughZeros{};
  }
  [[nodiscard]] const std::vector<Natural>& zeros() const { return zeros_; }

 private:
  Count wanted_;
  std::vector<Natural> zeros_;
};

TableRunOptions base_options(Natural to, unsigned threads) {
  TableRunOptions o;
  o.from = 1;
  o.to = to;
  o.threads = threads;
  o.segment_size = std::max<Natural>(config::default_segment_size, o.block_size);
  return o;
}

std::vector<TermValue> evaluate_zeros(const std::vector<std::int64_t>& indices, Natural limit, unsigned threads,
                                      const ProgressFn& progress) {
  std::int64_t wanted = 0;
  for (const auto k : indices) wanted = std::max(wanted, k);
  ZeroCollector sink(static_cast<Count>(std::max<std::int64_t>(wanted, 0)));
  if (wanted >= 1) {
    TableRunOptions o = base_options(limit, threads);
    o.events = true;
    try {
      require_checks(run_table(o, sink, progress));
    } catch (const EnoughZeros&) {
      // Stopped early on purpose: every requested zero is known.
    }
  }
  std::vector<TermValue> out;
  out.reserve(indices.size());
  for (const auto k : indices) {
    TermValue t;
    if (k < 1) {
      t.status = TermStatus::outside_domain;
    } else if (static_cast<Count>(k) > sink.zeros().size()) {
      t.status = TermStatus::beyond_limit;
    } else {
      t.status = TermStatus::computed;
      t.n = sink.zeros()[static_cast<std::size_t>(k - 1)];
      t.value = static_cast<SignedSum>(t.n);
    }
    out.push_back(t);
  }
  return out;
}

}  // namespace

Sequence parse_sequence(std::string_view name) {
  for (const auto& s : named_sequences)
    if (s.name == name) return {s.kind, 0};
  if (name.size() >= 2 && name.size() <= 3 && (name[0] == 'f' || name[0] == 'b')) {
    int d = -1;
    const auto digits = name.substr(1);
    const auto [end, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), d);
    const bool canonical = digits.size() == 1 || digits[0] != '0';
    if (ec == std::errc() && end == digits.data() + digits.size() && canonical && d >= 0 && d < config::omega_slots)
      return {name[0] == 'f' ? Kind::faces : Kind::betti, d};
  }
  throw InvalidArgument("unknown sequence '" + std::string(name) + "' (sequences: " +
                        std::string(sequence_names_help()) + ")");
}

std::string sequence_name(const Sequence& s) {
  if (s.kind == Kind::faces) return "f" + std::to_string(s.dimension);
  if (s.kind == Kind::betti) return "b" + std::to_string(s.dimension);
  for (const auto& n : named_sequences)
    if (n.kind == s.kind) return std::string(n.name);
  return "?";
}

std::string sequence_description(const Sequence& s) {
  const std::string d = std::to_string(s.dimension);
  switch (s.kind) {
    case Kind::mertens: return "M(n), the Mertens function";
    case Kind::mertens_pow10: return "M(10^k), the Mertens function at powers of ten";
    case Kind::mertens_pow2: return "M(2^k), the Mertens function at powers of two";
    case Kind::mertens_zeros: return "the k-th n with M(n) = 0";
    case Kind::squarefree: return "Q(n), the number of squarefree k <= n";
    case Kind::squarefree_pow10: return "Q(10^k), squarefree numbers up to powers of ten";
    case Kind::liouville: return "L(n), the summatory Liouville function";
    case Kind::faces: return "f" + d + "(n), faces of dimension " + d + " of K_n";
    case Kind::betti: return "b" + d + "(n), the Betti number in dimension " + d + " of K_n";
  }
  return "?";
}

std::string_view sequence_names_help() noexcept {
  return "mertens, mertens_pow10, mertens_pow2, mertens_zeros, squarefree, squarefree_pow10, liouville, "
         "f<d>, b<d> for d in 0..15";
}

std::vector<TermValue> evaluate_sequence_terms(const Sequence& sequence, const std::vector<std::int64_t>& indices,
                                               Natural limit, unsigned threads, const ProgressFn& progress) {
  if (limit < 1 || limit > config::max_sieve_n)
    throw InvalidArgument("limit " + std::to_string(limit) + " is outside [1, " + std::to_string(config::max_sieve_n) +
                          "]");
  if (threads < 1) throw InvalidArgument("threads must be at least 1");
  if ((sequence.kind == Kind::faces || sequence.kind == Kind::betti) &&
      (sequence.dimension < 0 || sequence.dimension >= config::omega_slots))
    throw InvalidArgument("dimension " + std::to_string(sequence.dimension) + " is outside [0, 15]");
  if (sequence.kind == Kind::mertens_zeros) return evaluate_zeros(indices, limit, threads, progress);

  // The n each index needs: itself, or a power of ten or two.
  const Natural base = sequence.kind == Kind::mertens_pow10 || sequence.kind == Kind::squarefree_pow10 ? 10
                       : sequence.kind == Kind::mertens_pow2                                            ? 2
                                                                                                        : 0;
  std::vector<TermValue> out(indices.size());
  std::vector<Natural> needed;
  for (std::size_t i = 0; i < indices.size(); ++i) {
    const std::int64_t k = indices[i];
    TermValue& t = out[i];
    if (k < 0) continue;  // outside_domain
    if (base == 0 && k == 0) {
      t = {TermStatus::computed, 0, 0};  // every sequence here is a sum over [1, n]: empty at n = 0
      continue;
    }
    const auto n = base == 0 ? (static_cast<Natural>(k) <= limit ? std::optional<Natural>(static_cast<Natural>(k))
                                                                  : std::nullopt)
                             : power_within(base, k, limit);
    if (!n) {
      t.status = TermStatus::beyond_limit;
      if (base == 0) t.n = static_cast<Natural>(k);
      continue;
    }
    t.status = TermStatus::computed;  // value filled in below
    t.n = *n;
    needed.push_back(*n);
  }
  if (needed.empty()) return out;
  std::sort(needed.begin(), needed.end());
  needed.erase(std::unique(needed.begin(), needed.end()), needed.end());

  TableRunOptions o = base_options(needed.back(), threads);
  o.samples = SampleSchedule(1, needed.back(), std::nullopt, needed, std::nullopt, false);
  RowCollector sink(sequence);
  require_checks(run_table(o, sink, progress));
  const auto& values = sink.values();
  if (values.size() != needed.size())
    throw InternalError("the engine wrote " + std::to_string(values.size()) + " rows for " +
                        std::to_string(needed.size()) + " sample points");
  for (auto& t : out) {
    if (t.status != TermStatus::computed || t.n == 0) continue;
    const auto it = std::lower_bound(values.begin(), values.end(), std::make_pair(t.n, SignedSum{0}),
                                     [](const auto& a, const auto& b) { return a.first < b.first; });
    if (it == values.end() || it->first != t.n) throw InternalError("no row for n = " + std::to_string(t.n));
    t.value = it->second;
  }
  return out;
}

}  // namespace sqfc::track
