#pragma once
// Writes the results of a run to a CF-1.8 netCDF-4 file (variable names: docs/output-file.md).
#include <filesystem>
#include <span>
#include <string>
#include <vector>

#include "bandstack/batch/column_result.hpp"
#include "bandstack/io/sweep.hpp"

namespace bandstack::io {

// Provenance stored in the global attributes.
struct RunInfo {
  std::string title;            // the study's title
  std::string study_file;       // path of the study file, "" for the built-in demo
  std::string study_text;       // the full study text
  std::string command_line;     // what was run, for the history attribute
  std::string longwave_method;  // human-readable description of optics and angular quadrature
  std::string shortwave_method; // the same for the shortwave ("none" when not computed)
  std::vector<std::string> experiment_names; // one per experiment result of every column
  std::string equilibrium_method; // description of the equilibrium settings ("" without equilibrium)
};

// Writes all columns (they must share one level count) to `path` atomically: the file appears only
// when complete. `axes` are the leading dimensions of every per-column variable, the results in
// row-major order over them (the product of their sizes is results.size()); empty: one "column"
// axis labelled with the columns' names. An axis with labels gets a `<name>_name` text coordinate
// ("column_name" for the columns), one with values a numeric coordinate variable of its own name.
// Throws FileError for I/O failures and InputError for inconsistent columns.
void write_result_file(const std::filesystem::path& path, std::span<const batch::ColumnResult> results,
                       const RunInfo& info, std::span<const OutputAxis> axes = {});

} // namespace bandstack::io
