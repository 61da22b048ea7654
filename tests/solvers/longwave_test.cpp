// Checks of the longwave kernel against analytic solutions of the Schwarzschild equation.
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/longwave.hpp"

#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/special_functions/expint.hpp>
#include <boost/multiprecision/cpp_bin_float.hpp>
#include <cmath>
#include <gtest/gtest.h>
#include <vector>

namespace bs = bandstack::solvers;
namespace constants = bandstack::constants;

namespace {

constexpr double pi = constants::pi;
constexpr double sigma = constants::stefan_boltzmann_w_m2_k4;

double planck_grey(double t_k) { return sigma * std::pow(t_k, 4) / pi; }

struct Fluxes {
  std::vector<double> up, down;
};

Fluxes solve(const std::vector<double>& tau, const std::vector<double>& source, const std::vector<double>& source_layer,
             double source_surface, double emissivity, const bs::AngularQuadrature& angles) {
  Fluxes f{std::vector<double>(tau.size() + 1), std::vector<double>(tau.size() + 1)};
  bs::longwave_fluxes(tau, source, source_layer, source_surface, emissivity, angles, f.up, f.down);
  return f;
}

// An isothermal column: the same source at every level and layer.
Fluxes solve_isothermal(const std::vector<double>& tau, double source, double source_surface, double emissivity,
                        const bs::AngularQuadrature& angles) {
  return solve(tau, std::vector<double>(tau.size() + 1, source), std::vector<double>(tau.size(), source),
               source_surface, emissivity, angles);
}

// Quadrature estimate of 2 E3(tau) = int_0^1 2 mu exp(-tau/mu) dmu.
double quadrature_two_e3(const bs::AngularQuadrature& q, double tau) {
  double s = 0.0;
  for (std::size_t j = 0; j < q.size(); ++j)
    s += q.weight[j] * std::exp(-tau / q.mu[j]);
  return s;
}

// An isothermal slab of total optical depth `tau` at temperature t_k cut into sublayers whose
// optical depths are proportional to `parts`.
std::vector<double> split(double tau, const std::vector<double>& parts) {
  double total = 0.0;
  for (double p : parts)
    total += p;
  std::vector<double> out;
  for (double p : parts)
    out.push_back(tau * p / total);
  return out;
}

} // namespace

// Optically thin limit: with no absorber the surface is seen directly, OLR = e sigma Ts^4 and no
// radiation comes down (energy conservation, common practice).
TEST(LongwaveKernel, ThinLimitSeesTheSurface) {
  const double ts = 290.0;
  for (double e : {1.0, 0.9, 0.0}) {
    const std::vector<double> tau(10, 1e-13);
    const Fluxes f = solve_isothermal(tau, planck_grey(250.0), planck_grey(ts), e, bs::gauss_quadrature(4));
    EXPECT_NEAR(f.up[0], e * sigma * std::pow(ts, 4), 1e-9) << "emissivity " << e;
    EXPECT_NEAR(f.down.back(), 0.0, 1e-9);
    EXPECT_EQ(f.down[0], 0.0);
  }
}

// Isothermal slab (temperature T, optical depth tau) over a black surface at Ts, exact angular
// integration: F_up(top) = sigma T^4 + 2 E3(tau) (sigma Ts^4 - sigma T^4) (Goody & Yung 1989,
// Atmospheric Radiation, ch. 2, slab transmission 2 E3; from memory). E3 from Boost.Math
// expint(3, tau). The 8-node Gauss rule integrates exp(-tau/mu) only approximately (its
// derivatives are singular at mu -> 0): 8 nodes resolve 2 E3 to 1e-4 absolute for all tau, and
// 8 nodes beat 2 nodes.
TEST(LongwaveKernel, IsothermalSlabOverSurfaceMatchesExponentialIntegral) {
  const double t = 230.0, ts = 295.0;
  const double contrast = sigma * (std::pow(ts, 4) - std::pow(t, 4));
  for (double tau : {1e-4, 1e-2, 0.1, 0.5, 1.0, 2.0, 5.0, 10.0}) {
    const double exact = sigma * std::pow(t, 4) + 2.0 * boost::math::expint(3, tau) * contrast;
    const std::vector<double> layers = split(tau, {1, 2, 3});
    const Fluxes eight = solve_isothermal(layers, planck_grey(t), planck_grey(ts), 1.0, bs::gauss_quadrature(8));
    const Fluxes two = solve_isothermal(layers, planck_grey(t), planck_grey(ts), 1.0, bs::gauss_quadrature(2));
    EXPECT_NEAR(eight.up[0], exact, 1e-4 * contrast) << "tau " << tau;
    EXPECT_LE(std::abs(eight.up[0] - exact), std::abs(two.up[0] - exact)) << "tau " << tau;
  }
}

