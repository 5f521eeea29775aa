// SPDX-License-Identifier: MIT
// `sqfc fredholm`: parse, run, write rows, histograms, an optional matrix dump and a manifest.
#include "cmd_fredholm.hpp"

#include <CLI/CLI.hpp>
#include <iostream>
#include <memory>

#include "sqfc/core/config.hpp"
#include "sqfc/core/checked.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/core/version.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/manifest.hpp"
#include "sqfc/io/table_writer.hpp"
#include "sqfc/track/fredholm_run.hpp"

namespace sqfc::cli {
namespace {

// Largest n for the bordered default; beyond it the closed form is the default.
constexpr Natural bordered_default_limit = 10'000;

std::string wide_text(Wide v) { return to_string_wide(v); }

class FredholmFileSink : public track::FredholmSink {
 public:
  FredholmFileSink(std::ostream& out, std::ostream* histogram) : out_(out), histogram_(histogram) {
    out_ << "n,vertices,edges,fredholm,energy,green_min,green_max,green_distinct,positive_eigenvalues,"
            "negative_eigenvalues,even_faces,odd_faces,flint_fredholm,spectrum_positive,spectrum_negative,"
            "spectrum_margin,div_fredholm,checks\n";
    if (histogram_) *histogram_ << "n,value,count,diagonal_count\n";
  }
  void on_row(const track::FredholmRow& r) override {
    out_ << r.n << ',' << r.vertices << ',' << r.edges << ',' << r.fredholm << ',' << wide_text(r.energy) << ',';
    if (r.stats && r.vertices > 0) out_ << r.stats->min() << ',' << r.stats->max() << ',' << r.stats->histogram.size() << ',';
    else out_ << ",,,";
    if (r.has_inertia) out_ << r.positive_eigenvalues << ',' << r.negative_eigenvalues << ',';
    else out_ << ",,";
    out_ << r.even_faces << ',' << r.odd_faces << ',' << r.flint_fredholm.value_or("") << ',';
    if (r.has_spectrum) out_ << r.spectrum_positive << ',' << r.spectrum_negative << ',' << io::format_decimal(r.spectrum_margin, 6) << ',';
    else out_ << ",,,";
    out_ << r.div_fredholm.value_or("") << ',' << r.checks << '\n';
    if (histogram_ && r.stats) {
      for (const auto& [value, count] : r.stats->histogram) {
        const auto d = r.stats->diagonal_histogram.find(value);
        *histogram_ << r.n << ',' << value << ',' << count << ',' << (d == r.stats->diagonal_histogram.end() ? 0 : d->second)
                    << '\n';
      }
      // Diagonal values that never occur off the diagonal cannot exist: every diagonal entry
      // is also an entry. Nothing else to write.
    }
  }

