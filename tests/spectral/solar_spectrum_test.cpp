// Solar spectrum files (docs/solar-spectrum-file.md): the file round trip, the wavelength form's
// conversion, the checks on bad files, the [solar] spectrum_file recipe key, and the builder's solar
// weights from a file against those from the blackbody source.
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/absorber.hpp"
#include "bandstack/spectral/band_builder.hpp"
#include "bandstack/spectral/planck.hpp"
#include "bandstack/spectral/solar_spectrum.hpp"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <gtest/gtest.h>

#include "spectral/tiny_sw_recipe.hpp"
#include <limits>
#include <netcdf>
#include <numbers>
#include <string>
#include <unistd.h>
#include <vector>

namespace sp = bandstack::spectral;
namespace fs = std::filesystem;
using bandstack::FileError;
using bandstack::InputError;

namespace {

const std::string bands_folder = std::string(BANDSTACK_SOURCE_DIR) + "/bands/";

// A folder of this process's test files, removed when the program ends.
struct ScratchFolder {
  fs::path path = fs::temp_directory_path() / ("bandstack_solar_spectrum_test_" + std::to_string(::getpid()));
  ScratchFolder() { fs::create_directories(path); }
  ~ScratchFolder() {
    std::error_code ec;
    fs::remove_all(path, ec);
  }
};

fs::path scratch() {
  static const ScratchFolder folder;
  return folder.path;
}

bool contains(const std::string& s, const std::string& part) { return s.find(part) != std::string::npos; }

// A file written with the netCDF library directly, so that it can hold what the writer refuses.
struct RawFile {
  std::string coordinate = "wavenumber";
  std::string coordinate_units = "cm-1";
  std::vector<double> x{1000.0, 2000.0, 3000.0};
  std::string irradiance_units = "W m-2 (cm-1)-1";
  std::vector<double> y{0.1, 0.2, 0.3};
  bool with_irradiance = true;
  bool second_coordinate = false; // also a wavelength(wavelength) variable
};

fs::path write_raw(const std::string& name, const RawFile& f) {
  const fs::path path = scratch() / name;
  netCDF::NcFile nc(path.string(), netCDF::NcFile::replace, netCDF::NcFile::nc4);
  nc.putAtt("title", "raw test spectrum");
  const auto dim = nc.addDim(f.coordinate, f.x.size());
  auto x = nc.addVar(f.coordinate, netCDF::ncDouble, dim);
  if (!f.coordinate_units.empty()) x.putAtt("units", f.coordinate_units);
  x.putVar(f.x.data());
  if (f.with_irradiance) {
    auto y = nc.addVar("spectral_irradiance", netCDF::ncDouble, dim);
    if (!f.irradiance_units.empty()) y.putAtt("units", f.irradiance_units);
    y.putVar(f.y.data());
  }
  if (f.second_coordinate) {
    const auto d2 = nc.addDim("wavelength", 2);
    auto w = nc.addVar("wavelength", netCDF::ncDouble, d2);
    w.putAtt("units", "nm");
    const std::vector<double> v{400.0, 500.0};
    w.putVar(v.data());
  }
  return path;
}

// The InputError of reading `path`; fails the test if the file is accepted.
InputError read_error(const fs::path& path) {
  try {
    (void)sp::read_solar_spectrum_file(path);
  } catch (const InputError& e) {
    return e;
  }
  ADD_FAILURE() << path << " was accepted";
  return InputError("(accepted)");
}

// A small shortwave recipe over 2000-50000 cm-1 on a 1 cm-1 grid with the given [solar] table.
std::string recipe_text(const std::string& solar) {
  return "name = \"tiny_sw\"\nabsorbers = \"" + bands_folder + "solar_idealised_absorbers.toml\"\n" + R"(
)" + bandstack::testing::tiny_sw_recipe_body(3) + solar;
}

sp::BandSet build(const std::string& solar) {
  const sp::BuildRecipe recipe = sp::parse_build_recipe(recipe_text(solar), (scratch() / "tiny_sw.toml").string());
  return sp::build_band_set(recipe, *sp::open_absorber_source(recipe));
}

