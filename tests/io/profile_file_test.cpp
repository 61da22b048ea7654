// The profile file (docs/profile-file.md): dimension orders, pressure order, units, humidity and
// mass-fraction conversions, variable mapping, levels, leading axes and every kind of bad file.
#include "bandstack/core/error.hpp"
#include "bandstack/io/profile_file.hpp"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <gtest/gtest.h>
#include <limits>
#include <map>
#include <netcdf>
#include <optional>
#include <string>
#include <unistd.h>
#include <utility>
#include <vector>

namespace fs = std::filesystem;
using bandstack::FileError;
using bandstack::Gas;
using bandstack::InputError;
using bandstack::atmosphere::Column;
using bandstack::io::ProfileDefaults;
using bandstack::io::ProfileFile;
using bandstack::io::ProfileVariables;
using bandstack::io::read_profile_file;

namespace {

// Reference constants typed in from their sources (not taken from the library).
constexpr double pa_per_hpa = 100.0;      // 1 hPa = 100 Pa (SI prefix hecto = 1e2, SI Brochure 9th ed. Table 7)
constexpr double zero_celsius_k = 273.15; // t/°C = T/K − 273.15 (SI Brochure 9th ed. §2.3.1)
constexpr double m_h2o = 18.01528e-3;     // kg/mol, IUPAC atomic weights H 1.00794, O 15.9994 (common practice)
constexpr double m_dry = 28.9644e-3;      // kg/mol, U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF 1976), M0
constexpr double m_co2 = 44.0095e-3;      // kg/mol, IUPAC atomic weights C 12.0107, O 15.9994 (common practice)

using Idx = std::map<std::string, std::size_t>;

struct Var {
  std::string name;
  std::vector<std::string> dims;
  std::vector<std::pair<std::string, std::string>> text; // text attributes
  std::vector<double> values;
  std::optional<double> fill; // _FillValue
};

struct File {
  std::vector<std::pair<std::string, std::size_t>> dims;
  std::vector<Var> vars;

  std::size_t size(const std::string& dim) const {
    for (const auto& [name, n] : dims)
      if (name == dim) return n;
    return 0;
  }
  Var& var(const std::string& name) {
    for (Var& v : vars)
      if (v.name == name) return v;
    throw std::logic_error("test bug: no variable " + name);
  }
  void erase(const std::string& name) {
    std::erase_if(vars, [&](const Var& v) { return v.name == name; });
  }
  void set_attribute(const std::string& var_name, const std::string& key, const std::string& value) {
    for (auto& [k, v] : var(var_name).text)
      if (k == key) {
        v = value;
        return;
      }
    var(var_name).text.emplace_back(key, value);
  }
  // Row-major values of a variable on `dims` from f(indices by dimension name).
  Var make(std::string name, std::vector<std::string> var_dims, std::vector<std::pair<std::string, std::string>> text,
           const std::function<double(const Idx&)>& f) const {
    Var v{std::move(name), std::move(var_dims), std::move(text), {}, {}};
    Idx idx;
    std::size_t count = 1;
    for (const auto& d : v.dims)
      count *= size(d);
    for (std::size_t flat = 0; flat < count; ++flat) {
      std::size_t rest = flat;
      for (std::size_t j = v.dims.size(); j-- > 0;) {
        idx[v.dims[j]] = rest % size(v.dims[j]);
        rest /= size(v.dims[j]);
      }
      v.values.push_back(f(idx));
    }
    return v;
  }
};

class ProfileFileTest : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / ("bandstack_profile_file_" + std::to_string(::getpid()) + "_" +
                                        ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
  }
  void TearDown() override { fs::remove_all(dir_); }

  fs::path write(const File& f, const std::string& name = "profiles.nc") const {
    const fs::path path = dir_ / name;
    netCDF::NcFile nc(path.string(), netCDF::NcFile::replace, netCDF::NcFile::nc4);
    std::map<std::string, netCDF::NcDim> dims;
    for (const auto& [dim, n] : f.dims)
      dims[dim] = nc.addDim(dim, n);
    for (const Var& v : f.vars) {
      std::vector<netCDF::NcDim> var_dims;
      for (const auto& d : v.dims)
        var_dims.push_back(dims.at(d));
      netCDF::NcVar var = nc.addVar(v.name, netCDF::ncDouble, var_dims);
      if (v.fill) var.setFill(true, *v.fill);
      for (const auto& [key, value] : v.text)
        var.putAtt(key, value);
      var.putVar(v.values.data());
    }
    return path;
  }

