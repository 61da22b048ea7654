// One delta-Eddington layer against two independent evaluations written here: the closed forms
// of Meador & Weaver (1980) as printed (in long double), and a numerical integration of the
// two-stream equations they solve.
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/delta_eddington.hpp"
#include "solvers/delta_eddington_kernel.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <algorithm>
#include <limits>
#include <random>
#include <utility>
#include <vector>

namespace bs = bandstack::solvers;

namespace {

using real = long double;

// Delta scaling as printed by Joseph, Wiscombe & Weinman (1976, J. Atmos. Sci. 33, 2452), eqs. for
// f = g^2: tau' = (1 - omega f) tau, omega' = (1 - f) omega / (1 - omega f), g' = (g - f)/(1 - f).
struct Scaled {
  real tau, omega, g;
};
// (g - f)/(1 - f) is written g/(1 + g), equal for f = g^2 and finite at g = 1; omega' = 1 when
// omega = 1, also at f = 1 where the printed quotient is 0/0.
Scaled jww_scaling(real tau, real omega, real g) {
  const real f = g > 0 ? g * g : 0; // bandstack applies it for g > 0 only (documented)
  const real omega_scaled = omega == 1 ? 1 : (1 - f) * omega / (1 - omega * f);
  return {(1 - omega * f) * tau, omega_scaled, g > 0 ? g / (1 + g) : g};
}

// Eddington coefficients, Meador & Weaver (1980, J. Atmos. Sci. 37, 630) Table 1 (from memory).
struct Gammas {
  real g1, g2, g3, g4;
};
Gammas eddington_gammas(real omega, real g, real mu0) {
  return {(7 - omega * (4 + 3 * g)) / 4, -(1 - omega * (4 - 3 * g)) / 4, (2 - 3 * g * mu0) / 4,
          1 - (2 - 3 * g * mu0) / 4};
}

struct Reference {
  real r_dif, t_dif, r_dir, t_dir_dif, t_dir;
};

// Meador & Weaver (1980) eqs. (14) and (15) for the direct beam (T there includes the direct
// beam, removed here) and the homogeneous solution for diffuse incidence, as printed (from
// memory; the numerical check below confirms them), evaluated literally in long double.
Reference meador_weaver(real tau, real omega, real g, real mu0) {
  const Scaled s = jww_scaling(tau, omega, g);
  const Gammas c = eddington_gammas(s.omega, s.g, mu0);
  const real k = std::sqrt(c.g1 * c.g1 - c.g2 * c.g2);
  const real a1 = c.g1 * c.g4 + c.g2 * c.g3;
  const real a2 = c.g1 * c.g3 + c.g2 * c.g4;
  const real t = s.tau;
  const real ep = std::exp(k * t), em = std::exp(-k * t), direct = std::exp(-t / mu0);
  const real den = (1 - k * k * mu0 * mu0) * ((k + c.g1) * ep + (k - c.g1) * em);
  Reference r{};
  r.r_dir = s.omega / den *
            ((1 - k * mu0) * (a2 + k * c.g3) * ep - (1 + k * mu0) * (a2 - k * c.g3) * em -
             2 * k * (c.g3 - a2 * mu0) * direct);
  const real total = direct * (1 - s.omega / den *
                                       ((1 + k * mu0) * (a1 + k * c.g4) * ep - (1 - k * mu0) * (a1 - k * c.g4) * em -
                                        2 * k * (c.g4 + a1 * mu0) * std::exp(t / mu0)));
  r.t_dir_dif = total - direct;
  r.t_dir = direct;
  const real dif_den = k * std::cosh(k * t) + c.g1 * std::sinh(k * t);
  r.r_dif = c.g2 * std::sinh(k * t) / dif_den;
  r.t_dif = k / dif_den;
  return r;
}

// The conservative limit (omega' = 1, k = 0) of the same equations, Meador & Weaver (1980)
// (from memory): R = [g1 tau + (g3 - g1 mu0)(1 - e^{-tau/mu0})] / (1 + g1 tau), total T = 1 - R,
// R_dif = g1 tau / (1 + g1 tau).
Reference meador_weaver_conservative(real tau, real g, real mu0) {
  const Scaled s = jww_scaling(tau, 1, g);
  const Gammas c = eddington_gammas(1, s.g, mu0);
  const real direct = std::exp(-s.tau / mu0);
  Reference r{};
  r.r_dir = (c.g1 * s.tau + (c.g3 - c.g1 * mu0) * (1 - direct)) / (1 + c.g1 * s.tau);
  r.t_dir_dif = 1 - r.r_dir - direct;
  r.t_dir = direct;
  r.r_dif = c.g1 * s.tau / (1 + c.g1 * s.tau);
  r.t_dif = 1 / (1 + c.g1 * s.tau);
  return r;
}

// The two-stream equations, Meador & Weaver (1980) eq. (2), with flux normalised to a unit direct
// beam on a horizontal surface at the top (pi F0 = 1/mu0):
//   dU/dtau = g1 U - g2 D - g3 omega e^{-tau/mu0} / mu0,  dD/dtau = g2 U - g1 D + g4 omega e^{-tau/mu0} / mu0,
// integrated by classical Runge-Kutta (fourth order) from the top with D(0) = 0 (for the direct
// beam) or D(0) = 1, no beam (diffuse incidence), and U(0) chosen by superposition so that
// U(tau) = 0 (a black surface below).
struct OdeResult {
  double r_dir, t_dir_dif, r_dif, t_dif;
};
OdeResult two_stream_ode(double tau, double omega, double g, double mu0) {
  const Scaled s = jww_scaling(tau, omega, g);
  const Gammas c = eddington_gammas(s.omega, s.g, mu0);
  const int steps = 40000;
  const real h = s.tau / steps;
  auto integrate = [&](real u0, real d0, real beam) {
    real u = u0, d = d0;
    auto f = [&](real x, real uu, real dd, real& du, real& dd_out) {
      const real src = beam * s.omega * std::exp(-x / mu0) / mu0;
      du = c.g1 * uu - c.g2 * dd - c.g3 * src;
      dd_out = c.g2 * uu - c.g1 * dd + c.g4 * src;
    };
    for (int m = 0; m < steps; ++m) {
      const real x = h * m;
      real k1u, k1d, k2u, k2d, k3u, k3d, k4u, k4d;
      f(x, u, d, k1u, k1d);
      f(x + h / 2, u + h / 2 * k1u, d + h / 2 * k1d, k2u, k2d);
      f(x + h / 2, u + h / 2 * k2u, d + h / 2 * k2d, k3u, k3d);
      f(x + h, u + h * k3u, d + h * k3d, k4u, k4d);
      u += h / 6 * (k1u + 2 * k2u + 2 * k3u + k4u);
      d += h / 6 * (k1d + 2 * k2d + 2 * k3d + k4d);
    }
    return std::pair<real, real>{u, d};
  };
  const auto [ua, da] = integrate(0, 0, 1); // beam, U(0) = 0
  const auto [ub, db] = integrate(1, 0, 0); // homogeneous, U(0) = 1
  const auto [uc, dc] = integrate(0, 1, 0); // homogeneous, D(0) = 1
  OdeResult r{};
  const real u_beam = -ua / ub;
  r.r_dir = static_cast<double>(u_beam);
  r.t_dir_dif = static_cast<double>(da + u_beam * db);
  const real u_dif = -uc / ub;
  r.r_dif = static_cast<double>(u_dif);
  r.t_dif = static_cast<double>(dc + u_dif * db);
  return r;
}

// |a - b| within rel of max(|b|, 1e-3): relative for values of order 1, absolute below.
void expect_close(double a, real b, double rel, const char* what) {
  const double bd = static_cast<double>(b);
  EXPECT_LE(std::abs(a - bd), rel * std::max(std::abs(bd), 1e-3)) << what << ": " << a << " vs " << bd;
}

double k_of(double omega, double g) {
  const Scaled s = jww_scaling(1, omega, g);
  return static_cast<double>(std::sqrt(3 * (1 - s.omega) * (1 - s.omega * s.g)));
}

} // namespace

