// SPDX-License-Identifier: MIT
// Run-store parameters and opening for `sqfc table --store`.
#include "table_store.hpp"

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <iostream>
#include <memory>

#include "sqfc/core/error.hpp"
#include "sqfc/io/stored_run.hpp"
#if SQFC_HAVE_MPI
#include "sqfc/io/mpi_run.hpp"
#endif

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

namespace {
#if SQFC_HAVE_MPI
std::unique_ptr<io::MpiSession> session;  // the one MPI session of this process, when launched by mpirun

// Launchers announce themselves in the environment: OpenMPI's mpirun, and PMI/PMIx launchers
// (Slurm's srun, MPICH's hydra).
bool launched_by_mpi() {
  for (const char* name : {"OMPI_COMM_WORLD_SIZE", "PMIX_RANK", "PMI_SIZE"})
    if (std::getenv(name) != nullptr) return true;
  return false;
}
#endif
}  // namespace

DistributedScope::DistributedScope() {
#if SQFC_HAVE_MPI
  if (launched_by_mpi() && !session) session = std::make_unique<io::MpiSession>();
#endif
}

DistributedScope::~DistributedScope() {
#if SQFC_HAVE_MPI
  session.reset();
#endif
}

unsigned DistributedScope::rank() const noexcept {
#if SQFC_HAVE_MPI
  if (session) return session->rank();
#endif
  return 0;
}

unsigned DistributedScope::ranks() const noexcept {
#if SQFC_HAVE_MPI
  if (session) return session->size();
#endif
  return 1;
}

track::TableRunReport run_table_engine(const TableJob& job, track::TableSink& sink, const track::ProgressFn& progress) {
#if SQFC_HAVE_MPI
  if (session && session->size() > 1) {
    try {
      std::optional<io::RunStore> store;
      if (job.store_path && session->rank() == 0) store = open_run_store(job);
      return io::run_table_distributed(job.run, *session, sink, store ? &*store : nullptr,
                                       session->rank() == 0 ? progress : track::ProgressFn{});
    } catch (const Error& e) {
      std::string message = e.what();
      for (auto& c : message)
        if (c == '\n') c = ' ';
      std::cerr << "sqfc table: error (rank " << session->rank() << "): " << message << '\n';
      session->abort(e.exit_code());
    }
  }
#endif
  if (job.store_path) {
    io::RunStore store = open_run_store(job);
    return io::run_table_stored(job.run, store, sink, progress);
  }
  return track::run_table(job.run, sink, progress);
}

std::optional<int> run_worker_rank(const TableJob& job) {
#if SQFC_HAVE_MPI
  if (session && session->rank() > 0) {
    struct NoOutput : track::TableSink {
      void on_row(const track::TableRow&) override {}
      void on_event(const track::Event&) override {}
    } none;
    (void)run_table_engine(job, none, {});
    return exit_code::ok;
  }
#endif
  (void)job;
  return std::nullopt;
}

}  // namespace sqfc::cli