// Nominal solar radius and astronomical unit: IAU 2015 Resolution B3 (R_sun = 6.957e8 m) and IAU 2012
// Resolution B2 (1 au = 149 597 870 700 m). pi B_nu(T) (R/au)^2 is the spectral irradiance at 1 au
// of a blackbody Sun (from memory).
constexpr double solar_radius_m = 6.957e8;
constexpr double astronomical_unit_m = 149597870700.0;
double blackbody_sun_w_m2_cm1(double nu_cm1, double t_k) {
  const double dilution = std::numbers::pi * std::pow(solar_radius_m / astronomical_unit_m, 2);
  return sp::planck_radiance(nu_cm1, t_k) * dilution;
}

// A 5772 K blackbody Sun sampled at `points` plus the end points 2000 and 50000 cm-1.
sp::SolarSpectrum blackbody_spectrum(const std::vector<double>& points) {
  sp::SolarSpectrum s;
  s.title = "5772 K blackbody";
  s.source = "planck_radiance times pi (R_sun / 1 au)^2";
  s.wavenumber_cm1.push_back(2000.0);
  for (double nu : points)
    if (nu > 2000.0 && nu < 50000.0) s.wavenumber_cm1.push_back(nu);
  s.wavenumber_cm1.push_back(50000.0);
  for (double nu : s.wavenumber_cm1)
    s.irradiance_w_m2_cm1.push_back(blackbody_sun_w_m2_cm1(nu, 5772.0));
  return s;
}

} // namespace

// --- the file --------------------------------------------------------------------------------------

TEST(SolarSpectrumFile, RoundTripAndInterpolation) {
  sp::SolarSpectrum s;
  s.title = "test spectrum";
  s.source = "made up for the test";
  s.wavenumber_cm1 = {1000.0, 1500.0, 4000.0};
  s.irradiance_w_m2_cm1 = {0.2, 0.4, 0.0};
  const fs::path path = scratch() / "round_trip.nc";
  sp::write_solar_spectrum_file(path, s);
  const sp::SolarSpectrum back = sp::read_solar_spectrum_file(path);
  EXPECT_EQ(back.title, s.title);
  EXPECT_EQ(back.source, s.source);
  EXPECT_EQ(back.wavenumber_cm1, s.wavenumber_cm1);
  EXPECT_EQ(back.irradiance_w_m2_cm1, s.irradiance_w_m2_cm1);
  // Linear interpolation (its definition, common practice); 0 outside the file's range.
  EXPECT_DOUBLE_EQ(back.irradiance(1250.0), 0.3);
  EXPECT_DOUBLE_EQ(back.irradiance(3000.0), 0.4 * 0.4);
  EXPECT_EQ(back.irradiance(1500.0), 0.4);
  EXPECT_EQ(back.irradiance(4000.0), 0.0);
  EXPECT_EQ(back.irradiance(999.0), 0.0);
  EXPECT_EQ(back.irradiance(4001.0), 0.0);
  EXPECT_TRUE(back.covers(1000.0, 4000.0));
  EXPECT_FALSE(back.covers(999.0, 4000.0));
  EXPECT_FALSE(back.covers(1000.0, 4000.1));
  // Trapezoids: 500 * 0.3 + 2500 * 0.2 = 650 W m-2 (arithmetic by hand).
  EXPECT_DOUBLE_EQ(back.total_w_m2(), 650.0);
  // The writer refuses what the reader would refuse.
  s.irradiance_w_m2_cm1[1] = -1.0;
  EXPECT_THROW(sp::write_solar_spectrum_file(scratch() / "refused.nc", s), InputError);
  EXPECT_FALSE(fs::exists(scratch() / "refused.nc"));
}

