// The shortwave column kernel: limits with exact answers, energy conservation, a numerical
// solution of the two-stream equations through an inhomogeneous column, and exact results of
// radiative transfer theory for isotropic scattering (Chandrasekhar 1960).
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/delta_eddington.hpp"
#include "bandstack/solvers/shortwave.hpp"

#include <boost/math/quadrature/gauss.hpp>
#include <cmath>
#include <gtest/gtest.h>
#include <limits>
#include <numbers>
#include <random>
#include <vector>

namespace bs = bandstack::solvers;

namespace {

constexpr double solar = 1361.0; // any positive flux; 1361 W m-2 is Kopp & Lean (2011)'s TSI

struct Column {
  std::vector<double> tau, omega, g;
  double mu0 = 0.5;
  double albedo_direct = 0.0;
  double albedo_diffuse = 0.0;
};

struct Fluxes {
  std::vector<double> up, direct, diffuse;
  [[nodiscard]] double down(std::size_t k) const { return direct[k] + diffuse[k]; }
};

Fluxes run(const Column& c) {
  const std::size_t levels = c.tau.size() + 1;
  Fluxes f{std::vector<double>(levels), std::vector<double>(levels), std::vector<double>(levels)};
  bs::shortwave_fluxes(c.tau, c.omega, c.g, c.mu0, solar, c.albedo_direct, c.albedo_diffuse, f.up, f.direct,
                       f.diffuse);
  return f;
}

Column random_column(std::mt19937_64& rng, std::size_t layers) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  Column c;
  for (std::size_t i = 0; i < layers; ++i) {
    c.tau.push_back(std::pow(10.0, -6.0 + 7.7 * unit(rng))); // 1e-6 to 50
    const double pick = unit(rng);
    c.omega.push_back(pick < 0.15 ? 0.0 : (pick < 0.3 ? 1.0 : unit(rng)));
    c.g.push_back(-0.5 + 1.45 * unit(rng));
  }
  c.mu0 = 0.02 + 0.98 * unit(rng);
  c.albedo_direct = unit(rng);
  c.albedo_diffuse = unit(rng);
  return c;
}

// Eddington diffuse reflectance and transmittance of a non-scattering layer: with omega = 0 the
// Meador & Weaver (1980) Table 1 coefficients are g1 = 7/4, g2 = -1/4, k = sqrt(3), and
// R = g2 sinh(k tau)/(k cosh + g1 sinh), T = k/(k cosh + g1 sinh).
void eddington_absorber(double tau, double& r, double& t) {
  const double k = std::sqrt(3.0);
  const double den = k * std::cosh(k * tau) + 1.75 * std::sinh(k * tau);
  r = -0.25 * std::sinh(k * tau) / den;
  t = k / den;
}

// Chandrasekhar's H-function for isotropic scattering with single-scattering albedo omega, from
// its closed-form integral (Chandrasekhar 1960, Radiative Transfer, ch. V; from memory):
//   ln H(mu) = -(mu/pi) Int_0^{pi/2} ln(1 - omega theta cot theta) / (cos^2 theta + mu^2 sin^2 theta) dtheta.
// theta = (pi/2) u^2 removes the logarithmic end-point singularity of the conservative case; the
// checks in HFunctionOfTheTest confirm the evaluation.
double h_function(double mu, double omega) {
  auto integrand = [&](double u) {
    const double theta = 0.5 * std::numbers::pi * u * u;
    const double jacobian = std::numbers::pi * u;
    // 1 - theta cot theta = theta^2/3 + theta^4/45 + 2 theta^6/945 + ... near 0
    const double t2 = theta * theta;
    const double one_minus = theta < 1e-3 ? t2 / 3.0 + t2 * t2 / 45.0 : 1.0 - theta / std::tan(theta);
    const double arg = (1.0 - omega) + omega * one_minus;
    const double c = std::cos(theta), s = std::sin(theta);
    return std::log(arg) / (c * c + mu * mu * s * s) * jacobian;
  };
  const double integral = boost::math::quadrature::gauss<double, 100>::integrate(integrand, 0.0, 1.0);
  return std::exp(-mu / std::numbers::pi * integral);
}

