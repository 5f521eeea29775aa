// SPDX-License-Identifier: MIT
// Pictures drawn by the binary: `sqfc table --plot`, `sqfc plot` from every input, and --plot on
// homology and fredholm (gnuplot runs, hence slow).
// Expected values: file signatures and well-formedness only (PNG signature, SVG parsed as XML:
// common practice); the picture sizes are the ones the tests ask for.
#include <gtest/gtest.h>

#include "cli_runner.hpp"
#include "io/plot_test_support.hpp"

namespace sqfc::cli_test {
namespace {

TEST(PlotRender, TablePlotDrawsBesideTheTable) {
  ScratchDir dir;
  const auto r = run_sqfc(dir, {"table", "--to", "2e5", "--log", "3", "--events", "ev.csv", "--out", "t.csv", "--plot", "png,svg,mertens,scaled,betti,faces,fredholm",
                                "--plot-width", "600", "--plot-height", "400", "--quiet"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  for (const std::string kind : {"mertens", "scaled", "betti", "faces", "fredholm"}) {
    std::string why;
    EXPECT_TRUE(plot_test::is_png_of_size(dir.path("t-" + kind + ".png"), 600, 400, why)) << kind << ": " << why;
    EXPECT_TRUE(plot_test::is_well_formed_svg(dir.path("t-" + kind + ".svg"), why)) << kind << ": " << why;
    EXPECT_TRUE(std::filesystem::exists(dir.path("t-" + kind + ".gp")));
    EXPECT_TRUE(std::filesystem::exists(dir.path("t-" + kind + ".dat")));
  }
  EXPECT_TRUE(std::filesystem::exists(dir.path("t.envelope.csv")));
  const std::string manifest = read_file(dir.path("t.csv.manifest.json"));
  EXPECT_NE(manifest.find("\"envelope\": \"t.envelope.csv\""), std::string::npos) << manifest;
  EXPECT_NE(manifest.find("\"t-fredholm.svg\""), std::string::npos) << manifest;
  EXPECT_NE(manifest.find("\"envelope_columns\": 600"), std::string::npos) << manifest;
  // Without a list, --plot draws every kind but betti (whose envelope costs a per-n pass), in PNG;
  // the betti picture from that envelope is refused with a hint.
  const auto d = run_sqfc(dir, {"table", "--to", "1e5", "--out", "d.csv", "--plot", "--quiet"});
  ASSERT_EQ(d.exit_code, 0) << describe(d);
  for (const std::string kind : {"mertens", "scaled", "faces", "fredholm"}) EXPECT_TRUE(std::filesystem::exists(dir.path("d-" + kind + ".png"))) << kind;
  EXPECT_FALSE(std::filesystem::exists(dir.path("d-betti.png")));
  const auto refused = run_sqfc(dir, {"plot", "d.envelope.csv", "--kind", "betti", "--out", "x"});
  EXPECT_EQ(refused.exit_code, 2);
  EXPECT_NE(refused.err.find("--envelope-betti"), std::string::npos) << describe(refused);
  // The zeros of M up to 2*10^5 are marked (from the events file).
  EXPECT_NE(read_file(dir.path("t-mertens.gp")).find("zeros ("), std::string::npos);
}

TEST(PlotRender, PlotCommandFromEveryInput) {
  ScratchDir dir;
  ASSERT_EQ(run_sqfc(dir, {"table", "--to", "5000", "--every", "50", "--format", "tsv", "--events", "ev.csv", "--out", "t.tsv", "--quiet"}).exit_code, 0);
  ASSERT_EQ(run_sqfc(dir, {"homology", "--to", "400", "--barcode", "bars.csv", "--out", "h.csv"}).exit_code, 0);
  ASSERT_EQ(run_sqfc(dir, {"fredholm", "--to", "120", "--every", "40", "--histogram", "g.csv", "--out", "f.csv", "--quiet"}).exit_code, 0);
  struct Job {
    std::string input, kind, format;
  };
  const std::vector<Job> jobs = {{"t.tsv", "mertens,betti", "pdf"}, {"ev.csv", "scaled", "png"}, {"bars.csv", "barcode,diagram", "svg"},
                                 {"g.csv", "green", "png,pdf"}, {"f.csv", "fredholm", "svg"}, {"h.csv", "betti", "png"}};
  int pictures = 0;
  for (const auto& j : jobs) {
    const auto r = run_sqfc(dir, {"plot", j.input, "--kind", j.kind, "--format", j.format, "--out", "p/" + j.input, "--log-x"});
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    for (const auto& path : split_lines(r.out)) {
      const std::filesystem::path p = dir.path(path);
      std::string why;
      const std::string ext = p.extension().string();
      const bool ok = ext == ".png" ? plot_test::is_png_of_size(p, 1200, 720, why)
                      : ext == ".svg" ? plot_test::is_well_formed_svg(p, why)
                                      : plot_test::is_pdf(p, why);
      EXPECT_TRUE(ok) << path << ": " << why;
      pictures += ok;
    }
  }
  EXPECT_EQ(pictures, 2 + 1 + 2 + 2 + 1 + 1);
  // Without --out the pictures go under data_out/plot/.
  const auto r = run_sqfc(dir, {"plot", "f.csv", "-q"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  const auto stamps = list_dir(dir.path("data_out/plot"));
  ASSERT_EQ(stamps.size(), 1U);
  EXPECT_TRUE(std::filesystem::exists(dir.path("data_out/plot/" + stamps[0] + "/f-fredholm.png")));
}

TEST(PlotRender, HomologyAndFredholmDrawBesideTheirOutputs) {
  ScratchDir dir;
  auto r = run_sqfc(dir, {"homology", "--to", "1000", "--out", "h.csv", "--plot"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  for (const std::string f : {"h.barcode.csv", "h-barcode.png", "h-diagram.png", "h-betti.png", "h-barcode.gp"})
    EXPECT_TRUE(std::filesystem::exists(dir.path(f))) << f;
  r = run_sqfc(dir, {"fredholm", "--to", "200", "--every", "50", "--out", "f.csv", "--plot", "green,fredholm,pdf", "--quiet"});
  ASSERT_EQ(r.exit_code, 0) << describe(r);
  for (const std::string f : {"f.histogram.csv", "f-green.pdf", "f-fredholm.pdf"}) EXPECT_TRUE(std::filesystem::exists(dir.path(f))) << f;
}

}  // namespace
}  // namespace sqfc::cli_test
