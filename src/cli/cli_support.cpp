// SPDX-License-Identifier: MIT
// Number options, thread defaults and the progress bar.
#include "cli_support.hpp"

#include <unistd.h>

#include <cmath>
#include <csignal>
#include <cstdio>
#include <thread>

#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/io/atomic_file.hpp"
#include "sqfc/io/manifest.hpp"

namespace sqfc::cli {
namespace {
volatile std::sig_atomic_t interrupt_signal = 0;
extern "C" void remember_interrupt(int signal_number) { interrupt_signal = signal_number; }
}  // namespace

void install_interrupt_handlers() {
  std::signal(SIGINT, remember_interrupt);
  std::signal(SIGTERM, remember_interrupt);
  // Past a file-size limit (ulimit -f) writes then fail with EFBIG and get one clear error
  // line, instead of the signal killing the process mid-write.
  std::signal(SIGXFSZ, SIG_IGN);
}

void throw_if_interrupted() {
  // 128 + signal number is the shell's convention for a run ended by a signal.
  if (interrupt_signal != 0) throw Error("interrupted by signal " + std::to_string(interrupt_signal) + "; no output written", 128 + interrupt_signal);
}

Natural parse_number_option(const std::string& text, const std::string& option, Natural min, Natural max) {
  const Natural value = parse_natural(text, option);
  if (value < min || value > max)
    throw InvalidArgument(option + " " + text + " is outside the supported range [" + std::to_string(min) + ", " +
                          std::to_string(max) + "]");
  return value;
}

SampleRequest parse_sample_request(const std::optional<std::string>& every, const std::optional<std::string>& at,
                                   const std::optional<std::string>& log, Natural limit, const std::string& limit_text) {
  SampleRequest request;
  if (every) request.every = parse_number_option(*every, "--every", 1, limit);
  if (at)
    for (const auto v : parse_natural_list(*at, "--at")) {
      if (v < 1 || v > limit) throw InvalidArgument("--at: " + std::to_string(v) + " is outside [1, " + limit_text + "]");
      request.at.push_back(v);
    }
  if (log) request.per_decade = static_cast<unsigned>(parse_number_option(*log, "--log", 1, 1000));
  if (!every && !at && !log) request.per_decade = 10;
  return request;
}

std::string default_output_path(const std::string& command, const Invocation& invocation, Natural n,
                                const std::string& file) {
  const std::string dir = "data_out/" + command + "/" + io::utc_compact_timestamp(invocation.started) + "-to" + std::to_string(n);
  io::ensure_directory(dir);
  return dir + "/" + file;
}

unsigned default_thread_count() {
  const unsigned n = std::thread::hardware_concurrency();
  return n == 0 ? 1 : n;
}

std::string short_count(Natural n) {
  if (n < 100000) return std::to_string(n);
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.2fe%d", static_cast<double>(n) / std::pow(10.0, static_cast<int>(std::log10(static_cast<double>(n)))),
                static_cast<int>(std::log10(static_cast<double>(n))));
  return buffer;
}

ProgressBar::ProgressBar(std::string label, bool quiet)
    : label_(std::move(label)), active_(!quiet && ::isatty(STDERR_FILENO) == 1),
      start_(std::chrono::steady_clock::now()), last_draw_(start_) {}

ProgressBar::~ProgressBar() { finish(); }

void ProgressBar::update(Natural done, Natural total) {
  if (!active_ || total == 0) return;
  const auto now = std::chrono::steady_clock::now();
  if (drawn_ && now - last_draw_ < std::chrono::milliseconds(100) && done < total) return;
  last_draw_ = now;
  drawn_ = true;
  const double fraction = static_cast<double>(done) / static_cast<double>(total);
  constexpr int width = 30;
  const int filled = static_cast<int>(fraction * width);
  std::string bar;
  for (int i = 0; i < width; ++i) bar += i < filled ? '#' : '.';
  const double elapsed = std::chrono::duration<double>(now - start_).count();
  const double remaining = fraction > 0 ? elapsed * (1 - fraction) / fraction : 0;
  std::fprintf(stderr, "\r%s  |%s| %5.1f%%  n = %s of %s  %.0f s left   ", label_.c_str(), bar.c_str(),
               100 * fraction, short_count(done).c_str(), short_count(total).c_str(), remaining);
  std::fflush(stderr);
}

void ProgressBar::finish() {
  if (!active_ || !drawn_) return;
  std::fprintf(stderr, "\r%*s\r", 100, "");
  std::fflush(stderr);
  drawn_ = false;
}

}  // namespace sqfc::cli
