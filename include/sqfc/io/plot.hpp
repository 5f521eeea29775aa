// SPDX-License-Identifier: MIT
/// @file plot.hpp  Pictures of sqfc outputs: a data file and a gnuplot script per picture, rendered by gnuplot.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::io {

/// The picture kinds (docs/plots.md).
enum class PlotKind { mertens, scaled, betti, faces, fredholm, barcode, diagram, green };
/// Picture formats: pngcairo, svg and pdfcairo terminals of gnuplot.
enum class PlotFormat { png, svg, pdf };
/// What a plot input file is.
enum class PlotInput { table, envelope, events, barcode, histogram };

std::string_view plot_kind_name(PlotKind kind) noexcept;
std::string_view plot_format_name(PlotFormat format) noexcept;
std::string_view plot_input_name(PlotInput input) noexcept;
/// Parses a kind name; nullopt when the text names no kind.
std::optional<PlotKind> find_plot_kind(std::string_view name) noexcept;
/// Parses a format name; nullopt when the text names no format.
std::optional<PlotFormat> find_plot_format(std::string_view name) noexcept;
/// Every kind, in the order of the enumeration.
std::vector<PlotKind> all_plot_kinds();

/// Recognises an input file by its first lines: the envelope signature; the headers
/// `kind,n,value` (events), `dimension,birth,death` (barcode), `n,value,count,diagonal_count`
/// (Green histogram); a header starting with `n` in CSV or TSV, or a JSON line starting with
/// `{"n":` (tables of sqfc table, homology and fredholm).
/// Throws: IoError (unreadable), InvalidArgument (empty or unrecognised, naming the file).
PlotInput detect_plot_input(const std::string& path);

/// The kinds an input supports, in enumeration order: tables the kinds whose columns they
/// have (mertens and scaled need `mertens`, betti `b0`, faces `f0`, fredholm `fredholm`), an
/// envelope the same, events mertens and scaled (markers only), a barcode barcode and diagram,
/// a histogram green. Throws: as detect_plot_input.
std::vector<PlotKind> supported_plot_kinds(const std::string& path, PlotInput input);

/// One plotting job: every kind in `kinds` from one input, in every format.
struct PlotRequest {
  std::string input;                  ///< the data file
  std::optional<PlotInput> input_kind;  ///< detected when empty
  std::optional<std::string> events;  ///< events file: zeros and records on the mertens and scaled pictures
  std::vector<PlotKind> kinds;        ///< empty: every supported kind
  std::vector<PlotFormat> formats = {PlotFormat::png};
  /// Output prefix: picture k goes to `<prefix>-<kind>.{dat,gp,png,svg,pdf}`.
  std::string prefix;
  bool log_x = false;
  bool log_y = true;                  ///< betti, faces and green use a log y axis
  unsigned width = 1200, height = 720;  ///< pixels (PDF: width/100 by height/100 inches)
  std::string gnuplot;                ///< absolute path of the gnuplot program
  std::optional<Natural> histogram_n;  ///< green: the sample n (default: the largest in the file)
  std::size_t max_bars = 20000;       ///< barcode and diagram refuse larger barcodes
};

/// What one picture wrote.
struct PlotOutput {
  PlotKind kind;
  std::string data, script;
  std::vector<std::string> pictures;
};

/// Checks a request before any file is written: the input exists and is recognised, every
/// requested kind is supported by it, the barcode is small enough, formats and sizes are sane,
/// and the gnuplot program exists. Throws: InvalidArgument, IoError (one-line messages; a
/// missing gnuplot names the Debian package gnuplot-nox).
void check_plot_request(const PlotRequest& request);

/// Throws IoError, naming the Debian package gnuplot-nox, unless `program` is an executable file.
void check_gnuplot(const std::string& program);

/// Writes the data file and the script of every picture (atomically), then runs gnuplot once per
/// format with the script's folder as working directory, writing each picture under a temporary
/// name that is renamed when gnuplot succeeds.
/// Complexity: O(size of the input) plus gnuplot's time (about 0.2 s per picture).
/// Throws: as check_plot_request; IoError when gnuplot fails (with its first error line).
std::vector<PlotOutput> make_plots(const PlotRequest& request);

}  // namespace sqfc::io
