// The cross-section file: round trip, interpolation, unit conversion and every kind of bad file.
#include "bandstack/core/error.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <gtest/gtest.h>
#include <limits>
#include <netcdf>
#include <string>
#include <vector>

namespace bs = bandstack::spectral;
namespace fs = std::filesystem;

namespace {

fs::path scratch(const std::string& name) {
  const fs::path dir = fs::temp_directory_path() / "bandstack_cross_section_test";
  fs::create_directories(dir);
  return dir / name;
}

const bs::AnalyticAbsorber& analytic() {
  static const bs::AnalyticAbsorber a(
      bs::load_absorber_recipe(std::string(BANDSTACK_SOURCE_DIR) + "/bands/earth_idealised_absorbers.toml"));
  return a;
}

// A file written directly with netCDF, as another program would, with one variable per entry.
struct RawVariable {
  std::string name;
  std::vector<std::string> dims{"temperature", "pressure", "wavenumber"};
  std::string units = "m2 kg-1"; // empty: no units attribute
  std::vector<double> values;    // empty: filled with 1.0
};
struct RawFile {
  std::vector<double> nu{500.0, 501.0, 503.0, 510.0};
  std::vector<double> p{1e4, 1e5};
  std::vector<double> t{250.0, 300.0};
  std::string nu_units = "cm-1", p_units = "Pa", t_units = "K";
  bool pressure_variable = true;
  std::vector<RawVariable> variables{RawVariable{"co2_mass_absorption_coefficient", {"temperature", "pressure", "wavenumber"}, "m2 kg-1", {}}};
};

fs::path write_raw(const std::string& name, const RawFile& f) {
  const fs::path path = scratch(name);
  netCDF::NcFile nc(path.string(), netCDF::NcFile::replace, netCDF::NcFile::nc4);
  nc.putAtt("title", "raw test file");
  const auto coordinate = [&](const char* dim_name, const std::vector<double>& v, const std::string& units, bool variable) {
    const auto dim = nc.addDim(dim_name, v.size());
    if (!variable) return;
    auto var = nc.addVar(dim_name, netCDF::ncDouble, dim);
    if (!units.empty()) var.putAtt("units", units);
    var.putVar(v.data());
  };
  coordinate("wavenumber", f.nu, f.nu_units, true);
  coordinate("pressure", f.p, f.p_units, f.pressure_variable);
  coordinate("temperature", f.t, f.t_units, true);
  for (const RawVariable& rv : f.variables) {
    std::vector<netCDF::NcDim> dims;
    std::size_t n = 1;
    for (const auto& d : rv.dims) {
      dims.push_back(nc.getDim(d));
      n *= dims.back().getSize();
    }
    auto var = nc.addVar(rv.name, netCDF::ncDouble, dims);
    if (!rv.units.empty()) var.putAtt("units", rv.units);
    std::vector<double> values = rv.values.empty() ? std::vector<double>(n, 1.0) : rv.values;
    var.putVar(values.data());
  }
  return path;
}

std::string error_of(const fs::path& path) {
  try {
    bs::CrossSectionAbsorber a(path);
  } catch (const bandstack::InputError& e) {
    return std::string("InputError: ") + e.what();
  } catch (const bandstack::FileError& e) {
    return std::string("FileError: ") + e.what();
  }
  return "(no error)";
}

void expect_error(const RawFile& f, const std::string& name, const std::string& variable, const std::string& words) {
  const fs::path path = write_raw(name + ".nc", f);
  const std::string m = error_of(path);
  EXPECT_EQ(m.rfind("InputError: ", 0), 0u) << m;
  EXPECT_NE(m.find(path.string()), std::string::npos) << m;
  if (!variable.empty()) {
    EXPECT_NE(m.find("'" + variable + "'"), std::string::npos) << m;
  }
  EXPECT_NE(m.find(words), std::string::npos) << m;
}

std::vector<double> evaluate(const bs::AbsorberSource& s, bs::Absorber a, bs::AbsorberState st, const bs::WavenumberGrid& g) {
  std::vector<double> out(g.count);
  s.absorption(a, st, g, out);
  return out;
}

} // namespace

