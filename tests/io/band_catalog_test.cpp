// Band catalog: built-in band sets by name, the band-set files generated at build time, the
// in-memory rebuild fallback, BANDSTACK_BAND_PATH, and absorber sources by name or path.
// Issue 3 asks that rebuilding a shipped band set "gives the same numbers": the generated files in
// <build>/bands/ must match an in-memory rebuild bit for bit. No physical values are checked here.
#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/io/band_set_file.hpp"
#include "bandstack/io/builtin_files.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

#include <bit>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <gtest/gtest.h>
#include <optional>
#include <string>
#include <unistd.h>
#include <vector>

namespace bs = bandstack::spectral;
namespace io = bandstack::io;
namespace fs = std::filesystem;
using bandstack::FileError;
using bandstack::InputError;

namespace {

// The build folder is the folder of the bandstack executable; the ALL target writes bands/*.nc there.
fs::path generated_file(const std::string& name) { return fs::path(BANDSTACK_EXE).parent_path() / "bands" / (name + ".nc"); }

fs::path source_file(const std::string& relative) { return fs::path(BANDSTACK_SOURCE_DIR) / relative; }

// Sets (or, with nullopt, removes) an environment variable for the lifetime of the guard, then
// restores what was there before.
class ScopedEnv {
public:
  ScopedEnv(std::string name, const std::optional<std::string>& value) : name_(std::move(name)) {
    if (const char* old = std::getenv(name_.c_str())) old_ = std::string(old);
    if (value)
      ::setenv(name_.c_str(), value->c_str(), 1);
    else
      ::unsetenv(name_.c_str());
  }
  ~ScopedEnv() {
    if (old_)
      ::setenv(name_.c_str(), old_->c_str(), 1);
    else
      ::unsetenv(name_.c_str());
  }
  ScopedEnv(const ScopedEnv&) = delete;
  ScopedEnv& operator=(const ScopedEnv&) = delete;

private:
  std::string name_;
  std::optional<std::string> old_;
};

// Bit-for-bit comparison of two arrays (== would also accept +0 vs -0), reporting the first
// difference and the number of differing entries.
template <class T>
void expect_bits_equal(const std::vector<T>& a, const std::vector<T>& b, const std::string& what) {
  ASSERT_EQ(a.size(), b.size()) << what;
  std::size_t differing = 0, first = 0;
  for (std::size_t i = 0; i < a.size(); ++i) {
    bool same = true;
    if constexpr (std::is_same_v<T, double>)
      same = std::bit_cast<std::uint64_t>(a[i]) == std::bit_cast<std::uint64_t>(b[i]);
    else
      same = a[i] == b[i];
    if (!same && differing++ == 0) first = i;
  }
  EXPECT_EQ(differing, 0u) << what << ": first difference at index " << first << ": " << a[first] << " vs " << b[first];
}

// The numbers of a band set: bands, g-points, reference grids, tables, Planck fractions.
void expect_same_tables(const bs::BandSet& a, const bs::BandSet& b, const std::string& label) {
  SCOPED_TRACE(label);
  expect_bits_equal(a.band_lower_cm1, b.band_lower_cm1, "band_lower_cm1");
  expect_bits_equal(a.band_upper_cm1, b.band_upper_cm1, "band_upper_cm1");
  expect_bits_equal(a.gpoint_band, b.gpoint_band, "gpoint_band");
  expect_bits_equal(a.gpoint_weight, b.gpoint_weight, "gpoint_weight");
  expect_bits_equal(a.ref_pressure_pa, b.ref_pressure_pa, "ref_pressure_pa");
  expect_bits_equal(a.ref_temperature_k, b.ref_temperature_k, "ref_temperature_k");
  expect_bits_equal(a.planck_temperature_k, b.planck_temperature_k, "planck_temperature_k");
  expect_bits_equal(a.absorption_coefficient, b.absorption_coefficient, "absorption_coefficient");
  expect_bits_equal(a.planck_fraction, b.planck_fraction, "planck_fraction");
  expect_bits_equal(a.solar_weight, b.solar_weight, "solar_weight");
  expect_bits_equal(a.rayleigh_cross_section_m2_kg, b.rayleigh_cross_section_m2_kg, "rayleigh_cross_section_m2_kg");
  EXPECT_EQ(a.absorber_present, b.absorber_present);
}

// The generated file, the in-memory rebuild and load_band_set(name) all carry the same numbers.
void check_generated_matches_rebuild(const std::string& name) {
  const ScopedEnv no_extra_folders("BANDSTACK_BAND_PATH", std::nullopt);
  const fs::path file = generated_file(name);
  ASSERT_TRUE(fs::is_regular_file(file)) << file << " is missing: it is generated at build time by the ALL target "
                                         << "(bandstack_band_sets); build everything, not only the tests";
  const bs::BandSet from_file = io::read_band_set(file);
  const bs::BandSet rebuilt = io::build_builtin_band_set(name);
  ASSERT_GT(rebuilt.gpoint_count(), 0u);
  expect_same_tables(from_file, rebuilt, "generated file vs in-memory rebuild");
  EXPECT_EQ(from_file.name, name);
  EXPECT_EQ(from_file.name, rebuilt.name);
  EXPECT_EQ(from_file.recipe_text, rebuilt.recipe_text);
  EXPECT_EQ(from_file.source_description, rebuilt.source_description);
  EXPECT_EQ(from_file.builder_version, rebuilt.builder_version);
  // The recipe stored is the compiled-in text of bands/<name>.toml.
  const auto builtin_text = io::builtin_file(name + ".toml");
  ASSERT_TRUE(builtin_text.has_value());
  EXPECT_EQ(rebuilt.recipe_text, *builtin_text);

  expect_same_tables(io::load_band_set(name), rebuilt, "load_band_set(name) vs in-memory rebuild");
}

class BandCatalog : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / ("bandstack_band_catalog_" + std::to_string(::getpid()) + "_" +
                                        ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
  }
  void TearDown() override { fs::remove_all(dir_); }
  fs::path dir_;
};

