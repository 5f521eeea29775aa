// SPDX-License-Identifier: MIT
// `sqfc check --bfile`: read the b-file, evaluate the sequence with the engine, print the report.
#include "cmd_check.hpp"

#include <CLI/CLI.hpp>
#include <iostream>

#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/io/bfile_check.hpp"

namespace sqfc::cli {

namespace {
// Default largest n sieved for a b-file check: 10^10 takes about a minute on two cores.
constexpr Natural default_check_limit = 10'000'000'000ULL;
}  // namespace

void add_check_command(CLI::App& app, CheckArguments& a) {
  auto* cmd = app.add_subcommand("check", "Compare an OEIS b-file with sqfc's values (--bfile FILE --sequence NAME)");
  cmd->add_option_function<std::string>(
      "--bfile", [&a](const std::string& v) { a.bfile = v; }, "b-file to compare (lines 'n a(n)', # comments)");
  cmd->add_option_function<std::string>(
      "--sequence", [&a](const std::string& v) { a.sequence = v; },
      "mertens, mertens_pow10, mertens_pow2, mertens_zeros, squarefree, squarefree_pow10, liouville, f<d>, b<d>");
  cmd->add_option_function<std::string>(
      "--to", [&a](const std::string& v) { a.to = v; }, "largest n to sieve; terms needing more are skipped (default 1e10)");
  cmd->add_option_function<std::string>(
      "--threads", [&a](const std::string& v) { a.threads = v; }, "worker threads (default: all hardware threads)");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no progress bar"));
}

int run_check_command(const CheckArguments& a, const Invocation&) {
  if (!a.bfile && !a.sequence)
    throw InvalidArgument("the identity suite is not available yet; compare a b-file with --bfile FILE --sequence NAME");
  if (!a.bfile) throw InvalidArgument("--sequence needs --bfile FILE");
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
