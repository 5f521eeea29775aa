// SPDX-License-Identifier: MIT
// `sqfc table`: parse, run the engine, write the table, events and manifest.
#include "cmd_table.hpp"

#include <CLI/CLI.hpp>
#include <filesystem>
#include <iostream>
#include <memory>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/config.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/envelope_file.hpp"
#include "sqfc/io/manifest.hpp"
#include "sqfc/io/stored_run.hpp"
#include "table_store.hpp"

namespace sqfc::cli {
namespace {

class FileSink : public track::TableSink {
 public:
  FileSink(io::TableWriter* table, io::EventWriter* events) : table_(table), events_(events) {}
  void on_row(const track::TableRow& row) override {
    if (table_) table_->write(row);
  }
  void on_event(const track::Event& event) override {
    if (events_) events_->write(event);
  }

 private:
  io::TableWriter* table_;
  io::EventWriter* events_;
};

// Two outputs (or an output and a manifest) on one file would overwrite each other after the
// whole run; refuse before any work. Paths are compared after normalisation.
void reject_shared_paths(const TableJob& job) {
  std::vector<std::pair<std::string, std::string>> files;  // (normalised path, what)
  auto add = [&](const std::string& path, const std::string& what) {
    if (path == "-") return;
    std::error_code ec;
    const auto status = std::filesystem::status(path, ec);
    if (!ec && std::filesystem::exists(status) && !std::filesystem::is_regular_file(status)) return;  // /dev/null etc.
    files.emplace_back(std::filesystem::weakly_canonical(std::filesystem::absolute(path)).string(), what);
  };
  const auto add_with_manifest = [&](const std::string& path, const std::string& what) {
    const auto before = files.size();
    add(path, what);
    if (files.size() > before) add(path + ".manifest.json", "the manifest of " + what);  // only beside real files
  };
  add_with_manifest(job.out, "--out");
  if (job.events_path) add_with_manifest(*job.events_path, "--events");
  if (job.envelope_path) add(*job.envelope_path, job.plot ? "the envelope of --plot" : "--envelope");
  for (std::size_t i = 0; i < files.size(); ++i)
    for (std::size_t j = i + 1; j < files.size(); ++j)
      if (files[i].first == files[j].first)
        throw InvalidArgument(files[i].second + " and " + files[j].second + " name the same file '" + files[i].first + "'");
}

}  // namespace

void add_table_command(CLI::App& app, TableArguments& a) {
  auto* cmd = app.add_subcommand("table", "Invariants of K_n for every n up to N, written at sample points");
  cmd->add_option("--to", a.to, "last n (required): digits, 1e9, 10^9 or 2^40")->required();
  cmd->add_option("--from", a.from, "first n to report (values are those of a run from 1)");
  cmd->add_option_function<std::string>(
      "--every", [&a](const std::string& v) { a.every = v; }, "sample every multiple of S");
  cmd->add_option_function<std::string>(
      "--at", [&a](const std::string& v) { a.at = v; }, "sample at a comma-separated list of n");
  cmd->add_option_function<std::string>(
      "--log", [&a](const std::string& v) { a.log = v; }, "sample K log-spaced points per decade, plus N");
  cmd->add_option_function<std::string>(
      "--columns", [&a](const std::string& v) { a.columns = v; }, "comma-separated columns (default: all)");
  cmd->add_option("--format", a.format, "csv, tsv, jsonl or bfile (one value column)");
  cmd->add_option_function<std::string>(
      "--out", [&a](const std::string& v) { a.out = v; }, "output file, - for standard output (default: under data_out/table/)");
  cmd->add_option_function<std::string>(
      "--events", [&a](const std::string& v) { a.events = v; }, "also write events (zeros, records, first dimensions) to this CSV file");
  cmd->add_option_function<std::string>(
      "--threads", [&a](const std::string& v) { a.threads = v; }, "worker threads (default: all hardware threads)");
  cmd->add_option_function<std::string>(
      "--block-size", [&a](const std::string& v) { a.block_size = v; }, "sieve block size in values (default 2^17)");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no progress bar"));
  cmd->add_option_function<std::string>(
      "--store", [&a](const std::string& v) { a.store = v; }, "checkpoint every segment into this run store (SQLite)");
  cmd->add_flag("--resume", a.resume, std::string("continue the run in the --store file where it stopped"));
  a.plot_option = cmd->add_option("--plot", a.plot_list,
                                  "draw pictures from a per-pixel envelope built during the run, beside the table; "
                                  "optional comma list of kinds (mertens, scaled, betti, faces, fredholm) and formats (png, svg, pdf)")
                      ->expected(0, 1);
  cmd->add_option_function<std::string>(
      "--envelope", [&a](const std::string& v) { a.envelope = v; }, "write the per-pixel-column envelope to this CSV file");
  cmd->add_flag("--envelope-betti", a.envelope_betti,
                std::string("also keep the Betti extremes in the envelope (a per-n pass; --plot betti implies it)"));
  add_plot_look_options(*cmd, a.plot_look, false);
}

TableJob make_table_job(const TableArguments& a, const Invocation& invocation) {
  TableJob job;
  auto& run = job.run;
  run.to = parse_number_option(a.to, "--to", 1, config::max_sieve_n);
  run.from = parse_number_option(a.from, "--from", 1, config::max_sieve_n);
  if (run.from > run.to) throw InvalidArgument("--from " + a.from + " is larger than --to " + a.to);
  run.threads = !a.threads ? default_thread_count()
                           : static_cast<unsigned>(parse_number_option(*a.threads, "--threads", 1, 256));
  if (a.block_size)
    run.block_size = static_cast<std::size_t>(parse_number_option(*a.block_size, "--block-size", 1024, 1 << 24));
  run.segment_size = std::max<Natural>(config::default_segment_size, run.block_size);

  const SampleRequest sample_request = parse_sample_request(a.every, a.at, a.log, config::max_sieve_n, "10^16");
  run.samples = sample_request.schedule(run.from, run.to);
  if (run.samples.empty())
  {
    std::string asked;
    if (a.every) asked += " --every " + *a.every;
    if (a.at) asked += " --at " + *a.at;
    throw InvalidArgument("no sample point of" + asked + " lies in [--from " + a.from + ", --to " + a.to +
                          "]: nothing to write");
  }

  job.format = io::parse_table_format(a.format);
  job.columns = !a.columns ? io::default_columns(run.to) : io::parse_columns(*a.columns, run.to);
  if (job.format == io::TableFormat::bfile && (job.columns.size() != 2))
    throw InvalidArgument("--format bfile needs exactly one value column, e.g. --columns mertens");
  if (job.format == io::TableFormat::bfile)
    job.bfile_comments = {"sqfc " + std::string("b-file: ") + io::column_name(job.columns[1]) + " for n in [" +
                          std::to_string(run.from) + ", " + std::to_string(run.to) + "]"};

  if (a.out && a.out->empty()) throw InvalidArgument("--out: empty path (use - for standard output)");
  if (a.events && a.events->empty()) throw InvalidArgument("--events: empty path (use - for standard output)");
  if (!a.out) {
    job.out = default_output_path("table", invocation, run.to, "table." + std::string(io::table_format_extension(job.format)));
  } else {
    job.out = *a.out;
  }
  if (a.events) {
    job.events_path = *a.events;
    run.events = true;
  }
  job.quiet = a.quiet;
  const bool plot = a.plot_option && a.plot_option->count() > 0;
  if (a.envelope && a.envelope->empty()) throw InvalidArgument("--envelope: empty path");
  if (a.envelope_betti && !plot && !a.envelope) throw InvalidArgument("--envelope-betti needs --envelope or --plot");
  if (plot || a.envelope) {
    io::PlotRequest request;
    apply_plot_look(a.plot_look, request, false, plot ? 200 : 1);
    track::EnvelopeOptions envelope{run.from, run.to, request.width, request.log_x, true};
    if (plot) {
      if (job.out == "-" && !a.envelope)
        throw InvalidArgument("--plot draws beside the table file; give --out FILE (not -) or --envelope FILE");
      const auto choice = parse_plot_choice(a.plot_list, "--plot");
      for (const auto k : choice.kinds)
        if (k == io::PlotKind::barcode || k == io::PlotKind::diagram || k == io::PlotKind::green)
          throw InvalidArgument("--plot: sqfc table cannot draw '" + std::string(io::plot_kind_name(k)) +
                                "' (use sqfc homology --plot or sqfc fredholm --plot)");
      request.kinds = choice.kinds;
      if (!choice.formats.empty()) request.formats = choice.formats;
      const std::string prefix = plot_prefix_beside(a.envelope ? *a.envelope : job.out);
      request.prefix = prefix;
      request.input = a.envelope ? *a.envelope : prefix + ".envelope.csv";
      request.input_kind = io::PlotInput::envelope;
      if (job.events_path && *job.events_path != "-") request.events = *job.events_path;
      // Betti extremes cost a per-n pass in the sieve phase (docs/plots.md has the measured
      // cost): built only when the betti picture is asked for by name.
      const bool betti = std::find(request.kinds.begin(), request.kinds.end(), io::PlotKind::betti) != request.kinds.end();
      if (request.kinds.empty())
        request.kinds = {io::PlotKind::mertens, io::PlotKind::scaled, io::PlotKind::faces, io::PlotKind::fredholm};
      envelope.betti = betti || a.envelope_betti;
      io::check_gnuplot(request.gnuplot);  // before the run, not after it
      job.envelope_path = request.input;
      job.plot = request;
    } else {
      job.envelope_path = *a.envelope;
      envelope.betti = a.envelope_betti;
    }
    run.envelope = envelope;
  }
  reject_shared_paths(job);
  if (a.resume && !a.store) throw InvalidArgument("--resume needs --store FILE");
  if (a.store) {
    if (a.store->empty() || *a.store == "-") throw InvalidArgument("--store: needs a file path");
    // The store keeps block summaries, not envelope columns, so a resumed envelope would be partial.
    if (run.envelope) throw InvalidArgument("--plot and --envelope cannot be combined with --store (the store does not keep envelopes)");
    job.store_path = *a.store;
    job.resume = a.resume;
    job.store_parameters = store_parameters(job, sample_request);
  }
  return job;
}

TableJobResult run_table_job(const TableJob& job, const Invocation& invocation) {
  const auto started = std::chrono::system_clock::now();
  const auto clock_start = std::chrono::steady_clock::now();
  // Open every output before the work starts, so an unwritable path fails at once.
  io::AtomicOutputFile table_file(job.out);
  std::unique_ptr<io::AtomicOutputFile> events_file;
  if (job.events_path) events_file = std::make_unique<io::AtomicOutputFile>(*job.events_path);
  const std::string manifest_path = !table_file.is_stream() ? job.out + ".manifest.json"
                                    : (events_file && !events_file->is_stream()) ? *job.events_path + ".manifest.json"
                                                                                  : "";
  std::unique_ptr<io::AtomicOutputFile> manifest_probe;
  if (!manifest_path.empty()) manifest_probe = std::make_unique<io::AtomicOutputFile>(manifest_path);
  std::unique_ptr<io::AtomicOutputFile> envelope_file;
  if (job.envelope_path) envelope_file = std::make_unique<io::AtomicOutputFile>(*job.envelope_path);

  io::TableWriter table_writer(table_file.stream(), job.format, job.columns, job.bfile_comments);
  std::unique_ptr<io::EventWriter> event_writer;
  if (events_file) event_writer = std::make_unique<io::EventWriter>(events_file->stream());
  FileSink sink(&table_writer, event_writer.get());

  ProgressBar bar(job.label, job.quiet);
  TableJobResult result;
  const track::ProgressFn progress = [&](Natural done, Natural total) {
    throw_if_interrupted();
    bar.update(done, total);
  };
  result.report = run_table_engine(job, sink, progress);
  bar.finish();
  table_file.commit();
  if (events_file) events_file->commit();
  if (envelope_file) {
    io::write_envelope(envelope_file->stream(), *result.report.envelope, std::max(0, complex::max_face_dimension(job.run.to)));
    envelope_file->commit();
  }
  if (job.plot)
    for (const auto& o : io::make_plots(*job.plot)) result.pictures.insert(result.pictures.end(), o.pictures.begin(), o.pictures.end());
  result.wall_seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - clock_start).count();

