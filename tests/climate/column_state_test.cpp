// Column state updates: water vapour at fixed relative humidity with a tropospheric scale factor.
#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/climate/column_state.hpp"
#include "bandstack/core/error.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <limits>
#include <string>

namespace at = bandstack::atmosphere;
namespace cl = bandstack::climate;
using bandstack::Gas;

namespace {

// A 30-layer column whose layer temperatures fall by 9 K per layer from 281 K at the ground to a
// single coldest layer (the cold point, 200 K) and rise by 2 K per layer above it, so that the
// troposphere is unambiguous (the built-in profiles have isothermal stretches).
constexpr std::size_t cold_point = 20;

at::Column v_shaped_column() {
  at::Column c = at::make_column(at::ProfileSettings{}, at::GridSpec{30, 100.0, 101325.0, at::Spacing::log_pressure});
  for (std::size_t i = 0; i < c.layer_count(); ++i) {
    const double distance = std::abs(static_cast<double>(i) - static_cast<double>(cold_point));
    c.temperature_layer_k[i] = 200.0 + (i > cold_point ? 9.0 : 2.0) * distance;
  }
  return c;
}

cl::WaterSettings relative_humidity(double scale) {
  cl::WaterSettings w;
  w.treatment = cl::WaterTreatment::fixed_relative_humidity;
  w.h2o_scale = scale;
  return w;
}

} // namespace

// Contract of WaterSettings::h2o_scale (column_state.hpp): the tropospheric water (the cold point
// and the layers below it) is multiplied, the stratospheric value is not.
TEST(ColumnState, H2oScaleMultipliesOnlyTroposphericWater) {
  at::Column reference = v_shaped_column();
  cl::update_water(reference, relative_humidity(1.0));
  const auto& x1 = reference.gas(Gas::h2o);
  ASSERT_GT(x1.back(), 1e-3); // moist near the ground (~0.8 % at 281 K and 77 % relative humidity)
  for (double scale : {0.5, 0.0, 2.0}) {
    at::Column c = v_shaped_column();
    cl::update_water(c, relative_humidity(scale));
    const auto& x = c.gas(Gas::h2o);
    for (std::size_t i = 0; i < c.layer_count(); ++i) {
      if (i < cold_point) {
        EXPECT_EQ(x[i], 4e-6) << "stratospheric layer " << i << ", scale " << scale; // WaterSettings default
        EXPECT_EQ(x[i], x1[i]);
      } else {
        EXPECT_DOUBLE_EQ(x[i], scale * x1[i]) << "tropospheric layer " << i << ", scale " << scale;
      }
    }
  }
}

TEST(ColumnState, FixedMoleFractionIgnoresTheScale) {
  at::Column c = v_shaped_column();
  const auto before = c.gas(Gas::h2o);
  cl::WaterSettings w;
  w.h2o_scale = 0.0;
  cl::update_water(c, w);
  EXPECT_EQ(c.gas(Gas::h2o), before);
}

TEST(ColumnState, BadH2oScaleThrows) {
  for (double bad : {-0.1, std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::infinity()}) {
    for (auto treatment : {cl::WaterTreatment::fixed_relative_humidity, cl::WaterTreatment::fixed_mole_fraction}) {
      at::Column c = v_shaped_column();
      cl::WaterSettings w = relative_humidity(bad);
      w.treatment = treatment;
      try {
        cl::update_water(c, w);
        ADD_FAILURE() << "no exception for " << bad;
      } catch (const bandstack::InputError& e) {
        EXPECT_NE(std::string(e.what()).find("h2o_scale"), std::string::npos) << e.what();
      }
    }
  }
}
