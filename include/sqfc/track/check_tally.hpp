// SPDX-License-Identifier: MIT
/// @file check_tally.hpp  Pass/fail counts of the identities a run checks as it goes.
#pragma once

#include <algorithm>
#include <cstddef>
#include <string>
#include <vector>

#include "sqfc/core/types.hpp"

namespace sqfc::track {

/// Outcome of one identity checked during a run.
struct CheckOutcome {
  std::string name;           ///< stable identifier, e.g. "euler_poincare"
  std::string statement;      ///< what is checked, with its source
  Count passed = 0;
  Count failed = 0;
  Natural first_failure = 0;  ///< n of the first failure, 0 when none
  std::string first_failure_detail;  ///< what differed at the first failure, when the check says
};

/// True when no outcome has a failure.
inline bool all_passed(const std::vector<CheckOutcome>& checks) {
  return std::all_of(checks.begin(), checks.end(), [](const CheckOutcome& c) { return c.failed == 0; });
}

/// Counts passes and failures per named check.
/// Invariant: the index add() returns stays valid; outcomes keep the order of add().
class CheckTally {
 public:
  /// Registers a check; returns its index for record().
  std::size_t add(std::string name, std::string statement) {
    outcomes_.push_back({std::move(name), std::move(statement), 0, 0, 0, {}});
    return outcomes_.size() - 1;
  }
  /// Records one evaluation at n. When @p row_checks is given, appends "name" or "name:FAIL"
  /// to it (';'-separated); @p detail is kept for the first failure. Pre: i from add() (assumed).
  void record(std::size_t i, bool ok, Natural n, std::string* row_checks = nullptr, const std::string& detail = {}) {
    auto& o = outcomes_[i];
    if (row_checks) {
      if (!row_checks->empty()) *row_checks += ';';
      *row_checks += o.name + (ok ? "" : ":FAIL");
    }
    if (ok) {
      ++o.passed;
      return;
    }
    if (o.failed == 0) {
      o.first_failure = n;
      o.first_failure_detail = detail;
    }
    ++o.failed;
  }
  /// The outcomes so far (for a checkpoint).
  [[nodiscard]] const std::vector<CheckOutcome>& outcomes() const noexcept { return outcomes_; }
  /// Continues the counts of a checkpoint. Pre: @p saved lists the same checks, by name and in
  /// the order of add() (checked; returns false and changes nothing otherwise).
  bool restore(const std::vector<CheckOutcome>& saved) {
    if (saved.size() != outcomes_.size()) return false;
    for (std::size_t i = 0; i < saved.size(); ++i)
      if (saved[i].name != outcomes_[i].name) return false;
    for (std::size_t i = 0; i < saved.size(); ++i) {
      outcomes_[i].passed = saved[i].passed;
      outcomes_[i].failed = saved[i].failed;
      outcomes_[i].first_failure = saved[i].first_failure;
      outcomes_[i].first_failure_detail = saved[i].first_failure_detail;
    }
    return true;
  }
  /// The outcomes, moved out.
  std::vector<CheckOutcome> take() { return std::move(outcomes_); }

 private:
  std::vector<CheckOutcome> outcomes_;
};

}  // namespace sqfc::track
