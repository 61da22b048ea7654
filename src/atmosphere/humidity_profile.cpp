#include "bandstack/atmosphere/humidity_profile.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include "bandstack/core/error.hpp"
#include "bandstack/thermo/humidity.hpp"

namespace bandstack::atmosphere {

namespace {

[[noreturn]] void bad(const char* item, const std::string& message) { throw InputError(InputPlace::of(item), message); }

} // namespace

double manabe_wetherald_relative_humidity(double pressure_pa, double surface_pressure_pa,
                                          double surface_relative_humidity) {
  if (!(surface_relative_humidity >= 0.0 && surface_relative_humidity <= 1.0))
    bad("surface_relative_humidity", "must be in [0, 1], got " + std::to_string(surface_relative_humidity));
  if (!std::isfinite(pressure_pa) || !(pressure_pa > 0.0))
    bad("pressure", "must be finite and > 0 Pa, got " + std::to_string(pressure_pa));
  if (!std::isfinite(surface_pressure_pa) || !(surface_pressure_pa > 0.0))
    bad("surface_pressure", "must be finite and > 0 Pa, got " + std::to_string(surface_pressure_pa));
  // Manabe & Wetherald (1967): the profile reaches zero at p/p_s = 0.02 (about 20 hPa).
  constexpr double zero_at = 0.02;
  const double rh = surface_relative_humidity * (pressure_pa / surface_pressure_pa - zero_at) / (1.0 - zero_at);
  return std::max(rh, 0.0);
}

std::vector<double> water_vapour_mole_fraction(const std::vector<double>& layer_pressure_pa,
                                               const std::vector<double>& layer_temperature_k,
                                               double surface_pressure_pa, double surface_relative_humidity,
                                               double tropopause_pressure_pa, double stratospheric_mole_fraction) {
  if (layer_pressure_pa.size() != layer_temperature_k.size())
    bad("temperature_layer", "has " + std::to_string(layer_temperature_k.size()) + " values, expected " +
                                 std::to_string(layer_pressure_pa.size()));
  if (!(stratospheric_mole_fraction >= 0.0 && stratospheric_mole_fraction < 1.0))
    bad("stratospheric_h2o_mole_fraction", "must be in [0, 1), got " + std::to_string(stratospheric_mole_fraction));
  std::vector<double> x(layer_pressure_pa.size());
  for (std::size_t i = 0; i < x.size(); ++i) {
    const double p = layer_pressure_pa[i];
    if (p < tropopause_pressure_pa) {
      x[i] = stratospheric_mole_fraction;
      continue;
    }
    const double rh = manabe_wetherald_relative_humidity(p, surface_pressure_pa, surface_relative_humidity);
    x[i] = std::max(thermo::mole_fraction_from_relative_humidity(rh, p, layer_temperature_k[i]),
                    stratospheric_mole_fraction);
  }
  return x;
}

double precipitable_water_kg_m2(const Column& column) {
  double total = 0.0;
  for (double m : layer_gas_mass_kg_m2(column, Gas::h2o)) total += m;
  return total;
}

} // namespace bandstack::atmosphere
