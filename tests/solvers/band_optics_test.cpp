#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/band_optics.hpp"
#include "bandstack/spectral/planck.hpp"
#include "solvers/band_test_support.hpp"

#include <algorithm>
#include <cmath>
#include <gtest/gtest.h>
#include <string>
#include <vector>

namespace bs = bandstack::solvers;
namespace sp = bandstack::spectral;
using band_test::Absorber;
using bandstack::Gas;

namespace {

const std::vector<double> p_nodes = band_test::log_nodes(100.0, 110000.0, 12); // Pa
const std::vector<double> t_nodes = band_test::linear_nodes(160.0, 340.0, 10);  // K
const std::vector<double> planck_nodes = band_test::linear_nodes(100.0, 400.0, 61);

// Mass of `gas` in each layer as the rest of bandstack computes it.
std::vector<double> mass(const bandstack::atmosphere::Column& c, Gas gas) {
  return bandstack::atmosphere::layer_gas_mass_kg_m2(c, gas);
}

// A column whose layer states lie between table nodes (off-node in p and T).
bandstack::atmosphere::Column off_node_column() { return band_test::make_column(9, 2000.0, 101000.0, 205.0, 297.0); }

} // namespace

// tau = kappa * m_gas for gases and kappa * m_h2o * e_h2o for the self-continuum, e = x_h2o p
// (units of spectral/absorber.hpp, definition). A table bilinear in p and T, kappa = c0 + c1 p +
// c2 T + c3 p T, is reproduced exactly between nodes by interpolation linear in p and T (a
// bilinear interpolant reproduces bilinear functions; analytic).
TEST(BandOptics, BilinearInPressureAndTemperatureIsExact) {
  const auto kappa = [](Absorber a, std::size_t g, double p, double t) {
    const double scale = 1.0 + static_cast<double>(g) + 3.0 * static_cast<double>(sp::index(a));
    return scale * (0.02 + 3e-6 * p + 1e-4 * (t - 150.0) + 2e-9 * p * (t - 150.0));
  };
  const std::vector<Absorber> present{Absorber::h2o, Absorber::co2, Absorber::h2o_self_continuum};
  const auto set = band_test::make_band_set({10.0, 500.0, 1000.0}, 3, p_nodes, t_nodes, planck_nodes, present, kappa);
  const auto column = off_node_column();
  const bs::BandOptics optics = bs::compute_band_optics(column, set);
  ASSERT_EQ(optics.layer_count, column.layer_count());
  ASSERT_EQ(optics.gpoint_count, 6u);
  const auto m_h2o = mass(column, Gas::h2o), m_co2 = mass(column, Gas::co2);
  for (std::size_t i = 0; i < column.layer_count(); ++i) {
    const double p = column.pressure_layer_pa[i], t = column.temperature_layer_k[i];
    const double e = column.gas(Gas::h2o)[i] * p;
    for (std::size_t g = 0; g < 6; ++g) {
      const double expected = kappa(Absorber::h2o, g, p, t) * m_h2o[i] + kappa(Absorber::co2, g, p, t) * m_co2[i] +
                              kappa(Absorber::h2o_self_continuum, g, p, t) * m_h2o[i] * e;
      EXPECT_NEAR(optics.optical_depth[i * 6 + g], expected, 1e-13 * expected) << "layer " << i << " g " << g;
    }
  }
}

// Pressure broadening, kappa proportional to p (Lorentz line wings; the idealised recipe's
// scaling), is exact with the default interpolation; linear in ln p overestimates it by
// cosh(ln(r)/2) - 1 ~ (ln r)^2 / 8 at the geometric mean of two nodes a factor r apart (convexity of
// e^x; analytic).
TEST(BandOptics, PressureBroadeningIsExactByDefault) {
  const auto kappa = [](Absorber, std::size_t, double p, double) { return 0.3 * p / 50000.0; };
  const auto set = band_test::make_band_set({10.0, 3000.0}, 1, p_nodes, t_nodes, planck_nodes, {Absorber::co2}, kappa);
  auto column = band_test::make_column(1, 0.0, 100000.0, 250.0, 250.0);
  const double geometric = std::sqrt(p_nodes[3] * p_nodes[4]);
  column.pressure_level_pa = {geometric - 1.0, geometric + 1.0};
  column.pressure_layer_pa = {geometric};
  const double m = mass(column, Gas::co2)[0];
  const double exact = 0.3 * geometric / 50000.0 * m;
  EXPECT_NEAR(bs::compute_band_optics(column, set).optical_depth[0], exact, 1e-13 * exact);

  bs::BandOptics optics;
  bs::BandOpticsWorkspace ws;
  const auto tables = bs::make_band_optics_tables(set, bs::PressureInterpolation::linear_in_ln_p);
  bs::compute_band_optics(column, tables, optics, ws);
  const double r = p_nodes[4] / p_nodes[3];
  EXPECT_NEAR(optics.optical_depth[0] / exact - 1.0, std::cosh(0.5 * std::log(r)) - 1.0, 1e-12);
}

