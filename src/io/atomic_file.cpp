// SPDX-License-Identifier: MIT
// Temporary-then-rename output files.
#include "sqfc/io/atomic_file.hpp"

#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <iostream>

#include "sqfc/core/error.hpp"

namespace sqfc::io {

AtomicOutputFile::AtomicOutputFile(std::string path) : path_(std::move(path)) {
  if (path_.empty()) throw IoError("output path is empty");
  if (is_stdout()) return;
  if (std::filesystem::is_directory(path_)) throw IoError("cannot write '" + path_ + "': it is a directory");
  std::error_code ec;
  const auto status = std::filesystem::status(path_, ec);
  if (!ec && std::filesystem::exists(status) && !std::filesystem::is_regular_file(status)) {
    direct_ = true;
    file_.open(path_, std::ios::binary);
    if (!file_) throw IoError("cannot write '" + path_ + "': " + std::strerror(errno));
    return;
  }
  temporary_ = path_ + ".part-" + std::to_string(::getpid());
  file_.open(temporary_, std::ios::binary | std::ios::trunc);
  if (!file_) throw IoError("cannot write '" + path_ + "': " + std::strerror(errno));
}

AtomicOutputFile::~AtomicOutputFile() {
  if (!committed_ && !temporary_.empty()) {
    file_.close();
    std::remove(temporary_.c_str());
  }
}

std::ostream& AtomicOutputFile::stream() { return is_stdout() ? std::cout : static_cast<std::ostream&>(file_); }

void AtomicOutputFile::commit() {
  if (committed_) return;
  if (is_stdout()) {
    std::cout.flush();
    if (!std::cout) throw IoError("writing to standard output failed");
    committed_ = true;
    return;
  }
  if (direct_) {
    file_.flush();
    if (!file_) throw IoError("writing '" + path_ + "' failed");
    file_.close();
    committed_ = true;
    return;
  }
  file_.flush();
  const bool good = static_cast<bool>(file_);
  file_.close();
  if (!good || file_.fail()) throw IoError("writing '" + path_ + "' failed (disk full?)");
  if (std::rename(temporary_.c_str(), path_.c_str()) != 0)
    throw IoError("cannot move the finished output into '" + path_ + "': " + std::strerror(errno));
  committed_ = true;
}

void ensure_directory(const std::string& directory) {
  if (directory.empty()) return;
  std::error_code ec;
  std::filesystem::create_directories(directory, ec);
  if (ec) throw IoError("cannot create directory '" + directory + "': " + ec.message());
}

}  // namespace sqfc::io