  // Expects read_profile_file to throw an InputError naming the file and `item`, with every piece of
  // `texts` in the message.
  void expect_rejected(const File& f, const std::string& item, const std::vector<std::string>& texts,
                       const ProfileVariables& variables = {}) const {
    const fs::path path = write(f, "bad.nc");
    try {
      (void)read_profile_file(path, variables, {});
      FAIL() << "accepted a file with a bad " << item;
    } catch (const InputError& e) {
      EXPECT_EQ(e.place().file, path.string()) << e.what();
      EXPECT_EQ(e.place().item, item) << e.what();
      const std::string what = e.what();
      EXPECT_NE(what.find(path.string()), std::string::npos) << what;
      EXPECT_NE(what.find("'" + item + "'"), std::string::npos) << what;
      for (const auto& text : texts)
        EXPECT_NE(what.find(text), std::string::npos) << "missing \"" << text << "\" in: " << what;
    }
  }

  fs::path dir_;
};

// Invented test profiles as functions of the column index c and the top-first layer index i.
const std::vector<double> pressure_hpa{10.0, 100.0, 300.0, 700.0, 925.0};
double temperature_k(std::size_t c, std::size_t i) {
  return 220.0 + 15.0 * static_cast<double>(i) + 0.5 * static_cast<double>(c);
}
double specific_humidity(std::size_t c, std::size_t i) {
  return 1e-6 * (1.0 + 1000.0 * static_cast<double>(i * i)) * (1.0 + 0.01 * static_cast<double>(c));
}
double surface_pressure_hpa(std::size_t c) { return 950.0 + 5.0 * static_cast<double>(c); }
double skin_temperature_k(std::size_t c) { return 290.0 + 0.25 * static_cast<double>(c); }

std::size_t at(const Idx& idx, const std::string& dim) { return idx.count(dim) ? idx.at(dim) : 0; }

// A reanalysis-like file: ta(time, lat, lon, level) on a 1-D pressure coordinate plev (hPa), specific
// humidity, surface pressure and skin temperature on (time, lat, lon). With `decreasing` the file
// stores the levels bottom first.
File four_dimensional(bool decreasing = false) {
  File f;
  f.dims = {{"time", 2}, {"lat", 3}, {"lon", 2}, {"level", 5}};
  const auto column = [&](const Idx& idx) { return (at(idx, "time") * 3 + at(idx, "lat")) * 2 + at(idx, "lon"); };
  const auto layer = [&](const Idx& idx) { return decreasing ? 4 - idx.at("level") : idx.at("level"); };
  f.vars.push_back(f.make("time", {"time"},
                          {{"units", "hours since 2001-01-01 00:00:00"}, {"calendar", "gregorian"}, {"axis", "T"}},
                          [](const Idx& idx) { return 6.0 * static_cast<double>(idx.at("time")); }));
  f.vars.push_back(f.make("lat", {"lat"}, {{"units", "degrees_north"}, {"standard_name", "latitude"}},
                          [](const Idx& idx) { return -30.0 + 30.0 * static_cast<double>(idx.at("lat")); }));
  f.vars.push_back(f.make("lon", {"lon"}, {{"units", "degrees_east"}},
                          [](const Idx& idx) { return 10.0 * static_cast<double>(idx.at("lon")); }));
  f.vars.push_back(f.make("plev", {"level"},
                          {{"units", "hPa"}, {"standard_name", "air_pressure"}, {"positive", "down"}},
                          [&](const Idx& idx) { return pressure_hpa[layer(idx)]; }));
  f.vars.push_back(f.make("ta", {"time", "lat", "lon", "level"}, {{"units", "K"}, {"standard_name", "air_temperature"}},
                          [&](const Idx& idx) { return temperature_k(column(idx), layer(idx)); }));
  f.vars.push_back(f.make("q", {"time", "lat", "lon", "level"},
                          {{"units", "kg kg-1"}, {"standard_name", "specific_humidity"}},
                          [&](const Idx& idx) { return specific_humidity(column(idx), layer(idx)); }));
  f.vars.push_back(f.make("ps", {"time", "lat", "lon"}, {{"units", "hPa"}, {"standard_name", "surface_air_pressure"}},
                          [&](const Idx& idx) { return surface_pressure_hpa(column(idx)); }));
  f.vars.push_back(f.make("ts", {"time", "lat", "lon"}, {{"units", "K"}, {"standard_name", "surface_temperature"}},
                          [&](const Idx& idx) { return skin_temperature_k(column(idx)); }));
  return f;
}

