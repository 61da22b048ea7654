#pragma once
// Private to io: small helpers for writing per-column variables of a result file with netCDF-cxx4.
#include <functional>
#include <initializer_list>
#include <span>
#include <string>
#include <vector>

#include <netcdf>

#include "bandstack/batch/column_result.hpp"

namespace bandstack::io::detail {

// The leading dimensions every per-column variable starts with (the study's columns and sweep axes,
// or a profile file's leading dimensions); the results are in row-major order over them.
struct Lead {
  std::vector<netCDF::NcDim> dims;
  std::string coordinates;   // the `coordinates` attribute of per-column variables ("column_name" or "")
  // dims followed by `extra`.
  [[nodiscard]] std::vector<netCDF::NcDim> with(std::initializer_list<netCDF::NcDim> extra) const {
    std::vector<netCDF::NcDim> all = dims;
    all.insert(all.end(), extra.begin(), extra.end());
    return all;
  }
};

struct Attributes {
  const char* units;
  const char* long_name;
  const char* standard_name; // nullptr where CF has none
};

// Adds a double variable with units, long_name, standard_name and, when not empty, a
// `coordinates` attribute.
netCDF::NcVar add_variable(netCDF::NcFile& file, const std::string& name, const std::vector<netCDF::NcDim>& dims,
                           const Attributes& attributes, const std::string& coordinates = "");

// Writes one value per column.
void put_per_column(netCDF::NcVar var, std::span<const batch::ColumnResult> results,
                    const std::function<double(const batch::ColumnResult&)>& get);

// Writes one profile of `length` values per column (column-major by column, then level or layer).
void put_profile(netCDF::NcVar var, std::span<const batch::ColumnResult> results, std::size_t length,
                 const std::function<const std::vector<double>&(const batch::ColumnResult&)>& get);

// The flux variables: longwave (always) and shortwave (when the run computed it), each with its
// band coordinate and by-band variables when the method is band-resolved.
void write_longwave(netCDF::NcFile& file, std::span<const batch::ColumnResult> results, const Lead& lead,
                    const netCDF::NcDim& level, const netCDF::NcDim& layer);
void write_shortwave(netCDF::NcFile& file, std::span<const batch::ColumnResult> results, const Lead& lead,
                     const netCDF::NcDim& level, const netCDF::NcDim& layer);

} // namespace bandstack::io::detail

namespace bandstack::io::detail {

// Names of a list of items as a char variable `<var_name>(<dim>, <length_dim>)`; creates both
// dimensions (the length one named <dim>_name_length) and returns the item dimension.
netCDF::NcDim write_names(netCDF::NcFile& file, const std::string& dim, const std::string& var_name,
                          const std::vector<std::string>& names, const char* long_name);

// The climate variables (docs/output-file.md), each written only when the run produced it:
// equilibrium diagnostics, experiment results on an `experiment` dimension, greenhouse attribution
// on a `gas` dimension and the `band_lw` dimension (written before by write_longwave).
void write_equilibrium(netCDF::NcFile& file, std::span<const batch::ColumnResult> results, const Lead& lead,
                       const netCDF::NcDim& layer);
void write_experiments(netCDF::NcFile& file, std::span<const batch::ColumnResult> results,
                       const std::vector<std::string>& experiment_names, const Lead& lead,
                       const netCDF::NcDim& layer);
void write_attribution(netCDF::NcFile& file, std::span<const batch::ColumnResult> results, const Lead& lead);

} // namespace bandstack::io::detail
