// SPDX-License-Identifier: MIT
// The plot module: input recognition, the envelope file, every picture kind in PNG, SVG and PDF,
// scripts that gnuplot can re-run, and refusals (wrong kind, missing gnuplot, large barcodes).
// Expected values are the inputs the tests write themselves (no outside values).
#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "io/plot_test_support.hpp"
#include "io/plot_run_support.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/io/columns.hpp"
#include "sqfc/io/envelope_file.hpp"
#include "sqfc/io/plot.hpp"
#include "sqfc/io/table_writer.hpp"
#include "sqfc/topology/persistence.hpp"
#include "sqfc/track/table_engine.hpp"

namespace sqfc::io {
namespace {

namespace fs = std::filesystem;
using plot_test::TempDir;
using plot_test::gnuplot_path;
using plot_test::write_run;
using plot_test::write_text;

TEST(Plot, RecognisesEveryInputFromItsFirstLines) {
  TempDir dir;
  write_run(dir, 5000, 100, false);
  write_text(dir.path("bars.csv"), "dimension,birth,death\n0,2,inf\n0,3,6\n");
  write_text(dir.path("hist.csv"), "n,value,count,diagonal_count\n10,0,20,0\n10,1,16,6\n");
  write_text(dir.path("t.tsv"), "n\tmertens\n1\t1\n");
  write_text(dir.path("t.jsonl"), "{\"n\":1,\"mertens\":1}\n");
  write_text(dir.path("empty.csv"), "");
  write_text(dir.path("other.csv"), "a,b\n1,2\n");
  EXPECT_EQ(detect_plot_input(dir.path("t.csv").string()), PlotInput::table);
  EXPECT_EQ(detect_plot_input(dir.path("t.tsv").string()), PlotInput::table);
  EXPECT_EQ(detect_plot_input(dir.path("t.jsonl").string()), PlotInput::table);
  EXPECT_EQ(detect_plot_input(dir.path("t.envelope.csv").string()), PlotInput::envelope);
  EXPECT_EQ(detect_plot_input(dir.path("ev.csv").string()), PlotInput::events);
  EXPECT_EQ(detect_plot_input(dir.path("bars.csv").string()), PlotInput::barcode);
  EXPECT_EQ(detect_plot_input(dir.path("hist.csv").string()), PlotInput::histogram);
  EXPECT_THROW(detect_plot_input(dir.path("empty.csv").string()), InvalidArgument);
  EXPECT_THROW(detect_plot_input(dir.path("other.csv").string()), InvalidArgument);
  EXPECT_THROW(detect_plot_input(dir.path("missing.csv").string()), IoError);
  const auto kinds = supported_plot_kinds(dir.path("t.csv").string(), PlotInput::table);
  EXPECT_EQ(kinds, (std::vector<PlotKind>{PlotKind::mertens, PlotKind::scaled, PlotKind::betti, PlotKind::faces, PlotKind::fredholm}));
  EXPECT_EQ(supported_plot_kinds(dir.path("t.tsv").string(), PlotInput::table), (std::vector<PlotKind>{PlotKind::mertens, PlotKind::scaled}));
}

TEST(Plot, EnvelopeFileRoundTrip) {
  TempDir dir;
  const auto env = write_run(dir, 20'000, 64, true);
  const auto info = read_envelope_info(dir.path("t.envelope.csv").string());
  EXPECT_EQ(info.first, 1U);
  EXPECT_EQ(info.last, 20'000U);
  EXPECT_TRUE(info.log_x);
  EXPECT_EQ(info.columns, env.columns.size());
  // Every exact field read back equals the envelope in memory.
  std::ifstream in(dir.path("t.envelope.csv"));
  std::string line;
  std::getline(in, line);
  std::getline(in, line);
  std::getline(in, line);
  std::size_t rows = 0;
  const auto index = [&](const std::string& name) {
    return static_cast<std::size_t>(std::find(info.header.begin(), info.header.end(), name) - info.header.begin());
  };
  while (std::getline(in, line)) {
    std::vector<std::string> f;
    std::stringstream s(line);
    for (std::string x; std::getline(s, x, ',');) f.push_back(x);
    ASSERT_EQ(f.size(), info.header.size());
    const auto& c = env.columns[rows];
    EXPECT_EQ(std::stoull(f[index("lo")]), c.lo);
    EXPECT_EQ(std::stoull(f[index("hi")]), c.hi);
    EXPECT_EQ(std::stoll(f[index("mertens_min")]), c.mertens.min);
    EXPECT_EQ(std::stoull(f[index("mertens_min_n")]), c.mertens.min_n);
    EXPECT_EQ(std::stoll(f[index("mertens_max")]), c.mertens.max);
    EXPECT_EQ(std::stoll(f[index("b1_max")]), c.betti[1].max);
    EXPECT_EQ(std::stoll(f[index("f2_last")]), c.faces[2].last);
    EXPECT_EQ(std::stoull(f[index("scaled_max_n")]), c.scaled.max_n);
    ++rows;
  }
  EXPECT_EQ(rows, env.columns.size());
  write_text(dir.path("bad.csv"), "# sqfc envelope: x\nno facts\n");
  EXPECT_THROW(read_envelope_info(dir.path("bad.csv").string()), InvalidArgument);
}

TEST(Plot, EachInputRendersInEachFormatAndTheScriptRunsAgain) {
  const std::string gnuplot = gnuplot_path();
  if (gnuplot.empty()) GTEST_SKIP() << "gnuplot is not installed (Debian package gnuplot-nox)";
  TempDir dir;
  plot_test::write_all_inputs(dir);
  int pictures = 0;
  // The full matrix (every kind in every format, linear and log x) is in test_plot_render_slow.cpp.
  pictures += plot_test::render_and_check(dir, "t.envelope.csv", {PlotKind::mertens}, {PlotFormat::png, PlotFormat::svg, PlotFormat::pdf}, false, true, gnuplot);
  pictures += plot_test::render_and_check(dir, "t.csv", {PlotKind::betti}, {PlotFormat::png}, true, false, gnuplot);
  pictures += plot_test::render_and_check(dir, "bars.csv", {PlotKind::barcode}, {PlotFormat::svg}, false, false, gnuplot);
  pictures += plot_test::render_and_check(dir, "hist.csv", {PlotKind::green}, {PlotFormat::pdf}, false, false, gnuplot);
  EXPECT_EQ(pictures, 6);
  // A researcher re-runs a kept script in its folder, here to a new SVG.
  const std::string again = "cd '" + dir.path("out").string() + "' && '" + gnuplot +
                            "' -e 'fmt=\"svg\"; outfile=\"again.svg\"' lin-t.envelope-mertens.gp 2>/dev/null";
  ASSERT_EQ(std::system(again.c_str()), 0);
  std::string why;
  EXPECT_TRUE(plot_test::is_well_formed_svg(dir.path("out/again.svg"), why)) << why;
  for (const auto& e : fs::directory_iterator(dir.path("out")))
    EXPECT_EQ(e.path().filename().string().find(".part-"), std::string::npos) << e.path();
}

TEST(Plot, RefusesWhatItCannotDraw) {
  TempDir dir;
  write_run(dir, 3000, 50, false);
  write_text(dir.path("bars.csv"), "dimension,birth,death\n0,2,inf\n0,3,6\n0,5,10\n");
  PlotRequest r;
  r.input = dir.path("t.csv").string();
  r.prefix = dir.path("out/p").string();
  r.gnuplot = gnuplot_path();
  r.kinds = {PlotKind::barcode};
  EXPECT_THROW(check_plot_request(r), InvalidArgument);  // a table has no bars
  r.kinds = {PlotKind::mertens};
  r.gnuplot = dir.path("no-such-gnuplot").string();
  try {
    check_plot_request(r);
    ADD_FAILURE() << "a missing gnuplot was accepted";
  } catch (const IoError& e) {
    EXPECT_NE(std::string(e.what()).find("gnuplot-nox"), std::string::npos) << e.what();
  }
  r.gnuplot = gnuplot_path();
  r.input = dir.path("bars.csv").string();
  r.kinds = {PlotKind::barcode};
  r.max_bars = 2;
  EXPECT_THROW(check_plot_request(r), InvalidArgument);
  r.input = dir.path("nothing.csv").string();
  EXPECT_THROW(check_plot_request(r), InvalidArgument);
  r.input = dir.path("t.csv").string();
  r.kinds = {};
  r.width = 10;
  EXPECT_THROW(check_plot_request(r), InvalidArgument);
  EXPECT_FALSE(fs::exists(dir.path("out")));  // refusals write nothing
}

}  // namespace
}  // namespace sqfc::io
