#include "bandstack/atmosphere/grid.hpp"

#include <cmath>
#include <limits>

#include <gtest/gtest.h>

#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/core/error.hpp"

namespace {

using bandstack::InputError;
using namespace bandstack::atmosphere;

TEST(Grid, LogSpacingIsGeometric) {
  // Analytic: equal steps in ln p between 10 and 1000 Pa with 2 layers give 10, 100, 1000.
  const auto p = level_pressures_pa({2, 10.0, 1000.0, Spacing::log_pressure});
  ASSERT_EQ(p.size(), 3u);
  EXPECT_DOUBLE_EQ(p[0], 10.0);
  EXPECT_NEAR(p[1], 100.0, 1e-10);
  EXPECT_DOUBLE_EQ(p[2], 1000.0);
}

TEST(Grid, LogSpacingHasConstantRatioAndExactEnds) {
  const GridSpec g{60, 10.0, 101325.0, Spacing::log_pressure};
  const auto p = level_pressures_pa(g);
  ASSERT_EQ(p.size(), 61u);
  EXPECT_EQ(p.front(), 10.0);
  EXPECT_EQ(p.back(), 101325.0);
  // Analytic: ratio (p_s/p_top)^(1/N) between neighbours.
  const double ratio = std::pow(101325.0 / 10.0, 1.0 / 60.0);
  for (std::size_t k = 1; k < p.size(); ++k) EXPECT_NEAR(p[k] / p[k - 1], ratio, 1e-12) << "level " << k;
}

TEST(Grid, LinearSpacingHasConstantStep) {
  const GridSpec g{40, 100.0, 100100.0, Spacing::linear_pressure};
  const auto p = level_pressures_pa(g);
  ASSERT_EQ(p.size(), 41u);
  EXPECT_EQ(p.front(), 100.0);
  EXPECT_EQ(p.back(), 100100.0);
  // Analytic: step (p_s - p_top) / N = 2500 Pa.
  for (std::size_t k = 1; k < p.size(); ++k) EXPECT_NEAR(p[k] - p[k - 1], 2500.0, 1e-9) << "level " << k;
}

TEST(Grid, SingleLayer) {
  const auto p = level_pressures_pa({1, 5.0, 7.0, Spacing::linear_pressure});
  ASSERT_EQ(p.size(), 2u);
  EXPECT_EQ(p[0], 5.0);
  EXPECT_EQ(p[1], 7.0);
}

TEST(Grid, LayerPressureIsMeanOfLevels) {
  const auto layers = layer_pressures_pa({10.0, 30.0, 100.0});
  ASSERT_EQ(layers.size(), 2u);
  EXPECT_DOUBLE_EQ(layers[0], 20.0);
  EXPECT_DOUBLE_EQ(layers[1], 65.0);
}

TEST(Grid, InvalidGridsThrowInputError) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  EXPECT_THROW((void)level_pressures_pa({0, 10.0, 1000.0}), InputError);
  EXPECT_THROW((void)level_pressures_pa({10, 0.0, 1000.0}), InputError);
  EXPECT_THROW((void)level_pressures_pa({10, -1.0, 1000.0}), InputError);
  EXPECT_THROW((void)level_pressures_pa({10, 1000.0, 1000.0}), InputError);
  EXPECT_THROW((void)level_pressures_pa({10, 2000.0, 1000.0}), InputError);
  EXPECT_THROW((void)level_pressures_pa({10, nan, 1000.0}), InputError);
  EXPECT_THROW((void)level_pressures_pa({10, 10.0, inf}), InputError);
  EXPECT_THROW((void)level_pressures_pa({10, 10.0, nan}), InputError);
}

TEST(Grid, ErrorNamesTheItem) {
  try {
    (void)level_pressures_pa({10, 10.0, 5.0});
    FAIL() << "expected InputError";
  } catch (const InputError& e) {
    EXPECT_EQ(e.place().item, "surface_pressure");
  }
}

TEST(Grid, MakeColumnRejectsInvalidGrid) {
  EXPECT_THROW((void)make_column({}, {0, 10.0, 101325.0}), InputError);
  EXPECT_THROW((void)make_column({}, {30, 200000.0, 101325.0}), InputError);
}

} // namespace