  if (!manifest_path.empty()) {
    const auto& r = result.report;
    io::Json m = io::manifest_head(invocation.argv);
    m.set("command", "table");
    io::Json parameters;
    parameters.set("from", job.run.from);
    parameters.set("to", job.run.to);
    parameters.set("sample_points", job.run.samples.size());
    io::Json columns = io::Json::Array{};
    for (const auto& c : job.columns) columns.push(io::column_name(c));
    parameters.set("columns", std::move(columns));
    parameters.set("format", std::string(io::table_format_extension(job.format)) == "txt" ? "bfile"
                                 : std::string(io::table_format_extension(job.format)));
    parameters.set("threads", job.run.threads);
    parameters.set("block_size", static_cast<std::uint64_t>(job.run.block_size));
    parameters.set("segment_size", job.run.segment_size);
    parameters.set("events", job.run.events);
    m.set("parameters", std::move(parameters));
    io::set_run_times(m, started, result.wall_seconds);
    m.set("threads", job.run.threads);
    if (job.run.ranks > 1) m.set("ranks", job.run.ranks);
    io::Json outputs;
    outputs.set("table", job.out);
    if (job.events_path) outputs.set("events", *job.events_path);
    if (job.store_path) outputs.set("store", *job.store_path);
    if (job.envelope_path) outputs.set("envelope", *job.envelope_path);
    if (job.plot) {
      io::Json pictures = io::Json::Array{};
      for (const auto& p : result.pictures) pictures.push(p);
      outputs.set("pictures", std::move(pictures));
    }
    m.set("outputs", std::move(outputs));
    io::Json counts;
    counts.set("rows", r.rows);
    counts.set("events", r.events);
    counts.set("blocks", r.blocks);
    counts.set("scanned_blocks", r.scanned_blocks);
    if (r.envelope) {
      counts.set("envelope_columns", static_cast<std::uint64_t>(r.envelope->columns.size()));
      counts.set("envelope_scanned_values", r.envelope->scanned_values);
    }
    m.set("counts", std::move(counts));
    m.set("checks", io::checks_to_json(r.checks));
    m.set("checks_passed", r.all_checks_passed());
    m.set("final", io::row_to_json(r.final_state.row(), std::max(0, complex::max_face_dimension(job.run.to))));
    manifest_probe->stream() << m.dump(2) << '\n';
    manifest_probe->commit();
    result.manifest_path = manifest_path;
  }
  return result;
}

