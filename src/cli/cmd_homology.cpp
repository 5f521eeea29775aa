// SPDX-License-Identifier: MIT
// `sqfc homology`: parse, reduce, verify, write Betti rows, the barcode and a manifest.
#include "cmd_homology.hpp"

#include <CLI/CLI.hpp>
#include <iostream>
#include <memory>

#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/manifest.hpp"
#include "sqfc/topology/clique_complex.hpp"
#include "sqfc/topology/persistence.hpp"
#include "sqfc/track/check_tally.hpp"
#include "sqfc/track/sample_schedule.hpp"

namespace sqfc::cli {

void add_homology_command(CLI::App& app, HomologyArguments& a) {
  auto* cmd = app.add_subcommand("homology", "Persistent homology of K_1 ⊂ K_2 ⊂ ... from the boundary matrix, with its barcode");
  cmd->add_option("--to", a.to, "last n (required), at most 2*10^8")->required();
  cmd->add_option_function<std::string>("--every", [&a](const std::string& v) { a.every = v; }, "sample every multiple of S");
  cmd->add_option_function<std::string>("--at", [&a](const std::string& v) { a.at = v; }, "sample at a comma-separated list of n");
  cmd->add_option_function<std::string>("--log", [&a](const std::string& v) { a.log = v; }, "K log-spaced samples per decade, plus N (default 10)");
  cmd->add_option_function<std::string>("--barcode", [&a](const std::string& v) { a.barcode = v; }, "write the barcode (dimension,birth,death) to this CSV");
  cmd->add_option_function<std::string>("--field", [&a](const std::string& v) { a.field = v; }, "coefficients: 2 (default) or 3");
  cmd->add_option_function<std::string>("--smooth", [&a](const std::string& v) { a.smooth = v; }, "only faces whose primes are all <= Y");
  cmd->add_option_function<std::string>("--coprime-to", [&a](const std::string& v) { a.coprime_to = v; }, "only faces coprime to m");
  cmd->add_option_function<std::string>("--max-dim", [&a](const std::string& v) { a.max_dim = v; }, "only faces of dimension <= D");
  cmd->add_option_function<std::string>("--out", [&a](const std::string& v) { a.out = v; }, "Betti table CSV (default under data_out/homology/), - for stdout");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no messages"));
  a.plot_option = cmd->add_option("--plot", a.plot_list,
                                  "draw the barcode, persistence diagram (N <= 50000) and Betti curves beside the output; "
                                  "optional comma list of kinds (barcode, diagram, betti) and formats (png, svg, pdf)")
                      ->expected(0, 1);
  add_plot_look_options(*cmd, a.plot_look, false);
}

int run_homology_command(const HomologyArguments& a, const Invocation& invocation) {
  const Natural n_max = parse_number_option(a.to, "--to", 1, 200'000'000ULL);
  const track::SampleSchedule samples = parse_sample_request(a.every, a.at, a.log, n_max, "--to").schedule(1, n_max);
  topology::FaceFamily family;
  if (a.smooth) family.smooth_bound = parse_number_option(*a.smooth, "--smooth", 2, n_max);
  if (a.coprime_to) family.coprime_to = parse_number_option(*a.coprime_to, "--coprime-to", 1, ~0ULL);
  if (a.max_dim) family.max_dimension = static_cast<int>(parse_number_option(*a.max_dim, "--max-dim", 0, 15));
  const unsigned field = a.field ? static_cast<unsigned>(parse_number_option(*a.field, "--field", 2, 3)) : 2;
  if (a.out && a.out->empty()) throw InvalidArgument("--out: empty path (use - for standard output)");
  if (a.barcode && a.barcode->empty()) throw InvalidArgument("--barcode: empty path");

  const bool plot = a.plot_option && a.plot_option->count() > 0;
  io::PlotRequest barcode_plot, betti_plot;
  if (plot) {
    const auto choice = parse_plot_choice(a.plot_list, "--plot");
    bool bars = choice.kinds.empty() && n_max <= 50'000, betti = choice.kinds.empty();
    for (const auto k : choice.kinds) {
      if (k == io::PlotKind::barcode || k == io::PlotKind::diagram) bars = true;
      else if (k == io::PlotKind::betti) betti = true;
      else throw InvalidArgument("--plot: sqfc homology draws barcode, diagram and betti, not '" + std::string(io::plot_kind_name(k)) + "'");
    }
    if (bars && n_max > 50'000)
      throw InvalidArgument("--plot barcode and diagram are for small N (--to 50000 or less); use --plot betti");
    if (a.out && *a.out == "-") throw InvalidArgument("--plot draws beside the output file; give --out FILE (not -)");
    if (bars && a.barcode && *a.barcode == "-") throw InvalidArgument("--plot draws the barcode from a file; give --barcode FILE (not -)");
    apply_plot_look(a.plot_look, barcode_plot, false);
    io::check_gnuplot(barcode_plot.gnuplot);
    if (!choice.formats.empty()) barcode_plot.formats = choice.formats;
    betti_plot = barcode_plot;
    for (const auto k : choice.kinds)
      if (k != io::PlotKind::betti) barcode_plot.kinds.push_back(k);
    if (bars && barcode_plot.kinds.empty()) barcode_plot.kinds = {io::PlotKind::barcode, io::PlotKind::diagram};
    if (!bars) barcode_plot.kinds.clear();
    if (betti) betti_plot.kinds = {io::PlotKind::betti};
  }
  std::string out_path;
  if (a.out) {
    out_path = *a.out;
  } else {
    out_path = default_output_path("homology", invocation, n_max, "homology.csv");
  }
  std::optional<std::string> barcode_path = a.barcode;
  if (plot) {
    const std::string prefix = plot_prefix_beside(out_path);
    if (!barcode_plot.kinds.empty() && !barcode_path) barcode_path = prefix + ".barcode.csv";
    barcode_plot.prefix = betti_plot.prefix = prefix;
    if (barcode_path) barcode_plot.input = *barcode_path;
    betti_plot.input = out_path;
  }
  const auto started = std::chrono::system_clock::now();
  const auto clock_start = std::chrono::steady_clock::now();
  io::AtomicOutputFile out(out_path);
  std::unique_ptr<io::AtomicOutputFile> barcode;
  if (barcode_path) barcode = std::make_unique<io::AtomicOutputFile>(*barcode_path);
  std::unique_ptr<io::AtomicOutputFile> manifest;
  if (!out.is_stream()) manifest = std::make_unique<io::AtomicOutputFile>(out_path + ".manifest.json");

  throw_if_interrupted();
  const auto result = topology::compute_persistence(n_max, family, field);
  throw_if_interrupted();
  const int top = std::max(result.top_dimension, 0);

  std::vector<Natural> points;
  for (auto next = samples.next_at_or_after(1); next; next = samples.next_at_or_after(*next + 1)) points.push_back(*next);

  track::CheckTally tally;
  const bool full = family.is_full();
  std::size_t formula = 0, bars_check = 0;
  std::vector<std::vector<Count>> expected;
  if (full) {
    formula = tally.add("betti_formula", "Betti numbers from the barcode = odd squarefree counts in (n/2, n] (Bjorner 2011, design.md identity 2)");
    bars_check = tally.add("bars_m_2m", "every finite bar is [m, 2m) for odd squarefree m, in dimension omega(m) - 1");
    expected = topology::betti_by_formula(points, top);
    if (n_max <= 200) {
      // The clique complex of G_N (barycentric refinement) must have K_N's Betti numbers.
      const auto clique_check = tally.add("clique_complex", "the clique complex of the divisibility graph G_N has the Betti numbers of K_N (N <= 200)");
      auto clique = topology::divisibility_clique_complex_betti(n_max);
      clique.resize(static_cast<std::size_t>(top + 1), 0);
      tally.record(clique_check, clique == topology::betti_from_bars(result.bars, n_max, top), n_max);
    }
    const auto bad = topology::first_bar_not_m_2m(result.bars, n_max);
    tally.record(bars_check, !bad, bad ? bad->birth : 0, nullptr,
                 bad ? "bar of dimension " + std::to_string(bad->dimension) + " [" + std::to_string(bad->birth) + ", " +
                           (bad->death ? std::to_string(bad->death) : std::string("inf")) + ")"
                     : std::string());
  }

  std::ostream& o = out.stream();
  o << 'n';
  for (int d = 0; d <= top; ++d) o << ",b" << d;
  o << ",checks\n";
  for (std::size_t i = 0; i < points.size(); ++i) {
    const auto betti = topology::betti_from_bars(result.bars, points[i], top);
    o << points[i];
    for (const auto b : betti) o << ',' << b;
    std::string checks;
    if (full) tally.record(formula, betti == expected[i], points[i], &checks);
    else checks = "formula_checks_off:family_is_not_K_n";
    o << ',' << checks << '\n';
  }
  if (barcode) {
    std::ostream& b = barcode->stream();
    b << "dimension,birth,death\n";
    for (const auto& bar : result.bars)
      b << bar.dimension << ',' << bar.birth << ',' << (bar.death ? std::to_string(bar.death) : std::string("inf")) << '\n';
  }
  out.commit();
  if (barcode) barcode->commit();
  std::vector<std::string> pictures;
  if (plot) {
    for (const auto* request : {&barcode_plot, &betti_plot})
      if (!request->kinds.empty())
        for (const auto& made : io::make_plots(*request)) pictures.insert(pictures.end(), made.pictures.begin(), made.pictures.end());
  }
  const auto checks = tally.take();
  const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - clock_start).count();
  if (manifest) {
    io::Json m = io::manifest_head(invocation.argv);
    m.set("command", "homology");
    io::Json parameters;
    parameters.set("to", n_max);
    parameters.set("field", field);
    parameters.set("smooth", family.smooth_bound ? io::Json(*family.smooth_bound) : io::Json(nullptr));
    parameters.set("coprime_to", family.coprime_to ? io::Json(*family.coprime_to) : io::Json(nullptr));
    parameters.set("max_dim", family.max_dimension ? io::Json(*family.max_dimension) : io::Json(nullptr));
    parameters.set("sample_points", static_cast<std::uint64_t>(points.size()));
    m.set("parameters", std::move(parameters));
    io::set_run_times(m, started, wall);
    io::Json stats;
    stats.set("bars", static_cast<std::uint64_t>(result.bars.size()));
    stats.set("column_additions", result.column_additions);
    stats.set("cleared_columns", result.cleared_columns);
    stats.set("apparent_pairs", result.apparent_pairs);
    stats.set("method", result.method == topology::ReductionOrder::apparent_pairs
                            ? "apparent pairs, remaining columns reduced by apparent columns"
                            : "twist order with clearing");
    m.set("reduction", std::move(stats));
    if (plot) {
      io::Json list = io::Json::Array{};
      for (const auto& p : pictures) list.push(p);
      m.set("pictures", std::move(list));
    }
    m.set("formula_checks", full ? "on" : "off: the family is not K_n, so identity 2 does not apply");
    m.set("checks", io::checks_to_json(checks));
    m.set("checks_passed", track::all_passed(checks));
    manifest->stream() << m.dump(2) << '\n';
    manifest->commit();
  }
  if (!track::all_passed(checks)) {
    for (const auto& c : checks)
      if (c.failed)
        std::cerr << "sqfc homology: check " << c.name << " failed, first at n = " << c.first_failure
                  << (c.first_failure_detail.empty() ? "" : " (" + c.first_failure_detail + ")") << "\n";
    return exit_code::check_failed;
  }
  return exit_code::ok;
}

}  // namespace sqfc::cli
