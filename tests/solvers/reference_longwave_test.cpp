#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/reference_longwave.hpp"
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

const std::vector<double> edges{10.0, 350.0, 500.0, 630.0, 700.0, 820.0, 1080.0, 1400.0, 2000.0, 3000.0};

// Isothermal column at t_k over a surface at surface_k.
bandstack::atmosphere::Column isothermal(std::size_t layers, double t_k, double surface_k) {
  auto c = band_test::make_column(layers, 100.0, 100000.0, t_k, t_k);
  c.surface_temperature_k = surface_k;
  return c;
}

// Midpoint-rule error bound for the integral of f over [a, b] with step h: h^2/24 |f'(b) - f'(a)|
// plus higher orders (Euler-Maclaurin formula; analytic). f' of B_nu by central differences.
double midpoint_bound(double a, double b, double h, double t_k) {
  const auto slope = [&](double nu) {
    return (sp::planck_radiance(nu + 1e-3, t_k) - sp::planck_radiance(nu - 1e-3, t_k)) / 2e-3;
  };
  return 2.0 * h * h / 24.0 * (std::abs(slope(a)) + std::abs(slope(b)));
}

// A strong band kappa0 exp(-|nu - nu0| / l) of CO2 without pressure or temperature dependence
// (the idealised exponential band of Jeevanjee et al. 2021, J. Climate; from memory).
band_test::FormulaSource exponential_band(double kappa0, double nu0, double l) {
  return band_test::FormulaSource({Absorber::co2}, [=](Absorber, double nu, double, double) {
    return kappa0 * std::exp(-std::abs(nu - nu0) / l);
  });
}

} // namespace

// No absorption: OLR is the surface emission pi * integral of B over the grid (Kirchhoff, black
// surface), to the midpoint rule's accuracy at 1 and at 0.01 cm-1.
TEST(ReferenceLongwave, TransparentAtmosphereEmitsTheSurface) {
  const band_test::FormulaSource none({}, [](Absorber, double, double, double) { return 0.0; });
  const auto column = isothermal(3, 250.0, 290.0);
  for (double step : {1.0, 0.01}) {
    const auto grid = sp::make_wavenumber_grid(10.0, 3000.0, step);
    const auto r = bs::solve_reference_longwave(column, none, grid, edges, bs::gauss_quadrature(4));
    const double exact = constants::pi * sp::planck_band_radiance(10.0, 3000.0, 290.0);
    const double bound = constants::pi * midpoint_bound(10.0, 3000.0, step, 290.0) + 1e-12 * exact;
    EXPECT_NEAR(r.olr(), exact, bound) << "step " << step;
    EXPECT_EQ(r.surface_down(), 0.0);
    for (std::size_t b = 0; b + 1 < edges.size(); ++b) {
      const double band_exact = constants::pi * sp::planck_band_radiance(edges[b], edges[b + 1], 290.0);
      EXPECT_NEAR(r.flux_up_by_band[b * 4], band_exact, 1e-5 * band_exact * step + 1e-12) << "band " << b;
    }
  }
}

// Isothermal atmosphere over a black surface at the same temperature: every upward radiance is
// B(T) whatever the absorption (Kirchhoff's law, isothermal cavity), so the upward flux at every
// level is pi * integral of B, here with a strong CO2-like band in the way.
TEST(ReferenceLongwave, IsothermalOverBlackSurfaceAtSameTemperature) {
  const auto source = exponential_band(200.0, 667.5, 10.2);
  const auto column = isothermal(10, 260.0, 260.0);
  const auto grid = sp::make_wavenumber_grid(10.0, 3000.0, 0.5);
  const auto r = bs::solve_reference_longwave(column, source, grid, edges, bs::gauss_quadrature(4));
  const double exact = constants::pi * sp::planck_band_radiance(10.0, 3000.0, 260.0);
  const double bound = constants::pi * midpoint_bound(10.0, 3000.0, 0.5, 260.0) + 1e-12 * exact;
  for (double up : r.flux_up) EXPECT_NEAR(up, exact, bound);
  EXPECT_GT(r.surface_down(), 0.05 * exact); // the band glows downward
}

