#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/thermo/humidity.hpp"
#include "bandstack/thermo/saturation.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <limits>

namespace {

using namespace bandstack::thermo;
namespace constants = bandstack::constants;

// eps = M_w / M_d = 18.01528 / 28.9644 = 0.62198, quoted as 0.622 in meteorology texts (common practice).
TEST(Humidity, EpsIsTheTextbookValue) {
  const double eps = mass_mixing_ratio_from_mole_fraction(0.5); // eps x / (1 - x) = eps at x = 1/2
  EXPECT_NEAR(eps, 0.622, 5e-4);
}

TEST(Humidity, RoundTripsToMachinePrecision) {
  for (double x = 0.0; x < 0.9; x += 0.0137) {
    EXPECT_NEAR(mole_fraction_from_mass_mixing_ratio(mass_mixing_ratio_from_mole_fraction(x)), x, 1e-14 * (1 + x));
    EXPECT_NEAR(mole_fraction_from_specific_humidity(specific_humidity_from_mole_fraction(x)), x, 1e-14 * (1 + x));
  }
  for (double x : {1e-9, 4e-6, 1e-3}) { // stratospheric to boundary-layer amounts: relative accuracy
    EXPECT_NEAR(mole_fraction_from_mass_mixing_ratio(mass_mixing_ratio_from_mole_fraction(x)) / x, 1.0, 1e-14);
    EXPECT_NEAR(mole_fraction_from_specific_humidity(specific_humidity_from_mole_fraction(x)) / x, 1.0, 1e-14);
  }
}

// Hand-computed textbook example: p = 1000 hPa, e = 20 hPa (x = 0.02).
// r = eps e / (p - e) = 0.622 * 20 / 980 = 0.012694 kg/kg; q = eps e / (p - (1 - eps) e)
// = 0.622 * 20 / 992.44 = 0.012535 kg/kg (definitions, e.g. Wallace & Hobbs 2006 sect. 3.5; from memory).
// Tolerance 5e-4 relative: eps = 0.62198 here versus the rounded 0.622.
TEST(Humidity, TextbookMixingRatioAndSpecificHumidity) {
  const double x = 20.0 / 1000.0;
  EXPECT_NEAR(mass_mixing_ratio_from_mole_fraction(x) / 0.012694, 1.0, 5e-4);
  EXPECT_NEAR(specific_humidity_from_mole_fraction(x) / 0.012535, 1.0, 5e-4);
  // q = r / (1 + r) (definition).
  const double r = mass_mixing_ratio_from_mole_fraction(x);
  EXPECT_NEAR(specific_humidity_from_mole_fraction(x), r / (1.0 + r), 1e-16);
}

// RH = 1 means e = e_s(T) (definition of relative humidity, WMO convention with respect to e_s).
TEST(Humidity, SaturatedMeansVapourPressureEqualsSaturation) {
  for (double t : {200.0, 250.0, 273.16, 288.15, 303.15}) {
    const double p = 90000.0;
    EXPECT_NEAR(mole_fraction_from_relative_humidity(1.0, p, t) * p / saturation_vapour_pressure_pa(t), 1.0, 1e-14);
    EXPECT_NEAR(saturation_mole_fraction(p, t), saturation_vapour_pressure_pa(t) / p, 1e-17);
    EXPECT_NEAR(relative_humidity_from_mole_fraction(saturation_mole_fraction(p, t), p, t), 1.0, 1e-14);
  }
}

TEST(Humidity, RelativeHumidityRoundTrip) {
  for (double rh : {0.0, 0.1, 0.5, 0.77, 1.0, 1.2}) {
    const double x = mole_fraction_from_relative_humidity(rh, 85000.0, 290.0);
    EXPECT_NEAR(relative_humidity_from_mole_fraction(x, 85000.0, 290.0), rh, 1e-14);
  }
}

// Stratopause-like case: e_s(270 K over ice) = 470 Pa (Murphy & Koop 2005 eq. 7) exceeds p = 100 Pa,
// so the mole fraction is capped below 1.
TEST(Humidity, MoleFractionIsCappedBelowOne) {
  EXPECT_EQ(saturation_mole_fraction(100.0, 270.0), max_water_mole_fraction);
  EXPECT_EQ(mole_fraction_from_relative_humidity(50.0, 1e5, 300.0), max_water_mole_fraction);
  EXPECT_LT(max_water_mole_fraction, 1.0);
  EXPECT_TRUE(std::isfinite(mass_mixing_ratio_from_mole_fraction(saturation_mole_fraction(1.0, 330.0))));
}

TEST(Humidity, BadInputThrowsInputError) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  EXPECT_THROW((void)mass_mixing_ratio_from_mole_fraction(1.0), bandstack::InputError);
  EXPECT_THROW((void)mass_mixing_ratio_from_mole_fraction(-1e-3), bandstack::InputError);
  EXPECT_THROW((void)mass_mixing_ratio_from_mole_fraction(nan), bandstack::InputError);
  EXPECT_THROW((void)mole_fraction_from_mass_mixing_ratio(-0.1), bandstack::InputError);
  EXPECT_THROW((void)mole_fraction_from_mass_mixing_ratio(std::numeric_limits<double>::infinity()),
               bandstack::InputError);
  EXPECT_THROW((void)specific_humidity_from_mole_fraction(1.5), bandstack::InputError);
  EXPECT_THROW((void)mole_fraction_from_specific_humidity(1.0), bandstack::InputError);
  EXPECT_THROW((void)relative_humidity_from_mole_fraction(0.01, 0.0, 280.0), bandstack::InputError);
  EXPECT_THROW((void)relative_humidity_from_mole_fraction(0.01, 1e5, 400.0), bandstack::InputError);
  EXPECT_THROW((void)mole_fraction_from_relative_humidity(-0.5, 1e5, 280.0), bandstack::InputError);
  EXPECT_THROW((void)saturation_mole_fraction(-1.0, 280.0), bandstack::InputError);
  try {
    (void)mole_fraction_from_specific_humidity(2.0);
    FAIL() << "no exception";
  } catch (const bandstack::InputError& error) {
    EXPECT_EQ(error.place().item, "q");
  }
}

} // namespace
