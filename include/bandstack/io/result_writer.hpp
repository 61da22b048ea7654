#pragma once
// Writes the results of a run to a CF-1.8 netCDF-4 file (variable names: docs/output-file.md).
#include <filesystem>
#include <span>
#include <string>
#include <vector>

#include "bandstack/batch/column_result.hpp"

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
// when complete. Throws FileError for I/O failures and InputError for inconsistent columns.
void write_result_file(const std::filesystem::path& path, std::span<const batch::ColumnResult> results,
                       const RunInfo& info);

} // namespace bandstack::io
