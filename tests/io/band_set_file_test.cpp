// Band-set file: bit-identical round trip, and every kind of bad file is refused with a typed error
// that names the file and the variable, never a crash. The set written here is made up; no physical
// values are checked.
#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/band_set_file.hpp"

#include <cmath>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <functional>
#include <gtest/gtest.h>
#include <limits>
#include <netcdf.h>
#include <netcdf>
#include <string>
#include <unistd.h>

namespace bs = bandstack::spectral;
namespace fs = std::filesystem;
using bandstack::FileError;
using bandstack::InputError;

namespace {

// 2 bands (3 + 2 g-points), 3 pressures, 2 temperatures, 3 Planck temperatures; h2o, o3 and the
// self-continuum present. Values chosen to need all 17 significant digits.
bs::BandSet sample_set() {
  bs::BandSet s;
  s.band_lower_cm1 = {10.0, 333.3};
  s.band_upper_cm1 = {333.3, 1000.0 / 3.0 + 500.0};
  s.gpoint_band = {0, 0, 0, 1, 1};
  s.gpoint_weight = {0.5, 0.3, 0.2, 1.0 / 3.0, 2.0 / 3.0};
  s.ref_pressure_pa = {1.0, std::sqrt(2.0) * 1000.0, 110000.0};
  s.ref_temperature_k = {150.0, 350.0};
  s.planck_temperature_k = {100.0, 250.0, 400.0};
  for (bs::Absorber a : {bs::Absorber::h2o, bs::Absorber::o3, bs::Absorber::h2o_self_continuum})
    s.absorber_present[index(a)] = true;
  const std::size_t block = 5 * 2 * 3;
  s.absorption_coefficient.assign(bs::absorber_count * block, 0.0);
  for (bs::Absorber a : bs::all_absorbers)
    if (s.absorber_present[index(a)])
      for (std::size_t i = 0; i < block; ++i)
        s.absorption_coefficient[index(a) * block + i] =
            std::exp(0.37 * static_cast<double>(i) - 3.0 * static_cast<double>(index(a))) / 7.0;
  s.absorption_coefficient[index(bs::Absorber::o3) * block + 4] = 0.0;
  s.planck_fraction = {0.1, 0.2, 0.3, 0.6, 0.5, 0.4, 0.3, 0.3, 0.3, 1.0 / 3.0, 0.25, 0.125, 2.0 / 3.0, 0.75, 0.875};
  s.name = "sample";
  s.source_description = "made-up source for a test";
  s.recipe_text = "name = \"sample\"\n# a recipe with \"quotes\" and ünïcode\n";
  s.builder_version = std::string(bandstack::version());
  return s;
}

class BandSetFile : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / ("bandstack_band_set_file_" + std::to_string(::getpid()) + "_" +
                                        ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
  }
  void TearDown() override { fs::remove_all(dir_); }

  // Writes the sample set, lets `spoil` change the file, and expects read_band_set to throw an
  // InputError naming the file and `item` with `text` in the message.
  void expect_rejected(const std::function<void(netCDF::NcFile&)>& spoil, const std::string& item,
                       const std::string& text = "") {
    const fs::path path = dir_ / "spoiled.nc";
    bandstack::io::write_band_set(path, sample_set());
    {
      netCDF::NcFile file(path.string(), netCDF::NcFile::write);
      spoil(file);
    }
    try {
      (void)bandstack::io::read_band_set(path);
      FAIL() << "read_band_set accepted a file with a bad " << item;
    } catch (const InputError& e) {
      EXPECT_EQ(e.place().file, path.string()) << e.what();
      EXPECT_EQ(e.place().item, item) << e.what();
      EXPECT_NE(std::string(e.what()).find(text), std::string::npos) << e.what();
    }
  }

  fs::path dir_;
};

bool same_bits(const std::vector<double>& a, const std::vector<double>& b) {
  return a.size() == b.size() && (a.empty() || std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0);
}

} // namespace

