// Experiments on a base state: the insolation experiment of a grey radiative-convective equilibrium
// against its analytic scaling, the choice of tropopause, a do-nothing experiment, error messages,
// and doubled CO2 with the band radiation against Manabe & Wetherald (1967).
#include "bandstack/climate/experiment.hpp"

#include <cmath>
#include <cstdio>
#include <gtest/gtest.h>
#include <string>

#include "bandstack/atmosphere/tropopause.hpp"
#include "bandstack/core/error.hpp"
#include "climate/experiment_fixtures.hpp"

namespace cl = bandstack::climate;
namespace at = bandstack::atmosphere;
namespace fx = experiment_fixtures;
using bandstack::Gas;

namespace {

constexpr double absorbed_solar = 240.0; // W m-2, chosen (near Earth's absorbed solar)
constexpr double kappa_co2 = 0.25;       // m2 kg-1, chosen: grey optical depth ~ 1.5 at 400 ppmv

cl::BaseState grey_equilibrium(const cl::EquilibriumSettings& s) {
  cl::BaseState base;
  base.equilibrium =
      cl::solve_equilibrium(fx::grey_column(40, 250.0, 288.0), fx::grey_radiation(kappa_co2, absorbed_solar), s);
  base.column = base.equilibrium->column;
  return base;
}

cl::EquilibriumSettings rce_settings() {
  cl::EquilibriumSettings s; // 6.5 K/km, surface energy balance, water at fixed mixing ratio
  s.time_marching_fallback = false;
  return s;
}

} // namespace

// Grey radiation with sunlight absorbed only by the ground, and a critical profile T = Ts (p/ps)^c:
// every flux is linear in sigma T^4 and the convective profile is linear in Ts, so multiplying the
// insolation by s multiplies every equilibrium temperature by s^(1/4) (the grey two-stream
// equilibrium, Pierrehumbert 2010, Principles of Planetary Climate, ch. 4, scales so; the
// effective temperature goes as S^(1/4) by Stefan-Boltzmann). The instantaneous forcing is
// (s - 1) S at every level (energy conservation) and the stratosphere, transparent to sunlight,
// does not adjust.
TEST(Experiment, GreyInsolationFollowsQuarterPowerLaw) {
  const cl::EquilibriumSettings s = rce_settings();
  const cl::BaseState base = grey_equilibrium(s);
  const double scale = 1.02; // chosen
  cl::Perturbation p;
  p.name = "brighter_sun";
  p.insolation_scale = scale;
  const cl::ExperimentResult r = cl::run_experiment(base, fx::grey_radiation(kappa_co2, absorbed_solar),
                                                    fx::grey_radiation(kappa_co2, scale * absorbed_solar), p, s);
  const double ts = base.column.surface_temperature_k;
  const double expected = ts * (std::pow(scale, 0.25) - 1.0);
  std::printf("grey RCE: Ts %.3f K, tropopause level %zu (%.0f Pa), dTs %.5f K (analytic %.5f); planck %.3f, lapse "
              "rate %.3f, stratosphere %.3f, water %.3f, total %.3f, residual %.4f W m-2 K-1\n",
              ts, r.tropopause_level, base.column.pressure_level_pa[r.tropopause_level], r.surface_temperature_change_k,
              expected, r.feedbacks.planck_w_m2_k, r.feedbacks.lapse_rate_w_m2_k,
              r.feedbacks.stratospheric_temperature_w_m2_k, r.feedbacks.water_vapour_w_m2_k, r.feedbacks.total_w_m2_k,
              r.feedbacks.residual_w_m2_k);
  EXPECT_NEAR(r.forcing.toa_instantaneous_w_m2, (scale - 1.0) * absorbed_solar, 1e-9);
  EXPECT_NEAR(r.forcing.tropopause_instantaneous_w_m2, (scale - 1.0) * absorbed_solar, 1e-9);
  EXPECT_NEAR(r.forcing.adjusted_w_m2, (scale - 1.0) * absorbed_solar, 1e-9);
  ASSERT_TRUE(r.equilibrium.has_value());
  // Equilibria converge to 0.01 W m-2 of TOA imbalance: dTs = Ts dN / (4 OLR) ~ 3e-3 K.
  EXPECT_NEAR(r.surface_temperature_change_k, expected, 0.01);
  for (std::size_t i = 0; i < base.column.layer_count(); ++i)
    EXPECT_NEAR(r.equilibrium->column.temperature_layer_k[i],
                std::pow(scale, 0.25) * base.column.temperature_layer_k[i], 0.02)
        << "layer " << i;
  EXPECT_TRUE(std::isnan(r.warming_per_co2_doubling_k)); // not a CO2 experiment
  // The feedback parameter is -F/dTs by definition; here that is -4 S / Ts to first order in s - 1.
  EXPECT_NEAR(r.feedbacks.total_w_m2_k, -4.0 * absorbed_solar / ts, 0.02 * 4.0 * absorbed_solar / ts);
  // Every temperature changes in proportion to itself: less warming aloft than at the ground, a
  // positive lapse-rate term; the stratosphere warms and radiates more, a negative term; no water.
  EXPECT_LT(r.feedbacks.planck_w_m2_k, 0.0);
  EXPECT_GT(r.feedbacks.lapse_rate_w_m2_k, 0.0);
  EXPECT_LT(r.feedbacks.stratospheric_temperature_w_m2_k, 0.0);
  EXPECT_EQ(r.feedbacks.water_vapour_w_m2_k, 0.0);
  // Only the temperature fields change, and PRP decomposes the TOA response to first order; the
  // two-sided average leaves a second-order residual (Colman & McAvaney 1997; from memory).
  EXPECT_LT(std::abs(r.feedbacks.residual_w_m2_k), 0.02 * std::abs(r.feedbacks.total_w_m2_k));
}