TEST(BandCatalogRebuild, DefaultLwFileMatchesRebuildBitForBit) { check_generated_matches_rebuild("default_lw"); }

TEST(BandCatalogRebuild, FineLwFileMatchesRebuildBitForBit) { check_generated_matches_rebuild("fine_lw"); }

TEST(BandCatalogRebuild, DefaultSwFileMatchesRebuildBitForBit) { check_generated_matches_rebuild("default_sw"); }

TEST(BandCatalogRebuild, RecipeFileInSourceTreeGivesTheBuiltInTables) {
  const fs::path recipe = source_file("bands/default_lw.toml");
  ASSERT_TRUE(fs::is_regular_file(recipe)) << recipe;
  const bs::BandSet from_path = io::build_band_set_from_recipe(recipe.string());
  const bs::BandSet builtin = io::build_builtin_band_set("default_lw");
  expect_same_tables(from_path, builtin, "recipe file in the source tree vs built-in name");
  EXPECT_EQ(from_path.name, "default_lw");
  EXPECT_EQ(from_path.recipe_text, builtin.recipe_text); // the compiled-in text is the file's text
  // The absorber recipe is read from the file next to the recipe, and the provenance says so.
  EXPECT_NE(from_path.source_description.find("earth_idealised_absorbers"), std::string::npos)
      << from_path.source_description;
}

TEST_F(BandCatalog, SearchPathStartsWithTheEnvironmentFolders) {
  const ScopedEnv env("BANDSTACK_BAND_PATH", (dir_ / "a").string() + "::" + (dir_ / "b").string());
  const std::vector<fs::path> path = io::band_set_search_path();
  ASSERT_GE(path.size(), 3u); // two from the variable (the empty item is skipped), then the build folder
  EXPECT_EQ(path[0], dir_ / "a");
  EXPECT_EQ(path[1], dir_ / "b");
  EXPECT_EQ(path[2], generated_file("default_lw").parent_path());
}

TEST_F(BandCatalog, UnknownNamesAndMissingFilesListTheBuiltInSets) {
  for (const std::string& name : std::vector<std::string>{"no_such_lw", (dir_ / "absent.nc").string(), "absent/set.nc"}) {
    SCOPED_TRACE(name);
    try {
      (void)io::load_band_set(name);
      ADD_FAILURE() << "load_band_set accepted " << name;
    } catch (const FileError& e) {
      const std::string what = e.what();
      EXPECT_NE(what.find(name), std::string::npos) << what;
      EXPECT_NE(what.find("default_lw"), std::string::npos) << what;
      EXPECT_NE(what.find("fine_lw"), std::string::npos) << what;
      // The absorber recipe is built in too, but it is not a band set.
      EXPECT_EQ(what.find("earth_idealised_absorbers"), std::string::npos) << what;
    }
  }
  EXPECT_THROW((void)io::build_builtin_band_set("no_such_lw"), InputError);
  EXPECT_THROW((void)io::build_builtin_band_set("earth_idealised_absorbers"), InputError);
  EXPECT_THROW((void)io::build_band_set_from_recipe((dir_ / "absent.toml").string()), FileError);
}