// Temperature on (time, level, lat) with a full pressure field in Pa; the vertical coordinate
// `level` is marked axis = "Z". No humidity, no surface values.
File time_level_lat(bool decreasing = false) {
  File f;
  f.dims = {{"time", 2}, {"level", 5}, {"lat", 3}};
  const auto column = [&](const Idx& idx) { return at(idx, "time") * 3 + at(idx, "lat"); };
  const auto layer = [&](const Idx& idx) { return decreasing ? 4 - idx.at("level") : idx.at("level"); };
  f.vars.push_back(
      f.make("level", {"level"}, {{"axis", "Z"}}, [&](const Idx& idx) { return static_cast<double>(layer(idx)); }));
  f.vars.push_back(f.make("air_pressure", {"time", "level", "lat"},
                          {{"units", "Pa"}, {"standard_name", "air_pressure"}}, [&](const Idx& idx) {
                            return pa_per_hpa * pressure_hpa[layer(idx)] *
                                   (1.0 + 0.001 * static_cast<double>(column(idx)));
                          }));
  f.vars.push_back(f.make("temperature", {"time", "level", "lat"},
                          {{"units", "K"}, {"standard_name", "air_temperature"}},
                          [&](const Idx& idx) { return temperature_k(column(idx), layer(idx)); }));
  return f;
}

void expect_same_columns(const ProfileFile& a, const ProfileFile& b, double tolerance) {
  ASSERT_EQ(a.columns.size(), b.columns.size());
  const auto near = [&](const std::vector<double>& x, const std::vector<double>& y, const char* what, std::size_t c) {
    ASSERT_EQ(x.size(), y.size()) << what;
    for (std::size_t k = 0; k < x.size(); ++k) {
      if (tolerance == 0.0)
        EXPECT_EQ(x[k], y[k]) << what << " column " << c << " index " << k;
      else
        EXPECT_NEAR(x[k], y[k], tolerance * std::abs(y[k])) << what << " column " << c << " index " << k;
    }
  };
  for (std::size_t c = 0; c < a.columns.size(); ++c) {
    const Column& x = a.columns[c];
    const Column& y = b.columns[c];
    near(x.pressure_level_pa, y.pressure_level_pa, "pressure_level", c);
    near(x.temperature_level_k, y.temperature_level_k, "temperature_level", c);
    near(x.pressure_layer_pa, y.pressure_layer_pa, "pressure_layer", c);
    near(x.temperature_layer_k, y.temperature_layer_k, "temperature_layer", c);
    for (Gas g : bandstack::all_gases)
      near(x.gas(g), y.gas(g), "mole fraction", c);
    near({x.surface_temperature_k}, {y.surface_temperature_k}, "surface_temperature", c);
  }
}

// Variables with one name given (designated initializers would warn about the other members).
ProfileVariables named(std::string ProfileVariables::*member, std::string name) {
  ProfileVariables variables;
  variables.*member = std::move(name);
  return variables;
}

// Mole fraction in moist air from specific humidity q: moles of water over moles of moist air per kg.
double mole_fraction_from_q(double q) { return (q / m_h2o) / (q / m_h2o + (1.0 - q) / m_dry); }

} // namespace