TEST(CrossSectionFile, AnalyticRecipeRoundTripIsExactAtTheNodes) {
  const bs::WavenumberGrid grid = bs::make_wavenumber_grid(500.0, 1600.0, 0.5);
  const std::vector<double> p{1000.0, 10000.0, 50000.0, 101325.0}, t{180.0, 250.0, 320.0};
  const fs::path path = scratch("roundtrip.nc");
  bs::write_cross_section_file(path, analytic(), grid, p, t, "analytic recipe on its own grid");
  const bs::CrossSectionAbsorber file(path);
  EXPECT_NE(file.description().find("analytic recipe on its own grid"), std::string::npos);
  EXPECT_NE(file.description().find("earth_idealised_absorbers v3"), std::string::npos) << file.description();
  EXPECT_EQ(file.memory_bytes(), 6u * grid.count * 4 * 3 * sizeof(double));
  for (bs::Absorber a : bs::all_absorbers) {
    ASSERT_TRUE(file.provides(a));
    for (double pp : p)
      for (double tt : t) EXPECT_EQ(evaluate(file, a, {pp, tt}, grid), evaluate(analytic(), a, {pp, tt}, grid)) << bs::absorber_name(a);
  }
  // Nothing is left behind but the file itself (atomic write through a temporary).
  std::size_t files = 0;
  for (const auto& e : fs::directory_iterator(path.parent_path()))
    if (e.path().filename().string().find("roundtrip.nc") != std::string::npos) ++files;
  EXPECT_EQ(files, 1u);
}

TEST(CrossSectionFile, InterpolationIsExactForLinearFunctions) {
  // kappa = 2 + 0.01 T + 0.3 ln p + 0.001 T ln p + 0.002 nu is reproduced exactly by bilinear
  // interpolation in (T, ln p) and linear interpolation in nu (analytic property of the scheme).
  const auto f = [](double nu, double p, double t) { return 2.0 + 0.01 * t + 0.3 * std::log(p) + 0.001 * t * std::log(p) + 0.002 * nu; };
  bs::CrossSectionTable table;
  table.wavenumber_cm1 = {100.0, 100.7, 102.0, 105.5, 106.0, 110.0}; // non-uniform
  table.pressure_pa = {10.0, 1000.0, 30000.0, 100000.0};
  table.temperature_k = {150.0, 220.0, 330.0};
  auto& k = table.kappa[bs::index(bs::Absorber::ch4)];
  for (double t : table.temperature_k)
    for (double p : table.pressure_pa)
      for (double nu : table.wavenumber_cm1) k.push_back(f(nu, p, t));
  const fs::path path = scratch("linear.nc");
  bs::write_cross_section_file(path, table);
  const bs::CrossSectionAbsorber file(path);
  const bs::WavenumberGrid grid{100.0, 0.25, 40}; // midpoints 100.125 ... 109.875, between file points
  for (const bs::AbsorberState st : {bs::AbsorberState{20.0, 151.0}, bs::AbsorberState{777.0, 300.0},
                                     bs::AbsorberState{99999.0, 329.0}, bs::AbsorberState{1000.0, 220.0}}) {
    const auto out = evaluate(file, bs::Absorber::ch4, st, grid);
    for (std::size_t i = 0; i < grid.count; ++i)
      EXPECT_NEAR(out[i], f(grid.at(i), st.pressure_pa, st.temperature_k), 1e-12 * f(grid.at(i), st.pressure_pa, st.temperature_k))
          << "nu " << grid.at(i) << " p " << st.pressure_pa << " T " << st.temperature_k;
  }
  // Absorbers the file lacks give zeros.
  for (double v : evaluate(file, bs::Absorber::co2, {1000.0, 200.0}, grid)) EXPECT_EQ(v, 0.0);
  EXPECT_FALSE(file.provides(bs::Absorber::co2));
}

