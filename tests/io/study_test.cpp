#include "bandstack/io/study.hpp"

#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io {
namespace {

const char* const good = R"(
title = "test"
[grid]
layers = 30
top_pressure_hpa = 1.0
surface_pressure_hpa = 1000.0
spacing = "linear_pressure"
[longwave]
method = "grey"
angular_quadrature = "diffusivity"
diffusivity_factor = 1.5
[longwave.grey_mass_absorption_m2_per_kg]
h2o = 0.1
co2 = 0.02
[output]
file = "out/result.nc"
[[columns]]
name = "a"
profile = "tropical"
surface_temperature_k = 299.5
co2_ppmv = 560
[[columns]]
name = "b"
profile = "us_standard_1976"
)";

TEST(Study, ParsesEveryKey) {
  const Study s = parse_study(good, "/data/studies/s.toml");
  EXPECT_EQ(s.title, "test");
  EXPECT_EQ(s.grid.layers, 30u);
  EXPECT_DOUBLE_EQ(s.grid.top_pressure_pa, 100.0);
  EXPECT_DOUBLE_EQ(s.grid.surface_pressure_pa, 100000.0);
  EXPECT_EQ(s.grid.spacing, atmosphere::Spacing::linear_pressure);
  EXPECT_EQ(s.longwave.angle_method, AngleMethod::diffusivity);
  EXPECT_DOUBLE_EQ(s.longwave.diffusivity_factor, 1.5);
  EXPECT_DOUBLE_EQ(s.longwave.grey.mass_absorption_m2_kg[index(Gas::h2o)], 0.1);
  EXPECT_DOUBLE_EQ(s.longwave.grey.mass_absorption_m2_kg[index(Gas::co2)], 0.02);
  EXPECT_DOUBLE_EQ(s.longwave.grey.mass_absorption_m2_kg[index(Gas::o3)], 0.0);
  ASSERT_EQ(s.columns.size(), 2u);
  EXPECT_EQ(s.columns[0].settings.profile, atmosphere::Profile::tropical);
  EXPECT_DOUBLE_EQ(*s.columns[0].settings.surface_temperature_k, 299.5);
  EXPECT_DOUBLE_EQ(s.columns[0].settings.co2_mole_fraction, 560e-6);
  EXPECT_FALSE(s.columns[1].settings.surface_temperature_k.has_value());
  // A relative output path is relative to the study file's folder.
  EXPECT_EQ(s.output_file, std::filesystem::path("/data/studies/out/result.nc"));
  EXPECT_EQ(s.source_text, good);
}

std::string problems_of(const std::string& text) {
  try {
    (void)parse_study(text, "s.toml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

TEST(Study, SyntaxErrorNamesLineAndColumn) {
  const std::string msg = problems_of("title = \"x\"\n[grid\nlayers = 3\n");
  EXPECT_NE(msg.find("s.toml:2:"), std::string::npos) << msg;
  EXPECT_NE(msg.find("syntax"), std::string::npos) << msg;
}

TEST(Study, ReportsAllProblemsAtOnceWithKeysAndLines) {
  const std::string msg = problems_of(R"([grid]
layers = "sixty"
spacing = "cubic"
[[columns]]
name = "a"
profile = "venus"
surface_temperature_k = -3
colour = "blue"
)");
  EXPECT_NE(msg.find("5 problems"), std::string::npos) << msg;
  EXPECT_NE(msg.find("s.toml:2:10: 'grid.layers': expected a whole number"), std::string::npos) << msg;
  EXPECT_NE(msg.find("'grid.spacing'"), std::string::npos) << msg;
  EXPECT_NE(msg.find("s.toml:6:"), std::string::npos) << msg;
  EXPECT_NE(msg.find("venus"), std::string::npos) << msg;
  EXPECT_NE(msg.find("'columns[0].surface_temperature_k': value -3"), std::string::npos) << msg;
  EXPECT_NE(msg.find("'columns[0].colour': unknown key"), std::string::npos) << msg;
}

TEST(Study, NeedsColumnsAndUniqueNames) {
  EXPECT_NE(problems_of("title = \"x\"\n").find("no columns"), std::string::npos);
  const std::string msg = problems_of("[[columns]]\nname=\"a\"\nprofile=\"tropical\"\n[[columns]]\nname=\"a\"\nprofile=\"tropical\"\n");
  EXPECT_NE(msg.find("duplicate column name"), std::string::npos) << msg;
}

TEST(Study, RejectsInconsistentGridAndBadAngles) {
  std::string msg = problems_of("[grid]\ntop_pressure_hpa = 500\nsurface_pressure_hpa = 400\n[[columns]]\nprofile=\"tropical\"\n");
  EXPECT_NE(msg.find("top_pressure_hpa must be below"), std::string::npos) << msg;
  msg = problems_of("[longwave]\ngauss_angles = 12\n[[columns]]\nprofile=\"tropical\"\n");
  EXPECT_NE(msg.find("'longwave.gauss_angles': value 12"), std::string::npos) << msg;
  msg = problems_of("[longwave]\nmethod = \"magic\"\n[[columns]]\nprofile=\"tropical\"\n");
  EXPECT_NE(msg.find("longwave.method"), std::string::npos) << msg;
}

TEST(Study, NanAndInfAreRejected) {
  const std::string msg = problems_of("[[columns]]\nprofile=\"tropical\"\nco2_ppmv = nan\nch4_ppmv = inf\n");
  EXPECT_NE(msg.find("'columns[0].co2_ppmv'"), std::string::npos) << msg;
  EXPECT_NE(msg.find("'columns[0].ch4_ppmv'"), std::string::npos) << msg;
}

TEST(Study, MissingFileIsAFileError) {
  EXPECT_THROW((void)load_study("/nonexistent/folder/study.toml"), FileError);
}

TEST(Study, DemoStudyParses) {
  const Study s = parse_study(demo_study_text(), "demo");
  EXPECT_GE(s.columns.size(), 4u);
  EXPECT_FALSE(s.title.empty());
}

} // namespace
} // namespace bandstack::io

namespace bandstack::io {
namespace {

TEST(Study, PerBandSurfacePropertiesAreArraysInRange) {
  const Study s = parse_study("[[columns]]\nprofile = \"tropical\"\nsurface_emissivity_by_band = [0.98, 1, 0.95]\n"
                              "surface_albedo_by_band = [0.1, 0.2]\n",
                              "s.toml");
  EXPECT_EQ(s.columns[0].surface_emissivity_by_band, (std::vector<double>{0.98, 1.0, 0.95}));
  EXPECT_EQ(s.columns[0].surface_albedo_by_band, (std::vector<double>{0.1, 0.2}));
  const std::string msg = problems_of("[[columns]]\nprofile = \"tropical\"\nsurface_emissivity_by_band = [0.9, 1.2, \"x\"]\n"
                                      "surface_albedo_by_band = 0.3\n");
  EXPECT_NE(msg.find("'columns[0].surface_emissivity_by_band[1]': value 1.2"), std::string::npos) << msg;
  EXPECT_NE(msg.find("'columns[0].surface_emissivity_by_band[2]': expected a number"), std::string::npos) << msg;
  EXPECT_NE(msg.find("'columns[0].surface_albedo_by_band': expected an array"), std::string::npos) << msg;
}

} // namespace
} // namespace bandstack::io