TEST_F(ProfileFileTest, ReadsTimeLatLonLevelColumnsRowMajor) {
  const ProfileFile file = read_profile_file(write(four_dimensional()), {}, {});
  ASSERT_EQ(file.columns.size(), 12u);
  for (std::size_t c = 0; c < 12; ++c) {
    const Column& col = file.columns[c];
    EXPECT_EQ(col.name, "");
    ASSERT_EQ(col.layer_count(), 5u);
    for (std::size_t i = 0; i < 5; ++i) {
      EXPECT_DOUBLE_EQ(col.pressure_layer_pa[i], pa_per_hpa * pressure_hpa[i]);
      EXPECT_DOUBLE_EQ(col.temperature_layer_k[i], temperature_k(c, i));
      // Specific humidity to mole fraction, independent formula.
      EXPECT_NEAR(col.gas(Gas::h2o)[i], mole_fraction_from_q(specific_humidity(c, i)),
                  1e-12 * mole_fraction_from_q(specific_humidity(c, i)));
      EXPECT_EQ(col.gas(Gas::co2)[i], ProfileDefaults{}.co2_mole_fraction);
      EXPECT_EQ(col.gas(Gas::o3)[i], ProfileDefaults{}.o3_mole_fraction);
    }
    EXPECT_DOUBLE_EQ(col.pressure_level_pa[5], pa_per_hpa * surface_pressure_hpa(c));
    EXPECT_EQ(col.surface_temperature_k, skin_temperature_k(c));
    EXPECT_EQ(col.temperature_level_k[5], skin_temperature_k(c));
  }
}

TEST_F(ProfileFileTest, ReadsTimeLevelLatWithFullPressureField) {
  const ProfileFile file = read_profile_file(write(time_level_lat()), {}, {});
  ASSERT_EQ(file.columns.size(), 6u);
  ASSERT_EQ(file.axes.size(), 2u);
  EXPECT_EQ(file.axes[0].name, "time");
  EXPECT_EQ(file.axes[1].name, "lat");
  EXPECT_TRUE(file.axes[0].values.empty()); // no coordinate variables for time and lat in this file
  for (std::size_t c = 0; c < 6; ++c)
    for (std::size_t i = 0; i < 5; ++i) {
      EXPECT_DOUBLE_EQ(file.columns[c].pressure_layer_pa[i],
                       pa_per_hpa * pressure_hpa[i] * (1.0 + 0.001 * static_cast<double>(c)));
      EXPECT_DOUBLE_EQ(file.columns[c].temperature_layer_k[i], temperature_k(c, i));
      EXPECT_EQ(file.columns[c].gas(Gas::h2o)[i], 0.0); // ProfileDefaults::h2o_mole_fraction
    }
}

TEST_F(ProfileFileTest, PressureIncreasingOrDecreasingGivesTheSameColumns) {
  expect_same_columns(read_profile_file(write(four_dimensional(true), "down.nc"), {}, {}),
                      read_profile_file(write(four_dimensional(false), "up.nc"), {}, {}), 0.0);
  expect_same_columns(read_profile_file(write(time_level_lat(true), "down.nc"), {}, {}),
                      read_profile_file(write(time_level_lat(false), "up.nc"), {}, {}), 0.0);
}

TEST_F(ProfileFileTest, UnitsConvertToTheSameColumns) {
  File f = four_dimensional();
  const ProfileFile reference = read_profile_file(write(f, "reference.nc"), {}, {});
  for (double& p : f.var("plev").values)
    p *= pa_per_hpa;
  f.set_attribute("plev", "units", "Pa");
  for (double& p : f.var("ps").values)
    p *= 0.1; // kPa: 1 kPa = 10 hPa
  f.set_attribute("ps", "units", "kPa");
  for (double& t : f.var("ta").values)
    t -= zero_celsius_k;
  f.set_attribute("ta", "units", "degC");
  for (double& t : f.var("ts").values)
    t -= zero_celsius_k;
  f.set_attribute("ts", "units", "degree_Celsius");
  for (double& q : f.var("q").values)
    q *= 1000.0; // 1 kg = 1000 g
  f.set_attribute("q", "units", "g/kg");
  expect_same_columns(read_profile_file(write(f, "converted.nc"), {}, {}), reference, 1e-12);
}

