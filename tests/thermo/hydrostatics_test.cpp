#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/humidity.hpp"
#include "bandstack/thermo/hydrostatics.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <vector>

namespace {

using namespace bandstack::thermo;
namespace constants = bandstack::constants;
constexpr double g0 = constants::standard_gravity_m_s2;
constexpr double r_d = constants::gas_constant_dry_air_j_kg_k;

// Textbook form T_v = T (1 + (1/eps - 1) q), exact for unsaturated air without condensate
// (e.g. Emanuel 1994 "Atmospheric Convection" sect. 4.3; from memory); 1/eps - 1 = 0.608.
TEST(Hydrostatics, VirtualTemperatureMatchesSpecificHumidityForm) {
  const double eps = constants::molar_mass_h2o_kg_mol / constants::molar_mass_dry_air_kg_mol;
  EXPECT_NEAR(1.0 / eps - 1.0, 0.608, 1e-3);
  EXPECT_EQ(virtual_temperature_k(250.0, 0.0), 250.0);
  for (double x : {1e-6, 0.01, 0.04, 0.3}) {
    const double q = specific_humidity_from_mole_fraction(x);
    EXPECT_NEAR(virtual_temperature_k(300.0, x), 300.0 * (1.0 + (1.0 / eps - 1.0) * q), 1e-11);
  }
  // Worked example: T = 30 degC, q = 20 g/kg -> T_v = 303.15 (1 + 0.608 * 0.02) = 306.84 K.
  EXPECT_NEAR(virtual_temperature_k(303.15, mole_fraction_from_specific_humidity(0.02)), 306.84, 0.01);
}

// Isothermal dry atmosphere: z = H ln(p_s / p), H = R_d T / g (analytic), on an uneven grid.
TEST(Hydrostatics, IsothermalAtmosphereHasExponentialPressure) {
  const std::vector<double> p = {10.0, 150.0, 2000.0, 10000.0, 35000.0, 70000.0, 101325.0};
  const std::vector<double> t(p.size() - 1, 250.0);
  const auto z = level_heights_m(p, t, {}, g0);
  ASSERT_EQ(z.size(), p.size());
  const double scale_height_m = r_d * 250.0 / g0;
  for (std::size_t i = 0; i < p.size(); ++i) {
    EXPECT_NEAR(z[i], scale_height_m * std::log(p.back() / p[i]), 1e-9 * (1.0 + z[i]));
  }
  EXPECT_EQ(z.back(), 0.0);
}

// Moist layers are thicker by exactly T_v / T (hypsometric equation).
TEST(Hydrostatics, MoistLayersUseVirtualTemperature) {
  const std::vector<double> p = {50000.0, 80000.0, 100000.0};
  const std::vector<double> t = {260.0, 285.0};
  const std::vector<double> x = {0.002, 0.02};
  const auto dry = level_heights_m(p, t, {0.0, 0.0}, g0);
  const auto moist = level_heights_m(p, t, x, g0);
  EXPECT_NEAR((moist[1] - moist[2]) / (dry[1] - dry[2]), virtual_temperature_k(285.0, 0.02) / 285.0, 1e-14);
  EXPECT_NEAR((moist[0] - moist[1]) / (dry[0] - dry[1]), virtual_temperature_k(260.0, 0.002) / 260.0, 1e-14);
}

// U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF), Table 4: layer bases in geopotential height H_b,
// base temperature T_b, lapse rate L_b = dT/dH and base pressure P_b (from memory; the pressures agree
// with the rounded values 22632, 5474.9, 868.02 Pa widely quoted from the standard's Table I).
// Within a layer T(p) = T_b (p / P_b)^(-R* L_b / (g0' M0)) (the standard's eq. 33a inverted),
// R* = 8.31432 J/(mol K), M0 = 28.9644 g/mol, g0' = 9.80665.
TEST(Hydrostatics, ReproducesUsStandardAtmosphere1976) {
  struct Layer {
    double base_height_m, base_temperature_k, lapse_k_m, base_pressure_pa;
  };
  const Layer us1976[] = {{0.0, 288.15, -6.5e-3, 101325.0},
                          {11000.0, 216.65, 0.0, 22632.06},
                          {20000.0, 216.65, 1.0e-3, 5474.889},
                          {32000.0, 228.65, 2.8e-3, 868.0187},
                          {47000.0, 270.65, 0.0, 110.9063}};
  const double r_star_1976 = 8.31432;
  const double m0 = 28.9644e-3;
  const int sublayers = 200; // per standard layer, even in ln p

  // Levels from the top (110.9063 Pa) to the surface; the table pressures are level boundaries.
  std::vector<double> p_levels;
  std::vector<double> t_layers;
  for (int k = 3; k >= 0; --k) {
    const Layer& b = us1976[k];
    const double p_top = us1976[k + 1].base_pressure_pa;
    const double exponent = -r_star_1976 * b.lapse_k_m / (g0 * m0);
    const double ln_span = std::log(b.base_pressure_pa / p_top);
    for (int j = 0; j < sublayers; ++j) {
      const double ln_p_upper = std::log(p_top) + ln_span * j / sublayers;
      const double ln_p_mid = ln_p_upper + 0.5 * ln_span / sublayers;
      p_levels.push_back(std::exp(ln_p_upper));
      t_layers.push_back(b.base_temperature_k * std::pow(std::exp(ln_p_mid) / b.base_pressure_pa, exponent));
    }
  }
  p_levels.push_back(us1976[0].base_pressure_pa);
  const auto z = level_heights_m(p_levels, t_layers, {}, g0);

  // Heights scale with the gas constant: ours is CODATA 2018 R = 8.314462618, the standard's
  // R* = 8.31432, so expect the table heights times R / R* (a 0.8 m shift at 47 km).
  // Tolerance 0.01 m: midpoint rule in ln p with 200 sublayers (relative error ~1e-7, < 5 mm at
  // 47 km) and the 7-digit table pressures (relative 1e-7, ~1 mm).
  const double gas_constant_ratio = constants::molar_gas_j_mol_k / r_star_1976;
  for (int k = 1; k <= 4; ++k) {
    const std::size_t level = static_cast<std::size_t>((4 - k) * sublayers);
    EXPECT_NEAR(p_levels[level], us1976[k].base_pressure_pa, 1e-9 * us1976[k].base_pressure_pa);
    EXPECT_NEAR(z[level], us1976[k].base_height_m * gas_constant_ratio, 0.01) << "H_b = " << us1976[k].base_height_m;
  }
}

TEST(Hydrostatics, BadInputThrowsWithPlace) {
  const std::vector<double> p = {100.0, 50000.0, 100000.0};
  const std::vector<double> t = {220.0, 280.0};
  EXPECT_THROW((void)level_heights_m(p, {220.0}, {}, g0), bandstack::InputError);
  EXPECT_THROW((void)level_heights_m(p, t, {0.0}, g0), bandstack::InputError);
  EXPECT_THROW((void)level_heights_m({0.0, 50000.0, 100000.0}, t, {}, g0), bandstack::InputError);
  EXPECT_THROW((void)level_heights_m(p, t, {}, 0.0), bandstack::InputError);
  EXPECT_THROW((void)level_heights_m({}, {}, {}, g0), bandstack::InputError);
  EXPECT_THROW((void)virtual_temperature_k(-1.0, 0.0), bandstack::InputError);
  EXPECT_THROW((void)virtual_temperature_k(280.0, 1.0), bandstack::InputError);
  try {
    (void)level_heights_m({100.0, 60000.0, 50000.0}, t, {}, g0);
    FAIL() << "no exception";
  } catch (const bandstack::InputError& error) {
    EXPECT_EQ(error.place().item, "level_pressure_pa");
    EXPECT_EQ(error.place().level, 2);
  }
  try {
    (void)level_heights_m(p, t, {0.01, 1.2}, g0);
    FAIL() << "no exception";
  } catch (const bandstack::InputError& error) {
    EXPECT_EQ(error.place().item, "layer_water_mole_fraction");
    EXPECT_EQ(error.place().level, 1);
  }
}

} // namespace
