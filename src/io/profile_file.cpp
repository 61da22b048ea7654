// Reading the columns of a netCDF profile file (docs/profile-file.md).
#include "bandstack/io/profile_file.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "io/profile_column.hpp"
#include "io/profile_fields.hpp"
#include "io/profile_netcdf.hpp"
#include "io/profile_sources.hpp"

#include "bandstack/io/resumable_output.hpp"

#include <array>
#include <fmt/format.h>
#include <fstream>
#include <optional>

namespace bandstack::io {

namespace {

using detail::Field;
using detail::Layout;
using detail::NetcdfFile;
using detail::Quantity;

using Fields = std::array<std::optional<Field>, detail::quantity_count>;
using Index = std::vector<std::size_t>; // leading indices of a column, one per Layout::leading entry

const std::optional<Field>& field_of(const Fields& fields, Quantity q) { return fields[static_cast<std::size_t>(q)]; }

std::vector<LeadingAxis> leading_axes(const NetcdfFile& nc, const Layout& layout) {
  std::vector<LeadingAxis> axes;
  for (std::size_t j : layout.leading) {
    const int dimid = layout.dims[j];
    LeadingAxis axis;
    axis.name = nc.dimension_name(dimid);
    axis.size = nc.dimension_size(dimid);
    const auto var = nc.variable(axis.name);
    if (var && nc.dimensions(*var) == std::vector<int>{dimid} && nc.numeric(*var)) {
      axis.values = nc.read_values(*var);
      axis.attributes = nc.text_attributes(*var);
    }
    axes.push_back(std::move(axis));
  }
  return axes;
}

// "(time 0, lat 2)": the leading indices of a column.
std::string describe_column(const NetcdfFile& nc, const Layout& layout, const Index& index) {
  std::string text;
  for (std::size_t j = 0; j < layout.leading.size(); ++j)
    text += fmt::format("{}{} {}", j == 0 ? "" : ", ", nc.dimension_name(layout.dims[layout.leading[j]]), index[j]);
  return "(" + text + ")";
}

// Whether the column's pressure increases along the file's vertical dimension; InputError unless it
// is strictly monotonic.
bool pressure_increases(const NetcdfFile& nc, const Layout& layout, const Field& pressure, const Index& index,
                        std::size_t column) {
  const std::size_t base = pressure.column_offset(layout, index), stride = pressure.vertical_stride(layout);
  const auto p = [&](std::size_t k) { return pressure.values[base + k * stride]; };
  const bool increasing = p(1) > p(0);
  for (std::size_t k = 1; k < layout.vertical_size; ++k) {
    if (increasing ? p(k) > p(k - 1) : p(k) < p(k - 1)) continue;
    InputPlace place;
    place.file = nc.path();
    place.item = pressure.source.name;
    place.column_index = static_cast<long>(column);
    const std::string where = layout.leading.empty() ? "" : " in column " + describe_column(nc, layout, index);
    throw InputError(place,
                     fmt::format("pressure must be strictly monotonic along '{}'{}: index {} has {} Pa, "
                                 "index {} has {} Pa",
                                 nc.dimension_name(layout.dims[layout.vertical]), where, k - 1, p(k - 1), k, p(k)));
  }
  return increasing;
}

// The layers of one column, top first, with every gas as a mole fraction.
detail::ColumnLayers column_layers(const NetcdfFile& nc, const Layout& layout, const Fields& fields,
                                   const ProfileDefaults& defaults, const Index& leading, std::size_t column) {
  const std::size_t n = layout.vertical_size;
  const bool increasing = pressure_increases(nc, layout, *field_of(fields, Quantity::pressure), leading, column);
  const auto at = [&](const Field& field, std::size_t top_first) { // the field's value at layer top_first
    const std::size_t k = increasing ? top_first : n - 1 - top_first;
    return field.values[field.column_offset(layout, leading) + k * field.vertical_stride(layout)];
  };
  detail::ColumnLayers layers;
  layers.pressure_pa.resize(n);
  layers.temperature_k.resize(n);
  for (std::size_t i = 0; i < n; ++i) {
    layers.pressure_pa[i] = at(*field_of(fields, Quantity::pressure), i);
    layers.temperature_k[i] = at(*field_of(fields, Quantity::temperature), i);
  }
  // Surface fields lack the vertical dimension (stride 0): any layer index gives the column's value.
  if (const auto& ps = field_of(fields, Quantity::surface_pressure)) layers.surface_pressure_pa = at(*ps, 0);
  if (const auto& ts = field_of(fields, Quantity::surface_temperature)) layers.surface_temperature_k = at(*ts, 0);

  // Gas order of all_gases: water first, as the mass fractions of the others need it.
  const std::array<std::pair<Quantity, double>, gas_count> gases{{{Quantity::h2o, defaults.h2o_mole_fraction},
                                                                  {Quantity::co2, defaults.co2_mole_fraction},
                                                                  {Quantity::o3, defaults.o3_mole_fraction},
                                                                  {Quantity::ch4, defaults.ch4_mole_fraction},
                                                                  {Quantity::n2o, defaults.n2o_mole_fraction}}};
  static_assert(all_gases[0] == Gas::h2o);
  const std::vector<double>& water = layers.mole_fraction[index(Gas::h2o)];
  for (Gas g : all_gases) {
    const auto& [q, default_value] = gases[index(g)];
    std::vector<double>& x = layers.mole_fraction[index(g)];
    x.assign(n, default_value);
    const auto& field = field_of(fields, q);
    if (!field) continue;
    for (std::size_t i = 0; i < n; ++i)
      x[i] = at(*field, i);
    if (field->kind != detail::AmountKind::mass_fraction) continue;
    // Mass fraction w in moist air to mole fraction: x = w M_moist / M_gas, with the moist-air molar
    // mass M_moist = x_h2o M_h2o + (1 - x_h2o) M_dry (the inverse of atmosphere::layer_gas_mass_kg_m2).
    for (std::size_t i = 0; i < n; ++i) {
      const double m_moist =
          water[i] * constants::molar_mass_h2o_kg_mol + (1.0 - water[i]) * constants::molar_mass_dry_air_kg_mol;
      x[i] *= m_moist / gas_molar_mass_kg_mol(g);
    }
  }
  return layers;
}

} // namespace

struct ProfileReader::Impl {
  std::filesystem::path path;
  NetcdfFile nc;
  ProfileDefaults defaults;
  Layout layout;
  std::array<std::optional<detail::FieldPlan>, detail::quantity_count> plans;
  std::vector<LeadingAxis> axes;
  std::vector<std::string> used_variables;
  std::string surface_pressure_item;

