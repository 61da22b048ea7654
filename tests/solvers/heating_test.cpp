#include "bandstack/atmosphere/column.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/grey.hpp"
#include "bandstack/solvers/heating.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <vector>

namespace bs = bandstack::solvers;
namespace constants = bandstack::constants;

// First law for a layer of mass dp/g at constant pressure (common practice):
// dT/dt = (g / c_p) (F_net,top - F_net,bottom) / dp, F_net = down - up. A layer of 100 hPa gaining
// 10 W m-2 warms by 9.80665 / 1004.64 * 10 / 1e4 * 86400 K/day = 0.8434 K/day.
TEST(HeatingRate, HandComputedLayer) {
  const std::vector<double> p{0.0, 1e4, 3e4};
  const std::vector<double> up{240.0, 250.0, 300.0};
  const std::vector<double> down{0.0, 20.0, 60.0};
  std::vector<double> out(2);
  bs::heating_rate_k_day(p, up, down, constants::standard_gravity_m_s2, out);
  const double g_over_cp_day = constants::standard_gravity_m_s2 / constants::specific_heat_dry_air_j_kg_k * 86400.0;
  // Layer 0: net top -240, net bottom -230: it loses 10 W m-2 -> cools.
  EXPECT_NEAR(out[0], g_over_cp_day * (-240.0 + 230.0) / 1e4, 1e-14);
  EXPECT_LT(out[0], 0.0);
  // Layer 1: net top -230, net bottom -240: gains 10 W m-2 over 200 hPa -> warms.
  EXPECT_NEAR(out[1], g_over_cp_day * 10.0 / 2e4, 1e-14);
  EXPECT_NEAR(out[1], 0.4217, 1e-4);
}

// Energy conservation: sum_i heating_i * c_p dp_i / g equals F_net(top) - F_net(surface), the
// radiative energy the atmosphere keeps (telescoping sum; common practice), to 1e-12 relative.
TEST(HeatingRate, ColumnEnergyIsConserved) {
  const int n = 50;
  bandstack::atmosphere::Column column;
  for (int k = 0; k <= n; ++k) {
    const double s = static_cast<double>(k) / n;
    column.pressure_level_pa.push_back(100.0 + (101325.0 - 100.0) * s * s);
    column.temperature_level_k.push_back(std::max(210.0, 290.0 - 80.0 * (1.0 - s) * 1.4));
  }
  for (int i = 0; i < n; ++i) {
    column.pressure_layer_pa.push_back(0.5 * (column.pressure_level_pa[i] + column.pressure_level_pa[i + 1]));
    column.temperature_layer_k.push_back(0.5 * (column.temperature_level_k[i] + column.temperature_level_k[i + 1]));
  }
  for (auto& x : column.mole_fraction)
    x.assign(n, 0.0);
  column.gas(bandstack::Gas::h2o).assign(n, 0.005);
  column.gas(bandstack::Gas::co2).assign(n, 4e-4);
  column.surface_temperature_k = 293.0;
  column.surface_emissivity = 0.96;
  column.gravity_m_s2 = 9.81;
  bs::GreyOptics optics;
  optics.mass_absorption_m2_kg[bandstack::index(bandstack::Gas::h2o)] = 0.1;
  optics.mass_absorption_m2_kg[bandstack::index(bandstack::Gas::co2)] = 0.05;
  optics.extra_tau_per_pa = 2e-6;

  const bs::LongwaveResult r = bs::solve_grey_longwave(column, optics, bs::gauss_quadrature(3));
  double kept = 0.0;
  for (int i = 0; i < n; ++i)
    kept += r.heating_rate_k_day[i] / constants::seconds_per_day * constants::specific_heat_dry_air_j_kg_k *
            (column.pressure_level_pa[i + 1] - column.pressure_level_pa[i]) / column.gravity_m_s2;
  const double net_top = r.flux_down.front() - r.flux_up.front();
  const double net_surface = r.flux_down.back() - r.flux_up.back();
  EXPECT_NEAR(kept, net_top - net_surface, 1e-12 * r.olr());
  EXPECT_LT(net_top - net_surface, 0.0); // a grey atmosphere cools radiatively (common practice)
}

TEST(HeatingRate, RejectsBadInput) {
  std::vector<double> out(2);
  const std::vector<double> f{1, 2, 3};
  EXPECT_THROW(bs::heating_rate_k_day(std::vector<double>{0, 1e4}, f, f, 9.8, out), bandstack::InputError);
  EXPECT_THROW(bs::heating_rate_k_day(std::vector<double>{0, 1e4, 1e4}, f, f, 9.8, out), bandstack::InputError);
  EXPECT_THROW(bs::heating_rate_k_day(std::vector<double>{0, 1e4, 2e4}, f, f, 0.0, out), bandstack::InputError);
  EXPECT_THROW(bs::heating_rate_k_day(std::vector<double>{0, 1e4, 2e4}, f, std::vector<double>{1, 2}, 9.8, out),
               bandstack::InputError);
}
