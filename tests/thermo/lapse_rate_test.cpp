#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/hydrostatics.hpp"
#include "bandstack/thermo/lapse_rate.hpp"
#include "bandstack/thermo/saturation.hpp"

#include <algorithm>
#include <cmath>
#include <gtest/gtest.h>
#include <vector>

namespace {

using namespace bandstack::thermo;
namespace constants = bandstack::constants;
constexpr double g0 = constants::standard_gravity_m_s2;
constexpr double r_d = constants::gas_constant_dry_air_j_kg_k;
constexpr double c_pd = constants::specific_heat_dry_air_j_kg_k;

// Bolton (1980), Mon. Wea. Rev. 108: e_s eq. (10) in Pa and, for saturated air (T_L = T), the
// pseudo-adiabatic equivalent potential temperature eq. (43), r in g/kg, p in hPa.
double bolton_theta_e_saturated_k(double t_k, double p_pa) {
  const double t_c = t_k - 273.15;
  const double e_hpa = 6.112 * std::exp(17.67 * t_c / (t_c + 243.5));
  const double p_hpa = p_pa / 100.0;
  const double r = 622.0 * e_hpa / (p_hpa - e_hpa);
  return t_k * std::pow(1000.0 / p_hpa, 0.2854 * (1.0 - 0.28e-3 * r)) *
         std::exp((3.376 / t_k - 0.00254) * r * (1.0 + 0.81e-3 * r));
}

// Temperature at p where Bolton's theta_e equals the target (bisection; theta_e rises with T).
double bolton_pseudoadiabat_k(double theta_e_k, double p_pa) {
  double lo = 150.0, hi = 330.0;
  for (int i = 0; i < 100; ++i) {
    const double mid = 0.5 * (lo + hi);
    (bolton_theta_e_saturated_k(mid, p_pa) < theta_e_k ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

// Dry adiabatic lapse rate g / c_pd (analytic); 9.76 K/km with c_pd = 1004.64 (AMS Glossary,
// "adiabatic lapse rate": about 9.8 K/km).
TEST(LapseRate, DryIsGravityOverHeatCapacity) {
  EXPECT_DOUBLE_EQ(dry_adiabatic_lapse_rate_k_m(g0), g0 / c_pd);
  EXPECT_NEAR(dry_adiabatic_lapse_rate_k_m(g0) * 1e3, 9.76, 0.005);
  EXPECT_NEAR(dry_adiabatic_lapse_rate_k_m(3.71) / dry_adiabatic_lapse_rate_k_m(g0), 3.71 / g0, 1e-15);
}

// Bolton (1980) eq. (2): L_v = (2.501 - 0.00237 T_c) 1e6 J/kg.
TEST(LapseRate, LatentHeatFollowsBolton) {
  EXPECT_DOUBLE_EQ(latent_heat_vaporisation_j_kg(273.15), 2.501e6);
  EXPECT_NEAR(latent_heat_vaporisation_j_kg(303.15), 2.4299e6, 1.0);
}

// Saturated-adiabatic lapse rate at 1000 hPa, K/km, as printed to 0.1 K/km in textbook tables
// (e.g. Smithsonian Meteorological Tables, List 1951; from memory): -40 degC 9.5, -20 degC 8.6,
// 0 degC 6.4, 20 degC 4.3, 40 degC 3.0. Tolerance 0.1 K/km: the tables' rounding plus differences
// in constants.
TEST(LapseRate, MoistMatchesTabulatedValuesAt1000hPa) {
  const struct { double t_c, lapse_k_km; } table[] = {{-40.0, 9.5}, {-20.0, 8.6}, {0.0, 6.4}, {20.0, 4.3}, {40.0, 3.0}};
  for (const auto& row : table) {
    EXPECT_NEAR(moist_pseudoadiabatic_lapse_rate_k_m(row.t_c + 273.15, 1e5, g0) * 1e3, row.lapse_k_km, 0.1)
        << "T = " << row.t_c << " degC";
  }
}

// AMS Glossary, "pseudoadiabatic lapse rate": usually within 1 percent of the approximate
// moist-adiabatic lapse rate Γ_m = g (1 + L r / (R_d T)) / (c_pd + L² r eps / (R_d T²)) (same L, r).
// The terms Γ_m drops are of relative order r, so in very moist air (r > 1%) allow r instead of 1%.
TEST(LapseRate, MoistWithinOnePercentOfGlossaryApproximation) {
  const double eps = constants::molar_mass_h2o_kg_mol / constants::molar_mass_dry_air_kg_mol;
  for (double p : {100000.0, 70000.0, 50000.0}) {
    for (double t : {250.0, 270.0, 285.0, 295.0}) {
      const double e = saturation_vapour_pressure_liquid_pa(t);
      const double r = eps * e / (p - e);
      const double l = latent_heat_vaporisation_j_kg(t);
      const double approx = g0 * (1.0 + l * r / (r_d * t)) / (c_pd + l * l * r * eps / (r_d * t * t));
      EXPECT_NEAR(moist_pseudoadiabatic_lapse_rate_k_m(t, p, g0) / approx, 1.0, std::max(0.01, r))
          << t << " K, " << p << " Pa";
    }
  }
}

// Cold limit: the saturation mixing ratio vanishes, so the moist rate approaches g / c_pd
// (analytic); below 123 K it is exactly the dry rate. Warmer air always cools more slowly.
TEST(LapseRate, MoistApproachesDryWhenCold) {
  const double dry = dry_adiabatic_lapse_rate_k_m(g0);
  EXPECT_NEAR(moist_pseudoadiabatic_lapse_rate_k_m(180.0, 10000.0, g0) / dry, 1.0, 1e-3);
  EXPECT_NEAR(moist_pseudoadiabatic_lapse_rate_k_m(150.0, 10000.0, g0) / dry, 1.0, 1e-6);
  EXPECT_DOUBLE_EQ(moist_pseudoadiabatic_lapse_rate_k_m(120.0, 10000.0, g0), dry);
  double previous = dry;
  for (double t = 200.0; t < 330.0; t += 5.0) {
    const double lapse = moist_pseudoadiabatic_lapse_rate_k_m(t, 1e5, g0);
    EXPECT_LT(lapse, previous) << t;
    previous = lapse;
  }
}

// RK4 is fourth order: halving the step divides the error by ~16; the default step is within
// 1e-6 K of a 16x finer integration (1000 -> 100 hPa, warm tropical start).
TEST(LapseRate, PseudoadiabatConvergesWithStepCount) {
  const double t0 = 303.15, p0 = 1e5, p = 1e4;
  const double reference = moist_pseudoadiabat_temperature_k(t0, p0, p, 2000);
  const double e20 = moist_pseudoadiabat_temperature_k(t0, p0, p, 20) - reference;
  const double e40 = moist_pseudoadiabat_temperature_k(t0, p0, p, 40) - reference;
  EXPECT_GT(std::abs(e20 / e40), 12.0);
  EXPECT_LT(std::abs(e20 / e40), 20.0);
  const double default_steps = moist_pseudoadiabat_temperature_k(t0, p0, p);
  EXPECT_NEAR(default_steps, reference, 1e-6);
  // Reversible path: going back down returns the start.
  EXPECT_NEAR(moist_pseudoadiabat_temperature_k(default_steps, p, p0), t0, 1e-6);
  EXPECT_EQ(moist_pseudoadiabat_temperature_k(t0, p0, p0), t0);
}

// Consistency with the lapse rate through the hypsometric equation: lay the pseudo-adiabat on thin
// layers, get their heights, and compare -dT/dz per layer with the lapse rate at the layer middle
// (second-order differences on 0.2% thin layers: agreement to 1e-4 relative).
TEST(LapseRate, PseudoadiabatMatchesLapseRateWithHeight) {
  const int n = 800;
  std::vector<double> p(n + 1), t(n + 1), t_layer(n), p_layer(n), x_layer(n);
  for (int i = 0; i <= n; ++i) {
    p[i] = 20000.0 * std::pow(1e5 / 20000.0, double(i) / n);
    t[i] = moist_pseudoadiabat_temperature_k(298.15, 1e5, p[i]);
  }
  for (int i = 0; i < n; ++i) {
    p_layer[i] = std::sqrt(p[i] * p[i + 1]);
    t_layer[i] = moist_pseudoadiabat_temperature_k(298.15, 1e5, p_layer[i]);
    x_layer[i] = saturation_vapour_pressure_liquid_pa(t_layer[i]) / p_layer[i];
  }
  const auto z = level_heights_m(p, t_layer, x_layer, g0);
  for (int i = 0; i < n; i += 50) {
    const double lapse = (t[i + 1] - t[i]) / (z[i] - z[i + 1]);
    EXPECT_NEAR(lapse / moist_pseudoadiabatic_lapse_rate_k_m(t_layer[i], p_layer[i], g0), 1.0, 1e-4) << p_layer[i];
  }
}

// Bolton (1980) eq. (43) theta_e is (nearly) conserved along pseudo-adiabats. Davies-Jones (2008),
// Mon. Wea. Rev. 136 (abstract): Bolton's formula carries an inherent uncertainty of up to 0.2 K in
// the pseudo-adiabat temperature. Tolerances: 0.25 K on temperature (0.2 K plus 0.05 K for our
// constants: c_pv, Murphy & Koop vs Bolton e_s), 0.5 K on theta_e (a 0.2 K temperature error is
// amplified by d theta_e / dT, about 2 in warm saturated air).
TEST(LapseRate, PseudoadiabatConservesBoltonThetaE) {
  for (double t0 : {273.15, 283.15, 293.15, 303.15}) {
    const double theta_e0 = bolton_theta_e_saturated_k(t0, 1e5);
    for (double p : {85000.0, 70000.0, 50000.0, 30000.0, 20000.0}) {
      const double t = moist_pseudoadiabat_temperature_k(t0, 1e5, p);
      EXPECT_NEAR(bolton_theta_e_saturated_k(t, p), theta_e0, 0.5) << t0 << " K to " << p << " Pa";
      EXPECT_NEAR(t, bolton_pseudoadiabat_k(theta_e0, p), 0.25) << t0 << " K to " << p << " Pa";
    }
  }
}

// Poisson's equation: theta = T (p00 / p)^kappa is conserved, with kappa = R_d / c_pd = 0.2857,
// i.e. 2/7 for a diatomic ideal gas (analytic); 300 K at 1000 hPa gives 246.1 K at 500 hPa.
TEST(LapseRate, DryAdiabatConservesPotentialTemperature) {
  const double kappa = r_d / c_pd;
  EXPECT_NEAR(kappa, 2.0 / 7.0, 1e-3);
  const double theta = 300.0;
  for (double p : {100.0, 5000.0, 50000.0, 90000.0, 105000.0}) {
    const double t = dry_adiabat_temperature_k(theta, 1e5, p);
    EXPECT_NEAR(t * std::pow(1e5 / p, kappa), theta, 1e-12);
  }
  EXPECT_NEAR(dry_adiabat_temperature_k(300.0, 1e5, 5e4), 300.0 * std::pow(0.5, 2.0 / 7.0), 0.1);
  // Hypsometric heights of a dry adiabat give dT/dz = -g / c_pd (analytic; midpoint in ln p).
  std::vector<double> p(101), t_layer(100);
  for (int i = 0; i <= 100; ++i)
    p[i] = 30000.0 + 700.0 * i;
  for (int i = 0; i < 100; ++i)
    t_layer[i] = dry_adiabat_temperature_k(300.0, 1e5, std::sqrt(p[i] * p[i + 1]));
  const auto z = level_heights_m(p, t_layer, {}, g0);
  const double lapse =
      (dry_adiabat_temperature_k(300.0, 1e5, p[100]) - dry_adiabat_temperature_k(300.0, 1e5, p[0])) / z[0];
  EXPECT_NEAR(lapse / dry_adiabatic_lapse_rate_k_m(g0), 1.0, 1e-5);
}

TEST(LapseRate, BadInputThrowsInputError) {
  EXPECT_THROW((void)dry_adiabatic_lapse_rate_k_m(0.0), bandstack::InputError);
  EXPECT_THROW((void)moist_pseudoadiabatic_lapse_rate_k_m(290.0, -1.0, g0), bandstack::InputError);
  EXPECT_THROW((void)moist_pseudoadiabatic_lapse_rate_k_m(335.0, 1e5, g0), bandstack::InputError);
  EXPECT_THROW((void)moist_pseudoadiabat_temperature_k(300.0, 1e5, 0.0), bandstack::InputError);
  EXPECT_THROW((void)moist_pseudoadiabat_temperature_k(300.0, 1e5, 5e4, 0), bandstack::InputError);
  EXPECT_THROW((void)moist_pseudoadiabat_temperature_k(330.0, 5e4, 1e5), bandstack::InputError); // reaches 332 K
  EXPECT_THROW((void)dry_adiabat_temperature_k(-5.0, 1e5, 5e4), bandstack::InputError);
}

} // namespace