// The kernel's own elementary functions against the C library's (glibc sqrt is correctly
// rounded, IEEE 754; exp/expm1 within ~1 ulp; common practice), over the ranges the kernel uses.
TEST(DeltaEddingtonKernel, ElementaryFunctionsMatchLibm) {
  namespace d = bandstack::solvers::detail;
  std::mt19937_64 rng(9);
  std::uniform_real_distribution<double> exponent(-300.0, std::log10(3.0));
  double worst_root = 0.0, worst_inverse = 0.0;
  for (int m = 0; m < 100000; ++m) {
    const double x = std::pow(10.0, exponent(rng));
    const d::SqrtParts r = d::vector_sqrt(x);
    worst_root = std::max(worst_root, std::abs(r.root - std::sqrt(x)) / std::sqrt(x));
    worst_inverse = std::max(worst_inverse, std::abs(r.inverse * std::sqrt(x) - 1.0));
  }
  EXPECT_LT(worst_root, 2.3e-16);
  EXPECT_LT(worst_inverse, 5e-16);
  EXPECT_EQ(d::vector_sqrt(0.0).root, 0.0);
  std::uniform_real_distribution<double> z_range(-750.0, 0.0);
  double worst_exp = 0.0, worst_expm1 = 0.0;
  for (int m = 0; m < 100000; ++m) {
    const double z = m % 2 ? z_range(rng) : z_range(rng) * 1e-3;
    const d::ExpParts p = d::exp_parts(z);
    if (z > -700.0) worst_exp = std::max(worst_exp, std::abs(p.exp - std::exp(z)) / std::exp(z));
    worst_expm1 = std::max(worst_expm1, std::abs(p.expm1 - std::expm1(z)) / std::abs(std::expm1(z)));
  }
  EXPECT_LT(worst_exp, 5e-16);
  EXPECT_LT(worst_expm1, 5e-16);
  EXPECT_EQ(d::exp_parts(-800.0).exp, 0.0);
}

