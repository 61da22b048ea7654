// Removing bands from a band set (spectral::with_active_bands): what is kept, what is zeroed, and
// what the band longwave solver then gives.
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <numbers>
#include <vector>

namespace at = bandstack::atmosphere;
namespace bs = bandstack::solvers;
namespace sp = bandstack::spectral;
namespace constants = bandstack::constants;

namespace {

const sp::BandSet& longwave_set() {
  static const sp::BandSet set = bandstack::io::load_band_set("default_lw");
  return set;
}

// A US-standard column of 30 layers; the surface at 288 K (a node of the solver's 0.25 K Planck
// table, so the surface emission is the band integral itself).
at::Column column() {
  at::ProfileSettings settings;
  settings.surface_temperature_k = 288.0;
  at::Column c = at::make_column(settings, at::GridSpec{30, 10.0, 101325.0, at::Spacing::log_pressure});
  c.surface_emissivity = 1.0;
  return c;
}

// Share of a blackbody's radiance above x = h c nu / (k T) (exact series, e.g. Siegel & Howell,
// Thermal Radiation Heat Transfer, blackbody functions): 15/pi^4 sum_n e^{-nx}/n (x^3 + 3x^2/n +
// 6x/n^2 + 6/n^3).
double fraction_above(double x) {
  double sum = 0.0;
  for (int n = 1; n <= 50; ++n) {
    const double m = n;
    sum += std::exp(-m * x) / m * (x * x * x + 3.0 * x * x / m + 6.0 * x / (m * m) + 6.0 / (m * m * m));
  }
  return 15.0 / std::pow(std::numbers::pi, 4) * sum;
}

// Share below a small x: 15/pi^4 (x^3/3 - x^4/8 + x^5/60 - ...) (the series of x^3/(e^x - 1),
// same source); at x = 0.05 the next term (x^7/5040) is negligible.
double fraction_below_small(double x) {
  return 15.0 / std::pow(std::numbers::pi, 4) * (x * x * x / 3.0 - std::pow(x, 4) / 8.0 + std::pow(x, 5) / 60.0);
}

} // namespace

TEST(BandMask, AllActiveGivesAnIdenticalSet) {
  const sp::BandSet& set = longwave_set();
  const sp::BandSet same = sp::with_active_bands(set, std::vector<bool>(set.band_count(), true));
  EXPECT_EQ(same.absorption_coefficient, set.absorption_coefficient);
  EXPECT_EQ(same.planck_fraction, set.planck_fraction);
  EXPECT_EQ(same.gpoint_band, set.gpoint_band);
  EXPECT_EQ(same.gpoint_weight, set.gpoint_weight);
  EXPECT_EQ(same.band_lower_cm1, set.band_lower_cm1);
  EXPECT_EQ(same.absorber_present, set.absorber_present);
  EXPECT_EQ(same.name, set.name);
  EXPECT_NO_THROW(sp::validate(same));
}

TEST(BandMask, InactiveBandsHaveNoAbsorptionButKeepTheirPlanckFractions) {
  const sp::BandSet& set = longwave_set();
  std::vector<bool> active(set.band_count(), true);
  active[1] = false;
  const sp::BandSet masked = sp::with_active_bands(set, active);
  EXPECT_NO_THROW(sp::validate(masked));
  EXPECT_EQ(masked.planck_fraction, set.planck_fraction);
  bool some_nonzero_in_removed = false;
  for (sp::Absorber a : sp::all_absorbers)
    for (std::size_t g = 0; g < set.gpoint_count(); ++g)
      for (std::size_t t = 0; t < set.ref_temperature_k.size(); ++t)
        for (std::size_t p = 0; p < set.ref_pressure_pa.size(); ++p) {
          if (set.gpoint_band[g] == 1) {
            some_nonzero_in_removed = some_nonzero_in_removed || set.kappa(a, g, t, p) != 0.0;
            EXPECT_EQ(masked.kappa(a, g, t, p), 0.0);
          } else {
            EXPECT_EQ(masked.kappa(a, g, t, p), set.kappa(a, g, t, p));
          }
        }
  EXPECT_TRUE(some_nonzero_in_removed); // the test removes a band that absorbs
}

