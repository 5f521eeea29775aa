// SPDX-License-Identifier: MIT
// The run store: SQLite in WAL mode, one transaction per segment, verified on every open.
#include "sqfc/io/run_store.hpp"

#include <sqlite3.h>

#include <fcntl.h>
#include <sys/file.h>
#include <unistd.h>

#include <cerrno>
#include <chrono>
#include <cstdio>
#include <cstring>
#include <filesystem>

#include "sqfc/core/error.hpp"
#include "sqfc/core/version.hpp"
#include "sqfc/io/manifest.hpp"
#include "sqfc/io/run_codec.hpp"

namespace sqfc::io {
namespace {

constexpr int application_id = 0x73716663;  // "sqfc"

const char* const schema_sql = R"(
CREATE TABLE meta(key TEXT PRIMARY KEY, value TEXT NOT NULL) WITHOUT ROWID;
CREATE TABLE parameters(name TEXT PRIMARY KEY, value TEXT NOT NULL) WITHOUT ROWID;
CREATE TABLE segments(segment INTEGER PRIMARY KEY, lo INTEGER NOT NULL, hi INTEGER NOT NULL,
                      blocks INTEGER NOT NULL, attempt INTEGER NOT NULL, committed_utc TEXT NOT NULL,
                      checkpoint BLOB NOT NULL, checksum INTEGER NOT NULL);
CREATE TABLE blocks(lo INTEGER PRIMARY KEY, hi INTEGER NOT NULL, scanned INTEGER NOT NULL,
                    summary BLOB NOT NULL, checksum INTEGER NOT NULL);
CREATE TABLE rows(n INTEGER PRIMARY KEY, data BLOB NOT NULL, checksum INTEGER NOT NULL);
CREATE TABLE events(seq INTEGER PRIMARY KEY, n INTEGER NOT NULL, data BLOB NOT NULL, checksum INTEGER NOT NULL);
CREATE TABLE attempts(attempt INTEGER PRIMARY KEY, started_utc TEXT NOT NULL, finished_utc TEXT NOT NULL,
                      first_n INTEGER NOT NULL, last_n INTEGER NOT NULL, wall_seconds REAL NOT NULL,
                      threads INTEGER NOT NULL, ranks INTEGER NOT NULL);
)";

std::int64_t as_signed(std::uint64_t v) { return static_cast<std::int64_t>(v); }
std::uint64_t as_unsigned(std::int64_t v) { return static_cast<std::uint64_t>(v); }

// A prepared statement; reset after each use.
class Statement {
 public:
  Statement(sqlite3* db, const std::string& sql, const std::string& store) : db_(db), store_(store) {
    if (sqlite3_prepare_v2(db, sql.c_str(), -1, &stmt_, nullptr) != SQLITE_OK)
      throw IoError("run store '" + store_ + "' is damaged or not a run store (" + sqlite3_errmsg(db) + ")");
  }
  ~Statement() { sqlite3_finalize(stmt_); }
  Statement(const Statement&) = delete;
  Statement& operator=(const Statement&) = delete;

