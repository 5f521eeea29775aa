// SPDX-License-Identifier: MIT
// Manifest helpers.
#include "sqfc/io/manifest.hpp"

#include <unistd.h>

#include <ctime>
#include <thread>

#include "sqfc/core/version.hpp"
#include "sqfc/io/atomic_file.hpp"

namespace sqfc::io {
namespace {
std::string format_utc(std::chrono::system_clock::time_point when, const char* pattern) {
  const std::time_t t = std::chrono::system_clock::to_time_t(when);
  std::tm tm{};
  gmtime_r(&t, &tm);
  char buffer[64];
  std::strftime(buffer, sizeof buffer, pattern, &tm);
  return buffer;
}
}  // namespace

std::string utc_timestamp(std::chrono::system_clock::time_point when) { return format_utc(when, "%Y-%m-%dT%H:%M:%SZ"); }

std::string utc_compact_timestamp(std::chrono::system_clock::time_point when) {
  return format_utc(when, "%Y%m%dT%H%M%SZ");
}

Json manifest_head(const std::vector<std::string>& command_line) {
  Json head;
  head.set("tool", "sqfc");
  head.set("version", version_string);
  head.set("source_commit", SQFC_GIT_COMMIT);
  Json argv;
  for (const auto& a : command_line) argv.push(a);
  head.set("command_line", std::move(argv));
  char host[256] = {};
  if (gethostname(host, sizeof host - 1) != 0) host[0] = '\0';
  Json machine;
  machine.set("host", std::string(host));
  machine.set("hardware_threads", std::thread::hardware_concurrency());
#if defined(__VERSION__)
  machine.set("compiler", std::string("g++ ") + __VERSION__);
#endif
  head.set("machine", std::move(machine));
  return head;
}

Json checks_to_json(const std::vector<track::CheckOutcome>& checks) {
  Json list = Json::Array{};
  for (const auto& c : checks) {
    Json item;
    item.set("name", c.name);
    item.set("statement", c.statement);
    item.set("passed", c.passed);
    item.set("failed", c.failed);
    item.set("first_failure_n", c.first_failure == 0 ? Json(nullptr) : Json(c.first_failure));
    if (!c.first_failure_detail.empty()) item.set("first_failure", c.first_failure_detail);
    list.push(std::move(item));
  }
  return list;
}

Json row_to_json(const track::TableRow& r, int top_dimension) {
  Json o;
  o.set("n", r.n);
  o.set("mu", r.mu);
  o.set("mertens", r.mertens);
  o.set("euler", r.euler);
  o.set("squarefree", r.squarefree);
  o.set("liouville", r.liouville);
  o.set("fredholm", r.fredholm);
  Json faces = Json::Array{}, betti = Json::Array{};
  for (int d = 0; d <= top_dimension; ++d) {
    faces.push(r.faces[static_cast<std::size_t>(d)]);
    betti.push(r.betti[static_cast<std::size_t>(d)]);
  }
  o.set("f", std::move(faces));
  o.set("b", std::move(betti));
  o.set("div_edges", r.div_edges);
  return o;
}

void set_run_times(Json& manifest, std::chrono::system_clock::time_point started, double wall_seconds) {
  manifest.set("started_utc", utc_timestamp(started));
  manifest.set("finished_utc", utc_timestamp(std::chrono::system_clock::now()));
  manifest.set("wall_seconds", wall_seconds);
}

void write_manifest(const std::string& path, const Json& manifest) {
  AtomicOutputFile file(path);
  file.stream() << manifest.dump(2) << '\n';
  file.commit();
}

}  // namespace sqfc::io
