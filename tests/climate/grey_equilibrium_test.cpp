// Equilibrium of grey columns: radiative equilibrium against the analytic two-stream solution,
// radiative-convective equilibrium on the critical lapse rate, Newton's iteration count, failures.
#include "bandstack/climate/equilibrium.hpp"

#include <cmath>
#include <cstdio>
#include <gtest/gtest.h>

#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"

namespace cl = bandstack::climate;
namespace at = bandstack::atmosphere;
namespace bs = bandstack::solvers;
namespace constants = bandstack::constants;

namespace {

constexpr double sigma = constants::stefan_boltzmann_w_m2_k4;
constexpr double diffusivity = 1.66;    // Elsasser (1942) diffusivity factor (common practice)
constexpr double absorbed_solar = 240.0; // W m-2, chosen (near Earth's absorbed solar)
constexpr double surface_pressure = 100000.0;

// A dry isothermal column on a log-pressure grid; grey optical depth proportional to pressure.
at::Column isothermal_column(std::size_t layers, double t_k) {
  at::Column c;
  c.name = "grey";
  c.pressure_level_pa = at::level_pressures_pa(at::GridSpec{layers, 10.0, surface_pressure, at::Spacing::log_pressure});
  c.pressure_layer_pa = at::layer_pressures_pa(c.pressure_level_pa);
  c.temperature_layer_k.assign(layers, t_k);
  c.temperature_level_k.assign(layers + 1, t_k);
  for (auto& x : c.mole_fraction) x.assign(layers, 0.0);
  c.surface_temperature_k = t_k;
  return c;
}

cl::NetHeating grey(double tau_surface) {
  bs::GreyOptics optics;
  optics.extra_tau_per_pa = tau_surface / surface_pressure;
  return cl::grey_net_heating(optics, bs::diffusivity_quadrature(diffusivity), absorbed_solar);
}

} // namespace

// Two-stream grey radiative equilibrium (Pierrehumbert 2010, Principles of Planetary Climate,
// ch. 4; from memory): sigma T^4(tau) = (OLR/2)(1 + D tau), OLR = absorbed solar, and the ground
// sigma Ts^4 = sigma T^4(tau_s) + OLR/2.
TEST(GreyEquilibrium, RadiativeMatchesTwoStreamSolution) {
  const double tau_s = 2.0; // chosen
  cl::EquilibriumSettings s;
  s.convection.kind = cl::ConvectionKind::none;
  s.time_marching_fallback = false;
  const cl::EquilibriumResult r = cl::solve_equilibrium(isothermal_column(60, 250.0), grey(tau_s), s);
  ASSERT_TRUE(r.converged);
  EXPECT_LE(std::abs(r.toa_net_w_m2), 0.01);
  double worst = 0.0;
  for (std::size_t i = 0; i < 60; ++i) {
    const double tau = tau_s * r.column.pressure_layer_pa[i] / surface_pressure;
    const double analytic = std::pow(absorbed_solar / 2.0 * (1.0 + diffusivity * tau) / sigma, 0.25);
    worst = std::max(worst, std::abs(r.column.temperature_layer_k[i] - analytic));
  }
  const double ground = std::pow((absorbed_solar / 2.0 * (1.0 + diffusivity * tau_s) + absorbed_solar / 2.0) / sigma, 0.25);
  std::printf("grey RE: %d Newton iterations, %ld radiative calls, max |T - analytic| = %.4f K, "
              "Ts - analytic = %.4f K\n", r.newton_iterations, r.radiative_calls, worst,
              r.column.surface_temperature_k - ground);
  // Discretisation: levels are interpolated linearly in ln p between layer centres; the error of
  // linear interpolation, (d ln p)^2 / 8 |d2T/d(ln p)^2|, with d ln p = 0.154 and, for T^4 linear in
  // p, |d2T/d(ln p)^2| <= 25 K near the ground (tau_s = 2), is <= 0.075 K; doubled for the
  // extrapolated end levels.
  EXPECT_LT(worst, 0.15);
  EXPECT_NEAR(r.column.surface_temperature_k, ground, 0.1);
}

