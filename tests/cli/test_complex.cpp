// SPDX-License-Identifier: MIT
// `sqfc complex N --object ... --format ...` run as a program (issue 7, items 2 and 3): the exact
// text of every format at N = 10, --count rows, the size guard (--max-bytes, --force), input
// errors (one line, exit 2, no file left) and the manifest. Read-back by networkx and scipy is in
// test_complex_reference.cpp.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <numeric>

#include "cli_runner.hpp"

namespace sqfc::cli_test {
namespace {

RunResult complex_cmd(const ScratchDir& dir, const std::vector<std::string>& args) {
  std::vector<std::string> all = {"complex"};
  all.insert(all.end(), args.begin(), args.end());
  return run_sqfc(dir, all);
}

// Hand-computed: the squarefree k in [2, 10] are 2, 3, 5, 6, 7, 10; G_10 has the edges 2-6,
// 3-6, 2-10, 5-10 (proper divisors) and H_10 also 6-10 (gcd 2).
const std::string graphml_nodes =
    "    <node id=\"2\"><data key=\"dimension\">0</data></node>\n"
    "    <node id=\"3\"><data key=\"dimension\">0</data></node>\n"
    "    <node id=\"5\"><data key=\"dimension\">0</data></node>\n"
    "    <node id=\"6\"><data key=\"dimension\">1</data></node>\n"
    "    <node id=\"7\"><data key=\"dimension\">0</data></node>\n"
    "    <node id=\"10\"><data key=\"dimension\">1</data></node>\n";
const std::string graphml_head =
    "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<graphml xmlns=\"http://graphml.graphdrawing.org/xmlns\">\n"
    "  <key id=\"dimension\" for=\"node\" attr.name=\"dimension\" attr.type=\"int\"/>\n";
const std::string g_title = "divisibility graph G_N (a - b when a properly divides b), N = 10";
const std::string h_title = "shared-factor graph H_N (a - b when gcd(a, b) > 1), N = 10";
const std::string dot_nodes = "  2 [dimension=0];\n  3 [dimension=0];\n  5 [dimension=0];\n  6 [dimension=1];\n"
                              "  7 [dimension=0];\n  10 [dimension=1];\n";
const std::string mtx_map = "% vertex index i (1-based) is the i-th squarefree integer in [2, N]; lines \"% i k\" map i to k\n"
                            "% 1 2\n% 2 3\n% 3 5\n% 4 6\n% 5 7\n% 6 10\n";

TEST(ComplexCommand, EveryFormatAtTenIsExact) {
  struct Case {
    std::vector<std::string> args;
    std::string text;
  };
  const std::vector<Case> cases = {
      {{"--object", "faces"},
       "{\"k\":2,\"primes\":[2],\"dim\":0}\n{\"k\":3,\"primes\":[3],\"dim\":0}\n{\"k\":5,\"primes\":[5],\"dim\":0}\n"
       "{\"k\":6,\"primes\":[2,3],\"dim\":1}\n{\"k\":7,\"primes\":[7],\"dim\":0}\n{\"k\":10,\"primes\":[2,5],\"dim\":1}\n"},
      {{"--object", "divisibility"},  // edges is the default graph format
       "# sqfc complex: " + g_title + "\n# vertices 6 edges 4; one edge \"a b\" per line, a < b\n2 6\n3 6\n2 10\n5 10\n"},
      {{"--object", "shared-factor", "--format", "edges"},
       "# sqfc complex: " + h_title + "\n# vertices 6 edges 5; one edge \"a b\" per line, a < b\n2 6\n3 6\n2 10\n5 10\n6 10\n"},
      {{"--object", "divisibility", "--format", "graphml"},
       graphml_head + "  <graph id=\"G_10\" edgedefault=\"undirected\">\n" + graphml_nodes +
           "    <edge source=\"2\" target=\"6\"/>\n    <edge source=\"3\" target=\"6\"/>\n"
           "    <edge source=\"2\" target=\"10\"/>\n    <edge source=\"5\" target=\"10\"/>\n  </graph>\n</graphml>\n"},
      {{"--object", "shared-factor", "--format", "graphml"},
       graphml_head + "  <graph id=\"H_10\" edgedefault=\"undirected\">\n" + graphml_nodes +
           "    <edge source=\"2\" target=\"6\"/>\n    <edge source=\"3\" target=\"6\"/>\n"
           "    <edge source=\"2\" target=\"10\"/>\n    <edge source=\"5\" target=\"10\"/>\n"
           "    <edge source=\"6\" target=\"10\"/>\n  </graph>\n</graphml>\n"},
      {{"--object", "divisibility", "--format", "dot"},
       "// sqfc complex: " + g_title + "\ngraph G_10 {\n" + dot_nodes + "  2 -- 6;\n  3 -- 6;\n  2 -- 10;\n  5 -- 10;\n}\n"},
      {{"--object", "shared-factor", "--format", "dot"},
       "// sqfc complex: " + h_title + "\ngraph H_10 {\n" + dot_nodes +
           "  2 -- 6;\n  3 -- 6;\n  2 -- 10;\n  5 -- 10;\n  6 -- 10;\n}\n"},
      // Lower triangle, row = index of b, column = index of a (2->1, 3->2, 5->3, 6->4, 7->5, 10->6).
      {{"--object", "divisibility", "--format", "mtx"},
       "%%MatrixMarket matrix coordinate pattern symmetric\n% sqfc complex: adjacency of the " + g_title + "\n" + mtx_map +
           "6 6 4\n4 1\n4 2\n6 1\n6 3\n"},
      {{"--object", "shared-factor", "--format", "mtx"},
       "%%MatrixMarket matrix coordinate pattern symmetric\n% sqfc complex: adjacency of the " + h_title + "\n" + mtx_map +
           "6 6 5\n4 1\n4 2\n6 1\n6 3\n6 4\n"},
  };
  std::size_t checked = 0;
  for (const auto& c : cases) {
    ScratchDir dir;
    std::vector<std::string> args = {"10"};
    args.insert(args.end(), c.args.begin(), c.args.end());
    args.insert(args.end(), {"--out", "-"});
    const auto r = complex_cmd(dir, args);
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(r.out, c.text) << describe(r);
    EXPECT_TRUE(r.err.empty()) << r.err;
    EXPECT_TRUE(list_dir(dir.work()).empty()) << "standard output must leave no file";
    ++checked;
  }
  EXPECT_EQ(checked, 9U);
}

TEST(ComplexCommand, CountRows) {
  // Hand-computed at N = 10 (see above); at N = 10^6: Q(10^6) = 607926 (OEIS A071172), so
  // 607925 vertices; the edge counts are compared with an enumeration run of the same binary.
  struct Case {
    std::vector<std::string> args;
    std::string out;
  };
  const std::vector<Case> cases = {
      {{"10", "--object", "faces", "--count"}, "n,object,faces,top_dimension\n10,faces,6,1\n"},
      {{"10", "--object", "divisibility", "--count"}, "n,object,vertices,edges\n10,divisibility,6,4\n"},
      {{"10", "--object", "shared-factor", "--count"}, "n,object,vertices,edges\n10,shared-factor,6,5\n"},
      {{"1e6", "--object", "faces", "--count"}, "n,object,faces,top_dimension\n1000000,faces,607925,6\n"},
      // 30 = 2*3*5 is the first face of dimension 2 (primorials, OEIS A002110).
      {{"30", "--object", "faces", "--count"}, "n,object,faces,top_dimension\n30,faces,18,2\n"},
  };
  std::size_t checked = 0;
  for (const auto& c : cases) {
    ScratchDir dir;
    const auto r = complex_cmd(dir, c.args);
    ASSERT_EQ(r.exit_code, 0) << describe(r);
    EXPECT_EQ(r.out, c.out);
    EXPECT_TRUE(list_dir(dir.work()).empty());
    ++checked;
  }
  EXPECT_EQ(checked, 5U);
  // --count against the number of lines an export writes (two header lines), N = 5000.
  std::size_t objects = 0;
  for (const std::string object : {"divisibility", "shared-factor"}) {
    ScratchDir dir;
    const auto count = complex_cmd(dir, {"5000", "--object", object, "--count"});
    ASSERT_EQ(count.exit_code, 0) << describe(count);
    const auto row = split_fields(split_lines(count.out).at(1));
    const auto exported = complex_cmd(dir, {"5000", "--object", object, "--out", "-"});
    ASSERT_EQ(exported.exit_code, 0) << describe(exported);
    EXPECT_EQ(std::to_string(split_lines(exported.out).size() - 2), row.at(3)) << object;
    ++objects;
  }
  EXPECT_EQ(objects, 2U);
}

TEST(ComplexCommand, SizeGuardRefusesAndForceWrites) {
  ScratchDir dir;
  const auto refused = complex_cmd(dir, {"1000", "--object", "shared-factor", "--out", "h.edges", "--max-bytes", "100"});
  EXPECT_EQ(refused.exit_code, 2) << describe(refused);
  EXPECT_EQ(split_lines(refused.err).size(), 1U) << refused.err;
  EXPECT_NE(refused.err.find("--force"), std::string::npos) << refused.err;
  EXPECT_NE(refused.err.find("bytes"), std::string::npos) << refused.err;
  EXPECT_TRUE(list_dir(dir.work()).empty()) << "a refused export leaves no file";
  const auto forced =
      complex_cmd(dir, {"1000", "--object", "shared-factor", "--out", "h.edges", "--max-bytes", "100", "--force"});
  ASSERT_EQ(forced.exit_code, 0) << describe(forced);
  EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"h.edges", "h.edges.manifest.json"}));
  const auto m = nlohmann::json::parse(read_file(dir.path("h.edges.manifest.json")));
  EXPECT_EQ(m.at("command"), "complex");
  EXPECT_EQ(m.at("parameters").at("object"), "shared-factor");
  EXPECT_EQ(m.at("parameters").at("force"), true);
  // The bound holds: bytes written <= estimated bytes; and the file is what the manifest says.
  const auto bytes = m.at("counts").at("bytes").get<std::uint64_t>();
  EXPECT_LE(bytes, m.at("counts").at("estimated_bytes").get<std::uint64_t>());
  EXPECT_EQ(bytes, read_file(dir.path("h.edges")).size());
  EXPECT_EQ(std::to_string(split_lines(read_file(dir.path("h.edges"))).size() - 2),
            std::to_string(m.at("counts").at("edges").get<std::uint64_t>()));
  // The default limit (2 GiB) refuses H_N at N = 10^6 (about 4 * 10^10 edges).
  const auto big = complex_cmd(dir, {"1e6", "--object", "shared-factor", "--out", "big.edges"});
  EXPECT_EQ(big.exit_code, 2) << describe(big);
  EXPECT_NE(big.err.find("GiB"), std::string::npos) << big.err;
  EXPECT_EQ(list_dir(dir.work()), (std::vector<std::string>{"h.edges", "h.edges.manifest.json"}));
}

