#pragma once
// Private to io: the parts of a result file that do not depend on the block being written: the
// leading dimensions with their coordinates, the table of variables, the global attributes.
#include <span>
#include <vector>

#include <netcdf>

#include "bandstack/io/result_writer.hpp"
#include "io/netcdf_put.hpp"

namespace bandstack::io::detail {

// Defines one dimension per axis with its coordinate variables (numeric `<name>`, text `<name>_name`)
// and writes their values; returns the dimensions.
std::vector<netCDF::NcDim> define_axes(netCDF::NcFile& file, std::span<const OutputAxis> axes);

// Every variable of the result file of a run whose results look like `sample`.
[[nodiscard]] Table describe_result(const R& sample, const RunInfo& info, std::span<const OutputAxis> axes);

// The values of per-column variable `v` for `results`, column after column (values_per_column
// each): a failed column's are missing (NaN; -127, netCDF's byte fill, for i8) unless the variable
// describes failed columns too (column_status).
void column_values(const Variable& v, std::span<const R> results, std::vector<double>& data);

// Conventions, title, source, history (with the time now), study, methods, comment.
void put_global_attributes(netCDF::NcFile& file, const RunInfo& info);

} // namespace bandstack::io::detail
