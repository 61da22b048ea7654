// Grey radiative-equilibrium solutions that the longwave kernel must reproduce.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/solvers/grey.hpp"
#include "bandstack/solvers/heating.hpp"
#include "bandstack/solvers/longwave.hpp"

#include <algorithm>
#include <cmath>
#include <gtest/gtest.h>
#include <vector>

namespace bs = bandstack::solvers;
namespace constants = bandstack::constants;

namespace {

constexpr double pi = constants::pi;
constexpr double sigma = constants::stefan_boltzmann_w_m2_k4;

// Two-stream grey radiative equilibrium with diffusivity D (Pierrehumbert 2010, Principles of
// Planetary Climate, ch. 4; Goody & Yung 1989, ch. 2; from memory): with the hemi-isotropic
// closure dF_up/dtau = D (F_up - pi B), dF_down/dtau = D (pi B - F_down) and constant net flux
// F_up - F_down = OLR,
//   pi B(tau) = sigma T^4(tau) = (OLR / 2)(1 + D tau),
//   F_up(tau) = OLR (1 + D tau / 2),  F_down(tau) = OLR D tau / 2,
// and the ground is warmer than the air above it: sigma Tg^4 = OLR (1 + D tau_s / 2), which
// exceeds sigma T^4(tau_s) by OLR / 2 (the ground temperature discontinuity). The source is
// linear in tau, so the kernel (linear in tau through each layer's value at its optical-depth
// centre and the exit level's value, longwave.hpp) with one direction mu = 1/D solves it exactly
// on any layering when the layer sources are the profile's values at the layer centres.
constexpr double diffusivity = 1.66;
constexpr double olr_target = 240.0; // W m-2, chosen
constexpr double tau_surface = 6.0;  // chosen

double equilibrium_source(double tau) { return olr_target / (2.0 * pi) * (1.0 + diffusivity * tau); }
double ground_source() { return olr_target / pi * (1.0 + diffusivity * tau_surface / 2.0); }

} // namespace

TEST(GreyEquilibrium, TwoStreamProfileHasNoFluxDivergence) {
  const int n = 120;
  std::vector<double> tau_level(n + 1), tau(n), source(n + 1), source_layer(n), pressure(n + 1);
  for (int k = 0; k <= n; ++k) {
    const double s = static_cast<double>(k) / n;
    tau_level[k] = tau_surface * s * s * (3.0 - 2.0 * s); // uneven: thin layers at both ends
    pressure[k] = 1e5 * s;
    source[k] = equilibrium_source(tau_level[k]);
  }
  for (int i = 0; i < n; ++i) {
    tau[i] = tau_level[i + 1] - tau_level[i];
    source_layer[i] = equilibrium_source(0.5 * (tau_level[i] + tau_level[i + 1]));
  }
  std::vector<double> up(n + 1), down(n + 1), heating(n);
  bs::longwave_fluxes(tau, source, source_layer, ground_source(), 1.0, bs::diffusivity_quadrature(diffusivity), up,
                      down);
  bs::heating_rate_k_day(pressure, up, down, constants::standard_gravity_m_s2, heating);

  EXPECT_NEAR(up[0], olr_target, 1e-12 * olr_target);
  for (int k = 0; k <= n; ++k) {
    EXPECT_NEAR(up[k] - down[k], olr_target, 1e-12 * olr_target) << "level " << k;
    EXPECT_NEAR(up[k], olr_target * (1.0 + diffusivity * tau_level[k] / 2.0), 1e-12 * up[k]) << "level " << k;
    EXPECT_NEAR(down[k], olr_target * diffusivity * tau_level[k] / 2.0, 1e-12 * olr_target) << "level " << k;
  }
  // 1e-12 of OLR across a layer of 1000 Pa is about 2e-12 K/day.
  for (int i = 0; i < n; ++i)
    EXPECT_NEAR(heating[i], 0.0, 1e-9) << "layer " << i;
}

