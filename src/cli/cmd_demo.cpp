// SPDX-License-Identifier: MIT
// `sqfc demo`: a seminar prepares a poster on where the spheres of K_n appear up to 10^8:
// the table and its b-files, every kind of picture, and a check report that vouches for them.
#include "cmd_demo.hpp"

#include <CLI/CLI.hpp>
#include <fstream>
#include <iostream>
#include <map>
#include <sstream>

#include "cmd_fredholm.hpp"
#include "cmd_homology.hpp"
#include "cmd_table.hpp"
#include "plot_support.hpp"
#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/bfile_check.hpp"
#include "sqfc/io/bfile_reader.hpp"
#include "sqfc/io/identity_report.hpp"
#include "sqfc/io/plot.hpp"
#include "sqfc/track/identity_suite.hpp"
#include "sqfc/track/sequence_terms.hpp"

namespace sqfc::cli {

void add_demo_command(CLI::App& app, DemoArguments& a) {
  auto* cmd = app.add_subcommand("demo", "Worked scenario: a poster table of the homology of K_n, into data_out/demo/");
  cmd->add_option("--to", a.to, "last n of the poster table (default 1e8)");
  cmd->add_option("--out-dir", a.out_dir, "folder for the demo's files (default data_out/demo)");
  cmd->add_option_function<std::string>(
      "--threads", [&a](const std::string& v) { a.threads = v; }, "worker threads (default: all)");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no progress bar"));
}

int run_demo_command(const DemoArguments& a, const Invocation& invocation) {
  // Validate before creating anything, so a bad argument leaves no folder behind.
  parse_number_option(a.to, "--to", 1, config::max_sieve_n);
  const unsigned threads =
      a.threads ? static_cast<unsigned>(parse_number_option(*a.threads, "--threads", 1, 256)) : default_thread_count();
  if (a.out_dir.empty()) throw InvalidArgument("--out-dir: empty path");
  io::ensure_directory(a.out_dir);
  const auto started = std::chrono::steady_clock::now();

  // Pictures need gnuplot: look for it before the long run, not after.
  PlotLookArguments look;
  io::PlotRequest picture_defaults;
  apply_plot_look(look, picture_defaults, false);
  io::check_gnuplot(picture_defaults.gnuplot);
  picture_defaults.formats = {io::PlotFormat::png, io::PlotFormat::svg, io::PlotFormat::pdf};
  const std::string pictures_dir = a.out_dir + "/pictures";
  io::ensure_directory(pictures_dir);

  // The poster table: every invariant at 20 log-spaced points per decade, with events, and the
  // per-pixel envelope (Betti extremes included) for the pictures.
  TableArguments poster;
  poster.envelope = a.out_dir + "/envelope.csv";
  poster.envelope_betti = true;
  poster.to = a.to;
  poster.log = "20";
  poster.out = a.out_dir + "/table.csv";
  poster.events = a.out_dir + "/events.csv";
  poster.threads = a.threads;
  poster.quiet = a.quiet;
  TableJob poster_job = make_table_job(poster, invocation);
  poster_job.label = "demo: poster table";
  const auto poster_result = run_table_job(poster_job, invocation);

  // b-files for the OEIS cross-check: every n up to 10^4.
  const Natural n_max = poster_job.run.to;
  const Natural bfile_to = std::min<Natural>(n_max, 10000);
  const std::vector<std::pair<std::string, std::string>> bfiles = {
      {"mertens", "OEIS A002321"}, {"squarefree", "OEIS A013928 (which counts squarefree k < n, so shifted by one)"},
      {"liouville", "OEIS A002819"}, {"b1", "the odd squarefree m in (n/2, n] with two primes (no OEIS entry used)"}};
  std::vector<std::string> bfile_paths;
  bool checks_ok = poster_result.report.all_checks_passed();
  for (const auto& [column, sequence] : bfiles) {
    TableArguments b;
    b.to = std::to_string(bfile_to);
    b.every = "1";
    b.columns = column;
    b.format = "bfile";
    b.out = a.out_dir + "/" + column + ".bfile.txt";
    b.threads = a.threads;
    b.quiet = true;
    TableJob job = make_table_job(b, invocation);
    job.bfile_comments.push_back("compare with " + sequence);
    const auto result = run_table_job(job, invocation);
    checks_ok = checks_ok && result.report.all_checks_passed();
    bfile_paths.push_back(*b.out);
  }

  // Read the events back: the births of homology dimensions and the zeros of M.
  std::ifstream events(*poster.events);
  std::string line;
  std::getline(events, line);  // header
  std::map<long, std::string> births;
  Count zeros = 0, total_events = 0;
  std::string last_high, last_low;
  while (std::getline(events, line)) {
    ++total_events;
    std::istringstream fields(line);
    std::string kind, n, value;
    std::getline(fields, kind, ',');
    std::getline(fields, n, ',');
    std::getline(fields, value, ',');
    if (kind == "first_homology_dimension") births[std::stol(value)] = n;
    if (kind == "mertens_zero") ++zeros;
    if (kind == "mertens_high") last_high = value + " at n = " + n;
    if (kind == "mertens_low") last_low = value + " at n = " + n;
  }

  // The barcode of the filtration and the Green histogram, small enough to draw bar by bar.
  const Natural small_n = std::min<Natural>(n_max, 2000);
  HomologyArguments homology;
  homology.to = std::to_string(small_n);
  homology.log = "10";
  homology.out = a.out_dir + "/homology.csv";
  homology.barcode = a.out_dir + "/barcode.csv";
  homology.quiet = true;
  checks_ok = run_homology_command(homology, invocation) == exit_code::ok && checks_ok;
  FredholmArguments fredholm;
  fredholm.to = std::to_string(small_n);
  fredholm.log = "10";
  fredholm.out = a.out_dir + "/fredholm.csv";
  fredholm.histogram = a.out_dir + "/green_histogram.csv";
  fredholm.threads = a.threads;
  fredholm.quiet = true;
  checks_ok = run_fredholm_command(fredholm, invocation) == exit_code::ok && checks_ok;

  // Every kind of picture, each with its data file and gnuplot script beside it.
  std::vector<std::string> pictures;
  const auto draw = [&](const std::string& input, std::optional<std::string> events_file, std::vector<io::PlotKind> kinds,
                        const std::string& name) {
    io::PlotRequest request = picture_defaults;
    request.input = input;
    request.events = std::move(events_file);
    request.kinds = std::move(kinds);
    request.prefix = pictures_dir + "/" + name;
    for (const auto& made : io::make_plots(request)) pictures.insert(pictures.end(), made.pictures.begin(), made.pictures.end());
  };
  draw(*poster.envelope, *poster.events,
       {io::PlotKind::mertens, io::PlotKind::scaled, io::PlotKind::betti, io::PlotKind::faces, io::PlotKind::fredholm},
       "poster");
  draw(*homology.barcode, std::nullopt, {io::PlotKind::barcode, io::PlotKind::diagram}, "filtration");
  draw(*fredholm.histogram, std::nullopt, {io::PlotKind::green}, "green");

  // The check report: the identity suite by independent routes, and the b-files read back and
  // compared with sqfc's own values term by term.
  track::IdentitySuiteOptions suite;
  suite.to = std::min<Natural>(n_max, 1'000'000);
  suite.threads = threads;
  const auto suite_report = track::run_identity_suite(suite);
  const std::string report_path = a.out_dir + "/check_report.txt";
  {
    io::AtomicOutputFile report(report_path);
    io::write_identity_report(report.stream(), suite_report, suite.threads);
    report.stream() << "\nb-files read back (sqfc check --bfile):\n";
    for (const auto& [column, sequence_name] : std::vector<std::pair<std::string, std::string>>{{"mertens", "mertens"}, {"liouville", "liouville"}}) {
      const auto contents = io::read_bfile_file(a.out_dir + "/" + column + ".bfile.txt");
      const auto sequence = track::parse_sequence(sequence_name);
      const auto values = track::evaluate_sequence_terms(sequence, io::bfile_indices(contents), bfile_to, suite.threads);
      const auto comparison = io::compare_bfile_terms(contents, values);
      io::write_bfile_check_report(report.stream(),
                                   {a.out_dir + "/" + column + ".bfile.txt", track::sequence_name(sequence),
                                    track::sequence_description(sequence), bfile_to},
                                   contents, comparison);
      checks_ok = io::bfile_check_passed(contents, comparison) && checks_ok;
    }
    report.commit();
  }
  {
    io::AtomicOutputFile json(a.out_dir + "/check_report.json");
    json.stream() << io::identity_report_json(suite_report).dump(2) << '\n';
    json.commit();
  }
  checks_ok = suite_report.passed() && checks_ok;

  const auto final_row = poster_result.report.final_state.row();
  const int top = std::max(0, complex::max_face_dimension(n_max));
  std::ostringstream betti;
  for (int d = 0; d <= top; ++d) betti << (d ? ", " : "") << "b" << d << " = " << final_row.betti[d];
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();

  std::cout << "sqfc demo: the seminar's poster, \"Where the spheres of K_n are born\", n up to " << n_max << "\n"
            << "  table:    " << poster_job.out << " (" << poster_result.report.rows << " rows, 20 per decade)\n"
            << "  events:   " << *poster.events << " (" << total_events << " events)\n"
            << "  manifest: " << poster_result.manifest_path << "\n"
            << "  b-files:  ";
  for (std::size_t i = 0; i < bfile_paths.size(); ++i) std::cout << (i ? ", " : "") << bfile_paths[i];
  std::cout << " (n <= " << bfile_to << ")\n  births of homology:";
  for (const auto& [d, n] : births) std::cout << "  dim " << d << " at n = " << n << ";";
  std::cout << "\n  at n = " << n_max << ": M = " << final_row.mertens << ", chi = " << final_row.euler
            << ", Q = " << final_row.squarefree << ", fredholm = " << final_row.fredholm << "\n"
            << "  homology: " << betti.str() << "\n"
            << "  zeros of M up to " << n_max << ": " << zeros << "; highest M " << last_high << "; lowest M "
            << last_low << "\n"
            << "  pictures: " << pictures.size() << " files (PNG, SVG, PDF; data and gnuplot scripts beside them) in "
            << pictures_dir << "\n"
            << "  barcode:  " << *homology.barcode << " (n <= " << small_n << "), Green histogram: " << *fredholm.histogram << "\n"
            << "  check report: " << report_path << " (identity suite to n = " << suite.to << ", "
            << suite_report.checks.size() << " checks, and the b-files read back)\n"
            << "  identity checks: " << (checks_ok ? "all passed" : "FAILED") << "\n"
            << "  time: " << seconds << " s\n";
  return checks_ok ? exit_code::ok : exit_code::check_failed;
}

}  // namespace sqfc::cli