TEST_F(ProfileFileTest, MixingRatioAndGasMassFractionsUseMolarMasses) {
  File f = four_dimensional();
  // Humidity mixing ratio r (per kg of dry air): x = (r/M_w) / (r/M_w + 1/M_d).
  f.set_attribute("q", "standard_name", "humidity_mixing_ratio");
  f.set_attribute("q", "units", "1");
  const double w_co2 = 6.1e-4; // kg per kg of moist air, a scalar for every layer of every column
  f.vars.push_back(
      Var{"co2", {}, {{"units", "kg kg-1"}, {"standard_name", "mass_fraction_of_carbon_dioxide_in_air"}}, {w_co2}, {}});
  f.vars.push_back(f.make("o3", {"level"}, {{"units", "ppmv"}},
                          [](const Idx& idx) { return 0.5 * static_cast<double>(idx.at("level") + 1); }));
  f.vars.push_back(f.make("ch4", {"time", "lat", "lon"},
                          {{"units", "ppb"}, {"standard_name", "mole_fraction_of_methane_in_air"}},
                          [](const Idx& idx) { return 1800.0 + static_cast<double>(idx.at("lon")); }));
  const ProfileFile file = read_profile_file(write(f), named(&ProfileVariables::o3, "o3"), {});
  for (std::size_t c = 0; c < file.columns.size(); ++c) {
    const Column& col = file.columns[c];
    for (std::size_t i = 0; i < 5; ++i) {
      const double r = specific_humidity(c, i);
      const double x_w = (r / m_h2o) / (r / m_h2o + 1.0 / m_dry);
      EXPECT_NEAR(col.gas(Gas::h2o)[i], x_w, 1e-12 * x_w);
      // Mass fraction w in moist air: x = (w/M_co2) / (moles of moist air per kg), where a kg of moist
      // air holds q = r/(1+r) kg of water and 1 - q of dry air.
      const double q = r / (1.0 + r);
      const double x_co2 = (w_co2 / m_co2) / (q / m_h2o + (1.0 - q) / m_dry);
      EXPECT_NEAR(col.gas(Gas::co2)[i], x_co2, 1e-12 * x_co2);
      EXPECT_NEAR(col.gas(Gas::o3)[i], 0.5e-6 * static_cast<double>(i + 1), 1e-18);           // 1 ppmv = 1e-6 mol/mol
      EXPECT_NEAR(col.gas(Gas::ch4)[i], (1800.0 + static_cast<double>(c % 2)) * 1e-9, 1e-21); // 1 ppb = 1e-9 mol/mol
    }
  }
  ASSERT_EQ(file.used_variables.size(), 8u);
  EXPECT_EQ(file.used_variables[0], "pressure <- plev (hPa)");
  EXPECT_EQ(file.used_variables[4], "h2o <- q (1, mass mixing ratio)");
  EXPECT_EQ(file.used_variables[5], "co2 <- co2 (kg kg-1, mass fraction)");
  EXPECT_EQ(file.used_variables[6], "o3 <- o3 (ppmv, mole fraction)");
}

TEST_F(ProfileFileTest, LevelsAreGeometricMeansAndHalfSpacingsBeyondTheOuterLayers) {
  File f = four_dimensional();
  f.erase("ps");
  f.erase("ts");
  ProfileDefaults defaults;
  defaults.surface_emissivity = 0.95;
  defaults.surface_albedo = 0.2;
  const ProfileFile file = read_profile_file(write(f), {}, defaults);
  const Column& col = file.columns[7];
  std::vector<double> p, t; // the file's layers
  for (std::size_t i = 0; i < 5; ++i) {
    p.push_back(pa_per_hpa * pressure_hpa[i]);
    t.push_back(temperature_k(7, i));
  }
  EXPECT_DOUBLE_EQ(col.pressure_level_pa[0], p[0] * std::sqrt(p[0] / p[1]));
  EXPECT_EQ(col.temperature_level_k[0], t[0]);
  for (std::size_t i = 1; i < 5; ++i) {
    EXPECT_DOUBLE_EQ(col.pressure_level_pa[i], std::sqrt(p[i - 1] * p[i]));
    EXPECT_DOUBLE_EQ(col.temperature_level_k[i], 0.5 * (t[i - 1] + t[i])); // linear in ln p at the ln-p midpoint
  }
  const double ps = p[4] * std::sqrt(p[4] / p[3]);
  EXPECT_DOUBLE_EQ(col.pressure_level_pa[5], ps);
  // Straight line in ln p through the two lowest layers.
  const double t_surface = t[4] + (t[4] - t[3]) / std::log(p[4] / p[3]) * std::log(ps / p[4]);
  EXPECT_DOUBLE_EQ(col.temperature_level_k[5], t_surface);
  EXPECT_DOUBLE_EQ(col.surface_temperature_k, t_surface);
  EXPECT_EQ(col.surface_emissivity, 0.95);
  EXPECT_EQ(col.surface_albedo, 0.2);
}

