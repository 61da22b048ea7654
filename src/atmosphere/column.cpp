#include "bandstack/atmosphere/column.hpp"

#include <cmath>
#include <string>

namespace bandstack::atmosphere {

namespace {

InputPlace at(const InputPlace& where, std::string item, std::size_t level) {
  InputPlace place = where;
  place.item = std::move(item);
  place.level = static_cast<long>(level);
  return place;
}

void check_size(const InputPlace& where, const std::string& item, std::size_t got, std::size_t want) {
  if (got != want) {
    InputPlace place = where;
    place.item = item;
    throw InputError(place, "has " + std::to_string(got) + " values, expected " + std::to_string(want));
  }
}

void check_in_range(const InputPlace& where, const char* item, double value, double lo, double hi) {
  if (!(value >= lo && value <= hi)) {
    InputPlace place = where;
    place.item = item;
    throw InputError(place, "value " + std::to_string(value) + " is outside [" + std::to_string(lo) + ", " +
                                std::to_string(hi) + "]");
  }
}

} // namespace

void validate(const Column& column, const InputPlace& where) {
  const std::size_t n = column.layer_count();
  if (n == 0) {
    InputPlace place = where;
    place.item = "pressure_layer";
    throw InputError(place, "a column needs at least one layer");
  }
  check_size(where, "pressure_level", column.pressure_level_pa.size(), n + 1);
  check_size(where, "temperature_level", column.temperature_level_k.size(), n + 1);
  check_size(where, "temperature_layer", column.temperature_layer_k.size(), n);
  for (Gas g : all_gases) check_size(where, std::string(gas_name(g)) + "_mole_fraction", column.gas(g).size(), n);

  for (std::size_t k = 0; k <= n; ++k) {
    const double p = column.pressure_level_pa[k];
    if (!std::isfinite(p) || p < 0.0) throw InputError(at(where, "pressure_level", k), "pressure must be finite and >= 0 Pa");
    if (k > 0 && !(p > column.pressure_level_pa[k - 1]))
      throw InputError(at(where, "pressure_level", k),
                       "pressure must increase strictly from the top (index 0) to the surface");
    const double t = column.temperature_level_k[k];
    if (!std::isfinite(t) || t <= 0.0) throw InputError(at(where, "temperature_level", k), "temperature must be finite and > 0 K");
  }
  for (std::size_t i = 0; i < n; ++i) {
    const double p = column.pressure_layer_pa[i];
    if (!(p >= column.pressure_level_pa[i] && p <= column.pressure_level_pa[i + 1]))
      throw InputError(at(where, "pressure_layer", i), "layer pressure must lie between its bounding level pressures");
    const double t = column.temperature_layer_k[i];
    if (!std::isfinite(t) || t <= 0.0) throw InputError(at(where, "temperature_layer", i), "temperature must be finite and > 0 K");
    for (Gas g : all_gases) {
      const double x = column.gas(g)[i];
      if (!std::isfinite(x) || x < 0.0 || x >= 1.0)
        throw InputError(at(where, std::string(gas_name(g)) + "_mole_fraction", i),
                         "mole fraction must be finite and in [0, 1)");
    }
  }
  if (!std::isfinite(column.surface_temperature_k) || column.surface_temperature_k <= 0.0) {
    InputPlace place = where;
    place.item = "surface_temperature";
    throw InputError(place, "surface temperature must be finite and > 0 K");
  }
  check_in_range(where, "surface_emissivity", column.surface_emissivity, 0.0, 1.0);
  check_in_range(where, "surface_albedo", column.surface_albedo, 0.0, 1.0);
  if (!(column.gravity_m_s2 > 0.0) || !std::isfinite(column.gravity_m_s2)) {
    InputPlace place = where;
    place.item = "gravity";
    throw InputError(place, "gravity must be finite and > 0 m s-2");
  }
}

std::vector<double> layer_air_mass_kg_m2(const Column& column) {
  const std::size_t n = column.layer_count();
  std::vector<double> mass(n);
  for (std::size_t i = 0; i < n; ++i)
    mass[i] = (column.pressure_level_pa[i + 1] - column.pressure_level_pa[i]) / column.gravity_m_s2;
  return mass;
}

std::vector<double> layer_gas_mass_kg_m2(const Column& column, Gas gas) {
  std::vector<double> mass = layer_air_mass_kg_m2(column);
  const std::vector<double>& x = column.gas(gas);
  const std::vector<double>& x_h2o = column.gas(Gas::h2o);
  const double m_gas = gas_molar_mass_kg_mol(gas);
  for (std::size_t i = 0; i < mass.size(); ++i) {
    const double m_moist = (1.0 - x_h2o[i]) * constants::molar_mass_dry_air_kg_mol + x_h2o[i] * constants::molar_mass_h2o_kg_mol;
    mass[i] *= x[i] * m_gas / m_moist;
  }
  return mass;
}

} // namespace bandstack::atmosphere