// Diffusivity approximation: the slab transmits exp(-1.66 tau) exactly (Elsasser 1942 factor,
// common practice), F_up(top) = sigma T^4 + exp(-1.66 tau)(sigma Ts^4 - sigma T^4).
TEST(LongwaveKernel, DiffusivityTransmissionIsExponential) {
  const double t = 210.0, ts = 300.0;
  for (double tau : {1e-8, 1e-3, 0.03, 0.3, 3.0, 30.0}) {
    const double expected = sigma * std::pow(t, 4) + std::exp(-1.66 * tau) * sigma * (std::pow(ts, 4) - std::pow(t, 4));
    const std::vector<double> layers = split(tau, {5, 1, 2, 7});
    const Fluxes f = solve_isothermal(layers, planck_grey(t), planck_grey(ts), 1.0, bs::diffusivity_quadrature(1.66));
    EXPECT_NEAR(f.up[0], expected, 1e-12 * expected) << "tau " << tau;
  }
}

// First-order thin correction: 2 E3(tau) = 1 - 2 tau + O(tau^2 ln tau) (Abramowitz & Stegun
// 1964, 5.1.12 series of E_n), so OLR ~ sigma Ts^4 - 2 tau (sigma Ts^4 - sigma T^4). An 8-node
// rule gets the slope 2 = int_0^1 2 mu (1/mu) dmu to about 1.5 % (1/mu is not a polynomial).
TEST(LongwaveKernel, ThinLayerFirstOrderCorrection) {
  const double t = 220.0, ts = 288.0;
  const double contrast = sigma * (std::pow(ts, 4) - std::pow(t, 4));
  for (double tau : {1e-6, 1e-5, 1e-4}) {
    const Fluxes f = solve_isothermal({tau}, planck_grey(t), planck_grey(ts), 1.0, bs::gauss_quadrature(8));
    const double slope = (sigma * std::pow(ts, 4) - f.up[0]) / (tau * contrast);
    EXPECT_NEAR(slope, 2.0, 0.03) << "tau " << tau;
  }
}

// Thick limit: each layer opaque, so the top sees only the top of the top layer and the surface
// only the bottom of the lowest layer: OLR = sigma T_top^4, surface down = sigma T_lowest^4
// (black-body limit, common practice). Isothermal: exact. With a lapse rate (layer temperatures
// midway between their levels) the source's slope gives a correction of order (dB/dtau) mu, here
// below 1e-7 relative for tau = 1e6.
TEST(LongwaveKernel, ThickLimitSeesTheNearestLevel) {
  const std::vector<double> tau(20, 1e6);
  {
    const Fluxes f = solve_isothermal(tau, planck_grey(250.0), planck_grey(300.0), 1.0, bs::gauss_quadrature(4));
    EXPECT_NEAR(f.up[0], sigma * std::pow(250.0, 4), 1e-13 * f.up[0]);
    EXPECT_NEAR(f.down.back(), sigma * std::pow(250.0, 4), 1e-13 * f.up[0]);
  }
  std::vector<double> t_level(21), source(21), source_layer(20);
  for (std::size_t k = 0; k <= 20; ++k) {
    t_level[k] = 200.0 + 4.0 * static_cast<double>(k);
    source[k] = planck_grey(t_level[k]);
  }
  for (std::size_t i = 0; i < 20; ++i)
    source_layer[i] = planck_grey(202.0 + 4.0 * static_cast<double>(i));
  const Fluxes f = solve(tau, source, source_layer, planck_grey(300.0), 1.0, bs::gauss_quadrature(4));
  EXPECT_NEAR(f.up[0], sigma * std::pow(t_level[0], 4), 1e-7 * f.up[0]);
  EXPECT_NEAR(f.down.back(), sigma * std::pow(t_level[20], 4), 1e-7 * f.down.back());
}