TEST(SolarSpectrumFile, WavelengthFormIsConvertedPerWavenumber) {
  // E_nu = E_lambda |d lambda / d nu| with lambda_nm = 1e7 / nu, so E_nu = E_lambda,nm lambda_nm^2 / 1e7
  // (change of variable, analytic). At 500 nm (20000 cm-1), 2.0 W m-2 nm-1 is
  // 2.0 * 500^2 / 1e7 = 0.05 W m-2 (cm-1)-1; at 400 nm (25000 cm-1), 1.6 -> 0.0256; at 625 nm
  // (16000 cm-1), 1.8 -> 0.0703125 (hand computed).
  RawFile nm;
  nm.coordinate = "wavelength";
  nm.coordinate_units = "nm";
  nm.x = {400.0, 500.0, 625.0};
  nm.irradiance_units = "W m-2 nm-1";
  nm.y = {1.6, 2.0, 1.8};
  RawFile um = nm;
  um.coordinate_units = "um";
  um.x = {0.4, 0.5, 0.625};
  um.irradiance_units = "W m-2 um-1";
  um.y = {1600.0, 2000.0, 1800.0};
  for (const auto& [name, raw] : {std::pair{"lambda_nm.nc", nm}, std::pair{"lambda_um.nc", um}}) {
    const sp::SolarSpectrum s = sp::read_solar_spectrum_file(write_raw(name, raw));
    ASSERT_EQ(s.wavenumber_cm1.size(), 3u) << name;
    EXPECT_NEAR(s.wavenumber_cm1[0], 16000.0, 1e-9) << name;
    EXPECT_NEAR(s.wavenumber_cm1[1], 20000.0, 1e-9) << name;
    EXPECT_NEAR(s.wavenumber_cm1[2], 25000.0, 1e-9) << name;
    EXPECT_NEAR(s.irradiance_w_m2_cm1[0], 0.0703125, 1e-14) << name;
    EXPECT_NEAR(s.irradiance_w_m2_cm1[1], 0.05, 1e-14) << name;
    EXPECT_NEAR(s.irradiance_w_m2_cm1[2], 0.0256, 1e-14) << name;
  }
  // Energy is conserved by the change of variable: a flat 1.5 W m-2 nm-1 over 400-700 nm carries
  // 1.5 * 300 = 450 W m-2 (analytic), whichever variable it is integrated in.
  RawFile flat = nm;
  flat.x.clear();
  flat.y.assign(3001, 1.5);
  for (int i = 0; i <= 3000; ++i)
    flat.x.push_back(400.0 + 0.1 * i);
  const sp::SolarSpectrum s = sp::read_solar_spectrum_file(write_raw("flat.nc", flat));
  EXPECT_NEAR(s.total_w_m2() / 450.0, 1.0, 1e-6);
}

TEST(SolarSpectrumFile, BadFilesNameFileVariableAndIndex) {
  const auto check = [](const std::string& name, const RawFile& raw, const std::string& variable,
                        const std::string& words) {
    const fs::path path = write_raw(name, raw);
    const InputError e = read_error(path);
    EXPECT_EQ(e.place().file, path.string()) << e.what();
    EXPECT_EQ(e.place().item, variable) << e.what();
    EXPECT_TRUE(contains(e.what(), words)) << e.what();
    EXPECT_TRUE(contains(e.what(), path.string()) && contains(e.what(), variable)) << e.what();
  };
  RawFile f;
  f.with_irradiance = false;
  check("no_irradiance.nc", f, "spectral_irradiance", "missing variable");
  f = RawFile{};
  f.coordinate = "frequency";
  check("no_coordinate.nc", f, "wavenumber", "missing coordinate");
  f = RawFile{};
  f.second_coordinate = true;
  check("two_coordinates.nc", f, "wavelength", "not both");
  f = RawFile{};
  f.irradiance_units = "W m-2 nm-1";
  check("per_nm_on_wavenumbers.nc", f, "spectral_irradiance", "not accepted");
  f = RawFile{};
  f.irradiance_units = "";
  check("no_units.nc", f, "spectral_irradiance", "units");
  f = RawFile{};
  f.coordinate_units = "m-1";
  check("wavenumber_in_m.nc", f, "wavenumber", "not accepted");
  f = RawFile{};
  f.y[2] = std::numeric_limits<double>::quiet_NaN();
  check("nan.nc", f, "spectral_irradiance", "index 2");
  f = RawFile{};
  f.y[1] = -0.1;
  check("negative.nc", f, "spectral_irradiance", "index 1");
  f = RawFile{};
  f.x = {1000.0, 3000.0, 2000.0};
  check("not_increasing.nc", f, "wavenumber", "index 2");
  f = RawFile{};
  f.coordinate = "wavelength";
  f.coordinate_units = "nm";
  f.x = {0.0, 500.0, 600.0};
  f.irradiance_units = "W m-2 nm-1";
  check("zero_wavelength.nc", f, "wavelength", "index 0");
  // Not a netCDF file, or no file at all: FileError naming the path.
  const fs::path text = scratch() / "not_netcdf.nc";
  std::ofstream(text) << "hello\n";
  EXPECT_THROW((void)sp::read_solar_spectrum_file(text), FileError);
  EXPECT_THROW((void)sp::read_solar_spectrum_file(scratch() / "missing.nc"), FileError);
}