// Single-scattering plane albedo of a layer of isotropic scatterers over a black surface
// (van de Hulst 1980, Multiple Light Scattering; Liou 2002 — the single-scattering solution, from
// memory): R1 = (omega/2) Int_0^1 mu/(mu + mu0) (1 - exp(-tau (1/mu + 1/mu0))) dmu.
double single_scattering_albedo_isotropic(double tau, double omega, double mu0) {
  auto f = [&](double mu) { return mu / (mu + mu0) * -std::expm1(-tau * (1.0 / mu + 1.0 / mu0)); };
  return 0.5 * omega * boost::math::quadrature::gauss<double, 60>::integrate(f, 0.0, 1.0);
}

// Exponential integral E2(x) = e^{-x} - x E1(x), E1(x) = -Ei(-x) (Abramowitz & Stegun 5.1.14, 5.1.2).
double e2(double x) { return std::exp(-x) + x * std::expint(-x); }

} // namespace

// Pure absorption over a black surface: the direct beam follows Beer-Lambert,
// mu0 S exp(-tau_cum/mu0); nothing is scattered, so no diffuse flux in either direction.
TEST(ShortwaveColumn, BeerLambertWithoutScattering) {
  Column c;
  c.tau = {0.01, 0.3, 1e-5, 2.0, 0.7};
  c.omega.assign(5, 0.0);
  c.g = {0.0, 0.8, -0.3, 0.5, 0.9}; // irrelevant without scattering
  c.mu0 = 0.3;
  const Fluxes f = run(c);
  double cum = 0.0;
  for (std::size_t k = 0; k <= c.tau.size(); ++k) {
    const double beer = c.mu0 * solar * std::exp(-cum / c.mu0);
    EXPECT_NEAR(f.direct[k], beer, 4e-16 * (static_cast<double>(k) + 2.0 + cum / c.mu0) * beer) << "level " << k;
    EXPECT_EQ(f.diffuse[k], 0.0);
    EXPECT_EQ(f.up[k], 0.0);
    if (k < c.tau.size()) cum += c.tau[k];
  }
}

// Pure absorption over a reflecting surface: the surface sends albedo_direct of the beam up as
// diffuse light; the layer (Eddington R, T for omega = 0) returns R of it, the surface reflects
// albedo_diffuse of that, and so on: U_surface = a_dir S / (1 - a_dif R), D_surface = R U_surface,
// U_top = T U_surface.
TEST(ShortwaveColumn, AbsorbingLayerOverReflectingSurface) {
  Column c;
  c.tau = {0.4};
  c.omega = {0.0};
  c.g = {0.3};
  c.mu0 = 0.6;
  c.albedo_direct = 0.3;
  c.albedo_diffuse = 0.7;
  const Fluxes f = run(c);
  double r = 0.0, t = 0.0;
  eddington_absorber(0.4, r, t);
  const double s_bottom = c.mu0 * solar * std::exp(-0.4 / c.mu0);
  const double u_surface = c.albedo_direct * s_bottom / (1.0 - c.albedo_diffuse * r);
  EXPECT_NEAR(f.direct[1], s_bottom, 1e-12 * s_bottom);
  EXPECT_NEAR(f.up[1], u_surface, 1e-12 * u_surface);
  EXPECT_NEAR(f.diffuse[1], r * u_surface, 1e-12 * u_surface);
  EXPECT_NEAR(f.up[0], t * u_surface, 1e-12 * u_surface);
  // Energy: incoming = reflected + absorbed in the layer + absorbed at the surface.
  const double incoming = c.mu0 * solar;
  const double layer = (f.down(0) - f.up[0]) - (f.down(1) - f.up[1]);
  const double surface = (1.0 - c.albedo_direct) * f.direct[1] + (1.0 - c.albedo_diffuse) * f.diffuse[1];
  EXPECT_NEAR(incoming, f.up[0] + layer + surface, 1e-12 * incoming);
  EXPECT_GT(layer, 0.0);
}

