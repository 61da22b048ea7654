#pragma once
// Private to batch: everything a run fixes before its first column (paths, expanded study, set-ups,
// provenance, the resume hash) and the block computation, shared by run_study (one process) and
// run_study_mpi (several).
#include <atomic>
#include <cstddef>
#include <filesystem>
#include <string>
#include <vector>

#include "bandstack/batch/run.hpp"
#include "bandstack/io/result_writer.hpp"
#include "bandstack/io/sweep.hpp"
#include "batch/climate_setup.hpp"
#include "batch/longwave_setup.hpp"
#include "batch/progress.hpp"
#include "batch/shortwave_setup.hpp"

namespace bandstack::batch {

// Built in place (the climate set-up points into the others): not copyable or movable.
struct RunContext {
  // `writes_output`: check that the result file's folder is writable (the rank that writes it).
  RunContext(const io::Study& study, const RunOptions& options, bool writes_output = true);
  RunContext(const RunContext&) = delete;
  RunContext& operator=(const RunContext&) = delete;

  std::filesystem::path path;   // the final result file
  io::ExpandedStudy expanded;
  std::size_t total;            // columns
  LongwaveSetup longwave;
  ShortwaveSetup shortwave;
  ClimateSetup climate;
  io::RunInfo info;
  std::string hash;             // of everything that decides the file's contents (resume check)
  std::size_t threads;
  bool stop_on_column_error;

private:
  static io::ExpandedStudy checked_columns(const io::Study& study, const RunOptions& options,
                                           const std::filesystem::path& path, bool writes_output);
  static ClimateSetup checked_climate(const io::Study& flat, const LongwaveSetup& lw, const ShortwaveSetup& sw);
};

// Columns [first, first + count): built and computed in parallel (RunContext::threads), each result
// in its own slot; a column that fails is recorded in its slot (status, error, name) unless
// stop_on_column_error (then its error propagates). `done` counts finished columns for `progress`.
[[nodiscard]] std::vector<ColumnResult> compute_block(const RunContext& run, std::size_t first, std::size_t count,
                                                      Progress& progress, std::atomic<std::size_t>& done);

// Sends `text` to RunOptions::note, if set.
void note(const RunOptions& options, const std::string& text);

// Where a run starts: 0, or after the columns an interrupted run of the same study recorded (then
// a note says so); an unusable earlier working file is discarded (with a note why).
[[nodiscard]] std::size_t resume_point(const std::filesystem::path& path, const std::string& hash,
                                       const RunOptions& options, std::size_t total);

// Failure messages kept in RunOutcome::first_failures.
inline constexpr std::size_t max_failures_kept = 5;

// Counts a failed column in `outcome`, keeping its message if it is among the first few.
void count_failure(RunOutcome& outcome, const std::string& error);

// The error of a run in which no column could be computed (InputError naming the result file and
// the first failure).
[[noreturn]] void fail_without_columns(const std::filesystem::path& path, const RunOutcome& outcome);

} // namespace bandstack::batch