TEST_F(ProfileFileTest, TopLevelIsNotPlacedBelowOneThousandthPascal) {
  File f = time_level_lat();
  f.dims = {{"level", 2}};
  f.vars = {Var{"p", {"level"}, {{"units", "Pa"}, {"standard_name", "air_pressure"}}, {0.01, 100.0}, {}},
            Var{"t", {"level"}, {{"units", "K"}, {"standard_name", "air_temperature"}}, {250.0, 260.0}, {}}};
  ProfileFile file = read_profile_file(write(f, "coarse.nc"), {}, {});
  ASSERT_EQ(file.columns.size(), 1u);
  EXPECT_TRUE(file.axes.empty());
  EXPECT_EQ(file.columns[0].pressure_level_pa[0], 1e-3); // 0.01 * sqrt(1e-4) = 1e-4, raised to 1e-3
  f.vars[0].values = {1e-3, 1.0};
  file = read_profile_file(write(f, "high.nc"), {}, {});
  EXPECT_EQ(file.columns[0].pressure_level_pa[0], 0.5e-3); // floor lowered to half the top layer's pressure
}

TEST_F(ProfileFileTest, LeadingAxesKeepCoordinatesAndTextAttributes) {
  const ProfileFile file = read_profile_file(write(four_dimensional()), {}, {});
  ASSERT_EQ(file.axes.size(), 3u);
  EXPECT_EQ(file.axes[0].name, "time");
  EXPECT_EQ(file.axes[0].size, 2u);
  EXPECT_EQ(file.axes[0].values, (std::vector<double>{0.0, 6.0}));
  EXPECT_EQ(file.axes[0].attributes,
            (std::vector<std::pair<std::string, std::string>>{
                {"units", "hours since 2001-01-01 00:00:00"}, {"calendar", "gregorian"}, {"axis", "T"}}));
  EXPECT_EQ(file.axes[1].values, (std::vector<double>{-30.0, 0.0, 30.0}));
  EXPECT_EQ(file.axes[2].name, "lon");
  EXPECT_EQ(file.axes[2].size, 2u);
}

TEST_F(ProfileFileTest, NamesInTheStudyOverrideStandardNames) {
  File f = four_dimensional();
  Var alternative = f.var("ta");
  alternative.name = "ta_corrected";
  for (double& t : alternative.values)
    t += 1.0;
  f.vars.push_back(alternative);
  // Two variables with standard_name air_temperature: the file alone is ambiguous.
  expect_rejected(f, "ta_corrected", {"'ta'", "'ta_corrected'", "temperature", "name the one to use"});
  // Named: that variable is used, even without a standard_name.
  f.set_attribute("ta_corrected", "standard_name", "");
  const ProfileFile file = read_profile_file(write(f), named(&ProfileVariables::temperature, "ta_corrected"), {});
  EXPECT_DOUBLE_EQ(file.columns[3].temperature_layer_k[2], temperature_k(3, 2) + 1.0);
  EXPECT_EQ(file.used_variables[1], "temperature <- ta_corrected (K)");
}