  Statement& bind(int i, std::int64_t v) {
    sqlite3_bind_int64(stmt_, i, v);
    return *this;
  }
  Statement& bind(int i, double v) {
    sqlite3_bind_double(stmt_, i, v);
    return *this;
  }
  Statement& bind(int i, const std::string& text) {
    sqlite3_bind_text(stmt_, i, text.data(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
    return *this;
  }
  Statement& bind_blob(int i, const Bytes& blob) {
    sqlite3_bind_blob(stmt_, i, blob.data(), static_cast<int>(blob.size()), SQLITE_TRANSIENT);
    return *this;
  }
  // True while a row is available; throws on error.
  bool step() {
    const int rc = sqlite3_step(stmt_);
    if (rc == SQLITE_ROW) return true;
    if (rc == SQLITE_DONE) return false;
    last_error_ = rc;
    throw_error(rc);
  }
  void run() {
    step();
    sqlite3_reset(stmt_);
    sqlite3_clear_bindings(stmt_);
  }
  void reset() {
    sqlite3_reset(stmt_);
    sqlite3_clear_bindings(stmt_);
  }
  std::int64_t integer(int c) { return sqlite3_column_int64(stmt_, c); }
  double real(int c) { return sqlite3_column_double(stmt_, c); }
  std::string text(int c) {
    const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(stmt_, c));
    return p ? std::string(p, static_cast<std::size_t>(sqlite3_column_bytes(stmt_, c))) : std::string();
  }
  std::string_view blob(int c) {
    const auto* p = static_cast<const char*>(sqlite3_column_blob(stmt_, c));
    return p ? std::string_view(p, static_cast<std::size_t>(sqlite3_column_bytes(stmt_, c))) : std::string_view();
  }
  int last_error_ = 0;

 private:
  [[noreturn]] void throw_error(int rc) {
    const std::string message = sqlite3_errmsg(db_);
    sqlite3_reset(stmt_);
    const int primary = rc & 0xFF;
    if (primary == SQLITE_FULL || (primary == SQLITE_IOERR))
      throw IoError("run store '" + store_ + "': cannot write (" + message +
                    "; disk full or file-size limit?)");
    if (primary == SQLITE_CORRUPT || primary == SQLITE_NOTADB)
      throw IoError("run store '" + store_ + "' is damaged (" + message + ")");
    throw IoError("run store '" + store_ + "': " + message);
  }
  sqlite3* db_;
  sqlite3_stmt* stmt_ = nullptr;
  std::string store_;
};

[[noreturn]] void damaged(const std::string& path, const std::string& why) {
  throw IoError("run store '" + path + "' is damaged: " + why + "; refusing to use it");
}

}  // namespace

struct RunStore::Impl {
  std::string path;
  sqlite3* db = nullptr;
  bool read_only = false;
  std::vector<RunParameter> parameters;
  Natural to = 0;
  Natural done = 0;
  Count segments = 0;
  Count blocks = 0;
  std::optional<track::RunCheckpoint> last;
  Count attempt = 0;
  std::chrono::steady_clock::time_point attempt_start;
  std::unique_ptr<Statement> insert_segment, insert_block, insert_row, insert_event, update_attempt;
  int lock_fd = -1;  // flock held by a writer for its whole run

  // One writer per store: a second run (or a leftover rank of a killed MPI job) is refused
  // instead of committing segments alongside. The kernel drops the lock when the process dies.
  void lock_for_writing() {
    lock_fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
    if (lock_fd < 0) throw IoError("cannot open run store '" + path + "': " + std::strerror(errno));
    if (::flock(lock_fd, LOCK_EX | LOCK_NB) != 0)
      throw IoError("run store '" + path + "' is in use by another sqfc process");
  }

  ~Impl() {
    if (lock_fd >= 0) ::close(lock_fd);
    insert_segment.reset();
    insert_block.reset();
    insert_row.reset();
    insert_event.reset();
    update_attempt.reset();
    if (db) sqlite3_close(db);
  }

  void exec(const std::string& sql) {
    char* error = nullptr;
    const int rc = sqlite3_exec(db, sql.c_str(), nullptr, nullptr, &error);
    if (rc != SQLITE_OK) {
      std::string message = error ? error : sqlite3_errstr(rc);
      sqlite3_free(error);
      const int primary = rc & 0xFF;
      if (primary == SQLITE_FULL || primary == SQLITE_IOERR)
        throw IoError("run store '" + path + "': cannot write (" + message +
                      "; disk full or file-size limit?)");
      if (primary == SQLITE_CORRUPT || primary == SQLITE_NOTADB)
        throw IoError("run store '" + path + "' is damaged or not a run store (" + message + ")");
      throw IoError("run store '" + path + "': " + message);
    }
  }

  void open(int flags, const std::string& file = {}) {
    const int rc = sqlite3_open_v2((file.empty() ? path : file).c_str(), &db, flags, nullptr);
    if (rc != SQLITE_OK)
      throw IoError("cannot open run store '" + path + "': " + (db ? sqlite3_errmsg(db) : sqlite3_errstr(rc)));
    sqlite3_extended_result_codes(db, 1);
    sqlite3_busy_timeout(db, 2000);
  }

  std::int64_t pragma(const std::string& name) {
    Statement s(db, "PRAGMA " + name, path);
    return s.step() ? s.integer(0) : 0;
  }