// Conservative scattering (omega = 1, any g) absorbs nothing (the two-stream equations conserve
// flux when omega = 1): over a black surface incoming = reflected + transmitted; over a white
// surface (albedo 1) everything comes back out at the top.
TEST(ShortwaveColumn, ConservativeScatteringAbsorbsNothing) {
  std::mt19937_64 rng(11);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  for (int trial = 0; trial < 60; ++trial) {
    Column c;
    const std::size_t layers = 1 + trial % 9;
    for (std::size_t i = 0; i < layers; ++i) {
      c.tau.push_back(std::pow(10.0, -4.0 + 6.0 * unit(rng)));
      c.omega.push_back(1.0);
      c.g.push_back(-0.5 + 1.5 * unit(rng));
    }
    if (trial % 10 == 0) c.tau[0] = 1e6; // a very thick cloud
    c.mu0 = trial % 3 == 0 ? 0.05 : unit(rng) * 0.95 + 0.05;
    const double incoming = c.mu0 * solar;
    const Fluxes black = run(c);
    EXPECT_NEAR(black.up[0] + black.down(layers), incoming, 1e-12 * incoming);
    c.albedo_direct = c.albedo_diffuse = 1.0;
    const Fluxes white = run(c);
    EXPECT_NEAR(white.up[0], incoming, 1e-12 * incoming);
    for (std::size_t k = 0; k <= layers; ++k) // net flux zero everywhere
      EXPECT_NEAR(white.down(k) - white.up[k], 0.0, 1e-12 * incoming);
  }
}

// Energy conservation layer by layer: every layer absorbs what its reflectances and
// transmittances (delta_eddington_layer) imply for the fluxes entering it, the surface absorbs
// (1 - albedo) of what reaches it, and the sum closes the budget at the top to 1e-9 (issue 4).
TEST(ShortwaveColumn, EnergyBudgetClosesLayerByLayer) {
  std::mt19937_64 rng(5);
  for (int trial = 0; trial < 200; ++trial) {
    const Column c = random_column(rng, 1 + trial % 12);
    const std::size_t n = c.tau.size();
    const Fluxes f = run(c);
    const double incoming = c.mu0 * solar;
    EXPECT_NEAR(f.down(0), incoming, 1e-15 * incoming);
    double absorbed = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
      const double from_fluxes = (f.down(i) - f.up[i]) - (f.down(i + 1) - f.up[i + 1]);
      const bs::LayerReflectance l = bs::delta_eddington_layer(c.tau[i], c.omega[i], c.g[i], c.mu0);
      const double beam_absorbed =
          1.0 - l.reflectance_direct - l.transmittance_direct_diffuse - l.transmittance_direct;
      const double from_layer =
          f.direct[i] * beam_absorbed + (f.diffuse[i] + f.up[i + 1]) * l.absorptance_diffuse;
      EXPECT_NEAR(from_fluxes, from_layer, 1e-12 * incoming) << "trial " << trial << " layer " << i;
      if (c.omega[i] == 1.0) {
        EXPECT_NEAR(from_fluxes, 0.0, 1e-12 * incoming);
      }
      absorbed += from_fluxes;
    }
    const double surface = f.down(n) - f.up[n];
    EXPECT_NEAR(surface, (1.0 - c.albedo_direct) * f.direct[n] + (1.0 - c.albedo_diffuse) * f.diffuse[n],
                1e-12 * incoming);
    EXPECT_NEAR(incoming, f.up[0] + absorbed + surface, 1e-9 * incoming);
  }
}