 private:
  std::ostream& out_;
  std::ostream* histogram_;
};

}  // namespace

void add_fredholm_command(CLI::App& app, FredholmArguments& a) {
  auto* cmd = app.add_subcommand("fredholm", "Fredholm determinant and Green function of the shared-factor graph H_n");
  cmd->add_option("--to", a.to, "last n (required)")->required();
  cmd->add_option_function<std::string>("--every", [&a](const std::string& v) { a.every = v; }, "sample every multiple of S");
  cmd->add_option_function<std::string>("--at", [&a](const std::string& v) { a.at = v; }, "sample at a comma-separated list of n");
  cmd->add_option_function<std::string>("--log", [&a](const std::string& v) { a.log = v; }, "K log-spaced samples per decade, plus N (default 10)");
  cmd->add_option_function<std::string>("--method", [&a](const std::string& v) { a.method = v; },
                                        "bordered (exact matrix; default for N <= 10^4), closed (closed form; default above) or "
                                        "flint (bordered plus FLINT determinants, certified inverse and zeta identity; N <= 2000)");
  cmd->add_flag("--green-stats", a.green_stats, std::string("Green value extremes and distinct values at each sample"));
  cmd->add_flag("--cross-check", a.cross_check, std::string("bordered: compare every entry with the closed form at each sample"));
  cmd->add_flag("--spectrum", a.spectrum, std::string("LAPACK eigenvalue signs with a verified margin at samples n <= 5000"));
  cmd->add_flag("--divisibility", a.divisibility,
                std::string("exploratory: det(1 + A(G_n)) of the divisibility graph at samples n <= 2000 (FLINT)"));
  cmd->add_option_function<std::string>("--histogram", [&a](const std::string& v) { a.histogram = v; },
                                        "write Green value histograms (n,value,count,diagonal_count) to this CSV");
  cmd->add_option_function<std::vector<std::string>>(
         "--dump-green",
         [&a](const std::vector<std::string>& v) {
           a.dump_n = v.at(0);
           a.dump_file = v.at(1);
         },
         "write g_n at this n to FILE (Matrix Market, symmetric integer)")
      ->expected(2);
  cmd->add_option_function<std::string>("--threads", [&a](const std::string& v) { a.threads = v; }, "threads for the bordered update");
  cmd->add_option_function<std::string>("--memory-limit", [&a](const std::string& v) { a.memory_limit = v; },
                                        "bytes the bordered matrix may use (default 2^32)");
  cmd->add_option_function<std::string>("--out", [&a](const std::string& v) { a.out = v; }, "output CSV (default under data_out/fredholm/), - for stdout");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no progress bar"));
  a.plot_option = cmd->add_option("--plot", a.plot_list,
                                  "draw the Fredholm sign and, with a histogram, the Green value histogram beside the output; "
                                  "optional comma list of kinds (fredholm, green) and formats (png, svg, pdf)")
                      ->expected(0, 1);
  add_plot_look_options(*cmd, a.plot_look, false);
}

int run_fredholm_command(const FredholmArguments& a, const Invocation& invocation) {
  track::FredholmRunOptions options;
  options.to = parse_number_option(a.to, "--to", 1, 200'000'000ULL);
  const Natural n_max = options.to;
  SampleRequest sampling = parse_sample_request(a.every, a.at, a.log, n_max, "--to");
  std::optional<Natural> dump_n;
  if (a.dump_n) {
    dump_n = parse_number_option(*a.dump_n, "--dump-green", 1, n_max);
    if (a.dump_file->empty()) throw InvalidArgument("--dump-green: empty file name");
    sampling.at.push_back(*dump_n);
  }
  options.samples = sampling.schedule(1, n_max);
  if (options.samples.empty()) throw InvalidArgument("no sample point of --every/--at lies in [1, --to " + a.to + "]");
  if (a.method && *a.method != "bordered" && *a.method != "closed" && *a.method != "flint")
    throw InvalidArgument("--method: unknown method '" + *a.method + "' (use bordered, closed or flint)");
  const bool flint = a.method && *a.method == "flint";
  if (flint && n_max > 2000) throw InvalidArgument("--method flint is limited to --to <= 2000 (exact FLINT determinants)");
  const bool bordered = a.method ? *a.method != "closed" : n_max <= bordered_default_limit;
  options.flint_checks = flint;
  options.spectrum = a.spectrum;
  options.divisibility = a.divisibility;
  options.method = bordered ? track::FredholmMethod::bordered : track::FredholmMethod::closed;
  options.green_stats = a.green_stats || a.histogram.has_value();
  options.cross_check = a.cross_check;
  if (a.cross_check && !bordered) throw InvalidArgument("--cross-check compares the bordered matrix with the closed form; use --method bordered");
  options.threads = a.threads ? static_cast<unsigned>(parse_number_option(*a.threads, "--threads", 1, 256)) : default_thread_count();
  options.memory_limit = a.memory_limit ? parse_number_option(*a.memory_limit, "--memory-limit", 1, ~0ULL) : (std::uint64_t{1} << 32);
  if (a.out && a.out->empty()) throw InvalidArgument("--out: empty path (use - for standard output)");
  if (a.histogram && a.histogram->empty()) throw InvalidArgument("--histogram: empty path");
  const bool plot = a.plot_option && a.plot_option->count() > 0;
  io::PlotRequest sign_plot, green_plot;
  bool want_green = false;
  if (plot) {
    const auto choice = parse_plot_choice(a.plot_list, "--plot");
    bool want_sign = choice.kinds.empty();
    want_green = choice.kinds.empty() && a.histogram.has_value();
    for (const auto k : choice.kinds) {
      if (k == io::PlotKind::fredholm) want_sign = true;
      else if (k == io::PlotKind::green) want_green = true;
      else throw InvalidArgument("--plot: sqfc fredholm draws fredholm and green, not '" + std::string(io::plot_kind_name(k)) + "'");
    }
    if (a.out && *a.out == "-") throw InvalidArgument("--plot draws beside the output file; give --out FILE (not -)");
    if (want_green && a.histogram && *a.histogram == "-")
      throw InvalidArgument("--plot draws the histogram from a file; give --histogram FILE (not -)");
    apply_plot_look(a.plot_look, sign_plot, false);
    io::check_gnuplot(sign_plot.gnuplot);
    if (!choice.formats.empty()) sign_plot.formats = choice.formats;
    green_plot = sign_plot;
    if (want_sign) sign_plot.kinds = {io::PlotKind::fredholm};
    if (want_green) green_plot.kinds = {io::PlotKind::green};
    if (want_green) options.green_stats = true;
  }

  track::check_fredholm_options(options);  // refuse before any output exists

  std::string out_path;
  if (a.out) {
    out_path = *a.out;
  } else {
    out_path = default_output_path("fredholm", invocation, n_max, "fredholm.csv");
  }
  std::optional<std::string> histogram_path = a.histogram;
  if (plot) {
    const std::string prefix = plot_prefix_beside(out_path);
    if (want_green && !histogram_path) histogram_path = prefix + ".histogram.csv";
    sign_plot.prefix = green_plot.prefix = prefix;
    sign_plot.input = out_path;
    if (histogram_path) green_plot.input = *histogram_path;
  }
  const auto started = std::chrono::system_clock::now();
  const auto clock_start = std::chrono::steady_clock::now();
  io::AtomicOutputFile out(out_path);
  std::unique_ptr<io::AtomicOutputFile> histogram, dump;
  if (histogram_path) histogram = std::make_unique<io::AtomicOutputFile>(*histogram_path);
  if (dump_n) dump = std::make_unique<io::AtomicOutputFile>(*a.dump_file);
  std::unique_ptr<io::AtomicOutputFile> manifest;
  if (!out.is_stream()) manifest = std::make_unique<io::AtomicOutputFile>(out_path + ".manifest.json");

  if (dump_n) {
    options.matrix_at = *dump_n;
    options.on_matrix = [&](Natural n, const std::vector<Natural>& vertices, std::size_t count,
                            const std::function<std::int64_t(std::size_t, std::size_t)>& entry) {
      std::ostream& o = dump->stream();
      Count nonzero = 0;
      for (std::size_t i = 0; i < count; ++i)
        for (std::size_t j = 0; j <= i; ++j) nonzero += entry(i, j) != 0;
      o << "%%MatrixMarket matrix coordinate integer symmetric\n"
        << "% sqfc " << version_string << ": Green function g_n = (1 + A(H_n))^-1, n = " << n << "\n"
        << "% row/column i is the i-th squarefree integer in [2, n]; the lower triangle is listed\n";
      o << count << ' ' << count << ' ' << nonzero << '\n';
      for (std::size_t j = 0; j < count; ++j)
        for (std::size_t i = j; i < count; ++i)
          if (const auto v = entry(i, j); v != 0) o << (i + 1) << ' ' << (j + 1) << ' ' << v << '\n';
      (void)vertices;
    };
  }

  FredholmFileSink sink(out.stream(), histogram ? &histogram->stream() : nullptr);
  ProgressBar bar("fredholm", a.quiet);
  const auto report = track::run_fredholm(options, sink, [&](Natural done, Natural total) {
    throw_if_interrupted();
    bar.update(done, total);
  });
  bar.finish();
  out.commit();
  if (histogram) histogram->commit();
  if (dump) dump->commit();
  std::vector<std::string> pictures;
  if (plot) {
    for (const auto* request : {&sign_plot, &green_plot})
      if (!request->kinds.empty())
        for (const auto& made : io::make_plots(*request)) pictures.insert(pictures.end(), made.pictures.begin(), made.pictures.end());
  }
  const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - clock_start).count();
  if (manifest) {
    io::Json m = io::manifest_head(invocation.argv);
    m.set("command", "fredholm");
    io::Json parameters;
    parameters.set("to", n_max);
    parameters.set("method", flint ? "flint" : bordered ? "bordered" : "closed");
    parameters.set("spectrum", options.spectrum);
    parameters.set("divisibility", options.divisibility);
    parameters.set("sample_points", options.samples.size());
    parameters.set("green_stats", options.green_stats);
    parameters.set("cross_check", options.cross_check);
    parameters.set("threads", options.threads);
    parameters.set("memory_limit", options.memory_limit);
    m.set("parameters", std::move(parameters));
    io::set_run_times(m, started, wall);
    m.set("threads", options.threads);
    io::Json outputs;
    outputs.set("table", out_path);
    if (histogram_path) outputs.set("histogram", *histogram_path);
    if (plot) {
      io::Json list = io::Json::Array{};
      for (const auto& p : pictures) list.push(p);
      outputs.set("pictures", std::move(list));
    }
    if (dump_n) outputs.set("green_matrix", *a.dump_file);
    m.set("outputs", std::move(outputs));
    m.set("rows", report.rows);
    m.set("checks", io::checks_to_json(report.checks));
    m.set("checks_passed", report.all_checks_passed());
    manifest->stream() << m.dump(2) << '\n';
    manifest->commit();
  }
  if (!report.all_checks_passed()) {
    for (const auto& c : report.checks)
      if (c.failed)
        std::cerr << "sqfc fredholm: check " << c.name << " failed " << c.failed << " times, first at n = " << c.first_failure
                  << (c.first_failure_detail.empty() ? "" : " (" + c.first_failure_detail + ")") << "\n";
    return exit_code::check_failed;
  }
  return exit_code::ok;
}

}  // namespace sqfc::cli
