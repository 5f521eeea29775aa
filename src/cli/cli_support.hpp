// SPDX-License-Identifier: MIT
// Shared pieces of the subcommands: invocation facts, number options, progress bar.
#pragma once

#include <chrono>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "sqfc/core/types.hpp"
#include "sqfc/track/sample_schedule.hpp"

namespace sqfc::cli {

/// What every subcommand knows about how it was called.
struct Invocation {
  std::vector<std::string> argv;
  std::chrono::system_clock::time_point started;
};

/// Parses a number option with the sqfc syntax and checks [min, max]; the error names the option.
Natural parse_number_option(const std::string& text, const std::string& option, Natural min, Natural max);

/// Installs SIGINT/SIGTERM handlers that only raise a flag; long runs poll it through
/// throw_if_interrupted() so that stack unwinding removes their temporary files.
void install_interrupt_handlers();
/// Throws Error("interrupted", 130) once a SIGINT or SIGTERM arrived.
void throw_if_interrupted();

/// The sample options --every, --at and --log as parsed numbers; none given means --log 10.
struct SampleRequest {
  std::optional<Natural> every;
  std::vector<Natural> at;
  std::optional<unsigned> per_decade;
  /// The schedule on [from, to]; --log (or the default) adds the end point.
  [[nodiscard]] track::SampleSchedule schedule(Natural from, Natural to) const {
    return track::SampleSchedule(from, to, every, at, per_decade, per_decade.has_value());
  }
};

/// Parses the sample options shared by table, fredholm and homology. --every and every --at value
/// must lie in [1, limit]; `limit_text` names the limit in the --at message (e.g. "10^16", "--to").
/// Throws: InvalidArgument, OverflowError.
SampleRequest parse_sample_request(const std::optional<std::string>& every, const std::optional<std::string>& at,
                                   const std::optional<std::string>& log, Natural limit, const std::string& limit_text);

/// Default output file of a command: data_out/<command>/<UTC start>-to<n>/<file>, the folder created.
/// Throws: IoError when the folder cannot be created.
std::string default_output_path(const std::string& command, const Invocation& invocation, Natural n,
                                const std::string& file);

/// Default worker count: the hardware threads, at least 1.
unsigned default_thread_count();

/// A one-line progress bar on stderr, drawn only when stderr is a terminal and not quiet.
/// Redraws at most ten times a second; finish() clears the line.
class ProgressBar {
 public:
  ProgressBar(std::string label, bool quiet);
  ~ProgressBar();
  void update(Natural done, Natural total);
  void finish();
  /// True when the bar draws (stderr is a terminal and not quiet).
  [[nodiscard]] bool active() const noexcept { return active_; }

 private:
  std::string label_;
  bool active_;
  std::chrono::steady_clock::time_point start_, last_draw_;
  bool drawn_ = false;
};

/// "1.23e9"-style short text of a count for progress output.
std::string short_count(Natural n);

}  // namespace sqfc::cli
