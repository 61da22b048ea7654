// Perturbations: what each change does to a column and to the water settings, validation, and the
// number of CO2 doublings.
#include "bandstack/climate/perturbation.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <string>

#include "bandstack/core/error.hpp"
#include "climate/experiment_fixtures.hpp"

namespace cl = bandstack::climate;
namespace at = bandstack::atmosphere;
namespace fx = experiment_fixtures;
using bandstack::Gas;

namespace {

at::Column column() {
  at::Column c = fx::grey_column(6, 250.0, 288.0, 400e-6);
  c.gas(Gas::h2o) = {4e-6, 4e-6, 1e-4, 1e-3, 5e-3, 1e-2};
  c.gas(Gas::ch4).assign(6, 1.8e-6);
  return c;
}

cl::Perturbation with(Gas gas, cl::GasChangeKind kind, double value) {
  cl::Perturbation p;
  p.name = "test";
  p.gas_changes.push_back({gas, kind, value});
  return p;
}

} // namespace

TEST(Perturbation, GasChangesInOrder) {
  at::Column c = column();
  cl::WaterSettings water;
  cl::Perturbation p = with(Gas::co2, cl::GasChangeKind::scale, 2.0);
  p.gas_changes.push_back({Gas::ch4, cl::GasChangeKind::set, 0.7e-6});
  p.gas_changes.push_back({Gas::co2, cl::GasChangeKind::scale, 1.5});
  p.gas_changes.push_back({Gas::n2o, cl::GasChangeKind::remove, 0.0});
  cl::apply_perturbation(p, 2, c, water);
  for (std::size_t i = 0; i < 6; ++i) {
    EXPECT_DOUBLE_EQ(c.gas(Gas::co2)[i], 400e-6 * 2.0 * 1.5);
    EXPECT_EQ(c.gas(Gas::ch4)[i], 0.7e-6);
    EXPECT_EQ(c.gas(Gas::n2o)[i], 0.0);
  }
  EXPECT_EQ(c.gas(Gas::h2o), column().gas(Gas::h2o));
  EXPECT_EQ(water.h2o_scale, 1.0); // fixed mixing ratio: the column alone carries the water
}

TEST(Perturbation, SunAlbedoAndStratosphericWater) {
  at::Column c = column();
  c.sun.distance_factor = 0.97;
  cl::WaterSettings water;
  cl::Perturbation p;
  p.name = "mixed";
  p.insolation_scale = 1.01;
  p.surface_albedo = 0.25;
  p.stratospheric_h2o_mole_fraction = 8e-6;
  cl::apply_perturbation(p, 2, c, water);
  EXPECT_DOUBLE_EQ(c.sun.distance_factor, 0.97 * 1.01);
  EXPECT_EQ(c.surface_albedo, 0.25);
  const std::vector<double> expected{8e-6, 8e-6, 1e-4, 1e-3, 5e-3, 1e-2}; // layers 0, 1 above level 2
  EXPECT_EQ(c.gas(Gas::h2o), expected);
  EXPECT_EQ(water.stratospheric_mole_fraction, 8e-6);
}

// With water at fixed relative humidity the stratosphere is where the equilibrium's water rule puts
// it (above the cold point), so that forcing and the new equilibrium see the same change
// (consistency with climate::update_water, not a physics value).
TEST(Perturbation, StratosphericWaterAtFixedRelativeHumidityFollowsTheColdPoint) {
  cl::WaterSettings water;
  water.treatment = cl::WaterTreatment::fixed_relative_humidity;
  at::Column c = column();
  c.temperature_layer_k = {230.0, 210.0, 200.0, 230.0, 260.0, 285.0}; // cold point: layer 2
  cl::Perturbation p;
  p.name = "drier";
  p.stratospheric_h2o_mole_fraction = 2e-6;
  cl::apply_perturbation(p, 4, c, water); // a tropopause level below the cold point
  EXPECT_EQ(water.stratospheric_mole_fraction, 2e-6);
  at::Column expected = c;
  cl::update_water(expected, water);
  EXPECT_EQ(c.gas(Gas::h2o), expected.gas(Gas::h2o));
  EXPECT_EQ(c.gas(Gas::h2o)[0], 2e-6);
  EXPECT_EQ(c.gas(Gas::h2o)[1], 2e-6);
  EXPECT_GT(c.gas(Gas::h2o)[3], 2e-6); // below the cold point: from the relative humidity
}