TEST(CrossSectionFile, StatesAndGridsOutsideTheTableAreClearErrors) {
  RawFile f;
  const bs::CrossSectionAbsorber file(write_raw("range.nc", f));
  const bs::WavenumberGrid inside{500.0, 1.0, 10};
  const auto message = [&](bs::AbsorberState st, const bs::WavenumberGrid& g) {
    try {
      (void)evaluate(file, bs::Absorber::co2, st, g);
    } catch (const bandstack::InputError& e) {
      return std::string(e.what());
    }
    return std::string("(no error)");
  };
  EXPECT_NE(message({5e4, 249.0}, inside).find("temperature 249 K is outside the table's range [250, 300] K"), std::string::npos);
  EXPECT_NE(message({5e4, 301.0}, inside).find("[250, 300] K"), std::string::npos);
  EXPECT_NE(message({9999.0, 260.0}, inside).find("pressure 9999 Pa is outside the table's range [10000, 100000] Pa"),
            std::string::npos);
  EXPECT_NE(message({2e5, 260.0}, inside).find("[10000, 100000] Pa"), std::string::npos);
  EXPECT_NE(message({5e4, 260.0}, bs::WavenumberGrid{499.0, 1.0, 5}).find("not within the file's range [500, 510] cm-1"),
            std::string::npos);
  EXPECT_NE(message({5e4, 260.0}, bs::WavenumberGrid{505.0, 1.0, 6}).find("not within"), std::string::npos);
  EXPECT_EQ(message({1e4, 300.0}, inside), "(no error)"); // range ends are inside
}

TEST(CrossSectionFile, SingleTemperatureMeansNoTemperatureDependence) {
  RawFile f;
  f.t = {296.0};
  f.variables[0].values = std::vector<double>(8, 0.0);
  for (std::size_t i = 0; i < 8; ++i) f.variables[0].values[i] = static_cast<double>(i);
  const bs::CrossSectionAbsorber file(write_raw("one_t.nc", f));
  const auto cold = evaluate(file, bs::Absorber::co2, {1e5, 150.0}, bs::WavenumberGrid{500.0, 1.0, 1});
  EXPECT_EQ(cold[0], 4.5); // pressure row 1, halfway between 500 (4) and 501 (5)
}

TEST(CrossSectionFile, PerMoleculeUnitsAndHectopascalsAreConverted) {
  RawFile f;
  f.p = {100.0, 1000.0};
  f.p_units = "hPa";
  f.variables = {RawVariable{"co2_mass_absorption_coefficient", {"temperature", "pressure", "wavenumber"}, "cm2 molecule-1",
                             std::vector<double>(16, 1e-20)},
                 RawVariable{"h2o_self_continuum_mass_absorption_coefficient", {"temperature", "pressure", "wavenumber"},
                             "cm2 molecule-1 atm-1", std::vector<double>(16, 1.888e-22)}};
  const bs::CrossSectionAbsorber file(write_raw("per_molecule.nc", f));
  EXPECT_EQ(file.table().pressure_pa, (std::vector<double>{1e4, 1e5}));
  // By hand: 1e-20 cm2 * 1e-4 m2/cm2 * 6.02214076e23 mol-1 / 0.0440095 kg/mol = 13.68371 m2/kg
  // (CODATA 2018 N_A; IUPAC molar mass of CO2).
  EXPECT_NEAR(evaluate(file, bs::Absorber::co2, {2e4, 260.0}, {500.0, 1.0, 1})[0], 13.68371, 1e-4);
  // By hand: 1.888e-22 * 1e-4 * 6.02214076e23 / 0.01801528 / 101325 Pa = 6.2287e-6 m2 kg-1 Pa-1.
  EXPECT_NEAR(evaluate(file, bs::Absorber::h2o_self_continuum, {2e4, 260.0}, {500.0, 1.0, 1})[0], 6.2287e-6, 1e-9);
}

