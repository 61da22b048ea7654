// The whole report from synthetic result files written here: well-formed, the right sections,
// bounded sampling, errors for files that are not results, and the size for 100,000 columns.
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include <gtest/gtest.h>
#include <netcdf>

#include "bandstack/core/error.hpp"
#include "bandstack/report/report.hpp"
#include "bandstack/report/result_data.hpp"
#include "report/xml_check.hpp"

namespace br = bandstack::report;
namespace fs = std::filesystem;

namespace {

struct Shape {
  std::size_t columns = 2;
  std::vector<std::pair<std::string, std::vector<double>>> sweeps; // name, values
  std::size_t layers = 10;
  bool with_bands = true;
  bool with_temperature_layer = true;
};

fs::path scratch(const std::string& name) {
  const fs::path dir = fs::temp_directory_path() / ("bandstack_report_test_" + std::to_string(::getpid()));
  fs::create_directories(dir);
  return dir / name;
}

// A file shaped like a result (docs/output-file.md) with made-up but physically shaped numbers:
// an isothermal-over-lapse-rate profile; olr = 200 + flat index (so a sample can be traced back).
void write_result(const fs::path& path, const Shape& shape) {
  using namespace netCDF;
  NcFile f(path.string(), NcFile::replace, NcFile::nc4);
  f.putAtt("title", "synthetic result");
  f.putAtt("source", "bandstack test");
  f.putAtt("comment", "caution");
  std::vector<NcDim> lead = {f.addDim("column", shape.columns)};
  std::size_t n = shape.columns;
  for (const auto& [name, values] : shape.sweeps) {
    NcDim d = f.addDim(name, values.size());
    NcVar v = f.addVar(name, ncDouble, d);
    v.putAtt("units", "1");
    v.putVar(values.data());
    lead.push_back(d);
    n *= values.size();
  }
  const NcDim level = f.addDim("level", shape.layers + 1);
  const NcDim layer = f.addDim("layer", shape.layers);
  const auto dims = [&](std::vector<NcDim> extra) {
    std::vector<NcDim> all = lead;
    all.insert(all.end(), extra.begin(), extra.end());
    return all;
  };
  std::vector<double> p_level, t_level, p_layer, t_layer;
  for (std::size_t i = 0; i <= shape.layers; ++i) {
    const double p = 100.0 * std::pow(1000.0, static_cast<double>(i) / static_cast<double>(shape.layers)) * 100.0; // 1..1000 hPa in Pa
    p_level.push_back(p);
    t_level.push_back(std::max(210.0, 288.0 * std::pow(p / 1.0e5, 0.19)));
  }
  for (std::size_t i = 0; i < shape.layers; ++i) {
    p_layer.push_back(0.5 * (p_level[i] + p_level[i + 1]));
    t_layer.push_back(0.5 * (t_level[i] + t_level[i + 1]));
  }
  const auto repeat = [&](const std::vector<double>& one) {
    std::vector<double> all;
    all.reserve(one.size() * n);
    for (std::size_t c = 0; c < n; ++c) all.insert(all.end(), one.begin(), one.end());
    return all;
  };
  const auto put = [&](const char* name, std::vector<NcDim> d, const std::vector<double>& values, const char* units) {
    NcVar v = f.addVar(name, ncDouble, d);
    v.putAtt("units", units);
    v.putVar(values.data());
  };
  put("pressure_level", dims({level}), repeat(p_level), "Pa");
  put("temperature_level", dims({level}), repeat(t_level), "K");
  put("pressure_layer", dims({layer}), repeat(p_layer), "Pa");
  if (shape.with_temperature_layer) put("temperature_layer", dims({layer}), repeat(t_layer), "K");
  std::vector<double> olr(n), ts(n, 288.0);
  for (std::size_t c = 0; c < n; ++c) olr[c] = 200.0 + static_cast<double>(c);
  put("olr", lead, olr, "W m-2");
  put("surface_temperature", lead, ts, "K");
  put("lw_heating_rate", dims({layer}), repeat(std::vector<double>(shape.layers, -1.5)), "K day-1");
  if (shape.with_bands) {
    const NcDim band = f.addDim("band_lw", 2);
    const NcDim bounds = f.addDim("bounds", 2);
    const std::vector<double> edges = {10, 600, 600, 2000};
    put("band_lw_bounds", {band, bounds}, edges, "cm-1");
    std::vector<double> up_one;
    for (std::size_t b = 0; b < 2; ++b)
      for (std::size_t i = 0; i <= shape.layers; ++i) up_one.push_back(b == 0 ? 120.0 : 110.0);
    put("lw_flux_up_by_band", dims({band, level}), repeat(up_one), "W m-2");
  }
}

std::string read_file(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

} // namespace

TEST(Report, SweepFileGivesWellFormedPageWithHeatMaps) {
  Shape shape;
  shape.sweeps = {{"co2_ppmv", {140, 280, 560, 1120}}, {"surface_albedo", {0.1, 0.2, 0.3}}};
  const fs::path nc = scratch("sweep.nc");
  write_result(nc, shape);
  const std::string html = br::render_report(nc);
  const xml_check::Result r = xml_check::check(html);
  ASSERT_EQ(r.error, "");
  EXPECT_EQ(r.element_count.count("script"), 0u);
  EXPECT_NE(html.find("data-plot=\"sweep-map-olr\""), std::string::npos);
  EXPECT_NE(html.find("data-plot=\"temperature\""), std::string::npos);
  EXPECT_NE(html.find("data-plot=\"spectrum-0\""), std::string::npos);
  EXPECT_NE(html.find("data-plot=\"distribution-olr\""), std::string::npos); // 24 columns: distributions
  EXPECT_NE(html.find("research tool"), std::string::npos);                  // the caution line
  // Self-contained: nothing is loaded from elsewhere (the SVG namespace name is not a fetch).
  for (const char* outside : {"src=", "href=\"http", "url(http", "@import", "<link", "<script"})
    EXPECT_EQ(html.find(outside), std::string::npos) << outside;
  fs::remove(nc);
}

TEST(Report, SampleTracesBackToColumnsAndStaysBounded) {
  Shape shape;
  shape.columns = 3;
  shape.sweeps = {{"co2_ppmv", {1, 2, 3, 4, 5, 6, 7}}, {"surface_albedo", {0.1, 0.2, 0.3, 0.4, 0.5}}};
  shape.layers = 4;
  const fs::path nc = scratch("sample.nc");
  write_result(nc, shape);
  br::ReportOptions options;
  options.max_sampled_columns = 20;
  options.max_profiles = 2;
  const br::ResultData data = br::read_result_data(nc, options);
  EXPECT_EQ(data.column_count, 105u);
  EXPECT_LE(data.sampled_count, 20u);
  EXPECT_LE(data.profiles.size(), 2u);
  const br::ScalarField* olr = data.scalar("olr");
  ASSERT_NE(olr, nullptr);
  ASSERT_EQ(olr->values.size(), data.sampled_count);
  for (std::size_t s = 0; s < data.sampled_count; ++s)
    EXPECT_DOUBLE_EQ(olr->values[s], 200.0 + static_cast<double>(data.flat_index_of_sample(s))); // olr = 200 + flat index
  // The lowest-OLR column is drawn and is column 0 (olr 200).
  EXPECT_EQ(data.profiles.front().flat_index, 0u);
  EXPECT_DOUBLE_EQ(data.profiles.front().olr_w_m2, 200.0);
  fs::remove(nc);
}

TEST(Report, WritesNextToResultAtomically) {
  const fs::path nc = scratch("small.nc");
  write_result(nc, Shape{});
  EXPECT_EQ(br::default_report_path(nc), scratch("small.html"));
  br::ReportOptions options;
  options.run_seconds = 2.5;
  br::write_report(nc, br::default_report_path(nc), options);
  const std::string html = read_file(scratch("small.html"));
  EXPECT_EQ(xml_check::check(html).error, "");
  EXPECT_NE(html.find("2.5 s"), std::string::npos); // time taken in the metadata
  for (const auto& entry : fs::directory_iterator(nc.parent_path()))
    EXPECT_EQ(entry.path().filename().string().find(".part"), std::string::npos) << entry.path();
  fs::remove(nc);
  fs::remove(scratch("small.html"));
}

TEST(Report, NotAResultFileIsAnInputErrorNamingTheVariable) {
  Shape shape;
  shape.with_temperature_layer = false;
  const fs::path nc = scratch("incomplete.nc");
  write_result(nc, shape);
  try {
    (void)br::render_report(nc);
    FAIL() << "expected InputError";
  } catch (const bandstack::InputError& e) {
    EXPECT_NE(std::string(e.what()).find("incomplete.nc"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("temperature_layer"), std::string::npos) << e.what();
    EXPECT_EQ(e.exit_code(), bandstack::ExitCode::bad_input);
  }
  const fs::path text = scratch("not_netcdf.nc");
  std::ofstream(text) << "hello";
  EXPECT_THROW((void)br::render_report(text), bandstack::FileError);
  fs::remove(nc);
  fs::remove(text);
}

TEST(Report, HundredThousandColumnsStaySmall) {
  // 1 column x 400 CO2 values x 250 albedos = 100,000 columns with 4 layers.
  Shape shape;
  shape.columns = 1;
  shape.layers = 4;
  std::vector<double> co2(400), albedo(250);
  for (std::size_t i = 0; i < co2.size(); ++i) co2[i] = 100.0 + static_cast<double>(i);
  for (std::size_t i = 0; i < albedo.size(); ++i) albedo[i] = 0.001 * static_cast<double>(i);
  shape.sweeps = {{"co2_ppmv", co2}, {"surface_albedo", albedo}};
  const fs::path nc = scratch("large.nc");
  write_result(nc, shape);
  br::write_report(nc, scratch("large.html"));
  const auto size = fs::file_size(scratch("large.html"));
  std::printf("report of 100000 columns: %ju bytes\n", static_cast<std::uintmax_t>(size));
  EXPECT_LT(size, 1'000'000u); // summaries and distributions, not every column
  const std::string html = read_file(scratch("large.html"));
  EXPECT_EQ(xml_check::check(html).error, "");
  EXPECT_NE(html.find("data-plot=\"sweep-map-olr\""), std::string::npos);
  EXPECT_NE(html.find(" of the 100000 columns"), std::string::npos); // an even sample (ReportOptions)
  fs::remove(nc);
  fs::remove(scratch("large.html"));
}

TEST(Report, HundredThousandValuesOfOneSweepStaySmall) {
  // 1 column x 100,000 CO2 values with 4 layers: one line per scalar, drawn at spread values.
  Shape shape;
  shape.columns = 1;
  shape.layers = 4;
  std::vector<double> co2(100000);
  for (std::size_t i = 0; i < co2.size(); ++i) co2[i] = 100.0 + 0.01 * static_cast<double>(i);
  shape.sweeps = {{"co2_ppmv", co2}};
  const fs::path nc = scratch("long.nc");
  write_result(nc, shape);
  br::write_report(nc, scratch("long.html"));
  const auto size = fs::file_size(scratch("long.html"));
  std::printf("report of 100000 values of one sweep: %ju bytes\n", static_cast<std::uintmax_t>(size));
  EXPECT_LT(size, 1'000'000u); // a line of every value would be tens of megabytes
  const std::string html = read_file(scratch("long.html"));
  EXPECT_EQ(xml_check::check(html).error, "");
  EXPECT_NE(html.find("data-plot=\"sweep-olr\""), std::string::npos);
  fs::remove(nc);
  fs::remove(scratch("long.html"));
}
