// Reading the columns of a netCDF profile file (docs/profile-file.md).
#include "bandstack/io/profile_file.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "io/profile_column.hpp"
#include "io/profile_fields.hpp"
#include "io/profile_netcdf.hpp"
#include "io/profile_sources.hpp"

#include <array>
#include <fmt/format.h>
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

ProfileFile read_profile_file(const std::filesystem::path& path, const ProfileVariables& variables,
                              const ProfileDefaults& defaults) {
  const std::string file = path.string();
  std::error_code ec;
  if (!std::filesystem::exists(path, ec)) throw FileError(file, "no such profile file");
  if (std::filesystem::is_directory(path, ec)) throw FileError(file, "is a folder, not a profile file");
  const NetcdfFile nc(file);

  const auto sources = detail::find_sources(nc, variables);
  const auto& pressure = sources[static_cast<std::size_t>(Quantity::pressure)];
  const auto& temperature = sources[static_cast<std::size_t>(Quantity::temperature)];
  BANDSTACK_ASSERT(pressure && temperature);
  const Layout layout = detail::find_layout(nc, *pressure, *temperature, variables.vertical_dimension);

  ProfileFile result;
  Fields fields;
  for (std::size_t i = 0; i < detail::quantity_count; ++i) {
    if (!sources[i]) continue;
    const auto q = static_cast<Quantity>(i);
    fields[i] = detail::read_field(nc, q, *sources[i], layout);
    result.used_variables.push_back(detail::describe_use(q, *fields[i]));
  }
  result.axes = leading_axes(nc, layout);

  const auto& surface_pressure = sources[static_cast<std::size_t>(Quantity::surface_pressure)];
  const std::string surface_pressure_item = surface_pressure ? surface_pressure->name : "surface_pressure";
  result.columns.reserve(layout.column_count);
  Index leading(layout.leading.size(), 0);
  for (std::size_t c = 0; c < layout.column_count; ++c) {
    InputPlace where;
    where.file = file;
    where.column_index = static_cast<long>(c);
    atmosphere::Column column = detail::make_column(column_layers(nc, layout, fields, defaults, leading, c), defaults,
                                                    where, surface_pressure_item);
    atmosphere::validate(column, where);
    result.columns.push_back(std::move(column));
    for (std::size_t j = leading.size(); j-- > 0;) { // row-major: the last leading dimension varies fastest
      if (++leading[j] < nc.dimension_size(layout.dims[layout.leading[j]])) break;
      leading[j] = 0;
    }
  }
  return result;
}

} // namespace bandstack::io
