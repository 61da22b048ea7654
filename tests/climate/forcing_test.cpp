// Radiative forcing: instantaneous forcing of a grey isothermal atmosphere against the analytic
// two-stream solution, insolation forcing against energy conservation, doubled CO2 with the band
// radiation against Myhre et al. (1998) and the known effect of stratospheric adjustment.
#include "bandstack/climate/forcing.hpp"

#include <cmath>
#include <cstdio>
#include <gtest/gtest.h>

#include "bandstack/atmosphere/tropopause.hpp"
#include "bandstack/climate/perturbation.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/grey.hpp"
#include "climate/experiment_fixtures.hpp"

namespace cl = bandstack::climate;
namespace at = bandstack::atmosphere;
namespace fx = experiment_fixtures;
using bandstack::Gas;

namespace {

constexpr double sigma = bandstack::constants::stefan_boltzmann_w_m2_k4;

cl::Perturbation scale_co2(double factor) {
  cl::Perturbation p;
  p.name = "co2_x" + std::to_string(factor);
  p.gas_changes.push_back({Gas::co2, cl::GasChangeKind::scale, factor});
  return p;
}

at::Column perturbed(const at::Column& base, const cl::Perturbation& p, std::size_t tropopause) {
  at::Column c = base;
  cl::WaterSettings water;
  cl::apply_perturbation(p, tropopause, c, water);
  return c;
}

// Net downward flux (W m-2) at a level with optical depth tau_above above it and tau_below below
// it, for an isothermal grey atmosphere at temperature t over a black ground at ts, with one
// diffusivity angle: every intensity is B e^(-D tau) + B_atm (1 - e^(-D tau)) along the slant path
// (Pierrehumbert 2010, Principles of Planetary Climate, sec. 4.2, for an isothermal slab; from memory).
double isothermal_net_w_m2(double t, double ts, double tau_above, double tau_below) {
  const double d = fx::diffusivity;
  const double down = sigma * std::pow(t, 4) * (1.0 - std::exp(-d * tau_above));
  const double up =
      sigma * std::pow(ts, 4) * std::exp(-d * tau_below) + sigma * std::pow(t, 4) * (1.0 - std::exp(-d * tau_below));
  return down - up;
}

} // namespace

// Sanity check (not a physics check): a perturbation that changes nothing forces nothing.
TEST(Forcing, NoChangeGivesExactlyZero) {
  const at::Column base = fx::grey_column(30, 230.0, 290.0);
  const cl::NetHeating grey = fx::grey_radiation(0.05, 240.0);
  const cl::ForcingResult r = cl::compute_forcing(base, grey, base, grey, 12);
  EXPECT_EQ(r.toa_instantaneous_w_m2, 0.0);
  EXPECT_EQ(r.tropopause_instantaneous_w_m2, 0.0);
  EXPECT_EQ(r.adjusted_w_m2, 0.0);
  EXPECT_EQ(r.adjusted_toa_w_m2, 0.0);
  EXPECT_EQ(r.adjustment_iterations, 0);
  EXPECT_EQ(r.adjusted_temperature_layer_k, base.temperature_layer_k);
}

