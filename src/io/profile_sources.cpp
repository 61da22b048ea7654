// Finding the variables of a profile file and its vertical dimension (docs/profile-file.md).
#include "io/profile_sources.hpp"

#include "bandstack/core/error.hpp"

#include <algorithm>
#include <fmt/format.h>

namespace bandstack::io::detail {

namespace {

[[noreturn]] void fail(const NetcdfFile& nc, const std::string& item, const std::string& message) {
  InputPlace place;
  place.file = nc.path();
  place.item = item;
  throw InputError(place, message);
}

const std::string& requested_name(const ProfileVariables& v, Quantity q) {
  switch (q) {
  case Quantity::pressure:
    return v.pressure;
  case Quantity::temperature:
    return v.temperature;
  case Quantity::surface_temperature:
    return v.surface_temperature;
  case Quantity::surface_pressure:
    return v.surface_pressure;
  case Quantity::h2o:
    return v.h2o;
  case Quantity::co2:
    return v.co2;
  case Quantity::o3:
    return v.o3;
  case Quantity::ch4:
    return v.ch4;
  case Quantity::n2o:
    return v.n2o;
  }
  return v.pressure; // unreachable
}

std::string list_names(const std::vector<StandardName>& names) {
  std::string text;
  for (std::size_t i = 0; i < names.size(); ++i)
    text += fmt::format("{}'{}'", i == 0 ? "" : (i + 1 == names.size() ? " or " : ", "), names[i].name);
  return text;
}

std::optional<StandardName> match(const std::vector<StandardName>& names, const std::optional<std::string>& value) {
  if (!value) return std::nullopt;
  for (const StandardName& s : names)
    if (s.name == *value) return s;
  return std::nullopt;
}

// Whether the coordinate variable of dimension `dimid` marks it as vertical (CF 1.8 §4.3).
bool marked_vertical(const NetcdfFile& nc, int dimid) {
  const std::string name = nc.dimension_name(dimid);
  const auto var = nc.variable(name);
  if (!var) return false;
  const auto dims = nc.dimensions(*var);
  if (dims.size() != 1 || dims[0] != dimid) return false;
  const auto axis = nc.text_attribute(*var, "axis");
  return (axis && (*axis == "Z" || *axis == "z")) || nc.text_attribute(*var, "positive").has_value();
}

} // namespace

std::string_view quantity_name(Quantity q) noexcept {
  static constexpr std::array<std::string_view, quantity_count> names{
      "pressure", "temperature", "surface_temperature", "surface_pressure", "h2o", "co2", "o3", "ch4", "n2o"};
  return names[static_cast<std::size_t>(q)];
}

std::vector<StandardName> standard_names(Quantity q) {
  using K = AmountKind;
  switch (q) {
  case Quantity::pressure:
    return {{"air_pressure"}};
  case Quantity::temperature:
    return {{"air_temperature"}};
  case Quantity::surface_temperature:
    return {{"surface_temperature"}};
  case Quantity::surface_pressure:
    return {{"surface_air_pressure"}};
  case Quantity::h2o:
    return {{"specific_humidity", K::specific_humidity},
            {"humidity_mixing_ratio", K::mixing_ratio},
            {"mole_fraction_of_water_vapor_in_air", K::mole_fraction}};
  case Quantity::co2:
    return {{"mole_fraction_of_carbon_dioxide_in_air", K::mole_fraction},
            {"mass_fraction_of_carbon_dioxide_in_air", K::mass_fraction}};
  case Quantity::o3:
    return {{"mole_fraction_of_ozone_in_air", K::mole_fraction}, {"mass_fraction_of_ozone_in_air", K::mass_fraction}};
  case Quantity::ch4:
    return {{"mole_fraction_of_methane_in_air", K::mole_fraction},
            {"mass_fraction_of_methane_in_air", K::mass_fraction}};
  case Quantity::n2o:
    return {{"mole_fraction_of_nitrous_oxide_in_air", K::mole_fraction},
            {"mass_fraction_of_nitrous_oxide_in_air", K::mass_fraction}};
  }
  return {};
}

std::array<std::optional<Source>, quantity_count> find_sources(const NetcdfFile& nc,
                                                               const ProfileVariables& variables) {
  std::array<std::optional<Source>, quantity_count> sources;
  const std::vector<int> all = nc.variables();
  for (std::size_t i = 0; i < quantity_count; ++i) {
    const auto q = static_cast<Quantity>(i);
    const std::vector<StandardName> names = standard_names(q);
    const std::string& wanted = requested_name(variables, q);
    if (!wanted.empty()) {
      const auto varid = nc.variable(wanted);
      if (!varid) fail(nc, wanted, fmt::format("no such variable in the file (named for {})", quantity_name(q)));
      sources[i] = Source{*varid, wanted, match(names, nc.text_attribute(*varid, "standard_name"))};
      continue;
    }
    for (int varid : all) {
      const auto standard_name = match(names, nc.text_attribute(varid, "standard_name"));
      if (!standard_name) continue;
      const std::string name = nc.variable_name(varid);
      if (sources[i])
        fail(nc, name,
             fmt::format("variables '{}' and '{}' could both be the {} (standard_name '{}' and '{}'): name the one to "
                         "use in the study",
                         sources[i]->name, name, quantity_name(q), sources[i]->standard_name->name,
                         standard_name->name));
      sources[i] = Source{varid, name, standard_name};
    }
    if (!sources[i] && (q == Quantity::pressure || q == Quantity::temperature))
      fail(nc, std::string(quantity_name(q)),
           fmt::format("no variable with standard_name {}: add the attribute or name the {} variable in the study",
                       list_names(names), quantity_name(q)));
  }
  return sources;
}

Layout find_layout(const NetcdfFile& nc, const Source& pressure, const Source& temperature,
                   const std::string& vertical_dimension) {
  Layout layout;
  layout.dims = nc.dimensions(temperature.varid);
  if (layout.dims.empty()) fail(nc, temperature.name, "must have a vertical dimension (it is a scalar)");
  const std::vector<int> p_dims = nc.dimensions(pressure.varid);
  const auto position = [&](int dimid) {
    return static_cast<std::size_t>(std::find(layout.dims.begin(), layout.dims.end(), dimid) - layout.dims.begin());
  };

  std::optional<std::size_t> vertical;
  if (p_dims.size() == 1) { // a pressure coordinate: its dimension is the vertical one
    vertical = position(p_dims[0]);
    if (*vertical == layout.dims.size())
      fail(nc, temperature.name,
           fmt::format("dimensions {} do not include the vertical dimension '{}' of the pressure '{}'",
                       nc.describe_dimensions(layout.dims), nc.dimension_name(p_dims[0]), pressure.name));
  } else if (p_dims != layout.dims) {
    fail(nc, pressure.name,
         fmt::format("dimensions {} do not fit: pressure is either 1-D (the vertical coordinate) or has the "
                     "dimensions of the temperature '{}' {}",
                     nc.describe_dimensions(p_dims), temperature.name, nc.describe_dimensions(layout.dims)));
  } else if (!vertical_dimension.empty()) {
    const auto dimid = nc.dimension(vertical_dimension);
    if (!dimid || position(*dimid) == layout.dims.size())
      fail(nc, temperature.name,
           fmt::format("the vertical dimension '{}' named in the study is not one of its dimensions {}",
                       vertical_dimension, nc.describe_dimensions(layout.dims)));
    vertical = position(*dimid);
  } else if (layout.dims.size() == 1) {
    vertical = 0;
  } else {
    for (std::size_t j = 0; j < layout.dims.size(); ++j) {
      if (!marked_vertical(nc, layout.dims[j])) continue;
      if (vertical)
        fail(nc, temperature.name,
             fmt::format("dimensions '{}' and '{}' are both marked vertical (axis = \"Z\" or positive): name the "
                         "vertical dimension in the study",
                         nc.dimension_name(layout.dims[*vertical]), nc.dimension_name(layout.dims[j])));
      vertical = j;
    }
    if (!vertical)
      fail(nc, temperature.name,
           fmt::format("cannot tell which of the dimensions {} is vertical: give its coordinate variable the "
                       "attribute axis = \"Z\", or name the vertical dimension in the study",
                       nc.describe_dimensions(layout.dims)));
  }
  if (!vertical_dimension.empty() && nc.dimension_name(layout.dims[*vertical]) != vertical_dimension)
    fail(nc, pressure.name,
         fmt::format("the vertical dimension named in the study is '{}', but the pressure coordinate lies on '{}'",
                     vertical_dimension, nc.dimension_name(layout.dims[*vertical])));

  layout.vertical = *vertical;
  layout.vertical_size = nc.dimension_size(layout.dims[layout.vertical]);
  if (layout.vertical_size < 2)
    fail(nc, temperature.name,
         fmt::format("the vertical dimension '{}' has {} point(s): a column needs at least 2",
                     nc.dimension_name(layout.dims[layout.vertical]), layout.vertical_size));
  for (std::size_t j = 0; j < layout.dims.size(); ++j) {
    if (j == layout.vertical) continue;
    layout.leading.push_back(j);
    layout.column_count *= nc.dimension_size(layout.dims[j]);
  }
  if (layout.column_count == 0)
    fail(nc, temperature.name,
         fmt::format("no columns: a leading dimension of {} has size 0", nc.describe_dimensions(layout.dims)));
  return layout;
}

} // namespace bandstack::io::detail
