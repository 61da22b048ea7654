#include "bandstack/thermo/saturation.hpp"

#include "bandstack/core/constants.hpp"
#include "require.hpp"

#include <cmath>

namespace bandstack::thermo {

double saturation_vapour_pressure_ice_pa(double temperature_k) {
  const double t = temperature_k;
  if (!(t > ice_formula_min_temperature_k && t <= constants::triple_point_water_k)) {
    detail::reject("saturation_vapour_pressure_ice_pa", "temperature_k", t,
                   "110 K < T <= 273.16 K (Murphy & Koop 2005 eq. 7)");
  }
  // Murphy & Koop (2005) eq. (7), ln of Pa.
  return std::exp(9.550426 - 5723.265 / t + 3.53068 * std::log(t) - 0.00728332 * t);
}

double saturation_vapour_pressure_liquid_pa(double temperature_k) {
  const double t = temperature_k;
  if (!(t > liquid_formula_min_temperature_k && t < liquid_formula_max_temperature_k)) {
    detail::reject("saturation_vapour_pressure_liquid_pa", "temperature_k", t,
                   "123 K < T < 332 K (Murphy & Koop 2005 eq. 10)");
  }
  // Murphy & Koop (2005) eq. (10), ln of Pa; the tanh term blends the supercooled branch.
  const double ln_t = std::log(t);
  return std::exp(54.842763 - 6763.22 / t - 4.210 * ln_t + 0.000367 * t +
                  std::tanh(0.0415 * (t - 218.8)) * (53.878 - 1331.22 / t - 9.44523 * ln_t + 0.014025 * t));
}

double saturation_vapour_pressure_pa(double temperature_k) {
  if (!(temperature_k > ice_formula_min_temperature_k && temperature_k < liquid_formula_max_temperature_k)) {
    detail::reject("saturation_vapour_pressure_pa", "temperature_k", temperature_k, "110 K < T < 332 K");
  }
  return temperature_k >= constants::triple_point_water_k ? saturation_vapour_pressure_liquid_pa(temperature_k)
                                                          : saturation_vapour_pressure_ice_pa(temperature_k);
}

} // namespace bandstack::thermo
