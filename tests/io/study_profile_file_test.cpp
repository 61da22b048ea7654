// [[columns]] profile_file and [columns.variables] in study files (docs/study-file.md).
#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"
#include "bandstack/io/study.hpp"

namespace bandstack::io {
namespace {

TEST(StudyProfileFile, PathAndMappingAreRead) {
  const Study s = parse_study(R"(
[[columns]]
name = "field"
profile_file = "data/profiles.nc"
co2_ppmv = 415
[columns.variables]
temperature = "ta"
h2o = "hus"
surface_pressure = "ps"
)", "/studies/s.toml");
  ASSERT_EQ(s.columns.size(), 1u);
  EXPECT_EQ(s.columns[0].profile_file, std::filesystem::path("/studies/data/profiles.nc")); // relative to the study
  EXPECT_EQ(s.columns[0].profile_variables.temperature, "ta");
  EXPECT_EQ(s.columns[0].profile_variables.h2o, "hus");
  EXPECT_EQ(s.columns[0].profile_variables.surface_pressure, "ps");
  EXPECT_TRUE(s.columns[0].profile_variables.pressure.empty()); // found by standard_name
  EXPECT_DOUBLE_EQ(s.columns[0].settings.co2_mole_fraction, 415e-6);
}

TEST(StudyProfileFile, ProblemsAreReported) {
  std::string m;
  try {
    (void)parse_study(R"(
[[sweeps]]
key = "ozone_scale"
values = [0.5]
[[columns]]
name = "field"
profile_file = "p.nc"
profile = "tropical"
ozone_scale = 2
[columns.variables]
temperature = "ta"
wind = "u"
[[columns]]
name = "other"
profile = "tropical"
)", "s.toml");
  } catch (const InputError& e) {
    m = e.what();
  }
  for (const char* expected :
       {"'columns[0].profile': does not apply to a column read from a profile_file",
        "'columns[0].ozone_scale': does not apply", "'columns[0].variables.wind': unknown key",
        "a study with a profile_file column has only that column", "[[sweeps]] key \"ozone_scale\" belongs to the built-in profiles and cannot be swept with a profile_file column"})
    EXPECT_NE(m.find(expected), std::string::npos) << "missing: " << expected << "\nin:\n" << m;
}

TEST(StudyProfileFile, SunFromFileIsReadAndChecked) {
  const Study s = parse_study(R"(
[[columns]]
profile_file = "p.nc"
sun_from_file = "daily_mean"
)", "s.toml");
  ASSERT_TRUE(s.columns[0].sun.from_file.has_value());
  EXPECT_EQ(*s.columns[0].sun.from_file, SunFromFile::daily_mean);
  EXPECT_FALSE(s.columns[0].sun.latitude_deg.has_value());
  std::string m;
  try {
    (void)parse_study(R"(
[[columns]]
profile_file = "p.nc"
sun_from_file = "hourly"
cos_zenith = 0.5
)", "s.toml");
  } catch (const InputError& e) {
    m = e.what();
  }
  for (const char* expected : {"'columns[0].sun_from_file': must be \"instantaneous\" or \"daily_mean\"",
                               "'columns[0].cos_zenith': cannot be given with sun_from_file"})
    EXPECT_NE(m.find(expected), std::string::npos) << "missing: " << expected << "\nin:\n" << m;
  m.clear();
  try {
    (void)parse_study(R"(
[[columns]]
profile = "tropical"
sun_from_file = "instantaneous"
)", "s.toml");
  } catch (const InputError& e) {
    m = e.what();
  }
  EXPECT_NE(m.find("'columns[0].sun_from_file': needs a profile_file column"), std::string::npos) << m;
}

} // namespace
} // namespace bandstack::io