  // Reads and checks everything; fills the cached facts. O(stored rows).
  void verify() {
    {
      Statement s(db, "PRAGMA quick_check", path);
      while (s.step()) {
        const std::string result = s.text(0);
        if (result != "ok") damaged(path, "SQLite quick_check reports '" + result + "'");
      }
    }
    if (pragma("application_id") != application_id) damaged(path, "it is not an sqfc run store");
    const auto version = pragma("user_version");
    if (version != run_store_schema_version)
      throw IoError("run store '" + path + "' has schema version " + std::to_string(version) + ", this sqfc reads " +
                    std::to_string(run_store_schema_version));
    parameters.clear();
    {
      Statement s(db, "SELECT name, value FROM parameters ORDER BY name", path);
      while (s.step()) parameters.push_back({s.text(0), s.text(1)});
    }
    to = 0;
    for (const auto& p : parameters)
      if (p.name == "to") to = std::stoull(p.value);
    if (to < 1) damaged(path, "it names no range");

    // Segments and their blocks: contiguous from n = 1, checksums, summaries re-merge to each checkpoint.
    Statement seg(db, "SELECT segment, lo, hi, blocks, checkpoint, checksum FROM segments ORDER BY segment", path);
    Statement blk(db, "SELECT lo, hi, scanned, summary, checksum FROM blocks ORDER BY lo", path);
    track::BlockSummary total;
    Count block_count = 0, scanned_count = 0;
    bool block_pending = blk.step();
    Count expected_segment = 0;
    Natural next_lo = 1;
    last.reset();
    while (seg.step()) {
      const auto g = as_unsigned(seg.integer(0));
      const auto lo = as_unsigned(seg.integer(1)), hi = as_unsigned(seg.integer(2));
      const auto nblocks = as_unsigned(seg.integer(3));
      const std::string_view blob = seg.blob(4);
      if (g != expected_segment) damaged(path, "segment " + std::to_string(expected_segment) + " is missing");
      if (lo != next_lo || hi <= lo || hi > to + 1)
        damaged(path, "segment " + std::to_string(g) + " does not continue at n = " + std::to_string(next_lo));
      if (checksum(blob, g) != as_unsigned(seg.integer(5))) damaged(path, "checksum of segment " + std::to_string(g));
      ByteReader reader(blob, "checkpoint of segment " + std::to_string(g));
      track::RunCheckpoint c = decode_checkpoint(reader);
      reader.expect_end();
      for (Count b = 0; b < nblocks; ++b) {
        if (!block_pending) damaged(path, "blocks of segment " + std::to_string(g) + " are missing");
        const auto blo = as_unsigned(blk.integer(0)), bhi = as_unsigned(blk.integer(1));
        const std::int64_t scanned = blk.integer(2);
        const std::string_view sblob = blk.blob(3);
        if (checksum(std::string(sblob) + static_cast<char>(scanned), blo) != as_unsigned(blk.integer(4)))
          damaged(path, "checksum of the block at n = " + std::to_string(blo));
        ByteReader br(sblob, "block at n = " + std::to_string(blo));
        const track::BlockSummary s = decode_summary(br);
        br.expect_end();
        if (s.lo != blo || s.hi != bhi || blo != total.hi)
          damaged(path, "blocks are not contiguous at n = " + std::to_string(total.hi));
        total = merge_summaries(total, s);
        ++block_count;
        if (scanned) ++scanned_count;
        block_pending = blk.step();
      }
      if (!(total == c.total) || total.hi != hi || c.blocks != block_count || c.scanned_blocks != scanned_count)
        damaged(path, "the block summaries do not re-merge to the checkpoint of segment " + std::to_string(g));
      next_lo = hi;
      ++expected_segment;
      last = std::move(c);
    }
    if (block_pending) damaged(path, "it holds blocks beyond its last segment");
    segments = expected_segment;
    blocks = block_count;
    done = next_lo - 1;
    // Rows and events: counts and ranges agree with the last checkpoint (checksums are checked when read).
    Statement rows(db, "SELECT count(*), coalesce(max(n), 0) FROM rows", path);
    rows.step();
    const auto row_count = as_unsigned(rows.integer(0));
    const auto row_max = as_unsigned(rows.integer(1));
    Statement events(db, "SELECT count(*), coalesce(max(seq) + 1, 0), coalesce(max(n), 0) FROM events", path);
    events.step();
    const auto event_count = as_unsigned(events.integer(0));
    const auto event_seq = as_unsigned(events.integer(1));
    const auto event_max = as_unsigned(events.integer(2));
    const Count want_rows = last ? last->rows : 0, want_events = last ? last->events : 0;
    if (row_count != want_rows || row_max > done)
      damaged(path, "it holds " + std::to_string(row_count) + " rows where its checkpoint says " + std::to_string(want_rows));
    if (event_count != want_events || event_seq != event_count || event_max > done)
      damaged(path, "it holds " + std::to_string(event_count) + " events where its checkpoint says " +
                        std::to_string(want_events));
  }