// Optically thin layer: to first order in the slant optical depth x = tau/mu, the Schwarzschild
// equation gives I_out = I_in + x (B_layer - I_in) (formal solution, Chandrasekhar 1960, ch. 1;
// from memory), with B_layer the source inside the layer. So a thin layer in front of nothing
// emits x B(T_layer) whatever its level temperatures are; the level values only enter at order x^2
// (here x^2/6 (B_exit - B_layer), longwave.hpp). The old kernel, with sources only at the levels,
// emitted x (B_top + B_bottom)/2 instead and so could not see a layer's own temperature.
TEST(LongwaveKernel, ThinLayerEmitsAtItsLayerTemperature) {
  const double b_layer = planck_grey(230.0);
  const std::vector<std::vector<double>> level_sources = {
      {planck_grey(180.0), planck_grey(300.0)}, {planck_grey(300.0), planck_grey(180.0)}, {b_layer, b_layer}};
  for (double mu : {1.0, 0.3}) {
    const bs::AngularQuadrature one_direction{{mu}, {1.0}};
    for (double tau : {1e-8, 1e-6, 1e-4, 1e-3}) {
      const double x = tau / mu;
      std::vector<double> up_emission, down_emission;
      for (const auto& levels : level_sources) {
        const Fluxes f = solve({tau}, levels, {b_layer}, 0.0, 1.0, one_direction); // black, cold surface
        up_emission.push_back(f.up[0] / pi);
        down_emission.push_back(f.down[1] / pi);
        // Relative deviation from x B_layer is of order x (-x/2 from 1 - e^-x, x/6 from the levels).
        EXPECT_NEAR(f.up[0] / pi / (x * b_layer), 1.0, 1.5 * x) << "mu " << mu << ", tau " << tau;
        EXPECT_NEAR(f.down[1] / pi / (x * b_layer), 1.0, 1.5 * x) << "mu " << mu << ", tau " << tau;
      }
      // Level sources that differ by a factor 7.7 change the emission only at order x^2:
      // |x^2/6 (B_exit - B_layer)| <= x^2 * 0.6 B_layer here.
      for (std::size_t m = 1; m < level_sources.size(); ++m) {
        EXPECT_LE(std::abs(up_emission[m] - up_emission[0]), 0.6 * x * x * b_layer) << "tau " << tau;
        EXPECT_LE(std::abs(down_emission[m] - down_emission[0]), 0.6 * x * x * b_layer) << "tau " << tau;
      }
    }
  }
}

// Optically thick layer: the radiance leaving it approaches the source at the exit level, with
// the first correction of the diffusion (Eddington-Barbier) limit, I_out = B_exit - mu dB/dtau
// (Chandrasekhar 1960, ch. 1; from memory). For the kernel's source, linear from B_layer at the
// centre to B_exit at the exit, mu dB/dtau = 2 (B_exit - B_layer) / x, and the remaining error is
// of order e^{-x}: I_out = B_exit - 2 (B_exit - B_layer) / x. Whatever enters (a hot surface below,
// nothing above) is forgotten.
TEST(LongwaveKernel, ThickLayerExitsAtTheExitLevelSource) {
  const double b_top = planck_grey(210.0), b_bottom = planck_grey(260.0), b_layer = planck_grey(240.0);
  for (double mu : {1.0, 0.3}) {
    const bs::AngularQuadrature one_direction{{mu}, {1.0}};
    for (double tau : {40.0, 1e3, 1e6}) {
      const double x = tau / mu;
      const Fluxes f = solve({tau}, {b_top, b_bottom}, {b_layer}, planck_grey(320.0), 1.0, one_direction);
      const double up = f.up[0] / pi, down = f.down[1] / pi;
      EXPECT_NEAR(up, b_top - 2.0 * (b_top - b_layer) / x, 1e-13 * b_bottom) << "mu " << mu << ", tau " << tau;
      EXPECT_NEAR(down, b_bottom - 2.0 * (b_bottom - b_layer) / x, 1e-13 * b_bottom) << "mu " << mu << ", tau " << tau;
    }
  }
}

