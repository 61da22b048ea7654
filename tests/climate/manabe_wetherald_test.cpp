// The radiative-convective model of Manabe & Wetherald (1967, J. Atmos. Sci. 24, 241-259) with the
// default band sets: a clear-sky global-mean column, water at the Manabe-Wetherald relative
// humidity, convective adjustment to 6.5 K/km, surface energy balance. Checks the clear-sky
// greenhouse effect, the equilibrium surface temperature and the equilibrium warming for doubled
// CO2 with fixed relative and fixed absolute humidity.
//
// Why the equilibrium is colder than the observed 288 K: the surface albedo is chosen so that the
// column absorbs Earth's all-sky 240 W m-2 of sunlight, which includes the reflection by clouds,
// but a clear column lacks the clouds' longwave greenhouse effect (about 26-30 W m-2). Earth's
// clear-sky OLR at 288 K is about 266 W m-2; a clear column absorbing 240 W m-2 must emit 26 W m-2
// less, i.e. be colder by about 26 W m-2 / lambda, with lambda ~2-2.5 W m-2 K-1 the clear-sky
// fixed-relative-humidity response of the OLR to surface warming: about 277 K. The second check
// (absorbed sunlight = Earth's clear-sky OLR) shows that the model's clear-sky greenhouse effect
// itself puts the surface near 288 K. Idealised spectroscopy (bands/earth_idealised_absorbers.toml:
// analytic band shapes calibrated to a few published numbers, no line-by-line data) may move the
// OLR by a few W m-2, i.e. Ts by 1-3 K; the ranges allow for that.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <gtest/gtest.h>

#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/climate/radiation.hpp"
#include "bandstack/core/constants.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"

namespace cl = bandstack::climate;
namespace at = bandstack::atmosphere;
namespace bs = bandstack::solvers;
using bandstack::Gas;

namespace {

constexpr std::size_t layers = 40;
constexpr double solar_constant_w_m2 = 1361.0; // Kopp & Lean (2011, GRL 38, L01706; from memory)
constexpr double co2_base = 300e-6;            // Manabe & Wetherald (1967) standard CO2, 300 ppmv (from memory)

// Column of `layers` log-spaced layers (10 Pa to 1013.25 hPa) from the U.S. Standard Atmosphere 1976
// temperatures (profiles.hpp), water at the Manabe-Wetherald relative humidity (RH_s = 0.77), the
// Green ozone profile, CO2 at `co2`; global-mean sun S0/4 as cos zenith 0.5 half the time
// (common practice). with_minor_gases: CH4 and N2O at the profile defaults, else none (MW67 had
// only H2O, CO2 and O3; from memory).
at::Column mw_column(double co2, bool with_minor_gases) {
  at::ProfileSettings p;
  p.co2_mole_fraction = co2;
  if (!with_minor_gases) p.ch4_mole_fraction = p.n2o_mole_fraction = 0.0;
  at::Column c =
      at::make_column(p, at::GridSpec{layers, 10.0, 101325.0, at::Spacing::log_pressure}, "manabe_wetherald");
  c.sun = at::SunGeometry{0.5, 1.0, 0.5};
  return c;
}

cl::EquilibriumSettings mw_settings(cl::WaterTreatment water) {
  cl::EquilibriumSettings s; // 6.5 K/km critical lapse rate, surface energy balance
  s.water.treatment = water;
  s.water.surface_relative_humidity = 0.77; // Manabe & Wetherald (1967) RH_s (from memory)
  s.time_marching_fallback = false;         // a Newton failure must show here
  return s;
}

class ManabeWetherald : public ::testing::Test {
protected:
  static void SetUpTestSuite() {
    static const bandstack::spectral::BandSet lw = bandstack::io::load_band_set("default_lw");
    static const bandstack::spectral::BandSet sw = bandstack::io::load_band_set("default_sw");
    radiation_ = new cl::NetHeating(cl::band_net_heating(lw, sw, bs::gauss_quadrature(3), solar_constant_w_m2));
  }
  static void TearDownTestSuite() {
    delete radiation_;
    radiation_ = nullptr;
  }

  // Equilibrium at fixed relative humidity with the surface albedo adjusted (secant steps on
  // equilibria) until the absorbed sunlight is `absorbed_w_m2` within 0.1 W m-2.
  static cl::EquilibriumResult equilibrium_absorbing(double absorbed_w_m2, const at::Column& start) {
    const cl::EquilibriumSettings s = mw_settings(cl::WaterTreatment::fixed_relative_humidity);
    at::Column column = start;
    cl::RadiationOutput out;
    for (int attempt = 0; attempt < 8; ++attempt) {
      cl::EquilibriumResult r = cl::solve_equilibrium(column, *radiation_, s);
      (*radiation_)(r.column, out);
      const double absorbed = out.absorbed_solar_w_m2;
      if (std::abs(absorbed - absorbed_w_m2) < 0.1) return r;
      at::Column brighter = r.column;
      brighter.surface_albedo += 0.01;
      cl::RadiationOutput bright;
      (*radiation_)(brighter, bright);
      column = r.column;
      const double per_albedo = (bright.absorbed_solar_w_m2 - absorbed) / 0.01; // W m-2 per unit albedo
      column.surface_albedo = std::clamp(column.surface_albedo - (absorbed - absorbed_w_m2) / per_albedo, 0.0, 1.0);
    }
    ADD_FAILURE() << "the albedo for " << absorbed_w_m2 << " W m-2 absorbed was not found";
    return cl::solve_equilibrium(column, *radiation_, s);
  }

  static cl::NetHeating* radiation_;
};

cl::NetHeating* ManabeWetherald::radiation_ = nullptr;

} // namespace

