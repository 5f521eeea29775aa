// SPDX-License-Identifier: MIT
// Exports of `sqfc complex` read back by reference libraries (issue 7 checks): GraphML and edge
// lists by networkx, Matrix Market by scipy.io.mmread, with the vertex and edge counts of
// `sqfc complex --count`. The Debian packages python3-networkx and python3-scipy come from
// scripts/setup.sh; when the interpreter or a module is missing the test fails, it never skips.
#include <gtest/gtest.h>

#include <utility>

#include "cli_runner.hpp"

namespace sqfc::cli_test {
namespace {

RunResult complex_cmd(const ScratchDir& dir, const std::vector<std::string>& args) {
  std::vector<std::string> all = {"complex"};
  all.insert(all.end(), args.begin(), args.end());
  return run_sqfc(dir, all);
}

// The Debian interpreter: python3-networkx and python3-scipy (scripts/setup.sh) install for it,
// whatever other python3 comes first on PATH.
const std::string python = "/usr/bin/python3";

TEST(ComplexExportReference, NetworkxAndScipyReadTheExports) {
  // networkx (read_graphml, read_edgelist) and scipy.io.mmread read the files back; their vertex
  // and edge counts must equal sqfc's --count. A missing interpreter or module fails the test.
  ScratchDir dir;
  struct Export {
    std::string object, format, file;
  };
  const std::vector<Export> exports = {
      {"divisibility", "graphml", "g.graphml"}, {"divisibility", "edges", "g.edges"}, {"divisibility", "mtx", "g.mtx"},
      {"shared-factor", "graphml", "h.graphml"}, {"shared-factor", "edges", "h.edges"}, {"shared-factor", "mtx", "h.mtx"},
  };
  for (const auto& e : exports) {
    const auto r = complex_cmd(dir, {"1000", "--object", e.object, "--format", e.format, "--out", e.file});
    ASSERT_EQ(r.exit_code, 0) << describe(r);
  }
  const auto g = complex_cmd(dir, {"1000", "--object", "divisibility", "--count"});
  const auto h = complex_cmd(dir, {"1000", "--object", "shared-factor", "--count"});
  ASSERT_EQ(g.exit_code, 0);
  ASSERT_EQ(h.exit_code, 0);
  const std::string script =
      "import sys\n"
      "try:\n"
      "    import networkx as nx\n"
      "    import scipy.io\n"
      "except ImportError as e:\n"
      "    sys.exit('missing reference module: %s (install python3-networkx python3-scipy, scripts/setup.sh)' % e)\n"
      "for name in ('g', 'h'):\n"
      "    ml = nx.read_graphml(name + '.graphml')\n"
      "    el = nx.read_edgelist(name + '.edges', nodetype=int)\n"
      "    mm = scipy.io.mmread(name + '.mtx').tocsr()\n"
      "    isolated = sum(1 for v in ml if ml.degree(v) == 0)\n"
      "    dims = sorted(set(d for _, d in ml.nodes(data='dimension')))\n"
      "    print(name, ml.number_of_nodes(), ml.number_of_edges(), el.number_of_nodes() + isolated,\n"
      "          el.number_of_edges(), mm.shape[0], (mm.nnz - int(mm.diagonal().sum())) // 2,\n"
      "          int((mm != mm.T).nnz), ','.join(map(str, dims)))\n";
  const auto py = run_program(dir, python, {"-c", script});
  ASSERT_NE(py.exit_code, 127) << "cannot execute " << python << " (install python3; scripts/setup.sh)";
  ASSERT_EQ(py.exit_code, 0) << describe(py);
  const auto lines = split_lines(py.out);
  ASSERT_EQ(lines.size(), 2U) << py.out;
  std::size_t checked = 0;
  for (const auto& [line, count] : {std::pair{lines[0], g.out}, std::pair{lines[1], h.out}}) {
    const auto f = split_fields(line, ' ');
    ASSERT_EQ(f.size(), 9U) << line;
    const auto row = split_fields(split_lines(count).at(1));
    const std::string& vertices = row.at(2);
    const std::string& edges = row.at(3);
    EXPECT_EQ(f[1], vertices) << "networkx GraphML vertices: " << line;
    EXPECT_EQ(f[2], edges) << "networkx GraphML edges: " << line;
    EXPECT_EQ(f[3], vertices) << "networkx edge-list vertices plus isolated ones: " << line;
    EXPECT_EQ(f[4], edges) << "networkx edge-list edges: " << line;
    EXPECT_EQ(f[5], vertices) << "scipy mmread matrix order: " << line;
    EXPECT_EQ(f[6], edges) << "scipy mmread symmetric entries / 2: " << line;
    EXPECT_EQ(f[7], "0") << "scipy mmread matrix is symmetric: " << line;
    EXPECT_EQ(f[8], "0,1,2,3") << "GraphML dimensions at N = 1000 (210 = 2*3*5*7 has dimension 3): " << line;
    ++checked;
  }
  EXPECT_EQ(checked, 2U);
}

}  // namespace
}  // namespace sqfc::cli_test