// The same state as a Column through the grey optics (tau proportional to pressure) and the
// one-call grey solver with level and layer temperatures from sigma T^4 = pi B, the layer's at its
// optical-depth centre (here its pressure centre, tau being proportional to pressure).
TEST(GreyEquilibrium, TwoStreamColumnThroughGreySolver) {
  const int n = 60;
  const double p_surface = 1e5;
  bandstack::atmosphere::Column column;
  column.name = "grey two-stream equilibrium";
  for (int k = 0; k <= n; ++k) {
    const double p = p_surface * static_cast<double>(k) / n;
    column.pressure_level_pa.push_back(p);
    column.temperature_level_k.push_back(std::pow(pi * equilibrium_source(tau_surface * p / p_surface) / sigma, 0.25));
  }
  for (int i = 0; i < n; ++i) {
    column.pressure_layer_pa.push_back(0.5 * (column.pressure_level_pa[i] + column.pressure_level_pa[i + 1]));
    const double tau_centre = tau_surface * column.pressure_layer_pa[i] / p_surface;
    column.temperature_layer_k.push_back(std::pow(pi * equilibrium_source(tau_centre) / sigma, 0.25));
  }
  for (auto& x : column.mole_fraction)
    x.assign(n, 0.0);
  column.surface_temperature_k = std::pow(pi * ground_source() / sigma, 0.25);
  column.surface_emissivity = 1.0;
  bs::GreyOptics optics;
  optics.extra_tau_per_pa = tau_surface / p_surface;

  const bs::LongwaveResult r = bs::solve_grey_longwave(column, optics, bs::diffusivity_quadrature(diffusivity));
  EXPECT_NEAR(r.olr(), olr_target, 1e-11 * olr_target);
  EXPECT_NEAR(r.surface_down(), olr_target * diffusivity * tau_surface / 2.0, 1e-11 * olr_target);
  for (int i = 0; i < n; ++i)
    EXPECT_NEAR(r.heating_rate_k_day[i], 0.0, 1e-8) << "layer " << i;
  // The ground temperature discontinuity (analytic, above): sigma Tg^4 - sigma T(tau_s)^4 = OLR / 2.
  EXPECT_NEAR(sigma * (std::pow(column.surface_temperature_k, 4) - std::pow(column.temperature_level_k.back(), 4)),
              olr_target / 2.0, 1e-9 * olr_target);
}

// N opaque isothermal layers over a black surface heated by absorbed sunlight S (the classical
// N-layer greenhouse model; Pierrehumbert 2010, ch. 3; from memory): in radiative equilibrium
// layer k (counted from the top) has sigma T_k^4 = k S and the surface sigma Ts^4 = (N + 1) S, so
// Ts = (N + 1)^{1/4} Te with sigma Te^4 = S. Each opaque layer (tau = 50) has its own temperature
// on both bounding levels; transparent (tau = 0) spacer layers carry the jump in the level source
// between neighbours. Solved by a fixed-point (Jacobi) iteration on layer and surface
// temperatures that uses only the kernel's fluxes.
TEST(GreyEquilibrium, OpaqueLayersGreenhouseModel) {
  const double absorbed_solar = 240.0; // W m-2, chosen
  const double te = std::pow(absorbed_solar / sigma, 0.25);
  for (int n_opaque : {1, 2, 5}) {
    const int n = 2 * n_opaque - 1; // opaque layers at even indices, spacers between
    std::vector<double> tau(n, 0.0), source(n + 1), source_layer(n), up(n + 1), down(n + 1);
    for (int i = 0; i < n; i += 2)
      tau[i] = 50.0;
    std::vector<double> emission(n_opaque, 0.5 * absorbed_solar); // sigma T^4 of each opaque layer
    double surface_emission = absorbed_solar;
    const bs::AngularQuadrature q = bs::gauss_quadrature(4);
    bs::LongwaveWorkspace ws;
    double worst = 0.0;
    for (int iteration = 0; iteration < 20000; ++iteration) {
      for (int m = 0; m < n_opaque; ++m)
        source[2 * m] = source[2 * m + 1] = source_layer[2 * m] = emission[m] / pi;
      for (int m = 0; m + 1 < n_opaque; ++m) // a transparent spacer emits nothing; any value will do
        source_layer[2 * m + 1] = 0.5 * (source[2 * m + 1] + source[2 * m + 2]);
      bs::longwave_fluxes(tau, source, source_layer, surface_emission / pi, 1.0, q, up, down, ws);
      worst = 0.0;
      for (int m = 0; m < n_opaque; ++m) {
        const int i = 2 * m;
        const double gain = (down[i] - up[i]) - (down[i + 1] - up[i + 1]);
        emission[m] += 0.5 * gain; // an opaque layer emits sigma T^4 both ways
        worst = std::max(worst, std::abs(gain));
      }
      const double surface_gain = absorbed_solar + down[n] - surface_emission;
      surface_emission += surface_gain;
      worst = std::max(worst, std::abs(surface_gain));
      if (worst < 1e-11 * absorbed_solar) break;
    }
    ASSERT_LT(worst, 1e-11 * absorbed_solar) << n_opaque << " layers did not converge";
    const double ts = std::pow(surface_emission / sigma, 0.25);
    EXPECT_NEAR(ts / te, std::pow(n_opaque + 1.0, 0.25), 1e-6) << n_opaque << " layers";
    for (int m = 0; m < n_opaque; ++m)
      EXPECT_NEAR(emission[m], (m + 1) * absorbed_solar, 1e-6 * absorbed_solar) << "layer " << m;
    EXPECT_NEAR(up[0], absorbed_solar, 1e-9 * absorbed_solar); // top of atmosphere balance
  }
}
