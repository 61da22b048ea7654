#include "io/netcdf_put.hpp"

#include <algorithm>

#include "bandstack/core/error.hpp"

namespace bandstack::io::detail {

std::size_t Table::dim_size(const std::string& name) const {
  for (const auto& [n, size] : dims)
    if (n == name) return size;
  throw InternalError("result file: no dimension " + name);
}

bool Table::has_dim(const std::string& name) const {
  return std::any_of(dims.begin(), dims.end(), [&](const auto& d) { return d.first == name; });
}

void Table::add_dim(const std::string& name, std::size_t size) {
  if (has_dim(name)) {
    if (dim_size(name) != size) throw InternalError("result file: dimension " + name + " defined twice");
    return;
  }
  dims.emplace_back(name, size);
}

Variable& Table::add(const std::string& name, std::vector<std::string> var_dims, const Attributes& a,
                     const std::string& coords) {
  Variable v;
  v.name = name;
  v.values_per_column = 1;
  for (const std::string& d : var_dims) v.values_per_column *= dim_size(d);
  v.dims = std::move(var_dims);
  v.attributes.emplace_back("units", a.units);
  v.attributes.emplace_back("long_name", a.long_name);
  if (a.standard_name) v.attributes.emplace_back("standard_name", a.standard_name);
  const std::string& c = coords.empty() ? coordinates : coords;
  if (!c.empty()) v.attributes.emplace_back("coordinates", c);
  variables.push_back(std::move(v));
  return variables.back();
}

void Table::scalar(const std::string& name, const Attributes& a, std::function<double(const R&)> get) {
  add(name, {}, a).get = [get = std::move(get)](const R& r, double* out) { *out = get(r); };
}

void Table::profile(const std::string& name, const std::string& dim, const Attributes& a,
                    std::function<const std::vector<double>&(const R&)> get) {
  const std::size_t length = dim_size(dim);
  add(name, {dim}, a).get = [get = std::move(get), length, name](const R& r, double* out) {
    const std::vector<double>& v = get(r);
    if (v.size() != length) throw InternalError("profile length mismatch while writing " + name);
    std::copy(v.begin(), v.end(), out);
  };
}

std::string padded_names(const std::vector<std::string>& names, std::size_t& length) {
  length = 1;
  for (const std::string& n : names) length = std::max(length, n.size());
  std::string text(names.size() * length, '\0');
  for (std::size_t i = 0; i < names.size(); ++i) std::copy(names[i].begin(), names[i].end(), text.begin() + static_cast<long>(i * length));
  return text;
}

void Table::names(const std::string& dim, const std::string& var_name, const std::vector<std::string>& items,
                  const char* long_name) {
  std::size_t length = 1;
  std::string text = padded_names(items, length);
  add_dim(dim, items.size());
  add_dim(dim + "_name_length", length);
  Variable v;
  v.name = var_name;
  v.storage = Storage::text;
  v.per_column = false;
  v.dims = {dim, dim + "_name_length"};
  v.attributes.emplace_back("long_name", long_name);
  v.text = std::move(text);
  variables.push_back(std::move(v));
}

} // namespace bandstack::io::detail
