#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/grey.hpp"
#include "bandstack/spectral/planck.hpp"
#include "solvers/band_test_support.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <vector>

namespace bs = bandstack::solvers;
namespace sp = bandstack::spectral;
namespace constants = bandstack::constants;
using band_test::Absorber;
using bandstack::Gas;

namespace {

const std::vector<double> p_nodes = band_test::log_nodes(10.0, 110000.0, 15);
const std::vector<double> t_nodes = band_test::linear_nodes(150.0, 350.0, 9);
const std::vector<double> planck_nodes = band_test::linear_nodes(100.0, 400.0, 31);

// Several bands, several g-points each, kappa varying with g, p and T, three absorbers.
sp::BandSet realistic_set() {
  const auto kappa = [](Absorber a, std::size_t g, double p, double t) {
    const double strength = std::pow(10.0, -3.0 + 0.35 * static_cast<double>(g % 16));
    const double base = a == Absorber::co2 ? 5.0 : (a == Absorber::h2o ? 1.0 : 1e-4);
    return base * strength * (p / 50000.0) * (1.0 + 2e-3 * (t - 250.0));
  };
  const auto fraction = [](std::size_t g, double t) {
    const double w = 1.0 + static_cast<double>(g % 4) * t / 250.0;
    return w / (4.0 + 6.0 * t / 250.0);
  };
  return band_test::make_band_set({10, 350, 500, 630, 700, 820, 1080, 1400, 2000, 3000}, 4, p_nodes, t_nodes,
                                  planck_nodes, {Absorber::h2o, Absorber::co2, Absorber::h2o_self_continuum}, kappa,
                                  fraction);
}

bandstack::atmosphere::Column test_column() { return band_test::make_column(20, 50.0, 100000.0, 200.0, 295.0); }

} // namespace

// Grey limit: one band covering [0, 1e5] cm-1 (all but e^-480 of the Planck spectrum at 300 K),
// one g-point with Planck fraction 1 and pressure-independent kappa is the grey problem
// (grey.hpp: source sigma T^4 / pi, the same kernel equations; definition of the grey case).
// Tolerance 1e-10: the grey source uses CODATA's rounded sigma, 3e-11 below the value the exact
// 2019 SI constants give the Planck integral (CODATA 2018).
TEST(BandLongwave, GreyLimitReproducesGreySolver) {
  const auto kappa = [](Absorber a, std::size_t, double, double) { return a == Absorber::h2o ? 0.08 : 0.5; };
  const auto set = band_test::make_band_set({0.0, 1e5}, 1, p_nodes, t_nodes, planck_nodes,
                                            {Absorber::h2o, Absorber::co2}, kappa);
  auto column = test_column();
  column.surface_emissivity = 0.93;
  bs::GreyOptics grey;
  grey.mass_absorption_m2_kg[bandstack::index(Gas::h2o)] = 0.08;
  grey.mass_absorption_m2_kg[bandstack::index(Gas::co2)] = 0.5;
  for (int n_angles : {1, 4}) {
    const auto angles = bs::gauss_quadrature(n_angles);
    const bs::LongwaveResult band = bs::solve_band_longwave(column, set, angles);
    const bs::LongwaveResult ref = bs::solve_grey_longwave(column, grey, angles);
    for (std::size_t k = 0; k <= column.layer_count(); ++k) {
      EXPECT_NEAR(band.flux_up[k], ref.flux_up[k], 1e-10 * ref.flux_up[k]) << "level " << k;
      EXPECT_NEAR(band.flux_down[k], ref.flux_down[k], 1e-10 * ref.flux_up[k]) << "level " << k;
    }
    for (std::size_t i = 0; i < column.layer_count(); ++i)
      EXPECT_NEAR(band.heating_rate_k_day[i], ref.heating_rate_k_day[i], 1e-8) << "layer " << i;
  }
}

// Totals are sums over bands; band heating rates add up to the total (linearity of the heating
// rate in the fluxes); every field of the result is filled with the band edges.
TEST(BandLongwave, BandsAddUpToTotals) {
  const auto set = realistic_set();
  const auto column = test_column();
  const bs::LongwaveResult r = bs::solve_band_longwave(column, set, bs::gauss_quadrature(2));
  const std::size_t n = column.layer_count(), levels = n + 1, n_band = set.band_count();
  ASSERT_EQ(r.band_count(), n_band);
  EXPECT_EQ(r.band_lower_cm1, set.band_lower_cm1);
  EXPECT_EQ(r.band_upper_cm1, set.band_upper_cm1);
  ASSERT_EQ(r.flux_up_by_band.size(), n_band * levels);
  ASSERT_EQ(r.flux_down_by_band.size(), n_band * levels);
  ASSERT_EQ(r.heating_rate_by_band.size(), n_band * n);
  for (std::size_t k = 0; k < levels; ++k) {
    double up = 0.0, down = 0.0;
    for (std::size_t b = 0; b < n_band; ++b) {
      up += r.flux_up_by_band[b * levels + k];
      down += r.flux_down_by_band[b * levels + k];
    }
    EXPECT_NEAR(up, r.flux_up[k], 1e-12 * r.flux_up[k]);
    EXPECT_NEAR(down, r.flux_down[k], 1e-12 * r.flux_up[k]);
  }
  for (std::size_t i = 0; i < n; ++i) {
    double h = 0.0;
    for (std::size_t b = 0; b < n_band; ++b) h += r.heating_rate_by_band[b * n + i];
    EXPECT_NEAR(h, r.heating_rate_k_day[i], 1e-12 * std::abs(r.heating_rate_k_day[i]) + 1e-12);
  }
  EXPECT_GT(r.olr(), 100.0);
  EXPECT_LT(r.olr(), constants::stefan_boltzmann_w_m2_k4 * std::pow(295.0, 4));
}