TEST_F(BandSetFile, RoundTripIsBitIdentical) {
  const bs::BandSet original = sample_set();
  const fs::path path = dir_ / "set.nc";
  bandstack::io::write_band_set(path, original);
  const bs::BandSet back = bandstack::io::read_band_set(path);
  EXPECT_TRUE(same_bits(back.band_lower_cm1, original.band_lower_cm1));
  EXPECT_TRUE(same_bits(back.band_upper_cm1, original.band_upper_cm1));
  EXPECT_EQ(back.gpoint_band, original.gpoint_band);
  EXPECT_TRUE(same_bits(back.gpoint_weight, original.gpoint_weight));
  EXPECT_TRUE(same_bits(back.ref_pressure_pa, original.ref_pressure_pa));
  EXPECT_TRUE(same_bits(back.ref_temperature_k, original.ref_temperature_k));
  EXPECT_TRUE(same_bits(back.planck_temperature_k, original.planck_temperature_k));
  EXPECT_TRUE(same_bits(back.absorption_coefficient, original.absorption_coefficient));
  EXPECT_TRUE(same_bits(back.planck_fraction, original.planck_fraction));
  EXPECT_EQ(back.absorber_present, original.absorber_present);
  EXPECT_EQ(back.name, original.name);
  EXPECT_EQ(back.source_description, original.source_description);
  EXPECT_EQ(back.recipe_text, original.recipe_text);
  EXPECT_EQ(back.builder_version, original.builder_version);
}

TEST_F(BandSetFile, StoresOnlyPresentAbsorbersWithTheirUnits) {
  const fs::path path = dir_ / "set.nc";
  bandstack::io::write_band_set(path, sample_set());
  netCDF::NcFile file(path.string(), netCDF::NcFile::read);
  EXPECT_EQ(file.getDim("absorber").getSize(), 3u);
  EXPECT_EQ(file.getDim("gpoint").getSize(), 5u);
  const std::size_t length = file.getDim("absorber_text_length").getSize();
  std::vector<char> units(3 * length);
  file.getVar("absorber_units").getVar(units.data());
  // Units of absorber.hpp: gases m2 per kg of the gas; the self-continuum per Pa of vapour pressure.
  EXPECT_STREQ(std::string(units.data(), length).c_str(), "m2 kg-1");
  EXPECT_STREQ(std::string(units.data() + 2 * length, length).c_str(), "m2 kg-1 Pa-1");
  std::string conventions;
  file.getAtt("Conventions").getValues(conventions);
  EXPECT_EQ(conventions, "CF-1.8");
}

TEST_F(BandSetFile, WriteRefusesInvalidSetAndLeavesNothing) {
  bs::BandSet s = sample_set();
  s.planck_fraction[0] = 0.5;
  EXPECT_THROW(bandstack::io::write_band_set(dir_ / "bad.nc", s), InputError);
  EXPECT_TRUE(fs::is_empty(dir_));
  EXPECT_THROW(bandstack::io::write_band_set(dir_ / "no" / "such" / "folder.nc", sample_set()), FileError);
}

TEST_F(BandSetFile, MissingOrForeignFilesAreFileErrors) {
  EXPECT_THROW((void)bandstack::io::read_band_set(dir_ / "absent.nc"), FileError);
  EXPECT_THROW((void)bandstack::io::read_band_set(dir_), FileError);
  std::ofstream(dir_ / "text.nc") << "name = \"not netCDF\"\n";
  EXPECT_THROW((void)bandstack::io::read_band_set(dir_ / "text.nc"), FileError);
  std::ofstream(dir_ / "empty.nc").close();
  EXPECT_THROW((void)bandstack::io::read_band_set(dir_ / "empty.nc"), FileError);
}

TEST_F(BandSetFile, TruncatedFileIsAnErrorNotACrash) {
  const fs::path path = dir_ / "set.nc";
  bandstack::io::write_band_set(path, sample_set());
  const auto size = fs::file_size(path);
  for (const double share : {0.9, 0.5, 0.1}) {
    const fs::path cut = dir_ / "cut.nc";
    fs::copy_file(path, cut, fs::copy_options::overwrite_existing);
    fs::resize_file(cut, static_cast<std::uintmax_t>(static_cast<double>(size) * share));
    try {
      (void)bandstack::io::read_band_set(cut);
      ADD_FAILURE() << "a file cut to " << share << " of its size was accepted";
    } catch (const bandstack::Error& e) {
      EXPECT_EQ(e.exit_code(), bandstack::ExitCode::bad_input) << e.what();
      EXPECT_NE(std::string(e.what()).find(cut.string()), std::string::npos) << e.what();
    }
  }
}

TEST_F(BandSetFile, OtherNetcdfFileIsNotABandSet) {
  const fs::path path = dir_ / "other.nc";
  {
    netCDF::NcFile file(path.string(), netCDF::NcFile::replace, netCDF::NcFile::nc4);
    file.addDim("x", 3);
  }
  try {
    (void)bandstack::io::read_band_set(path);
    FAIL();
  } catch (const InputError& e) {
    EXPECT_EQ(e.place().item, "band_set_format");
  }
}

