// SPDX-License-Identifier: MIT
// Distributed table runs over MPI: segment dealing, checkpoint hand-over, ordered writing on rank 0.
#include "sqfc/io/mpi_run.hpp"

#include <mpi.h>

#include <algorithm>
#include <chrono>
#include <limits>
#include <list>
#include <thread>
#include <vector>

#include "sqfc/core/error.hpp"
#include "sqfc/io/run_codec.hpp"
#include "sqfc/io/stored_run.hpp"

namespace sqfc::io {
namespace {

constexpr int tag_checkpoint = 1;  // checkpoint after a segment, to the next segment's rank
constexpr int tag_segment = 2;     // a whole segment (blocks, rows, events, checkpoint), to rank 0
constexpr int tag_resume = 3;      // the resume point, broadcast by rank 0

void check(int rc, const char* what) {
  if (rc != MPI_SUCCESS) throw IoError(std::string("MPI: ") + what + " failed");
}

// OpenMPI's blocking calls spin while they wait, taking a core from this rank's own sieve
// threads (and, on a shared machine, from the other ranks). Waiting by polling with short
// sleeps leaves the core free; the sleep grows from 20 to 50 microseconds, small next to the
// ~10 ms a segment of 2^22 values takes to sieve.
template <class Ready>
void wait_politely(Ready&& ready) {
  std::chrono::microseconds pause{20};
  while (!ready()) {
    std::this_thread::sleep_for(pause);
    pause = std::min(pause * 2, std::chrono::microseconds{50});
  }
}

void send_bytes(const Bytes& bytes, int to, int tag) {
  if (bytes.size() > static_cast<std::size_t>(std::numeric_limits<int>::max()))
    throw IoError("MPI: a segment message exceeds 2 GiB; use a smaller --every or fewer events");
  MPI_Request request;
  check(MPI_Isend(bytes.data(), static_cast<int>(bytes.size()), MPI_BYTE, to, tag, MPI_COMM_WORLD, &request), "send");
  wait_politely([&] {
    int done = 0;
    check(MPI_Test(&request, &done, MPI_STATUS_IGNORE), "test");
    return done != 0;
  });
}

// Sends that complete in the background. A message above OpenMPI's eager limit (a few KiB
// over shared memory) is sent by rendezvous: a blocking send would hold this rank until the
// receiver posts its receive, which it does only when it needs the message, after its own
// sieving, and so would serialise the ranks' sieving. MPI keeps the order of messages between
// two ranks with the same tag, so the receiver still sees them in sending order.
class BackgroundSends {
 public:
  BackgroundSends() = default;
  BackgroundSends(const BackgroundSends&) = delete;
  BackgroundSends& operator=(const BackgroundSends&) = delete;
  ~BackgroundSends() {
    // Sends are pending here only when a run failed and MPI_Abort follows: the buffers are left
    // allocated rather than freed under MPI's feet.
    if (!pending_.empty()) (void)new std::list<Slot>(std::move(pending_));
  }

  void send(Bytes bytes, int to, int tag) {
    reap();
    if (bytes.size() > static_cast<std::size_t>(std::numeric_limits<int>::max()))
      throw IoError("MPI: a segment message exceeds 2 GiB; use a smaller --every or fewer events");
    auto& slot = pending_.emplace_back();  // a list: the buffer stays put while MPI reads it
    slot.bytes = std::move(bytes);
    check(MPI_Isend(slot.bytes.data(), static_cast<int>(slot.bytes.size()), MPI_BYTE, to, tag, MPI_COMM_WORLD,
                    &slot.request),
          "send");
  }
  // Waits until every message has been delivered.
  void finish() {
    wait_politely([&] {
      reap();
      return pending_.empty();
    });
  }

 private:
  struct Slot {
    Bytes bytes;
    MPI_Request request = MPI_REQUEST_NULL;
  };
  std::list<Slot> pending_;

