// SPDX-License-Identifier: MIT
// `sqfc value`: parse, call the isolated evaluations of the arith layer, write rows and manifest.
#include "cmd_value.hpp"

#include <CLI/CLI.hpp>
#include <algorithm>
#include <chrono>
#include <iostream>
#include <memory>

#include "sqfc/arith/isolated_values.hpp"
#include "sqfc/arith/omega_counting.hpp"
#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/manifest.hpp"
#include "sqfc/io/table_writer.hpp"

namespace sqfc::cli {
namespace {

// What `--what` can ask for, in column order.
enum class Quantity { mertens, squarefree, liouville, fredholm, faces, betti };
struct QuantityName {
  Quantity quantity;
  const char* name;
};
constexpr QuantityName quantity_names[] = {
    {Quantity::mertens, "mertens"},   {Quantity::squarefree, "squarefree"}, {Quantity::liouville, "liouville"},
    {Quantity::fredholm, "fredholm"}, {Quantity::faces, "faces"},           {Quantity::betti, "betti"},
};

// The default --what: what takes a few seconds at the largest x on two cores (measured
// December 2026, docs/cli.md): M(10^13) 2.2 s of CPU and L about 1.6 times that; the omega
// counts 1.3 s of CPU at 10^12.
constexpr Natural default_liouville_limit = 10'000'000'000'000ULL;   // 10^13
constexpr Natural default_omega_limit = 1'000'000'000'000ULL;        // 10^12

Natural bound_of(Quantity q) {
  switch (q) {
    case Quantity::mertens:
    case Quantity::fredholm: return arith::max_isolated_mertens_x;
    case Quantity::liouville: return arith::max_isolated_liouville_x;
    case Quantity::squarefree: return arith::max_isolated_squarefree_x;
    case Quantity::faces:
    case Quantity::betti: return arith::max_omega_counting_x;
  }
  return 0;
}

std::vector<Quantity> parse_what(const std::string& list) {
  std::vector<Quantity> chosen;
  if (list.empty()) throw InvalidArgument("--what: empty list");
  std::size_t start = 0;
  for (;;) {
    const auto comma = list.find(',', start);
    const std::string name = list.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    bool found = false;
    for (const auto& q : quantity_names)
      if (name == q.name) {
        if (std::find(chosen.begin(), chosen.end(), q.quantity) == chosen.end()) chosen.push_back(q.quantity);
        found = true;
      }
    if (!found)
      throw InvalidArgument("--what: unknown quantity '" + name +
                            "' (known: mertens, squarefree, liouville, fredholm, faces, betti)");
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  std::sort(chosen.begin(), chosen.end());
  return chosen;
}

bool wants(const std::vector<Quantity>& what, Quantity q) { return std::find(what.begin(), what.end(), q) != what.end(); }

// Progress of one evaluation: drawn only once it has run for a second.
class DelayedProgress {
 public:
  DelayedProgress(const std::string& label, bool quiet) : bar_(label, quiet), start_(std::chrono::steady_clock::now()) {}
  void update(double fraction) {
    throw_if_interrupted();
    if (std::chrono::steady_clock::now() - start_ < std::chrono::seconds(1)) return;
    constexpr Natural scale = 1000;
    bar_.update(static_cast<Natural>(fraction * scale), scale);
  }
  void finish() { bar_.finish(); }

 private:
  ProgressBar bar_;
  std::chrono::steady_clock::time_point start_;
};

struct Evaluation {
  track::TableRow row;
  double seconds = 0;
};

Evaluation evaluate(Natural x, const std::vector<Quantity>& what, unsigned threads, bool quiet) {
  Evaluation e;
  e.row.n = x;
  const auto clock_start = std::chrono::steady_clock::now();
  const std::string at = " at " + std::to_string(x);
  arith::IsolatedOptions options;
  options.threads = threads;

  const bool need_m = wants(what, Quantity::mertens) || wants(what, Quantity::fredholm);
  const bool need_l = wants(what, Quantity::liouville);
  const bool need_q = wants(what, Quantity::squarefree) || wants(what, Quantity::fredholm);
  if (need_m || need_l) {
    DelayedProgress bar(need_l ? "M and L" + at : "M" + at, quiet);
    options.progress = [&bar](double f) { bar.update(f); };
    if (need_l) {
      const auto ml = arith::mertens_liouville_isolated(x, options);
      e.row.mertens = ml.mertens;
      e.row.liouville = ml.liouville;
    } else {
      e.row.mertens = arith::mertens_isolated(x, options);
    }
    bar.finish();
  }
  if (need_q) {
    DelayedProgress bar("Q" + at, quiet);
    options.progress = [&bar](double f) { bar.update(f); };
    e.row.squarefree = arith::squarefree_isolated(x, options);
    bar.finish();
  }
  if (wants(what, Quantity::fredholm)) e.row.fredholm = arith::fredholm_from_counts(e.row.squarefree, e.row.mertens);
  if (wants(what, Quantity::faces) || wants(what, Quantity::betti)) {
    DelayedProgress bar("faces and Betti numbers" + at, quiet);
    const auto counts = arith::count_by_omega(x, threads, [&bar](Natural done, Natural total) {
      bar.update(total == 0 ? 0.0 : static_cast<double>(done) / static_cast<double>(total));
    });
    bar.finish();
    // f_d = #{squarefree k <= x : omega(k) = d + 1}; b~_d = #{odd squarefree k in (x/2, x] :
    // omega(k) = d + 1} (design.md identity 2), b_0 unreduced = b~_0 + 1 once K_x is non-empty.
    const auto upper = arith::odd_upper_half_by_omega(counts);
    for (std::size_t d = 0; d < e.row.faces.size(); ++d) {
      if (d + 1 < counts.squarefree_by_omega.size()) e.row.faces[d] = counts.squarefree_by_omega[d + 1];
      if (d + 1 < upper.size()) e.row.betti[d] = static_cast<SignedSum>(upper[d + 1]);
    }
    if (x >= 2) e.row.betti[0] += 1;
  }
  e.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - clock_start).count();
  return e;
}

std::vector<io::Column> columns_for(const std::vector<Quantity>& what, Natural largest) {
  using K = io::Column::Kind;
  std::vector<io::Column> columns = {{K::n}};
  const int top = std::max(0, complex::max_face_dimension(largest));
  for (const auto q : what) {
    switch (q) {
      case Quantity::mertens: columns.push_back({K::mertens}); break;
      case Quantity::squarefree: columns.push_back({K::squarefree}); break;
      case Quantity::liouville: columns.push_back({K::liouville}); break;
      case Quantity::fredholm: columns.push_back({K::fredholm}); break;
      case Quantity::faces:
        for (int d = 0; d <= top; ++d) columns.push_back({K::face, d});
        break;
      case Quantity::betti:
        for (int d = 0; d <= top; ++d) columns.push_back({K::betti, d});
        break;
    }
  }
  return columns;
}

}  // namespace

void add_value_command(CLI::App& app, ValueArguments& a) {
  auto* cmd = app.add_subcommand("value", "M(x), Q(x), L(x), the Fredholm sign, faces and Betti numbers at isolated x");
  cmd->add_option("x", a.xs, "one or more x: digits, 1e16, 10^16 or 2^40")->required();
  cmd->add_option_function<std::string>(
      "--what", [&a](const std::string& v) { a.what = v; },
      "comma-separated: mertens, squarefree, liouville, fredholm, faces, betti (default: what is fast at the largest x)");
  cmd->add_option("--format", a.format, "csv, tsv or jsonl");
  cmd->add_option_function<std::string>(
      "--out", [&a](const std::string& v) { a.out = v; }, "output file, - for standard output (default: under data_out/value/)");
  cmd->add_option_function<std::string>(
      "--threads", [&a](const std::string& v) { a.threads = v; }, "worker threads (default: all hardware threads)");
  cmd->add_flag("--quiet,-q", a.quiet, std::string("no progress bar"));
}

int run_value_command(const ValueArguments& a, const Invocation& invocation) {
  const auto started = std::chrono::system_clock::now();
  const auto clock_start = std::chrono::steady_clock::now();
  std::vector<Natural> xs;
  for (const auto& text : a.xs) {
    const Natural x = parse_natural(text, "x");
    if (x < 1) throw InvalidArgument("x = " + text + " is below 1");
    xs.push_back(x);
  }
  const Natural largest = *std::max_element(xs.begin(), xs.end());
  std::vector<Quantity> what;
  if (a.what) {
    what = parse_what(*a.what);
  } else {
    what = {Quantity::mertens, Quantity::squarefree, Quantity::fredholm};
    if (largest <= default_liouville_limit) what.push_back(Quantity::liouville);
    if (largest <= default_omega_limit) what.insert(what.end(), {Quantity::faces, Quantity::betti});
    std::sort(what.begin(), what.end());
  }
  for (const auto q : what)
    for (std::size_t i = 0; i < xs.size(); ++i)
      if (xs[i] > bound_of(q))
        throw InvalidArgument("x = " + a.xs[i] + " is beyond the supported bound " + std::to_string(bound_of(q)) + " of " +
                              quantity_names[static_cast<int>(q)].name);
  const auto format = io::parse_table_format(a.format);
  if (format == io::TableFormat::bfile) throw InvalidArgument("--format: value writes csv, tsv or jsonl, not bfile");
  const unsigned threads = !a.threads ? default_thread_count()
                                      : static_cast<unsigned>(parse_number_option(*a.threads, "--threads", 1, 256));
  if (a.out && a.out->empty()) throw InvalidArgument("--out: empty path (use - for standard output)");
  const std::string out =
      a.out ? *a.out : default_output_path("value", invocation, largest, "value." + std::string(io::table_format_extension(format)));

  io::AtomicOutputFile file(out);
  std::unique_ptr<io::AtomicOutputFile> manifest_file;
  if (!file.is_stream()) manifest_file = std::make_unique<io::AtomicOutputFile>(out + ".manifest.json");
  const auto columns = columns_for(what, largest);
  io::TableWriter writer(file.stream(), format, columns);
  std::vector<Evaluation> evaluations;
  for (const Natural x : xs) {
    evaluations.push_back(evaluate(x, what, threads, a.quiet));
    writer.write(evaluations.back().row);
    if (file.is_stdout()) file.stream().flush();  // rows appear as they are computed
  }
  file.commit();

  if (manifest_file) {
    io::Json m = io::manifest_head(invocation.argv);
    m.set("command", "value");
    io::Json parameters;
    io::Json x_list = io::Json::Array{};
    for (const Natural x : xs) x_list.push(x);
    parameters.set("x", std::move(x_list));
    io::Json what_list = io::Json::Array{};
    for (const auto q : what) what_list.push(std::string(quantity_names[static_cast<int>(q)].name));
    parameters.set("what", std::move(what_list));
    parameters.set("format", a.format);
    parameters.set("threads", threads);
    m.set("parameters", std::move(parameters));
    io::set_run_times(m, started, std::chrono::duration<double>(std::chrono::steady_clock::now() - clock_start).count());
    io::Json outputs;
    outputs.set("table", out);
    m.set("outputs", std::move(outputs));
    io::Json results = io::Json::Array{};
    for (const auto& e : evaluations) {
      io::Json r;
      for (const auto& c : columns) {
        const auto text = io::column_value(c, e.row);
        if (text.front() == '-') r.set(io::column_name(c), static_cast<std::int64_t>(std::stoll(text)));
        else r.set(io::column_name(c), static_cast<std::uint64_t>(std::stoull(text)));
      }
      r.set("seconds", e.seconds);
      results.push(std::move(r));
    }
    m.set("results", std::move(results));
    manifest_file->stream() << m.dump(2) << '\n';
    manifest_file->commit();
  }
  if (ProgressBar("", a.quiet).active() && manifest_file)
    std::cerr << "sqfc value: wrote " << out << " (" << evaluations.size() << " rows)\n";
  return exit_code::ok;
}

}  // namespace sqfc::cli
