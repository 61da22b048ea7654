// Packed blocks (io/result_packing.hpp): a file written from packed blocks, passed through bytes as
// between processes, equals the file written from the results, failed columns included.
#include "bandstack/io/result_packing.hpp"

#include <cmath>
#include <map>
#include <span>

#include <netcdf>

#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io {
namespace {

namespace fs = std::filesystem;

batch::ColumnResult make_result(std::size_t layers, double offset) {
  batch::ColumnResult r;
  atmosphere::Column& c = r.column;
  for (std::size_t k = 0; k <= layers; ++k) {
    c.pressure_level_pa.push_back(100.0 + 1000.0 * static_cast<double>(k));
    c.temperature_level_k.push_back(200.0 + static_cast<double>(k) + offset);
    r.longwave.flux_up.push_back(240.0 + static_cast<double>(k) + offset);
    r.longwave.flux_down.push_back(static_cast<double>(k) * 0.5 + offset);
  }
  for (std::size_t i = 0; i < layers; ++i) {
    c.pressure_layer_pa.push_back(600.0 + 1000.0 * static_cast<double>(i));
    c.temperature_layer_k.push_back(200.5 + static_cast<double>(i) + offset);
    for (auto& x : c.mole_fraction) x.push_back(1e-6 * (1.0 + offset));
    r.longwave.heating_rate_k_day.push_back(-1.0 - static_cast<double>(i) - offset);
  }
  c.surface_temperature_k = 290.0 + offset;
  return r;
}

batch::ColumnResult failed(const std::string& why) {
  batch::ColumnResult r;
  r.status = batch::ColumnStatus::not_converged;
  r.error = why;
  return r;
}

// Every variable of two files, as doubles (text as its bytes).
std::map<std::string, std::vector<double>> contents(const fs::path& path) {
  netCDF::NcFile file(path.string(), netCDF::NcFile::read);
  std::map<std::string, std::vector<double>> out;
  for (const auto& [name, var] : file.getVars()) {
    std::size_t n = 1;
    for (const netCDF::NcDim& d : var.getDims()) n *= d.getSize();
    if (var.getType() == netCDF::ncChar) {
      std::vector<char> text(n);
      var.getVar(text.data());
      out[name].assign(text.begin(), text.end());
    } else {
      out[name].resize(n);
      var.getVar(out[name].data());
    }
  }
  return out;
}

TEST(ResultPacking, PackedBlocksWriteTheSameFileAsResults) {
  const fs::path direct = fs::temp_directory_path() / "bandstack_packing_direct.nc";
  const fs::path packed = fs::temp_directory_path() / "bandstack_packing_packed.nc";
  std::vector<batch::ColumnResult> results;
  for (int i = 0; i < 5; ++i) results.push_back(make_result(4, 3.0 * i));
  results[2] = failed("column 2: equilibrium not reached");
  std::vector<OutputAxis> axes(1);
  axes[0].name = "co2_ppmv";
  axes[0].size = 5;
  axes[0].values = {100, 200, 400, 800, 1600};
  RunInfo info;
  info.title = "packing test (invented)";
  {
    ResultFileWriter writer(direct, results.front(), info, axes);
    writer.write_block(0, std::span(results).subspan(0, 3));
    writer.write_block(3, std::span(results).subspan(3, 2));
    writer.close();
  }
  {
    const ResultShape shape = ResultShape::decode(ResultShape::of(results.front()).encode());
    const ResultPacker packer(shape, info, axes);
    ResultFileWriter writer(packed, shape.sample(), info, axes);
    // Out of order, as blocks from several processes arrive.
    writer.write_packed(PackedBlock::from_bytes(packer.pack(3, std::span(results).subspan(3, 2)).to_bytes()));
    writer.write_packed(PackedBlock::from_bytes(packer.pack(0, std::span(results).subspan(0, 3)).to_bytes()));
    writer.close();
  }
  const auto a = contents(direct), b = contents(packed);
  ASSERT_EQ(a.size(), b.size());
  for (const auto& [name, values] : a) {
    ASSERT_TRUE(b.count(name)) << name;
    ASSERT_EQ(values.size(), b.at(name).size()) << name;
    for (std::size_t k = 0; k < values.size(); ++k) {
      if (!(std::isnan(values[k]) && std::isnan(b.at(name)[k]))) {
        EXPECT_EQ(values[k], b.at(name)[k]) << name << " " << k;
      }
    }
  }
  EXPECT_TRUE(std::isnan(a.at("olr")[2])); // the failed column is missing
  EXPECT_EQ(a.at("olr")[4], 240.0 + 12.0);  // flux_up[0] of make_result
  fs::remove(direct);
  fs::remove(packed);
}

TEST(ResultPacking, MalformedBytesAndShapesAreRejected) {
  const ResultShape shape = ResultShape::of(make_result(3, 0.0));
  std::vector<double> numbers = shape.encode();
  numbers.pop_back();
  EXPECT_THROW((void)ResultShape::decode(numbers), InputError);
  numbers = shape.encode();
  numbers[0] = -1.0;
  EXPECT_THROW((void)ResultShape::decode(numbers), InputError);
  const ResultPacker packer(shape, RunInfo{}, std::vector<OutputAxis>{OutputAxis{"column", 1, {}, {"a"}, {}}});
  const std::vector<batch::ColumnResult> one{make_result(3, 0.0)};
  std::vector<char> bytes = packer.pack(0, one).to_bytes();
  bytes.resize(bytes.size() - 3);
  EXPECT_THROW((void)PackedBlock::from_bytes(bytes), InputError);
  const std::vector<batch::ColumnResult> other{make_result(5, 0.0)};
  EXPECT_THROW((void)packer.pack(0, other), InputError);
}

} // namespace
} // namespace bandstack::io
