// SPDX-License-Identifier: MIT
// The sqfc executable: subcommand dispatch and the one place errors become exit codes.
#include <CLI/CLI.hpp>
#include <chrono>
#include <exception>
#include <iostream>

#include "cli_support.hpp"
#include "cmd_check.hpp"
#include "cmd_demo.hpp"
#include "cmd_complex.hpp"
#include "cmd_face.hpp"
#include "cmd_fredholm.hpp"
#include "cmd_homology.hpp"
#include "cmd_runs.hpp"
#include "cmd_plot.hpp"
#include "cmd_table.hpp"
#include "cmd_value.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/version.hpp"

namespace {
// Messages quote user input; a newline in it must not break the one-line rule.
std::string one_line(std::string message) {
  for (auto& c : message)
    if (c == '\n' || c == '\r') c = ' ';
  return message;
}
}  // namespace

int main(int argc, char** argv) {
  sqfc::cli::Invocation invocation;
  invocation.started = std::chrono::system_clock::now();
  for (int i = 0; i < argc; ++i) invocation.argv.emplace_back(argv[i]);

  CLI::App app{"sqfc: the squarefree complex K_n, its graphs and invariants"};
  app.set_version_flag("--version", sqfc::version_string);
  app.require_subcommand(1);
  sqfc::cli::TableArguments table_args;
  sqfc::cli::add_table_command(app, table_args);
  sqfc::cli::DemoArguments demo_args;
  sqfc::cli::add_demo_command(app, demo_args);
  sqfc::cli::FredholmArguments fredholm_args;
  sqfc::cli::add_fredholm_command(app, fredholm_args);
  sqfc::cli::CheckArguments check_args;
  sqfc::cli::add_check_command(app, check_args);
  sqfc::cli::FaceArguments face_args;
  sqfc::cli::add_face_command(app, face_args);
  sqfc::cli::ComplexArguments complex_args;
  sqfc::cli::add_complex_command(app, complex_args);
  sqfc::cli::HomologyArguments homology_args;
  sqfc::cli::add_homology_command(app, homology_args);
  sqfc::cli::ValueArguments value_args;
  sqfc::cli::add_value_command(app, value_args);
  sqfc::cli::RunsArguments runs_args;
  sqfc::cli::add_runs_command(app, runs_args);
  sqfc::cli::PlotArguments plot_args;
  sqfc::cli::add_plot_command(app, plot_args);

  std::string command = "sqfc";
  sqfc::cli::install_interrupt_handlers();
  // CLI11 reports an unknown first word as a missing subcommand; name it instead.
  if (argc >= 2 && argv[1][0] != '-') {
    const std::string word = argv[1];
    bool known = false;
    std::string names;  // in registration order, so the message never lags behind the commands
    for (const auto* sub : app.get_subcommands({})) {
      known = known || sub->get_name() == word;
      names += (names.empty() ? "" : ", ") + sub->get_name();
    }
    if (!known) {
      std::cerr << "sqfc: error: unknown command '" << one_line(word) << "' (commands: " << names << "; see sqfc --help)\n";
      return sqfc::exit_code::bad_input;
    }
  }
  try {
    try {
      app.parse(argc, argv);
    } catch (const CLI::ParseError& e) {
      if (e.get_exit_code() == 0) return app.exit(e);  // --help, --version
      std::string message = e.what();
      for (auto& c : message)
        if (c == '\n') c = ' ';
      std::cerr << "sqfc: error: " << message << " (see sqfc --help)\n";
      return sqfc::exit_code::bad_input;
    }
    for (const auto* sub : app.get_subcommands()) command = "sqfc " + sub->get_name();
    if (app.got_subcommand("table")) return sqfc::cli::run_table_command(table_args, invocation);
    if (app.got_subcommand("demo")) return sqfc::cli::run_demo_command(demo_args, invocation);
    if (app.got_subcommand("fredholm")) return sqfc::cli::run_fredholm_command(fredholm_args, invocation);
    if (app.got_subcommand("check")) return sqfc::cli::run_check_command(check_args, invocation);
    if (app.got_subcommand("face")) return sqfc::cli::run_face_command(face_args, invocation);
    if (app.got_subcommand("complex")) return sqfc::cli::run_complex_command(complex_args, invocation);
    if (app.got_subcommand("homology")) return sqfc::cli::run_homology_command(homology_args, invocation);
    if (app.got_subcommand("value")) return sqfc::cli::run_value_command(value_args, invocation);
    if (app.got_subcommand("runs")) return sqfc::cli::run_runs_command(app, runs_args);
    if (app.got_subcommand("plot")) return sqfc::cli::run_plot_command(plot_args, invocation);
    std::cerr << "sqfc: error: no command given (see sqfc --help)\n";
    return sqfc::exit_code::bad_input;
  } catch (const sqfc::Error& e) {
    std::cerr << command << ": error: " << one_line(e.what()) << '\n';
    return e.exit_code();
  } catch (const std::bad_alloc&) {
    std::cerr << command << ": error: out of memory\n";
    return sqfc::exit_code::bad_input;
  } catch (const std::exception& e) {
    std::cerr << command << ": internal error: " << one_line(e.what()) << '\n';
    return sqfc::exit_code::internal;
  }
}