// Kirchhoff's law with a Lambertian surface under an opaque isothermal atmosphere at T: the
// surface receives sigma T^4 and sends up e sigma Ts^4 + (1 - e) sigma T^4 (common practice).
TEST(LongwaveKernel, GreySurfaceReflectsDiffusely) {
  const double t = 260.0, ts = 280.0, e = 0.85;
  const std::vector<double> tau(3, 1e4);
  const Fluxes f = solve_isothermal(tau, planck_grey(t), planck_grey(ts), e, bs::gauss_quadrature(3));
  EXPECT_NEAR(f.up.back(), e * sigma * std::pow(ts, 4) + (1 - e) * sigma * std::pow(t, 4), 1e-12 * f.up.back());
}

// Emission of an isothermal slab (no surface emission): emissivity 1 - 2 E3(tau) with exact angles
// (Goody & Yung 1989, ch. 2; from memory), per direction 1 - exp(-tau/mu) (Beer's law), and the
// same up and down by symmetry. The result must not depend on how the slab is cut into sublayers
// (1e-12 relative), across the series/exponential switch of the layer factors.
TEST(LongwaveKernel, IsothermalSlabEmissionIndependentOfLayering) {
  const double t = 240.0;
  const bs::AngularQuadrature q = bs::gauss_quadrature(8);
  const std::vector<std::vector<double>> layerings = {
      {1}, {1, 1}, {3, 1, 2}, std::vector<double>(10, 1.0), {1e-6, 1, 1e-3, 5, 2}, std::vector<double>(300, 1.0)};
  for (double tau : {1e-7, 1e-3, 0.04, 0.06, 0.2, 0.3, 3.0, 40.0, 800.0}) {
    const double per_direction = 1.0 - quadrature_two_e3(q, tau);
    const double exact_angles = 1.0 - 2.0 * boost::math::expint(3, tau);
    double reference = -1.0;
    for (const auto& parts : layerings) {
      const std::vector<double> layers = split(tau, parts);
      const Fluxes f = solve_isothermal(layers, planck_grey(t), 0.0, 1.0, q);
      const double emissivity = f.up[0] / (sigma * std::pow(t, 4));
      EXPECT_NEAR(emissivity, per_direction, 1e-13 + 1e-12 * per_direction) << "tau " << tau;
      EXPECT_NEAR(emissivity, exact_angles, 1e-4) << "tau " << tau;
      EXPECT_NEAR(f.down.back(), f.up[0], 1e-12 * f.up[0]) << "tau " << tau;
      if (reference < 0.0) reference = f.up[0];
      EXPECT_NEAR(f.up[0], reference, 1e-12 * reference) << "tau " << tau << ", " << parts.size() << " sublayers";
    }
  }
}

// A source linear in optical depth through the whole column, with each layer's value taken at its
// optical-depth centre, is represented exactly by any layering (the layer value and the exit
// level's value fix the line, longwave.hpp), so cutting the layers further must not change any
// flux (1e-12 relative).
TEST(LongwaveKernel, LinearSourceIndependentOfLayering) {
  const double tau_total = 7.0, b_top = 20.0, b_bottom = 130.0;
  auto source_at = [&](double t) { return b_top + (b_bottom - b_top) * t / tau_total; };
  const bs::AngularQuadrature q = bs::gauss_quadrature(4);
  auto run = [&](int n) {
    std::vector<double> tau(n), source(n + 1), source_layer(n);
    for (int k = 0; k <= n; ++k) {
      const double tk = tau_total * std::pow(static_cast<double>(k) / n, 2); // uneven layers
      source[k] = source_at(tk);
      if (k > 0) {
        const double above = tau_total * std::pow(static_cast<double>(k - 1) / n, 2);
        tau[k - 1] = tk - above;
        source_layer[k - 1] = source_at(0.5 * (above + tk));
      }
    }
    return solve(tau, source, source_layer, 140.0, 0.95, q);
  };
  const Fluxes one = run(1);
  for (int n : {2, 5, 17, 200}) {
    const Fluxes many = run(n);
    EXPECT_NEAR(many.up[0], one.up[0], 1e-12 * one.up[0]) << n << " layers";
    EXPECT_NEAR(many.down.back(), one.down.back(), 1e-12 * one.down.back()) << n << " layers";
    EXPECT_NEAR(many.up.back(), one.up.back(), 1e-12 * one.up.back()) << n << " layers";
  }
}

