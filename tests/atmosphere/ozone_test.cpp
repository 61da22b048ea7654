#include "bandstack/atmosphere/ozone.hpp"

#include <cmath>

#include <gtest/gtest.h>

#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/hydrostatics.hpp"

namespace {

using bandstack::Gas;
using namespace bandstack::atmosphere;

ProfileSettings settings_for(Profile p) {
  ProfileSettings s;
  s.profile = p;
  return s;
}

TEST(GreenOzone, LoschmidtConstant) {
  // CODATA 2018: Loschmidt constant (273.15 K, 101.325 kPa) n0 = 2.686780111e25 m-3.
  EXPECT_NEAR(loschmidt_per_m3 / 2.686780111e25, 1.0, 1e-9);
  // 1 Dobson unit = 1e-5 m at NTP = 2.6868e20 molecules m-2 (WMO definition, common practice).
  EXPECT_NEAR(molecules_per_m2_per_dobson / 2.6868e20, 1.0, 1e-4);
}

TEST(GreenOzone, AnalyticProperties) {
  const GreenOzone o; // a = 0.4 cm, b = 20 km, c = 5 km (Lacis & Hansen 1974, from memory)
  // u(0) = a, u(b) = a (1 + e^{-b/c}) / 2 and u -> 0 far above: the formula's own limits.
  EXPECT_NEAR(green_ozone_above_cm(0.0, o), 0.4, 1e-15);
  EXPECT_NEAR(green_ozone_above_cm(20000.0, o), 0.2 * (1.0 + std::exp(-4.0)), 1e-15);
  EXPECT_LT(green_ozone_above_cm(100000.0, o), 1e-7);
  // Concentration -du/dh peaks at h = b with a (1 + e^{-b/c}) / (4c) (analytic derivative).
  const double h = 1.0;
  const double slope = (green_ozone_above_cm(20000.0 - h, o) - green_ozone_above_cm(20000.0 + h, o)) / (2 * h);
  EXPECT_NEAR(slope, 0.4 * (1.0 + std::exp(-4.0)) / 20000.0, 1e-12);
  const double slope_low = (green_ozone_above_cm(15000.0 - h, o) - green_ozone_above_cm(15000.0 + h, o)) / (2 * h);
  EXPECT_LT(slope_low, slope);
  EXPECT_THROW((void)green_ozone_above_cm(0.0, GreenOzone{0.4, 20000.0, 0.0}), bandstack::InputError);
}

TEST(GreenOzone, ColumnTotalIsFourHundredDobson) {
  // a = 0.4 cm NTP = 400 DU (1 DU = 0.001 cm NTP). The layer sum telescopes to u(0) - u(z_top);
  // u(z_top)/a ~ e^{-(z_top - b)/c} ~ 1e-4 for a 10 Pa top, so 400 DU to within 0.1 DU.
  for (Profile p : {Profile::us_standard_1976, Profile::tropical, Profile::midlatitude_summer,
                    Profile::high_latitude_winter}) {
    const Column c = make_column(settings_for(p), {});
    EXPECT_NEAR(ozone_column_dobson(c), 400.0, 0.2) << profile_name(p);
  }
}

TEST(GreenOzone, MixingRatioMaximumInTheMiddleStratosphere) {
  // Observed ozone mixing ratio peaks at roughly 6-10 ppmv near 30-35 km (e.g. the mid-latitude
  // ozone model for the 1976 standard, Krueger & Minzner 1976, J. Geophys. Res. 81; from memory).
  // Accept 4-11 ppmv at 25-38 km for this idealised form.
  for (Profile p : {Profile::us_standard_1976, Profile::tropical, Profile::midlatitude_summer,
                    Profile::high_latitude_winter}) {
    const Column c = make_column(settings_for(p), {});
    const auto z = bandstack::thermo::level_heights_m(c.pressure_level_pa, c.temperature_layer_k, c.gas(Gas::h2o),
                                                      c.gravity_m_s2);
    const auto& x = c.gas(Gas::o3);
    std::size_t imax = 0;
    for (std::size_t i = 0; i < x.size(); ++i) {
      EXPECT_GE(x[i], 0.0);
      if (x[i] > x[imax]) imax = i;
    }
    const double z_max = 0.5 * (z[imax] + z[imax + 1]);
    EXPECT_GT(x[imax], 4e-6) << profile_name(p);
    EXPECT_LT(x[imax], 11e-6) << profile_name(p);
    EXPECT_GT(z_max, 25000.0) << profile_name(p);
    EXPECT_LT(z_max, 38000.0) << profile_name(p);
    // Tropospheric ozone of the form is small: below 5 km under 0.2 ppmv (observed 0.02-0.1 ppmv,
    // Logan 1999, J. Geophys. Res. 104; from memory).
    EXPECT_LT(x.back(), 0.2e-6) << profile_name(p);
  }
}

TEST(GreenOzone, ScaleMultipliesTheProfile) {
  ProfileSettings s;
  const Column c1 = make_column(s, {});
  s.ozone_scale = 0.5;
  const Column c_half = make_column(s, {});
  for (std::size_t i = 0; i < c1.layer_count(); ++i)
    EXPECT_NEAR(c_half.gas(Gas::o3)[i], 0.5 * c1.gas(Gas::o3)[i], 1e-15 + 1e-12 * c1.gas(Gas::o3)[i]);
  EXPECT_NEAR(ozone_column_dobson(c_half), 0.5 * ozone_column_dobson(c1), 1e-9);
  s.ozone_scale = 0.0;
  const Column c_zero = make_column(s, {});
  for (double x : c_zero.gas(Gas::o3)) EXPECT_EQ(x, 0.0);
}

TEST(GreenOzone, LayerMoleFractionFromColumnDifference) {
  // One layer from 20 km to 0 km holding u(0) - u(20 km) with a dry Δp = 100000 Pa:
  // x = Δu 1e-2 n0 g M_d / (N_A Δp), by hand from the definitions.
  const GreenOzone o;
  const auto x = green_ozone_mole_fraction({20000.0, 0.0}, {1325.0, 101325.0}, {0.0}, 9.80665);
  const double du = 0.4 - 0.2 * (1.0 + std::exp(-4.0));
  const double expected = du * 1e-2 * 2.686780111e25 * 9.80665 * 28.9644e-3 / (6.02214076e23 * 100000.0);
  ASSERT_EQ(x.size(), 1u);
  EXPECT_NEAR(x[0] / expected, 1.0, 1e-9);
  EXPECT_THROW((void)green_ozone_mole_fraction({0.0, 20000.0}, {1325.0, 101325.0}, {0.0}, 9.80665),
               bandstack::InputError);
  EXPECT_THROW((void)green_ozone_mole_fraction({20000.0, 0.0}, {1325.0}, {0.0}, 9.80665), bandstack::InputError);
}

} // namespace
