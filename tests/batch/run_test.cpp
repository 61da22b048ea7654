#include "bandstack/batch/run.hpp"

#include <cstring>

#include <gtest/gtest.h>

namespace bandstack::batch {
namespace {

bool bit_identical(const std::vector<double>& a, const std::vector<double>& b) {
  return a.size() == b.size() && std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0;
}

TEST(Run, ResultsAreBitIdenticalForAnyThreadCount) {
  io::Study study = io::parse_study(io::demo_study_text(), "demo");
  // Many columns so that the work is really split between threads.
  const std::vector<io::ColumnSpec> base = study.columns;
  for (int copy = 0; copy < 8; ++copy)
    for (io::ColumnSpec spec : base) {
      spec.name.append("_").append(std::to_string(copy));
      spec.settings.co2_mole_fraction *= 1.0 + 0.1 * copy;
      study.columns.push_back(spec);
    }
  const auto columns = build_columns(study);
  const auto one = compute_columns(study, columns, 1);
  const auto two = compute_columns(study, columns, 2);
  const auto four = compute_columns(study, columns, 4);
  ASSERT_EQ(one.size(), columns.size());
  for (std::size_t c = 0; c < one.size(); ++c) {
    EXPECT_TRUE(bit_identical(one[c].longwave.flux_up, two[c].longwave.flux_up)) << c;
    EXPECT_TRUE(bit_identical(one[c].longwave.flux_down, four[c].longwave.flux_down)) << c;
    EXPECT_TRUE(bit_identical(one[c].longwave.heating_rate_k_day, four[c].longwave.heating_rate_k_day)) << c;
  }
}

TEST(Run, BadColumnIsNamedInTheError) {
  io::Study study = io::parse_study("[[columns]]\nname = \"cold\"\nprofile = \"tropical\"\n", "s.toml");
  study.columns[0].settings.surface_emissivity = 1.5; // bypasses the parser's own range check
  try {
    (void)build_columns(study);
    FAIL() << "expected an InputError";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("cold"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("surface_emissivity"), std::string::npos) << e.what();
  }
}

} // namespace
} // namespace bandstack::batch

namespace bandstack::batch {
namespace {

// Kirchhoff: a per-band emissivity equal to the broadband value in every band changes nothing, and a
// per-band albedo likewise (the solvers treat each band independently; exact).
TEST(Run, UniformPerBandSurfacePropertiesEqualTheBroadbandOnes) {
  io::Study study = io::parse_study("[[columns]]\nname = \"a\"\nprofile = \"midlatitude_summer\"\nsurface_emissivity = 0.95\n"
                                    "surface_albedo = 0.2\nlatitude_deg = 40\nday_of_year = 172\n",
                                    "s.toml");
  const auto columns = build_columns(study);
  const auto broadband = compute_columns(study, columns, 1);
  study.columns[0].surface_emissivity_by_band.assign(broadband[0].longwave.band_count(), 0.95);
  study.columns[0].surface_albedo_by_band.assign(broadband[0].shortwave.band_count(), 0.2);
  const auto by_band = compute_columns(study, columns, 1);
  EXPECT_TRUE(bit_identical(broadband[0].longwave.flux_up, by_band[0].longwave.flux_up));
  EXPECT_TRUE(bit_identical(broadband[0].shortwave.flux_up, by_band[0].shortwave.flux_up));
  // A different emissivity in one band changes the surface upward flux in that band only.
  study.columns[0].surface_emissivity_by_band[5] = 0.5;
  const auto changed = compute_columns(study, columns, 1);
  const std::size_t levels = columns[0].level_count();
  for (std::size_t b = 0; b < changed[0].longwave.band_count(); ++b) {
    const double before = broadband[0].longwave.flux_up_by_band[b * levels + levels - 1];
    const double after = changed[0].longwave.flux_up_by_band[b * levels + levels - 1];
    if (b == 5) EXPECT_LT(after, before);
    else EXPECT_EQ(after, before) << b;
  }
}

TEST(Run, PerBandSurfacePropertiesMustMatchTheBandSets) {
  io::Study study = io::parse_study("[[columns]]\nprofile = \"tropical\"\nsurface_emissivity_by_band = [0.9, 0.9]\n", "s.toml");
  try {
    (void)check_study(study);
    FAIL() << "expected an InputError";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("columns[0].surface_emissivity_by_band"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("has 2 values, but the longwave band set has 16 bands"), std::string::npos) << e.what();
  }
  study.longwave.method = io::LongwaveMethod::grey;
  EXPECT_THROW((void)check_study(study), InputError);
}

} // namespace
} // namespace bandstack::batch
