// Equilibrium, experiments and attribution through a whole study (batch/climate_setup).
#include <cmath>
#include <cstring>

#include <gtest/gtest.h>

#include "bandstack/batch/run.hpp"
#include "bandstack/core/error.hpp"

namespace bandstack::batch {
namespace {

const std::string head = R"(
[grid]
layers = 24
top_pressure_hpa = 0.5
surface_pressure_hpa = 1013.25
[longwave]
gauss_angles = 1
)";

const std::string column_a = R"(
[[columns]]
name = "a"
profile = "us_standard_1976"
surface_albedo = 0.33
)";

const std::string column_b = R"(
[[columns]]
name = "b"
profile = "tropical"
surface_albedo = 0.3
co2_ppmv = 280
)";

std::vector<ColumnResult> run(const std::string& text, std::size_t threads = 1) {
  const io::Study study = io::parse_study(text, "s.toml");
  return compute_columns(study, build_columns(study), threads);
}

bool same(double a, double b) { return std::memcmp(&a, &b, sizeof a) == 0; }

TEST(ClimateRun, EquilibriumExperimentsAndAttributionAreDeterministic) {
  const std::string text = head + R"(
[equilibrium]
[[experiments]]
name = "doubled_co2"
scale_gases = { co2 = 2.0 }
[[experiments]]
name = "without_band_1"
remove_longwave_bands = [1]
[attribution]
)" + column_a + column_b;
  const std::vector<ColumnResult> one = run(text, 1);
  const std::vector<ColumnResult> two = run(text, 2);
  ASSERT_EQ(one.size(), 2u);
  for (std::size_t c = 0; c < 2; ++c) {
    const ColumnResult& r = one[c];
    ASSERT_TRUE(r.equilibrium && r.attribution);
    // The fluxes written are those of the equilibrium: the top of the atmosphere is in balance to
    // the solver's tolerance (0.01 W m-2, the issue's criterion).
    EXPECT_LE(std::abs(r.shortwave.absorbed_solar() - r.longwave.olr()), 0.0101) << c;
    EXPECT_EQ(r.column.surface_temperature_k, r.equilibrium->column.surface_temperature_k);
    ASSERT_EQ(r.experiments.size(), 2u);
    // Doubling CO2 warms and removing water's rotation band (250-400 cm-1) cools (sign: Manabe & Wetherald 1967).
    EXPECT_GT(r.experiments[0].surface_temperature_change_k, 0.5) << c;
    EXPECT_GT(r.experiments[0].forcing.adjusted_w_m2, 1.0) << c;
    EXPECT_LT(r.experiments[1].surface_temperature_change_k, -1.0) << c;
    EXPECT_LT(r.experiments[1].forcing.adjusted_w_m2, -1.0) << c;
    // log2(2) = 1 doubling; the band removal is not a CO2 scaling.
    EXPECT_DOUBLE_EQ(r.experiments[0].warming_per_co2_doubling_k, r.experiments[0].surface_temperature_change_k);
    EXPECT_TRUE(std::isnan(r.experiments[1].warming_per_co2_doubling_k));
    EXPECT_EQ(r.attribution->band_removal_w_m2.size(), 16u);
    // Any thread count gives bit-identical results.
    EXPECT_TRUE(same(r.column.surface_temperature_k, two[c].column.surface_temperature_k));
    for (std::size_t e = 0; e < 2; ++e) {
      EXPECT_TRUE(same(r.experiments[e].surface_temperature_change_k, two[c].experiments[e].surface_temperature_change_k));
      EXPECT_TRUE(same(r.experiments[e].forcing.adjusted_w_m2, two[c].experiments[e].forcing.adjusted_w_m2));
      EXPECT_TRUE(same(r.experiments[e].feedbacks.planck_w_m2_k, two[c].experiments[e].feedbacks.planck_w_m2_k));
    }
    EXPECT_TRUE(same(r.attribution->band_removal_w_m2[5], two[c].attribution->band_removal_w_m2[5]));
  }
}

