#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/grey.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <gtest/gtest.h>
#include <vector>

namespace bs = bandstack::solvers;
namespace constants = bandstack::constants;
using bandstack::Gas;

namespace {

bandstack::atmosphere::Column two_layer_column() {
  bandstack::atmosphere::Column c;
  c.pressure_level_pa = {0.0, 40000.0, 100000.0};
  c.pressure_layer_pa = {20000.0, 70000.0};
  c.temperature_level_k = {220.0, 250.0, 285.0};
  c.temperature_layer_k = {235.0, 268.0};
  for (auto& x : c.mole_fraction)
    x.assign(2, 0.0);
  c.gas(Gas::h2o) = {0.001, 0.02};
  c.gas(Gas::co2) = {4e-4, 4e-4};
  c.surface_temperature_k = 288.0;
  c.gravity_m_s2 = 9.8;
  return c;
}

} // namespace

// tau = kappa * (gas mass per area); gas mass = dp/g * x * M_gas / M_moist (hydrostatic layer
// mass, common practice) with M_moist = (1 - x_h2o) M_dry + x_h2o M_h2o; plus extra * dp.
TEST(GreyOptics, OpticalDepthFromGasMasses) {
  const auto column = two_layer_column();
  bs::GreyOptics optics;
  optics.mass_absorption_m2_kg[bandstack::index(Gas::co2)] = 0.2;
  optics.mass_absorption_m2_kg[bandstack::index(Gas::h2o)] = 0.05;
  optics.extra_tau_per_pa = 1e-5;
  const std::vector<double> tau = bs::grey_optical_depth(column, optics);
  ASSERT_EQ(tau.size(), 2u);
  for (std::size_t i = 0; i < 2; ++i) {
    const double dp = column.pressure_level_pa[i + 1] - column.pressure_level_pa[i];
    const double xw = column.gas(Gas::h2o)[i];
    const double m_moist = (1 - xw) * constants::molar_mass_dry_air_kg_mol + xw * constants::molar_mass_h2o_kg_mol;
    const double air = dp / column.gravity_m_s2;
    const double expected = 0.2 * air * 4e-4 * constants::molar_mass_co2_kg_mol / m_moist +
                            0.05 * air * xw * constants::molar_mass_h2o_kg_mol / m_moist + 1e-5 * dp;
    EXPECT_NEAR(tau[i], expected, 1e-14 * expected) << "layer " << i;
  }
  // The extra absorber alone gives a column optical depth extra * p_surface (definition).
  bs::GreyOptics extra_only;
  extra_only.extra_tau_per_pa = 3e-5;
  const std::vector<double> t2 = bs::grey_optical_depth(column, extra_only);
  EXPECT_NEAR(t2[0] + t2[1], 3e-5 * 1e5, 1e-14);
}

// sigma T^4 / pi at 300 K = 5.670374419e-8 * 8.1e9 / pi = 146.20 W m-2 sr-1 (CODATA 2018 sigma).
TEST(GreyOptics, GreySource) { EXPECT_NEAR(bs::grey_source_w_m2_sr(300.0), 459.3003279 / constants::pi, 1e-6); }

// With no absorber the grey solve returns the surface emission everywhere upward and nothing
// downward (transparent atmosphere, common practice), and zero heating.
TEST(GreyOptics, TransparentColumn) {
  auto column = two_layer_column();
  column.surface_emissivity = 0.9;
  const bs::LongwaveResult r = bs::solve_grey_longwave(column, bs::GreyOptics{}, bs::gauss_quadrature(2));
  const double emitted = 0.9 * constants::stefan_boltzmann_w_m2_k4 * std::pow(288.0, 4);
  EXPECT_NEAR(r.olr(), emitted, 1e-12 * emitted);
  EXPECT_EQ(r.surface_down(), 0.0);
  for (double h : r.heating_rate_k_day)
    EXPECT_NEAR(h, 0.0, 1e-12);
}