TEST(GreyEquilibrium, RadiativeConvectiveTroposphereOnCriticalLapseRate) {
  cl::EquilibriumSettings s; // 6.5 K/km, surface energy balance
  s.time_marching_fallback = false;
  const cl::EquilibriumResult r = cl::solve_equilibrium(isothermal_column(60, 250.0), grey(4.0), s);
  std::printf("grey RCE 60 layers from isothermal: %d Newton iterations, %ld radiative calls, Ts = %.3f K, "
              "convective top %.0f Pa, TOA net %.2e W m-2\n", r.newton_iterations, r.radiative_calls,
              r.column.surface_temperature_k, r.convective_top_pressure_pa(), r.toa_net_w_m2);
  // Issue 5: from an isothermal start, RCE of a 60-layer column in at most 15 Newton iterations.
  EXPECT_LE(r.newton_iterations, 15);
  // Broyden (1965) updates between differenced Jacobians: one full forward-difference Jacobian of
  // the 61 unknowns (61 calls), the starting evaluation, and at most 15 steps of two trials each
  // (a step and one halving) bound the work: 61 + 1 + 2 * 15 = 92 calls (measured: 18 with the grouped
  // Jacobian, 7 calls per Jacobian). A Jacobian
  // differenced every step, as before, needs more than 300.
  EXPECT_LE(r.radiative_calls, 61 + 1 + 2 * 15);
  EXPECT_LE(std::abs(r.toa_net_w_m2), 0.01);
  EXPECT_LE(r.max_radiative_heating_k_day, 1e-3);
  std::size_t convective = 0;
  const double rd = constants::gas_constant_dry_air_j_kg_k, g = constants::standard_gravity_m_s2;
  for (std::size_t i = 0; i + 1 < 60; ++i) {
    if (!r.convective[i]) continue;
    ++convective;
    // Hypsometric equation with the log-mean layer temperature, exact for a temperature linear in
    // height (Wallace & Hobbs 2006, Atmospheric Science, sec. 3.2; from memory).
    const double t1 = r.column.temperature_layer_k[i], t2 = r.column.temperature_layer_k[i + 1];
    const double dz = rd * (t2 - t1) / std::log(t2 / t1) / g * std::log(r.column.pressure_layer_pa[i + 1] / r.column.pressure_layer_pa[i]);
    EXPECT_NEAR((t2 - t1) / dz, 6.5e-3, 1e-9) << "layer " << i;
  }
  EXPECT_GT(convective, 5u);
  // Above the convective region the column is stable (no layer colder than the critical profile).
  for (std::size_t i = 0; i + 1 < 60; ++i) {
    if (!r.convective[i]) {
      EXPECT_GE(r.column.temperature_layer_k[i] + 1e-9,
                r.column.temperature_layer_k[i + 1] * std::pow(r.column.pressure_layer_pa[i] / r.column.pressure_layer_pa[i + 1], rd * 6.5e-3 / g))
          << "layer " << i;
    }
  }
}

TEST(GreyEquilibrium, TimeMarchingReachesTheSameState) {
  cl::EquilibriumSettings s;
  s.time_marching_fallback = false;
  const at::Column start = isothermal_column(20, 250.0);
  const cl::EquilibriumResult newton = cl::solve_equilibrium(start, grey(4.0), s);
  const cl::EquilibriumResult march = cl::march_to_equilibrium(start, grey(4.0), s);
  std::printf("20 layers: Newton %ld calls, time marching %ld calls (%ld steps)\n", newton.radiative_calls,
              march.radiative_calls, march.time_steps);
  EXPECT_NEAR(march.column.surface_temperature_k, newton.column.surface_temperature_k, 0.05);
}

TEST(GreyEquilibrium, NonConvergenceIsAnError) {
  cl::EquilibriumSettings s;
  s.max_newton_iterations = 1;
  s.time_marching_fallback = false;
  EXPECT_THROW((void)cl::solve_equilibrium(isothermal_column(60, 250.0), grey(4.0), s), bandstack::ConvergenceError);
  s.time_marching_fallback = true;
  s.marching.max_steps = 3;
  try {
    (void)cl::solve_equilibrium(isothermal_column(60, 250.0), grey(4.0), s);
    FAIL() << "expected ConvergenceError";
  } catch (const bandstack::ConvergenceError& e) {
    EXPECT_NE(std::string(e.what()).find("did not converge"), std::string::npos) << e.what();
  }
}