// The kernel solves the two-stream equations of Meador & Weaver (1980) eq. (2) with their Eddington
// coefficients (Table 1) through an inhomogeneous column. Here the same equations are integrated
// numerically (fourth-order Runge-Kutta in each layer's delta-scaled optical depth, superposition
// of a beam-driven and a homogeneous solution to meet D = 0 at the top and the Lambertian surface
// U = a_dir S + a_dif D at the bottom); fluxes must agree at every level.
TEST(ShortwaveColumn, MatchesNumericalTwoStreamSolution) {
  Column c;
  c.tau = {0.3, 1.2, 0.05, 0.6};
  c.omega = {0.999, 0.6, 1.0, 0.2};
  c.g = {0.0, 0.85, 0.4, -0.3};
  c.mu0 = 0.6;
  c.albedo_direct = 0.25;
  c.albedo_diffuse = 0.4;
  const Fluxes f = run(c);
  using real = long double;
  struct State {
    real u, d;
  };
  const std::size_t n = c.tau.size();
  auto integrate = [&](State y, real beam_scale, std::vector<State>& at_levels) {
    at_levels.assign(1, y);
    real beam = beam_scale * c.mu0 * solar; // direct flux on a horizontal surface
    for (std::size_t i = 0; i < n; ++i) {
      const bs::DeltaScaled s = bs::delta_eddington_scaling(c.tau[i], c.omega[i], c.g[i]);
      const real w = s.single_scattering_albedo, g = s.asymmetry, mu = c.mu0;
      const real g1 = (7 - w * (4 + 3 * g)) / 4, g2 = -(1 - w * (4 - 3 * g)) / 4;
      const real g3 = (2 - 3 * g * mu) / 4, g4 = 1 - g3;
      const int steps = 20000;
      const real h = s.optical_depth / steps;
      auto rhs = [&](real x, const State& v) {
        const real src = w * beam * std::exp(-x / mu) / mu;
        return State{g1 * v.u - g2 * v.d - g3 * src, g2 * v.u - g1 * v.d + g4 * src};
      };
      for (int m = 0; m < steps; ++m) {
        const real x = h * m;
        const State k1 = rhs(x, y);
        const State k2 = rhs(x + h / 2, {y.u + h / 2 * k1.u, y.d + h / 2 * k1.d});
        const State k3 = rhs(x + h / 2, {y.u + h / 2 * k2.u, y.d + h / 2 * k2.d});
        const State k4 = rhs(x + h, {y.u + h * k3.u, y.d + h * k3.d});
        y.u += h / 6 * (k1.u + 2 * k2.u + 2 * k3.u + k4.u);
        y.d += h / 6 * (k1.d + 2 * k2.d + 2 * k3.d + k4.d);
      }
      beam *= std::exp(-static_cast<real>(s.optical_depth) / mu);
      at_levels.push_back(y);
    }
    return beam;
  };
  std::vector<State> a, b;
  const real beam_bottom = integrate({0, 0}, 1, a);
  integrate({1, 0}, 0, b);
  const real u0 = (c.albedo_direct * beam_bottom + c.albedo_diffuse * a[n].d - a[n].u) /
                  (b[n].u - c.albedo_diffuse * b[n].d);
  const double incoming = c.mu0 * solar;
  for (std::size_t k = 0; k <= n; ++k) {
    EXPECT_NEAR(f.up[k], static_cast<double>(a[k].u + u0 * b[k].u), 1e-9 * incoming) << "level " << k;
    EXPECT_NEAR(f.diffuse[k], static_cast<double>(a[k].d + u0 * b[k].d), 1e-9 * incoming) << "level " << k;
  }
  EXPECT_NEAR(f.direct[n], static_cast<double>(beam_bottom), 1e-12 * incoming);
}

// Splitting a homogeneous layer into sub-layers: the two-stream equations are linear with
// constant coefficients, delta scaling is linear in tau, and adding combines exact solutions of
// sub-layers, so the answer does not change at all (beyond rounding) — stronger than the
// convergence with subdivision one would ask of an approximate layer solution.
TEST(ShortwaveColumn, SubdividingALayerChangesNothing) {
  for (double omega : {0.0, 0.6, 0.95, 1.0}) {
    Column whole;
    whole.tau = {2.0};
    whole.omega = {omega};
    whole.g = {0.7};
    whole.mu0 = 0.5;
    whole.albedo_direct = 0.2;
    whole.albedo_diffuse = 0.35;
    const Fluxes f1 = run(whole);
    for (std::size_t parts : {2u, 3u, 64u, 128u}) {
      Column split = whole;
      split.tau.assign(parts, 2.0 / static_cast<double>(parts));
      split.omega.assign(parts, omega);
      split.g.assign(parts, 0.7);
      const Fluxes fn = run(split);
      const double incoming = whole.mu0 * solar;
      EXPECT_NEAR(fn.up[0], f1.up[0], 1e-12 * incoming) << "omega " << omega << " parts " << parts;
      EXPECT_NEAR(fn.diffuse[parts], f1.diffuse[1], 1e-12 * incoming);
      EXPECT_NEAR(fn.direct[parts], f1.direct[1], 1e-12 * incoming);
      EXPECT_NEAR(fn.up[parts], f1.up[1], 1e-12 * incoming);
    }
  }
}