TEST(ComplexCommand, BadInputIsOneLineExitTwoNoFile) {
  const std::vector<std::vector<std::string>> cases = {
      {"2e9", "--object", "faces", "--out", "x"},                      // past the enumeration limit 10^9
      {"10000001", "--object", "shared-factor", "--out", "x"},         // past 10^7 for H_N
      {"1e12", "--object", "divisibility", "--count"},                 // past the count limit 10^11
      {"0", "--object", "faces", "--out", "x"},                        // N >= 1
      {"10", "--object", "cliques", "--out", "x"},                     // unknown object
      {"10", "--object", "divisibility", "--format", "gml", "--out", "x"},  // unknown format
      {"10", "--object", "faces", "--format", "dot", "--out", "x"},    // format does not fit
      {"10", "--object", "divisibility", "--format", "jsonl", "--out", "x"},
      {"12abc", "--object", "faces", "--out", "x"},                    // junk N
      {"10", "--out", "x"},                                            // no --object
      {"10", "--object", "faces", "--max-bytes", "lots", "--out", "x"},
      {"10", "--object", "faces", "--count", "--out", "x"},            // --count writes no file
      {"10", "--object", "faces", "--out", ""},
  };
  std::size_t checked = 0;
  for (const auto& args : cases) {
    ScratchDir dir;
    const auto r = complex_cmd(dir, args);
    EXPECT_EQ(r.exit_code, 2) << describe(r);
    EXPECT_EQ(split_lines(r.err).size(), 1U) << describe(r);
    EXPECT_EQ(r.err.rfind("sqfc complex: error: ", 0), 0U) << describe(r);
    EXPECT_TRUE(r.out.empty()) << describe(r);
    EXPECT_TRUE(list_dir(dir.work()).empty()) << describe(r);
    ++checked;
  }
  EXPECT_EQ(checked, cases.size());
  EXPECT_EQ(checked, 13U);
  ScratchDir dir;
  const auto unknown = run_sqfc(dir, {"complexes"});
  EXPECT_EQ(unknown.exit_code, 2);
  EXPECT_NE(unknown.err.find("complex,"), std::string::npos) << unknown.err;
}

}  // namespace
}  // namespace sqfc::cli_test