// With linear_in_ln_p, kappa = c0 + c1 ln p + c2 T + c3 T ln p is reproduced exactly (bilinear in
// ln p and T; analytic).
TEST(BandOptics, LinearInLogPressureOption) {
  const auto kappa = [](Absorber, std::size_t g, double p, double t) {
    return (1.0 + static_cast<double>(g)) * (0.5 + 0.1 * std::log(p) + 1e-3 * t + 2e-4 * t * std::log(p));
  };
  const auto set = band_test::make_band_set({10.0, 3000.0}, 2, p_nodes, t_nodes, planck_nodes, {Absorber::o3}, kappa);
  auto column = off_node_column();
  column.gas(Gas::o3).assign(column.layer_count(), 5e-6);
  const auto tables = bs::make_band_optics_tables(set, bs::PressureInterpolation::linear_in_ln_p);
  bs::BandOptics optics;
  bs::BandOpticsWorkspace ws;
  bs::compute_band_optics(column, tables, optics, ws);
  const auto m = mass(column, Gas::o3);
  for (std::size_t i = 0; i < column.layer_count(); ++i)
    for (std::size_t g = 0; g < 2; ++g) {
      const double expected = kappa(Absorber::o3, g, column.pressure_layer_pa[i], column.temperature_layer_k[i]) * m[i];
      EXPECT_NEAR(optics.optical_depth[i * 2 + g], expected, 1e-13 * expected);
    }
}

// Below the lowest reference pressure (documented extrapolation in band_optics.hpp): gases scale
// kappa(p_min) by p / p_min, the self-continuum keeps kappa(p_min).
TEST(BandOptics, LowPressureExtrapolation) {
  const auto kappa = [](Absorber a, std::size_t, double p, double t) {
    return (a == Absorber::h2o ? 2.0 : 7.0) * (1.0 + 1e-3 * p) * (t / 200.0);
  };
  const std::vector<Absorber> present{Absorber::h2o, Absorber::h2o_self_continuum};
  auto set = band_test::make_band_set({10.0, 3000.0}, 1, p_nodes, t_nodes, planck_nodes, present, kappa);
  auto column = band_test::make_column(2, 0.0, 100.0, 220.0, 220.0); // layers at 25 and 75 Pa < 100 Pa
  const auto optics = bs::compute_band_optics(column, set);
  const auto m = mass(column, Gas::h2o);
  for (std::size_t i = 0; i < 2; ++i) {
    const double p = column.pressure_layer_pa[i];
    const double e = column.gas(Gas::h2o)[i] * p;
    const double at_min_gas = kappa(Absorber::h2o, 0, p_nodes[0], 220.0);
    const double at_min_cont = kappa(Absorber::h2o_self_continuum, 0, p_nodes[0], 220.0);
    const double expected = at_min_gas * p / p_nodes[0] * m[i] + at_min_cont * m[i] * e;
    EXPECT_NEAR(optics.optical_depth[i], expected, 1e-13 * expected) << "layer " << i;
  }
}