  void reap() {
    for (auto it = pending_.begin(); it != pending_.end();) {
      int done = 0;
      check(MPI_Test(&it->request, &done, MPI_STATUS_IGNORE), "test");
      it = done ? pending_.erase(it) : std::next(it);
    }
  }
};

Bytes receive_bytes(int from, int tag) {
  MPI_Status status;
  wait_politely([&] {
    int arrived = 0;
    check(MPI_Iprobe(from, tag, MPI_COMM_WORLD, &arrived, &status), "probe");
    return arrived != 0;
  });
  int size = 0;
  check(MPI_Get_count(&status, MPI_BYTE, &size), "get_count");
  Bytes bytes(static_cast<std::size_t>(size), '\0');
  check(MPI_Recv(bytes.data(), size, MPI_BYTE, from, tag, MPI_COMM_WORLD, MPI_STATUS_IGNORE), "receive");
  return bytes;
}

// A segment as it travels to rank 0.
struct SegmentMessage {
  Natural index = 0, lo = 0, hi = 0;
  std::vector<track::BlockSummary> blocks;
  std::vector<std::uint8_t> scanned;
  std::vector<track::TableRow> rows;
  std::vector<track::Event> events;
  track::RunCheckpoint after;
};

Bytes encode_segment(const track::SegmentCommit& c, const std::vector<track::TableRow>& rows,
                     const std::vector<track::Event>& events) {
  ByteWriter w;
  w.put_unsigned(c.index);
  w.put_unsigned(c.lo);
  w.put_unsigned(c.hi);
  w.put_unsigned(c.blocks->size());
  for (std::size_t i = 0; i < c.blocks->size(); ++i) {
    encode(w, (*c.blocks)[i]);
    w.put_unsigned((*c.scanned)[i]);
  }
  w.put_unsigned(rows.size());
  for (const auto& r : rows) encode(w, r);
  w.put_unsigned(events.size());
  for (const auto& e : events) encode(w, e);
  encode(w, *c.after);
  return w.take();
}

SegmentMessage decode_segment(const Bytes& bytes) {
  ByteReader r(bytes, "MPI segment message");
  SegmentMessage m;
  m.index = r.get_unsigned();
  m.lo = r.get_unsigned();
  m.hi = r.get_unsigned();
  const auto blocks = r.get_unsigned();
  for (std::uint64_t i = 0; i < blocks; ++i) {
    m.blocks.push_back(decode_summary(r));
    m.scanned.push_back(static_cast<std::uint8_t>(r.get_unsigned() ? 1 : 0));
  }
  const auto rows = r.get_unsigned();
  for (std::uint64_t i = 0; i < rows; ++i) m.rows.push_back(decode_row(r));
  const auto events = r.get_unsigned();
  for (std::uint64_t i = 0; i < events; ++i) m.events.push_back(decode_event(r));
  m.after = decode_checkpoint(r);
  r.expect_end();
  return m;
}

Bytes encode_checkpoint_message(Natural index, const track::RunCheckpoint& c) {
  ByteWriter w;
  w.put_unsigned(index);
  encode(w, c);
  return w.take();
}

track::RunCheckpoint decode_checkpoint_message(const Bytes& bytes, Natural expected_index) {
  ByteReader r(bytes, "MPI checkpoint message");
  if (r.get_unsigned() != expected_index) throw InternalError("MPI: checkpoints arrived out of order");
  track::RunCheckpoint c = decode_checkpoint(r);
  r.expect_end();
  return c;
}

// Ranks other than 0: send each committed segment to rank 0, and its checkpoint to the next rank.
class WorkerSink : public track::TableSink {
 public:
  WorkerSink(unsigned rank, unsigned ranks, Natural segment_count)
      : rank_(rank), ranks_(ranks), segment_count_(segment_count) {}
  void on_row(const track::TableRow& row) override { rows_.push_back(row); }
  void on_event(const track::Event& event) override { events_.push_back(event); }
  void on_segment_committed(const track::SegmentCommit& c) override {
    // The checkpoint first: it is small and unblocks the next rank at once.
    if (rank_ + 1 < ranks_ && c.index + 1 < segment_count_)
      sends_.send(encode_checkpoint_message(c.index, *c.after), static_cast<int>(rank_ + 1), tag_checkpoint);
    sends_.send(encode_segment(c, rows_, events_), 0, tag_segment);
    rows_.clear();
    events_.clear();
  }
  void finish() { sends_.finish(); }

 private:
  BackgroundSends sends_;
  unsigned rank_, ranks_;
  Natural segment_count_;
  std::vector<track::TableRow> rows_;
  std::vector<track::Event> events_;
};

// Rank 0: writes its own segments and, in order between them, the segments other ranks send.
class RootSink : public track::TableSink {
 public:
  RootSink(track::TableSink& inner, unsigned ranks, Natural segment_count, Natural first_segment)
      : inner_(inner), ranks_(ranks), segment_count_(segment_count), next_(first_segment) {}
  void on_row(const track::TableRow& row) override { inner_.on_row(row); }
  void on_event(const track::Event& event) override { inner_.on_event(event); }
  void on_segment_committed(const track::SegmentCommit& c) override {
    inner_.on_segment_committed(c);
    last_ = *c.after;
    next_ = c.index + 1;
    if (ranks_ > 1 && c.index + 1 < segment_count_)
      sends_.send(encode_checkpoint_message(c.index, *c.after), 1, tag_checkpoint);
  }
  void finish() { sends_.finish(); }
  // Writes the foreign segments before `upto` and returns the checkpoint after the last.
  track::RunCheckpoint drain(Natural upto) {
    for (; next_ < upto; ++next_) {
      const int from = static_cast<int>(next_ % ranks_);
      const SegmentMessage m = decode_segment(receive_bytes(from, tag_segment));
      if (m.index != next_) throw InternalError("MPI: segment " + std::to_string(m.index) + " arrived out of order");
      for (const auto& r : m.rows) inner_.on_row(r);
      for (const auto& e : m.events) inner_.on_event(e);
      const track::SegmentCommit c{m.index, m.lo, m.hi, &m.blocks, &m.scanned, &m.after};
      inner_.on_segment_committed(c);
      last_ = m.after;
      if (progress_) progress_(m.hi - 1, total_);
    }
    return last_;
  }
  void set_progress(const track::ProgressFn& p, Natural total) {
    progress_ = p;
    total_ = total;
  }
  [[nodiscard]] const track::RunCheckpoint& last() const { return last_; }

