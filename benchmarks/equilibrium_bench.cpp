// Radiative-convective equilibrium of a 60-layer grey column from an isothermal start (250 K,
// grey optical depth 4 proportional to pressure, 240 W m-2 absorbed at the ground, 6.5 K/km):
// Newton's method against the explicit time march to the same tolerance. Reports radiative calls
// and the ratio (issue 5 aim: at least 50x fewer calls with Newton).
#include <benchmark/benchmark.h>

#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/climate/equilibrium.hpp"

namespace {

using namespace bandstack;

atmosphere::Column start_column() {
  atmosphere::Column c;
  c.name = "grey bench";
  c.pressure_level_pa = atmosphere::level_pressures_pa(atmosphere::GridSpec{60, 10.0, 1e5, atmosphere::Spacing::log_pressure});
  c.pressure_layer_pa = atmosphere::layer_pressures_pa(c.pressure_level_pa);
  c.temperature_layer_k.assign(60, 250.0);
  c.temperature_level_k.assign(61, 250.0);
  for (auto& x : c.mole_fraction) x.assign(60, 0.0);
  c.surface_temperature_k = 250.0;
  return c;
}

climate::NetHeating radiation() {
  solvers::GreyOptics optics;
  optics.extra_tau_per_pa = 4.0 / 1e5;
  return climate::grey_net_heating(optics, solvers::diffusivity_quadrature(1.66), 240.0);
}

void BM_GreyRceNewton(benchmark::State& state) {
  const auto column = start_column();
  const auto rad = radiation();
  climate::EquilibriumSettings s;
  s.time_marching_fallback = false;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::solve_equilibrium(column, rad, s);
  state.counters["radiative_calls"] = static_cast<double>(r.radiative_calls);
  state.counters["newton_iterations"] = r.newton_iterations;
}
BENCHMARK(BM_GreyRceNewton)->Unit(benchmark::kMillisecond);

// Newton with a Jacobian differenced every step (no Broyden updates), for comparison.
void BM_GreyRceNewtonEveryStepJacobian(benchmark::State& state) {
  const auto column = start_column();
  const auto rad = radiation();
  climate::EquilibriumSettings s;
  s.time_marching_fallback = false;
  s.broyden_update = false;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::solve_equilibrium(column, rad, s);
  state.counters["radiative_calls"] = static_cast<double>(r.radiative_calls);
  state.counters["newton_iterations"] = r.newton_iterations;
}
BENCHMARK(BM_GreyRceNewtonEveryStepJacobian)->Unit(benchmark::kMillisecond);

void BM_GreyRceTimeMarching(benchmark::State& state) {
  const auto column = start_column();
  const auto rad = radiation();
  climate::EquilibriumSettings s;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::march_to_equilibrium(column, rad, s);
  state.counters["radiative_calls"] = static_cast<double>(r.radiative_calls);
  state.counters["time_steps"] = static_cast<double>(r.time_steps);
  // Calls of the time march over calls of Newton (with Broyden updates): the issue-5 ratio.
  climate::EquilibriumSettings newton_settings = s;
  newton_settings.time_marching_fallback = false;
  const auto newton = climate::solve_equilibrium(column, rad, newton_settings);
  state.counters["newton_radiative_calls"] = static_cast<double>(newton.radiative_calls);
  state.counters["calls_ratio_march_over_newton"] =
      static_cast<double>(r.radiative_calls) / static_cast<double>(newton.radiative_calls);
}
BENCHMARK(BM_GreyRceTimeMarching)->Unit(benchmark::kMillisecond);

} // namespace
