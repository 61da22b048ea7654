// Convective adjustment (Manabe & Strickler 1964, J. Atmos. Sci. 21; Manabe & Wetherald 1967).
#include "bandstack/climate/convective_adjustment.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <vector>

#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

namespace cl = bandstack::climate;
namespace at = bandstack::atmosphere;
namespace constants = bandstack::constants;

namespace {

constexpr double g = constants::standard_gravity_m_s2;
constexpr double cp = constants::specific_heat_dry_air_j_kg_k;

struct Grid {
  std::vector<double> level, layer;
};

Grid grid(std::size_t layers) {
  Grid out;
  out.level = at::level_pressures_pa(at::GridSpec{layers, 1000.0, 100000.0, at::Spacing::log_pressure});
  out.layer = at::layer_pressures_pa(out.level);
  return out;
}

double enthalpy(const Grid& gr, const std::vector<double>& t) {
  double e = 0.0;
  for (std::size_t i = 0; i < t.size(); ++i) e += cp * (gr.level[i + 1] - gr.level[i]) / g * t[i];
  return e;
}

// Lapse rate (K/m) between two pressures from the hypsometric equation with the layer-mean
// temperature; for a temperature linear in height the log-mean (T1 - T2) / ln(T1 / T2) is the exact
// layer mean of 1/T weighting (Wallace & Hobbs 2006, Atmospheric Science, sec. 3.2; from memory).
double hypsometric_lapse_rate(double t_upper, double p_upper, double t_lower, double p_lower) {
  const double mean_t = (t_lower - t_upper) / std::log(t_lower / t_upper);
  const double dz = constants::gas_constant_dry_air_j_kg_k * mean_t / g * std::log(p_lower / p_upper);
  return (t_lower - t_upper) / dz;
}

} // namespace

TEST(CriticalProfile, FixedLapseRateIsLinearInHeight) {
  const cl::ConvectionSettings s{cl::ConvectionKind::fixed_lapse_rate, 6.5};
  const double t = cl::critical_profile_temperature_k(s, 288.15, 101325.0, 50000.0, g);
  EXPECT_NEAR(hypsometric_lapse_rate(t, 50000.0, 288.15, 101325.0), 6.5e-3, 1e-12);
  // U.S. Standard Atmosphere 1976: 6.5 K/km from 288.15 K, 101325 Pa reaches 216.65 K at
  // 22632.06 Pa (11 km geopotential) (NOAA/NASA/USAF 1976, Table I; from memory).
  EXPECT_NEAR(cl::critical_profile_temperature_k(s, 288.15, 101325.0, 22632.06, g), 216.65, 0.01);
}

TEST(ConvectiveAdjustment, UnstableRegionBecomesCriticalAndKeepsEnthalpy) {
  const Grid gr = grid(30);
  const cl::ConvectionSettings s{cl::ConvectionKind::fixed_lapse_rate, 6.5};
  // Lower half: 9 K/km from 300 K (unstable, steeper than 6.5 K/km); upper half isothermal 200 K
  // (stable). Chosen.
  const cl::ConvectionSettings steep{cl::ConvectionKind::fixed_lapse_rate, 9.0};
  std::vector<double> t(30);
  for (std::size_t i = 0; i < 30; ++i)
    t[i] = i < 12 ? 200.0 : cl::critical_profile_temperature_k(steep, 300.0, gr.level.back(), gr.layer[i], g);
  const std::vector<double> before = t;
  const double e0 = enthalpy(gr, t);
  const cl::AdjustmentResult r = cl::adjust_convectively(s, gr.level, gr.layer, t, g);
  EXPECT_NEAR(enthalpy(gr, t), e0, 1e-12 * e0);
  ASSERT_GT(r.adjusted_layer_count(), 0u);
  for (std::size_t i = 0; i < 30; ++i) {
    if (!r.layer_adjusted[i]) {
      EXPECT_EQ(t[i], before[i]) << "stable layer " << i << " touched";
      continue;
    }
    if (i + 1 < 30 && r.layer_adjusted[i + 1])
      EXPECT_NEAR(hypsometric_lapse_rate(t[i], gr.layer[i], t[i + 1], gr.layer[i + 1]), 6.5e-3, 1e-12) << i;
  }
  // The adjusted region spans the whole unstable part and stops where the column is stable.
  for (std::size_t i = 12; i < 30; ++i) EXPECT_TRUE(r.layer_adjusted[i]) << i;
  for (std::size_t i = 0; i + 1 < 30; ++i)
    EXPECT_GE(t[i], cl::critical_profile_temperature_k(s, t[i + 1], gr.layer[i + 1], gr.layer[i], g) - 1e-9) << i;
}

TEST(ConvectiveAdjustment, GroundJoinsWithItsHeatCapacity) {
  const Grid gr = grid(20);
  const cl::ConvectionSettings s{cl::ConvectionKind::fixed_lapse_rate, 6.5};
  std::vector<double> t(20, 250.0); // isothermal air over a warm ground: unstable at the bottom
  cl::AdjustedSurface ground{300.0, 4.2e6};
  const double e0 = enthalpy(gr, t) + ground.heat_capacity_j_m2_k * ground.temperature_k;
  const cl::AdjustmentResult r = cl::adjust_convectively(s, gr.level, gr.layer, t, g, &ground);
  EXPECT_TRUE(r.surface_adjusted);
  EXPECT_NEAR(enthalpy(gr, t) + ground.heat_capacity_j_m2_k * ground.temperature_k, e0, 1e-12 * e0);
  // Surface air is the skin: the profile passes through (p_s, T_s).
  EXPECT_NEAR(t.back(), cl::critical_profile_temperature_k(s, ground.temperature_k, gr.level.back(), gr.layer.back(), g),
              1e-9);
  EXPECT_FALSE(r.layer_adjusted.front());
  EXPECT_EQ(t.front(), 250.0);
}

TEST(ConvectiveAdjustment, MoistAdiabatRegion) {
  const Grid gr = grid(20);
  const cl::ConvectionSettings s{cl::ConvectionKind::moist_adiabat, 0.0};
  std::vector<double> t(20);
  const cl::ConvectionSettings dry{cl::ConvectionKind::fixed_lapse_rate, 9.5};
  for (std::size_t i = 0; i < 20; ++i) t[i] = cl::critical_profile_temperature_k(dry, 300.0, gr.level.back(), gr.layer[i], g);
  const double e0 = enthalpy(gr, t);
  const cl::AdjustmentResult r = cl::adjust_convectively(s, gr.level, gr.layer, t, g);
  EXPECT_NEAR(enthalpy(gr, t), e0, 1e-12 * e0);
  EXPECT_EQ(r.adjusted_layer_count(), 20u);
  for (std::size_t i = 0; i + 1 < 20; ++i)
    EXPECT_NEAR(t[i], cl::critical_profile_temperature_k(s, t[19], gr.layer[19], gr.layer[i], g), 1e-6) << i;
}

TEST(ConvectiveAdjustment, BadInputThrows) {
  const Grid gr = grid(5);
  std::vector<double> t(4, 250.0);
  EXPECT_THROW(cl::adjust_convectively({}, gr.level, gr.layer, t, g), bandstack::InputError);
  std::vector<double> t5(5, 250.0);
  EXPECT_THROW(cl::adjust_convectively({cl::ConvectionKind::fixed_lapse_rate, -1.0}, gr.level, gr.layer, t5, g),
               bandstack::InputError);
}
