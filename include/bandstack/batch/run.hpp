#pragma once
// Running a study: build every column, compute it (in parallel, deterministically), write the result.
#include <cstddef>
#include <filesystem>
#include <string>
#include <vector>

#include "bandstack/batch/column_result.hpp"
#include "bandstack/io/study.hpp"

namespace bandstack::batch {

struct RunOptions {
  std::size_t threads = 0;                   // worker threads; 0 = all hardware threads
  std::filesystem::path output_directory;    // if not empty, the output file is written here instead
};

// The Sun's geometry a column spec asks for (see io::SunSpec).
[[nodiscard]] atmosphere::SunGeometry sun_geometry(const io::SunSpec& sun);

// Builds and validates every column of the study, one per combination of columns and sweep values
// in row-major order (io::expand_sweeps); InputError names the column on failure.
[[nodiscard]] std::vector<atmosphere::Column> build_columns(const io::Study& study);

// Everything a run would check before computing: builds and validates every column and loads the
// band sets and absorber sources the study names (InputError / FileError on any problem). Returns
// the columns. Used by `bandstack check`.
[[nodiscard]] std::vector<atmosphere::Column> check_study(const io::Study& study);

// Computes every column (`columns` from build_columns of the same study). Columns are independent and each result goes to its own slot, so the
// results are bit-identical for any thread count.
[[nodiscard]] std::vector<ColumnResult> compute_columns(const io::Study& study,
                                                        const std::vector<atmosphere::Column>& columns,
                                                        std::size_t threads);

// Where the study's output will be written under these options.
[[nodiscard]] std::filesystem::path output_path(const io::Study& study, const RunOptions& options);

struct RunOutcome {
  std::filesystem::path output_file;  // the file written
  std::vector<ColumnResult> results;  // one per column, in study order
  std::vector<std::string> experiment_names; // the study's experiments, in order
};

// The whole job: checks the output folder is writable, builds, computes and writes the result file
// atomically.
RunOutcome run_study(const io::Study& study, const RunOptions& options);

// A short plain-text table of the main results (one line per column) for the terminal.
[[nodiscard]] std::string format_summary(const RunOutcome& outcome);

} // namespace bandstack::batch
