// SPDX-License-Identifier: MIT
// What a successful `sqfc table` writes: the header of design.md section 4, the formats, the
// sampling options, --from, the number syntax, the default output place, --quiet and the progress bar.
#include <fcntl.h>
#include <gtest/gtest.h>
#include <sys/stat.h>
#include <unistd.h>

#include <atomic>
#include <nlohmann/json.hpp>
#include <thread>

#include "cli_runner.hpp"

namespace sqfc::cli_test {
namespace {

// Runs a table into `name` inside `dir`, expects success with a silent stderr, returns the file.
std::string table_into(const ScratchDir& dir, std::vector<std::string> args, const std::string& name = "t.csv") {
  args.insert(args.begin(), "table");
  args.insert(args.end(), {"--out", name});
  const auto r = run_sqfc(dir, args);
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "") << describe(r);
  return read_file(dir.path(name));
}

TEST(TableOutput, HeaderIsTheDesignColumnListForEachN) {
  // N on both sides of the primorials 6, 30, 210, 2310, 30030, 510510, 9699690 (OEIS A002110), where
  // the top dimension D of K_N grows by one; N = 1..5 have D = 0 (no face above a vertex).
  const std::vector<unsigned long long> ns = {1,    2,    5,     6,     29,     30,     209,     210,
                                              2309, 2310, 30029, 30030, 510509, 510510, 9699689, 9699690};
  int checked = 0;
  for (const auto n : ns) {
    ScratchDir dir;
    const std::string to = std::to_string(n);
    const auto lines = split_lines(table_into(dir, {"--to", to, "--at", to}));
    ASSERT_EQ(lines.size(), 2u) << "N = " << n;
    const auto header = split_fields(lines[0]);
    EXPECT_EQ(header, expected_columns(n)) << "N = " << n << ": " << lines[0];
    const auto row = split_fields(lines[1]);
    EXPECT_EQ(row.size(), header.size()) << lines[1];
    EXPECT_EQ(row.at(0), to);
    ++checked;
  }
  EXPECT_EQ(checked, 16);
  // Spot checks of the rule itself (design.md: f0..fD, b0..bD).
  EXPECT_EQ(expected_columns(1).size(), 7u + 1 + 1 + 1);
  EXPECT_EQ(expected_columns(9699690).size(), 7u + 8 + 8 + 1);
}

TEST(TableOutput, FormatsCarryTheSameValues) {
  ScratchDir dir;
  const std::vector<std::string> common = {"--to", "1000", "--every", "7"};
  auto with = [&](std::vector<std::string> extra) {
    auto a = common;
    a.insert(a.end(), extra.begin(), extra.end());
    return a;
  };
  const auto csv = split_lines(table_into(dir, common, "t.csv"));
  const auto tsv = split_lines(table_into(dir, with({"--format", "tsv"}), "t.tsv"));
  const auto jsonl = split_lines(table_into(dir, with({"--format", "jsonl"}), "t.jsonl"));
  const auto bfile = split_lines(table_into(dir, with({"--format", "bfile", "--columns", "liouville"}), "t.txt"));
  ASSERT_EQ(csv.size(), 1u + 142);  // 7, 14, ..., 994
  ASSERT_EQ(tsv.size(), csv.size());
  ASSERT_EQ(jsonl.size(), csv.size() - 1);  // JSON lines has no header line
  const auto header = split_fields(csv[0]);
  ASSERT_EQ(header, expected_columns(1000));
  EXPECT_EQ(split_fields(tsv[0], '\t'), header);
  const auto liouville =
      static_cast<std::size_t>(std::find(header.begin(), header.end(), "liouville") - header.begin());
  std::size_t bfile_line = 0;
  while (bfile_line < bfile.size() && !bfile[bfile_line].empty() && bfile[bfile_line][0] == '#') ++bfile_line;
  EXPECT_EQ(bfile.size() - bfile_line, csv.size() - 1);
  int rows = 0;
  for (std::size_t i = 1; i < csv.size(); ++i) {
    const auto fields = split_fields(csv[i]);
    EXPECT_EQ(split_fields(tsv[i], '\t'), fields) << i;
    const auto object = nlohmann::ordered_json::parse(jsonl[i - 1]);
    std::vector<std::string> keys, values;
    for (const auto& [key, value] : object.items()) keys.push_back(key), values.push_back(value.dump());
    EXPECT_EQ(keys, header) << jsonl[i - 1];
    EXPECT_EQ(values, fields) << jsonl[i - 1];
    if (bfile_line + i - 1 < bfile.size()) {
      EXPECT_EQ(bfile[bfile_line + i - 1], fields[0] + " " + fields[liouville]);
    }
    ++rows;
  }
  EXPECT_EQ(rows, 142);
}

TEST(TableOutput, ColumnSelectionKeepsOrderPutsNFirstAndDropsRepeats) {
  ScratchDir dir;
  const auto full = split_lines(table_into(dir, {"--to", "300", "--every", "30"}, "full.csv"));
  const auto header = split_fields(full.at(0));
  struct Selection {
    std::string list;
    std::vector<std::string> columns;
  };
  const std::vector<Selection> selections = {
      {"mertens", {"n", "mertens"}},
      {"div_edges,mu", {"n", "div_edges", "mu"}},
      {"mertens,n,mertens", {"n", "mertens"}},
      {"f", {"n", "f0", "f1", "f2", "f3"}},  // `f` is f0..fD with D = 3 at N = 300
      {"b1,euler", {"n", "b1", "euler"}},
      {"f7,b9", {"n", "f7", "b9"}},  // dimensions above D = 3 are allowed and all zero (docs/cli.md)
  };
  int checked = 0;
  for (const auto& s : selections) {
    const auto lines = split_lines(table_into(dir, {"--to", "300", "--every", "30", "--columns", s.list}, "sel.csv"));
    ASSERT_EQ(lines.size(), full.size()) << s.list;
    EXPECT_EQ(split_fields(lines[0]), s.columns) << s.list;
    for (std::size_t i = 1; i < lines.size(); ++i) {
      const auto all = split_fields(full[i]);
      std::vector<std::string> expected;
      for (const auto& c : s.columns) {
        const auto at = std::find(header.begin(), header.end(), c);
        expected.push_back(at == header.end() ? "0" : all.at(static_cast<std::size_t>(at - header.begin())));
      }
      EXPECT_EQ(split_fields(lines[i]), expected) << s.list << " row " << i;
    }
    ++checked;
  }
  EXPECT_EQ(checked, 6);
}

TEST(TableOutput, FromGivesExactlyTheRowsOfTheFullRunFromA) {
  struct Case {
    std::vector<std::string> sampling;
    std::uint64_t from;
    std::size_t rows;  // expected rows with n >= from
  };
  const std::vector<Case> cases = {
      {{"--every", "50"}, 437, 12},                       // 450..1000
      {{"--every", "7"}, 700, 43},                        // 700..994
      {{"--at", "1,2,6,15,30,105,210,300,999"}, 105, 4},  // from is itself a sample point
      {{}, 30, 16},                                       // default log points: 32, 40, ..., 794, 1000
      {{"--log", "3"}, 5, 8},                             // 5, 10, 22, 46, 100, 215, 464, 1000
      {{"--every", "1000"}, 1000, 1},                     // from = to
      {{"--every", "1"}, 990, 11},                        // 990..1000
  };
  int checked = 0;
  for (const auto& c : cases) {
    ScratchDir dir;
    auto full_args = c.sampling;
    full_args.insert(full_args.begin(), {"--to", "1000"});
    auto from_args = full_args;
    from_args.insert(from_args.end(), {"--from", std::to_string(c.from)});
    const auto full = split_lines(table_into(dir, full_args, "full.csv"));
    const auto part = split_lines(table_into(dir, from_args, "part.csv"));
    ASSERT_FALSE(full.empty());
    std::vector<std::string> expected = {full[0]};
    for (std::size_t i = 1; i < full.size(); ++i)
      if (std::stoull(split_fields(full[i])[0]) >= c.from) expected.push_back(full[i]);
    EXPECT_EQ(part, expected) << "--from " << c.from;
    EXPECT_EQ(part.size(), c.rows + 1) << "--from " << c.from;
    ++checked;
  }
  EXPECT_EQ(checked, 7);
}

TEST(TableOutput, NumberSyntaxFormsAreEquivalent) {
  // design.md section 4: plain digits, 1e9, 10^9 and 2^40 all denote the same numbers.
  struct Pair {
    std::vector<std::string> written, plain;
  };
  const std::vector<Pair> pairs = {
      {{"--to", "1e3"}, {"--to", "1000"}},
      {{"--to", "10^3"}, {"--to", "1000"}},
      {{"--to", "2^10"}, {"--to", "1024"}},
      {{"--to", "3e2"}, {"--to", "300"}},
      {{"--to", "1E3"}, {"--to", "1000"}},                              // docs/cli.md: 1E6 is accepted
      {{"--to=1e3", "--every=50"}, {"--to", "1000", "--every", "50"}},  // docs/cli.md: --opt=value
      {{"--to", "2^20", "--every", "2^16"}, {"--to", "1048576", "--every", "65536"}},
      {{"--to", "1000", "--every", "1e2"}, {"--to", "1000", "--every", "100"}},
      {{"--to", "1000", "--at", "2^5,1e2,10^3"}, {"--to", "1000", "--at", "32,100,1000"}},
      {{"--to", "1000", "--every", "10", "--from", "1e2"}, {"--to", "1000", "--every", "10", "--from", "100"}},
      {{"--to", "1000", "--log", "1e1"}, {"--to", "1000", "--log", "10"}},
      {{"--to", "5000", "--every", "10", "--block-size", "2^10"},
       {"--to", "5000", "--every", "10", "--block-size", "1024"}},
      {{"--to", "1000", "--every", "10", "--threads", "2^1"}, {"--to", "1000", "--every", "10", "--threads", "2"}},
  };
  int checked = 0;
  for (const auto& p : pairs) {
    ScratchDir dir;
    const auto a = table_into(dir, p.written, "a.csv");
    const auto b = table_into(dir, p.plain, "b.csv");
    EXPECT_FALSE(a.empty()) << join(p.written, " ");
    EXPECT_TRUE(a == b) << join(p.written, " ") << " differs from " << join(p.plain, " ");
    ++checked;
  }
  EXPECT_EQ(checked, 13);
}

TEST(TableOutput, TableAndEventsBothOnStandardOutputInterleaveByN) {
  // docs/cli.md: with --out - and --events - the two streams interleave in increasing n. Taken apart
  // again they are the golden table and the golden events (both verified in test_golden_content.cpp).
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"table", "--to", "1000", "--every", "50", "--out", "-", "--events", "-"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{});  // no file, so no manifest
  std::vector<std::string> table, events;
  std::uint64_t last_n = 0;
  int ordered = 0;
  for (const auto& line : split_lines(r.out)) {
    const auto fields = split_fields(line);
    const bool is_event = line == "kind,n,value" || (fields.size() == 3 && !fields[0].empty() &&
                                                     std::isalpha(static_cast<unsigned char>(fields[0][0])));
    (is_event ? events : table).push_back(line);
    const std::string& n_text = is_event ? fields.at(1) : fields.at(0);
    if (!n_text.empty() && std::isdigit(static_cast<unsigned char>(n_text[0]))) {
      const auto n = std::stoull(n_text);
      EXPECT_GE(n, last_n) << line;
      last_n = n;
      ++ordered;
    }
  }
  EXPECT_EQ(join(table, "\n") + "\n", read_file(golden_dir() / "table_to1000_every50.csv"));
  EXPECT_EQ(join(events, "\n") + "\n", read_file(golden_dir() / "events_to1000.csv"));
  EXPECT_EQ(ordered, 20 + 135);
}

