// SPDX-License-Identifier: MIT
/// @file identity_report.hpp  The readable report and the JSON document of `sqfc check` (the identity suite).
#pragma once

#include <ostream>

#include "sqfc/io/json.hpp"
#include "sqfc/track/identity_suite.hpp"

namespace sqfc::io {

/// Writes the readable report (docs/output-formats.md, "Identity suite report"): a heading, one
/// block per check grouped by identity (verdict, statement, source, routes, range, counts, first
/// failure), the sub-ranges of the expensive checks, and a closing verdict line.
/// @param threads shown in the heading. Complexity: O(checks).
void write_identity_report(std::ostream& out, const track::IdentitySuiteReport& report, unsigned threads);

/// The report as JSON: {"to", "identities", "passed", "engine_checks_failed", "checks": [...]},
/// one object per check with every field of track::IdentityCheckResult. Complexity: O(checks).
Json identity_report_json(const track::IdentitySuiteReport& report);

}  // namespace sqfc::io
