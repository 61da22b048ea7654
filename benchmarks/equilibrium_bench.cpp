// Radiative-convective equilibrium of 60-layer columns from an isothermal start (6.5 K/km, surface
// energy balance): Newton's method against the explicit time march to the same tolerance
// (1e-3 K/day, 0.01 W m-2). Reports Newton steps, radiative calls and the ratio of calls (issue 5
// aims: at most 15 Newton steps, at least 50x fewer calls with Newton than with the time march).
//   Grey:  grey optical depth 4 proportional to pressure, 240 W m-2 absorbed at the ground, 250 K.
//   Band:  default_lw + default_sw (3 Gauss angles, S0 = 1361 W m-2, cos zenith 0.5 half the time),
//          the U.S. Standard 1976 gases with 300 ppmv CO2 and no CH4/N2O (the Manabe & Wetherald 1967
//          set-up of tests/climate/manabe_wetherald_test.cpp), surface albedo 0.3, everything at
//          250 K; water held at the starting column's mole fractions (argument 0) or at the
//          Manabe-Wetherald relative humidity (argument 1).
#include <benchmark/benchmark.h>

#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/io/band_catalog.hpp"

namespace {

using namespace bandstack;

constexpr std::size_t layers = 60;
constexpr double start_k = 250.0;

atmosphere::Column grey_column() {
  atmosphere::Column c;
  c.name = "grey bench";
  c.pressure_level_pa =
      atmosphere::level_pressures_pa(atmosphere::GridSpec{layers, 10.0, 1e5, atmosphere::Spacing::log_pressure});
  c.pressure_layer_pa = atmosphere::layer_pressures_pa(c.pressure_level_pa);
  c.temperature_layer_k.assign(layers, start_k);
  c.temperature_level_k.assign(layers + 1, start_k);
  for (auto& x : c.mole_fraction) x.assign(layers, 0.0);
  c.surface_temperature_k = start_k;
  return c;
}

climate::NetHeating grey_radiation() {
  solvers::GreyOptics optics;
  optics.extra_tau_per_pa = 4.0 / 1e5;
  return climate::grey_net_heating(optics, solvers::diffusivity_quadrature(1.66), 240.0);
}

atmosphere::Column band_column() {
  atmosphere::ProfileSettings p;
  p.co2_mole_fraction = 300e-6;
  p.ch4_mole_fraction = p.n2o_mole_fraction = 0.0;
  p.surface_albedo = 0.3;
  const atmosphere::GridSpec grid{layers, 10.0, 101325.0, atmosphere::Spacing::log_pressure};
  atmosphere::Column c = atmosphere::make_column(p, grid, "band bench");
  c.sun = atmosphere::SunGeometry{0.5, 1.0, 0.5};
  c.temperature_layer_k.assign(layers, start_k);
  c.temperature_level_k.assign(layers + 1, start_k);
  c.surface_temperature_k = start_k;
  return c;
}

const climate::NetHeating& band_radiation() {
  static const spectral::BandSet lw = io::load_band_set("default_lw");
  static const spectral::BandSet sw = io::load_band_set("default_sw");
  static const climate::NetHeating radiation = climate::band_net_heating(lw, sw, solvers::gauss_quadrature(3), 1361.0);
  return radiation;
}

climate::EquilibriumSettings band_settings(const benchmark::State& state) {
  climate::EquilibriumSettings s;
  s.water.treatment = state.range(0) == 0 ? climate::WaterTreatment::fixed_mole_fraction
                                          : climate::WaterTreatment::fixed_relative_humidity;
  return s;
}

void report_newton(benchmark::State& state, const climate::EquilibriumResult& r) {
  state.counters["radiative_calls"] = static_cast<double>(r.radiative_calls);
  state.counters["newton_iterations"] = r.newton_iterations;
  state.counters["surface_temperature_k"] = r.column.surface_temperature_k;
}

// The time march, and the ratio of its calls to those of Newton's method with `newton_settings`.
void report_march(benchmark::State& state, const climate::EquilibriumResult& march, const atmosphere::Column& start,
                  const climate::NetHeating& radiation, climate::EquilibriumSettings newton_settings) {
  state.counters["radiative_calls"] = static_cast<double>(march.radiative_calls);
  state.counters["time_steps"] = static_cast<double>(march.time_steps);
  state.counters["surface_temperature_k"] = march.column.surface_temperature_k;
  newton_settings.time_marching_fallback = false;
  const auto newton = climate::solve_equilibrium(start, radiation, newton_settings);
  state.counters["newton_radiative_calls"] = static_cast<double>(newton.radiative_calls);
  state.counters["calls_ratio_march_over_newton"] =
      static_cast<double>(march.radiative_calls) / static_cast<double>(newton.radiative_calls);
}

void BM_GreyRceNewton(benchmark::State& state) {
  const auto column = grey_column();
  const auto rad = grey_radiation();
  climate::EquilibriumSettings s;
  s.time_marching_fallback = false;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::solve_equilibrium(column, rad, s);
  report_newton(state, r);
}
BENCHMARK(BM_GreyRceNewton)->Unit(benchmark::kMillisecond);

// Full forward differences (N + 1 calls per Jacobian) instead of grouped ones, Broyden updates.
void BM_GreyRceNewtonFullDifferences(benchmark::State& state) {
  const auto column = grey_column();
  const auto rad = grey_radiation();
  climate::EquilibriumSettings s;
  s.time_marching_fallback = false;
  s.jacobian = climate::JacobianMethod::full_differences;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::solve_equilibrium(column, rad, s);
  report_newton(state, r);
}
BENCHMARK(BM_GreyRceNewtonFullDifferences)->Unit(benchmark::kMillisecond);

// Newton with a full Jacobian differenced every step (no Broyden updates), for comparison.
void BM_GreyRceNewtonEveryStepJacobian(benchmark::State& state) {
  const auto column = grey_column();
  const auto rad = grey_radiation();
  climate::EquilibriumSettings s;
  s.time_marching_fallback = false;
  s.jacobian = climate::JacobianMethod::full_differences;
  s.broyden_update = false;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::solve_equilibrium(column, rad, s);
  report_newton(state, r);
}
BENCHMARK(BM_GreyRceNewtonEveryStepJacobian)->Unit(benchmark::kMillisecond);

void BM_GreyRceTimeMarching(benchmark::State& state) {
  const auto column = grey_column();
  const auto rad = grey_radiation();
  climate::EquilibriumSettings s;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::march_to_equilibrium(column, rad, s);
  report_march(state, r, column, rad, s);
}
BENCHMARK(BM_GreyRceTimeMarching)->Unit(benchmark::kMillisecond);

void BM_BandRceNewton(benchmark::State& state) {
  const auto column = band_column();
  const auto& rad = band_radiation();
  climate::EquilibriumSettings s = band_settings(state);
  s.time_marching_fallback = false;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::solve_equilibrium(column, rad, s);
  report_newton(state, r);
}
BENCHMARK(BM_BandRceNewton)->ArgName("fixed_rh")->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond);

void BM_BandRceNewtonFullDifferences(benchmark::State& state) {
  const auto column = band_column();
  const auto& rad = band_radiation();
  climate::EquilibriumSettings s = band_settings(state);
  s.time_marching_fallback = false;
  s.jacobian = climate::JacobianMethod::full_differences;
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::solve_equilibrium(column, rad, s);
  report_newton(state, r);
}
BENCHMARK(BM_BandRceNewtonFullDifferences)->ArgName("fixed_rh")->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond);

void BM_BandRceTimeMarching(benchmark::State& state) {
  const auto column = band_column();
  const auto& rad = band_radiation();
  const climate::EquilibriumSettings s = band_settings(state);
  climate::EquilibriumResult r;
  for (auto _ : state) r = climate::march_to_equilibrium(column, rad, s);
  report_march(state, r, column, rad, s);
}
BENCHMARK(BM_BandRceTimeMarching)->ArgName("fixed_rh")->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond);

} // namespace