TEST(TableOutput, FifoOutputIsWrittenInPlace) {
  // docs/cli.md: an existing path that is not a regular file (a FIFO) is written in place: no
  // .part- file, no rename over it, and no manifest beside it (the manifest goes beside the events
  // file when that is a regular file).
  int checked = 0;
  for (const bool with_events : {false, true}) {
    ScratchDir dir;
    const auto fifo = dir.path("t.fifo");
    ASSERT_EQ(::mkfifo(fifo.c_str(), 0644), 0);
    // A non-blocking reader, so neither side can block forever whatever the binary does.
    const int reader = ::open(fifo.c_str(), O_RDONLY | O_NONBLOCK);
    ASSERT_GE(reader, 0);
    std::string received;
    std::atomic<bool> done{false};
    std::thread drain([&] {
      char buffer[4096];
      while (true) {
        const ssize_t got = ::read(reader, buffer, sizeof buffer);
        if (got > 0)
          received.append(buffer, static_cast<std::size_t>(got));
        else if (done)
          break;
        else
          std::this_thread::sleep_for(std::chrono::milliseconds(1));
      }
    });
    std::vector<std::string> args = {"table", "--to", "1000", "--every", "50", "--out", "t.fifo"};
    if (with_events) args.insert(args.end(), {"--events", "e.csv"});
    const auto r = run_sqfc(dir, args);
    done = true;
    drain.join();
    ::close(reader);
    EXPECT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(received, read_file(golden_dir() / "table_to1000_every50.csv"));
    EXPECT_TRUE(std::filesystem::is_fifo(fifo)) << "the FIFO was replaced";
    const std::vector<std::string> expected_files =
        with_events ? std::vector<std::string>{"e.csv", "e.csv.manifest.json", "t.fifo"}
                    : std::vector<std::string>{"t.fifo"};
    EXPECT_EQ(list_dir(dir.work()), expected_files);
    ++checked;
  }
  EXPECT_EQ(checked, 2);
}

