#include "bandstack/thermo/lapse_rate.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/thermo/humidity.hpp"
#include "bandstack/thermo/saturation.hpp"
#include "require.hpp"

#include <algorithm>
#include <cmath>

namespace bandstack::thermo {
namespace {

constexpr double eps = constants::molar_mass_h2o_kg_mol / constants::molar_mass_dry_air_kg_mol;
constexpr double r_d = constants::gas_constant_dry_air_j_kg_k;
constexpr double c_pd = constants::specific_heat_dry_air_j_kg_k;
constexpr double kappa = r_d / c_pd;
// Specific heat of water vapour at constant pressure (Emanuel 1994, "Atmospheric Convection",
// table of constants; from memory).
constexpr double c_pv = 1870.0;
// Largest ln p step of the RK4 integration: the global error scales as h^4; h = 0.02 gives
// < 1e-7 K over 1000 -> 100 hPa (checked in the tests against a 16x finer integration).
constexpr double max_step_ln_p = 0.02;

// Saturation mixing ratio over liquid, kg/kg. Below the liquid formula's range e_s < 1e-9 Pa, so
// the vapour is dropped there rather than failing a cold upper-atmosphere parcel.
double saturation_mixing_ratio_liquid(double temperature_k, double pressure_pa) {
  if (temperature_k <= liquid_formula_min_temperature_k) return 0.0;
  const double e_pa =
      std::min(saturation_vapour_pressure_liquid_pa(temperature_k), max_water_mole_fraction * pressure_pa);
  return eps * e_pa / (pressure_pa - e_pa);
}

// AMS Glossary of Meteorology, "pseudoadiabatic lapse rate", per unit g.
double pseudoadiabatic_lapse_rate_per_g(double temperature_k, double pressure_pa) {
  const double r = saturation_mixing_ratio_liquid(temperature_k, pressure_pa);
  const double t = temperature_k;
  const double l = latent_heat_vaporisation_j_kg(t);
  return (1.0 + r) * (1.0 + l * r / (r_d * t)) / (c_pd + r * c_pv + l * l * r * (eps + r) / (r_d * t * t));
}

// dT/dln p along the pseudo-adiabat: the lapse rate times dz/dln p = -R_d T_v / g (hydrostatic, with
// the virtual temperature of the saturated air and no condensate carried).
double pseudoadiabat_slope_k(double temperature_k, double ln_p) {
  const double p = std::exp(ln_p);
  const double r = saturation_mixing_ratio_liquid(temperature_k, p);
  const double t_v = temperature_k * (1.0 + r / eps) / (1.0 + r);
  return pseudoadiabatic_lapse_rate_per_g(temperature_k, p) * r_d * t_v;
}

void check_adiabat_input(const char* function, double t0_k, double p0_pa, double p_pa) {
  detail::require_positive(function, "t0_k", t0_k);
  detail::require_positive(function, "p0_pa", p0_pa);
  detail::require_positive(function, "p_pa", p_pa);
}

} // namespace

double dry_adiabatic_lapse_rate_k_m(double gravity_m_s2) {
  detail::require_positive("dry_adiabatic_lapse_rate_k_m", "gravity_m_s2", gravity_m_s2);
  return gravity_m_s2 / c_pd;
}

double latent_heat_vaporisation_j_kg(double temperature_k) {
  detail::require_positive("latent_heat_vaporisation_j_kg", "temperature_k", temperature_k);
  return (2.501 - 0.00237 * (temperature_k - constants::zero_celsius_k)) * 1e6;
}

double moist_pseudoadiabatic_lapse_rate_k_m(double temperature_k, double pressure_pa, double gravity_m_s2) {
  detail::require_positive("moist_pseudoadiabatic_lapse_rate_k_m", "temperature_k", temperature_k);
  detail::require_positive("moist_pseudoadiabatic_lapse_rate_k_m", "pressure_pa", pressure_pa);
  detail::require_positive("moist_pseudoadiabatic_lapse_rate_k_m", "gravity_m_s2", gravity_m_s2);
  return gravity_m_s2 * pseudoadiabatic_lapse_rate_per_g(temperature_k, pressure_pa);
}

double moist_pseudoadiabat_temperature_k(double t0_k, double p0_pa, double p_pa, int steps) {
  check_adiabat_input("moist_pseudoadiabat_temperature_k", t0_k, p0_pa, p_pa);
  if (steps < 1) detail::reject("moist_pseudoadiabat_temperature_k", "steps", steps, "at least 1 step");
  const double h = (std::log(p_pa) - std::log(p0_pa)) / steps;
  double t = t0_k;
  double x = std::log(p0_pa);
  for (int i = 0; i < steps; ++i) {
    const double k1 = pseudoadiabat_slope_k(t, x);
    const double k2 = pseudoadiabat_slope_k(t + 0.5 * h * k1, x + 0.5 * h);
    const double k3 = pseudoadiabat_slope_k(t + 0.5 * h * k2, x + 0.5 * h);
    const double k4 = pseudoadiabat_slope_k(t + h * k3, x + h);
    t += h / 6.0 * (k1 + 2.0 * k2 + 2.0 * k3 + k4);
    x = std::log(p0_pa) + (i + 1) * h;
  }
  return t;
}

double moist_pseudoadiabat_temperature_k(double t0_k, double p0_pa, double p_pa) {
  check_adiabat_input("moist_pseudoadiabat_temperature_k", t0_k, p0_pa, p_pa);
  const double span = std::abs(std::log(p_pa / p0_pa));
  const int steps = std::max(1, static_cast<int>(std::ceil(span / max_step_ln_p)));
  return moist_pseudoadiabat_temperature_k(t0_k, p0_pa, p_pa, steps);
}

double dry_adiabat_temperature_k(double t0_k, double p0_pa, double p_pa) {
  check_adiabat_input("dry_adiabat_temperature_k", t0_k, p0_pa, p_pa);
  return t0_k * std::pow(p_pa / p0_pa, kappa);
}

} // namespace bandstack::thermo