// Checks of the test's own H-function against published facts: the zeroth moment
// Int_0^1 H dmu = 2 (1 - sqrt(1 - omega)) / omega (exact; Chandrasekhar 1960, from memory), and
// H(1) = 2.9078 for conservative isotropic scattering (Chandrasekhar 1960, Table of H; from memory).
TEST(ShortwaveColumn, HFunctionOfTheTest) {
  for (double omega : {0.5, 0.9, 0.99}) {
    const double moment = boost::math::quadrature::gauss<double, 60>::integrate(
        [&](double mu) { return h_function(mu, omega); }, 0.0, 1.0);
    EXPECT_NEAR(moment, 2.0 * (1.0 - std::sqrt(1.0 - omega)) / omega, 1e-6) << omega;
  }
  EXPECT_NEAR(h_function(1.0, 1.0), 2.9078, 2e-4);
}

// A semi-infinite isotropically scattering atmosphere (tau = 1e4, g = 0) over nothing: the exact
// plane albedo is r(mu0) = 1 - H(mu0) sqrt(1 - omega) (Chandrasekhar 1960, from memory). The
// delta-Eddington value must be within 0.015: errors of the Eddington approximation in plane
// albedo are of order 0.01 (Joseph et al. 1976; King & Harshvardhan 1986, J. Atmos. Sci. 43, 784;
// from memory). The largest difference here is about 0.011 (omega = 0.9, mu0 = 1).
TEST(ShortwaveColumn, SemiInfiniteIsotropicAtmosphereMatchesChandrasekhar) {
  for (double omega : {0.5, 0.9, 0.99})
    for (double mu0 : {0.1, 0.25, 0.5, 0.75, 1.0}) {
      Column c;
      c.tau = {1e4};
      c.omega = {omega};
      c.g = {0.0};
      c.mu0 = mu0;
      const Fluxes f = run(c);
      const double exact = 1.0 - h_function(mu0, omega) * std::sqrt(1.0 - omega);
      EXPECT_NEAR(f.up[0] / (mu0 * solar), exact, 0.015) << "omega " << omega << " mu0 " << mu0;
    }
  // Conservative: the exact plane albedo of a semi-infinite atmosphere is 1 for every mu0
  // (Chandrasekhar 1960); a layer of tau = 1e8 is that to 1e-7.
  Column c;
  c.tau = {1e8};
  c.omega = {1.0};
  c.g = {0.0};
  for (double mu0 : {0.1, 0.5, 1.0}) {
    c.mu0 = mu0;
    EXPECT_NEAR(run(c).up[0] / (mu0 * solar), 1.0, 1e-7);
  }
}

// A thick conservative isotropic layer (tau = 20) over a black surface: transmission follows the
// asymptotic law T(mu0) = 4 K(mu0) / (3 (tau + 2 q0)) with escape function K(mu0) = (sqrt(3)/4)
// H(mu0) and extrapolation length q0 = 0.7104 (van de Hulst 1980, Multiple Light Scattering, vol. 2;
// Chandrasekhar 1960; from memory), exact up to terms of order exp(-tau). The Eddington
// approximation describes the diffusion of net flux inside the layer well and errs in how the
// beam is turned into diffuse light near the top, increasingly so toward grazing incidence
// (Joseph et al. 1976; King & Harshvardhan 1986; from memory). Tolerances: 2% for mu0 >= 0.5
// (measured 0.3-0.8%), 10% for mu0 = 0.25 and 0.1 (measured 3% and 7%).
TEST(ShortwaveColumn, ThickConservativeLayerTransmission) {
  for (double mu0 : {0.1, 0.25, 0.5, 0.75, 1.0}) {
    Column c;
    c.tau = {20.0};
    c.omega = {1.0};
    c.g = {0.0};
    c.mu0 = mu0;
    const Fluxes f = run(c);
    const double transmitted = f.down(1) / (mu0 * solar);
    const double k_escape = std::sqrt(3.0) / 4.0 * h_function(mu0, 1.0);
    const double asymptotic = 4.0 * k_escape / (3.0 * (20.0 + 2.0 * 0.7104));
    EXPECT_NEAR(transmitted / asymptotic, 1.0, mu0 >= 0.5 ? 0.02 : 0.10) << "mu0 " << mu0;
  }
}