// Out of the tables: pressure above the highest node, layer temperatures outside the reference
// temperatures and level, layer or surface temperatures outside the Planck temperatures are errors
// that name the level (issue 3: "clear error outside the table's range").
TEST(BandOptics, OutOfRangeStatesAreErrors) {
  const auto kappa = [](Absorber, std::size_t, double, double) { return 1.0; };
  const auto set = band_test::make_band_set({10.0, 3000.0}, 1, p_nodes, t_nodes, planck_nodes, {Absorber::co2}, kappa);
  const auto tables = bs::make_band_optics_tables(set);
  bs::BandOptics optics;
  bs::BandOpticsWorkspace ws;
  const auto expect_error = [&](const bandstack::atmosphere::Column& c, const std::string& item, std::optional<long> level,
                                const std::string& fragment) {
    try {
      bs::compute_band_optics(c, tables, optics, ws);
      ADD_FAILURE() << "expected an InputError for " << item;
    } catch (const bandstack::InputError& e) {
      EXPECT_EQ(e.place().item, item);
      EXPECT_EQ(e.place().level, level);
      EXPECT_NE(std::string(e.what()).find(fragment), std::string::npos) << e.what();
    }
  };
  auto high = band_test::make_column(3, 1000.0, 120000.0, 220.0, 290.0); // last layer at ~1.0e5.. 1.2e5
  high.pressure_layer_pa[2] = 115000.0;
  expect_error(high, "pressure_layer", 2, "[100, 110000] Pa");
  auto cold = band_test::make_column(3, 1000.0, 100000.0, 220.0, 290.0);
  cold.temperature_layer_k[1] = 150.0;
  expect_error(cold, "temperature_layer", 1, "[160, 340] K");
  auto hot = band_test::make_column(3, 1000.0, 100000.0, 220.0, 290.0);
  hot.temperature_level_k[3] = 401.0;
  expect_error(hot, "temperature_level", 3, "[100, 400] K");
  auto surface = band_test::make_column(3, 1000.0, 100000.0, 220.0, 290.0);
  surface.surface_temperature_k = 99.0;
  expect_error(surface, "surface_temperature", std::nullopt, "Planck temperatures");
  {
    // Layer sources need the layer temperature inside the Planck temperatures too (here narrower
    // than the reference temperatures).
    const auto narrow = band_test::make_band_set({10.0, 3000.0}, 1, p_nodes, t_nodes, band_test::linear_nodes(200.0, 300.0, 21),
                                                 {Absorber::co2}, kappa);
    const auto narrow_tables = bs::make_band_optics_tables(narrow);
    auto cool_layer = band_test::make_column(3, 1000.0, 100000.0, 220.0, 290.0);
    cool_layer.temperature_layer_k[0] = 190.0; // inside [160, 340] K, outside [200, 300] K
    try {
      bs::compute_band_optics(cool_layer, narrow_tables, optics, ws);
      ADD_FAILURE() << "expected an InputError for the layer's Planck source";
    } catch (const bandstack::InputError& e) {
      EXPECT_EQ(e.place().item, "temperature_layer");
      EXPECT_EQ(e.place().level, 0);
      EXPECT_NE(std::string(e.what()).find("Planck temperatures"), std::string::npos) << e.what();
    }
  }
  // Exactly on the table's edges is inside.
  auto edge = band_test::make_column(2, 1000.0, 110000.0, 160.0, 340.0);
  edge.pressure_layer_pa[1] = 110000.0;
  edge.temperature_layer_k = {160.0, 340.0};
  EXPECT_NO_THROW(bs::compute_band_optics(edge, tables, optics, ws));
}

