// SPDX-License-Identifier: MIT
// Inputs for the plot tests (a run's table, events and envelope, a barcode, a histogram) and one
// helper that renders pictures and checks every file it reports.
#pragma once

#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <stdexcept>
#include <string>
#include <vector>

#include "io/plot_test_support.hpp"
#include "sqfc/io/columns.hpp"
#include "sqfc/io/envelope_file.hpp"
#include "sqfc/io/plot.hpp"
#include "sqfc/io/table_writer.hpp"
#include "sqfc/topology/persistence.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::plot_test {

using namespace sqfc::io;
namespace fs = std::filesystem;

class TempDir {
 public:
  TempDir() {
    std::string pattern = (fs::temp_directory_path() / "sqfc-plot-XXXXXX").string();
    if (::mkdtemp(pattern.data()) == nullptr) throw std::runtime_error("mkdtemp failed");
    root_ = pattern;
  }
  ~TempDir() {
    std::error_code ec;
    fs::remove_all(root_, ec);
  }
  [[nodiscard]] fs::path path(const std::string& name) const { return root_ / name; }

 private:
  fs::path root_;
};

inline std::string gnuplot_path() {
  for (const char* p : {"/usr/bin/gnuplot", "/usr/local/bin/gnuplot"})
    if (::access(p, X_OK) == 0) return p;
  return "";
}

class EverySink : public track::TableSink {
 public:
  EverySink(TableWriter& table, EventWriter& events) : table_(table), events_(events) {}
  void on_row(const track::TableRow& row) override { table_.write(row); }
  void on_event(const track::Event& e) override { events_.write(e); }

 private:
  TableWriter& table_;
  EventWriter& events_;
};

// A table (every 97th n), its events and its envelope up to `to`, written into `dir`.
inline track::Envelope write_run(const TempDir& dir, Natural to, unsigned width, bool log_x) {
  std::ofstream table(dir.path("t.csv")), events(dir.path("ev.csv")), envelope(dir.path("t.envelope.csv"));
  TableWriter tw(table, TableFormat::csv, default_columns(to));
  EventWriter ew(events);
  EverySink sink(tw, ew);
  track::TableRunOptions o;
  o.to = to;
  o.threads = 2;
  o.block_size = 1024;
  o.segment_size = 4096;
  o.samples = track::SampleSchedule(1, to, Natural{97}, {}, std::nullopt, true);
  o.events = true;
  o.envelope = track::EnvelopeOptions{1, to, width, log_x, true};
  auto report = track::run_table(o, sink);
  write_envelope(envelope, *report.envelope, 5);
  return *report.envelope;
}

inline void write_text(const fs::path& p, const std::string& text) { std::ofstream(p) << text; }


/// Writes t.csv, ev.csv, t.envelope.csv (to 30000, 300 columns), bars.csv (sqfc barcode of K_300)
/// and hist.csv (a small hand-made histogram in the format of sqfc fredholm --histogram).
inline void write_all_inputs(const TempDir& dir) {
  write_run(dir, 30'000, 300, false);
  std::ofstream bars(dir.path("bars.csv"));
  bars << "dimension,birth,death\n";
  for (const auto& b : topology::compute_persistence(300, topology::FaceFamily{}, 2).bars)
    bars << b.dimension << ',' << b.birth << ',' << (b.death ? std::to_string(b.death) : std::string("inf")) << '\n';
  write_text(dir.path("hist.csv"), "n,value,count,diagonal_count\n10,-1,2,0\n10,0,20,0\n10,1,14,6\n20,-2,4,0\n20,0,80,2\n20,1,60,9\n");
}

/// Renders `kinds` of `input` (in dir) to dir/out/<lin|log>-<stem>-<kind>.*, checks the data file,
/// the script and every picture (PNG signature and size, SVG through an XML parser, PDF header
/// and trailer). Returns the number of pictures checked.
inline int render_and_check(const TempDir& dir, const std::string& input, const std::vector<PlotKind>& kinds,
                            const std::vector<PlotFormat>& formats, bool log_x, bool events, const std::string& gnuplot) {
  PlotRequest r;
  r.input = dir.path(input).string();
  if (events) r.events = dir.path("ev.csv").string();
  r.kinds = kinds;
  r.formats = formats;
  r.prefix = dir.path(std::string("out/") + (log_x ? "log-" : "lin-") + fs::path(input).stem().string()).string();
  r.log_x = log_x;
  r.width = 640;
  r.height = 400;
  r.gnuplot = gnuplot;
  const auto outputs = make_plots(r);
  EXPECT_EQ(outputs.size(), kinds.size()) << input;
  int pictures = 0;
  for (std::size_t i = 0; i < outputs.size(); ++i) {
    const auto& o = outputs[i];
    EXPECT_EQ(o.kind, kinds[i]);
    EXPECT_GT(fs::file_size(o.data), 0U) << o.data;
    EXPECT_GT(fs::file_size(o.script), 0U) << o.script;
    EXPECT_EQ(o.pictures.size(), formats.size());
    for (std::size_t j = 0; j < o.pictures.size(); ++j) {
      std::string why;
      const fs::path p = o.pictures[j];
      bool ok = false;
      if (formats[j] == PlotFormat::png) ok = is_png_of_size(p, 640, 400, why);
      if (formats[j] == PlotFormat::svg) ok = is_well_formed_svg(p, why);
      if (formats[j] == PlotFormat::pdf) ok = is_pdf(p, why);
      EXPECT_TRUE(ok) << p << ": " << why;
      pictures += ok;
    }
  }
  return pictures;
}

}  // namespace sqfc::plot_test
