#include "spectral/netcdf_checks.hpp"

#include <algorithm>
#include <sstream>
#include <vector>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"

namespace bandstack::spectral::detail {

[[noreturn]] void fail(const std::string& file, const std::string& item, const std::string& message) {
  InputPlace place;
  place.file = file;
  place.item = item;
  throw InputError(place, message);
}

std::string normalise_units(const std::string& units) {
  std::istringstream in(units);
  std::string word, out;
  while (in >> word) out += (out.empty() ? "" : " ") + word;
  return out;
}

bool one_of(const std::string& s, std::initializer_list<const char*> options) {
  return std::any_of(options.begin(), options.end(), [&](const char* o) { return s == o; });
}

std::optional<std::string> text_attribute(int ncid, int varid, const char* name, const std::string& file,
                                          const std::string& item) {
  nc_type type{};
  std::size_t length = 0;
  if (nc_inq_att(ncid, varid, name, &type, &length) != NC_NOERR) return std::nullopt;
  std::string value;
  if (type == NC_CHAR) {
    value.assign(length, '\0');
    if (length > 0 && nc_get_att_text(ncid, varid, name, value.data()) != NC_NOERR) fail(file, item, fmt::format("cannot read attribute '{}'", name));
    while (!value.empty() && value.back() == '\0') value.pop_back();
  } else if (type == NC_STRING && length >= 1) {
    std::vector<char*> strings(length, nullptr);
    if (nc_get_att_string(ncid, varid, name, strings.data()) != NC_NOERR) fail(file, item, fmt::format("cannot read attribute '{}'", name));
    value = strings[0] ? strings[0] : "";
    nc_free_string(length, strings.data());
  } else {
    fail(file, item, fmt::format("attribute '{}' must be text", name));
  }
  return value;
}

bool has_attribute(int ncid, int varid, const char* name) {
  return nc_inq_attid(ncid, varid, name, nullptr) == NC_NOERR;
}

std::optional<double> fill_value(int ncid, int varid) {
  double value = 0.0;
  if (has_attribute(ncid, varid, "_FillValue") && nc_get_att_double(ncid, varid, "_FillValue", &value) == NC_NOERR)
    return value;
  nc_type type{};
  nc_inq_vartype(ncid, varid, &type);
  if (type == NC_DOUBLE) return NC_FILL_DOUBLE;
  if (type == NC_FLOAT) return static_cast<double>(NC_FILL_FLOAT);
  return std::nullopt;
}

bool numeric(int ncid, int varid) {
  nc_type type{};
  nc_inq_vartype(ncid, varid, &type);
  return type == NC_DOUBLE || type == NC_FLOAT || type == NC_INT || type == NC_SHORT || type == NC_INT64 ||
         type == NC_UINT || type == NC_USHORT || type == NC_UINT64 || type == NC_BYTE || type == NC_UBYTE;
}

void reject_packing(int ncid, const netCDF::NcVar& var, const std::string& file) {
  if (has_attribute(ncid, var.getId(), "scale_factor") || has_attribute(ncid, var.getId(), "add_offset"))
    fail(file, var.getName(), "packed data (scale_factor/add_offset) is not supported: write the values unpacked");
}

} // namespace bandstack::spectral::detail
