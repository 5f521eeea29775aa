// SPDX-License-Identifier: MIT
// Readable and JSON forms of the identity suite's report.
#include "sqfc/io/identity_report.hpp"

#include <string>

namespace sqfc::io {
namespace {

const char* verdict(const track::IdentityCheckResult& c) {
  if (c.failed) return "FAIL";
  return c.points == 0 ? "SKIPPED" : "PASS";
}

std::string identity_list(const std::vector<int>& ids) {
  std::string s;
  for (std::size_t i = 0; i < ids.size(); ++i) s += (i ? "," : "") + std::to_string(ids[i]);
  return s;
}

}  // namespace

void write_identity_report(std::ostream& out, const track::IdentitySuiteReport& report, unsigned threads) {
  out << "sqfc identity suite (design.md section 2)\n";
  out << "range: n = 1.." << report.to << "\n";
  out << "identities: " << identity_list(report.identities) << "\n";
  out << "threads: " << threads << "\n";
  if (report.corruption)
    out << "injected fault (test only): " << report.corruption->check << " at n = " << report.corruption->n << "\n";
  int current = 0;
  Count passed = 0, failed = 0, skipped = 0;
  for (const auto& c : report.checks) {
    if (c.identity != current) {
      current = c.identity;
      out << "\n[" << current << "] " << track::identity_title(current) << "\n";
    }
    out << "  " << verdict(c) << "  " << c.name << "\n";
    out << "    statement: " << c.statement << "\n";
    out << "    source: " << c.source << "\n";
    out << "    routes: " << c.routes << "\n";
    if (c.points == 0) {
      out << "    checked: nothing (no n of this check lies in 1.." << report.to << ")\n";
      ++skipped;
      continue;
    }
    out << "    checked: " << c.coverage << (c.reduced_range ? " (smaller range: expensive check)" : "") << "\n";
    out << "    counts: " << c.points << " n, " << c.compared << " values compared, " << c.failed << " n failed\n";
    if (c.first_failure)
      out << "    first failure: n = " << c.first_failure->n << ", expected " << c.first_failure->expected << ", got "
          << c.first_failure->got << "\n";
    (c.failed ? failed : passed) += 1;
  }
  bool any_reduced = false;
  for (const auto& c : report.checks) any_reduced = any_reduced || (c.reduced_range && c.points > 0);
  if (any_reduced) {
    out << "\nsmaller ranges (expensive checks):\n";
    for (const auto& c : report.checks)
      if (c.reduced_range && c.points > 0) out << "  " << c.name << ": " << c.coverage << "\n";
  }
  out << "\nengine self-checks: ";
  if (report.engine_checks_failed.empty()) {
    out << "all passed\n";
  } else {
    for (std::size_t i = 0; i < report.engine_checks_failed.size(); ++i)
      out << (i ? ", " : "") << report.engine_checks_failed[i];
    out << " FAILED\n";
  }
  out << "checks: " << report.checks.size() << " run, " << passed << " passed, " << failed << " failed, " << skipped
      << " skipped\n";
  out << "verdict: " << (report.passed() ? "PASS" : "FAIL") << "\n";
}

Json identity_report_json(const track::IdentitySuiteReport& report) {
  Json doc;
  doc.set("to", report.to);
  Json ids = Json::Array{};
  for (int i : report.identities) ids.push(i);
  doc.set("identities", std::move(ids));
  doc.set("passed", report.passed());
  if (report.corruption) {
    Json fault;
    fault.set("check", report.corruption->check);
    fault.set("n", report.corruption->n);
    doc.set("injected_fault", std::move(fault));
  } else {
    doc.set("injected_fault", nullptr);
  }
  Json engine = Json::Array{};
  for (const auto& name : report.engine_checks_failed) engine.push(name);
  doc.set("engine_checks_failed", std::move(engine));
  Json checks = Json::Array{};
  for (const auto& c : report.checks) {
    Json item;
    item.set("identity", c.identity);
    item.set("identity_title", std::string(track::identity_title(c.identity)));
    item.set("name", c.name);
    item.set("verdict", verdict(c));
    item.set("statement", c.statement);
    item.set("source", c.source);
    item.set("routes", c.routes);
    item.set("from", c.points ? Json(c.from) : Json(nullptr));
    item.set("to", c.points ? Json(c.to) : Json(nullptr));
    item.set("coverage", c.coverage);
    item.set("reduced_range", c.reduced_range);
    item.set("points", c.points);
    item.set("compared", c.compared);
    item.set("failed", c.failed);
    if (c.first_failure) {
      Json f;
      f.set("n", c.first_failure->n);
      f.set("expected", c.first_failure->expected);
      f.set("got", c.first_failure->got);
      item.set("first_failure", std::move(f));
    } else {
      item.set("first_failure", nullptr);
    }
    checks.push(std::move(item));
  }
  doc.set("checks", std::move(checks));
  return doc;
}

}  // namespace sqfc::io