TEST(TableOutput, DefaultOutputGoesUnderDataOutTable) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"table", "--to", "1000"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.out, "");
  EXPECT_EQ(list_dir(dir.work()), std::vector<std::string>{"data_out"});
  ASSERT_EQ(list_dir(dir.path("data_out")), std::vector<std::string>{"table"});
  const auto runs = list_dir(dir.path("data_out/table"));
  ASSERT_EQ(runs.size(), 1u);
  // One run folder, named by UTC time and N, e.g. 20261201T230256Z-to1000.
  EXPECT_TRUE(runs[0].size() > 7 && runs[0].substr(runs[0].size() - 7) == "-to1000") << runs[0];
  const auto run_dir = dir.path("data_out/table/" + runs[0]);
  EXPECT_EQ(list_dir(run_dir), (std::vector<std::string>{"table.csv", "table.csv.manifest.json"}));
  // Default sampling (10 log points per decade) and all columns: the golden log table.
  EXPECT_TRUE(read_file(run_dir / "table.csv") == read_file(golden_dir() / "table_to1000_log.csv"));
}

TEST(TableOutput, NoProgressBarWhenStderrIsAFile) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"table", "--to", "2e6", "--every", "1e5", "--out", "t.csv"});
  EXPECT_EQ(r.exit_code, 0) << describe(r);
  EXPECT_EQ(r.err, "") << describe(r);
  EXPECT_EQ(split_lines(read_file(dir.path("t.csv"))).size(), 21u);
}

