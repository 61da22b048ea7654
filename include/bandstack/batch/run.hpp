#pragma once
// Running a study: build every column, compute it (in parallel, deterministically), write the result.
#include <cstddef>
#include <filesystem>
#include <optional>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

#include "bandstack/batch/column_result.hpp"
#include "bandstack/io/study.hpp"

namespace bandstack::batch {

struct RunOptions {
  std::size_t threads = 0;                   // worker threads; 0 = all hardware threads
  std::filesystem::path output_directory;    // if not empty, the output file is written here instead
  // Columns computed (in parallel) and written per block; memory use grows with this, not with the
  // number of columns of the study. Part of the checkpoint: a run resumes only with the same value.
  std::size_t chunk_columns = 256;
  int deflate_level = 0;                     // netCDF deflate level of the result (0 = none, 1..9)
  bool resume = true;                        // continue an interrupted run of the same study and settings
  bool progress = false;                     // show columns done, rate and time left on stderr
  std::size_t summary_columns = 1000;        // RunOutcome::summaries are kept only up to this many columns
  std::function<void(std::string_view)> note; // receives notes (resuming, starting afresh); may be empty
  // A column that cannot be built or computed (InputError, ConvergenceError) is recorded in the file
  // (column_status, column_error) and the run goes on; with this set, the first one stops the run.
  bool stop_on_column_error = false;
};

// The Sun's geometry a column spec asks for (see io::SunSpec).
[[nodiscard]] atmosphere::SunGeometry sun_geometry(const io::SunSpec& sun);

// Builds and validates every column of the study, one per combination of columns and sweep values
// in row-major order (io::expand_sweeps); InputError names the column on failure.
[[nodiscard]] std::vector<atmosphere::Column> build_columns(const io::Study& study);

// Everything a run would check before computing: builds and validates every column and loads the
// band sets and absorber sources the study names, and checks the experiments against them
// (InputError / FileError on any problem). Columns are built one at a time and dropped. Returns the
// counts. Used by `bandstack check`.
struct StudyCheck {
  std::size_t column_count = 0;  // after expanding sweeps or reading the profile file
  std::size_t layer_count = 0;   // of the first column (all share it)
};
[[nodiscard]] StudyCheck check_study(const io::Study& study);

// Computes every column (`columns` from build_columns of the same study). Columns are independent and each result goes to its own slot, so the
// results are bit-identical for any thread count.
[[nodiscard]] std::vector<ColumnResult> compute_columns(const io::Study& study,
                                                        const std::vector<atmosphere::Column>& columns,
                                                        std::size_t threads);

// Where the study's output will be written under these options.
[[nodiscard]] std::filesystem::path output_path(const io::Study& study, const RunOptions& options);

// The few numbers of one column the terminal summary shows.
struct ColumnSummary {
  std::string name;
  double surface_temperature_k = 0.0;
  double olr_w_m2 = 0.0;
  double surface_lw_down_w_m2 = 0.0;
  std::optional<double> absorbed_solar_w_m2;         // without shortwave: none
  struct Experiment {
    double forcing_toa_w_m2 = 0.0;
    double forcing_adjusted_w_m2 = 0.0;
    std::optional<double> surface_temperature_change_k; // without equilibrium: none
  };
  std::vector<Experiment> experiments;
  std::string error; // a failed column: why (the numbers above are then not set)
};

// The summary line of a computed column.
[[nodiscard]] ColumnSummary summarise(const ColumnResult& result);

struct RunOutcome {
  std::filesystem::path output_file;  // the file written
  // One line of the terminal summary per column, kept when the run computed every column itself and
  // has at most RunOptions::summary_columns columns; otherwise empty (the results are in the file).
  std::vector<ColumnSummary> summaries;
  std::vector<std::string> experiment_names; // the study's experiments, in order
  std::size_t column_count = 0;       // columns of the study (with sweeps expanded)
  std::size_t resumed_from = 0;       // columns taken from an interrupted run's working file
  int interrupted_by = 0;             // the signal (SIGINT, SIGTERM) that stopped the run, or 0
  std::size_t columns_written = 0;    // columns in the file (all of them unless interrupted)
  double seconds = 0.0;               // wall-clock time of the run in s, as measured by the caller (0 if not)
  std::size_t failed_columns = 0;     // columns recorded as failed in this run (not counting resumed ones)
  std::vector<std::string> first_failures; // the messages of the first few of them
};

// The whole job: checks the output folder is writable, builds, computes and writes the result file
// block of RunOptions::chunk_columns columns by block, so memory stays bounded. The result is
// bit-identical for any thread count and block size. The final file appears only when complete;
// until then it is built in a working file next to it with a checkpoint record
// (io::working_path, io::checkpoint_path), synced after every block. If the same study with the same
// settings was interrupted before (signal, kill -9), the run continues after the last block
// recorded. SIGINT and SIGTERM stop the run after the current block (outcome.interrupted_by set;
// running the same command again resumes). A column that fails is recorded and the run goes on
// (RunOptions::stop_on_column_error); a run in which every column fails is an error (the first
// column's). Any error removes the working file and the record.
RunOutcome run_study(const io::Study& study, const RunOptions& options);

// A short plain-text table of the main results (one line per column) for the terminal; only a
// count when the outcome holds no results.
[[nodiscard]] std::string format_summary(const RunOutcome& outcome);

} // namespace bandstack::batch