// Joseph et al. (1976): f = g^2; tau' = (1 - omega f) tau; omega' = (1 - f) omega / (1 - omega f);
// g' = g / (1 + g). Values worked by hand from those formulas.
TEST(DeltaEddingtonScaling, MatchesJosephEtAl) {
  // tau = 2, omega = 0.9, g = 0.8: f = 0.64, 1 - omega f = 0.424, tau' = 0.848,
  // omega' = 0.36 * 0.9 / 0.424 = 0.764150943..., g' = 0.8 / 1.8 = 0.444...
  const bs::DeltaScaled s = bs::delta_eddington_scaling(2.0, 0.9, 0.8);
  EXPECT_NEAR(s.optical_depth, 0.848, 1e-15);
  EXPECT_NEAR(s.single_scattering_albedo, 0.324 / 0.424, 1e-15);
  EXPECT_NEAR(s.asymmetry, 0.8 / 1.8, 1e-15);
  // No forward peak for g <= 0: unchanged (bandstack's documented choice).
  const bs::DeltaScaled b = bs::delta_eddington_scaling(2.0, 0.9, -0.3);
  EXPECT_EQ(b.optical_depth, 2.0);
  EXPECT_EQ(b.single_scattering_albedo, 0.9);
  EXPECT_EQ(b.asymmetry, -0.3);
  // omega = g = 1: everything scattered straight ahead, the layer vanishes.
  const bs::DeltaScaled f = bs::delta_eddington_scaling(5.0, 1.0, 1.0);
  EXPECT_EQ(f.optical_depth, 0.0);
  EXPECT_EQ(f.single_scattering_albedo, 1.0);
  EXPECT_EQ(f.asymmetry, 0.5);
}

// The kernel against the printed closed forms over thin to thick layers, absorbing to nearly
// conservative, isotropic to cloud-like, high to low sun. Points within 1e-3 of k mu0 = 1 are
// left out here (the printed forms are 0/0 there) and covered by the numerical solution below.
TEST(DeltaEddingtonLayer, MatchesMeadorWeaverClosedForms) {
  int compared = 0;
  for (double tau : {1e-6, 1e-3, 0.1, 1.0, 5.0, 30.0})
    for (double omega : {0.0, 0.3, 0.9, 0.999})
      for (double g : {-0.5, 0.0, 0.5, 0.85})
        for (double mu0 : {0.05, 0.3, 0.7, 1.0}) {
          if (std::abs(1.0 - k_of(omega, g) * mu0) < 1e-3) continue;
          const bs::LayerReflectance l = bs::delta_eddington_layer(tau, omega, g, mu0);
          const Reference r = meador_weaver(tau, omega, g, mu0);
          expect_close(l.reflectance_diffuse, r.r_dif, 1e-12, "R diffuse");
          expect_close(l.transmittance_diffuse, r.t_dif, 1e-12, "T diffuse");
          expect_close(l.reflectance_direct, r.r_dir, 1e-12, "R direct");
          expect_close(l.transmittance_direct_diffuse, r.t_dir_dif, 1e-12, "T direct->diffuse");
          expect_close(l.transmittance_direct, r.t_dir, 1e-13, "T direct");
          EXPECT_NEAR(l.absorptance_diffuse, static_cast<double>(1 - r.r_dif - r.t_dif), 1e-12);
          ++compared;
        }
  EXPECT_GT(compared, 350);
}

