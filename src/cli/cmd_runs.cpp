// SPDX-License-Identifier: MIT
// `sqfc runs list|show`: opens stores read-only (which verifies them) and prints what they hold.
#include "cmd_runs.hpp"

#include <CLI/CLI.hpp>
#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <sstream>

#include "sqfc/core/error.hpp"
#include "sqfc/io/run_store.hpp"

namespace sqfc::cli {
namespace {

namespace fs = std::filesystem;

std::string percent(Natural done, Natural to) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.1f%%", to ? 100.0 * static_cast<double>(done) / static_cast<double>(to) : 0.0);
  return buffer;
}

std::string seconds(double s) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.2f s", s);
  return buffer;
}

std::string status(const io::RunStoreSummary& s) {
  return s.done >= s.to ? "complete" : (s.done == 0 ? "empty" : "partial");
}

// Store files named on the command line, or the *.db files directly inside named folders.
std::vector<std::string> store_files(const std::vector<std::string>& paths) {
  std::vector<std::string> files;
  for (const auto& p : paths) {
    std::error_code ec;
    if (fs::is_directory(p, ec)) {
      std::vector<std::string> found;
      for (const auto& entry : fs::directory_iterator(p, ec))
        if (entry.is_regular_file() && entry.path().extension() == ".db") found.push_back(entry.path().string());
      std::sort(found.begin(), found.end());
      files.insert(files.end(), found.begin(), found.end());
    } else if (fs::exists(p, ec)) {
      files.push_back(p);
    } else {
      throw InvalidArgument("runs list: '" + p + "' does not exist");
    }
  }
  return files;
}

int list_runs(const std::vector<std::string>& paths) {
  int damaged = 0;
  std::cout << "store\tstatus\tdone\tto\tprogress\tattempts\twall_seconds\tnote\n";
  for (const auto& file : store_files(paths)) {
    try {
      const auto s = io::RunStore::open_read_only(file).summary();
      double wall = 0;
      for (const auto& a : s.attempts) wall += a.wall_seconds;
      char w[32];
      std::snprintf(w, sizeof w, "%.2f", wall);
      std::cout << file << '\t' << status(s) << '\t' << s.done << '\t' << s.to << '\t' << percent(s.done, s.to) << '\t'
                << s.attempts.size() << '\t' << w << "\t-\n";
    } catch (const Error& e) {
      ++damaged;
      std::string why = e.what();
      for (auto& c : why)
        if (c == '\t' || c == '\n' || c == '\r') c = ' ';
      std::cout << file << "\trefused\t-\t-\t-\t-\t-\t" << why << '\n';
    }
  }
  return damaged ? exit_code::check_failed : exit_code::ok;
}

int show_run(const std::string& path) {
  const auto s = io::RunStore::open_read_only(path).summary();  // throws IoError when damaged
  std::ostringstream o;
  o << "store        " << s.path << '\n';
  o << "schema       " << s.schema_version << ", written by sqfc " << s.sqfc_version << ", created " << s.created_utc << '\n';
  o << "parameters  ";
  for (const auto& p : s.parameters) o << ' ' << p.name << '=' << p.value;
  o << '\n';
  o << "done         n in [1, " << s.done << "] of [1, " << s.to << "] (" << percent(s.done, s.to) << ", " << status(s)
    << ")\n";
  o << "holds        " << s.segments << " segments, " << s.blocks << " blocks ("
    << (s.last ? s.last->scanned_blocks : 0) << " rescanned per n), " << s.rows << " rows, " << s.events << " events\n";
  double wall = 0;
  for (const auto& a : s.attempts) {
    const Natural span = a.last_n + 1 - a.first_n;
    o << "attempt " << a.index << "    " << a.started_utc << " .. " << a.finished_utc << ", n " << a.first_n << ".."
      << a.last_n << ", " << seconds(a.wall_seconds) << ", threads " << a.threads << ", ranks " << a.ranks;
    if (span > 0 && a.wall_seconds > 0) {
      char rate[48];
      std::snprintf(rate, sizeof rate, ", %.3g n/s", static_cast<double>(span) / a.wall_seconds);
      o << rate;
    }
    o << '\n';
    wall += a.wall_seconds;
  }
  o << "time         " << seconds(wall) << " over " << s.attempts.size() << " attempt(s)\n";
  o << "store checks passed: SQLite quick_check, a checksum per segment and block, blocks contiguous from n = 1, "
       "summaries re-merge to every checkpoint, row and event counts\n";
  if (s.last) {
    for (const auto& c : s.last->checks)
      o << "check        " << c.name << ": " << c.passed << " passed, " << c.failed << " failed"
        << (c.failed ? ", first at n = " + std::to_string(c.first_failure) : std::string()) << '\n';
    const auto row = s.last->state().row();
    o << "at n = " << row.n << "  M = " << row.mertens << ", Q = " << row.squarefree << ", L = " << row.liouville << '\n';
  }
  std::cout << o.str();
  return exit_code::ok;
}

}  // namespace

void add_runs_command(CLI::App& app, RunsArguments& a) {
  auto* cmd = app.add_subcommand("runs", "What run stores (sqfc table --store) hold");
  cmd->require_subcommand(1);
  auto* list = cmd->add_subcommand("list", "One line per store: status, range done, attempts, time");
  list->add_option("paths", a.list_paths, "store files or folders holding *.db stores")->required();
  auto* show = cmd->add_subcommand("show", "Parameters, range done, timings and checks of one store");
  show->add_option("store", a.show_path, "the store file")->required();
}

int run_runs_command(const CLI::App& app, const RunsArguments& a) {
  const auto* runs = app.get_subcommand("runs");
  if (runs->got_subcommand("list")) return list_runs(a.list_paths);
  return show_run(a.show_path);
}

}  // namespace sqfc::cli