// A cold isothermal slab over a warm black surface: per interval the exact solution is
// pi sum_j w_j [B_s e^{-tau/mu_j} + B_a (1 - e^{-tau/mu_j})] (Schwarzschild equation with constant
// source; analytic), evaluated here independently with the same grid and directions.
TEST(ReferenceLongwave, ColdSlabOverWarmSurfaceMatchesAnalyticSolution) {
  const double kappa0 = 50.0, nu0 = 667.5, l = 10.2;
  const auto source = exponential_band(kappa0, nu0, l);
  const auto column = isothermal(8, 220.0, 290.0);
  double total_mass = 0.0;
  for (double m : bandstack::atmosphere::layer_gas_mass_kg_m2(column, Gas::co2)) total_mass += m;
  const auto grid = sp::make_wavenumber_grid(10.0, 3000.0, 1.0);
  const auto angles = bs::gauss_quadrature(4);
  const auto r = bs::solve_reference_longwave(column, source, grid, edges, angles);
  double olr = 0.0;
  for (std::size_t q = 0; q < grid.count; ++q) {
    const double nu = grid.at(q);
    const double tau = kappa0 * std::exp(-std::abs(nu - nu0) / l) * total_mass;
    double sum = 0.0;
    for (std::size_t j = 0; j < angles.size(); ++j) {
      const double t = std::exp(-tau / angles.mu[j]);
      sum += angles.weight[j] * (sp::planck_radiance(nu, 290.0) * t + sp::planck_radiance(nu, 220.0) * (1.0 - t));
    }
    olr += constants::pi * sum * grid.step_cm1;
  }
  EXPECT_NEAR(r.olr(), olr, 1e-12 * olr);
}

// Narrow-band limit: doubling the strength of an exponential band lowers the OLR by about
// 2 l ln2 pi [B(nu0, T_s) - B(nu0, T_a)] (the band widens by l ln 2 on each side; Wilson &
// Gea-Banacloche 2012, Am. J. Phys.; Jeevanjee et al. 2021, J. Climate; from memory). Here B is
// taken at the two wavenumbers where the slab turns from opaque to transparent,
// nu0 +- l ln(kappa0 M / (mu ln 2)) with mu = 1/1.66 (diffusivity; common practice), because B
// changes across the band; the remaining approximation is the sharpness of that transition.
TEST(ReferenceLongwave, NarrowBandLimitOfDoubling) {
  const double kappa0 = 500.0, nu0 = 600.0, l = 10.0, ts = 290.0, ta = 210.0;
  const auto column = isothermal(6, ta, ts);
  double total_mass = 0.0;
  for (double m : bandstack::atmosphere::layer_gas_mass_kg_m2(column, Gas::co2)) total_mass += m;
  const auto grid = sp::make_wavenumber_grid(10.0, 3000.0, 0.5);
  const auto angles = bs::gauss_quadrature(4);
  const double olr1 = bs::solve_reference_longwave(column, exponential_band(kappa0, nu0, l), grid, edges, angles).olr();
  const double olr2 =
      bs::solve_reference_longwave(column, exponential_band(2.0 * kappa0, nu0, l), grid, edges, angles).olr();
  const double reach = l * std::log(kappa0 * total_mass * 1.66 / std::log(2.0));
  double expected = 0.0;
  for (double nu : {nu0 - reach, nu0 + reach})
    expected += l * std::log(2.0) * constants::pi * (sp::planck_radiance(nu, ts) - sp::planck_radiance(nu, ta));
  EXPECT_NEAR(olr1 - olr2, expected, 0.02 * expected);
}