TEST_F(BandSetFile, MissingVariableOrDimension) {
  expect_rejected([](netCDF::NcFile& f) { f.getVar("planck_fraction").rename("planck_share"); }, "planck_fraction",
                  "missing");
  expect_rejected([](netCDF::NcFile& f) { f.getVar("gpoint_weight").rename("weight"); }, "gpoint_weight", "missing");
  expect_rejected([](netCDF::NcFile& f) { f.getDim("band").rename("bands"); }, "band_lower_wavenumber",
                  "expected (band)");
  expect_rejected([](netCDF::NcFile& f) { f.putAtt("band_set_format", netCDF::ncInt, 99); }, "band_set_format", "99");
  expect_rejected([](netCDF::NcFile& f) { nc_del_att(f.getId(), NC_GLOBAL, "recipe_text"); }, "recipe_text", "missing");
}

TEST_F(BandSetFile, WrongUnits) {
  expect_rejected([](netCDF::NcFile& f) { f.getVar("ref_pressure").putAtt("units", "hPa"); }, "ref_pressure", "\"Pa\"");
  expect_rejected([](netCDF::NcFile& f) { f.getVar("band_upper_wavenumber").putAtt("units", "um"); },
                  "band_upper_wavenumber", "cm-1");
  expect_rejected([](netCDF::NcFile& f) { nc_del_att(f.getId(), f.getVar("ref_temperature").getId(), "units"); },
                  "ref_temperature", "missing");
  expect_rejected(
      [](netCDF::NcFile& f) {
        const std::size_t length = f.getDim("absorber_text_length").getSize();
        std::vector<char> units(length, '\0');
        std::strcpy(units.data(), "cm2");
        f.getVar("absorber_units").putVar({1, 0}, {1, length}, units.data());
      },
      "absorber_units", "index 1 (o3)");
}

TEST_F(BandSetFile, BadValuesNamedWithIndex) {
  // absorption_coefficient(absorber, gpoint, ref_temperature, ref_pressure); file absorber 1 is o3.
  expect_rejected(
      [](netCDF::NcFile& f) {
        f.getVar("absorption_coefficient").putVar({1, 3, 1, 2}, std::numeric_limits<double>::quiet_NaN());
      },
      "absorption_coefficient", "o3 at g-point 3, ref_temperature 1, ref_pressure 2");
  expect_rejected(
      [](netCDF::NcFile& f) {
        f.getVar("absorption_coefficient").putVar({2, 0, 0, 1}, -2.0);
      },
      "absorption_coefficient",
      "h2o_self_continuum at g-point 0, ref_temperature 0, ref_pressure 1: value -2 is negative");
  expect_rejected([](netCDF::NcFile& f) { f.getVar("ref_temperature").putVar({1}, 140.0); }, "ref_temperature",
                  "strictly increasing");
  expect_rejected(
      [](netCDF::NcFile& f) { f.getVar("ref_pressure").putVar({1}, std::numeric_limits<double>::quiet_NaN()); },
      "ref_pressure", "index 1");
  expect_rejected(
      [](netCDF::NcFile& f) {
        f.getVar("planck_fraction").putVar({1, 2}, 0.26);
      },
      "planck_fraction", "band 0, planck_temperature 2");
  expect_rejected([](netCDF::NcFile& f) { f.getVar("gpoint_weight").putVar({4}, 0.6); }, "gpoint_weight", "band 1");
  expect_rejected([](netCDF::NcFile& f) { f.getVar("gpoint_band").putVar({4}, -1); }, "gpoint_band", "index 4");
  expect_rejected([](netCDF::NcFile& f) { f.getVar("band_lower_wavenumber").putVar({1}, 400.0); },
                  "band_lower_wavenumber", "contiguous");
}

TEST_F(BandSetFile, UnknownOrRepeatedAbsorber) {
  const auto set_name = [](netCDF::NcFile& f, std::size_t i, const char* name) {
    const std::size_t length = f.getDim("absorber_text_length").getSize();
    std::vector<char> text(length, '\0');
    std::strncpy(text.data(), name, length);
    f.getVar("absorber_name").putVar({i, 0}, {1, length}, text.data());
  };
  expect_rejected([&](netCDF::NcFile& f) { set_name(f, 1, "ozone"); }, "absorber_name", "unknown absorber \"ozone\"");
  expect_rejected([&](netCDF::NcFile& f) { set_name(f, 1, "h2o"); }, "absorber_name", "twice");
}