// Sanity check (not a physics check): an experiment that changes nothing forces nothing and
// does not move the equilibrium beyond its tolerance; feedbacks are undefined.
TEST(Experiment, NothingChangedGivesZero) {
  const cl::EquilibriumSettings s = rce_settings();
  const cl::BaseState base = grey_equilibrium(s);
  const cl::NetHeating grey = fx::grey_radiation(kappa_co2, absorbed_solar);
  cl::Perturbation p;
  p.name = "nothing";
  const cl::ExperimentResult r = cl::run_experiment(base, grey, grey, p, s);
  EXPECT_EQ(r.forcing.toa_instantaneous_w_m2, 0.0);
  EXPECT_EQ(r.forcing.adjusted_w_m2, 0.0);
  ASSERT_TRUE(r.equilibrium.has_value());
  // The restarted solver may take one more step inside the tolerance: 0.01 W m-2 of imbalance is
  // dTs = Ts dN / (4 OLR) ~ 3e-3 K; below 1e-3 K no feedbacks are computed.
  EXPECT_LT(std::abs(r.surface_temperature_change_k), 1e-3);
  EXPECT_TRUE(std::isnan(r.feedbacks.planck_w_m2_k));
  EXPECT_TRUE(std::isnan(r.feedbacks.total_w_m2_k));
}

// The tropopause of an equilibrium with convection is the top of its convective region (Manabe &
// Wetherald 1967); of a column without one, the lapse-rate tropopause.
TEST(Experiment, TropopauseChoice) {
  const cl::EquilibriumSettings s = rce_settings();
  const cl::BaseState base = grey_equilibrium(s);
  const cl::NetHeating grey = fx::grey_radiation(kappa_co2, absorbed_solar);
  cl::Perturbation p;
  p.name = "co2_x2";
  p.gas_changes.push_back({Gas::co2, cl::GasChangeKind::scale, 2.0});
  std::size_t top = base.column.layer_count();
  while (top > 0 && base.equilibrium->convective[top - 1])
    --top;
  ASSERT_LT(top, base.column.layer_count());
  EXPECT_EQ(cl::run_experiment(base, grey, grey, p, s).tropopause_level, top);

  cl::BaseState column_only;
  column_only.column = fx::us_standard_column(30);
  const std::size_t expected = at::lapse_rate_tropopause_level(column_only.column);
  EXPECT_EQ(cl::run_experiment(column_only, grey, grey, p, s).tropopause_level, expected);
}

TEST(Experiment, ErrorsNameTheExperiment) {
  cl::EquilibriumSettings s = rce_settings();
  const cl::BaseState base = grey_equilibrium(s);
  const cl::NetHeating grey = fx::grey_radiation(kappa_co2, absorbed_solar);
  cl::Perturbation bad;
  bad.name = "dimmer";
  bad.insolation_scale = -1.0;
  try {
    (void)cl::run_experiment(base, grey, grey, bad, s);
    FAIL() << "expected InputError";
  } catch (const bandstack::InputError& e) {
    EXPECT_EQ(e.place().item, "insolation_scale");
    EXPECT_NE(std::string(e.what()).find("dimmer"), std::string::npos) << e.what();
  }
  cl::Perturbation p;
  p.name = "co2_x4";
  p.gas_changes.push_back({Gas::co2, cl::GasChangeKind::scale, 4.0});
  try {
    (void)cl::run_experiment(base, grey, cl::NetHeating{}, p, s);
    FAIL() << "expected InputError";
  } catch (const bandstack::InputError& e) {
    EXPECT_EQ(e.place().item, "radiation");
    EXPECT_NE(std::string(e.what()).find("co2_x4"), std::string::npos) << e.what();
  }
  s.max_newton_iterations = 1;
  try {
    (void)cl::run_experiment(base, grey, grey, p, s);
    FAIL() << "expected ConvergenceError";
  } catch (const bandstack::ConvergenceError& e) {
    EXPECT_NE(std::string(e.what()).find("experiment 'co2_x4'"), std::string::npos) << e.what();
  }
}

