// Reading, checking and writing cross-section files (docs/cross-section-file.md).
#include "bandstack/spectral/cross_section_file.hpp"

#include <algorithm>
#include <cmath>
#include <optional>
#include <sstream>

#include <fmt/format.h>
#include <netcdf>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "spectral/netcdf_checks.hpp"
#include "spectral/netcdf_truncation.hpp"

namespace bandstack::spectral {

using namespace detail;

namespace {

constexpr const char* suffix = "_mass_absorption_coefficient";
constexpr int format_version = 1;
// Values one coordinate or one absorber's table may have (2 GiB of doubles): a damaged file's sizes are
// refused before anything is allocated for them.
constexpr std::size_t max_values = std::size_t{1} << 28;

std::string variable_name(Absorber a) { return std::string(absorber_name(a)) + suffix; }

// Factor from the file's units to bandstack's (m2 kg-1, or m2 kg-1 Pa-1 for the continuum); nullopt
// for units we do not accept.
std::optional<double> coefficient_factor(Absorber a, const std::string& units) {
  const double per_molecule_to_per_kg = 1e-4 * constants::avogadro_per_mol / gas_molar_mass_kg_mol(absorber_gas(a));
  if (scales_with_vapour_pressure(a)) {
    if (one_of(units, {"m2 kg-1 Pa-1", "m2/kg/Pa", "m^2 kg^-1 Pa^-1", "m2 kg^-1 Pa^-1"})) return 1.0;
    if (one_of(units, {"cm2 molecule-1 atm-1", "cm2/molecule/atm", "cm^2 molecule^-1 atm^-1"}))
      return per_molecule_to_per_kg / 101325.0; // standard atmosphere, 101325 Pa exactly (3rd CGPM 1954)
    return std::nullopt;
  }
  if (one_of(units, {"m2 kg-1", "m2/kg", "m^2 kg^-1", "m^2/kg", "m2 kg^-1"})) return 1.0;
  if (one_of(units, {"cm2 molecule-1", "cm2/molecule", "cm^2 molecule^-1", "cm^2/molecule"})) return per_molecule_to_per_kg;
  return std::nullopt;
}

const char* accepted_units(Absorber a) {
  return scales_with_vapour_pressure(a) ? "\"m2 kg-1 Pa-1\" or \"cm2 molecule-1 atm-1\"" : "\"m2 kg-1\" or \"cm2 molecule-1\"";
}

// Reads coordinate `name` (a 1-D variable on the dimension of the same name) in bandstack units.
std::vector<double> read_coordinate(const netCDF::NcFile& nc, const std::string& name, const std::string& file) {
  const netCDF::NcDim dim = nc.getDim(name);
  if (dim.isNull()) fail(file, name, "missing dimension (a cross-section file needs wavenumber, pressure and temperature)");
  const netCDF::NcVar var = nc.getVar(name);
  if (var.isNull()) fail(file, name, "missing coordinate variable (the values of the dimension of the same name)");
  const auto dims = var.getDims();
  if (dims.size() != 1 || dims[0].getName() != name)
    fail(file, name, fmt::format("the coordinate variable must have the single dimension ({})", name));
  if (!numeric(nc.getId(), var.getId())) fail(file, name, "must be numeric");
  reject_packing(nc.getId(), var, file);
  const auto units = text_attribute(nc.getId(), var.getId(), "units", file, name);
  if (!units) fail(file, name, "missing 'units' attribute");
  const std::string u = normalise_units(*units);
  double factor = 1.0;
  if (name == "wavenumber") {
    if (!one_of(u, {"cm-1", "cm^-1", "1/cm", "cm**-1"})) fail(file, name, fmt::format("units \"{}\" not accepted (expected \"cm-1\")", *units));
  } else if (name == "pressure") {
    if (u == "hPa") factor = 100.0;
    else if (u != "Pa") fail(file, name, fmt::format("units \"{}\" not accepted (expected \"Pa\" or \"hPa\")", *units));
  } else if (u != "K") {
    fail(file, name, fmt::format("units \"{}\" not accepted (expected \"K\")", *units));
  }
  if (dim.getSize() > max_values) fail(file, name, fmt::format("has {} values, more than {}", dim.getSize(), max_values));
  std::vector<double> values(dim.getSize());
  if (!values.empty()) var.getVar(values.data());
  for (double& v : values) v *= factor;
  return values;
}

void check_coordinate(const std::vector<double>& x, const std::string& name, std::size_t min_size, bool zero_allowed,
                      const std::string& file) {
  if (x.size() < min_size) fail(file, name, fmt::format("needs at least {} values, has {}", min_size, x.size()));
  for (std::size_t i = 0; i < x.size(); ++i) {
    if (!std::isfinite(x[i]) || x[i] < 0.0 || (!zero_allowed && x[i] == 0.0))
      fail(file, name, fmt::format("value at index {} is {}: must be finite and {}", i, x[i], zero_allowed ? ">= 0" : "> 0"));
    if (i > 0 && !(x[i] > x[i - 1]))
      fail(file, name, fmt::format("must be strictly increasing: index {} has {}, index {} has {}", i - 1, x[i - 1], i, x[i]));
  }
}

} // namespace

void validate(const CrossSectionTable& table, const std::string& file) {
  check_coordinate(table.wavenumber_cm1, "wavenumber", 2, true, file);
  check_coordinate(table.pressure_pa, "pressure", 1, false, file);
  check_coordinate(table.temperature_k, "temperature", 1, false, file);
  const std::size_t n_nu = table.wavenumber_cm1.size(), n_p = table.pressure_pa.size();
  bool any = false;
  for (Absorber a : all_absorbers) {
    const std::vector<double>& k = table.kappa[index(a)];
    if (k.empty()) continue;
    any = true;
    if (k.size() != table.values_per_absorber())
      fail(file, variable_name(a), fmt::format("has {} values, expected {} (temperature x pressure x wavenumber)", k.size(),
                                               table.values_per_absorber()));
    for (std::size_t i = 0; i < k.size(); ++i) {
      if (std::isfinite(k[i]) && k[i] >= 0.0) continue;
      const std::size_t t = i / (n_p * n_nu), p = (i / n_nu) % n_p, nu = i % n_nu;
      fail(file, variable_name(a),
           fmt::format("value {} at (temperature {}, pressure {}, wavenumber {}) = ({} K, {} Pa, {} cm-1): coefficients "
                       "must be finite and >= 0",
                       k[i], t, p, nu, table.temperature_k[t], table.pressure_pa[p], table.wavenumber_cm1[nu]));
    }
  }
  if (!any)
    fail(file, "", "no absorption coefficients: the file needs at least one variable <absorber>_mass_absorption_coefficient");
}

CrossSectionTable read_cross_section_file(const std::filesystem::path& path) {
  const std::string file = path.string();
  if (!std::filesystem::is_regular_file(path)) throw FileError(file, "no such cross-section file");
  check_classic_file(path, file);
  CrossSectionTable table;
  try {
    netCDF::NcFile nc(file, netCDF::NcFile::read);
    const int ncid = nc.getId();
    if (auto v = text_attribute(ncid, NC_GLOBAL, "title", file, "title")) table.title = *v;
    if (auto v = text_attribute(ncid, NC_GLOBAL, "source", file, "source")) table.source = *v;
    int version = format_version;
    if (has_attribute(ncid, NC_GLOBAL, "cross_section_format_version") &&
        (nc_get_att_int(ncid, NC_GLOBAL, "cross_section_format_version", &version) != NC_NOERR || version > format_version))
      fail(file, "cross_section_format_version",
           fmt::format("format version {} is newer than this bandstack reads ({})", version, format_version));

    table.wavenumber_cm1 = read_coordinate(nc, "wavenumber", file);
    table.pressure_pa = read_coordinate(nc, "pressure", file);
    table.temperature_k = read_coordinate(nc, "temperature", file);
    check_coordinate(table.wavenumber_cm1, "wavenumber", 2, true, file);
    check_coordinate(table.pressure_pa, "pressure", 1, false, file);
    check_coordinate(table.temperature_k, "temperature", 1, false, file);

    for (const auto& [name, var] : nc.getVars()) {
      if (name.size() <= std::string(suffix).size() || !name.ends_with(suffix)) continue;
      const std::string prefix = name.substr(0, name.size() - std::string(suffix).size());
      const auto a = absorber_from_name(prefix);
      if (!a) {
        std::string known;
        for (Absorber k : all_absorbers) known += (known.empty() ? "" : ", ") + std::string(absorber_name(k));
        fail(file, name, fmt::format("unknown absorber \"{}\" (known: {})", prefix, known));
      }
      const auto dims = var.getDims();
      if (dims.size() != 3 || dims[0].getName() != "temperature" || dims[1].getName() != "pressure" ||
          dims[2].getName() != "wavenumber") {
        std::string got;
        for (const auto& d : dims) got += (got.empty() ? "" : ", ") + d.getName();
        fail(file, name, fmt::format("dimensions must be (temperature, pressure, wavenumber), got ({})", got));
      }
      if (!numeric(ncid, var.getId())) fail(file, name, "must be numeric");
      reject_packing(ncid, var, file);
      const auto units = text_attribute(ncid, var.getId(), "units", file, name);
      if (!units) fail(file, name, fmt::format("missing 'units' attribute (expected {})", accepted_units(*a)));
      const auto factor = coefficient_factor(*a, normalise_units(*units));
      if (!factor) fail(file, name, fmt::format("units \"{}\" not accepted (expected {})", *units, accepted_units(*a)));

      const double count = static_cast<double>(table.temperature_k.size()) * static_cast<double>(table.pressure_pa.size()) *
                           static_cast<double>(table.wavenumber_cm1.size());
      if (count > static_cast<double>(max_values))
        fail(file, name, fmt::format("has {:.0f} values (temperature x pressure x wavenumber), more than the {} one absorber may have",
                                     count, max_values));
      std::vector<double> values(table.values_per_absorber());
      var.getVar(values.data());
      if (const auto fill = fill_value(ncid, var.getId())) {
        const auto it = std::find(values.begin(), values.end(), *fill);
        if (it != values.end()) {
          const std::size_t i = static_cast<std::size_t>(it - values.begin());
          const std::size_t n_nu = table.wavenumber_cm1.size(), n_p = table.pressure_pa.size();
          fail(file, name, fmt::format("missing value (fill value {}) at (temperature {}, pressure {}, wavenumber {})", *fill,
                                       i / (n_p * n_nu), (i / n_nu) % n_p, i % n_nu));
        }
      }
      if (*factor != 1.0)
        for (double& v : values) v *= *factor;
      table.kappa[index(*a)] = std::move(values);
    }
  } catch (const netCDF::exceptions::NcException& e) {
    throw FileError(file, std::string("cannot read as a netCDF cross-section file: ") + first_line(e.what()));
  }
  validate(table, file);
  return table;
}

void write_cross_section_file(const std::filesystem::path& path, const CrossSectionTable& table) {
  validate(table, path.string());
  io::AtomicOutput output(path);
  try {
    netCDF::NcFile nc(output.temporary_path().string(), netCDF::NcFile::replace, netCDF::NcFile::nc4);
    nc.putAtt("Conventions", "CF-1.8");
    nc.putAtt("title", table.title);
    nc.putAtt("source", table.source);
    nc.putAtt("history", fmt::format("written by bandstack {}", version()));
    nc.putAtt("cross_section_format_version", netCDF::ncInt, format_version);

    const auto coordinate = [&](const char* name, const std::vector<double>& values, const char* units,
                                const char* long_name, const char* standard_name) {
      const netCDF::NcDim dim = nc.addDim(name, values.size());
      netCDF::NcVar var = nc.addVar(name, netCDF::ncDouble, dim);
      var.putAtt("units", units);
      var.putAtt("long_name", long_name);
      if (standard_name) var.putAtt("standard_name", standard_name);
      var.putVar(values.data());
      return dim;
    };
    const auto d_nu = coordinate("wavenumber", table.wavenumber_cm1, "cm-1", "wavenumber", nullptr);
    const auto d_p = coordinate("pressure", table.pressure_pa, "Pa", "air pressure", "air_pressure");
    const auto d_t = coordinate("temperature", table.temperature_k, "K", "air temperature", "air_temperature");
    for (Absorber a : all_absorbers) {
      const std::vector<double>& k = table.kappa[index(a)];
      if (k.empty()) continue;
      netCDF::NcVar var = nc.addVar(variable_name(a), netCDF::ncDouble, {d_t, d_p, d_nu});
      std::vector<std::size_t> chunk{1, 1, table.wavenumber_cm1.size()}; // one spectrum per chunk
      var.setChunking(netCDF::NcVar::nc_CHUNKED, chunk);
      var.putAtt("units", scales_with_vapour_pressure(a) ? "m2 kg-1 Pa-1" : "m2 kg-1");
      var.putAtt("long_name", scales_with_vapour_pressure(a)
                                  ? "water vapour self-continuum absorption coefficient per kg of water per Pa of vapour pressure"
                                  : fmt::format("mass absorption coefficient of {}", absorber_name(a)));
      var.putVar(k.data());
    }
    nc.close();
  } catch (const netCDF::exceptions::NcException& e) {
    throw FileError(path.string(), std::string("cannot write the cross-section file: ") + first_line(e.what()));
  }
  output.commit();
}

void write_cross_section_file(const std::filesystem::path& path, const AbsorberSource& source, const WavenumberGrid& grid,
                              std::vector<double> pressures_pa, std::vector<double> temperatures_k,
                              const std::string& title) {
  CrossSectionTable table;
  table.title = title;
  table.source = source.description();
  table.wavenumber_cm1.resize(grid.count);
  for (std::size_t i = 0; i < grid.count; ++i) table.wavenumber_cm1[i] = grid.at(i);
  table.pressure_pa = std::move(pressures_pa);
  table.temperature_k = std::move(temperatures_k);
  check_coordinate(table.wavenumber_cm1, "wavenumber", 2, true, path.string());
  check_coordinate(table.pressure_pa, "pressure", 1, false, path.string());
  check_coordinate(table.temperature_k, "temperature", 1, false, path.string());
  const std::size_t n_nu = grid.count;
  for (Absorber a : all_absorbers) {
    if (!source.provides(a)) continue;
    std::vector<double>& k = table.kappa[index(a)];
    k.resize(table.values_per_absorber());
    for (std::size_t t = 0; t < table.temperature_k.size(); ++t)
      for (std::size_t p = 0; p < table.pressure_pa.size(); ++p)
        source.absorption(a, AbsorberState{table.pressure_pa[p], table.temperature_k[t]}, grid,
                          std::span<double>(k).subspan((t * table.pressure_pa.size() + p) * n_nu, n_nu));
  }
  write_cross_section_file(path, table);
}

} // namespace bandstack::spectral
