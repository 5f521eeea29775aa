// SPDX-License-Identifier: MIT
// Run-store parameters and opening for `sqfc table --store`.
#include "table_store.hpp"

#include <algorithm>
#include <filesystem>

namespace sqfc::cli {

std::vector<io::RunParameter> store_parameters(const TableJob& job, const SampleRequest& samples) {
  std::vector<io::RunParameter> p;
  p.push_back({"to", std::to_string(job.run.to)});
  p.push_back({"from", std::to_string(job.run.from)});
  // The sample points in a canonical form, so --at 20,10 and --at 10,20 agree.
  std::string sampling;
  if (samples.every) sampling += "every=" + std::to_string(*samples.every) + ";";
  if (!samples.at.empty()) {
    std::vector<Natural> at = samples.at;
    std::sort(at.begin(), at.end());
    at.erase(std::unique(at.begin(), at.end()), at.end());
    sampling += "at=";
    for (std::size_t i = 0; i < at.size(); ++i) sampling += (i ? "," : "") + std::to_string(at[i]);
    sampling += ";";
  }
  if (samples.per_decade) sampling += "log=" + std::to_string(*samples.per_decade) + ";";
  p.push_back({"samples", sampling});
  std::string columns;
  for (const auto& c : job.columns) columns += (columns.empty() ? "" : ",") + io::column_name(c);
  p.push_back({"columns", columns});
  p.push_back({"format", std::string(io::table_format_extension(job.format))});
  p.push_back({"events", job.run.events ? "yes" : "no"});
  p.push_back({"block_size", std::to_string(job.run.block_size)});
  p.push_back({"segment_size", std::to_string(job.run.segment_size)});
  std::sort(p.begin(), p.end(), [](const auto& a, const auto& b) { return a.name < b.name; });
  return p;
}

io::RunStore open_run_store(const TableJob& job) {
  const std::string& path = *job.store_path;
  std::error_code ec;
  io::RunStore store = (job.resume && std::filesystem::exists(path, ec))
                           ? io::RunStore::open_for_resume(path, job.store_parameters)
                           : io::RunStore::create(path, job.store_parameters);
  store.begin_attempt(job.run.threads, job.run.ranks);
  return store;
}

}  // namespace sqfc::cli
