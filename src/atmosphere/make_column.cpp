#include <cmath>
#include <string>

#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/humidity_profile.hpp"
#include "bandstack/atmosphere/ozone.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/atmosphere/us_standard_1976.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/hydrostatics.hpp"

namespace bandstack::atmosphere {

namespace {

void check_fraction(const char* item, double value, bool allow_one) {
  const bool ok = std::isfinite(value) && value >= 0.0 && (allow_one ? value <= 1.0 : value < 1.0);
  if (!ok) {
    InputPlace place;
    place.item = item;
    throw InputError(place, std::string("must be in [0, 1") + (allow_one ? "]" : ")") + ", got " + std::to_string(value));
  }
}

void check_settings(const ProfileSettings& s) {
  check_fraction("surface_relative_humidity", s.surface_relative_humidity, true);
  check_fraction("stratospheric_h2o_mole_fraction", s.stratospheric_h2o_mole_fraction, false);
  check_fraction("co2_mole_fraction", s.co2_mole_fraction, false);
  check_fraction("ch4_mole_fraction", s.ch4_mole_fraction, false);
  check_fraction("n2o_mole_fraction", s.n2o_mole_fraction, false);
  check_fraction("surface_emissivity", s.surface_emissivity, true);
  check_fraction("surface_albedo", s.surface_albedo, true);
  if (!std::isfinite(s.ozone_scale) || s.ozone_scale < 0.0) {
    InputPlace place;
    place.item = "ozone_scale";
    throw InputError(place, "must be finite and >= 0, got " + std::to_string(s.ozone_scale));
  }
}

} // namespace

Column make_column(const ProfileSettings& settings, const GridSpec& grid, std::string name) {
  check_settings(settings);
  Column c;
  c.name = name.empty() ? std::string(profile_name(settings.profile)) : std::move(name);
  c.pressure_level_pa = level_pressures_pa(grid);
  c.pressure_layer_pa = layer_pressures_pa(c.pressure_level_pa);
  const std::size_t n = c.layer_count();
  const double ps = c.pressure_level_pa.back();

  const TemperatureStructure structure = temperature_structure(settings, ps);
  c.temperature_level_k = temperatures_at_pressures_k(structure, c.pressure_level_pa);
  c.temperature_layer_k = temperatures_at_pressures_k(structure, c.pressure_layer_pa);
  // The surface level is the surface air temperature exactly, not an integration result.
  c.temperature_level_k.back() = structure.surface_temperature_k;

  c.gas(Gas::h2o) = water_vapour_mole_fraction(c.pressure_layer_pa, c.temperature_layer_k, ps,
                                               settings.surface_relative_humidity, structure.tropopause_pressure_pa,
                                               settings.stratospheric_h2o_mole_fraction);
  c.gas(Gas::co2).assign(n, settings.co2_mole_fraction);
  c.gas(Gas::ch4).assign(n, settings.ch4_mole_fraction);
  c.gas(Gas::n2o).assign(n, settings.n2o_mole_fraction);

  // Ozone altitudes: hypsometric heights above the surface, plus the surface altitude the 1976
  // standard gives to p_s (0 m at 101325 Pa), so the Green profile stays tied to sea level.
  std::vector<double> z = thermo::level_heights_m(c.pressure_level_pa, c.temperature_layer_k, c.gas(Gas::h2o), c.gravity_m_s2);
  const double z_surface = us_standard_1976::geopotential_height_m(ps);
  for (double& zk : z) zk += z_surface;
  c.gas(Gas::o3) = green_ozone_mole_fraction(z, c.pressure_level_pa, c.gas(Gas::h2o), c.gravity_m_s2, settings.ozone_scale);

  c.surface_temperature_k = structure.surface_temperature_k;
  c.surface_emissivity = settings.surface_emissivity;
  c.surface_albedo = settings.surface_albedo;
  validate(c);
  return c;
}

} // namespace bandstack::atmosphere