// Correlated-k is exact when kappa is constant within each band (one g-point per band carries the
// whole band): the band solver with such a set equals the reference on the same column, angles
// and surface, to the quadrature of the Planck function (Hermite table 1e-9, midpoint rule at
// 0.01 cm-1 ~1e-10). kappa proportional to p and linear in T is exact in the band tables.
TEST(ReferenceLongwave, BandSolverEqualsReferenceForBandConstantAbsorption) {
  const std::vector<double> strength{0.3, 0.02, 2.0, 40.0, 0.5, 0.001, 0.05, 0.8, 0.003};
  const auto band_of = [&](double nu) {
    std::size_t b = 0;
    while (b + 2 < edges.size() && nu >= edges[b + 1]) ++b;
    return b;
  };
  const auto law = [&](Absorber a, std::size_t b, double p, double t) {
    const double s = strength[(b + 3 * sp::index(a)) % strength.size()];
    if (a == Absorber::h2o_self_continuum) return 1e-4 * s * (1.0 - 2e-3 * (t - 250.0));
    return s * (p / 50000.0) * (1.0 + 1e-3 * (t - 250.0));
  };
  const std::vector<Absorber> absorbers{Absorber::h2o, Absorber::co2, Absorber::h2o_self_continuum};
  const band_test::FormulaSource source(absorbers, [&](Absorber a, double nu, double p, double t) { return law(a, band_of(nu), p, t); });
  const auto set = band_test::make_band_set(edges, 1, band_test::log_nodes(10.0, 110000.0, 12),
                                            band_test::linear_nodes(150.0, 350.0, 5), band_test::linear_nodes(100.0, 400.0, 7),
                                            absorbers, [&](Absorber a, std::size_t g, double p, double t) { return law(a, g, p, t); });
  auto column = band_test::make_column(12, 30.0, 101325.0, 205.0, 298.0);
  column.surface_temperature_k = 301.0;
  const std::vector<double> emissivity{0.95, 0.9, 1.0, 0.98, 0.8, 0.97, 0.99, 0.9, 0.85};
  const auto angles = bs::gauss_quadrature(4);
  const auto band = bs::solve_band_longwave(column, set, angles, emissivity);
  const auto ref =
      bs::solve_reference_longwave(column, source, sp::make_wavenumber_grid(10.0, 3000.0, 0.01), edges, angles, emissivity);
  const std::size_t levels = column.layer_count() + 1;
  for (std::size_t k = 0; k < levels; ++k) {
    EXPECT_NEAR(band.flux_up[k], ref.flux_up[k], 1e-10 * ref.flux_up[k]) << "level " << k;
    EXPECT_NEAR(band.flux_down[k], ref.flux_down[k], 1e-10 * ref.flux_up[k]) << "level " << k;
    for (std::size_t b = 0; b + 1 < edges.size(); ++b)
      EXPECT_NEAR(band.flux_up_by_band[b * levels + k], ref.flux_up_by_band[b * levels + k],
                  1e-10 * ref.flux_up_by_band[b * levels + k] + 1e-12);
  }
  for (std::size_t i = 0; i + 1 < levels; ++i)
    EXPECT_NEAR(band.heating_rate_k_day[i], ref.heating_rate_k_day[i], 1e-8) << "layer " << i;
}

// Deterministic (fixed chunk and summation order): two runs agree to the bit; totals are sums of
// the bands.
TEST(ReferenceLongwave, DeterministicAndBandsAddUp) {
  const auto source = exponential_band(100.0, 667.5, 10.2);
  const auto column = band_test::make_column(9, 100.0, 100000.0, 210.0, 290.0);
  const auto grid = sp::make_wavenumber_grid(10.0, 3000.0, 0.65);
  const auto a = bs::solve_reference_longwave(column, source, grid, edges, bs::gauss_quadrature(4));
  const auto b = bs::solve_reference_longwave(column, source, grid, edges, bs::gauss_quadrature(4));
  EXPECT_EQ(a.flux_up, b.flux_up);
  EXPECT_EQ(a.flux_down, b.flux_down);
  EXPECT_EQ(a.heating_rate_by_band, b.heating_rate_by_band);
  const std::size_t levels = 10, n_band = edges.size() - 1;
  for (std::size_t k = 0; k < levels; ++k) {
    double up = 0.0;
    for (std::size_t band = 0; band < n_band; ++band) up += a.flux_up_by_band[band * levels + k];
    EXPECT_NEAR(up, a.flux_up[k], 1e-12 * a.flux_up[k]);
  }
}

TEST(ReferenceLongwave, RejectsBadInput) {
  const auto source = exponential_band(1.0, 667.5, 10.2);
  const auto column = isothermal(3, 250.0, 290.0);
  const auto angles = bs::gauss_quadrature(4);
  const auto grid = sp::make_wavenumber_grid(10.0, 3000.0, 1.0);
  const std::vector<double> narrow_edges{100.0, 3000.0};
  EXPECT_THROW((void)bs::solve_reference_longwave(column, source, grid, narrow_edges, angles), bandstack::InputError);
  const std::vector<double> unordered{10.0, 700.0, 600.0, 3000.0};
  EXPECT_THROW((void)bs::solve_reference_longwave(column, source, grid, unordered, angles), bandstack::InputError);
  const std::vector<double> emissivity{1.0};
  EXPECT_THROW((void)bs::solve_reference_longwave(column, source, grid, edges, angles, emissivity), bandstack::InputError);
  // A layer state the source does not cover: the error names the layer.
  const band_test::FormulaSource picky({Absorber::co2}, [](Absorber, double, double, double) { return 1.0; }, 240.0, 400.0);
  auto cold = column;
  cold.temperature_layer_k[2] = 230.0;
  try {
    (void)bs::solve_reference_longwave(cold, picky, grid, edges, angles);
    FAIL() << "expected InputError";
  } catch (const bandstack::InputError& e) {
    EXPECT_EQ(e.place().level, 2);
  }
}