TEST_F(ProfileFileTest, FullPressureFieldNeedsAMarkedOrNamedVerticalDimension) {
  File f = time_level_lat();
  f.erase("level");
  expect_rejected(f, "temperature", {"cannot tell which of the dimensions (time, level, lat) is vertical", "axis"});
  const ProfileFile file = read_profile_file(write(f), named(&ProfileVariables::vertical_dimension, "level"), {});
  EXPECT_EQ(file.columns.size(), 6u);
  expect_rejected(f, "temperature", {"'lat_typo'"}, named(&ProfileVariables::vertical_dimension, "lat_typo"));
}

TEST_F(ProfileFileTest, RejectsMissingTemperature) {
  File f = four_dimensional();
  f.erase("ta");
  expect_rejected(f, "temperature", {"air_temperature"});
  expect_rejected(four_dimensional(), "t", {"no such variable", "temperature"},
                  named(&ProfileVariables::temperature, "t"));
}

TEST_F(ProfileFileTest, RejectsUnknownOrMissingUnits) {
  File f = four_dimensional();
  f.set_attribute("ta", "units", "degF");
  expect_rejected(f, "ta", {"\"degF\"", "degC"});
  f = four_dimensional();
  f.set_attribute("plev", "units", "hpa");
  expect_rejected(f, "plev", {"\"hpa\"", "hPa"});
  f = four_dimensional();
  f.set_attribute("q", "units", "percent");
  expect_rejected(f, "q", {"\"percent\"", "kg kg-1"});
  f = four_dimensional();
  f.set_attribute("q", "units", "ppmv"); // a mole-based unit on a mass-based standard_name
  expect_rejected(f, "q", {"\"ppmv\"", "specific_humidity"});
  f = four_dimensional();
  f.vars.push_back(Var{"o3", {}, {{"units", "1"}}, {1e-6}, {}}); // "1" alone: per mass or per mole?
  expect_rejected(f, "o3", {"\"1\"", "standard_name"}, named(&ProfileVariables::o3, "o3"));
  f = four_dimensional();
  std::erase_if(f.var("ps").text, [](const auto& a) { return a.first == "units"; });
  expect_rejected(f, "ps", {"missing 'units'", "hPa"});
}

