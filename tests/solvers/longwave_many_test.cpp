#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/longwave.hpp"
#include "bandstack/solvers/longwave_many.hpp"
#include "solvers/vector_math.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <random>
#include <vector>

namespace bs = bandstack::solvers;

namespace {

double relative_difference(double a, double b) { return std::abs(a - b) / std::max(std::abs(b), 1e-300); }

} // namespace

// The vectorisable expm1 against the C library's (ISO C expm1: correctly rounded to ~1 ulp in
// glibc, common practice) over the range the solvers use, including |y| < 1e-10 where exp(y) - 1
// would lose every digit.
TEST(VectorExpm1, MatchesLibm) {
  std::mt19937_64 rng(7);
  std::uniform_real_distribution<double> exponent(-12.0, 2.85); // |y| from 1e-12 to ~700
  double worst = 0.0;
  for (int k = 0; k < 200000; ++k) {
    const double y = (k % 2 ? 1.0 : -1.0) * std::pow(10.0, exponent(rng));
    worst = std::max(worst, relative_difference(bs::detail::vector_expm1(y), std::expm1(y)));
  }
  EXPECT_LT(worst, 5e-16);
  EXPECT_EQ(bs::detail::vector_expm1(0.0), 0.0);
  EXPECT_EQ(bs::detail::vector_expm1(-1e6), -1.0); // e^-1e6 - 1 rounds to -1 (definition)
}

// Every point of the batched kernel must equal the single-point kernel (same equations) for
// optical depths from 0 to opaque, any emissivity and several angle sets.
TEST(LongwaveMany, EachPointMatchesSinglePointKernel) {
  constexpr std::size_t layers = 7;
  constexpr std::size_t points = 13;
  std::mt19937_64 rng(3);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::vector<double> tau(layers * points), source((layers + 1) * points), source_layer(layers * points);
  std::vector<double> surface(points), emissivity(points);
  for (std::size_t q = 0; q < points; ++q) {
    for (std::size_t i = 0; i < layers; ++i) {
      // log-uniform from 1e-9 to 1e4, plus exact zeros and values at the series switch
      double t = std::pow(10.0, -9.0 + 13.0 * unit(rng));
      if ((q + i) % 5 == 0) t = 0.0;
      if ((q + i) % 7 == 0) t = 0.01;
      tau[i * points + q] = t;
    }
    for (std::size_t k = 0; k <= layers; ++k)
      source[k * points + q] = 10.0 + 90.0 * unit(rng);
    for (std::size_t i = 0; i < layers; ++i)
      source_layer[i * points + q] = 10.0 + 90.0 * unit(rng);
    surface[q] = 50.0 + 60.0 * unit(rng);
    emissivity[q] = q % 3 == 0 ? 1.0 : unit(rng);
  }
  for (const auto& angles : {bs::gauss_quadrature(1), bs::gauss_quadrature(4), bs::diffusivity_quadrature(1.66)}) {
    std::vector<double> up((layers + 1) * points), down((layers + 1) * points);
    bs::LongwaveManyWorkspace workspace;
    bs::longwave_fluxes_many(points, tau, source, source_layer, surface, emissivity, angles, up, down, workspace);
    for (std::size_t q = 0; q < points; ++q) {
      std::vector<double> t1(layers), s1(layers + 1), l1(layers), u1(layers + 1), d1(layers + 1);
      for (std::size_t i = 0; i < layers; ++i) t1[i] = tau[i * points + q];
      for (std::size_t k = 0; k <= layers; ++k) s1[k] = source[k * points + q];
      for (std::size_t i = 0; i < layers; ++i) l1[i] = source_layer[i * points + q];
      bs::longwave_fluxes(t1, s1, l1, surface[q], emissivity[q], angles, u1, d1);
      for (std::size_t k = 0; k <= layers; ++k) {
        EXPECT_NEAR(up[k * points + q], u1[k], 1e-13 * u1[k]) << "point " << q << " level " << k;
        EXPECT_NEAR(down[k * points + q], d1[k], 1e-13 * std::max(d1[k], 1.0)) << "point " << q << " level " << k;
      }
    }
  }
}

