// SPDX-License-Identifier: MIT
// Slow `sqfc value` check (issue 3): face counts, Betti numbers, M, Q, L and the Fredholm sign
// at 10^8 equal those of `sqfc table --to 10^8`.
// Expected values: the oracle is `sqfc table` (itself checked against OEIS b-files); no outside value is used.
#include <gtest/gtest.h>

#include "cli_runner.hpp"
#include "value_test_support.hpp"

namespace sqfc::cli_test {
namespace {

TEST(ValueCommandSlow, EveryColumnEqualsTheTableAt1e8) {
  ScratchDir dir;
  const auto v = run_sqfc(dir, {"value", "1e8", "--what", "mertens,squarefree,liouville,fredholm,faces,betti", "--out", "-"});
  ASSERT_EQ(v.exit_code, 0) << describe(v);
  const auto t = run_sqfc(dir, {"table", "--to", "1e8", "--at", "1e8", "--out", "-", "--quiet"});
  ASSERT_EQ(t.exit_code, 0) << describe(t);
  const auto vr = csv_rows(v.out), tr = csv_rows(t.out);
  ASSERT_EQ(vr.size(), 1U);
  ASSERT_EQ(tr.size(), 1U);
  EXPECT_EQ(compare_value_with_table(vr[0], tr[0]), 2 * 8 + 5);  // f0..f7, b0..b7 (D = 7 at 10^8), n, M, Q, L, D
}

}  // namespace
}  // namespace sqfc::cli_test
