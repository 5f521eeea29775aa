// SPDX-License-Identifier: MIT
// Varint encodings of run data and the FNV-1a checksum.
#include "sqfc/io/run_codec.hpp"

#include <bit>
#include <cstring>

#include "sqfc/core/error.hpp"

namespace sqfc::io {

void ByteWriter::put_unsigned(std::uint64_t v) {
  while (v >= 0x80) {
    bytes_.push_back(static_cast<char>((v & 0x7F) | 0x80));
    v >>= 7;
  }
  bytes_.push_back(static_cast<char>(v));
}

void ByteWriter::put_signed(std::int64_t v) {
  // Zigzag: small magnitudes of either sign get short encodings.
  const auto u = static_cast<std::uint64_t>(v);
  put_unsigned((u << 1) ^ (v < 0 ? ~std::uint64_t{0} : 0));
}

void ByteWriter::put_double(double v) {
  const auto bits = std::bit_cast<std::uint64_t>(v);
  for (int i = 0; i < 8; ++i) bytes_.push_back(static_cast<char>((bits >> (8 * i)) & 0xFF));
}

void ByteWriter::put_string(std::string_view s) {
  put_unsigned(s.size());
  bytes_.append(s);
}

std::uint64_t ByteReader::get_unsigned() {
  std::uint64_t v = 0;
  for (int shift = 0; shift < 64; shift += 7) {
    if (pos_ >= bytes_.size()) throw IoError(what_ + " is truncated");
    const auto byte = static_cast<unsigned char>(bytes_[pos_++]);
    if (shift == 63 && byte > 1) break;
    v |= static_cast<std::uint64_t>(byte & 0x7F) << shift;
    if (!(byte & 0x80)) return v;
  }
  throw IoError(what_ + " holds a malformed number");
}

std::int64_t ByteReader::get_signed() {
  const std::uint64_t u = get_unsigned();
  return static_cast<std::int64_t>((u >> 1) ^ (~(u & 1) + 1));
}

double ByteReader::get_double() {
  if (bytes_.size() - pos_ < 8) throw IoError(what_ + " is truncated");
  std::uint64_t bits = 0;
  for (int i = 0; i < 8; ++i) bits |= static_cast<std::uint64_t>(static_cast<unsigned char>(bytes_[pos_++])) << (8 * i);
  return std::bit_cast<double>(bits);
}

std::string ByteReader::get_string() {
  const std::uint64_t size = get_unsigned();
  if (size > bytes_.size() - pos_) throw IoError(what_ + " is truncated");
  std::string s(bytes_.substr(pos_, size));
  pos_ += size;
  return s;
}

void ByteReader::expect_end() const {
  if (!at_end()) throw IoError(what_ + " has " + std::to_string(bytes_.size() - pos_) + " unexpected trailing bytes");
}

std::uint64_t checksum(std::string_view bytes, std::uint64_t key) {
  std::uint64_t h = 14695981039346656037ULL;  // FNV-1a 64-bit offset basis and prime
  auto mix = [&h](unsigned char c) {
    h ^= c;
    h *= 1099511628211ULL;
  };
  for (int i = 0; i < 8; ++i) mix(static_cast<unsigned char>((key >> (8 * i)) & 0xFF));
  for (char c : bytes) mix(static_cast<unsigned char>(c));
  return h;
}

namespace {
int get_small(ByteReader& r, int low, int high, const char* what) {
  const std::int64_t v = r.get_signed();
  if (v < low || v > high) throw IoError(std::string("stored ") + what + " is out of range");
  return static_cast<int>(v);
}
}  // namespace

void encode(ByteWriter& w, const track::BlockSummary& s) {
  w.put_unsigned(s.lo);
  w.put_unsigned(s.hi - s.lo);
  w.put_signed(s.mertens);
  w.put_signed(s.liouville);
  for (int k = 0; k < config::omega_slots; ++k) w.put_unsigned(s.odd_squarefree[k]);
  for (int k = 0; k < config::omega_slots; ++k) w.put_unsigned(s.even_squarefree[k]);
  w.put_signed(s.prefix_low);
  w.put_signed(s.prefix_high);
  w.put_signed(s.mu_last);
}

track::BlockSummary decode_summary(ByteReader& r) {
  track::BlockSummary s;
  s.lo = r.get_unsigned();
  const std::uint64_t size = r.get_unsigned();
  if (size > config::max_sieve_n || s.lo > config::max_sieve_n + 1) throw IoError("stored block range is out of range");
  s.hi = s.lo + size;
  s.mertens = r.get_signed();
  s.liouville = r.get_signed();
  for (int k = 0; k < config::omega_slots; ++k) s.odd_squarefree[k] = r.get_unsigned();
  for (int k = 0; k < config::omega_slots; ++k) s.even_squarefree[k] = r.get_unsigned();
  s.prefix_low = r.get_signed();
  s.prefix_high = r.get_signed();
  s.mu_last = get_small(r, -1, 1, "mu");
  return s;
}

void encode(ByteWriter& w, const track::TableRow& row) {
  w.put_unsigned(row.n);
  w.put_signed(row.mu);
  w.put_signed(row.mertens);
  w.put_signed(row.euler);
  w.put_unsigned(row.squarefree);
  w.put_signed(row.liouville);
  w.put_signed(row.fredholm);
  for (int k = 0; k < config::omega_slots; ++k) w.put_unsigned(row.faces[k]);
  for (int k = 0; k < config::omega_slots; ++k) w.put_signed(row.betti[k]);
  w.put_unsigned(row.div_edges);
}

track::TableRow decode_row(ByteReader& r) {
  track::TableRow row;
  row.n = r.get_unsigned();
  row.mu = get_small(r, -1, 1, "mu");
  row.mertens = r.get_signed();
  row.euler = r.get_signed();
  row.squarefree = r.get_unsigned();
  row.liouville = r.get_signed();
  row.fredholm = get_small(r, -1, 1, "fredholm sign");
  for (int k = 0; k < config::omega_slots; ++k) row.faces[k] = r.get_unsigned();
  for (int k = 0; k < config::omega_slots; ++k) row.betti[k] = r.get_signed();
  row.div_edges = r.get_unsigned();
  return row;
}

void encode(ByteWriter& w, const track::Event& e) {
  w.put_unsigned(static_cast<std::uint64_t>(e.kind));
  w.put_unsigned(e.n);
  w.put_signed(e.value);
  w.put_double(e.scaled);
}

track::Event decode_event(ByteReader& r) {
  const std::uint64_t kind = r.get_unsigned();
  if (kind > static_cast<std::uint64_t>(track::EventKind::first_homology_dimension))
    throw IoError("stored event kind is unknown");
  track::Event e{static_cast<track::EventKind>(kind), 0, 0, 0.0};
  e.n = r.get_unsigned();
  e.value = r.get_signed();
  e.scaled = r.get_double();
  return e;
}

void encode(ByteWriter& w, const track::RunCheckpoint& c) {
  encode(w, c.total);
  const auto& e = c.records;
  w.put_signed(e.high);
  w.put_signed(e.low);
  w.put_signed(e.scaled_high_m);
  w.put_signed(e.scaled_low_m);
  w.put_unsigned(e.scaled_high_n);
  w.put_unsigned(e.scaled_low_n);
  w.put_unsigned(e.face_dims_seen);
  w.put_unsigned(e.homology_dims_seen);
  w.put_unsigned(c.rows);
  w.put_unsigned(c.events);
  w.put_unsigned(c.blocks);
  w.put_unsigned(c.scanned_blocks);
  w.put_unsigned(c.checks.size());
  for (const auto& o : c.checks) {
    w.put_string(o.name);
    w.put_string(o.statement);
    w.put_unsigned(o.passed);
    w.put_unsigned(o.failed);
    w.put_unsigned(o.first_failure);
    w.put_string(o.first_failure_detail);
  }
}

track::RunCheckpoint decode_checkpoint(ByteReader& r) {
  track::RunCheckpoint c;
  c.total = decode_summary(r);
  auto& e = c.records;
  e.high = r.get_signed();
  e.low = r.get_signed();
  e.scaled_high_m = r.get_signed();
  e.scaled_low_m = r.get_signed();
  e.scaled_high_n = r.get_unsigned();
  e.scaled_low_n = r.get_unsigned();
  const std::uint64_t faces = r.get_unsigned(), homology = r.get_unsigned();
  if (faces > 0xFFFFFFFFULL || homology > 0xFFFFFFFFULL) throw IoError("stored event records are out of range");
  e.face_dims_seen = static_cast<std::uint32_t>(faces);
  e.homology_dims_seen = static_cast<std::uint32_t>(homology);
  c.rows = r.get_unsigned();
  c.events = r.get_unsigned();
  c.blocks = r.get_unsigned();
  c.scanned_blocks = r.get_unsigned();
  const std::uint64_t count = r.get_unsigned();
  if (count > 64) throw IoError("stored checkpoint lists too many checks");
  for (std::uint64_t i = 0; i < count; ++i) {
    track::CheckOutcome o;
    o.name = r.get_string();
    o.statement = r.get_string();
    o.passed = r.get_unsigned();
    o.failed = r.get_unsigned();
    o.first_failure = r.get_unsigned();
    o.first_failure_detail = r.get_string();
    c.checks.push_back(std::move(o));
  }
  return c;
}

}  // namespace sqfc::io