// Energy conservation (first law for the column, heating.hpp): the mass-weighted column heating
// equals the net flux entering at the top minus the net flux leaving at the surface.
TEST(BandLongwave, ColumnHeatingBalancesBoundaryFluxes) {
  const auto set = realistic_set();
  const auto column = test_column();
  const bs::LongwaveResult r = bs::solve_band_longwave(column, set, bs::gauss_quadrature(3));
  const std::size_t n = column.layer_count();
  double column_heating_w_m2 = 0.0;
  for (std::size_t i = 0; i < n; ++i) {
    const double dp = column.pressure_level_pa[i + 1] - column.pressure_level_pa[i];
    column_heating_w_m2 += r.heating_rate_k_day[i] / constants::seconds_per_day * constants::specific_heat_dry_air_j_kg_k *
                           dp / column.gravity_m_s2;
  }
  const double net_top = r.flux_down[0] - r.flux_up[0];
  const double net_surface = r.flux_down[n] - r.flux_up[n];
  EXPECT_NEAR(column_heating_w_m2, net_top - net_surface, 1e-10 * r.olr());
  EXPECT_EQ(r.flux_down[0], 0.0); // nothing enters at the top
}

// Surface emissivity per band: with a transparent atmosphere the OLR of band b is
// e_b * pi * B_b(T_s) (Kirchhoff; definition of emissivity), and an emissivity equal in every
// band is the same as the column's emissivity.
TEST(BandLongwave, SurfaceEmissivityByBand) {
  const auto kappa = [](Absorber, std::size_t, double, double) { return 0.0; };
  const std::vector<double> edges{10.0, 600.0, 1200.0, 3000.0};
  const auto set = band_test::make_band_set(edges, 2, p_nodes, t_nodes, planck_nodes, {Absorber::co2}, kappa);
  const auto column = test_column();
  const std::vector<double> emissivity{0.9, 0.5, 0.0};
  const bs::LongwaveResult r = bs::solve_band_longwave(column, set, bs::gauss_quadrature(2), emissivity);
  const std::size_t levels = column.layer_count() + 1;
  for (std::size_t b = 0; b < 3; ++b) {
    const double expected = emissivity[b] * constants::pi * sp::planck_band_radiance(edges[b], edges[b + 1], 295.0);
    EXPECT_NEAR(r.flux_up_by_band[b * levels], expected, 1e-9 * expected + 1e-12) << "band " << b;
  }
  auto grey_surface = column;
  grey_surface.surface_emissivity = 0.7;
  const std::vector<double> same{0.7, 0.7, 0.7};
  const auto a = bs::solve_band_longwave(grey_surface, set, bs::gauss_quadrature(2));
  const auto b = bs::solve_band_longwave(column, set, bs::gauss_quadrature(2), same);
  EXPECT_EQ(a.flux_up, b.flux_up);
  const std::vector<double> wrong_size{0.5, 0.5};
  EXPECT_THROW((void)bs::solve_band_longwave(column, set, bs::gauss_quadrature(2), wrong_size), bandstack::InputError);
  const std::vector<double> out_of_range{0.5, 1.5, 0.5};
  EXPECT_THROW((void)bs::solve_band_longwave(column, set, bs::gauss_quadrature(2), out_of_range), bandstack::InputError);
}

// The batch overload with a reused workspace and result gives the same numbers as the one-call
// form, also after solving a column of another size in between.
TEST(BandLongwave, WorkspaceOverloadMatchesConvenienceForm) {
  const auto set = realistic_set();
  const auto tables = bs::make_band_optics_tables(set);
  const auto column = test_column();
  bs::BandLongwaveWorkspace ws;
  bs::LongwaveResult r;
  const auto angles = bs::gauss_quadrature(2);
  bs::solve_band_longwave(band_test::make_column(7, 100.0, 90000.0, 210.0, 280.0), tables, angles, {}, ws, r);
  bs::solve_band_longwave(column, tables, angles, {}, ws, r);
  const auto once = bs::solve_band_longwave(column, set, angles);
  EXPECT_EQ(r.flux_up, once.flux_up);
  EXPECT_EQ(r.flux_down, once.flux_down);
  EXPECT_EQ(r.heating_rate_by_band, once.heating_rate_by_band);
}