TEST(ClimateRun, WithoutEquilibriumExperimentsGiveForcingOnly) {
  const std::vector<ColumnResult> r = run(head + "[[experiments]]\nscale_gases = { co2 = 2.0 }\n" + column_a);
  ASSERT_EQ(r[0].experiments.size(), 1u);
  EXPECT_FALSE(r[0].equilibrium.has_value());
  EXPECT_FALSE(r[0].experiments[0].equilibrium.has_value());
  EXPECT_TRUE(std::isnan(r[0].experiments[0].surface_temperature_change_k));
  EXPECT_GT(r[0].experiments[0].forcing.toa_instantaneous_w_m2, 1.0);
}

std::string error_of(const std::string& text) {
  try {
    const io::Study study = io::parse_study(text, "s.toml");
    (void)check_study(study);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

TEST(ClimateRun, ExperimentsAreCheckedAgainstTheBandSets) {
  EXPECT_NE(error_of(head + "[[experiments]]\nremove_longwave_bands = [16]\n" + column_a)
                .find("s.toml: 'experiments[0].remove_longwave_bands': band 16 does not exist: the longwave band set has bands 0..15"),
            std::string::npos)
      << error_of(head + "[[experiments]]\nremove_longwave_bands = [16]\n" + column_a);
  std::string albedo = column_a;
  albedo += "surface_albedo_by_band = [0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1]\n";
  const std::string m = error_of(head + "[[experiments]]\nsurface_albedo = 0.2\n" + albedo);
  EXPECT_NE(m.find("experiments[0].surface_albedo"), std::string::npos) << m;
  EXPECT_NE(m.find("surface_albedo_by_band"), std::string::npos) << m;
  const std::string h = error_of(head + "[equilibrium]\n[[experiments]]\nset_gases_ppmv = { h2o = 10 }\n" + column_a);
  EXPECT_NE(h.find("experiments[0]"), std::string::npos) << h;
}

} // namespace
} // namespace bandstack::batch

namespace bandstack::batch {
namespace {

// Study-level settings swept per column: the solar constant scales the sunlight at the top exactly
// (global mean: S/4, Kopp & Lean 2011 value as the study's own), and the critical lapse rate shapes
// the convective region: T_i / T_j = (p_i / p_j)^(R_d Gamma / g) between convective layers
// (hypsometric equation for a constant lapse rate; R_d = R / M_d with CODATA R and M_d of the
// U.S. Standard Atmosphere 1976, standard gravity).
TEST(ClimateRun, StudyLevelSettingsSweptPerColumn) {
  const std::vector<ColumnResult> r = run(head + R"(
[equilibrium]
[[sweeps]]
key = "solar_constant_w_m2"
values = [1361, 1200]
[[sweeps]]
key = "critical_lapse_rate_k_per_km"
values = [5.0, 8.0]
)" + column_a);
  ASSERT_EQ(r.size(), 4u);
  const double gammas[] = {5.0, 8.0};
  for (std::size_t i = 0; i < 4; ++i) {
    const double s0 = i < 2 ? 1361.0 : 1200.0;
    EXPECT_NEAR(r[i].shortwave.toa_incoming(), s0 / 4.0, 1e-9 * s0) << i;
    ASSERT_TRUE(r[i].equilibrium);
    const double exponent = 8.314462618 / 28.9644e-3 * gammas[i % 2] * 1e-3 / 9.80665;
    const auto& conv = r[i].equilibrium->convective;
    const auto& t = r[i].column.temperature_layer_k;
    const auto& p = r[i].column.pressure_layer_pa;
    const std::size_t n = t.size();
    ASSERT_TRUE(conv[n - 1] && conv[n - 3]) << i;
    EXPECT_NEAR(t[n - 3] / t[n - 1], std::pow(p[n - 3] / p[n - 1], exponent), 1e-9) << i;
  }
  // A weaker lapse rate (5 K/km) holds a warmer upper troposphere that radiates more: cooler surface
  // for the same sunlight (Manabe & Wetherald 1967 sign of the lapse-rate effect).
  EXPECT_LT(r[0].column.surface_temperature_k, r[1].column.surface_temperature_k);
  // Less sunlight, colder surface.
  EXPECT_LT(r[2].column.surface_temperature_k, r[0].column.surface_temperature_k);
}

} // namespace
} // namespace bandstack::batch
