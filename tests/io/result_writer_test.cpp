#include "bandstack/io/result_writer.hpp"

#include <span>

#include <netcdf>

#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io {
namespace {

namespace fs = std::filesystem;

batch::ColumnResult make_result(const std::string& name, std::size_t layers, double offset) {
  batch::ColumnResult r;
  atmosphere::Column& c = r.column;
  c.name = name;
  for (std::size_t k = 0; k <= layers; ++k) {
    c.pressure_level_pa.push_back(100.0 + 1000.0 * static_cast<double>(k));
    c.temperature_level_k.push_back(200.0 + static_cast<double>(k) + offset);
    r.longwave.flux_up.push_back(240.0 + static_cast<double>(k) + offset);
    r.longwave.flux_down.push_back(static_cast<double>(k));
  }
  for (std::size_t i = 0; i < layers; ++i) {
    c.pressure_layer_pa.push_back(600.0 + 1000.0 * static_cast<double>(i));
    c.temperature_layer_k.push_back(200.5 + static_cast<double>(i));
    for (auto& x : c.mole_fraction) x.push_back(1e-6);
    r.longwave.heating_rate_k_day.push_back(-1.0 - static_cast<double>(i));
  }
  c.surface_temperature_k = 290.0 + offset;
  return r;
}

TEST(ResultWriter, WritesNamesUnitsAndValues) {
  const fs::path path = fs::temp_directory_path() / "bandstack_writer_test.nc";
  std::vector<batch::ColumnResult> results{make_result("first", 4, 0.0), make_result("second_longer_name", 4, 10.0)};
  RunInfo info;
  info.title = "writer test";
  info.study_text = "title = \"writer test\"";
  write_result_file(path, results, info);

  netCDF::NcFile file(path.string(), netCDF::NcFile::read);
  EXPECT_EQ(file.getDim("column").getSize(), 2u);
  EXPECT_EQ(file.getDim("level").getSize(), 5u);
  EXPECT_EQ(file.getDim("layer").getSize(), 4u);
  std::string value;
  file.getAtt("Conventions").getValues(value);
  EXPECT_EQ(value, "CF-1.8");
  netCDF::NcVar olr = file.getVar("olr");
  olr.getAtt("standard_name").getValues(value);
  EXPECT_EQ(value, "toa_outgoing_longwave_flux"); // CF standard name table
  olr.getAtt("units").getValues(value);
  EXPECT_EQ(value, "W m-2");
  double olr_values[2];
  olr.getVar(olr_values);
  EXPECT_DOUBLE_EQ(olr_values[0], 240.0);
  EXPECT_DOUBLE_EQ(olr_values[1], 250.0);
  double up[10];
  file.getVar("lw_flux_up").getVar(up);
  EXPECT_DOUBLE_EQ(up[5 + 4], 254.0);
  netCDF::NcVar heating = file.getVar("lw_heating_rate");
  heating.getAtt("units").getValues(value);
  EXPECT_EQ(value, "K day-1");
  char names[2 * 18];
  file.getVar("column_name").getVar(names);
  EXPECT_EQ(std::string(names + 18, 18), "second_longer_name");
  file.close();
  fs::remove(path);
}

TEST(ResultWriter, MismatchedLevelsAreRejectedAndNothingIsWritten) {
  const fs::path path = fs::temp_directory_path() / "bandstack_writer_mismatch.nc";
  fs::remove(path);
  std::vector<batch::ColumnResult> results{make_result("a", 4, 0.0), make_result("b", 5, 0.0)};
  EXPECT_THROW(write_result_file(path, results, RunInfo{}), InputError);
  EXPECT_FALSE(fs::exists(path));
}

TEST(ResultWriter, BlocksOverTwoAxesFillTheFileInRowMajorOrder) {
  const fs::path path = fs::temp_directory_path() / "bandstack_writer_blocks.nc";
  std::vector<batch::ColumnResult> results;
  for (int i = 0; i < 6; ++i) results.push_back(make_result(std::string("c").append(std::to_string(i)), 3, 10.0 * i)); // append: GCC 12 -Wrestrict false positive
  std::vector<OutputAxis> axes(2);
  axes[0].name = "column";
  axes[0].size = 2;
  axes[0].labels = {"north", "south"};
  axes[1].name = "co2_ppmv";
  axes[1].size = 3;
  axes[1].values = {280, 560, 1120};
  {
    ResultFileWriter writer(path, results.front(), RunInfo{}, axes, StorageSettings{1, 2});
    // Blocks of 4 and 2 columns: the first crosses from column 0 into column 1.
    writer.write_block(0, std::span(results).subspan(0, 4));
    writer.write_block(4, std::span(results).subspan(4, 2));
    writer.close();
  }
  netCDF::NcFile file(path.string(), netCDF::NcFile::read);
  double olr[6];
  file.getVar("olr").getVar(olr);
  for (int i = 0; i < 6; ++i) EXPECT_DOUBLE_EQ(olr[i], 240.0 + 10.0 * i) << i; // flux_up[0] of make_result
  double up[6 * 4];
  file.getVar("lw_flux_up").getVar(up);
  EXPECT_DOUBLE_EQ(up[5 * 4 + 3], 243.0 + 50.0);
  bool shuffle = false, deflate = false;
  int level = 0;
  file.getVar("olr").getCompressionParameters(shuffle, deflate, level);
  EXPECT_TRUE(deflate);
  EXPECT_EQ(level, 1);
  file.close();
  fs::remove(path);
}

} // namespace
} // namespace bandstack::io
