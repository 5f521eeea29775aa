// SPDX-License-Identifier: MIT
/// @file atomic_file.hpp  Output files that appear only when complete.
#pragma once

#include <fstream>
#include <ostream>
#include <string>

namespace sqfc::io {

/// Writes to `<path>.part-<pid>` and renames it to `path` on commit(), so a reader never sees
/// a partial file. "-" means standard output (no file, commit() flushes). An existing path
/// that is not a regular file (/dev/null, a FIFO, a terminal) is written directly: renaming
/// over a device would replace it.
/// Invariant: until commit() succeeds, `path` is untouched; the destructor removes the
/// temporary file of an uncommitted output.
class AtomicOutputFile {
 public:
  /// Opens the temporary file now, so that an unwritable path fails before any work.
  /// Throws: IoError naming the path and the reason.
  explicit AtomicOutputFile(std::string path);
  ~AtomicOutputFile();
  AtomicOutputFile(const AtomicOutputFile&) = delete;
  AtomicOutputFile& operator=(const AtomicOutputFile&) = delete;

  [[nodiscard]] std::ostream& stream();
  [[nodiscard]] const std::string& path() const noexcept { return path_; }
  [[nodiscard]] bool is_stdout() const noexcept { return path_ == "-"; }
  /// True for standard output and for existing non-regular files (devices, FIFOs): outputs
  /// that get no manifest beside them.
  [[nodiscard]] bool is_stream() const noexcept { return is_stdout() || direct_; }
  /// Flushes, closes and renames into place. Throws: IoError on a write or rename failure.
  void commit();

 private:
  std::string path_;
  std::string temporary_;
  std::ofstream file_;
  bool committed_ = false;
  bool direct_ = false;  // an existing non-regular file, written in place
};

/// Creates the directory and its parents when missing. Throws: IoError.
void ensure_directory(const std::string& directory);

}  // namespace sqfc::io