// The Planck sources of a band's g-points add up to the band integral of the Planck function
// (Planck fractions sum to 1 per band), to the documented accuracy of the Hermite table: 1e-9 of
// the band radiance or 1e-12 of sigma T^4 / pi, whichever is larger. Band integrals from
// spectral::planck_band_radiance (itself checked against quadrature and handbook fractions).
// Levels, the layer (at its own temperature, within the reference temperatures) and the surface.
TEST(BandOptics, PlanckSourcesSumToBandRadiance) {
  std::vector<double> edges{10, 250, 350, 500, 580, 630, 667, 700, 820, 980, 1080, 1180, 1390, 1480, 1800, 2080, 2500, 3000};
  const std::size_t per_band = 4;
  // Fractions linear in T that sum to 1 in each band: 1/n + (j - (n-1)/2) c (T - 250).
  const auto fraction = [&](std::size_t g, double t) {
    const double j = static_cast<double>(g % per_band);
    return 1.0 / static_cast<double>(per_band) + (j - 1.5) * 4e-4 * (t - 250.0);
  };
  const auto kappa = [](Absorber, std::size_t, double, double) { return 0.0; };
  const auto set = band_test::make_band_set(edges, per_band, p_nodes, t_nodes, planck_nodes, {}, kappa, fraction);
  const auto tables = bs::make_band_optics_tables(set);
  const std::size_t n_band = edges.size() - 1;
  for (double t = 100.0; t <= 400.0; t += 3.3) {
    auto column = band_test::make_column(1, 1000.0, 100000.0, 200.0, 200.0);
    column.temperature_level_k = {t, t};
    column.surface_temperature_k = t;
    const double t_layer = std::min(std::max(t - 7.0, 160.0), 340.0);
    column.temperature_layer_k = {t_layer};
    bs::BandOptics optics;
    bs::BandOpticsWorkspace ws;
    bs::compute_band_optics(column, tables, optics, ws);
    const double total = bandstack::constants::stefan_boltzmann_w_m2_k4 * std::pow(t, 4) / bandstack::constants::pi;
    for (std::size_t b = 0; b < n_band; ++b) {
      double sum = 0.0;
      for (std::size_t g = b * per_band; g < (b + 1) * per_band; ++g) sum += optics.source_level[g];
      const double exact = sp::planck_band_radiance(edges[b], edges[b + 1], t);
      const double tolerance = 1e-9 * exact + 1e-12 * total;
      EXPECT_NEAR(sum, exact, tolerance) << "band " << b << " T " << t;
      double layer_sum = 0.0;
      for (std::size_t g = b * per_band; g < (b + 1) * per_band; ++g) layer_sum += optics.source_layer[g];
      const double exact_layer = sp::planck_band_radiance(edges[b], edges[b + 1], t_layer);
      EXPECT_NEAR(layer_sum, exact_layer, 1e-9 * exact_layer + 1e-12 * total) << "band " << b << " T " << t_layer;
      EXPECT_NEAR(optics.source_layer[b * per_band + 2] / layer_sum, fraction(2, t_layer), 1e-13);
      EXPECT_NEAR(bs::tabulated_band_radiance(tables, b, t), exact, tolerance);
      // Each g-point carries its interpolated fraction (here linear in T, so exactly).
      EXPECT_NEAR(optics.source_surface[b * per_band + 1] / sum, fraction(1, t), 1e-13);
    }
  }
}

// The tables are checked on the way in (spectral::validate): a band whose fractions do not sum to
// 1 is rejected.
TEST(BandOptics, RejectsInvalidSet) {
  const auto kappa = [](Absorber, std::size_t, double, double) { return 1.0; };
  auto set = band_test::make_band_set({10.0, 3000.0}, 2, p_nodes, t_nodes, planck_nodes, {Absorber::co2}, kappa);
  set.planck_fraction[0] = 0.9;
  EXPECT_THROW((void)bs::make_band_optics_tables(set), bandstack::InputError);
}

// Absorbers with no gas in the column add nothing; a repeated call with the same workspace gives
// bit-identical results (no state carried between columns).
TEST(BandOptics, WorkspaceReuseIsStateless) {
  const auto kappa = [](Absorber a, std::size_t g, double p, double) {
    return (1.0 + static_cast<double>(g)) * (a == Absorber::ch4 ? 5.0 : 1.0) * p / 1e5;
  };
  const auto set = band_test::make_band_set({10.0, 800.0, 3000.0}, 3, p_nodes, t_nodes, planck_nodes,
                                            {Absorber::co2, Absorber::ch4}, kappa);
  const auto tables = bs::make_band_optics_tables(set);
  bs::BandOptics first, second, other;
  bs::BandOpticsWorkspace ws;
  const auto column = off_node_column(); // no CH4
  bs::compute_band_optics(column, tables, first, ws);
  bs::compute_band_optics(band_test::make_column(4, 500.0, 80000.0, 190.0, 260.0), tables, other, ws);
  bs::compute_band_optics(column, tables, second, ws);
  EXPECT_EQ(first.optical_depth, second.optical_depth);
  EXPECT_EQ(first.source_level, second.source_level);
  EXPECT_EQ(first.source_layer, second.source_layer);
  EXPECT_EQ(first.source_surface, second.source_surface);
  const auto m = mass(column, Gas::co2);
  const double p = column.pressure_layer_pa[0];
  EXPECT_NEAR(first.optical_depth[0], p / 1e5 * m[0], 1e-13 * p / 1e5 * m[0]);
}
