// SPDX-License-Identifier: MIT
// The golden files of tests/data/golden/ and the command lines that produce them.
#pragma once

#include <string>
#include <vector>

namespace sqfc::cli_test {

/// One golden file: the `sqfc` arguments that write it (into the file named `output`, relative to
/// the working directory) and its name under tests/data/golden/.
struct GoldenCase {
  std::string file;               ///< name under tests/data/golden/ (and the output name of the run)
  std::vector<std::string> args;  ///< arguments after `sqfc`
};

/// Every golden file. Each was written once by the binary, then verified against the brute-force
/// reference and published values (test_golden_content.cpp) before it was kept.
inline const std::vector<GoldenCase>& golden_cases() {
  static const std::vector<GoldenCase> cases = {
      {"table_to1000_every50.csv", {"table", "--to", "1000", "--every", "50", "--out", "table_to1000_every50.csv"}},
      {"table_from101_to500_every25.tsv",
       {"table", "--to", "500", "--from", "101", "--every", "25", "--format", "tsv", "--out",
        "table_from101_to500_every25.tsv"}},
      {"table_to300_at_selected.jsonl",
       {"table", "--to", "300", "--at", "1,2,6,15,30,105,210,300", "--columns", "liouville,b,mertens,f2", "--format",
        "jsonl", "--out", "table_to300_at_selected.jsonl"}},
      {"table_to1000_log.csv", {"table", "--to", "1000", "--out", "table_to1000_log.csv"}},
      {"mertens_to200.bfile.txt",
       {"table", "--to", "200", "--every", "1", "--columns", "mertens", "--format", "bfile", "--out",
        "mertens_to200.bfile.txt"}},
      {"events_to1000.csv",
       {"table", "--to", "1000", "--at", "1000", "--events", "events_to1000.csv", "--out", "t.csv"}},
  };
  return cases;
}

}  // namespace sqfc::cli_test
