#include "bandstack/thermo/humidity.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/thermo/saturation.hpp"
#include "require.hpp"

#include <algorithm>

namespace bandstack::thermo {
namespace {

constexpr double eps = constants::molar_mass_h2o_kg_mol / constants::molar_mass_dry_air_kg_mol;

} // namespace

double mass_mixing_ratio_from_mole_fraction(double x) {
  detail::require_unit_fraction("mass_mixing_ratio_from_mole_fraction", "x", x);
  return eps * x / (1.0 - x);
}

double mole_fraction_from_mass_mixing_ratio(double r) {
  detail::require_non_negative("mole_fraction_from_mass_mixing_ratio", "r", r);
  return r / (eps + r);
}

double specific_humidity_from_mole_fraction(double x) {
  detail::require_unit_fraction("specific_humidity_from_mole_fraction", "x", x);
  // q = m_w / (m_w + m_d) per mole of moist air.
  return eps * x / (1.0 - x * (1.0 - eps));
}

double mole_fraction_from_specific_humidity(double q) {
  detail::require_unit_fraction("mole_fraction_from_specific_humidity", "q", q);
  return q / (eps + q * (1.0 - eps));
}

double relative_humidity_from_mole_fraction(double x, double pressure_pa, double temperature_k) {
  detail::require_unit_fraction("relative_humidity_from_mole_fraction", "x", x);
  detail::require_positive("relative_humidity_from_mole_fraction", "pressure_pa", pressure_pa);
  return x * pressure_pa / saturation_vapour_pressure_pa(temperature_k);
}

double mole_fraction_from_relative_humidity(double rh, double pressure_pa, double temperature_k) {
  detail::require_non_negative("mole_fraction_from_relative_humidity", "rh", rh);
  detail::require_positive("mole_fraction_from_relative_humidity", "pressure_pa", pressure_pa);
  const double e_pa = rh * saturation_vapour_pressure_pa(temperature_k);
  return std::min(e_pa / pressure_pa, max_water_mole_fraction);
}

double saturation_mole_fraction(double pressure_pa, double temperature_k) {
  detail::require_positive("saturation_mole_fraction", "pressure_pa", pressure_pa);
  return mole_fraction_from_relative_humidity(1.0, pressure_pa, temperature_k);
}

} // namespace bandstack::thermo