// Clear-sky greenhouse effect of the U.S. Standard Atmosphere 1976 (288.15 K surface): Kiehl &
// Trenberth (1997, BAMS 78, 197-208; from memory) computed a clear-sky OLR of about 265 W m-2 for it,
// a greenhouse effect sigma Ts^4 - OLR of about 125 W m-2. Our column has CO2 at 300 ppmv and
// the (moister) Manabe-Wetherald humidity; +-10 W m-2 for those differences and the idealised
// spectroscopy.
TEST_F(ManabeWetherald, UsStandardClearSkyOlr) {
  cl::RadiationOutput out;
  (*radiation_)(mw_column(co2_base, true), out);
  const double sigma = bandstack::constants::stefan_boltzmann_w_m2_k4;
  std::printf("U.S. Standard 1976, MW humidity, 300 ppmv CO2: clear-sky OLR %.2f W m-2, greenhouse effect %.2f W m-2\n",
              out.olr_w_m2, sigma * std::pow(288.15, 4) - out.olr_w_m2);
  EXPECT_NEAR(out.olr_w_m2, 265.0, 10.0);
}

// Surface temperature of the clear-sky RCE absorbing Earth's 240 W m-2 (Loeb et al. 2009, J. Climate
// 22, 748-766; Trenberth et al. 2009, BAMS 90, 311-323: 239-240 W m-2; from memory). Expected
// (top of file): 288 K less (266 - 240) W m-2 / (2-2.5 W m-2 K-1), i.e. 275-278 K, with the
// observed global mean 288 K (GISTEMP 1951-1980 baseline ~14 C; common practice), Earth's
// clear-sky OLR ~266 W m-2 (Trenberth et al. 2009; from memory) and a clear-sky fixed-RH response
// of ~2 W m-2 K-1 (Manabe & Wetherald 1967; from memory). Range: widened by 4 K each way for
// +-3 W m-2 of clear-sky OLR and +-5 W m-2 of idealised spectroscopy.
// Then the same with the absorbed sunlight raised to Earth's clear-sky OLR (266 W m-2): the
// clouds' longwave effect added as sunlight, the column must emit what the clear-sky Earth emits,
// at about the observed 288 K (+-6 K: the +-4 K above plus the Manabe-Wetherald humidity, drier
// aloft than observed).
TEST_F(ManabeWetherald, SurfaceTemperature) {
  const cl::EquilibriumResult r = equilibrium_absorbing(240.0, mw_column(co2_base, false));
  const cl::EquilibriumResult warm = equilibrium_absorbing(266.0, r.column);
  std::printf("MW67 clear-sky RCE, %zu layers: absorbing 240 W m-2 Ts = %.2f K (albedo %.3f, %d Newton steps, "
              "%ld radiative calls, convective top %.0f hPa); absorbing 266 W m-2 Ts = %.2f K\n",
              layers, r.column.surface_temperature_k, r.column.surface_albedo, r.newton_iterations, r.radiative_calls,
              r.convective_top_pressure_pa() / 100.0, warm.column.surface_temperature_k);
  EXPECT_GT(r.column.surface_temperature_k, 271.0);
  EXPECT_LT(r.column.surface_temperature_k, 282.0);
  EXPECT_NEAR(warm.column.surface_temperature_k, 288.0, 6.0);
  // The convective region ends within the range of observed tropopauses, from about 100 hPa in the
  // tropics to about 300 hPa at high latitudes (common practice).
  EXPECT_GT(r.convective_top_pressure_pa(), 100e2);
  EXPECT_LT(r.convective_top_pressure_pa(), 300e2);
}

// Equilibrium warming for 300 -> 600 ppmv CO2 from the 240 W m-2 base state. Manabe & Wetherald
// (1967, Table 5; from memory): 2.4 K with fixed relative humidity and 1.3 K with fixed absolute
// humidity (average cloudiness). Ranges: fixed RH 1.5-4 K, fixed absolute humidity 0.8-2.2 K
// (wider than MW67's clear/cloudy spread for our idealised spectroscopy); fixed RH warms more
// (positive water-vapour feedback, MW67's central result).
TEST_F(ManabeWetherald, DoubledCo2Warming) {
  const cl::EquilibriumResult base = equilibrium_absorbing(240.0, mw_column(co2_base, false));
  at::Column doubled = base.column;
  doubled.gas(Gas::co2).assign(layers, 2.0 * co2_base);
  const cl::EquilibriumResult rh =
      cl::solve_equilibrium(doubled, *radiation_, mw_settings(cl::WaterTreatment::fixed_relative_humidity));
  // Fixed absolute humidity: the water of the base equilibrium held as it is.
  const cl::EquilibriumResult ah =
      cl::solve_equilibrium(doubled, *radiation_, mw_settings(cl::WaterTreatment::fixed_mole_fraction));
  const double dts_rh = rh.column.surface_temperature_k - base.column.surface_temperature_k;
  const double dts_ah = ah.column.surface_temperature_k - base.column.surface_temperature_k;
  std::printf("2xCO2: dTs = %.3f K with fixed relative humidity (%d Newton steps, %ld calls), %.3f K with fixed "
              "absolute humidity (%d steps, %ld calls)\n",
              dts_rh, rh.newton_iterations, rh.radiative_calls, dts_ah, ah.newton_iterations, ah.radiative_calls);
  EXPECT_GT(dts_rh, 1.5);
  EXPECT_LT(dts_rh, 4.0);
  EXPECT_GT(dts_ah, 0.8);
  EXPECT_LT(dts_ah, 2.2);
  EXPECT_GT(dts_rh, dts_ah);
  // The water of the fixed-absolute-humidity run is exactly the base state's.
  EXPECT_EQ(ah.column.gas(Gas::h2o), base.column.gas(Gas::h2o));
}
