#pragma once
// Running a study across the ranks of an MPI job (optional build feature BANDSTACK_MPI, Open MPI):
// columns are handed out block by block to whichever rank asks (dynamic balancing: equilibrium
// columns cost unevenly), each rank computes its blocks with oneTBB, and rank 0 writes the one result
// file (a gather strategy: the other ranks send their blocks to rank 0 as packed numbers,
// io/result_packing.hpp). The file is identical to a single-process run's, whatever the rank count.
#include "bandstack/batch/run.hpp"

namespace bandstack::batch {

// Whether this build can run across MPI ranks.
[[nodiscard]] bool mpi_built() noexcept;

// The MPI environment of the process: initialised (MPI_Init_thread, funnelled) only when the process
// was started by an MPI launcher (mpirun, srun), so that the plain executable never needs one. Keep
// one alive for the whole program; MPI is finalised when it ends.
class MpiSession {
public:
  MpiSession(int& argc, char**& argv);
  ~MpiSession();
  MpiSession(const MpiSession&) = delete;
  MpiSession& operator=(const MpiSession&) = delete;
  [[nodiscard]] int rank() const noexcept { return rank_; }
  [[nodiscard]] int size() const noexcept { return size_; }
  // Ends every rank of the job with `code` (after an error that the other ranks cannot see).
  [[noreturn]] void abort(int code) const;

private:
  bool initialised_ = false;
  int rank_ = 0;
  int size_ = 1;
};

// run_study over the session's ranks. Rank 0 returns the outcome (summaries only for columns it
// computed itself; failure counts for all); the other ranks return an outcome with only
// column_count set. With one rank this is run_study. Resuming works as for run_study (rank 0 keeps
// the checkpoint: the blocks written in a row from the start). Errors of any rank end the run: the
// rank that meets one reports it through rank 0, which discards the working file and aborts the
// job with exit code 2 (bad input) or 1.
[[nodiscard]] RunOutcome run_study_mpi(const io::Study& study, const RunOptions& options, const MpiSession& session);

} // namespace bandstack::batch
