// SPDX-License-Identifier: MIT
// `sqfc table`: options, and the job runner shared with `sqfc demo`.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "cli_support.hpp"
#include "plot_support.hpp"
#include "sqfc/io/columns.hpp"
#include "sqfc/io/run_store.hpp"
#include "sqfc/io/table_writer.hpp"
#include "sqfc/track/table_engine.hpp"

namespace CLI {
class App;
class Option;
}

namespace sqfc::cli {

/// Raw option text of `sqfc table`, as typed. An option that was not given is nullopt, so
/// that an empty value (`--every ""`) is an error rather than a silent default.
struct TableArguments {
  std::string to, from = "1", format = "csv";
  std::optional<std::string> every, at, log, columns, out, events, threads, block_size, store;
  bool quiet = false;
  bool resume = false;
  // Pictures: --plot [LIST] (kinds and formats), --envelope FILE, and the look options.
  std::string plot_list;
  CLI::Option* plot_option = nullptr;
  std::optional<std::string> envelope;
  bool envelope_betti = false;
  PlotLookArguments plot_look;
};

/// A validated table job.
struct TableJob {
  track::TableRunOptions run;
  std::vector<io::Column> columns;
  io::TableFormat format = io::TableFormat::csv;
  std::string out;               ///< path or "-"
  std::optional<std::string> events_path;
  bool quiet = false;
  std::vector<std::string> bfile_comments;
  std::string label = "table";   ///< progress-bar label
  std::optional<std::string> store_path;  ///< --store: checkpoint into this run store
  bool resume = false;                    ///< --resume: continue the store's run
  std::vector<io::RunParameter> store_parameters;  ///< what a resumed store must match
  std::optional<std::string> envelope_path;  ///< envelope file (--envelope, or beside the table with --plot)
  std::optional<io::PlotRequest> plot;        ///< pictures drawn from the envelope after the run
};

/// What a finished job wrote and found.
struct TableJobResult {
  track::TableRunReport report;
  std::string manifest_path;  ///< empty when no manifest was written
  double wall_seconds = 0;
  std::vector<std::string> pictures;
};

void add_table_command(CLI::App& app, TableArguments& args);
/// Validates the arguments. Throws: InvalidArgument with a one-line message.
TableJob make_table_job(const TableArguments& args, const Invocation& invocation);
/// Runs the job, writes the table, events and manifest. Throws: Error.
TableJobResult run_table_job(const TableJob& job, const Invocation& invocation);
/// The whole subcommand: returns the exit code.
int run_table_command(const TableArguments& args, const Invocation& invocation);

}  // namespace sqfc::cli
