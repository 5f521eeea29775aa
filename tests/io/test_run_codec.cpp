// SPDX-License-Identifier: MIT
// Tests of io/run_codec: every encoding round-trips exactly (random values, edges next to 2^63),
// and truncated or damaged bytes are refused or change the checksum.
#include "sqfc/io/run_codec.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <random>

#include "oracles/test_support.hpp"
#include "sqfc/core/error.hpp"
#include "track/collecting_sink.hpp"

namespace {

using namespace sqfc;
namespace st = sqfc::testing;

TEST(RunCodec, IntegersRoundTripIncludingExtremes) {
  auto rng = st::test_rng(61);
  std::vector<std::int64_t> values = {0, 1, -1, 63, 64, -64, -65, std::numeric_limits<std::int64_t>::max(),
                                      std::numeric_limits<std::int64_t>::min()};
  for (int i = 0; i < 1000; ++i) values.push_back(static_cast<std::int64_t>(rng()) >> (rng() % 64));
  io::ByteWriter w;
  for (auto v : values) {
    w.put_signed(v);
    w.put_unsigned(static_cast<std::uint64_t>(v));
  }
  io::ByteReader r(w.bytes(), "test bytes");
  for (auto v : values) {
    EXPECT_EQ(r.get_signed(), v) << st::seed_note();
    EXPECT_EQ(r.get_unsigned(), static_cast<std::uint64_t>(v));
  }
  r.expect_end();
  EXPECT_EQ(values.size(), 1009U);
}

TEST(RunCodec, TruncatedInputThrowsEverywhere) {
  track::RunCheckpoint c;
  c.total.hi = 4194305;
  c.total.mertens = -12;
  c.checks.push_back({"euler_poincare", "statement", 5, 0, 0, ""});
  const io::Bytes bytes = io::encode_one(c);
  std::size_t refused = 0;
  for (std::size_t cut = 0; cut < bytes.size(); ++cut) {
    io::ByteReader r(std::string_view(bytes).substr(0, cut), "cut checkpoint");
    EXPECT_THROW((void)io::decode_checkpoint(r), IoError) << "cut at " << cut;
    ++refused;
  }
  EXPECT_EQ(refused, bytes.size());
  io::ByteReader whole(bytes, "checkpoint");
  EXPECT_EQ(io::decode_checkpoint(whole), c);
  whole.expect_end();
}

TEST(RunCodec, RandomRecordsRoundTrip) {
  auto rng = st::test_rng(62);
  std::uniform_int_distribution<std::int64_t> small(-1'000'000, 1'000'000);
  const int cases = 200 * static_cast<int>(st::test_multiplier());
  for (int i = 0; i < cases; ++i) {
    track::BlockSummary s;
    s.lo = rng() % 10'000'000'000'000'000ULL + 1;
    s.hi = s.lo + rng() % (1U << 24);
    s.mertens = small(rng);
    s.liouville = small(rng);
    for (int k = 0; k < config::omega_slots; ++k) s.odd_squarefree[k] = rng() >> (rng() % 64);
    for (int k = 0; k < config::omega_slots; ++k) s.even_squarefree[k] = rng() >> (rng() % 64);
    s.prefix_low = -small(rng);
    s.prefix_high = small(rng);
    s.mu_last = static_cast<int>(rng() % 3) - 1;
    const io::Bytes sb = io::encode_one(s);
    io::ByteReader rs(sb, "summary");
    EXPECT_EQ(io::decode_summary(rs), s) << st::seed_note();

    track::TableRow row;
    row.n = rng();
    row.mu = static_cast<int>(rng() % 3) - 1;
    row.mertens = small(rng);
    row.euler = 1 - row.mertens;
    row.squarefree = rng();
    row.liouville = small(rng);
    row.fredholm = (rng() & 1) ? 1 : -1;
    for (int k = 0; k < config::omega_slots; ++k) row.faces[k] = rng();
    for (int k = 0; k < config::omega_slots; ++k) row.betti[k] = small(rng);
    row.div_edges = rng();
    const io::Bytes rb = io::encode_one(row);
    io::ByteReader rr(rb, "row");
    EXPECT_TRUE(st::same_row(io::decode_row(rr), row)) << st::seed_note();

    const track::Event e{static_cast<track::EventKind>(rng() % 7), rng(), small(rng),
                         static_cast<double>(small(rng)) / std::sqrt(static_cast<double>(rng() % 1000 + 1))};
    const io::Bytes eb = io::encode_one(e);
    io::ByteReader re(eb, "event");
    EXPECT_EQ(io::decode_event(re), e) << st::seed_note();
  }
}

TEST(RunCodec, OutOfRangeFieldsAreRefused) {
  io::ByteWriter w;
  w.put_unsigned(9);  // no such event kind
  w.put_unsigned(5);
  w.put_signed(0);
  w.put_double(0.0);
  io::ByteReader r(w.bytes(), "event");
  EXPECT_THROW((void)io::decode_event(r), IoError);
  track::TableRow row;
  row.mu = 1;
  io::Bytes bytes = io::encode_one(row);
  bytes[1] = 8;  // mu = 4 after zigzag
  io::ByteReader rr(bytes, "row");
  EXPECT_THROW((void)io::decode_row(rr), IoError);
}

TEST(RunCodec, ChecksumSeesEveryFlippedBitAndTheKey) {
  const io::Bytes bytes = io::encode_one(track::BlockSummary{});
  const auto base = io::checksum(bytes, 7);
  EXPECT_NE(io::checksum(bytes, 8), base);
  std::size_t flips = 0;
  for (std::size_t i = 0; i < bytes.size(); ++i)
    for (int bit = 0; bit < 8; ++bit) {
      io::Bytes damaged = bytes;
      damaged[i] = static_cast<char>(damaged[i] ^ (1 << bit));
      EXPECT_NE(io::checksum(damaged, 7), base);
      ++flips;
    }
  EXPECT_EQ(flips, 8 * bytes.size());
}

}  // namespace
