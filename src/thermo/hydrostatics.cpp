#include "bandstack/thermo/hydrostatics.hpp"

#include "bandstack/core/constants.hpp"
#include "require.hpp"

#include <cmath>
#include <string>

namespace bandstack::thermo {
namespace {

constexpr double eps = constants::molar_mass_h2o_kg_mol / constants::molar_mass_dry_air_kg_mol;

[[noreturn]] void reject_at(long level, const char* item, const std::string& message) {
  InputPlace place = detail::place_of(item);
  place.level = level;
  throw InputError(place, "level_heights_m: " + message);
}

} // namespace

double virtual_temperature_k(double temperature_k, double water_mole_fraction) {
  detail::require_positive("virtual_temperature_k", "temperature_k", temperature_k);
  detail::require_unit_fraction("virtual_temperature_k", "water_mole_fraction", water_mole_fraction);
  return temperature_k / (1.0 - water_mole_fraction * (1.0 - eps));
}

std::vector<double> level_heights_m(const std::vector<double>& level_pressure_pa,
                                    const std::vector<double>& layer_temperature_k,
                                    const std::vector<double>& layer_water_mole_fraction, double gravity_m_s2) {
  detail::require_positive("level_heights_m", "gravity_m_s2", gravity_m_s2);
  const std::size_t n_layers = layer_temperature_k.size();
  if (n_layers == 0 || level_pressure_pa.size() != n_layers + 1) {
    throw InputError(detail::place_of("level_pressure_pa"),
                     "level_heights_m: need N+1 >= 2 level pressures for N layer temperatures, got " +
                         std::to_string(level_pressure_pa.size()) + " and " + std::to_string(n_layers));
  }
  const bool dry = layer_water_mole_fraction.empty();
  if (!dry && layer_water_mole_fraction.size() != n_layers) {
    throw InputError(detail::place_of("layer_water_mole_fraction"),
                     "level_heights_m: need N = " + std::to_string(n_layers) + " values or none, got " +
                         std::to_string(layer_water_mole_fraction.size()));
  }
  if (!(std::isfinite(level_pressure_pa[0]) && level_pressure_pa[0] > 0.0)) {
    reject_at(0, "level_pressure_pa", "top pressure must be finite and > 0 Pa");
  }

  const double scale_m_per_k = constants::gas_constant_dry_air_j_kg_k / gravity_m_s2;
  std::vector<double> height_m(n_layers + 1, 0.0);
  for (std::size_t i = n_layers; i-- > 0;) {
    const auto level = static_cast<long>(i);
    const double p_top = level_pressure_pa[i];
    const double p_bottom = level_pressure_pa[i + 1];
    if (!(std::isfinite(p_bottom) && p_bottom > p_top)) {
      reject_at(level + 1, "level_pressure_pa", "pressures must increase strictly downward");
    }
    const double t = layer_temperature_k[i];
    const double x = dry ? 0.0 : layer_water_mole_fraction[i];
    if (!(std::isfinite(t) && t > 0.0)) reject_at(level, "layer_temperature_k", "temperature must be > 0 K");
    if (!(x >= 0.0 && x < 1.0)) reject_at(level, "layer_water_mole_fraction", "mole fraction must be in [0, 1)");
    height_m[i] = height_m[i + 1] + scale_m_per_k * virtual_temperature_k(t, x) * std::log(p_bottom / p_top);
  }
  return height_m;
}

} // namespace bandstack::thermo