// omega = 1 exactly (k = 0, where the general forms are 0/0): the conservative closed forms.
TEST(DeltaEddingtonLayer, ConservativeMatchesClosedForms) {
  for (double tau : {1e-8, 1e-3, 0.5, 3.0, 100.0, 1e6})
    for (double g : {-0.9, 0.0, 0.3, 0.85, 1.0})
      for (double mu0 : {0.01, 0.2, 0.5, 1.0}) {
        const bs::LayerReflectance l = bs::delta_eddington_layer(tau, 1.0, g, mu0);
        const Reference r = meador_weaver_conservative(tau, g, mu0);
        expect_close(l.reflectance_direct, r.r_dir, 1e-12, "R direct");
        expect_close(l.transmittance_direct_diffuse, r.t_dir_dif, 1e-12, "T direct->diffuse");
        expect_close(l.reflectance_diffuse, r.r_dif, 1e-12, "R diffuse");
        expect_close(l.transmittance_diffuse, r.t_dif, 1e-12, "T diffuse");
        // No absorption (energy conservation of the two-stream equations with omega = 1).
        EXPECT_EQ(l.absorptance_diffuse, 0.0);
        EXPECT_NEAR(l.reflectance_direct + l.transmittance_direct_diffuse + l.transmittance_direct, 1.0, 1e-13);
        EXPECT_NEAR(l.reflectance_diffuse + l.transmittance_diffuse, 1.0, 1e-13);
      }
}

// The closed forms against the equations they solve (numerical integration above), including
// the removable singularity k mu0 = 1 hit exactly, omega = 1 and the approach to it, and omega = 0.
TEST(DeltaEddingtonLayer, SolvesTheTwoStreamEquations) {
  struct Case {
    double tau, omega, g, mu0;
  };
  std::vector<Case> cases{{1.0, 0.9, 0.7, 0.5},   {0.3, 1.0, 0.2, 0.8},     {2.0, 0.5, 0.0, 1.0},
                          {0.05, 0.99, 0.85, 0.2}, {1.5, 1.0 - 1e-9, 0.5, 0.6}, {3.0, 0.0, 0.0, 0.4},
                          {1.0, 0.6, -0.4, 0.9}};
  // k mu0 = 1 exactly (k = 1.2369... for omega = 0.4, g = 0.1 after scaling).
  cases.push_back({1.2, 0.4, 0.1, 1.0 / k_of(0.4, 0.1)});
  cases.push_back({0.7, 0.2, 0.0, 1.0 / k_of(0.2, 0.0)});
  for (const Case& c : cases) {
    const bs::LayerReflectance l = bs::delta_eddington_layer(c.tau, c.omega, c.g, c.mu0);
    const OdeResult r = two_stream_ode(c.tau, c.omega, c.g, c.mu0);
    EXPECT_NEAR(l.reflectance_direct, r.r_dir, 1e-11) << c.tau << " " << c.omega << " " << c.g << " " << c.mu0;
    EXPECT_NEAR(l.transmittance_direct_diffuse, r.t_dir_dif, 1e-11) << c.tau << " " << c.omega << " " << c.mu0;
    EXPECT_NEAR(l.reflectance_diffuse, r.r_dif, 1e-11) << c.tau << " " << c.omega;
    EXPECT_NEAR(l.transmittance_diffuse, r.t_dif, 1e-11) << c.tau << " " << c.omega;
  }
}