// Grey CO2 doubled in an isothermal atmosphere: the layers' optical depths double, and the
// instantaneous change of the net flux at the top and at the tropopause is the difference of the
// analytic isothermal-slab fluxes (no discretisation error: the source is constant).
TEST(Forcing, GreyIsothermalInstantaneousMatchesAnalytic) {
  const double t = 230.0, ts = 290.0; // chosen
  const std::size_t layers = 30, k = 12;
  const at::Column base = fx::grey_column(layers, t, ts);
  const cl::NetHeating grey = fx::grey_radiation(0.05, 240.0); // kappa chosen: tau ~ 0.3 for 400 ppmv
  const at::Column doubled = perturbed(base, scale_co2(2.0), k);
  bandstack::solvers::GreyOptics optics;
  optics.mass_absorption_m2_kg[bandstack::index(Gas::co2)] = 0.05;
  const std::vector<double> tau = bandstack::solvers::grey_optical_depth(base, optics);
  double above = 0.0, total = 0.0;
  for (std::size_t i = 0; i < layers; ++i) {
    total += tau[i];
    if (i < k) above += tau[i];
  }
  const cl::ForcingResult r = cl::compute_forcing(base, grey, doubled, grey, k);
  const double toa = isothermal_net_w_m2(t, ts, 0.0, 2.0 * total) - isothermal_net_w_m2(t, ts, 0.0, total);
  const double trop =
      isothermal_net_w_m2(t, ts, 2.0 * above, 2.0 * (total - above)) - isothermal_net_w_m2(t, ts, above, total - above);
  std::printf("grey isothermal 2xCO2 (tau %.3f): TOA %.4f (analytic %.4f), tropopause %.4f (analytic %.4f), "
              "adjusted %.4f W m-2 in %d iterations\n",
              total, r.toa_instantaneous_w_m2, toa, r.tropopause_instantaneous_w_m2, trop, r.adjusted_w_m2,
              r.adjustment_iterations);
  EXPECT_NEAR(r.toa_instantaneous_w_m2, toa, 1e-6 * std::abs(toa));
  EXPECT_NEAR(r.tropopause_instantaneous_w_m2, trop, 1e-6 * std::abs(trop));
  // Fixed dynamical heating: once the stratosphere's heating is back to its base value, the change
  // of the net flux is the same at its top and its bottom (energy conservation of the layers).
  EXPECT_NEAR(r.adjusted_toa_w_m2, r.adjusted_w_m2, 0.02);
}

// Sunlight absorbed only by the ground: scaling the insolation by s changes the net flux at every
// level by (s - 1) S exactly (energy conservation), and the longwave heating of the stratosphere does
// not change, so the adjustment does nothing.
TEST(Forcing, InsolationForcingIsExactWithSurfaceAbsorption) {
  const double s = 1.02, absorbed = 240.0; // chosen
  const at::Column base = fx::grey_column(30, 230.0, 290.0);
  const cl::ForcingResult r =
      cl::compute_forcing(base, fx::grey_radiation(0.05, absorbed), base, fx::grey_radiation(0.05, s * absorbed), 10);
  const double expected = (s - 1.0) * absorbed;
  EXPECT_NEAR(r.toa_instantaneous_w_m2, expected, 1e-9);
  EXPECT_NEAR(r.tropopause_instantaneous_w_m2, expected, 1e-9);
  EXPECT_NEAR(r.adjusted_w_m2, expected, 1e-9);
  EXPECT_EQ(r.adjustment_iterations, 0);
}

