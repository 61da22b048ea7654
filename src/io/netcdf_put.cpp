#include "io/netcdf_put.hpp"

#include "bandstack/core/error.hpp"

namespace bandstack::io::detail {

using netCDF::NcDim;
using netCDF::NcFile;
using netCDF::NcVar;

NcVar add_variable(NcFile& file, const std::string& name, const std::vector<NcDim>& dims, const Attributes& a,
                   const std::string& coordinates) {
  NcVar var = file.addVar(name, netCDF::ncDouble, dims);
  var.putAtt("units", a.units);
  var.putAtt("long_name", a.long_name);
  if (a.standard_name) var.putAtt("standard_name", a.standard_name);
  if (!coordinates.empty()) var.putAtt("coordinates", coordinates);
  return var;
}

void put_per_column(NcVar var, std::span<const batch::ColumnResult> results,
                    const std::function<double(const batch::ColumnResult&)>& get) {
  std::vector<double> data;
  data.reserve(results.size());
  for (const auto& r : results) data.push_back(get(r));
  var.putVar(data.data());
}

void put_profile(NcVar var, std::span<const batch::ColumnResult> results, std::size_t length,
                 const std::function<const std::vector<double>&(const batch::ColumnResult&)>& get) {
  std::vector<double> data;
  data.reserve(results.size() * length);
  for (const auto& r : results) {
    const std::vector<double>& v = get(r);
    if (v.size() != length) throw InternalError("profile length mismatch while writing " + var.getName());
    data.insert(data.end(), v.begin(), v.end());
  }
  var.putVar(data.data());
}

} // namespace bandstack::io::detail