// Near k mu0 = 1 the kernel switches between a series and the plain quotient (at
// |tau/mu0 (1 - k mu0)| = 0.05). Sweeping mu0 across both switches in steps of 1e-5 (relative),
// the fourth differences of R and T must stay at the size smooth functions give (below ~1e-12
// of the value at this step); a mismatch between the two branches would show as a jump above it.
TEST(DeltaEddingtonLayer, SmoothAcrossInternalSwitches) {
  const double mu_star = 1.0 / k_of(0.3, 0.2);
  for (double tau : {0.01, 0.5, 4.0, 40.0}) {
    std::vector<double> r, t;
    for (int m = -2000; m <= 2000; ++m) {
      const double mu0 = std::min(1.0, mu_star * (1.0 + 1e-5 * m));
      const bs::LayerReflectance l = bs::delta_eddington_layer(tau, 0.3, 0.2, mu0);
      r.push_back(l.reflectance_direct);
      t.push_back(l.transmittance_direct_diffuse);
    }
    auto fourth = [](const std::vector<double>& f, std::size_t j) {
      return std::abs(f[j + 2] - 4 * f[j + 1] + 6 * f[j] - 4 * f[j - 1] + f[j - 2]) / (std::abs(f[j]) + 1e-300);
    };
    double worst = 0.0;
    for (std::size_t j = 2; j + 2 < r.size(); ++j) worst = std::max({worst, fourth(r, j), fourth(t, j)});
    EXPECT_LT(worst, 1e-10) << "tau " << tau;
  }
}

// Limits that need no formula: an empty layer passes everything; a non-scattering layer only
// attenuates the beam (Beer-Lambert, exp(-tau/mu0)); huge optical depths stay finite.
TEST(DeltaEddingtonLayer, Limits) {
  const bs::LayerReflectance empty = bs::delta_eddington_layer(0.0, 0.7, 0.5, 0.6);
  EXPECT_EQ(empty.transmittance_direct, 1.0);
  EXPECT_EQ(empty.transmittance_diffuse, 1.0);
  EXPECT_EQ(empty.reflectance_diffuse, 0.0);
  EXPECT_NEAR(empty.reflectance_direct, 0.0, 1e-16);
  EXPECT_NEAR(empty.transmittance_direct_diffuse, 0.0, 1e-16);
  for (double tau : {1e-9, 0.3, 7.0, 800.0}) {
    const bs::LayerReflectance a = bs::delta_eddington_layer(tau, 0.0, 0.6, 0.45);
    EXPECT_EQ(a.reflectance_direct, 0.0);
    EXPECT_EQ(a.transmittance_direct_diffuse, 0.0);
    // tau/mu0 is formed as tau * (1/mu0): one rounding, amplified by tau/mu0 in the exponential.
    const double beer = std::exp(-tau / 0.45);
    EXPECT_NEAR(a.transmittance_direct, beer, 4e-16 * (1.0 + tau / 0.45) * beer);
  }
  for (double tau : {1e20, 1e100, 1e300}) {
    for (double omega : {0.0, 0.5, 1.0}) {
      const bs::LayerReflectance l = bs::delta_eddington_layer(tau, omega, 0.0, 1e-3);
      EXPECT_TRUE(std::isfinite(l.reflectance_direct) && std::isfinite(l.transmittance_direct_diffuse) &&
                  std::isfinite(l.reflectance_diffuse) && std::isfinite(l.transmittance_diffuse));
      EXPECT_EQ(l.transmittance_direct, 0.0);
      if (omega == 1.0) {
        EXPECT_NEAR(l.reflectance_direct, 1.0, 1e-15);
      }
    }
  }
}

TEST(DeltaEddingtonLayer, RejectsBadInput) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  EXPECT_THROW((void)bs::delta_eddington_layer(nan, 0.5, 0.5, 0.5), bandstack::InputError);
  EXPECT_THROW((void)bs::delta_eddington_layer(-1.0, 0.5, 0.5, 0.5), bandstack::InputError);
  EXPECT_THROW((void)bs::delta_eddington_layer(1.0, 1.01, 0.5, 0.5), bandstack::InputError);
  EXPECT_THROW((void)bs::delta_eddington_layer(1.0, 0.5, -1.2, 0.5), bandstack::InputError);
  EXPECT_THROW((void)bs::delta_eddington_layer(1.0, 0.5, 0.5, 0.0), bandstack::InputError);
  EXPECT_THROW((void)bs::delta_eddington_layer(1.0, 0.5, 0.5, 1.5), bandstack::InputError);
  EXPECT_THROW((void)bs::delta_eddington_scaling(1.0, nan, 0.5), bandstack::InputError);
  try {
    (void)bs::delta_eddington_layer(1.0, 0.5, 2.0, 0.5);
    FAIL();
  } catch (const bandstack::InputError& e) {
    EXPECT_EQ(e.place().item, "asymmetry_factor");
  }
}
