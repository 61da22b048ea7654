// The study-file sections [equilibrium], [[experiments]] and [attribution] (docs/study-file.md).
#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"
#include "bandstack/io/study.hpp"

namespace bandstack::io {
namespace {

const std::string columns = R"(
[[columns]]
name = "a"
profile = "us_standard_1976"
)";

const std::string good = R"(
[equilibrium]
convection = "moist_adiabat"
critical_lapse_rate_k_per_km = 5.5
water = "fixed_mixing_ratio"
surface_temperature = "fixed"
heating_tolerance_k_per_day = 0.002
flux_tolerance_w_m2 = 0.05
max_newton_iterations = 12
time_marching_fallback = false

[[experiments]]
name = "many"
scale_gases = { co2 = 2.0 }
set_gases_ppmv = { ch4 = 0.7 }
remove_gases = ["o3", "n2o"]
remove_longwave_bands = [5, 6]
remove_shortwave_bands = [0]
insolation_scale = 1.01
surface_albedo = 0.25
stratospheric_h2o_ppmv = 2.0

[[experiments]]
scale_gases = { h2o = 0.5 }

[attribution]
)" + columns;

TEST(StudyClimate, ParsesEveryKey) {
  const Study s = parse_study(good, "s.toml");
  ASSERT_TRUE(s.equilibrium.has_value());
  const climate::EquilibriumSettings& e = *s.equilibrium;
  EXPECT_EQ(e.convection.kind, climate::ConvectionKind::moist_adiabat);
  EXPECT_DOUBLE_EQ(e.convection.critical_lapse_rate_k_km, 5.5);
  EXPECT_EQ(e.water.treatment, climate::WaterTreatment::fixed_mole_fraction);
  EXPECT_EQ(e.surface, climate::SurfaceTreatment::fixed);
  EXPECT_DOUBLE_EQ(e.heating_tolerance_k_day, 0.002);
  EXPECT_DOUBLE_EQ(e.flux_tolerance_w_m2, 0.05);
  EXPECT_EQ(e.max_newton_iterations, 12);
  EXPECT_FALSE(e.time_marching_fallback);

  ASSERT_EQ(s.experiments.size(), 2u);
  const climate::Perturbation& p = s.experiments[0];
  EXPECT_EQ(p.name, "many");
  // Removals first, then sets, then scales, each gas once.
  ASSERT_EQ(p.gas_changes.size(), 4u);
  EXPECT_EQ(p.gas_changes[0].gas, Gas::o3);
  EXPECT_EQ(p.gas_changes[0].kind, climate::GasChangeKind::remove);
  EXPECT_EQ(p.gas_changes[1].gas, Gas::n2o);
  EXPECT_EQ(p.gas_changes[2].gas, Gas::ch4);
  EXPECT_EQ(p.gas_changes[2].kind, climate::GasChangeKind::set);
  EXPECT_DOUBLE_EQ(p.gas_changes[2].value, 0.7e-6);
  EXPECT_EQ(p.gas_changes[3].gas, Gas::co2);
  EXPECT_EQ(p.gas_changes[3].kind, climate::GasChangeKind::scale);
  EXPECT_DOUBLE_EQ(p.gas_changes[3].value, 2.0);
  EXPECT_EQ(p.removed_longwave_bands, (std::vector<std::size_t>{5, 6}));
  EXPECT_EQ(p.removed_shortwave_bands, (std::vector<std::size_t>{0}));
  EXPECT_DOUBLE_EQ(p.insolation_scale, 1.01);
  EXPECT_DOUBLE_EQ(*p.surface_albedo, 0.25);
  EXPECT_DOUBLE_EQ(*p.stratospheric_h2o_mole_fraction, 2e-6);
  EXPECT_EQ(s.experiments[1].name, "experiment_1");
  EXPECT_TRUE(s.attribution.enabled);
  EXPECT_TRUE(s.attribution.bands); // default with the bands longwave method
}

TEST(StudyClimate, DefaultsWithoutTheTables) {
  const Study s = parse_study(columns, "s.toml");
  EXPECT_FALSE(s.equilibrium.has_value());
  EXPECT_TRUE(s.experiments.empty());
  EXPECT_FALSE(s.attribution.enabled);
  const Study d = parse_study("[equilibrium]\n" + columns, "s.toml");
  ASSERT_TRUE(d.equilibrium.has_value());
  EXPECT_EQ(d.equilibrium->convection.kind, climate::ConvectionKind::fixed_lapse_rate);
  EXPECT_DOUBLE_EQ(d.equilibrium->convection.critical_lapse_rate_k_km, 6.5);
  EXPECT_EQ(d.equilibrium->water.treatment, climate::WaterTreatment::fixed_relative_humidity);
  EXPECT_EQ(d.equilibrium->surface, climate::SurfaceTreatment::energy_balance);
}

std::string problems_of(const std::string& text) {
  try {
    (void)parse_study(text, "s.toml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

TEST(StudyClimate, EveryProblemIsReportedWithItsPlace) {
  const std::string bad = R"(
[longwave]
method = "grey"
[equilibrium]
convection = "dry"
water = 3
max_newton_iterations = -1
[[experiments]]
name = "x"
scale_gases = { co2 = -1.0, xenon = 2.0 }
remove_gases = ["co2", "argon"]
remove_longwave_bands = [1.5, 2]
[[experiments]]
name = "x"
insolation_scale = 1.1
[[experiments]]
name = "empty"
[attribution]
bands = true
)" + columns;
  const std::string m = problems_of(bad);
  for (const char* expected :
       {"s.toml:5:14: 'equilibrium.convection': must be one of \"fixed_lapse_rate\", \"moist_adiabat\", \"none\", not \"dry\"",
        "'equilibrium.water': expected a string", "'equilibrium.max_newton_iterations': value -1 is outside",
        "'experiments[0].scale_gases.co2': value -1", "'experiments[0].scale_gases.xenon': unknown gas",
        "unknown gas \"argon\"", "'experiments[0].remove_longwave_bands[0]': expected a whole number",
        "'experiments[1].name': duplicate experiment name \"x\"", "'experiments[2]': changes nothing",
        "attribution.bands needs the longwave method \"bands\"",
        "experiments[0].remove_longwave_bands needs the longwave method \"bands\""})
    EXPECT_NE(m.find(expected), std::string::npos) << "missing: " << expected << "\nin:\n" << m;
}

TEST(StudyClimate, AGasChangedTwiceIsAProblem) {
  const std::string m = problems_of("[[experiments]]\nremove_gases = [\"co2\"]\nscale_gases = { co2 = 2.0 }\n" + columns);
  EXPECT_NE(m.find("co2 is changed twice"), std::string::npos) << m;
}

} // namespace
} // namespace bandstack::io