TEST_F(ProfileFileTest, RejectsNaNAndMissingValuesNamingTheIndex) {
  File f = four_dimensional();
  f.var("ta").values[((1 * 3 + 0) * 2 + 1) * 5 + 3] = std::numeric_limits<double>::quiet_NaN();
  expect_rejected(f, "ta", {"nan", "(time 1, lat 0, lon 1, level 3)"});
  f = four_dimensional();
  f.var("q").fill = -999.0;
  f.var("q").values[((0 * 3 + 2) * 2 + 0) * 5 + 4] = -999.0;
  expect_rejected(f, "q", {"_FillValue -999", "(time 0, lat 2, lon 0, level 4)"});
  f = four_dimensional();
  f.var("ts").values[5] = 1e20; // marked missing by a numeric missing_value attribute added below
  const fs::path path = write(f, "missing.nc");
  {
    netCDF::NcFile nc(path.string(), netCDF::NcFile::write);
    nc.getVar("ts").putAtt("missing_value", netCDF::ncDouble, 1e20);
  }
  try {
    (void)read_profile_file(path, {}, {});
    FAIL() << "accepted a missing_value";
  } catch (const InputError& e) {
    EXPECT_EQ(e.place().item, "ts");
    EXPECT_NE(std::string(e.what()).find("missing_value 1e+20"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("(time 0, lat 2, lon 1)"), std::string::npos) << e.what();
  }
}

TEST_F(ProfileFileTest, RejectsNonMonotonicPressureNamingColumnAndLevel) {
  File f = time_level_lat();
  // Column 4 = (time 1, lat 1): make level 3 equal to level 2.
  Var& p = f.var("air_pressure");
  const auto flat = [](std::size_t t, std::size_t k, std::size_t y) { return (t * 5 + k) * 3 + y; };
  p.values[flat(1, 3, 1)] = p.values[flat(1, 2, 1)];
  expect_rejected(f, "air_pressure", {"(column 4)", "(time 1, lat 1)", "along 'level'", "index 2 has", "index 3 has"});
}

TEST_F(ProfileFileTest, RejectsSurfacePressureNotBelowTheLowestLayer) {
  File f = four_dimensional();
  f.var("ps").values[5] = 900.0; // hPa, above the lowest layer at 925 hPa
  expect_rejected(f, "ps", {"(column 5)", "90000 Pa", "92500 Pa"});
}

TEST_F(ProfileFileTest, RejectsWrongDimensions) {
  File f = four_dimensional();
  f.var("q").dims = {"lat", "time", "lon", "level"};
  expect_rejected(f, "q", {"(lat, time, lon, level)", "(time, lat, lon, level)"});
  f = four_dimensional();
  f.var("ps").dims = {"time", "lon", "lat"};
  expect_rejected(f, "ps", {"(time, lon, lat)", "(time, lat, lon)"});
}

TEST_F(ProfileFileTest, RejectsValuesOutOfRange) {
  File f = four_dimensional();
  f.var("q").values[2] = -1e-7; // negative humidity (as numerical schemes sometimes leave) is not clipped
  expect_rejected(f, "q", {"-1e-07", "(time 0, lat 0, lon 0, level 2)", "[0, 1)"});
}

TEST_F(ProfileFileTest, MissingOrNonNetcdfFilesAreFileErrors) {
  EXPECT_THROW((void)read_profile_file(dir_ / "absent.nc", {}, {}), FileError);
  const fs::path text = dir_ / "text.nc";
  std::ofstream(text) << "not netCDF\n";
  EXPECT_THROW((void)read_profile_file(text, {}, {}), FileError);
}

// Block reading (ProfileReader::read): any run of columns equals the same columns of the whole read,
// in both layouts (vertical last; vertical between the leading dimensions with a full pressure field).
TEST_F(ProfileFileTest, BlocksOfColumnsEqualTheWholeRead) {
  for (const File& f : {four_dimensional(), time_level_lat(true)}) {
    const fs::path path = write(f);
    const ProfileFile whole = read_profile_file(path, {}, {});
    const bandstack::io::ProfileReader reader(path, {}, {});
    ASSERT_EQ(reader.column_count(), whole.columns.size());
    EXPECT_EQ(reader.layer_count(), 5u);
    EXPECT_EQ(reader.used_variables(), whole.used_variables);
    for (std::size_t first = 0; first < reader.column_count(); ++first)
      for (std::size_t count = 1; first + count <= reader.column_count(); ++count) {
        ProfileFile block;
        block.columns = reader.read(first, count);
        ProfileFile expected;
        expected.columns.assign(whole.columns.begin() + static_cast<long>(first),
                                whole.columns.begin() + static_cast<long>(first + count));
        expect_same_columns(block, expected, 0.0);
      }
    EXPECT_TRUE(reader.read(3, 0).empty());
  }
}

// A bad value is found when its column is read, and named by its index in the whole file; the other
// columns read normally (the file is opened without reading the values).
TEST_F(ProfileFileTest, BlocksFindBadValuesOnlyInTheirOwnColumns) {
  File f = four_dimensional();
  // Column 7 = (time 1, lat 0, lon 1).
  f.var("ta").values[((1 * 3 + 0) * 2 + 1) * 5 + 3] = std::numeric_limits<double>::quiet_NaN();
  const fs::path path = write(f);
  const bandstack::io::ProfileReader reader(path, {}, {});
  EXPECT_EQ(reader.read(0, 7).size(), 7u);
  EXPECT_EQ(reader.read(8, 4).size(), 4u);
  try {
    (void)reader.read(6, 3);
    FAIL() << "read a NaN";
  } catch (const InputError& e) {
    EXPECT_EQ(e.place().item, "ta");
    EXPECT_NE(std::string(e.what()).find("(time 1, lat 0, lon 1, level 3)"), std::string::npos) << e.what();
  }
}

TEST_F(ProfileFileTest, ContentHashFollowsTheBytes) {
  File f = four_dimensional();
  const bandstack::io::ProfileReader a(write(f, "a.nc"), {}, {});
  f.var("ta").values[0] += 0.5;
  const bandstack::io::ProfileReader other(write(f, "c.nc"), {}, {});
  EXPECT_EQ(a.content_hash(), a.content_hash());
  EXPECT_NE(a.content_hash(), other.content_hash());
}
