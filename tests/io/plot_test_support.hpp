// SPDX-License-Identifier: MIT
// Checks of rendered pictures shared by the io and cli plot tests: PNG signature and size,
// SVG well-formedness through an XML parser, PDF header and trailer.
#pragma once

#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace sqfc::plot_test {

inline std::string read_bytes(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

/// The PNG signature (89 50 4E 47 0D 0A 1A 0A, PNG specification section 5.2, common practice),
/// an IHDR chunk first, and its width and height.
inline bool is_png_of_size(const std::filesystem::path& p, std::uint32_t width, std::uint32_t height, std::string& why) {
  const std::string b = read_bytes(p);
  if (b.size() < 33 + 12) return why = "shorter than a PNG header", false;
  if (b.compare(0, 8, std::string("\x89PNG\r\n\x1a\n", 8)) != 0) return why = "no PNG signature", false;
  if (b.compare(12, 4, "IHDR") != 0) return why = "first chunk is not IHDR", false;
  const auto be32 = [&](std::size_t at) {
    return (std::uint32_t(std::uint8_t(b[at])) << 24) | (std::uint32_t(std::uint8_t(b[at + 1])) << 16) |
           (std::uint32_t(std::uint8_t(b[at + 2])) << 8) | std::uint32_t(std::uint8_t(b[at + 3]));
  };
  if (be32(16) != width || be32(20) != height)
    return why = "size " + std::to_string(be32(16)) + "x" + std::to_string(be32(20)), false;
  if (b.find("IEND") == std::string::npos) return why = "no IEND chunk", false;
  return true;
}

/// Parses the SVG with python3's standard-library XML parser (xml.etree.ElementTree) and checks
/// that the root element is <svg> in the SVG namespace. python3 is a Debian base package here;
/// a standard-library parser avoids adding a C++ XML dependency for tests only.
inline bool is_well_formed_svg(const std::filesystem::path& p, std::string& why) {
  const std::string command =
      "python3 -c \"import sys, xml.etree.ElementTree as E; r = E.parse(sys.argv[1]).getroot(); "
      "sys.exit(0 if r.tag == '{http://www.w3.org/2000/svg}svg' else 3)\" '" + p.string() + "' 2>/dev/null";
  const int status = std::system(command.c_str());
  if (status != 0) return why = "python3 xml.etree rejected it (status " + std::to_string(status) + ")", false;
  return true;
}

/// A PDF starts with "%PDF-" and ends with "%%EOF" and optional end-of-line characters
/// (ISO 32000-1 sections 7.5.2 and 7.5.5, common practice).
inline bool is_pdf(const std::filesystem::path& p, std::string& why) {
  std::string b = read_bytes(p);
  if (b.rfind("%PDF-", 0) != 0) return why = "no %PDF- header", false;
  while (!b.empty() && (b.back() == '\n' || b.back() == '\r')) b.pop_back();
  if (b.size() < 5 || b.compare(b.size() - 5, 5, "%%EOF") != 0) return why = "no %%EOF trailer", false;
  return true;
}

}  // namespace sqfc::plot_test