TEST_F(BandCatalog, RelativePathsAreTakenRelativeToTheGivenFolder) {
  const fs::path generated = generated_file("default_lw");
  ASSERT_TRUE(fs::is_regular_file(generated)) << generated;
  fs::create_directories(dir_ / "study");
  fs::copy_file(generated, dir_ / "study" / "my_set.nc");
  const bs::BandSet expected = io::read_band_set(generated);
  expect_same_tables(io::load_band_set("my_set.nc", dir_ / "study"), expected, "relative to the study folder");
  // An absolute path ignores the folder.
  expect_same_tables(io::load_band_set((dir_ / "study" / "my_set.nc").string(), dir_ / "elsewhere"), expected,
                     "absolute path");
  // Relative to another folder the file is not there.
  EXPECT_THROW((void)io::load_band_set("my_set.nc", dir_ / "elsewhere"), FileError);
}

TEST_F(BandCatalog, MatchingFileOnTheEnvironmentPathIsUsedFirst) {
  // A file built from exactly the compiled-in recipe by this version is trusted as it is: the
  // numbers come from it, not from the build folder's file or a rebuild. (This also shows that the
  // fallback tests below really put their file in the way.)
  bs::BandSet set = io::read_band_set(generated_file("default_lw"));
  for (double& k : set.absorption_coefficient) k *= 2.0;
  io::write_band_set(dir_ / "default_lw.nc", set);
  const ScopedEnv env("BANDSTACK_BAND_PATH", dir_.string());
  expect_same_tables(io::load_band_set("default_lw"), set, "file on BANDSTACK_BAND_PATH");
}

TEST_F(BandCatalog, StaleOrCorruptFilesFallBackToTheRebuild) {
  const bs::BandSet rebuilt = io::build_builtin_band_set("default_lw");
  const fs::path folder = dir_ / "bands";
  fs::create_directories(folder);
  const ScopedEnv env("BANDSTACK_BAND_PATH", folder.string());

  // Built from another recipe text (numbers changed too, so that using it would show).
  bs::BandSet other_recipe = rebuilt;
  other_recipe.recipe_text += "# edited after the build\n";
  for (double& k : other_recipe.absorption_coefficient) k *= 2.0;
  io::write_band_set(folder / "default_lw.nc", other_recipe);
  {
    const bs::BandSet loaded = io::load_band_set("default_lw");
    expect_same_tables(loaded, rebuilt, "file with another recipe_text");
    EXPECT_EQ(loaded.recipe_text, rebuilt.recipe_text);
  }

  // Built by another version of bandstack.
  bs::BandSet other_version = other_recipe;
  other_version.recipe_text = rebuilt.recipe_text;
  other_version.builder_version = std::string(bandstack::version()) + "-other";
  io::write_band_set(folder / "default_lw.nc", other_version);
  expect_same_tables(io::load_band_set("default_lw"), rebuilt, "file from another builder version");

  // Not netCDF at all.
  fs::remove(folder / "default_lw.nc");
  std::ofstream(folder / "default_lw.nc") << "this is not a band set\n";
  expect_same_tables(io::load_band_set("default_lw"), rebuilt, "text file");

  // A folder where the file should be.
  fs::remove(folder / "default_lw.nc");
  fs::create_directories(folder / "default_lw.nc");
  expect_same_tables(io::load_band_set("default_lw"), rebuilt, "folder");
}

// ---- absorber sources ----

// kappa of `source` for absorber a at `state` on `grid`.
std::vector<double> kappa_on(const bs::AbsorberSource& source, bs::Absorber a, const bs::AbsorberState& state,
                             const bs::WavenumberGrid& grid) {
  std::vector<double> out(grid.count, -1.0);
  source.absorption(a, state, grid, out);
  return out;
}

