// SPDX-License-Identifier: MIT
// Runs the sqfc executable in a fresh scratch folder and captures exit code, stdout and stderr.
#pragma once

#include <fcntl.h>
#include <poll.h>
#include <pty.h>
#include <signal.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <chrono>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

#ifndef SQFC_BINARY
#error "SQFC_BINARY (absolute path of the sqfc executable) must be defined by the build"
#endif
#ifndef SQFC_TEST_DATA_DIR
#error "SQFC_TEST_DATA_DIR must be defined by the build"
#endif

namespace sqfc::cli_test {

/// Absolute path of the executable under test.
inline std::string binary_path() { return SQFC_BINARY; }

/// tests/data/golden/, where the byte-exact expected outputs live.
inline std::filesystem::path golden_dir() { return std::filesystem::path(SQFC_TEST_DATA_DIR) / "golden"; }

/// What one run of the executable produced.
struct RunResult {
  int exit_code = -1;             ///< the process's exit status; 128 + signal number when it was killed
  bool killed_by_signal = false;  ///< true when a signal ended the process (it did not exit by itself)
  std::string out;                ///< everything written to standard output
  std::string err;                ///< everything written to standard error (through a terminal: as the terminal saw it)
  std::vector<std::string> argv;  ///< the argument vector that was executed, argv[0] included
};

/// A scratch folder for one test: `work/` is the child's working directory and holds only what the
/// child writes there; the captured streams live beside it, so listing `work/` shows outputs only.
/// Invariant: the folder exists from construction until destruction, which removes it with its contents.
class ScratchDir {
 public:
  ScratchDir() {
    std::string pattern = (std::filesystem::temp_directory_path() / "sqfc-cli-XXXXXX").string();
    if (::mkdtemp(pattern.data()) == nullptr)
      throw std::runtime_error("mkdtemp failed: " + std::string(std::strerror(errno)));
    root_ = pattern;
    std::filesystem::create_directory(work());
  }
  ~ScratchDir() {
    std::error_code ec;
    std::filesystem::remove_all(root_, ec);
  }
  ScratchDir(const ScratchDir&) = delete;
  ScratchDir& operator=(const ScratchDir&) = delete;

  /// The child's working directory.
  [[nodiscard]] std::filesystem::path work() const { return root_ / "work"; }
  /// A path inside the working directory.
  [[nodiscard]] std::filesystem::path path(const std::string& relative) const { return work() / relative; }
  /// Folder for the captured streams (outside work()).
  [[nodiscard]] const std::filesystem::path& root() const { return root_; }