  Impl(const std::filesystem::path& p, const ProfileDefaults& d) : path(p), nc(p.string()), defaults(d) {}
};

namespace {

std::unique_ptr<ProfileReader::Impl> open_reader(const std::filesystem::path& path, const ProfileVariables& variables,
                                                 const ProfileDefaults& defaults) {
  const std::string file = path.string();
  std::error_code ec;
  if (!std::filesystem::exists(path, ec)) throw FileError(file, "no such profile file");
  if (std::filesystem::is_directory(path, ec)) throw FileError(file, "is a folder, not a profile file");
  auto impl = std::make_unique<ProfileReader::Impl>(path, defaults);
  const NetcdfFile& nc = impl->nc;
  const auto sources = detail::find_sources(nc, variables);
  const auto& pressure = sources[static_cast<std::size_t>(Quantity::pressure)];
  const auto& temperature = sources[static_cast<std::size_t>(Quantity::temperature)];
  BANDSTACK_ASSERT(pressure && temperature);
  impl->layout = detail::find_layout(nc, *pressure, *temperature, variables.vertical_dimension);
  for (std::size_t i = 0; i < detail::quantity_count; ++i) {
    if (!sources[i]) continue;
    const auto q = static_cast<Quantity>(i);
    impl->plans[i] = detail::plan_field(nc, q, *sources[i], impl->layout);
    impl->used_variables.push_back(detail::describe_use(q, *impl->plans[i]));
  }
  impl->axes = leading_axes(nc, impl->layout);
  const auto& surface_pressure = sources[static_cast<std::size_t>(Quantity::surface_pressure)];
  impl->surface_pressure_item = surface_pressure ? surface_pressure->name : "surface_pressure";
  return impl;
}

} // namespace

ProfileReader::ProfileReader(const std::filesystem::path& path, const ProfileVariables& variables,
                             const ProfileDefaults& defaults)
    : impl_(open_reader(path, variables, defaults)) {}
ProfileReader::~ProfileReader() = default;
ProfileReader::ProfileReader(ProfileReader&&) noexcept = default;
ProfileReader& ProfileReader::operator=(ProfileReader&&) noexcept = default;

const std::filesystem::path& ProfileReader::path() const noexcept { return impl_->path; }
std::size_t ProfileReader::column_count() const noexcept { return impl_->layout.column_count; }
std::size_t ProfileReader::layer_count() const noexcept { return impl_->layout.vertical_size; }
const std::vector<LeadingAxis>& ProfileReader::axes() const noexcept { return impl_->axes; }
const std::vector<std::string>& ProfileReader::used_variables() const noexcept { return impl_->used_variables; }

std::vector<atmosphere::Column> ProfileReader::read(std::size_t first, std::size_t count) const {
  const Impl& r = *impl_;
  const Layout& layout = r.layout;
  std::vector<std::size_t> leading_shape;
  for (std::size_t j : layout.leading)
    leading_shape.push_back(r.nc.dimension_size(layout.dims[j]));
  std::vector<atmosphere::Column> columns;
  if (count == 0) return columns;
  columns.reserve(count);
  std::size_t c = first;
  // Each slab is a box of the leading dimensions: its fields are read, then its columns built in
  // row-major order (the order of the flat range).
  for (const detail::Hyperslab& slab : detail::flat_range_slabs(leading_shape, first, count)) {
    detail::Hyperslab box;
    box.start.assign(layout.dims.size(), 0);
    box.count.assign(layout.dims.size(), 0);
    box.count[layout.vertical] = layout.vertical_size;
    for (std::size_t j = 0; j < layout.leading.size(); ++j) {
      box.start[layout.leading[j]] = slab.start[j];
      box.count[layout.leading[j]] = slab.count[j];
    }
    Fields fields;
    for (std::size_t i = 0; i < detail::quantity_count; ++i)
      if (r.plans[i]) fields[i] = detail::read_field(r.nc, static_cast<Quantity>(i), *r.plans[i], layout, box);
    std::size_t in_slab = 1;
    for (std::size_t n : slab.count)
      in_slab *= n;
    Index leading = slab.start;
    for (std::size_t k = 0; k < in_slab; ++k, ++c) {
      InputPlace where;
      where.file = r.path.string();
      where.column_index = static_cast<long>(c);
      atmosphere::Column column = detail::make_column(column_layers(r.nc, layout, fields, r.defaults, leading, c),
                                                      r.defaults, where, r.surface_pressure_item);
      atmosphere::validate(column, where);
      columns.push_back(std::move(column));
      for (std::size_t j = leading.size(); j-- > 0;) { // row-major: the last leading dimension varies fastest
        if (++leading[j] < slab.start[j] + slab.count[j]) break;
        leading[j] = slab.start[j];
      }
    }
  }
  return columns;
}

std::uint64_t ProfileReader::content_hash() const {
  std::ifstream in(impl_->path, std::ios::binary);
  if (!in) throw FileError(impl_->path.string(), "cannot be read");
  std::uint64_t h = fnv1a(std::string_view{});
  std::vector<char> piece(1 << 20);
  while (in) {
    in.read(piece.data(), static_cast<std::streamsize>(piece.size()));
    const auto got = static_cast<std::size_t>(in.gcount());
    if (got == 0) break;
    h = fnv1a(std::string_view(piece.data(), got), h);
  }
  return h;
}

ProfileFile read_profile_file(const std::filesystem::path& path, const ProfileVariables& variables,
                              const ProfileDefaults& defaults) {
  const ProfileReader reader(path, variables, defaults);
  ProfileFile result;
  result.axes = reader.axes();
  result.used_variables = reader.used_variables();
  result.columns = reader.read(0, reader.column_count());
  return result;
}

} // namespace bandstack::io