// Doubled CO2 (280 -> 560 ppmv) on the U.S. Standard Atmosphere 1976 column with the band radiation.
TEST(Forcing, DoubledCo2BandRadiation) {
  at::Column base = fx::us_standard_column(36);
  for (double& x : base.gas(Gas::co2))
    x = 280e-6; // pre-industrial (Myhre et al. 1998 use C0 = 278 ppmv)
  const cl::NetHeating radiation = fx::band_radiation();
  const std::size_t k = at::lapse_rate_tropopause_level(base);
  const cl::ForcingResult r = cl::compute_forcing(base, radiation, perturbed(base, scale_co2(2.0), k), radiation, k);
  std::printf("US 1976, 36 layers, tropopause level %zu (%.0f Pa): 2xCO2 TOA %.3f, tropopause %.3f, adjusted %.3f "
              "(at the top %.4f) W m-2; %d iterations, %ld radiative calls\n",
              k, base.pressure_level_pa[k], r.toa_instantaneous_w_m2, r.tropopause_instantaneous_w_m2, r.adjusted_w_m2,
              r.adjusted_toa_w_m2, r.adjustment_iterations, r.radiative_calls);
  for (std::size_t i = 0; i < k; i += 4)
    std::printf("  layer %2zu  %8.1f Pa  dT %+.2f K\n", i, base.pressure_layer_pa[i],
                r.adjusted_temperature_layer_k[i] - base.temperature_layer_k[i]);
  // Myhre et al. 1998 (GRL 25, 2715, Table 3): adjusted forcing 5.35 ln 2 = 3.71 W m-2, global mean
  // with clouds. Clouds mask part of the CO2 forcing, so a clear column forces more: 15-25 % more
  // (from memory; docs/physics.md takes 1.25 for the minor gases), and one mid-latitude column
  // standing for the globe adds ~10 % either way (docs/physics.md's table: tropical TOA forcing 24 %
  // above US 1976, high-latitude winter 33 % below). Window: 1.0-1.35 x 3.71 W m-2.
  EXPECT_GT(r.adjusted_w_m2, 3.71);
  EXPECT_LT(r.adjusted_w_m2, 1.35 * 3.71);
  // Instantaneous TOA forcing: about half the tropopause forcing for CO2, because the warmer
  // stratosphere emits more to space when CO2 is added (Hansen et al. 1997, JGR 102, 6831;
  // from memory); clear-sky line-by-line values of 2-3 W m-2 for standard columns (Collins et al.
  // 2006, JGR 111, D14317; from memory).
  EXPECT_GT(r.toa_instantaneous_w_m2, 2.0);
  EXPECT_LT(r.toa_instantaneous_w_m2, 3.5);
  // Stratospheric adjustment: the stratosphere cools (Manabe & Wetherald 1967, J. Atmos. Sci. 24,
  // 241; Fels et al. 1980), which lowers its emission, so the adjusted forcing lies between the
  // instantaneous TOA and tropopause forcings (Hansen et al. 1997; from memory).
  for (std::size_t i = 0; i < k; ++i) {
    if (base.pressure_layer_pa[i] < 1000.0) {
      EXPECT_LT(r.adjusted_temperature_layer_k[i], base.temperature_layer_k[i] - 1.0) << "layer " << i;
    }
  }
  EXPECT_GT(r.adjusted_w_m2, r.toa_instantaneous_w_m2 + 0.5);
  EXPECT_LT(r.adjusted_w_m2, r.tropopause_instantaneous_w_m2);
  // Consistency of the converged adjustment (fixed dynamical heating, see the grey test).
  EXPECT_NEAR(r.adjusted_toa_w_m2, r.adjusted_w_m2, 0.02);
  for (std::size_t i = k; i < base.layer_count(); ++i)
    EXPECT_EQ(r.adjusted_temperature_layer_k[i], base.temperature_layer_k[i]);
}

TEST(Forcing, InputErrors) {
  const at::Column base = fx::grey_column(10, 230.0, 290.0);
  const cl::NetHeating grey = fx::grey_radiation(0.05, 240.0);
  EXPECT_THROW((void)cl::compute_forcing(base, grey, base, grey, 0), bandstack::InputError);
  EXPECT_THROW((void)cl::compute_forcing(base, grey, base, grey, 10), bandstack::InputError);
  EXPECT_THROW((void)cl::compute_forcing(base, grey, fx::grey_column(11, 230.0, 290.0), grey, 5),
               bandstack::InputError);
  EXPECT_THROW((void)cl::compute_forcing(base, grey, base, cl::NetHeating{}, 5), bandstack::InputError);
  cl::AdjustmentSettings s;
  s.max_step_k = 0.0;
  EXPECT_THROW((void)cl::compute_forcing(base, grey, base, grey, 5, s), bandstack::InputError);
}

// An adjustment that cannot converge in the steps allowed is an error naming the residual.
TEST(Forcing, NonConvergenceIsAnError) {
  const at::Column base = fx::grey_column(30, 230.0, 290.0);
  const cl::NetHeating grey = fx::grey_radiation(0.05, 240.0);
  cl::AdjustmentSettings s;
  s.max_iterations = 1;
  s.max_step_k = 0.01;
  try {
    (void)cl::compute_forcing(base, grey, perturbed(base, scale_co2(4.0), 12), grey, 12, s);
    FAIL() << "expected ConvergenceError";
  } catch (const bandstack::ConvergenceError& e) {
    EXPECT_NE(std::string(e.what()).find("K/day"), std::string::npos) << e.what();
  }
}