 private:
  std::filesystem::path root_;
};

/// How to run the child.
struct RunOptions {
  /// Connect the child's stderr to a pseudo-terminal instead of a file (for the progress bar).
  bool stderr_terminal = false;
  /// The child is killed (by its pid) when it runs longer than this.
  std::chrono::seconds timeout{120};
  /// When non-zero: send this signal to the child (by its pid) once `signal_delay` has passed and,
  /// with `signal_after_partial_file`, once the working directory holds a `*.part-*` file (so the
  /// child is known to be past start-up and inside its run).
  int signal_number = 0;
  std::chrono::milliseconds signal_delay{0};
  bool signal_after_partial_file = false;
};

namespace detail {

inline std::string read_whole_file(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// Waits for `pid`, draining `terminal_fd` (when >= 0) into `terminal_text` meanwhile. Kills the
// child after the deadline so a hung binary fails the test instead of hanging it.
inline bool has_partial_file(const std::filesystem::path& dir) {
  std::error_code ec;
  for (const auto& entry : std::filesystem::directory_iterator(dir, ec))
    if (entry.path().filename().string().find(".part-") != std::string::npos) return true;
  return false;
}

inline int wait_for_child(pid_t pid, int terminal_fd, std::string& terminal_text, const RunOptions& options,
                          const std::filesystem::path& work, bool& killed_by_signal) {
  const auto start = std::chrono::steady_clock::now();
  const auto deadline = start + options.timeout;
  int status = 0;
  bool exited = false, killed = false, signalled = options.signal_number == 0;
  bool terminal_open = terminal_fd >= 0;
  while (!exited || terminal_open) {
    if (terminal_open) {
      pollfd p{terminal_fd, POLLIN, 0};
      const int ready = ::poll(&p, 1, 10);
      if (ready > 0) {
        char buffer[4096];
        const ssize_t got = ::read(terminal_fd, buffer, sizeof buffer);
        if (got > 0)
          terminal_text.append(buffer, static_cast<std::size_t>(got));
        else if (got == 0 || errno != EINTR)
          terminal_open = false;  // EIO: every slave end is closed
      } else if (ready < 0 && errno != EINTR) {
        terminal_open = false;
      } else if (exited) {
        terminal_open = false;  // child gone and nothing left to read
      }
    } else {
      std::this_thread::sleep_for(std::chrono::milliseconds(2));
    }
    if (!exited) {
      const pid_t r = ::waitpid(pid, &status, WNOHANG);
      if (r == pid)
        exited = true;
      else if (r < 0 && errno != EINTR)
        throw std::runtime_error("waitpid failed: " + std::string(std::strerror(errno)));
    }
    if (!exited && !signalled && std::chrono::steady_clock::now() >= start + options.signal_delay &&
        (!options.signal_after_partial_file || has_partial_file(work))) {
      ::kill(pid, options.signal_number);
      signalled = true;
    }
    if (!exited && !killed && std::chrono::steady_clock::now() > deadline) {
      ::kill(pid, SIGKILL);
      killed = true;
    }
  }
  if (WIFEXITED(status)) return WEXITSTATUS(status);
  if (WIFSIGNALED(status)) {
    killed_by_signal = true;
    return 128 + WTERMSIG(status);
  }
  return -1;
}

}  // namespace detail

/// Runs `program args...` (an absolute path; no PATH search) with working directory `dir.work()`,
/// stdin from /dev/null, and returns what it did; exit code 127 when the program cannot be executed.
/// Throws std::runtime_error when the process cannot be started at all.
inline RunResult run_program(const ScratchDir& dir, const std::string& program, const std::vector<std::string>& args,
                             const RunOptions& options = {}) {
  RunResult result;
  result.argv.push_back(program);
  result.argv.insert(result.argv.end(), args.begin(), args.end());
  std::vector<char*> c_argv;
  for (auto& a : result.argv) c_argv.push_back(a.data());
  c_argv.push_back(nullptr);

  static int run_counter = 0;
  const std::string tag = std::to_string(++run_counter);
  const std::string out_path = (dir.root() / ("stdout-" + tag)).string();
  const std::string err_path = (dir.root() / ("stderr-" + tag)).string();
  const std::string work = dir.work().string();

  int master = -1, slave = -1;
  if (options.stderr_terminal && ::openpty(&master, &slave, nullptr, nullptr, nullptr) != 0)
    throw std::runtime_error("openpty failed: " + std::string(std::strerror(errno)));

  const pid_t pid = ::fork();
  if (pid < 0) throw std::runtime_error("fork failed: " + std::string(std::strerror(errno)));
  if (pid == 0) {
    // Child: only async-signal-safe calls until exec.
    const int in = ::open("/dev/null", O_RDONLY);
    const int out = ::open(out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    const int err = options.stderr_terminal ? slave : ::open(err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    if (in < 0 || out < 0 || err < 0 || ::chdir(work.c_str()) != 0) ::_exit(126);
    if (options.stderr_terminal) {
      ::setsid();
      ::close(master);
    }
    ::dup2(in, 0);
    ::dup2(out, 1);
    ::dup2(err, 2);
    for (const int fd : {in, out, err})
      if (fd > 2) ::close(fd);
    ::execv(c_argv[0], c_argv.data());
    ::_exit(127);
  }
  std::string terminal_text;
  if (options.stderr_terminal) ::close(slave);
  result.exit_code = detail::wait_for_child(pid, master, terminal_text, options, dir.work(), result.killed_by_signal);
  if (options.stderr_terminal) ::close(master);
  result.out = detail::read_whole_file(out_path);
  result.err = options.stderr_terminal ? terminal_text : detail::read_whole_file(err_path);
  return result;
}

/// Runs `sqfc args...` with working directory `dir.work()`, stdin from /dev/null, and returns what it did.
/// Throws std::runtime_error when the process cannot be started at all.
inline RunResult run_sqfc(const ScratchDir& dir, const std::vector<std::string>& args, const RunOptions& options = {}) {
  return run_program(dir, binary_path(), args, options);
}

/// A readable summary of a run for assertion messages.
inline std::string describe(const RunResult& r) {
  std::string s = "command:";
  for (const auto& a : r.argv) s += " '" + a + "'";
  s += "\nexit code: " + std::to_string(r.exit_code) + (r.killed_by_signal ? " (killed by a signal)" : "") +
       "\nstderr: " + r.err.substr(0, 2000) + "\nstdout (first 500 bytes): " + r.out.substr(0, 500);
  return s;
}

/// Names of the entries of a folder, sorted.
inline std::vector<std::string> list_dir(const std::filesystem::path& p) {
  std::vector<std::string> names;
  for (const auto& entry : std::filesystem::directory_iterator(p)) names.push_back(entry.path().filename().string());
  std::sort(names.begin(), names.end());
  return names;
}

/// The contents of a file (empty when missing).
inline std::string read_file(const std::filesystem::path& p) { return detail::read_whole_file(p); }

/// Splits text into lines at '\n'; a final '\n' does not start an extra empty line.
inline std::vector<std::string> split_lines(const std::string& text) {
  std::vector<std::string> lines;
  std::size_t start = 0;
  while (start < text.size()) {
    const auto end = text.find('\n', start);
    if (end == std::string::npos) {
      lines.push_back(text.substr(start));
      break;
    }
    lines.push_back(text.substr(start, end - start));
    start = end + 1;
  }
  return lines;
}

/// Splits one line at every `separator` (no quoting: sqfc tables hold plain integers).
inline std::vector<std::string> split_fields(const std::string& line, char separator = ',') {
  std::vector<std::string> fields;
  std::size_t start = 0;
  while (true) {
    const auto end = line.find(separator, start);
    fields.push_back(line.substr(start, end == std::string::npos ? std::string::npos : end - start));
    if (end == std::string::npos) break;
    start = end + 1;
  }
  return fields;
}

/// Joins strings with a separator.
inline std::string join(const std::vector<std::string>& parts, const std::string& separator) {
  std::string s;
  for (std::size_t i = 0; i < parts.size(); ++i) s += (i ? separator : "") + parts[i];
  return s;
}

/// The default column list of a table up to N, written out independently of the library:
/// n, mu, mertens, euler, squarefree, liouville, fredholm, f0..fD, b0..bD, div_edges (design.md
/// section 4), with D = max(0, largest face dimension of K_N). The largest face of K_N has as many
/// primes as the largest primorial <= N (primorials 2, 6, 30, 210, ... are OEIS A002110).
inline std::vector<std::string> expected_columns(unsigned long long to) {
  const unsigned long long primes[] = {2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47};
  int count = 0;
  unsigned long long primorial = 1;
  for (const auto p : primes) {
    if (primorial > to / p) break;
    primorial *= p;
    ++count;
  }
  const int top = std::max(0, count - 1);
  std::vector<std::string> names = {"n", "mu", "mertens", "euler", "squarefree", "liouville", "fredholm"};
  for (int d = 0; d <= top; ++d) names.push_back("f" + std::to_string(d));
  for (int d = 0; d <= top; ++d) names.push_back("b" + std::to_string(d));
  names.push_back("div_edges");
  return names;
}

}  // namespace sqfc::cli_test
