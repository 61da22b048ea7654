#include <cstddef>
#include "report/netcdf_reader.hpp"

#include <netcdf.h>

#include "bandstack/core/error.hpp"

namespace bandstack::report {

namespace {

void check(int status, const std::string& path, const std::string& what) {
  if (status != NC_NOERR) throw FileError(path, what + ": " + first_line(nc_strerror(status)));
}

} // namespace

NetcdfReader::NetcdfReader(std::string path) : path_(std::move(path)) {
  const int status = nc_open(path_.c_str(), NC_NOWRITE, &ncid_);
  if (status != NC_NOERR) {
    ncid_ = -1;
    throw FileError(path_, "cannot open as a netCDF result file: " + first_line(nc_strerror(status)));
  }
  // The report reads a few columns of many chunked variables: a small chunk cache per variable keeps
  // its memory bounded (netCDF's default would keep up to several MiB of chunks per variable). Not
  // available for classic files, where it does not matter.
  int count = 0;
  if (nc_inq_nvars(ncid_, &count) == NC_NOERR)
    for (int v = 0; v < count; ++v) (void)nc_set_var_chunk_cache(ncid_, v, std::size_t{1} << 20, 13, 0.75f);
}

NetcdfReader::~NetcdfReader() {
  if (ncid_ >= 0) nc_close(ncid_);
}

bool NetcdfReader::has_variable(const std::string& name) const {
  int id = 0;
  return nc_inq_varid(ncid_, name.c_str(), &id) == NC_NOERR;
}

void NetcdfReader::require(const std::string& name) const {
  if (!has_variable(name))
    throw InputError(InputPlace{path_, name, {}, {}, {}, {}}, "not a bandstack result file: the variable is missing");
}

int NetcdfReader::variable_id(const std::string& name) const {
  require(name);
  int id = 0;
  nc_inq_varid(ncid_, name.c_str(), &id);
  return id;
}

std::vector<std::string> NetcdfReader::dimension_names(const std::string& variable) const {
  const int id = variable_id(variable);
  int ndims = 0;
  check(nc_inq_varndims(ncid_, id, &ndims), path_, variable);
  std::vector<int> dims(static_cast<std::size_t>(ndims));
  check(nc_inq_vardimid(ncid_, id, dims.data()), path_, variable);
  std::vector<std::string> names;
  for (int d : dims) {
    char name[NC_MAX_NAME + 1] = {};
    check(nc_inq_dimname(ncid_, d, name), path_, variable);
    names.emplace_back(name);
  }
  return names;
}

std::vector<std::size_t> NetcdfReader::dimension_sizes(const std::string& variable) const {
  std::vector<std::size_t> sizes;
  for (const std::string& name : dimension_names(variable)) sizes.push_back(*dimension_size(name));
  return sizes;
}

std::optional<std::size_t> NetcdfReader::dimension_size(const std::string& dimension) const {
  int id = 0;
  if (nc_inq_dimid(ncid_, dimension.c_str(), &id) != NC_NOERR) return std::nullopt;
  std::size_t size = 0;
  check(nc_inq_dimlen(ncid_, id, &size), path_, dimension);
  return size;
}

std::string NetcdfReader::text_attribute(const std::string& variable, const std::string& name) const {
  int id = NC_GLOBAL;
  if (!variable.empty()) {
    if (!has_variable(variable)) return {};
    id = variable_id(variable);
  }
  nc_type type = 0;
  std::size_t length = 0;
  if (nc_inq_att(ncid_, id, name.c_str(), &type, &length) != NC_NOERR || type != NC_CHAR) return {};
  std::string text(length, '\0');
  if (length > 0) check(nc_get_att_text(ncid_, id, name.c_str(), text.data()), path_, name);
  while (!text.empty() && text.back() == '\0') text.pop_back();
  return text;
}

std::vector<std::pair<std::string, std::string>> NetcdfReader::global_text_attributes() const {
  int count = 0;
  check(nc_inq_natts(ncid_, &count), path_, "global attributes");
  std::vector<std::pair<std::string, std::string>> out;
  for (int i = 0; i < count; ++i) {
    char name[NC_MAX_NAME + 1] = {};
    check(nc_inq_attname(ncid_, NC_GLOBAL, i, name), path_, "global attributes");
    std::string value = text_attribute("", name);
    if (!value.empty()) out.emplace_back(name, std::move(value));
  }
  return out;
}

std::vector<double> NetcdfReader::read(const std::string& variable, const std::vector<std::size_t>& start,
                                       const std::vector<std::size_t>& count,
                                       const std::vector<std::ptrdiff_t>& stride) const {
  const int id = variable_id(variable);
  std::size_t n = 1;
  for (std::size_t c : count) n *= c;
  std::vector<double> values(n);
  if (n == 0) return values;
  const int status = stride.empty() ? nc_get_vara_double(ncid_, id, start.data(), count.data(), values.data())
                                    : nc_get_vars_double(ncid_, id, start.data(), count.data(), stride.data(), values.data());
  check(status, path_, "reading " + variable);
  return values;
}

std::vector<double> NetcdfReader::read_all(const std::string& variable) const {
  const std::vector<std::size_t> sizes = dimension_sizes(variable);
  return read(variable, std::vector<std::size_t>(sizes.size(), 0), sizes);
}

std::vector<std::string> NetcdfReader::read_strings(const std::string& variable) const {
  const std::vector<std::size_t> sizes = dimension_sizes(variable);
  if (sizes.size() != 2) return {};
  std::vector<char> chars(sizes[0] * sizes[1]);
  const std::size_t start[2] = {0, 0};
  if (!chars.empty()) check(nc_get_vara_text(ncid_, variable_id(variable), start, sizes.data(), chars.data()), path_, variable);
  std::vector<std::string> out;
  for (std::size_t i = 0; i < sizes[0]; ++i) {
    std::string s(chars.data() + i * sizes[1], sizes[1]);
    s.erase(s.find_last_not_of(std::string("\0 ", 2)) + 1);
    out.push_back(std::move(s));
  }
  return out;
}

} // namespace bandstack::report