TEST(TableOutput, QuietSilencesATerminalStderr) {
  // On a terminal stderr sqfc reports progress; --quiet and -q must silence it completely. The
  // first run shows that the pseudo-terminal is seen as one, so the quiet runs can fail.
  const std::vector<std::string> args = {"table", "--to", "2e6", "--every", "1e5", "--out", "t.csv"};
  RunOptions terminal;
  terminal.stderr_terminal = true;
  std::string loud_table;
  {
    ScratchDir dir;
    const auto r = run_sqfc(dir, args, terminal);
    EXPECT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_NE(r.err, "") << "no progress output on a terminal\n" << describe(r);
    loud_table = read_file(dir.path("t.csv"));
  }
  int checked = 0;
  for (const std::string flag : {"--quiet", "-q"}) {
    ScratchDir dir;
    auto quiet_args = args;
    quiet_args.push_back(flag);
    const auto r = run_sqfc(dir, quiet_args, terminal);
    EXPECT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(r.err, "") << flag << "\n" << describe(r);
    EXPECT_TRUE(read_file(dir.path("t.csv")) == loud_table) << flag;  // progress never leaks into the table
    ++checked;
  }
  EXPECT_EQ(checked, 2);
  EXPECT_EQ(split_lines(loud_table).size(), 21u);
}

}  // namespace
}  // namespace sqfc::cli_test
