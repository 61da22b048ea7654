// The lapse-rate tropopause (WMO 1957 definition) of built-in and synthetic columns.
#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/atmosphere/tropopause.hpp"
#include "bandstack/atmosphere/us_standard_1976.hpp"
#include "bandstack/core/error.hpp"

#include <cmath>
#include <cstdio>
#include <gtest/gtest.h>

namespace at = bandstack::atmosphere;
namespace us = bandstack::atmosphere::us_standard_1976;

namespace {

// The level whose pressure is nearest, in ln p, to p_pa.
std::size_t nearest_level(const at::Column& c, double p_pa) {
  std::size_t best = 0;
  for (std::size_t k = 1; k < c.level_count(); ++k)
    if (std::abs(std::log(c.pressure_level_pa[k] / p_pa)) < std::abs(std::log(c.pressure_level_pa[best] / p_pa)))
      best = k;
  return best;
}

at::Column profile_column(at::Profile profile, const at::GridSpec& grid) {
  at::ProfileSettings s;
  s.profile = profile;
  return at::make_column(s, grid);
}

// A column on `grid` with layer temperatures t_of(H) at the U.S. Standard Atmosphere 1976
// geopotential height H of each layer pressure; water and other gases zero.
template <class F> at::Column column_from_height_profile(const at::GridSpec& grid, F t_of) {
  at::Column c;
  c.pressure_level_pa = at::level_pressures_pa(grid);
  c.pressure_layer_pa = at::layer_pressures_pa(c.pressure_level_pa);
  for (double p : c.pressure_layer_pa)
    c.temperature_layer_k.push_back(t_of(us::geopotential_height_m(p)));
  for (double p : c.pressure_level_pa)
    c.temperature_level_k.push_back(t_of(us::geopotential_height_m(p)));
  for (auto& x : c.mole_fraction)
    x.assign(grid.layers, 0.0);
  c.surface_temperature_k = c.temperature_level_k.back();
  return c;
}

} // namespace

// U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF), Table 4: the troposphere's 6.5 K/km ends at
// 11 km geopotential, 22632.06 Pa (226.3 hPa), 216.65 K, above which the temperature is constant
// to 20 km (from memory, as in us_standard_1976_test.cpp). The tropopause must be found within one
// layer of it on any grid.
TEST(Tropopause, UsStandard1976At11Kilometres) {
  const at::GridSpec grids[] = {{40, 10.0, 101325.0, at::Spacing::log_pressure},
                                {30, 100.0, 101325.0, at::Spacing::log_pressure},
                                {60, 10.0, 101325.0, at::Spacing::linear_pressure},
                                {100, 1.0, 101325.0, at::Spacing::log_pressure}};
  for (const at::GridSpec& grid : grids) {
    const at::Column c = profile_column(at::Profile::us_standard_1976, grid);
    const std::size_t k = at::lapse_rate_tropopause_level(c);
    const std::size_t expected = nearest_level(c, 22632.06);
    const double h_km = us::geopotential_height_m(c.pressure_level_pa[k]) / 1000.0;
    std::printf("US 1976, %zu layers: tropopause level %zu at %.1f hPa, H = %.2f km (expected level %zu)\n",
                grid.layers, k, c.pressure_level_pa[k] / 100.0, h_km, expected);
    EXPECT_LE(k + 1, expected + 2) << grid.layers; // |k - expected| <= 1
    EXPECT_LE(expected, k + 1) << grid.layers;
  }
}

// The tropical profile's pseudo-adiabat meets its 195 K isothermal stratosphere at its cold point
// (profiles.hpp, temperature_structure); the lapse rate drops there from near the dry adiabat to 0
// (moist pseudo-adiabats steepen towards the dry adiabat in cold air; e.g. Wallace & Hobbs 2006,
// Atmospheric Science, ch. 3; from memory). Same for the other built-in profiles, whose troposphere
// curve meets the stratosphere curve at the structure's tropopause. The high-latitude winter
// profile's +10 K surface inversion must not be taken for the tropopause.
TEST(Tropopause, BuiltInProfilesAtTheirColdPoint) {
  const at::GridSpec grid{50, 10.0, 101325.0, at::Spacing::log_pressure};
  for (at::Profile profile :
       {at::Profile::tropical, at::Profile::midlatitude_summer, at::Profile::high_latitude_winter}) {
    at::ProfileSettings s;
    s.profile = profile;
    const at::Column c = at::make_column(s, grid);
    const at::TemperatureStructure structure = at::temperature_structure(s, grid.surface_pressure_pa);
    const std::size_t k = at::lapse_rate_tropopause_level(c);
    const std::size_t expected = nearest_level(c, structure.tropopause_pressure_pa);
    std::printf("%s: tropopause level %zu at %.1f hPa (structure: %.1f hPa, %.1f K; nearest level %zu)\n",
                std::string(at::profile_name(profile)).c_str(), k, c.pressure_level_pa[k] / 100.0,
                structure.tropopause_pressure_pa / 100.0, structure.tropopause_temperature_k, expected);
    EXPECT_LE(k + 1, expected + 2) << at::profile_name(profile);
    EXPECT_LE(expected, k + 1) << at::profile_name(profile);
  }
}

