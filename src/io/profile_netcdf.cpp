// netCDF access for the profile-file reader (C API: attributes of any type and whole-variable reads).
#include "io/profile_netcdf.hpp"
#include "spectral/netcdf_truncation.hpp"

#include "bandstack/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <fmt/format.h>
#include <netcdf.h>

namespace bandstack::io::detail {

namespace {

std::optional<std::vector<double>> numeric_attribute(int ncid, int varid, const char* name) {
  nc_type type{};
  std::size_t length = 0;
  if (nc_inq_att(ncid, varid, name, &type, &length) != NC_NOERR || type == NC_CHAR || type == NC_STRING || length == 0)
    return std::nullopt;
  std::vector<double> values(length);
  if (nc_get_att_double(ncid, varid, name, values.data()) != NC_NOERR) return std::nullopt;
  return values;
}

} // namespace

NetcdfFile::NetcdfFile(const std::string& path) : path_(path) {
  spectral::detail::check_classic_file(path, path); // a damaged or truncated classic header, before the library
  const int status = nc_open(path.c_str(), NC_NOWRITE, &ncid_);
  if (status != NC_NOERR)
    throw FileError(path, std::string("cannot read as a netCDF profile file: ") + first_line(nc_strerror(status)));
}

NetcdfFile::~NetcdfFile() { nc_close(ncid_); }

void NetcdfFile::fail(int varid, const std::string& message) const {
  InputPlace place;
  place.file = path_;
  if (varid != NC_GLOBAL) place.item = variable_name(varid);
  throw InputError(place, message);
}

std::vector<int> NetcdfFile::variables() const {
  int count = 0;
  nc_inq_nvars(ncid_, &count);
  std::vector<int> ids(static_cast<std::size_t>(count));
  if (count > 0) nc_inq_varids(ncid_, &count, ids.data());
  return ids;
}

std::optional<int> NetcdfFile::variable(const std::string& name) const {
  int varid = 0;
  if (nc_inq_varid(ncid_, name.c_str(), &varid) != NC_NOERR) return std::nullopt;
  return varid;
}

std::string NetcdfFile::variable_name(int varid) const {
  char name[NC_MAX_NAME + 1] = {};
  nc_inq_varname(ncid_, varid, name);
  return name;
}

std::vector<int> NetcdfFile::dimensions(int varid) const {
  int count = 0;
  nc_inq_varndims(ncid_, varid, &count);
  std::vector<int> dims(static_cast<std::size_t>(count));
  if (count > 0) nc_inq_vardimid(ncid_, varid, dims.data());
  return dims;
}

bool NetcdfFile::numeric(int varid) const {
  nc_type type{};
  nc_inq_vartype(ncid_, varid, &type);
  return type == NC_DOUBLE || type == NC_FLOAT || type == NC_INT || type == NC_SHORT || type == NC_INT64 ||
         type == NC_UINT || type == NC_USHORT || type == NC_UINT64 || type == NC_BYTE || type == NC_UBYTE;
}

std::string NetcdfFile::dimension_name(int dimid) const {
  char name[NC_MAX_NAME + 1] = {};
  nc_inq_dimname(ncid_, dimid, name);
  return name;
}

std::size_t NetcdfFile::dimension_size(int dimid) const {
  std::size_t size = 0;
  nc_inq_dimlen(ncid_, dimid, &size);
  return size;
}

std::optional<int> NetcdfFile::dimension(const std::string& name) const {
  int dimid = 0;
  if (nc_inq_dimid(ncid_, name.c_str(), &dimid) != NC_NOERR) return std::nullopt;
  return dimid;
}

std::string NetcdfFile::describe_dimensions(const std::vector<int>& dimids) const {
  std::string text;
  for (int d : dimids)
    text += (text.empty() ? "" : ", ") + dimension_name(d);
  return "(" + text + ")";
}

std::optional<std::string> NetcdfFile::text_attribute(int varid, const char* name) const {
  nc_type type{};
  std::size_t length = 0;
  if (nc_inq_att(ncid_, varid, name, &type, &length) != NC_NOERR) return std::nullopt;
  std::string value;
  if (type == NC_CHAR) {
    value.assign(length, '\0');
    if (length > 0 && nc_get_att_text(ncid_, varid, name, value.data()) != NC_NOERR)
      fail(varid, fmt::format("cannot read attribute '{}'", name));
    while (!value.empty() && value.back() == '\0')
      value.pop_back();
  } else if (type == NC_STRING && length >= 1) {
    std::vector<char*> strings(length, nullptr);
    if (nc_get_att_string(ncid_, varid, name, strings.data()) != NC_NOERR)
      fail(varid, fmt::format("cannot read attribute '{}'", name));
    value = strings[0] ? strings[0] : "";
    nc_free_string(length, strings.data());
  } else {
    fail(varid, fmt::format("attribute '{}' must be text", name));
  }
  return value;
}

std::vector<std::pair<std::string, std::string>> NetcdfFile::text_attributes(int varid) const {
  int count = 0;
  nc_inq_varnatts(ncid_, varid, &count);
  std::vector<std::pair<std::string, std::string>> attributes;
  for (int i = 0; i < count; ++i) {
    char name[NC_MAX_NAME + 1] = {};
    nc_type type{};
    if (nc_inq_attname(ncid_, varid, i, name) != NC_NOERR || nc_inq_atttype(ncid_, varid, name, &type) != NC_NOERR)
      continue;
    if (type == NC_CHAR || type == NC_STRING) attributes.emplace_back(name, *text_attribute(varid, name));
  }
  return attributes;
}

std::string NetcdfFile::describe_index(int varid, std::size_t flat, const std::vector<std::size_t>& start,
                                       const std::vector<std::size_t>& count) const {
  const std::vector<int> dims = dimensions(varid);
  std::vector<std::size_t> index(dims.size());
  for (std::size_t j = dims.size(); j-- > 0;) {
    const std::size_t size = count.empty() ? dimension_size(dims[j]) : count[j];
    index[j] = (size > 0 ? flat % size : 0) + (start.empty() ? 0 : start[j]);
    flat = size > 0 ? flat / size : 0;
  }
  std::string text;
  for (std::size_t j = 0; j < dims.size(); ++j)
    text += fmt::format("{}{} {}", j == 0 ? "" : ", ", dimension_name(dims[j]), index[j]);
  return "(" + text + ")";
}

std::vector<double> NetcdfFile::read_values(int varid) const {
  std::vector<std::size_t> start, count;
  for (int d : dimensions(varid)) {
    start.push_back(0);
    count.push_back(dimension_size(d));
  }
  return read_values(varid, start, count);
}

std::vector<double> NetcdfFile::read_values(int varid, const std::vector<std::size_t>& start,
                                            const std::vector<std::size_t>& count) const {
  if (!numeric(varid)) fail(varid, "must be numeric");
  if (text_attribute(varid, "_Unsigned"))
    fail(varid, "the _Unsigned attribute is not supported: store the values in an unsigned or wider type");
  std::size_t total = 1;
  for (std::size_t n : count)
    total *= n;
  std::vector<double> values(total);
  if (total > 0) {
    const int status = start.empty() ? nc_get_var_double(ncid_, varid, values.data()) // a scalar
                                     : nc_get_vara_double(ncid_, varid, start.data(), count.data(), values.data());
    if (status != NC_NOERR) fail(varid, std::string("cannot read the values: ") + first_line(nc_strerror(status)));
  }

  // Missing values are compared in the file's (packed) representation, before unpacking (CF 1.8 §2.5.1).
  std::vector<std::pair<double, const char*>> missing;
  if (const auto fill = numeric_attribute(ncid_, varid, "_FillValue")) {
    missing.emplace_back(fill->front(), "_FillValue");
  } else {
    nc_type type{};
    nc_inq_vartype(ncid_, varid, &type);
    if (type == NC_DOUBLE) missing.emplace_back(NC_FILL_DOUBLE, "netCDF default fill value");
    if (type == NC_FLOAT) missing.emplace_back(static_cast<double>(NC_FILL_FLOAT), "netCDF default fill value");
  }
  if (const auto values_missing = numeric_attribute(ncid_, varid, "missing_value"))
    for (double m : *values_missing)
      missing.emplace_back(m, "missing_value");
  for (std::size_t i = 0; i < values.size(); ++i) {
    const double v = values[i];
    if (!std::isfinite(v))
      fail(varid, fmt::format("value {} at {}: every value used must be finite", v, describe_index(varid, i, start, count)));
    for (const auto& [m, what] : missing)
      if (v == m)
        fail(varid, fmt::format("missing value ({} {}) at {}: every value used must be present", what, m,
                                describe_index(varid, i, start, count)));
  }

  const auto scale = numeric_attribute(ncid_, varid, "scale_factor");
  const auto offset = numeric_attribute(ncid_, varid, "add_offset");
  if (scale || offset) {
    const double a = scale ? scale->front() : 1.0, b = offset ? offset->front() : 0.0;
    for (double& v : values)
      v = v * a + b;
  }
  return values;
}

} // namespace bandstack::io::detail