 private:
  BackgroundSends sends_;
  track::TableSink& inner_;
  unsigned ranks_;
  Natural segment_count_;
  Natural next_;
  track::RunCheckpoint last_;
  track::ProgressFn progress_;
  Natural total_ = 0;
};

}  // namespace

MpiSession::MpiSession() {
  int provided = 0;
  if (MPI_Init_thread(nullptr, nullptr, MPI_THREAD_SERIALIZED, &provided) != MPI_SUCCESS)
    throw IoError("MPI_Init_thread failed");
  if (provided < MPI_THREAD_SERIALIZED) {
    MPI_Finalize();
    throw IoError("this MPI library does not support MPI_THREAD_SERIALIZED");
  }
  int rank = 0, size = 1;
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  MPI_Comm_size(MPI_COMM_WORLD, &size);
  rank_ = static_cast<unsigned>(rank);
  size_ = static_cast<unsigned>(size);
}

MpiSession::~MpiSession() { MPI_Finalize(); }

void MpiSession::abort(int exit_code) const {
  MPI_Abort(MPI_COMM_WORLD, exit_code);
  std::abort();  // MPI_Abort does not return; this keeps [[noreturn]] honest
}

track::TableRunReport run_table_distributed(const track::TableRunOptions& options, const MpiSession& session,
                                            track::TableSink& output, RunStore* store,
                                            const track::ProgressFn& progress) {
  const unsigned rank = session.rank(), ranks = session.size();
  track::TableRunOptions run = options;
  run.ranks = ranks;
  run.rank = rank;
  // The grid of the engine: segments of min(segment_size, to) values from n = 1.
  const Natural segment_size = std::min<Natural>(options.segment_size, options.to);
  const Natural segment_count = (options.to + segment_size - 1) / segment_size;

  // Rank 0 decides where to start (its store's checkpoint) and tells every rank.
  Bytes resume;
  if (rank == 0 && store && store->last_checkpoint()) resume = encode_one(*store->last_checkpoint());
  if (ranks > 1) {
    if (rank == 0)
      for (unsigned r = 1; r < ranks; ++r) send_bytes(resume, static_cast<int>(r), tag_resume);
    else
      resume = receive_bytes(0, tag_resume);
  }
  if (!resume.empty()) {
    ByteReader reader(resume, "resume point");
    run.resume_from = decode_checkpoint(reader);
    reader.expect_end();
  }
  const Natural done = run.resume_from ? run.resume_from->total.hi - 1 : 0;
  const Natural first_segment = done >= options.to ? segment_count : done / segment_size;

  if (rank != 0) {
    WorkerSink sink(rank, ranks, segment_count);
    const unsigned previous = rank - 1;
    run.await_checkpoint = [previous](Natural g) {
      return decode_checkpoint_message(receive_bytes(static_cast<int>(previous), tag_checkpoint), g - 1);
    };
    auto report = track::run_table(run, sink);
    sink.finish();
    return report;
  }

  std::unique_ptr<track::TableSink> store_sink = store ? make_store_sink(*store) : nullptr;
  RootSink root(store_sink ? *store_sink : output, ranks, segment_count, first_segment);
  root.set_progress(progress, options.to);
  run.await_checkpoint = [&root](Natural g) { return root.drain(g); };
  track::TableRunReport report = track::run_table(run, root, progress);
  root.drain(segment_count);  // the segments after rank 0's last one
  root.finish();
  if (store) {
    replay_store(*store, output);
    return report_from_store(*store);
  }
  if (first_segment >= segment_count) throw InternalError("MPI: nothing to run");
  const track::RunCheckpoint& last = root.last();
  report.final_state = last.state();
  report.rows = last.rows;
  report.events = last.events;
  report.blocks = last.blocks;
  report.scanned_blocks = last.scanned_blocks;
  report.checks = last.checks;
  return report;
}

}  // namespace sqfc::io