// Exactness per direction for the source the kernel assumes (longwave.hpp): along each ray B is
// linear in optical depth through the layer value B_layer at the layer's centre t = tau/2 and the
// level value where the ray leaves, B1 (bottom) going down and B0 (top) going up:
//   B_down(t) = B_layer + (B1 - B_layer) (2t/tau - 1),   B_up(t) = B_layer + (B0 - B_layer) (1 - 2t/tau).
// The formal solution of mu dI/dt = I - B (Chandrasekhar 1960, Radiative Transfer, ch. 1; from
// memory) gives
//   I_down(tau) = int_0^tau B_down(t) e^{-(tau - t)/mu} dt/mu,
//   I_up(0)    = I_s e^{-tau/mu} + int_0^tau B_up(t) e^{-t/mu} dt/mu,
// evaluated here by adaptive Gauss-Kronrod quadrature (Boost.Math), independently of the kernel.
// One direction with weight 1 turns the flux into pi I. B_layer = 60 is not the mean of the level
// values (72.5), so the two rays see different lines, as the kernel must.
TEST(LongwaveKernel, LayerAndExitSourceIsExactPerDirection) {
  const double b0 = 35.0, b1 = 110.0, b_layer = 60.0, b_surface = 125.0;
  using integrator = boost::math::quadrature::gauss_kronrod<double, 31>;
  for (double mu : {0.05, 0.3, 2.0 / 3.0, 1.0}) {
    for (double tau : {1e-7, 1e-3, 0.02, 0.12, 0.26, 0.4, 2.5, 30.0}) {
      const bs::AngularQuadrature one_direction{{mu}, {1.0}};
      auto b_down = [&](double t) { return b_layer + (b1 - b_layer) * (2.0 * t / tau - 1.0); };
      auto b_up = [&](double t) { return b_layer + (b0 - b_layer) * (1.0 - 2.0 * t / tau); };
      // Substituting s = (tau - t)/mu (down) and s = t/mu (up) puts the integrands on [0, tau/mu]
      // with the factor e^{-s} smooth, which a 31-point rule integrates quickly to 1e-14 relative.
      const double x = tau / mu;
      const double down =
          integrator::integrate([&](double s) { return b_down(tau - mu * s) * std::exp(-s); }, 0.0, x, 15, 1e-14);
      const double up = b_surface * std::exp(-x) +
                        integrator::integrate([&](double s) { return b_up(mu * s) * std::exp(-s); }, 0.0, x, 15, 1e-14);
      const Fluxes f = solve({tau}, {b0, b1}, {b_layer}, b_surface, 1.0, one_direction);
      EXPECT_NEAR(f.down[1] / pi, down, 1e-13 * b1) << "mu " << mu << ", tau " << tau;
      EXPECT_NEAR(f.up[0] / pi, up, 1e-13 * b_surface) << "mu " << mu << ", tau " << tau;
    }
  }
}

// The layer factors against 1 - e^-x and 1 - (1 - e^-x)/x evaluated in 50-digit arithmetic
// (Boost.Multiprecision), across the series switch at x = 0.25: 1e-15 and 1e-14 relative, as
// documented in longwave.hpp. Exact limits: both 0 at x = 0; 1 and 1 - 1/x for large x.
TEST(LongwaveKernel, LayerFactorAccuracy) {
  using wide = boost::multiprecision::cpp_bin_float_50;
  const bs::LayerFactors zero = bs::linear_in_tau_factors(0.0);
  EXPECT_EQ(zero.absorptance, 0.0);
  EXPECT_EQ(zero.linear_source, 0.0);
  EXPECT_DOUBLE_EQ(bs::linear_in_tau_factors(1e3).absorptance, 1.0);
  EXPECT_DOUBLE_EQ(bs::linear_in_tau_factors(1e3).linear_source, 1.0 - 1e-3);
  for (double x : {1e-12, 1e-9, 1e-4, 0.01, 0.1, 0.2499999, 0.25, 0.2500001, 0.6, 3.0, 40.0}) {
    const wide xw = x;
    const wide a_exact = 1 - exp(-xw);
    const wide g_exact = 1 - a_exact / xw;
    const double a = static_cast<double>(a_exact), g = static_cast<double>(g_exact);
    const bs::LayerFactors f = bs::linear_in_tau_factors(x);
    EXPECT_NEAR(f.absorptance, a, 1e-15 * a) << "x = " << x;
    EXPECT_NEAR(f.linear_source, g, 1e-14 * g) << "x = " << x;
  }
}

