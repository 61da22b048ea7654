#include "equilibrium_state.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

namespace bandstack::climate::detail {

namespace {

void positive(double value, const char* item, const char* unit) {
  if (!std::isfinite(value) || !(value > 0.0))
    throw InputError(InputPlace::of(item), fmt::format("must be finite and > 0 {}", unit));
}

} // namespace

void check_inputs(const atmosphere::Column& start, const EquilibriumSettings& s) {
  atmosphere::validate(start);
  positive(s.heating_tolerance_k_day, "heating_tolerance", "K/day");
  positive(s.flux_tolerance_w_m2, "flux_tolerance", "W m-2");
  positive(s.jacobian_step_k, "jacobian_step", "K");
  positive(s.max_step_k, "max_step", "K");
  positive(s.marching.initial_time_step_s, "initial_time_step", "s");
  positive(s.marching.max_time_step_s, "max_time_step", "s");
  positive(s.marching.surface_heat_capacity_j_m2_k, "surface_heat_capacity", "J m-2 K-1");
  if (s.max_newton_iterations < 0) throw InputError(InputPlace::of("max_newton_iterations"), "must be >= 0");
  if (s.marching.max_steps < 0) throw InputError(InputPlace::of("max_time_steps"), "must be >= 0");
  if (s.convection.kind == ConvectionKind::fixed_lapse_rate &&
      (!std::isfinite(s.convection.critical_lapse_rate_k_km) || !(s.convection.critical_lapse_rate_k_km > 0.0)))
    throw InputError(InputPlace::of("critical_lapse_rate"), "must be finite and > 0 K/km");
  if (s.water.treatment == WaterTreatment::fixed_relative_humidity &&
      (!(s.water.surface_relative_humidity >= 0.0) || !(s.water.surface_relative_humidity <= 1.0)))
    throw InputError(InputPlace::of("surface_relative_humidity"), "must be in [0, 1]");
  if (s.water.treatment == WaterTreatment::fixed_relative_humidity &&
      (!(s.water.stratospheric_mole_fraction >= 0.0) || !(s.water.stratospheric_mole_fraction < 1.0)))
    throw InputError(InputPlace::of("stratospheric_mole_fraction"), "must be in [0, 1) mol/mol");
}

void Evaluator::operator()(const atmosphere::Column& column, Evaluation& out) {
  ++calls_;
  radiation_(column, out);
  if (out.heating_k_day.size() != column.layer_count() || out.net_flux_w_m2.size() != column.level_count())
    throw InternalError("radiation callback returned heating rates or fluxes of the wrong size");
  bool finite = std::isfinite(out.olr_w_m2) && std::isfinite(out.absorbed_solar_w_m2);
  for (double h : out.heating_k_day) finite = finite && std::isfinite(h);
  for (double f : out.net_flux_w_m2) finite = finite && std::isfinite(f);
  if (!finite) throw InputError(InputPlace::of("radiation"), "radiative heating is not finite for this state");
}

void set_state(atmosphere::Column& column, const std::vector<double>& t, double ts, bool lowest_layer_convective,
               const WaterSettings& water) {
  for (std::size_t i = 0; i < t.size(); ++i)
    if (!(t[i] > 0.0) || !std::isfinite(t[i]))
      throw InputError(InputPlace::of("temperature_layer", i), "temperature left the physical range during the iteration");
  if (!(ts > 0.0) || !std::isfinite(ts))
    throw InputError(InputPlace::of("surface_temperature"), "temperature left the physical range during the iteration");
  column.temperature_layer_k = t;
  column.surface_temperature_k = ts;
  set_level_temperatures(column, lowest_layer_convective);
  update_water(column, water);
}

double region_net_w_m2(const atmosphere::Column& column, const Evaluation& e, const std::vector<bool>& convective) {
  const double cp = constants::specific_heat_dry_air_j_kg_k;
  double net = e.surface_net_w_m2();
  for (std::size_t i = column.layer_count(); i-- > 0 && convective[i];)
    net += cp * (column.pressure_level_pa[i + 1] - column.pressure_level_pa[i]) / column.gravity_m_s2 *
           e.heating_k_day[i] / constants::seconds_per_day;
  return net;
}

bool finish(EquilibriumResult& r, const atmosphere::Column& column, const Evaluation& e,
            const std::vector<bool>& convective, const EquilibriumSettings& s) {
  r.column = column;
  r.heating_k_day = e.heating_k_day;
  r.convective = convective;
  r.toa_net_w_m2 = e.toa_net_w_m2();
  r.surface_net_w_m2 = e.surface_net_w_m2();
  r.region_net_w_m2 = region_net_w_m2(column, e, convective);
  r.max_radiative_heating_k_day = 0.0;
  for (std::size_t i = 0; i < column.layer_count(); ++i)
    if (!convective[i]) r.max_radiative_heating_k_day = std::max(r.max_radiative_heating_k_day, std::abs(e.heating_k_day[i]));
  bool ok = r.max_radiative_heating_k_day <= s.heating_tolerance_k_day;
  if (s.surface == SurfaceTreatment::energy_balance)
    ok = ok && std::abs(r.toa_net_w_m2) <= s.flux_tolerance_w_m2 && std::abs(r.region_net_w_m2) <= s.flux_tolerance_w_m2;
  return ok;
}

std::string describe_residuals(const EquilibriumResult& r) {
  return fmt::format("max |heating| = {:.3g} K/day in radiative layers, TOA net flux = {:.3g} W m-2, "
                     "net flux into the convective region and ground = {:.3g} W m-2",
                     r.max_radiative_heating_k_day, r.toa_net_w_m2, r.region_net_w_m2);
}

} // namespace bandstack::climate::detail
