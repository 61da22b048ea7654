#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/core/error.hpp"
#include "equilibrium_state.hpp"

namespace bandstack::climate {

EquilibriumResult march_to_equilibrium(const atmosphere::Column& start, const NetHeating& radiation,
                                       const EquilibriumSettings& s) {
  detail::check_inputs(start, s);
  if (!radiation) throw InputError(InputPlace::of("radiation"), "no radiation callback given");
  const std::size_t n = start.layer_count();
  const bool seb = s.surface == SurfaceTreatment::energy_balance;
  const double cs = s.marching.surface_heat_capacity_j_m2_k;
  detail::Evaluator evaluate(radiation);
  atmosphere::Column column = start;
  std::vector<double> t = start.temperature_layer_k;
  double ts = start.surface_temperature_k;
  std::vector<bool> convective(n, false);

  // Starting state adjusted, so that the march begins from a stable column.
  auto adjust = [&](std::vector<double>& temps, double& surface_t) {
    if (s.convection.kind == ConvectionKind::none) return;
    // A fixed surface temperature acts as a ground of unlimited heat capacity.
    AdjustedSurface ground{surface_t, seb ? cs : 1e30};
    const AdjustmentResult a =
        adjust_convectively(s.convection, column.pressure_level_pa, column.pressure_layer_pa, temps, column.gravity_m_s2, &ground);
    if (seb) surface_t = ground.temperature_k;
    convective.assign(n, false);
    // Only the region touching the ground counts as convective for the criteria.
    if (a.surface_adjusted)
      for (std::size_t i = n; i-- > 0 && a.layer_adjusted[i];) convective[i] = true;
  };
  adjust(t, ts);

  EquilibriumResult result;
  result.method = EquilibriumMethod::time_marching;
  detail::Evaluation e, previous;
  std::vector<double> t_previous = t;
  double ts_previous = ts;
  double dt = s.marching.initial_time_step_s;
  long calm_steps = 0;
  bool have_previous = false;
  for (long step = 0;; ++step) {
    try {
      detail::set_state(column, t, ts, convective.back(), s.water);
      evaluate(column, e);
    } catch (const InputError& error) {
      throw ConvergenceError(fmt::format("column '{}': time marching left the radiation's range after {} steps: {}",
                                         start.name, step, error.what()));
    }
    result.time_steps = step;
    result.radiative_calls = evaluate.calls();
    if (detail::finish(result, column, e, convective, s)) {
      result.converged = true;
      return result;
    }
    if (step >= s.marching.max_steps)
      throw ConvergenceError(fmt::format("column '{}': time marching did not converge in {} steps ({})", start.name, step,
                                         detail::describe_residuals(result)));
    // Explicit-step stability: a radiative layer (or the ground) whose tendency flips sign with a
    // larger magnitude is a growing oscillation; the step is undone and halved.
    bool growing = false;
    if (have_previous) {
      for (std::size_t i = 0; i < n && !growing; ++i)
        growing = !convective[i] && e.heating_k_day[i] * previous.heating_k_day[i] < 0.0 &&
                  std::abs(e.heating_k_day[i]) > std::max(std::abs(previous.heating_k_day[i]), s.heating_tolerance_k_day);
      if (seb && !convective.back())
        growing = growing || (e.surface_net_w_m2() * previous.surface_net_w_m2() < 0.0 &&
                              std::abs(e.surface_net_w_m2()) > std::max(std::abs(previous.surface_net_w_m2()), s.flux_tolerance_w_m2));
    }
    if (growing) {
      dt *= 0.5;
      t = t_previous;
      ts = ts_previous;
      adjust(t, ts);
      have_previous = false;
      calm_steps = 0;
      continue;
    }
    if (++calm_steps > 50) {
      dt = std::min(dt * 1.2, s.marching.max_time_step_s);
      calm_steps = 0;
    }
    t_previous = t;
    ts_previous = ts;
    previous = e;
    have_previous = true;
    for (std::size_t i = 0; i < n; ++i) t[i] += dt * e.heating_k_day[i] / 86400.0;
    if (seb) ts += dt * e.surface_net_w_m2() / cs;
    adjust(t, ts);
  }
}

} // namespace bandstack::climate
