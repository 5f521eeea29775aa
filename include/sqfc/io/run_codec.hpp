// SPDX-License-Identifier: MIT
/// @file run_codec.hpp  Compact byte encodings of block summaries, rows, events and checkpoints,
/// shared by the run store and the distributed run, with a checksum to detect damage.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "sqfc/track/block_summary.hpp"
#include "sqfc/track/events.hpp"
#include "sqfc/track/table_engine.hpp"
#include "sqfc/track/tracker_state.hpp"

namespace sqfc::io {

/// Bytes of an encoding. Integers are LEB128 varints (signed ones zigzag-mapped), doubles their
/// 8 IEEE-754 bytes little-endian, strings a varint length then the bytes
/// (docs/output-formats.md, "Run store").
using Bytes = std::string;

/// Appends encodings to a byte string.
class ByteWriter {
 public:
  void put_unsigned(std::uint64_t v);
  void put_signed(std::int64_t v);
  void put_double(double v);
  void put_string(std::string_view s);
  [[nodiscard]] const Bytes& bytes() const noexcept { return bytes_; }
  Bytes take() { return std::move(bytes_); }

 private:
  Bytes bytes_;
};

/// Reads what ByteWriter wrote. Every read past the end or of a malformed varint throws
/// IoError naming @p what, so damaged input is refused, never misread.
class ByteReader {
 public:
  ByteReader(std::string_view bytes, std::string what) : bytes_(bytes), what_(std::move(what)) {}
  std::uint64_t get_unsigned();
  std::int64_t get_signed();
  double get_double();
  std::string get_string();
  [[nodiscard]] bool at_end() const noexcept { return pos_ == bytes_.size(); }
  /// Throws IoError unless every byte was read.
  void expect_end() const;

 private:
  std::string_view bytes_;
  std::size_t pos_ = 0;
  std::string what_;
};

/// 64-bit FNV-1a of @p bytes, seeded with @p key (so a row moved to another key fails the check).
/// Detects accidental damage only; it is not a cryptographic hash. Complexity: O(size).
std::uint64_t checksum(std::string_view bytes, std::uint64_t key);

void encode(ByteWriter& w, const track::BlockSummary& s);
void encode(ByteWriter& w, const track::TableRow& r);
void encode(ByteWriter& w, const track::Event& e);
void encode(ByteWriter& w, const track::RunCheckpoint& c);
/// Decoders; each validates ranges (omega slots, mu in {-1, 0, 1}, known event kinds).
/// Throws: IoError on malformed input.
track::BlockSummary decode_summary(ByteReader& r);
track::TableRow decode_row(ByteReader& r);
track::Event decode_event(ByteReader& r);
track::RunCheckpoint decode_checkpoint(ByteReader& r);

/// Encodes one value alone.
template <class T>
Bytes encode_one(const T& value) {
  ByteWriter w;
  encode(w, value);
  return w.take();
}

}  // namespace sqfc::io