TEST(BandMask, ShortwaveSetKeepsSolarWeightsAndRayleigh) {
  const sp::BandSet sw = bandstack::io::load_band_set("default_sw");
  const sp::BandSet dark = sp::with_active_bands(sw, std::vector<bool>(sw.band_count(), false));
  EXPECT_EQ(dark.solar_weight, sw.solar_weight);
  EXPECT_EQ(dark.rayleigh_cross_section_m2_kg, sw.rayleigh_cross_section_m2_kg);
  for (double k : dark.absorption_coefficient)
    ASSERT_EQ(k, 0.0);
  EXPECT_NO_THROW(sp::validate(dark));
}

// A transparent atmosphere over a black surface: OLR = sigma Ts^4 (Stefan-Boltzmann law) less the
// blackbody share outside the set's 10-3000 cm-1 (analytic series above), no downward flux at the
// surface and no heating.
TEST(BandMask, AllInactiveGivesStefanBoltzmannOutgoingFlux) {
  const sp::BandSet& set = longwave_set();
  const sp::BandSet clear = sp::with_active_bands(set, std::vector<bool>(set.band_count(), false));
  const at::Column c = column();
  const double ts = c.surface_temperature_k;
  const bs::LongwaveResult r = bs::solve_band_longwave(c, clear, bs::gauss_quadrature(3));
  const double c2 = 1.438776877; // second radiation constant h c / k, cm K (CODATA 2018)
  const double outside =
      fraction_below_small(c2 * set.band_lower_cm1.front() / ts) + fraction_above(c2 * set.band_upper_cm1.back() / ts);
  const double sigma_t4 = constants::stefan_boltzmann_w_m2_k4 * std::pow(ts, 4);
  EXPECT_NEAR(r.olr(), sigma_t4 * (1.0 - outside), 1e-9 * sigma_t4);
  EXPECT_NEAR(r.olr(), sigma_t4, 5e-4 * sigma_t4); // 0.02 % of sigma T^4 lies outside at 288 K
  EXPECT_NEAR(r.surface_down(), 0.0, 1e-12);
  for (double h : r.heating_rate_k_day)
    EXPECT_NEAR(h, 0.0, 1e-12);
}

// g-points are independent, so making one band transparent changes only that band's fluxes; the
// removed band then lets more of the warm surface's emission out (the column's temperature falls
// with height up to the tropopause).
TEST(BandMask, RemovingOneBandChangesOnlyThatBand) {
  const sp::BandSet& set = longwave_set();
  const at::Column c = column();
  const auto angles = bs::gauss_quadrature(3);
  const bs::LongwaveResult all = bs::solve_band_longwave(c, set, angles);
  const std::size_t levels = c.level_count();
  for (std::size_t removed : {std::size_t{2}, set.band_count() - 1}) {
    std::vector<bool> active(set.band_count(), true);
    active[removed] = false;
    const bs::LongwaveResult r = bs::solve_band_longwave(c, sp::with_active_bands(set, active), angles);
    for (std::size_t b = 0; b < set.band_count(); ++b) {
      if (b == removed) continue;
      for (std::size_t k = 0; k < levels; ++k) {
        const double scale = 1e-12 * all.flux_up_by_band[b * levels + levels - 1];
        EXPECT_NEAR(r.flux_up_by_band[b * levels + k], all.flux_up_by_band[b * levels + k], scale) << b << " " << k;
        EXPECT_NEAR(r.flux_down_by_band[b * levels + k], all.flux_down_by_band[b * levels + k], scale) << b << " " << k;
      }
    }
    EXPECT_GT(r.flux_up_by_band[removed * levels], all.flux_up_by_band[removed * levels]) << removed;
    EXPECT_NEAR(r.flux_down_by_band[removed * levels + levels - 1], 0.0, 1e-12) << removed;
  }
}

TEST(BandMask, WrongFlagCountThrows) {
  const sp::BandSet& set = longwave_set();
  EXPECT_THROW((void)sp::with_active_bands(set, std::vector<bool>(set.band_count() + 1, true)), bandstack::InputError);
  EXPECT_THROW((void)sp::with_active_bands(set, {}), bandstack::InputError);
  try {
    (void)sp::with_active_bands(set, std::vector<bool>(3, true));
    FAIL() << "no exception";
  } catch (const bandstack::InputError& e) {
    EXPECT_NE(std::string(e.what()).find("active_bands"), std::string::npos) << e.what();
  }
}