// A Rayleigh-like layer (tau = 0.1, omega = 1, g = 0 as for Rayleigh scattering, mu0 = 0.5, black
// surface). For isotropic scattering the exact reflectance lies between the single-scattering
// value R1 (lower bound: higher orders only add) and R1 plus the fraction of photons scattered at
// least twice, (1 - e^{-tau/mu0}) (1 - E2(tau/2)) (a photon scattered at depth z escapes
// unscattered with probability (E2(z) + E2(tau - z))/2 >= E2(tau/2), E2 being convex). Here
// R1 = 0.0763 and the upper bound 0.107; the published range for such a layer is about 0.06-0.10.
TEST(ShortwaveColumn, RayleighLikeLayerReflectance) {
  Column c;
  c.tau = {0.1};
  c.omega = {1.0};
  c.g = {0.0};
  c.mu0 = 0.5;
  const Fluxes f = run(c);
  const double reflectance = f.up[0] / (c.mu0 * solar);
  const double r1 = single_scattering_albedo_isotropic(0.1, 1.0, 0.5);
  const double upper = r1 + -std::expm1(-0.1 / 0.5) * (1.0 - e2(0.05));
  EXPECT_GT(reflectance, r1);
  EXPECT_LT(reflectance, upper);
  EXPECT_NEAR(r1, 0.0763, 1e-4); // the bound itself, as quoted above
}

// All g-points at once give what one g-point at a time gives.
TEST(ShortwaveColumn, ManyPointsMatchOnePointAtATime) {
  constexpr std::size_t layers = 7, points = 13;
  std::mt19937_64 rng(3);
  std::vector<double> tau(layers * points), omega(layers * points), g(layers * points);
  std::vector<double> toa(points), a_dir(points), a_dif(points);
  std::vector<Column> columns;
  for (std::size_t q = 0; q < points; ++q) {
    Column c = random_column(rng, layers);
    c.mu0 = 0.37;
    for (std::size_t i = 0; i < layers; ++i) {
      tau[i * points + q] = c.tau[i];
      omega[i * points + q] = c.omega[i];
      g[i * points + q] = c.g[i];
    }
    toa[q] = solar;
    a_dir[q] = c.albedo_direct;
    a_dif[q] = c.albedo_diffuse;
    columns.push_back(c);
  }
  std::vector<double> up((layers + 1) * points), dir((layers + 1) * points), dif((layers + 1) * points);
  bs::ShortwaveWorkspace workspace;
  for (int repeat = 0; repeat < 2; ++repeat) { // the second call reuses the grown workspace
    bs::shortwave_fluxes_many(points, tau, omega, g, 0.37, toa, a_dir, a_dif, up, dir, dif, workspace);
    for (std::size_t q = 0; q < points; ++q) {
      const Fluxes one = run(columns[q]);
      for (std::size_t k = 0; k <= layers; ++k) {
        EXPECT_NEAR(up[k * points + q], one.up[k], 1e-13 * solar);
        EXPECT_NEAR(dir[k * points + q], one.direct[k], 1e-13 * solar);
        EXPECT_NEAR(dif[k * points + q], one.diffuse[k], 1e-13 * solar);
      }
    }
  }
  // The same workspace then serves a single point with more layers (another scratch layout).
  Column longer = random_column(rng, 25);
  std::vector<double> up1(26), dir1(26), dif1(26);
  bs::shortwave_fluxes(longer.tau, longer.omega, longer.g, longer.mu0, solar, longer.albedo_direct,
                       longer.albedo_diffuse, up1, dir1, dif1, workspace);
  const Fluxes fresh = run(longer);
  for (std::size_t k = 0; k <= 25; ++k) {
    EXPECT_EQ(up1[k], fresh.up[k]);
    EXPECT_EQ(dif1[k], fresh.diffuse[k]);
  }
}