TEST(Perturbation, WaterAtFixedRelativeHumidity) {
  cl::WaterSettings water;
  water.treatment = cl::WaterTreatment::fixed_relative_humidity;
  at::Column c = column();
  cl::apply_perturbation(with(Gas::h2o, cl::GasChangeKind::scale, 2.0), 2, c, water);
  EXPECT_EQ(water.h2o_scale, 2.0);
  EXPECT_EQ(water.stratospheric_mole_fraction, 8e-6);
  EXPECT_EQ(c.gas(Gas::h2o)[5], 2e-2);
  cl::apply_perturbation(with(Gas::h2o, cl::GasChangeKind::remove, 0.0), 2, c, water);
  EXPECT_EQ(water.h2o_scale, 0.0);
  EXPECT_EQ(water.stratospheric_mole_fraction, 0.0);
  EXPECT_EQ(c.gas(Gas::h2o), std::vector<double>(6, 0.0));
  // The relative humidity decides the water there: setting it is refused.
  EXPECT_THROW(cl::apply_perturbation(with(Gas::h2o, cl::GasChangeKind::set, 1e-3), 2, c, water),
               bandstack::InputError);
}

TEST(Perturbation, ValidationNamesExperimentAndItem) {
  const cl::WaterSettings water;
  const auto item_of = [&](const cl::Perturbation& p) {
    try {
      cl::validate(p, water);
    } catch (const bandstack::InputError& e) {
      EXPECT_NE(std::string(e.what()).find("'test'"), std::string::npos) << e.what();
      return e.place().item;
    }
    return std::string("no error");
  };
  EXPECT_EQ(item_of(with(Gas::co2, cl::GasChangeKind::scale, -1.0)), "gas_changes[0]");
  EXPECT_EQ(item_of(with(Gas::co2, cl::GasChangeKind::scale, NAN)), "gas_changes[0]");
  EXPECT_EQ(item_of(with(Gas::co2, cl::GasChangeKind::set, 1.0)), "gas_changes[0]");
  EXPECT_EQ(item_of(with(Gas::co2, cl::GasChangeKind::set, 0.5)), "no error");
  EXPECT_EQ(item_of(with(Gas::co2, cl::GasChangeKind::scale, 0.0)), "no error");
  cl::Perturbation p = with(Gas::co2, cl::GasChangeKind::scale, 2.0);
  p.insolation_scale = INFINITY;
  EXPECT_EQ(item_of(p), "insolation_scale");
  p.insolation_scale = 1.0;
  p.surface_albedo = 1.5;
  EXPECT_EQ(item_of(p), "surface_albedo");
  p.surface_albedo.reset();
  p.stratospheric_h2o_mole_fraction = -1e-6;
  EXPECT_EQ(item_of(p), "stratospheric_h2o");
}

// log2 of the CO2 factor (by definition of a doubling).
TEST(Perturbation, Co2Doublings) {
  EXPECT_DOUBLE_EQ(cl::co2_doublings(with(Gas::co2, cl::GasChangeKind::scale, 2.0)).value(), 1.0);
  EXPECT_DOUBLE_EQ(cl::co2_doublings(with(Gas::co2, cl::GasChangeKind::scale, 4.0)).value(), 2.0);
  EXPECT_DOUBLE_EQ(cl::co2_doublings(with(Gas::co2, cl::GasChangeKind::scale, 0.5)).value(), -1.0);
  cl::Perturbation two_steps = with(Gas::co2, cl::GasChangeKind::scale, 2.0);
  two_steps.gas_changes.push_back({Gas::co2, cl::GasChangeKind::scale, 4.0});
  EXPECT_DOUBLE_EQ(cl::co2_doublings(two_steps).value(), 3.0);
  EXPECT_FALSE(cl::co2_doublings(with(Gas::co2, cl::GasChangeKind::scale, 1.0)));
  EXPECT_FALSE(cl::co2_doublings(with(Gas::co2, cl::GasChangeKind::scale, 0.0)));
  EXPECT_FALSE(cl::co2_doublings(with(Gas::co2, cl::GasChangeKind::set, 800e-6)));
  EXPECT_FALSE(cl::co2_doublings(with(Gas::ch4, cl::GasChangeKind::scale, 2.0)));
  cl::Perturbation brighter = with(Gas::co2, cl::GasChangeKind::scale, 2.0);
  brighter.insolation_scale = 1.01;
  EXPECT_FALSE(cl::co2_doublings(brighter));
  cl::Perturbation fewer_bands = with(Gas::co2, cl::GasChangeKind::scale, 2.0);
  fewer_bands.removed_longwave_bands = {3};
  EXPECT_FALSE(cl::co2_doublings(fewer_bands));
  EXPECT_FALSE(cl::co2_doublings(cl::Perturbation{}));
}
