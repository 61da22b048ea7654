// Absorber names and the fine wavenumber grid.
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/absorber.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <limits>

namespace bs = bandstack::spectral;

TEST(AbsorberNames, RoundTripEveryAbsorber) {
  for (bs::Absorber a : bs::all_absorbers) {
    const auto back = bs::absorber_from_name(bs::absorber_name(a));
    ASSERT_TRUE(back.has_value()) << bs::absorber_name(a);
    EXPECT_EQ(*back, a);
  }
  EXPECT_EQ(bs::absorber_name(bs::Absorber::h2o_self_continuum), "h2o_self_continuum");
  EXPECT_EQ(bs::absorber_name(bs::Absorber::co2), "co2");
}

TEST(AbsorberNames, UnknownAndWrongCaseAreRejected) {
  EXPECT_FALSE(bs::absorber_from_name("H2O").has_value());
  EXPECT_FALSE(bs::absorber_from_name("h20").has_value());
  EXPECT_FALSE(bs::absorber_from_name("").has_value());
  EXPECT_FALSE(bs::absorber_from_name("co2 ").has_value());
}

TEST(AbsorberGas, SelfContinuumBelongsToWater) {
  EXPECT_EQ(bs::absorber_gas(bs::Absorber::h2o_self_continuum), bandstack::Gas::h2o);
  EXPECT_EQ(bs::absorber_gas(bs::Absorber::h2o), bandstack::Gas::h2o);
  EXPECT_EQ(bs::absorber_gas(bs::Absorber::n2o), bandstack::Gas::n2o);
  EXPECT_TRUE(bs::scales_with_vapour_pressure(bs::Absorber::h2o_self_continuum));
  EXPECT_FALSE(bs::scales_with_vapour_pressure(bs::Absorber::h2o));
}

TEST(WavenumberGrid, FineLongwaveGridHasTheExpectedPoints) {
  // (3000 - 10) / 0.01 = 299000 intervals; midpoints 10.005 ... 2999.995 (arithmetic).
  const bs::WavenumberGrid g = bs::make_wavenumber_grid(10.0, 3000.0, 0.01);
  EXPECT_EQ(g.count, 299000u);
  EXPECT_NEAR(g.at(0), 10.005, 1e-12);
  EXPECT_NEAR(g.at(g.count - 1), 2999.995, 1e-9);
  EXPECT_NEAR(g.end_cm1(), 3000.0, 1e-9);
}

TEST(WavenumberGrid, CoarseGridMidpoints) {
  const bs::WavenumberGrid g = bs::make_wavenumber_grid(0.0, 10.0, 2.5);
  ASSERT_EQ(g.count, 4u);
  EXPECT_DOUBLE_EQ(g.at(0), 1.25);
  EXPECT_DOUBLE_EQ(g.at(3), 8.75);
}

TEST(WavenumberGrid, RangeMustBeAWholeNumberOfSteps) {
  EXPECT_THROW((void)bs::make_wavenumber_grid(0.0, 1.0, 0.3), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(10.0, 3000.0, 0.011), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(0.0, 1.0, 2.0), bandstack::InputError); // less than one step
  EXPECT_NO_THROW((void)bs::make_wavenumber_grid(0.1, 0.7, 0.2)); // 3 steps despite binary rounding
}

TEST(WavenumberGrid, InvalidBoundsAreInputErrors) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  EXPECT_THROW((void)bs::make_wavenumber_grid(10.0, 3000.0, 0.0), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(10.0, 3000.0, -0.01), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(-10.0, 3000.0, 0.01), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(3000.0, 10.0, 0.01), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(10.0, 10.0, 0.01), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(nan, 3000.0, 0.01), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(10.0, inf, 0.01), bandstack::InputError);
  EXPECT_THROW((void)bs::make_wavenumber_grid(10.0, 3000.0, nan), bandstack::InputError);
  try {
    (void)bs::make_wavenumber_grid(10.0, 3000.0, -1.0);
    FAIL() << "expected InputError";
  } catch (const bandstack::InputError& e) {
    EXPECT_NE(std::string(e.what()).find("step"), std::string::npos) << e.what();
  }
}