// --- the recipe and the builder ---------------------------------------------------------------------

TEST(SolarSpectrumBuild, FileOfTheBlackbodyGivesTheBlackbodyWeights) {
  // The file holds the 5772 K blackbody Sun at exactly the fine-grid midpoints, where the builder
  // evaluates the spectrum, so its weights must equal those of `temperature_k = 5772` to rounding:
  // the scale pi (R/au)^2 cancels in the normalisation (analytic equivalence).
  const sp::WavenumberGrid grid = sp::make_wavenumber_grid(2000.0, 50000.0, 1.0);
  std::vector<double> midpoints;
  for (std::size_t i = 0; i < grid.count; ++i)
    midpoints.push_back(grid.at(i));
  const sp::SolarSpectrum sun = blackbody_spectrum(midpoints);
  sp::write_solar_spectrum_file(scratch() / "blackbody_sun.nc", sun);

  // sigma T^4 (R/au)^2 with the IAU 2015 B3 nominal values is the nominal total solar irradiance,
  // 1361 W m-2 (IAU 2015 Resolution B3); 2000-50000 cm-1 holds its blackbody fraction.
  const double fraction = sp::blackbody_fraction(2000.0, 50000.0, 5772.0);
  EXPECT_NEAR(sun.total_w_m2() / fraction, 1361.0, 1.0);

  const sp::BandSet from_temperature = build("[solar]\ntemperature_k = 5772.0\n");
  const sp::BandSet from_file = build("[solar]\nspectrum_file = \"blackbody_sun.nc\"\n");
  ASSERT_EQ(from_file.solar_weight.size(), from_temperature.solar_weight.size());
  for (std::size_t g = 0; g < from_file.solar_weight.size(); ++g) {
    EXPECT_NEAR(from_file.solar_weight[g], from_temperature.solar_weight[g], 1e-9 * from_temperature.solar_weight[g])
        << "g-point " << g;
    EXPECT_NEAR(from_file.rayleigh_cross_section_m2_kg[g], from_temperature.rayleigh_cross_section_m2_kg[g],
                1e-9 * from_temperature.rayleigh_cross_section_m2_kg[g])
        << "g-point " << g;
  }
  EXPECT_EQ(from_file.gpoint_weight, from_temperature.gpoint_weight); // the sorting does not see the Sun
  // Provenance: the file and its title.
  EXPECT_TRUE(contains(from_file.source_description, "blackbody_sun.nc")) << from_file.source_description;
  EXPECT_TRUE(contains(from_file.source_description, "5772 K blackbody")) << from_file.source_description;

  // Sampled every 25 cm-1 instead, linear interpolation of the smooth Planck curve still gives each
  // band's weight to within 1e-5 relative (interpolation error ~ (h^2/8) B'' / B, analytic bound).
  std::vector<double> coarse;
  for (double nu = 2025.0; nu < 50000.0; nu += 25.0)
    coarse.push_back(nu);
  sp::write_solar_spectrum_file(scratch() / "coarse_sun.nc", blackbody_spectrum(coarse));
  const sp::BandSet from_coarse = build("[solar]\nspectrum_file = \"coarse_sun.nc\"\n");
  for (std::size_t b = 0; b < 3; ++b) {
    double w_coarse = 0.0, w_exact = 0.0;
    for (std::size_t g = 0; g < from_coarse.gpoint_count(); ++g)
      if (from_coarse.gpoint_band[g] == b) w_coarse += from_coarse.solar_weight[g], w_exact += from_temperature.solar_weight[g];
    EXPECT_NEAR(w_coarse / w_exact, 1.0, 1e-5) << "band " << b;
  }
}

