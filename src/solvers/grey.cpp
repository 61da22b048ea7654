#include "bandstack/solvers/grey.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/heating.hpp"
#include "bandstack/solvers/longwave.hpp"

#include <cmath>
#include <string>
#include <utility>

namespace bandstack::solvers {

namespace {


void check_optics(const GreyOptics& optics) {
  for (Gas gas : all_gases) {
    const double kappa = optics.mass_absorption_m2_kg[index(gas)];
    if (!(kappa >= 0.0) || !std::isfinite(kappa))
      throw InputError(InputPlace::of(std::string(gas_name(gas)) + "_mass_absorption"),
                       "grey mass absorption coefficient must be finite and >= 0 m2 kg-1");
  }
  if (!(optics.extra_tau_per_pa >= 0.0) || !std::isfinite(optics.extra_tau_per_pa))
    throw InputError(InputPlace::of("extra_tau_per_pa"), "must be finite and >= 0 Pa-1");
}

} // namespace

std::vector<double> grey_optical_depth(const atmosphere::Column& column, const GreyOptics& optics) {
  atmosphere::validate(column);
  check_optics(optics);
  const std::size_t n = column.layer_count();
  std::vector<double> tau(n, 0.0);
  for (std::size_t i = 0; i < n; ++i)
    tau[i] = optics.extra_tau_per_pa * (column.pressure_level_pa[i + 1] - column.pressure_level_pa[i]);
  for (Gas gas : all_gases) {
    const double kappa = optics.mass_absorption_m2_kg[index(gas)];
    if (kappa == 0.0) continue;
    const std::vector<double> mass = atmosphere::layer_gas_mass_kg_m2(column, gas);
    for (std::size_t i = 0; i < n; ++i)
      tau[i] += kappa * mass[i];
  }
  return tau;
}

double grey_source_w_m2_sr(double t_k) noexcept {
  const double t2 = t_k * t_k;
  return constants::stefan_boltzmann_w_m2_k4 * t2 * t2 / constants::pi;
}

LongwaveResult solve_grey_longwave(const atmosphere::Column& column, const GreyOptics& optics,
                                   const AngularQuadrature& angles) {
  const std::vector<double> tau = grey_optical_depth(column, optics); // validates column and optics
  const std::size_t n = column.layer_count();
  std::vector<double> source(n + 1), source_layer(n);
  for (std::size_t k = 0; k <= n; ++k)
    source[k] = grey_source_w_m2_sr(column.temperature_level_k[k]);
  for (std::size_t i = 0; i < n; ++i)
    source_layer[i] = grey_source_w_m2_sr(column.temperature_layer_k[i]);

  LongwaveResult result;
  result.flux_up.resize(n + 1);
  result.flux_down.resize(n + 1);
  result.heating_rate_k_day.resize(n);
  longwave_fluxes(tau, source, source_layer, grey_source_w_m2_sr(column.surface_temperature_k),
                  column.surface_emissivity, angles, result.flux_up, result.flux_down);
  heating_rate_k_day(column.pressure_level_pa, result.flux_up, result.flux_down, column.gravity_m_s2,
                     result.heating_rate_k_day);
  return result;
}

} // namespace bandstack::solvers
