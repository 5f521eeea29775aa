// SPDX-License-Identifier: MIT
// Every picture kind from every input that supports it, in PNG, SVG and PDF, with linear and
// logarithmic x (about 45 gnuplot runs, hence slow).
#include <gtest/gtest.h>

#include "io/plot_run_support.hpp"

namespace sqfc::io {
namespace {

TEST(PlotRender, EveryKindInEveryFormat) {
  const std::string gnuplot = plot_test::gnuplot_path();
  if (gnuplot.empty()) GTEST_SKIP() << "gnuplot is not installed (Debian package gnuplot-nox)";
  plot_test::TempDir dir;
  plot_test::write_all_inputs(dir);
  const std::vector<PlotFormat> all = {PlotFormat::png, PlotFormat::svg, PlotFormat::pdf};
  const std::vector<PlotKind> lines = {PlotKind::mertens, PlotKind::scaled, PlotKind::betti, PlotKind::faces, PlotKind::fredholm};
  int pictures = 0;
  for (const bool log_x : {false, true}) {
    pictures += plot_test::render_and_check(dir, "t.csv", lines, all, log_x, true, gnuplot);
    pictures += plot_test::render_and_check(dir, "t.envelope.csv", lines, all, log_x, true, gnuplot);
    pictures += plot_test::render_and_check(dir, "ev.csv", {PlotKind::mertens, PlotKind::scaled}, all, log_x, false, gnuplot);
    pictures += plot_test::render_and_check(dir, "bars.csv", {PlotKind::barcode, PlotKind::diagram}, all, log_x, false, gnuplot);
    pictures += plot_test::render_and_check(dir, "hist.csv", {PlotKind::green}, all, log_x, false, gnuplot);
  }
  EXPECT_EQ(pictures, 2 * 3 * (5 + 5 + 2 + 2 + 1));
}

}  // namespace
}  // namespace sqfc::io