TEST_F(BandCatalog, AbsorberSourceByNameRecipePathAndCrossSectionFile) {
  const auto builtin = io::load_absorber_source("earth_idealised_absorbers");
  ASSERT_NE(builtin, nullptr);
  EXPECT_NE(builtin->description().find("earth_idealised_absorbers"), std::string::npos) << builtin->description();
  // The recipe has a CO2 band (bands/earth_idealised_absorbers.toml); a working source gives positive,
  // finite absorption in it.
  ASSERT_TRUE(builtin->provides(bs::Absorber::co2));
  const bs::WavenumberGrid grid = bs::make_wavenumber_grid(600.0, 700.0, 0.5);
  const bs::AbsorberState state{50000.0, 250.0};
  const std::vector<double> k_builtin = kappa_on(*builtin, bs::Absorber::co2, state, grid);
  double peak = 0.0;
  for (double k : k_builtin) {
    ASSERT_TRUE(std::isfinite(k) && k >= 0.0) << k;
    peak = std::max(peak, k);
  }
  EXPECT_GT(peak, 0.0);

  // The same recipe as a file path, absolute and relative to a folder: the same numbers.
  const fs::path recipe = source_file("bands/earth_idealised_absorbers.toml");
  const auto by_path = io::load_absorber_source(recipe.string());
  const auto by_relative = io::load_absorber_source("earth_idealised_absorbers.toml", recipe.parent_path());
  for (const auto* source : {by_path.get(), by_relative.get()}) {
    ASSERT_NE(source, nullptr);
    for (bs::Absorber a : bs::all_absorbers) {
      SCOPED_TRACE(std::string(bs::absorber_name(a)));
      EXPECT_EQ(source->provides(a), builtin->provides(a));
      expect_bits_equal(kappa_on(*source, a, state, grid), kappa_on(*builtin, a, state, grid), "kappa");
    }
  }

  // A cross-section file tabulated from the built-in recipe on a small grid: at a table node it gives
  // the tabulated values (docs/cross-section-file.md: table points are reproduced exactly).
  const std::vector<double> pressures{10000.0, 50000.0, 100000.0};
  const std::vector<double> temperatures{200.0, 250.0, 300.0};
  bs::write_cross_section_file(dir_ / "small.nc", *builtin, grid, pressures, temperatures, "small test table");
  const auto table_abs = io::load_absorber_source((dir_ / "small.nc").string());
  const auto table_rel = io::load_absorber_source("small.nc", dir_);
  for (const auto* source : {table_abs.get(), table_rel.get()}) {
    ASSERT_NE(source, nullptr);
    EXPECT_NE(source->description().find("small test table"), std::string::npos) << source->description();
    EXPECT_TRUE(source->provides(bs::Absorber::co2));
    const std::vector<double> k = kappa_on(*source, bs::Absorber::co2, state, grid);
    for (std::size_t i = 0; i < grid.count; ++i)
      ASSERT_DOUBLE_EQ(k[i], k_builtin[i]) << "at " << grid.at(i) << " cm-1";
    // No extrapolation outside the table (docs/cross-section-file.md).
    EXPECT_THROW((void)kappa_on(*source, bs::Absorber::co2, {50000.0, 150.0}, grid), InputError);
  }
}

TEST_F(BandCatalog, UnknownAbsorberSourcesAreFileErrors) {
  for (const std::string& name :
       std::vector<std::string>{"no_such_absorbers", (dir_ / "absent.toml").string(), (dir_ / "absent.nc").string()}) {
    SCOPED_TRACE(name);
    try {
      (void)io::load_absorber_source(name);
      ADD_FAILURE() << "load_absorber_source accepted " << name;
    } catch (const FileError& e) {
      EXPECT_NE(std::string(e.what()).find(name), std::string::npos) << e.what();
    }
  }
  // A file that is there but is not netCDF.
  std::ofstream(dir_ / "text.nc") << "not netCDF\n";
  EXPECT_THROW((void)io::load_absorber_source("text.nc", dir_), FileError);
  // A recipe file with a TOML error names the file.
  std::ofstream(dir_ / "broken.toml") << "[recipe\n";
  try {
    (void)io::load_absorber_source("broken.toml", dir_);
    ADD_FAILURE() << "a broken recipe was accepted";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("broken.toml"), std::string::npos) << e.what();
  }
}

} // namespace
