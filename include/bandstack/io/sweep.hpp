#pragma once
// Sweeps: the numeric [[columns]] keys a study may vary (docs/study-file.md, [[sweeps]]), and the
// expansion of a study into one column per combination of columns and sweep values.
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "bandstack/io/study.hpp"

namespace bandstack::io {

struct SweepKey {
  std::string_view key;        // study-file key, e.g. "co2_ppmv"
  double lowest, highest;      // allowed range in the key's units (the [[columns]] key's range)
  std::string_view units;      // UDUNITS string for the output coordinate, e.g. "1e-6" for ppmv
  std::string_view long_name;  // for the output coordinate
};

// Every key a sweep may vary, in a fixed order.
[[nodiscard]] const std::vector<SweepKey>& sweep_keys();
// The entry for `key`, or nullptr.
[[nodiscard]] const SweepKey* find_sweep_key(std::string_view key);

// Sets `key` of `spec` to `value` (in the key's study-file units). Setting cos_zenith drops the
// latitude/day/time keys and the reverse, so that the swept value is the one used.
// Throws InputError for an unknown key.
void set_column_value(ColumnSpec& spec, std::string_view key, double value);

// One output dimension of a run: a sweep axis, the study's columns, or a profile file's leading
// dimension.
struct OutputAxis {
  std::string name;                    // the netCDF dimension name
  std::size_t size = 0;
  std::vector<double> values;          // numeric coordinate values, or empty
  std::vector<std::string> labels;     // text labels (written as <name>_name), or empty
  std::vector<std::pair<std::string, std::string>> attributes; // of the coordinate variable
};

// The study with its sweeps expanded: columns holds one spec per point of the output axes, in
// row-major order (the study's columns outermost, then each sweep in study order), and sweeps is
// empty. A study whose column is a profile_file expands into the file's columns (given_column set,
// named "<name>[i]"), with the file's leading dimensions as the axes (io/profile_file.hpp); the
// file's errors propagate. Throws InputError (naming the sweep) if a combination is invalid (e.g.
// latitude_deg swept on a column without day_of_year).
struct ExpandedStudy {
  Study study;
  std::vector<OutputAxis> axes;        // "column" (labels = column names), then one per sweep
  // The open profile file of a profile-file study (prepare_columns), else null: the columns it
  // gives are read block by block (read_profile_columns).
  std::shared_ptr<const ProfileReader> profile;
  // With sun_from_file: the Sun's position of each of the profile file's columns, else null.
  std::shared_ptr<const ProfileSun> sun;
};
[[nodiscard]] ExpandedStudy expand_sweeps(const Study& study);

// The same columns without holding one spec per column (memory independent of the sweep sizes and
// of the profile file's size): `study` keeps its own columns and sweeps and column_spec builds each
// expanded column on demand; a profile-file study keeps its one column (profile_column_count set)
// and `profile` open, with the file's leading dimensions and the sweeps as the axes. Checks what
// expand_sweeps checks, per base column and sweep value.
[[nodiscard]] ExpandedStudy prepare_columns(const Study& study);
// The file columns that the expanded columns [first, first + count) of a prepare_columns result
// use, read from its profile file: the first of them is the file column of expanded column `first`
// (file_column_of). Empty for a study without a profile file.
[[nodiscard]] std::vector<atmosphere::Column> read_profile_columns(const ExpandedStudy& expanded, std::size_t first,
                                                                   std::size_t count);
// The Sun of file column c when the study takes it from the file (ExpandedStudy::sun), else nullopt.
[[nodiscard]] std::optional<SunSpec> file_sun(const ExpandedStudy& expanded, std::size_t c);
// The file column of expanded column i of a profile-file study.
[[nodiscard]] std::size_t file_column_of(const Study& study, std::size_t i);
// Number of columns after expansion: columns (or a profile file's columns) x the sweeps' value counts.
[[nodiscard]] std::size_t column_count(const Study& study);
// Column i of the expansion (row-major: the study's columns outermost, then each sweep in order).
[[nodiscard]] ColumnSpec column_spec(const Study& study, std::size_t i);

} // namespace bandstack::io