TEST(ShortwaveColumn, RejectsBadInputNamingItemAndLayer) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  std::vector<double> tau{0.1, 0.2, 0.3, 0.4}, omega{0.5, 0.5, 0.5, 0.5}, g{0.1, 0.1, 0.1, 0.1};
  std::vector<double> up(5), dir(5), dif(5);
  auto expect_error = [&](const char* item, long layer, auto&& call) {
    try {
      call();
      ADD_FAILURE() << "no error for " << item;
    } catch (const bandstack::InputError& e) {
      EXPECT_EQ(e.place().item, item);
      if (layer >= 0) {
        ASSERT_TRUE(e.place().level.has_value()) << item;
        EXPECT_EQ(*e.place().level, layer);
      }
    }
  };
  auto solve = [&](double mu0, double a_dir, double a_dif, double toa) {
    bs::shortwave_fluxes(tau, omega, g, mu0, toa, a_dir, a_dif, up, dir, dif);
  };
  tau[2] = nan;
  expect_error("optical_depth", 2, [&] { solve(0.5, 0.1, 0.1, solar); });
  tau[2] = 0.3;
  omega[1] = 1.0 + 1e-12;
  expect_error("single_scattering_albedo", 1, [&] { solve(0.5, 0.1, 0.1, solar); });
  omega[1] = 0.5;
  g[3] = -1.5;
  expect_error("asymmetry_factor", 3, [&] { solve(0.5, 0.1, 0.1, solar); });
  g[3] = 0.1;
  expect_error("cos_zenith", -1, [&] { solve(0.0, 0.1, 0.1, solar); });  // night: the caller's job
  expect_error("cos_zenith", -1, [&] { solve(-0.3, 0.1, 0.1, solar); });
  expect_error("cos_zenith", -1, [&] { solve(nan, 0.1, 0.1, solar); });
  expect_error("surface_albedo_direct", -1, [&] { solve(0.5, 1.2, 0.1, solar); });
  expect_error("surface_albedo_diffuse", -1, [&] { solve(0.5, 0.1, nan, solar); });
  expect_error("toa_solar_flux", -1, [&] { solve(0.5, 0.1, 0.1, -1.0); });
  std::vector<double> short_omega{0.5, 0.5};
  expect_error("single_scattering_albedo", -1,
               [&] { bs::shortwave_fluxes(tau, short_omega, g, 0.5, solar, 0.1, 0.1, up, dir, dif); });
  std::vector<double> short_up(4);
  expect_error("shortwave_flux_up", -1,
               [&] { bs::shortwave_fluxes(tau, omega, g, 0.5, solar, 0.1, 0.1, short_up, dir, dif); });
  std::vector<double> none;
  expect_error("optical_depth", -1, [&] { bs::shortwave_fluxes(none, none, none, 0.5, solar, 0.1, 0.1, up, dir, dif); });
  bs::ShortwaveWorkspace ws;
  std::vector<double> one{solar};
  expect_error("g_points", -1, [&] {
    bs::shortwave_fluxes_many(0, tau, omega, g, 0.5, one, one, one, up, dir, dif, ws);
  });
  // In the many-point form, the message names the g-point too.
  std::vector<double> tau2{0.1, 0.2, 0.3, -0.4}, omega2(4, 0.5), g2(4, 0.0), toa2(2, solar), alb2(2, 0.1);
  std::vector<double> up2(6), dir2(6), dif2(6);
  try {
    bs::shortwave_fluxes_many(2, tau2, omega2, g2, 0.5, toa2, alb2, alb2, up2, dir2, dif2, ws);
    ADD_FAILURE();
  } catch (const bandstack::InputError& e) {
    EXPECT_EQ(*e.place().level, 1);
    EXPECT_NE(std::string(e.what()).find("g-point 1"), std::string::npos) << e.what();
  }
}
