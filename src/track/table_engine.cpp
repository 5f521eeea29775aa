// SPDX-License-Identifier: MIT
// The tabulation engine: parallel sieve and block summaries, ordered pass with sparse rescans.
#include "sqfc/track/table_engine.hpp"

#include <algorithm>
#include <memory>
#include <string>

#include "sqfc/arith/parallel_segments.hpp"
#include "sqfc/arith/sieve.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/track/block_summary.hpp"

namespace sqfc::track {
namespace {

// Buffers of one worker, allocated once per run.
struct Worker {
  Worker(const arith::SieveTables& tables, std::size_t block_size, Natural segment_size)
      : sieve(tables, block_size), codes(segment_size) {
    summaries.reserve(segment_size / block_size + 1);
  }
  arith::SegmentedSieve sieve;
  std::vector<arith::FactorCode> codes;   // factor codes of the current segment
  std::vector<BlockSummary> summaries;    // one per block of the current segment
  std::vector<EnvelopePieceExtras> extras;  // one per summary when an envelope is built
  Natural segment_lo = 0;
};

// Identity checks made on every emitted row (design.md identities 1-3).
class RowChecks {
 public:
  RowChecks() {
    tally_.add("euler_poincare", "sum_d (-1)^d b_d = 1 - M(n) (Euler-Poincare with Bjorner 2011 Betti numbers)");
    tally_.add("face_euler", "sum_d (-1)^d f_d = 1 - M(n) (Euler characteristic, design.md identity 1)");
    tally_.add("fredholm_parity", "prod -mu(k) = (-1)^((Q(n)+M(n))/2 - 1) (unimodularity, design.md identity 3)");
    tally_.add("block_rescan", "per-n rescan of a block ends in the state its summary gives");
  }
  void check_row(const TableRow& r) {
    SignedSum betti_sum = 0, face_sum = 0;
    for (int d = 0; d < config::omega_slots; ++d) {
      const SignedSum sign = (d % 2 == 0) ? 1 : -1;
      betti_sum += sign * r.betti[d];
      face_sum += sign * static_cast<SignedSum>(r.faces[d]);
    }
    tally_.record(0, betti_sum == r.euler, r.n);
    tally_.record(1, face_sum == r.euler, r.n);
    const SignedSum exponent = (static_cast<SignedSum>(r.squarefree) + r.mertens) / 2 - 1;
    const int expected = (exponent % 2 == 0) ? 1 : -1;
    tally_.record(2, expected == r.fredholm, r.n);
  }
  void check_rescan(bool ok, Natural n) { tally_.record(3, ok, n); }
  [[nodiscard]] const std::vector<CheckOutcome>& outcomes() const noexcept { return tally_.outcomes(); }
  void restore(const std::vector<CheckOutcome>& saved) {
    if (!tally_.restore(saved)) throw InvalidArgument("the checkpoint's identity checks are not this engine's");
  }
  std::vector<CheckOutcome> take() { return tally_.take(); }