namespace {

// Doubled CO2 (280 -> 560 ppmv) on the radiative-convective equilibrium (6.5 K/km) of the U.S.
// Standard column (40 layers) with the band radiation.
cl::ExperimentResult doubled_co2(cl::WaterTreatment treatment, cl::BaseState& base) {
  at::Column start = fx::us_standard_column(40);
  for (double& x : start.gas(Gas::co2))
    x = 280e-6;
  cl::EquilibriumSettings s = rce_settings();
  s.water.treatment = treatment;
  const cl::NetHeating radiation = fx::band_radiation();
  base.equilibrium = cl::solve_equilibrium(start, radiation, s);
  base.column = base.equilibrium->column;
  cl::Perturbation p;
  p.name = "doubled_co2";
  p.gas_changes.push_back({Gas::co2, cl::GasChangeKind::scale, 2.0});
  const cl::ExperimentResult r = cl::run_experiment(base, radiation, radiation, p, s);
  const cl::FeedbackTerms& f = r.feedbacks;
  std::printf("2xCO2 RCE (%s): Ts %.2f K, tropopause %.0f Pa; forcing TOA %.3f, tropopause %.3f, adjusted %.3f W m-2; "
              "dTs %.3f K; planck %.3f, lapse rate %.3f, water vapour %.3f, stratosphere %.3f, total %.3f, "
              "residual %.3f W m-2 K-1\n",
              treatment == cl::WaterTreatment::fixed_relative_humidity ? "fixed RH" : "fixed mixing ratio",
              base.column.surface_temperature_k, base.column.pressure_level_pa[r.tropopause_level],
              r.forcing.toa_instantaneous_w_m2, r.forcing.tropopause_instantaneous_w_m2, r.forcing.adjusted_w_m2,
              r.surface_temperature_change_k, f.planck_w_m2_k, f.lapse_rate_w_m2_k, f.water_vapour_w_m2_k,
              f.stratospheric_temperature_w_m2_k, f.total_w_m2_k, f.residual_w_m2_k);
  return r;
}

void check_common(const cl::ExperimentResult& r, const cl::BaseState& base) {
  ASSERT_TRUE(r.equilibrium.has_value());
  EXPECT_EQ(r.warming_per_co2_doubling_k, r.surface_temperature_change_k); // one doubling
  // Equilibrium: F + (sum of terms) dTs = 0, so the terms must account for the feedback parameter
  // -F/dTs up to the nonlinearity PRP leaves (brief: under 15 %).
  EXPECT_NEAR(r.feedbacks.total_w_m2_k, -r.forcing.adjusted_w_m2 / r.surface_temperature_change_k, 1e-12);
  EXPECT_LT(std::abs(r.feedbacks.residual_w_m2_k), 0.15 * std::abs(r.feedbacks.total_w_m2_k));
  // Planck term: Soden & Held 2006 (J. Climate 19, 3354, Table 1) -3.2 W m-2 K-1 global mean with
  // clouds; clear skies emit from warmer levels and respond more strongly, and -4 OLR / T with
  // clear-sky OLR ~265 W m-2 (Kiehl & Trenberth 1997) and emission from 255-288 K gives -3.7 to
  // -4.2: window [-4.2, -3.2].
  EXPECT_LT(r.feedbacks.planck_w_m2_k, -3.2);
  EXPECT_GT(r.feedbacks.planck_w_m2_k, -4.2);
  // The stratosphere above 10 hPa cools in the new equilibrium (Manabe & Wetherald 1967).
  double cooling = 0.0;
  int layers = 0;
  for (std::size_t i = 0; i < base.column.layer_count(); ++i) {
    if (base.column.pressure_layer_pa[i] < 1000.0) {
      cooling += base.column.temperature_layer_k[i] - r.equilibrium->column.temperature_layer_k[i];
      ++layers;
    }
  }
  EXPECT_GT(cooling / layers, 1.0);
}

} // namespace

// Manabe & Wetherald 1967 (J. Atmos. Sci. 24, 241, Table 5; from memory): doubling CO2 (300 -> 600
// ppmv) warms the surface of their radiative-convective model by 1.33 K with fixed absolute
// humidity and 2.36 K with fixed relative humidity; the water-vapour feedback amplifies the
// warming by ~1.8. Our forcing and column differ (clear sky, one column, idealised bands), so the
// checks are the windows dTs(RH) in [1.5, 3.5] K and the amplification in [1.3, 2.3].
TEST(Experiment, DoubledCo2BandRadiation) {
  cl::BaseState base_mr, base_rh;
  const cl::ExperimentResult mr = doubled_co2(cl::WaterTreatment::fixed_mole_fraction, base_mr);
  const cl::ExperimentResult rh = doubled_co2(cl::WaterTreatment::fixed_relative_humidity, base_rh);
  check_common(mr, base_mr);
  check_common(rh, base_rh);
  // Water at a fixed mixing ratio does not change: its term is exactly 0; at fixed relative
  // humidity the warmer air holds more water, which traps more longwave: a positive term.
  EXPECT_EQ(mr.feedbacks.water_vapour_w_m2_k, 0.0);
  EXPECT_GT(rh.feedbacks.water_vapour_w_m2_k, 0.0);
  EXPECT_GT(rh.surface_temperature_change_k, 1.5);
  EXPECT_LT(rh.surface_temperature_change_k, 3.5);
  const double amplification = rh.surface_temperature_change_k / mr.surface_temperature_change_k;
  EXPECT_GT(amplification, 1.3);
  EXPECT_LT(amplification, 2.3);
}