  void prepare_writes() {
    insert_segment = std::make_unique<Statement>(
        db, "INSERT INTO segments VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8)", path);
    insert_block = std::make_unique<Statement>(db, "INSERT INTO blocks VALUES (?1, ?2, ?3, ?4, ?5)", path);
    insert_row = std::make_unique<Statement>(db, "INSERT INTO rows VALUES (?1, ?2, ?3)", path);
    insert_event = std::make_unique<Statement>(db, "INSERT INTO events VALUES (?1, ?2, ?3, ?4)", path);
    update_attempt = std::make_unique<Statement>(
        db, "UPDATE attempts SET finished_utc = ?1, last_n = ?2, wall_seconds = ?3 WHERE attempt = ?4", path);
  }

  void configure_writer() {
    // WAL: a commit appends to the log, readers (`sqfc runs`) never block the run. NORMAL
    // synchronisation: a killed process loses nothing committed; a power cut may lose the last
    // commits but never leaves a damaged store (SQLite's WAL guarantees).
    exec("PRAGMA journal_mode = WAL");
    exec("PRAGMA synchronous = NORMAL");
  }
};

RunStore::RunStore(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
RunStore::RunStore(RunStore&&) noexcept = default;
RunStore& RunStore::operator=(RunStore&&) noexcept = default;
RunStore::~RunStore() = default;

RunStore RunStore::create(const std::string& path, const std::vector<RunParameter>& parameters) {
  std::error_code ec;
  if (std::filesystem::exists(path, ec))
    throw InvalidArgument("run store '" + path + "' already exists: add --resume to continue it, or remove it");
  // The schema is written into a temporary file that is renamed into place once complete, so a
  // process killed while creating leaves no half-made store behind (only the temporary file).
  const std::string temporary = path + ".part-" + std::to_string(::getpid());
  std::filesystem::remove(temporary, ec);
  {
    auto maker = std::make_unique<Impl>();
    maker->path = path;
    maker->open(SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE, temporary);
    try {
      maker->exec("BEGIN");
      maker->exec(schema_sql);
      maker->exec("PRAGMA application_id = " + std::to_string(application_id));
      maker->exec("PRAGMA user_version = " + std::to_string(run_store_schema_version));
      {
        Statement meta(maker->db, "INSERT INTO meta VALUES (?1, ?2)", path);
        meta.bind(1, std::string("schema_version")).bind(2, std::to_string(run_store_schema_version)).run();
        meta.bind(1, std::string("sqfc_version")).bind(2, std::string(version_string)).run();
        meta.bind(1, std::string("created_utc")).bind(2, utc_timestamp(std::chrono::system_clock::now())).run();
        Statement param(maker->db, "INSERT INTO parameters VALUES (?1, ?2)", path);
        for (const auto& p : parameters) param.bind(1, p.name).bind(2, p.value).run();
      }
      maker->exec("COMMIT");
    } catch (...) {
      maker.reset();
      std::filesystem::remove(temporary, ec);
      throw;
    }
  }
  if (std::rename(temporary.c_str(), path.c_str()) != 0) {
    std::filesystem::remove(temporary, ec);
    throw IoError("cannot create run store '" + path + "': " + std::strerror(errno));
  }
  auto impl = std::make_unique<Impl>();
  impl->path = path;
  impl->lock_for_writing();
  impl->open(SQLITE_OPEN_READWRITE);
  impl->configure_writer();
  impl->verify();
  impl->prepare_writes();
  return RunStore(std::move(impl));
}

RunStore RunStore::open_for_resume(const std::string& path, const std::vector<RunParameter>& parameters) {
  std::error_code ec;
  if (!std::filesystem::is_regular_file(path, ec)) throw IoError("run store '" + path + "' does not exist");
  auto impl = std::make_unique<Impl>();
  impl->path = path;
  impl->lock_for_writing();
  impl->open(SQLITE_OPEN_READWRITE);
  impl->configure_writer();
  impl->verify();
  // Name every parameter that differs, with both values.
  std::string differ;
  auto value_in = [](const std::vector<RunParameter>& list, const std::string& name) -> std::optional<std::string> {
    for (const auto& p : list)
      if (p.name == name) return p.value;
    return std::nullopt;
  };
  std::vector<std::string> names;
  for (const auto& p : impl->parameters) names.push_back(p.name);
  for (const auto& p : parameters)
    if (!value_in(impl->parameters, p.name)) names.push_back(p.name);
  for (const auto& name : names) {
    const auto stored = value_in(impl->parameters, name), now = value_in(parameters, name);
    if (stored != now)
      differ += (differ.empty() ? "" : ", ") + name + " (store: " + stored.value_or("none") + ", now: " +
                now.value_or("none") + ")";
  }
  if (!differ.empty())
    throw InvalidArgument("run store '" + path + "' was made with other parameters: " + differ);
  impl->prepare_writes();
  return RunStore(std::move(impl));
}

RunStore RunStore::open_read_only(const std::string& path) {
  std::error_code ec;
  if (!std::filesystem::is_regular_file(path, ec)) throw IoError("run store '" + path + "' does not exist");
  auto impl = std::make_unique<Impl>();
  impl->path = path;
  impl->read_only = true;
  impl->open(SQLITE_OPEN_READONLY);
  impl->verify();
  return RunStore(std::move(impl));
}

std::optional<track::RunCheckpoint> RunStore::last_checkpoint() const { return impl_->last; }
Natural RunStore::done() const { return impl_->done; }
Natural RunStore::to() const { return impl_->to; }
std::vector<RunParameter> RunStore::parameters() const { return impl_->parameters; }

void RunStore::begin_attempt(unsigned threads, unsigned ranks) {
  Impl& s = *impl_;
  s.attempt_start = std::chrono::steady_clock::now();
  Statement count(s.db, "SELECT coalesce(max(attempt), 0) + 1 FROM attempts", s.path);
  count.step();
  s.attempt = as_unsigned(count.integer(0));
  count.reset();
  const std::string now = utc_timestamp(std::chrono::system_clock::now());
  Statement insert(s.db, "INSERT INTO attempts VALUES (?1, ?2, ?3, ?4, ?5, 0.0, ?6, ?7)", s.path);
  insert.bind(1, as_signed(s.attempt)).bind(2, now).bind(3, now);
  insert.bind(4, as_signed(s.done + 1)).bind(5, as_signed(s.done));
  insert.bind(6, static_cast<std::int64_t>(threads)).bind(7, static_cast<std::int64_t>(ranks)).run();
}

void RunStore::commit_segment(const track::SegmentCommit& commit, const std::vector<track::TableRow>& rows,
                              const std::vector<track::Event>& events) {
  Impl& s = *impl_;
  if (commit.lo != s.done + 1 || !commit.after || !commit.blocks || !commit.scanned)
    throw InternalError("run store: segment at n = " + std::to_string(commit.lo) + " does not follow n = " +
                        std::to_string(s.done));
  const Count event_base = s.last ? s.last->events : 0;
  s.exec("BEGIN");
  try {
    const Bytes checkpoint = encode_one(*commit.after);
    s.insert_segment->bind(1, as_signed(commit.index)).bind(2, as_signed(commit.lo)).bind(3, as_signed(commit.hi));
    s.insert_segment->bind(4, static_cast<std::int64_t>(commit.blocks->size())).bind(5, as_signed(s.attempt));
    s.insert_segment->bind(6, utc_timestamp(std::chrono::system_clock::now()));
    s.insert_segment->bind_blob(7, checkpoint).bind(8, as_signed(checksum(checkpoint, commit.index)));
    s.insert_segment->run();
    for (std::size_t i = 0; i < commit.blocks->size(); ++i) {
      const auto& b = (*commit.blocks)[i];
      const Bytes blob = encode_one(b);
      const char scanned = static_cast<char>((*commit.scanned)[i] ? 1 : 0);
      s.insert_block->bind(1, as_signed(b.lo)).bind(2, as_signed(b.hi)).bind(3, static_cast<std::int64_t>(scanned));
      s.insert_block->bind_blob(4, blob).bind(5, as_signed(checksum(blob + scanned, b.lo))).run();
    }
    for (const auto& r : rows) {
      const Bytes blob = encode_one(r);
      s.insert_row->bind(1, as_signed(r.n)).bind_blob(2, blob).bind(3, as_signed(checksum(blob, r.n))).run();
    }
    for (std::size_t i = 0; i < events.size(); ++i) {
      const Bytes blob = encode_one(events[i]);
      const Count seq = event_base + i;
      s.insert_event->bind(1, as_signed(seq)).bind(2, as_signed(events[i].n)).bind_blob(3, blob);
      s.insert_event->bind(4, as_signed(checksum(blob, seq))).run();
    }
    if (s.attempt > 0) {
      const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - s.attempt_start).count();
      s.update_attempt->bind(1, utc_timestamp(std::chrono::system_clock::now())).bind(2, as_signed(commit.hi - 1));
      s.update_attempt->bind(3, wall).bind(4, as_signed(s.attempt)).run();
    }
    s.exec("COMMIT");
  } catch (const IoError& e) {
    sqlite3_exec(s.db, "ROLLBACK", nullptr, nullptr, nullptr);
    throw IoError(std::string(e.what()) + "; the store is intact up to n = " + std::to_string(s.done) +
                  ", continue it with --resume");
  } catch (...) {
    sqlite3_exec(s.db, "ROLLBACK", nullptr, nullptr, nullptr);
    throw;
  }
  s.done = commit.hi - 1;
  ++s.segments;
  s.blocks += commit.blocks->size();
  s.last = *commit.after;
}

void RunStore::for_each_row(const std::function<void(const track::TableRow&)>& visit) const {
  Statement s(impl_->db, "SELECT n, data, checksum FROM rows ORDER BY n", impl_->path);
  while (s.step()) {
    const auto n = as_unsigned(s.integer(0));
    const std::string_view blob = s.blob(1);
    if (checksum(blob, n) != as_unsigned(s.integer(2))) damaged(impl_->path, "checksum of the row n = " + std::to_string(n));
    ByteReader r(blob, "row n = " + std::to_string(n));
    const track::TableRow row = decode_row(r);
    r.expect_end();
    if (row.n != n) damaged(impl_->path, "row n = " + std::to_string(n) + " holds n = " + std::to_string(row.n));
    visit(row);
  }
}

void RunStore::for_each_event(const std::function<void(const track::Event&)>& visit) const {
  Statement s(impl_->db, "SELECT seq, n, data, checksum FROM events ORDER BY seq", impl_->path);
  while (s.step()) {
    const auto seq = as_unsigned(s.integer(0));
    const std::string_view blob = s.blob(2);
    if (checksum(blob, seq) != as_unsigned(s.integer(3))) damaged(impl_->path, "checksum of event " + std::to_string(seq));
    ByteReader r(blob, "event " + std::to_string(seq));
    const track::Event e = decode_event(r);
    r.expect_end();
    if (e.n != as_unsigned(s.integer(1))) damaged(impl_->path, "event " + std::to_string(seq) + " moved");
    visit(e);
  }
}

RunStoreSummary RunStore::summary() const {
  const Impl& s = *impl_;
  RunStoreSummary out;
  out.path = s.path;
  out.schema_version = run_store_schema_version;
  {
    Statement meta(s.db, "SELECT key, value FROM meta", s.path);
    while (meta.step()) {
      const std::string key = meta.text(0);
      if (key == "sqfc_version") out.sqfc_version = meta.text(1);
      if (key == "created_utc") out.created_utc = meta.text(1);
    }
  }
  out.parameters = s.parameters;
  out.to = s.to;
  out.done = s.done;
  out.segments = s.segments;
  out.blocks = s.blocks;
  out.last = s.last;
  out.rows = s.last ? s.last->rows : 0;
  out.events = s.last ? s.last->events : 0;
  Statement attempts(s.db, "SELECT attempt, started_utc, finished_utc, first_n, last_n, wall_seconds, threads, ranks "
                           "FROM attempts ORDER BY attempt", s.path);
  while (attempts.step()) {
    RunAttempt a;
    a.index = as_unsigned(attempts.integer(0));
    a.started_utc = attempts.text(1);
    a.finished_utc = attempts.text(2);
    a.first_n = as_unsigned(attempts.integer(3));
    a.last_n = as_unsigned(attempts.integer(4));
    a.wall_seconds = attempts.real(5);
    a.threads = static_cast<unsigned>(attempts.integer(6));
    a.ranks = static_cast<unsigned>(attempts.integer(7));
    out.attempts.push_back(std::move(a));
  }
  return out;
}

}  // namespace sqfc::io