// Transparent layers pass the surface emission up unchanged and send nothing down (Schwarzschild
// equation with zero optical depth, common practice).
TEST(LongwaveMany, TransparentColumn) {
  const std::size_t layers = 3, points = 2;
  std::vector<double> tau(layers * points, 0.0), source((layers + 1) * points, 80.0), layer(layers * points, 70.0);
  std::vector<double> surface{100.0, 50.0}, emissivity{1.0, 0.5};
  std::vector<double> up((layers + 1) * points), down((layers + 1) * points);
  bs::LongwaveManyWorkspace workspace;
  bs::longwave_fluxes_many(points, tau, source, layer, surface, emissivity, bs::gauss_quadrature(3), up, down,
                           workspace);
  for (std::size_t k = 0; k <= layers; ++k) {
    EXPECT_NEAR(up[k * points], bandstack::constants::pi * 100.0, 1e-12);
    EXPECT_NEAR(up[k * points + 1], 0.5 * bandstack::constants::pi * 50.0, 1e-12);
    EXPECT_EQ(down[k * points], 0.0);
  }
}

TEST(LongwaveMany, RejectsBadInput) {
  const std::size_t points = 2;
  std::vector<double> tau{0.1, 0.2}, source{1.0, 1.0, 2.0, 2.0}, layer{1.5, 1.5}, surface{3.0, 3.0};
  std::vector<double> emissivity{1.0, 1.0}, up(4), down(4);
  bs::LongwaveManyWorkspace ws;
  const auto angles = bs::gauss_quadrature(2);
  EXPECT_NO_THROW(bs::longwave_fluxes_many(points, tau, source, layer, surface, emissivity, angles, up, down, ws));
  auto bad_tau = tau;
  bad_tau[1] = std::nan("");
  EXPECT_THROW(bs::longwave_fluxes_many(points, bad_tau, source, layer, surface, emissivity, angles, up, down, ws),
               bandstack::InputError);
  bad_tau[1] = -1.0;
  EXPECT_THROW(bs::longwave_fluxes_many(points, bad_tau, source, layer, surface, emissivity, angles, up, down, ws),
               bandstack::InputError);
  auto bad_e = emissivity;
  bad_e[0] = 1.5;
  EXPECT_THROW(bs::longwave_fluxes_many(points, tau, source, layer, surface, bad_e, angles, up, down, ws),
               bandstack::InputError);
  std::vector<double> short_source{1.0, 1.0, 2.0};
  EXPECT_THROW(bs::longwave_fluxes_many(points, tau, short_source, layer, surface, emissivity, angles, up, down, ws),
               bandstack::InputError);
  std::vector<double> short_layer{1.5};
  EXPECT_THROW(bs::longwave_fluxes_many(points, tau, source, short_layer, surface, emissivity, angles, up, down, ws),
               bandstack::InputError);
  EXPECT_THROW(bs::longwave_fluxes_many(0, tau, source, layer, surface, emissivity, angles, up, down, ws),
               bandstack::InputError);
  try {
    auto inf_source = source;
    inf_source[3] = INFINITY;
    bs::longwave_fluxes_many(points, tau, inf_source, layer, surface, emissivity, angles, up, down, ws);
    FAIL() << "expected InputError";
  } catch (const bandstack::InputError& e) {
    EXPECT_EQ(e.place().level, 1); // value 3 is level 1, point 1
  }
  for (double bad : {-1.0, std::nan(""), HUGE_VAL}) {
    auto bad_layer = layer;
    bad_layer[1] = bad;
    try {
      bs::longwave_fluxes_many(points, tau, source, bad_layer, surface, emissivity, angles, up, down, ws);
      FAIL() << "expected InputError for layer source " << bad;
    } catch (const bandstack::InputError& e) {
      EXPECT_EQ(e.place().item, "planck_source_layer");
      EXPECT_EQ(e.place().level, 0); // value 1 is layer 0, point 1
    }
  }
}