TEST(SolarSpectrumBuild, SpectrumMustCoverTheSet) {
  std::vector<double> points;
  for (double nu = 2000.0; nu <= 40000.0; nu += 100.0)
    points.push_back(nu);
  sp::SolarSpectrum short_sun = blackbody_spectrum(points);
  short_sun.wavenumber_cm1.pop_back(); // drop 50000: the file now ends at 40000 cm-1
  short_sun.irradiance_w_m2_cm1.pop_back();
  const fs::path path = scratch() / "short_sun.nc";
  sp::write_solar_spectrum_file(path, short_sun);
  try {
    (void)build("[solar]\nspectrum_file = \"short_sun.nc\"\n");
    FAIL() << "built with a spectrum that stops at 40000 cm-1";
  } catch (const InputError& e) {
    EXPECT_EQ(e.place().file, path.string()) << e.what();
    EXPECT_EQ(e.place().item, "wavenumber") << e.what();
    EXPECT_TRUE(contains(e.what(), "2000-50000 cm-1")) << e.what();
  }
  // A missing file is a FileError naming it.
  EXPECT_THROW((void)build("[solar]\nspectrum_file = \"no_such_sun.nc\"\n"), FileError);
}

TEST(SolarSpectrumBuild, RecipeKeyIsResolvedAndExclusive) {
  const std::string file = (scratch() / "r.toml").string();
  const sp::BuildRecipe recipe = sp::parse_build_recipe(recipe_text("[solar]\nspectrum_file = \"sun.nc\"\n"), file);
  ASSERT_TRUE(recipe.solar && recipe.solar->spectrum_file);
  EXPECT_EQ(*recipe.solar->spectrum_file, scratch() / "sun.nc"); // relative to the recipe's folder
  EXPECT_TRUE(recipe.solar->rayleigh_scattering);
  const sp::BuildRecipe absolute =
      sp::parse_build_recipe(recipe_text("[solar]\nspectrum_file = \"/data/sun.nc\"\nrayleigh_scattering = false\n"), file);
  EXPECT_EQ(*absolute.solar->spectrum_file, fs::path("/data/sun.nc"));
  EXPECT_FALSE(absolute.solar->rayleigh_scattering);

  const auto message = [&](const std::string& solar) {
    try {
      (void)sp::parse_build_recipe(recipe_text(solar), file);
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string("(accepted)");
  };
  // Both sources: the problem is reported at the spectrum_file line with the other key's line.
  const std::string text = recipe_text("[solar]\ntemperature_k = 5772.0\nspectrum_file = \"sun.nc\"\n");
  long line_of_file = 1, line_of_temperature = 1;
  for (std::size_t i = 0; i < text.find("spectrum_file"); ++i)
    line_of_file += text[i] == '\n';
  for (std::size_t i = 0; i < text.find("temperature_k = 5772.0"); ++i)
    line_of_temperature += text[i] == '\n';
  const std::string both = message("[solar]\ntemperature_k = 5772.0\nspectrum_file = \"sun.nc\"\n");
  EXPECT_TRUE(contains(both, file + ":" + std::to_string(line_of_file) + ":")) << both;
  EXPECT_TRUE(contains(both, "solar.spectrum_file")) << both;
  EXPECT_TRUE(contains(both, "not both")) << both;
  EXPECT_TRUE(contains(both, "line " + std::to_string(line_of_temperature))) << both;
  EXPECT_TRUE(contains(message("[solar]\nspectrum_file = \"sun.nc\"\nbrightness_temperature_cm1 = [1.0, 2.0]\n"
                               "brightness_temperature_k = [5000.0, 5000.0]\n"),
                       "not both"));
  EXPECT_TRUE(contains(message("[solar]\nspectrum_file = \"\"\n"), "must not be empty"));
  EXPECT_TRUE(contains(message("[solar]\nspectrum_file = 3\n"), "solar.spectrum_file"));
  // Neither source: temperature_k is missing.
  EXPECT_TRUE(contains(message("[solar]\nrayleigh_scattering = true\n"), "solar.temperature_k"));
  // A recipe built in code with both is refused by the builder.
  sp::BuildRecipe both_in_code = recipe;
  both_in_code.solar->brightness_node_cm1 = {25000.0, 50000.0};
  both_in_code.solar->brightness_node_k = {5772.0, 4800.0};
  EXPECT_THROW((void)sp::build_band_set(both_in_code, *sp::open_absorber_source(both_in_code)), InputError);
}