// WMO (1957) second condition: a low lapse rate that does not last 2 km is not the tropopause.
// A 1 km isothermal layer at 4-5 km (average lapse rate over the next 2 km: 6.5 x 1 / 2 = 3.25
// K/km > 2) inside a 6.5 K/km troposphere that ends at 11 km.
TEST(Tropopause, ThinInversionIsNotTheTropopause) {
  const auto t_of = [](double h) {
    const double km = h / 1000.0;
    if (km < 4.0) return 288.15 - 6.5 * km;
    if (km < 5.0) return 288.15 - 26.0;
    return 288.15 - 26.0 - 6.5 * (std::min(km, 11.0) - 5.0);
  };
  const at::Column c = column_from_height_profile({60, 1000.0, 101325.0, at::Spacing::log_pressure}, t_of);
  const std::size_t k = at::lapse_rate_tropopause_level(c);
  const std::size_t expected = nearest_level(c, us::pressure_pa(11000.0));
  EXPECT_LE(k + 1, expected + 2);
  EXPECT_LE(expected, k + 1);
  // The same inversion 3 km thick (4-7 km) passes the 2 km test and is the tropopause.
  const auto thick = [](double h) {
    const double km = h / 1000.0;
    if (km < 4.0) return 288.15 - 6.5 * km;
    if (km < 7.0) return 288.15 - 26.0;
    return 288.15 - 26.0 - 6.5 * (std::min(km, 11.0) - 7.0);
  };
  const at::Column c2 = column_from_height_profile({60, 1000.0, 101325.0, at::Spacing::log_pressure}, thick);
  const std::size_t k2 = at::lapse_rate_tropopause_level(c2);
  const std::size_t expected2 = nearest_level(c2, us::pressure_pa(4000.0));
  EXPECT_LE(k2 + 1, expected2 + 2);
  EXPECT_LE(expected2, k2 + 1);
}

// No level qualifies: the level above the coldest layer (the contract's fallback), kept in 1..N-1.
TEST(Tropopause, FallbackToColdestLayer) {
  // 6.5 K/km all the way up: the coldest layer is the top one (level 0, kept at 1).
  const at::Column lapsing = column_from_height_profile({30, 5000.0, 101325.0, at::Spacing::log_pressure},
                                                        [](double h) { return 288.15 - 6.5e-3 * h; });
  EXPECT_EQ(at::lapse_rate_tropopause_level(lapsing), 1u);
  // Temperature rising with height through the whole column: no lapse rate exceeds 2 K/km and the
  // coldest layer is the lowest one.
  at::Column c =
      column_from_height_profile({30, 5000.0, 101325.0, at::Spacing::log_pressure}, [](double) { return 250.0; });
  for (std::size_t i = 0; i < c.layer_count(); ++i)
    c.temperature_layer_k[i] = 250.0 - 0.5 * static_cast<double>(i);
  EXPECT_EQ(at::lapse_rate_tropopause_level(c), c.layer_count() - 1);
}

TEST(Tropopause, RejectsBadColumns) {
  const at::Column us = profile_column(at::Profile::us_standard_1976, {2, 10.0, 101325.0, at::Spacing::log_pressure});
  EXPECT_THROW((void)at::lapse_rate_tropopause_level(us), bandstack::InputError);
  at::Column c = profile_column(at::Profile::us_standard_1976, {10, 10.0, 101325.0, at::Spacing::log_pressure});
  at::Column short_t = c;
  short_t.temperature_layer_k.pop_back();
  EXPECT_THROW((void)at::lapse_rate_tropopause_level(short_t), bandstack::InputError);
  at::Column nan_t = c;
  nan_t.temperature_layer_k[3] = NAN;
  EXPECT_THROW((void)at::lapse_rate_tropopause_level(nan_t), bandstack::InputError);
  at::Column bad_p = c;
  bad_p.pressure_layer_pa[4] = bad_p.pressure_level_pa[6];
  EXPECT_THROW((void)at::lapse_rate_tropopause_level(bad_p), bandstack::InputError);
}
