// SPDX-License-Identifier: MIT
// `sqfc check`: the identity suite (parse, run track::run_identity_suite, write the report, JSON and
// manifest), or with --bfile the b-file comparison (read, evaluate with the engine, print the report).
#include "cmd_check.hpp"

#include <CLI/CLI.hpp>
#include <chrono>
#include <iostream>
#include <memory>

#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/bfile_check.hpp"
#include "sqfc/io/identity_report.hpp"
#include "sqfc/io/manifest.hpp"
#include "sqfc/track/identity_suite.hpp"

namespace sqfc::cli {

namespace {
// Default largest n sieved for a b-file check: 10^10 takes about a minute on two cores.
constexpr Natural default_check_limit = 10'000'000'000ULL;
// Default range of the identity suite: 10^6, the range of the performance target (issue 5).
constexpr Natural default_suite_to = 1'000'000ULL;

// --inject-fault CHECK:N (test-only): corrupt the value check CHECK gets at n = N.
track::IdentityCorruption parse_fault(const std::string& text) {
  const auto colon = text.rfind(':');
  if (colon == std::string::npos || colon == 0)
    throw InvalidArgument("--inject-fault: expected CHECK:N, got '" + text + "'");
  return {text.substr(0, colon), parse_number_option(text.substr(colon + 1), "--inject-fault", 1, track::max_identity_suite_n)};
}

int run_identity_suite_command(const CheckArguments& a, const Invocation& invocation) {
  if (a.sequence) throw InvalidArgument("--sequence needs --bfile FILE");
  track::IdentitySuiteOptions options;
  options.to = a.to ? parse_number_option(*a.to, "--to", 1, track::max_identity_suite_n) : default_suite_to;
  options.threads = !a.threads ? default_thread_count()
                               : static_cast<unsigned>(parse_number_option(*a.threads, "--threads", 1, 256));
  if (a.only) options.identities = track::parse_identity_list(*a.only);
  if (a.inject_fault) options.corruption = parse_fault(*a.inject_fault);
  if (a.out && a.out->empty()) throw InvalidArgument("--out: empty path (use - for standard output)");

  // Open every output before the run, so an unwritable path fails before any work.
  std::unique_ptr<io::AtomicOutputFile> out, manifest;
  if (a.out) {
    out = std::make_unique<io::AtomicOutputFile>(*a.out);
    if (!out->is_stream()) manifest = std::make_unique<io::AtomicOutputFile>(*a.out + ".manifest.json");
  }
  const auto started = std::chrono::system_clock::now();
  const auto clock_start = std::chrono::steady_clock::now();
  ProgressBar bar("check", a.quiet);
  const track::IdentitySuiteReport report = track::run_identity_suite(options, [&](Natural done, Natural total) {
    throw_if_interrupted();
    bar.update(done, total);
  });
  bar.finish();
  const double wall = std::chrono::duration<double>(std::chrono::steady_clock::now() - clock_start).count();

  const bool json_on_stdout = out && out->is_stdout();
  if (!json_on_stdout) io::write_identity_report(std::cout, report, options.threads);
  if (out) {
    io::Json doc = io::identity_report_json(report);
    out->stream() << doc.dump(2) << '\n';
    out->commit();
  }
  if (manifest) {
    io::Json m = io::manifest_head(invocation.argv);
    m.set("command", "check");
    io::Json parameters;
    parameters.set("to", options.to);
    parameters.set("threads", options.threads);
    io::Json ids = io::Json::Array{};
    for (int i : report.identities) ids.push(i);
    parameters.set("identities", std::move(ids));
    parameters.set("inject_fault", a.inject_fault ? io::Json(*a.inject_fault) : io::Json(nullptr));
    m.set("parameters", std::move(parameters));
    io::set_run_times(m, started, wall);
    m.set("output", *a.out);
    io::Json checks = io::Json::Array{};
    for (const auto& c : report.checks) {
      io::Json item;
      item.set("name", c.name);
      item.set("identity", c.identity);
      item.set("passed", c.failed == 0);
      item.set("failed", c.failed);
      item.set("first_failure_n", c.first_failure ? io::Json(c.first_failure->n) : io::Json(nullptr));
      checks.push(std::move(item));
    }
    m.set("checks", std::move(checks));
    m.set("checks_passed", report.passed());
    manifest->stream() << m.dump(2) << '\n';
    manifest->commit();
  }
  std::cout.flush();
  if (!a.quiet && !report.passed())
    for (const auto& c : report.checks)
      if (c.failed)
        std::cerr << "sqfc check: " << c.name << " failed at " << c.failed << " n, first at n = " << c.first_failure->n << "\n";
  return report.passed() ? exit_code::ok : exit_code::check_failed;
}
}  // namespace

void add_check_command(CLI::App& app, CheckArguments& a) {
  auto* cmd = app.add_subcommand(
      "check", "Run the identity suite over n <= N (--to N), or compare an OEIS b-file with sqfc's values (--bfile FILE --sequence NAME)");
  cmd->add_option_function<std::string>(
      "--bfile", [&a](const std::string& v) { a.bfile = v; }, "b-file to compare (lines 'n a(n)', # comments)");
  cmd->add_option_function<std::string>(
      "--sequence", [&a](const std::string& v) { a.sequence = v; },
      "mertens, mertens_pow10, mertens_pow2, mertens_zeros, squarefree, squarefree_pow10, liouville, f<d>, b<d>");
  cmd->add_option_function<std::string>(
      "--to", [&a](const std::string& v) { a.to = v; },
      "identity suite: largest n (default 1e6, at most 1e8); b-file: largest n to sieve, terms needing more are skipped (default 1e10)");
  cmd->add_option_function<std::string>(
      "--only", [&a](const std::string& v) { a.only = v; },
      "identity suite: identities to run, comma-separated numbers 1..8 or names (euler, betti, unimodularity, energy, spectrum, green, arithmetic, counts)");
  cmd->add_option_function<std::string>(
      "--out", [&a](const std::string& v) { a.out = v; }, "identity suite: also write the report as JSON to FILE (- for stdout instead of the text report)");
  // Test-only mutation hook (docs/cli.md): hidden from --help.
  cmd->add_option_function<std::string>(
         "--inject-fault", [&a](const std::string& v) { a.inject_fault = v; }, "test only: corrupt check CHECK's value at n = N")
      ->group("");
  cmd->add_option_function<std::string>(
      "--threads", [&a](const std::string& v) { a.threads = v; }, "worker threads (default: all hardware threads)");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no progress bar"));
}

int run_check_command(const CheckArguments& a, const Invocation& invocation) {
  if (!a.bfile) return run_identity_suite_command(a, invocation);
  if (a.only) throw InvalidArgument("--only applies to the identity suite, not to --bfile");
  if (a.out) throw InvalidArgument("--out applies to the identity suite, not to --bfile (the b-file report goes to standard output)");
  if (a.inject_fault) throw InvalidArgument("--inject-fault applies to the identity suite, not to --bfile");
  if (!a.sequence) throw InvalidArgument("--bfile needs --sequence NAME (" + std::string(track::sequence_names_help()) + ")");
  const track::Sequence sequence = track::parse_sequence(*a.sequence);
  const Natural limit = a.to ? parse_number_option(*a.to, "--to", 1, config::max_sieve_n) : default_check_limit;
  const unsigned threads = !a.threads ? default_thread_count()
                                      : static_cast<unsigned>(parse_number_option(*a.threads, "--threads", 1, 256));

  const io::BfileContents contents = io::read_bfile_file(*a.bfile);
  ProgressBar bar("check", a.quiet);
  const auto values = track::evaluate_sequence_terms(sequence, io::bfile_indices(contents), limit, threads,
                                                     [&](Natural done, Natural total) {
                                                       throw_if_interrupted();
                                                       bar.update(done, total);
                                                     });
  bar.finish();
  const io::BfileComparison comparison = io::compare_bfile_terms(contents, values);
  io::write_bfile_check_report(std::cout,
                               {*a.bfile, track::sequence_name(sequence), track::sequence_description(sequence), limit},
                               contents, comparison);
  std::cout.flush();
  return io::bfile_check_passed(contents, comparison) ? exit_code::ok : exit_code::check_failed;
}

}  // namespace sqfc::cli