int run_table_command(const TableArguments& args, const Invocation& invocation) {
  const DistributedScope mpi;  // MPI only under an MPI launcher
  TableJob job;
  try {
    job = make_table_job(args, invocation);
  } catch (const Error&) {
    if (mpi.rank() > 0) return exit_code::bad_input;  // rank 0 reports it
    throw;
  }
  job.run.ranks = mpi.ranks();
  if (job.run.ranks > 1 && job.run.envelope) {
    if (mpi.rank() > 0) return exit_code::bad_input;  // rank 0 reports it
    throw InvalidArgument("--plot and --envelope are not available under mpirun (each rank sees only its own segments)");
  }
  if (const auto worker = run_worker_rank(job)) return *worker;
  const TableJobResult result = run_table_job(job, invocation);
  if (!result.report.all_checks_passed()) {
    for (const auto& c : result.report.checks)
      if (c.failed)
        std::cerr << "sqfc table: check " << c.name << " failed " << c.failed << " times, first at n = " << c.first_failure
                  << "\n";
    return exit_code::check_failed;
  }
  if (ProgressBar("", job.quiet).active() && !result.manifest_path.empty())
    std::cerr << "sqfc table: wrote " << job.out << " (" << result.report.rows << " rows) in " << result.wall_seconds
              << " s\n";
  return exit_code::ok;
}

}  // namespace sqfc::cli
