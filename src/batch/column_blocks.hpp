#pragma once
// Private to batch: the pieces of a run shared by compute_columns (all at once) and run_study
// (block by block).
#include <cstddef>
#include <exception>
#include <vector>
#include <optional>

#include "bandstack/batch/column_result.hpp"
#include "bandstack/io/study.hpp"
#include "bandstack/io/sweep.hpp"
#include "batch/climate_setup.hpp"
#include "batch/longwave_setup.hpp"
#include "batch/shortwave_setup.hpp"

namespace bandstack::batch {

// Column i of the study's expansion (io::column_spec), with its Sun; InputError names it. A column
// of a profile file is built from `file_column` (its column in the file) unless the spec holds it,
// with the Sun `file_sun` when the study takes the Sun from the file.
[[nodiscard]] atmosphere::Column build_column(const io::Study& study, std::size_t i,
                                              const atmosphere::Column* file_column = nullptr,
                                              const std::optional<io::SunSpec>& file_sun = std::nullopt);

// What the columns [first, first + count) of a prepare_columns result need from outside the study:
// the profile-file columns they use, read as one block of the file (serially). When that block
// fails and `per_column` is set, the file columns are read one by one, so that a bad one fails only
// the columns built from it.
class BlockInputs {
public:
  BlockInputs(const io::ExpandedStudy& expanded, std::size_t first, std::size_t count, bool per_column);
  // Column i (its index in the expansion, within the block), with its Sun; InputError names it, or
  // is the error its file column gave. Thread-safe.
  [[nodiscard]] atmosphere::Column build(std::size_t i) const;

private:
  const io::ExpandedStudy& expanded_;
  std::size_t file_first_ = 0;
  std::vector<atmosphere::Column> file_columns_;
  std::vector<std::exception_ptr> file_errors_; // per file column, null if it was read
};

// Columns [first, first + count) of a prepare_columns result, built in parallel (in the caller's
// task arena) after reading the profile-file columns they use (serially, one block of the file).
[[nodiscard]] std::vector<atmosphere::Column> build_block(const io::ExpandedStudy& expanded, std::size_t first,
                                                          std::size_t count);

// Per-band surface properties must match the band sets the study uses (InputError otherwise).
void check_band_properties(const io::Study& study, const LongwaveSetup& lw, const ShortwaveSetup& sw);

// Computes column c (its index in the study without sweeps, built by build_column) into `result`:
// climate (equilibrium, experiments, attribution) and fluxes. Errors name the column.
void compute_one(const io::Study& study, const LongwaveSetup& setup, const ShortwaveSetup& sw_setup,
                 const ClimateSetup& climate_setup, std::size_t c, const atmosphere::Column& column, ColumnResult& result);

} // namespace bandstack::batch