// The layer "zigzag" mode: layer temperatures perturbed by +1, -1, +1, ... K with the level
// temperatures unchanged (interpolating levels between layers cancels the alternation). The layer
// temperatures now enter through the layer sources, so a thin layer's heating changes by its own
// cooling to space: it emits D tau sigma (T^4 - T0^4) more each way (diffusivity D, thin limit of
// the Schwarzschild equation, longwave.hpp), so
//   delta H = -(g / c_p) 2 D kappa sigma ((T0 + dT)^4 - T0^4) * 86400 s/day,   kappa = tau / dp,
// about 0.14 K/day per K here (Newtonian cooling of an optically thin layer, e.g. Goody & Yung
// 1989, ch. 2; from memory). The old kernel used level sources only, so this change was exactly 0
// and radiative equilibria were undetermined along the mode. Neighbours' changed emission adds
// (alternating, nearly cancelling) corrections of order tau: within 5 % above 1000 Pa
// (cumulative tau above 0.02 of 2).
TEST(GreyOptics, LayerTemperatureZigzagChangesThinLayerHeating) {
  constexpr std::size_t n = 40;
  constexpr double p_top = 10.0, p_surface = 1e5, tau_surface = 2.0, diffusivity = 1.66;
  bandstack::atmosphere::Column column;
  column.name = "zigzag";
  auto base_t = [&](double p) { return 200.0 + 88.0 * p / p_surface; }; // chosen, K
  for (std::size_t k = 0; k <= n; ++k) {
    const double p = p_top * std::pow(p_surface / p_top, static_cast<double>(k) / n); // log-pressure grid
    column.pressure_level_pa.push_back(p);
    column.temperature_level_k.push_back(base_t(p));
  }
  for (std::size_t i = 0; i < n; ++i) {
    column.pressure_layer_pa.push_back(0.5 * (column.pressure_level_pa[i] + column.pressure_level_pa[i + 1]));
    column.temperature_layer_k.push_back(base_t(column.pressure_layer_pa[i]));
  }
  for (auto& x : column.mole_fraction)
    x.assign(n, 0.0);
  column.surface_temperature_k = 288.0;
  bs::GreyOptics optics;
  const double kappa = tau_surface / p_surface; // Pa-1
  optics.extra_tau_per_pa = kappa;
  const bs::AngularQuadrature angles = bs::diffusivity_quadrature(diffusivity);

  const bs::LongwaveResult smooth = bs::solve_grey_longwave(column, optics, angles);
  auto zigzag = column;
  for (std::size_t i = 0; i < n; ++i)
    zigzag.temperature_layer_k[i] += i % 2 == 0 ? 1.0 : -1.0;
  const bs::LongwaveResult perturbed = bs::solve_grey_longwave(zigzag, optics, angles);

  const double sigma = constants::stefan_boltzmann_w_m2_k4;
  const double per_w_m2_pa = column.gravity_m_s2 / constants::specific_heat_dry_air_j_kg_k * 86400.0; // K/day
  std::size_t checked = 0;
  double worst_relative = 0.0, smallest_change = 1e300;
  for (std::size_t i = 0; i < n && column.pressure_level_pa[i + 1] <= 1000.0; ++i, ++checked) {
    const double t0 = column.temperature_layer_k[i], t1 = zigzag.temperature_layer_k[i];
    const double expected = -per_w_m2_pa * 2.0 * diffusivity * kappa * sigma * (std::pow(t1, 4) - std::pow(t0, 4));
    const double change = perturbed.heating_rate_k_day[i] - smooth.heating_rate_k_day[i];
    EXPECT_GT(std::abs(expected), 0.1) << "layer " << i; // the estimate itself is clearly non-zero
    EXPECT_NEAR(change, expected, 0.05 * std::abs(expected)) << "layer " << i;
    worst_relative = std::max(worst_relative, std::abs(change / expected - 1.0));
    smallest_change = std::min(smallest_change, std::abs(change));
  }
  std::printf("zigzag +-1 K: %zu layers above 1000 Pa, heating changes >= %.4f K/day, worst deviation from the "
              "thin-layer estimate %.2f %%\n", checked, smallest_change, 100.0 * worst_relative);
  EXPECT_GE(checked, 20u);
}

TEST(GreyOptics, RejectsBadInput) {
  const auto column = two_layer_column();
  bs::GreyOptics bad;
  bad.mass_absorption_m2_kg[bandstack::index(Gas::o3)] = -1.0;
  EXPECT_THROW((void)bs::grey_optical_depth(column, bad), bandstack::InputError);
  bs::GreyOptics bad_extra;
  bad_extra.extra_tau_per_pa = std::nan("");
  EXPECT_THROW((void)bs::grey_optical_depth(column, bad_extra), bandstack::InputError);
  auto broken = column;
  broken.temperature_level_k.pop_back();
  EXPECT_THROW((void)bs::solve_grey_longwave(broken, bs::GreyOptics{}, bs::gauss_quadrature(2)), bandstack::InputError);
}