TEST(CrossSectionFile, BadFilesNameFileVariableAndIndex) {
  const std::string co2 = "co2_mass_absorption_coefficient";
  RawFile f;
  f.variables.clear();
  expect_error(f, "no_absorber", "", "no absorption coefficients");

  f = RawFile{};
  f.pressure_variable = false;
  expect_error(f, "no_pressure", "pressure", "missing coordinate variable");

  f = RawFile{};
  f.variables[0].units = "kg m-2";
  expect_error(f, "wrong_units", co2, "units \"kg m-2\" not accepted");

  f = RawFile{};
  f.variables[0].units = "";
  expect_error(f, "no_units", co2, "missing 'units'");

  f = RawFile{};
  f.variables[0].units = "cm2 molecule-1 atm-1"; // continuum units on a gas
  expect_error(f, "gas_with_continuum_units", co2, "not accepted");

  f = RawFile{};
  f.t_units = "degC";
  expect_error(f, "celsius", "temperature", "units \"degC\" not accepted");

  f = RawFile{};
  f.variables[0].values = std::vector<double>(16, 1.0);
  f.variables[0].values[13] = std::numeric_limits<double>::quiet_NaN();
  expect_error(f, "nan", co2, "(temperature 1, pressure 1, wavenumber 1)");

  f = RawFile{};
  f.variables[0].values = std::vector<double>(16, 1.0);
  f.variables[0].values[2] = -1e-3;
  expect_error(f, "negative", co2, "value -0.001 at (temperature 0, pressure 0, wavenumber 2)");

  f = RawFile{};
  f.variables[0].values = std::vector<double>(16, 1.0);
  f.variables[0].values[5] = NC_FILL_DOUBLE; // never written
  expect_error(f, "fill", co2, "missing value");

  f = RawFile{};
  f.p = {1e5, 1e4};
  expect_error(f, "decreasing_pressure", "pressure", "strictly increasing: index 0 has 100000, index 1 has 10000");

  f = RawFile{};
  f.nu = {500.0, 501.0, 501.0, 510.0};
  expect_error(f, "repeated_wavenumber", "wavenumber", "strictly increasing");

  f = RawFile{};
  f.t = {0.0, 300.0};
  expect_error(f, "zero_temperature", "temperature", "must be finite and > 0");

  f = RawFile{};
  f.variables[0].dims = {"wavenumber", "pressure", "temperature"};
  expect_error(f, "transposed", co2, "dimensions must be (temperature, pressure, wavenumber), got (wavenumber, pressure, temperature)");

  f = RawFile{};
  f.variables[0].dims = {"pressure", "wavenumber"};
  expect_error(f, "two_dims", co2, "dimensions must be");

  f = RawFile{};
  f.variables[0].name = "h20_mass_absorption_coefficient";
  expect_error(f, "typo", "h20_mass_absorption_coefficient", "unknown absorber \"h20\"");
}

TEST(CrossSectionFile, UnreadableFilesAreFileErrors) {
  EXPECT_EQ(error_of("/nonexistent/file.nc").rfind("FileError: ", 0), 0u);
  const fs::path text = scratch("not_netcdf.nc");
  std::ofstream(text) << "this is not netCDF\n";
  const std::string m = error_of(text);
  EXPECT_EQ(m.rfind("FileError: ", 0), 0u) << m;
  EXPECT_NE(m.find(text.string()), std::string::npos) << m;
}

TEST(CrossSectionFile, WriterRejectsBadTablesAndLeavesNoFile) {
  const fs::path path = scratch("never_written.nc");
  fs::remove(path);
  EXPECT_THROW(bs::write_cross_section_file(path, analytic(), bs::make_wavenumber_grid(500.0, 510.0, 1.0), {1e5, 1e4}, {250.0},
                                            "decreasing pressures"),
               bandstack::InputError);
  EXPECT_THROW(bs::write_cross_section_file(path, analytic(), bs::make_wavenumber_grid(500.0, 510.0, 1.0), {1e4}, {},
                                            "no temperatures"),
               bandstack::InputError);
  EXPECT_FALSE(fs::exists(path));
  EXPECT_THROW(bs::write_cross_section_file("/nonexistent/folder/x.nc", analytic(), bs::make_wavenumber_grid(500.0, 510.0, 1.0),
                                            {1e4}, {250.0}, "no folder"),
               bandstack::FileError);
}