 private:
  CheckTally tally_;
};

}  // namespace

bool TableRunReport::all_checks_passed() const { return all_passed(checks); }

TrackerState RunCheckpoint::state() const {
  TrackerState s;
  s.apply(total);
  return s;
}

bool operator==(const RunCheckpoint& a, const RunCheckpoint& b) {
  if (!(a.total == b.total && a.records == b.records && a.rows == b.rows && a.events == b.events &&
        a.blocks == b.blocks && a.scanned_blocks == b.scanned_blocks && a.checks.size() == b.checks.size()))
    return false;
  for (std::size_t i = 0; i < a.checks.size(); ++i) {
    const auto &x = a.checks[i], &y = b.checks[i];
    if (x.name != y.name || x.statement != y.statement || x.passed != y.passed || x.failed != y.failed ||
        x.first_failure != y.first_failure || x.first_failure_detail != y.first_failure_detail)
      return false;
  }
  return true;
}

TableRunReport run_table(const TableRunOptions& options, TableSink& sink, const ProgressFn& progress) {
  if (options.to < 1 || options.to > config::max_sieve_n)
    throw InvalidArgument("N = " + std::to_string(options.to) + " is outside the supported range [1, " +
                          std::to_string(config::max_sieve_n) + "]");
  if (options.from < 1 || options.from > options.to)
    throw InvalidArgument("--from " + std::to_string(options.from) + " is outside [1, N]");
  if (options.threads < 1) throw InvalidArgument("--threads must be at least 1");
  if (options.segment_size < options.block_size)
    throw InvalidArgument("segment size must be at least the block size");

  const arith::SieveTables tables(options.to);
  std::vector<std::unique_ptr<Worker>> workers;
  const Natural segment_count = (options.to + options.segment_size - 1) / options.segment_size;
  const auto worker_count = static_cast<unsigned>(std::min<Natural>(options.threads, segment_count));
  const Natural segment_size = std::min<Natural>(options.segment_size, options.to);
  for (unsigned t = 0; t < worker_count; ++t)
    workers.push_back(std::make_unique<Worker>(tables, std::min<std::size_t>(options.block_size, std::max<Natural>(segment_size, 1024)), segment_size));

  TableRunReport report;
  TrackerState state;
  EventDetector detector;
  RowChecks checks;
  BlockSummary total;  // of [1, state.n()], for checkpoints

  // A checkpoint replaces the whole ordered state: on resume, and in a distributed run before
  // each segment whose predecessor another process committed.
  auto load_checkpoint = [&](const RunCheckpoint& c) {
    if (c.total.lo != 1) throw InvalidArgument("a checkpoint must summarise [1, n]");
    total = c.total;
    state = c.state();
    detector = EventDetector(c.records);
    checks.restore(c.checks);
    report.rows = c.rows;
    report.events = c.events;
    report.blocks = c.blocks;
    report.scanned_blocks = c.scanned_blocks;
  };
  if (options.ranks < 1 || options.rank >= options.ranks) throw InvalidArgument("rank must lie in [0, ranks)");
  if (options.ranks > 1 && !options.await_checkpoint)
    throw InvalidArgument("a distributed run needs a way to receive checkpoints");
  Natural first_segment = 0;
  if (options.resume_from) {
    const Natural done = options.resume_from->total.hi - 1;
    if (done > options.to || (done % segment_size != 0 && done != options.to))
      throw InvalidArgument("resume point n = " + std::to_string(done) + " is not a segment boundary of this run");
    load_checkpoint(*options.resume_from);
    first_segment = (done == options.to) ? segment_count : done / segment_size;
  }
  // Segments g >= first_segment with g % ranks == rank, in increasing order.
  Natural first_local = first_segment + (options.rank + options.ranks - first_segment % options.ranks) % options.ranks;
  const Natural local_count = first_local >= segment_count ? 0 : (segment_count - 1 - first_local) / options.ranks + 1;
  std::vector<std::uint8_t> scanned;  // of the segment being committed
  Natural last_committed = first_segment == 0 ? ~Natural{0} : first_segment - 1;
  std::unique_ptr<EnvelopeBuilder> envelope;
  if (options.envelope) envelope = std::make_unique<EnvelopeBuilder>(*options.envelope);

  // Parallel part: sieve the segment block by block, keep the codes, summarise each block
  // while it is still in cache.
  auto segment_lo = [&](Natural g) { return 1 + g * segment_size; };
  auto work = [&](unsigned w, Natural i, Natural, Natural) {
    const Natural g = first_local + i * options.ranks;
    const Natural seg_lo = segment_lo(g);
    const Natural seg_hi = std::min(seg_lo + segment_size, options.to + 1);
    Worker& worker = *workers[w];
    worker.segment_lo = seg_lo;
    worker.summaries.clear();
    worker.extras.clear();
    worker.sieve.reset(seg_lo, seg_hi);
    for (Natural lo = seg_lo;; lo += worker.sieve.last_size()) {
      arith::FactorCode* out = worker.codes.data() + (lo - seg_lo);
      if (!worker.sieve.next_block_codes(out)) break;
      if (!envelope) {
        worker.summaries.push_back(summarize_codes(worker.sieve.last_lo(), out, worker.sieve.last_size()));
        continue;
      }
      // Envelope pieces never straddle a pixel column, so their summaries bound each column.
      const Natural block_lo = worker.sieve.last_lo();
      envelope->for_each_piece(block_lo, worker.sieve.last_size(), [&](std::size_t offset, std::size_t count) {
        worker.summaries.push_back(summarize_codes(block_lo + offset, out + offset, count));
        worker.extras.push_back(envelope->summarize_piece(block_lo + offset, out + offset, count));
      });
    }
  };

  auto emit_event = [&](const Event& e) {
    ++report.events;
    sink.on_event(e);
  };

  // Ordered part: apply summaries, rescan where a row or an event may fall.
  auto commit = [&](unsigned w, Natural i) {
    const Natural g = first_local + i * options.ranks;
    if (g != 0 && last_committed != g - 1) load_checkpoint(options.await_checkpoint(g));
    Worker& worker = *workers[w];
    scanned.assign(worker.summaries.size(), 0);
    std::size_t block_index = 0;
    for (std::size_t index = 0; index < worker.summaries.size(); ++index) {
      const BlockSummary& s = worker.summaries[index];
      if (s.lo != state.n() + 1) throw InternalError("block summaries out of order at n = " + std::to_string(s.lo));
      total = merge_summaries(total, s);
      if (envelope)
        envelope->add_piece(state, s, worker.extras[index], worker.codes.data() + (s.lo - worker.segment_lo));
      ++report.blocks;
      const auto next_sample = options.samples.next_at_or_after(s.lo);
      const bool has_sample = next_sample && *next_sample < s.hi;
      const bool may_fire = options.events && detector.may_fire_in(state, s);
      if (!has_sample && !may_fire) {
        state.apply(s);
      } else {
        ++report.scanned_blocks;
        scanned[block_index] = 1;
        TrackerState expected = state;
        expected.apply(s);
        const arith::FactorCode* codes = worker.codes.data() + (s.lo - worker.segment_lo);
        Natural sample = has_sample ? *next_sample : 0;
        for (Natural n = s.lo; n < s.hi; ++n) {
          const arith::FactorCode code = codes[n - s.lo];
          state.step(code);
          const bool report_n = n >= options.from;
          if (options.events) detector.observe(state, code, report_n, emit_event);
          if (n == sample) {
            if (report_n) {
              const TableRow row = state.row();
              if (options.self_checks) checks.check_row(row);
              ++report.rows;
              sink.on_row(row);
            }
            const auto following = options.samples.next_at_or_after(n + 1);
            sample = (following && *following < s.hi) ? *following : 0;
          }
        }
        checks.check_rescan(state == expected, s.hi - 1);
      }
      ++block_index;
      if (progress) progress(s.hi - 1, options.to);
    }
    last_committed = g;
    const RunCheckpoint after{total, detector.records(), report.rows, report.events, report.blocks,
                              report.scanned_blocks, checks.outcomes()};
    const SegmentCommit done{g, segment_lo(g), state.n() + 1, &worker.summaries, &scanned, &after};
    sink.on_segment_committed(done);
  };

  if (local_count > 0) arith::for_each_segment_ordered(0, local_count, 1, worker_count, work, commit);
  report.final_state = state;
  if (envelope) report.envelope = envelope->take();
  report.checks = checks.take();
  return report;
}

}  // namespace sqfc::track