TEST(LongwaveKernel, WorkspaceReuseGivesSameResult) {
  bs::LongwaveWorkspace ws;
  const bs::AngularQuadrature q = bs::gauss_quadrature(3);
  std::vector<double> up(6), down(6), up2(3), down2(3);
  const std::vector<double> tau{0.1, 2.0, 0.5, 0.01, 4.0}, source{10, 20, 30, 40, 50, 60}, layer{14, 26, 33, 47, 52};
  bs::longwave_fluxes(tau, source, layer, 65.0, 0.9, q, up, down, ws);
  bs::longwave_fluxes(std::vector<double>{1.0, 1.0}, std::vector<double>{1, 2, 3}, std::vector<double>{1.5, 2.5}, 3.0,
                      1.0, q, up2, down2, ws);
  const Fluxes fresh = solve(tau, source, layer, 65.0, 0.9, q);
  bs::longwave_fluxes(tau, source, layer, 65.0, 0.9, q, up, down, ws);
  for (std::size_t k = 0; k < 6; ++k) {
    EXPECT_EQ(up[k], fresh.up[k]);
    EXPECT_EQ(down[k], fresh.down[k]);
  }
}

TEST(LongwaveKernel, RejectsBadInput) {
  const bs::AngularQuadrature q = bs::gauss_quadrature(2);
  std::vector<double> up(3), down(3);
  const std::vector<double> tau{0.1, 0.2}, source{1, 2, 3}, layer{1.5, 2.5};
  EXPECT_NO_THROW(bs::longwave_fluxes(tau, source, layer, 3.0, 1.0, q, up, down));
  EXPECT_THROW(bs::longwave_fluxes(tau, std::vector<double>{1, 2}, layer, 3.0, 1.0, q, up, down), bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(tau, source, std::vector<double>{1}, 3.0, 1.0, q, up, down), bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(tau, source, std::vector<double>{1, 2, 3}, 3.0, 1.0, q, up, down),
               bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(std::vector<double>{0.1, -0.2}, source, layer, 3.0, 1.0, q, up, down),
               bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(std::vector<double>{0.1, std::nan("")}, source, layer, 3.0, 1.0, q, up, down),
               bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(tau, std::vector<double>{1, HUGE_VAL, 3}, layer, 3.0, 1.0, q, up, down),
               bandstack::InputError);
  try {
    bs::longwave_fluxes(tau, source, std::vector<double>{1.5, -1.0}, 3.0, 1.0, q, up, down);
    FAIL() << "expected InputError for a negative layer source";
  } catch (const bandstack::InputError& e) {
    EXPECT_EQ(e.place().item, "planck_source_layer");
    EXPECT_EQ(e.place().level, 1);
  }
  EXPECT_THROW(bs::longwave_fluxes(tau, source, std::vector<double>{std::nan(""), 2.5}, 3.0, 1.0, q, up, down),
               bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(tau, source, std::vector<double>{1.5, HUGE_VAL}, 3.0, 1.0, q, up, down),
               bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(tau, source, layer, -3.0, 1.0, q, up, down), bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(tau, source, layer, 3.0, 1.2, q, up, down), bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(tau, source, layer, 3.0, 1.0, bs::AngularQuadrature{{0.0}, {1.0}}, up, down),
               bandstack::InputError);
  std::vector<double> short_up(2);
  EXPECT_THROW(bs::longwave_fluxes(tau, source, layer, 3.0, 1.0, q, short_up, down), bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes(std::vector<double>{}, std::vector<double>{1}, std::vector<double>{}, 3.0, 1.0, q,
                                   std::span<double>(up).first(1), std::span<double>(down).first(1)),
               bandstack::InputError);
}
