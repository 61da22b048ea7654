// Reading, checking and writing solar spectrum files (docs/solar-spectrum-file.md).
#include "bandstack/spectral/solar_spectrum.hpp"

#include <algorithm>
#include <cmath>
#include <initializer_list>
#include <optional>
#include <sstream>

#include <fmt/format.h>
#include <netcdf>

#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "spectral/netcdf_checks.hpp"

namespace bandstack::spectral {

using namespace detail;

namespace {

constexpr int format_version = 1;
constexpr const char* irradiance_name = "spectral_irradiance";

// A numeric, unpacked 1-D variable on dimension `dim`, with its values and its (normalised) units.
struct Column1d {
  std::vector<double> values;
  std::string units;     // normalised
  std::string units_raw; // as written
};

Column1d read_1d(const netCDF::NcFile& nc, const std::string& name, const std::string& dim, const std::string& file) {
  const netCDF::NcVar var = nc.getVar(name);
  if (var.isNull()) fail(file, name, "missing variable");
  const auto dims = var.getDims();
  if (dims.size() != 1 || dims[0].getName() != dim) {
    std::string got;
    for (const auto& d : dims) got += (got.empty() ? "" : ", ") + d.getName();
    fail(file, name, fmt::format("must have the single dimension ({}), has ({})", dim, got));
  }
  const int ncid = nc.getId();
  if (!numeric(ncid, var.getId())) fail(file, name, "must be numeric");
  if (has_attribute(ncid, var.getId(), "scale_factor") || has_attribute(ncid, var.getId(), "add_offset"))
    fail(file, name, "packed data (scale_factor/add_offset) is not supported: write the values unpacked");
  const auto units = text_attribute(ncid, var.getId(), "units", file, name);
  if (!units) fail(file, name, "missing 'units' attribute");
  Column1d c;
  c.units_raw = *units;
  c.units = normalise_units(*units);
  c.values.resize(dims[0].getSize());
  if (!c.values.empty()) var.getVar(c.values.data());
  if (const auto fill = fill_value(ncid, var.getId())) {
    const auto it = std::find(c.values.begin(), c.values.end(), *fill);
    if (it != c.values.end())
      fail(file, name, fmt::format("missing value (fill value {}) at index {}", *fill, it - c.values.begin()));
  }
  return c;
}

// A coordinate: at least two values, finite, strictly increasing, >= 0 (or > 0 with `positive`).
void check_coordinate(const std::vector<double>& x, const std::string& name, bool positive, const std::string& file) {
  if (x.size() < 2) fail(file, name, fmt::format("needs at least 2 values, has {}", x.size()));
  for (std::size_t i = 0; i < x.size(); ++i) {
    if (!std::isfinite(x[i]) || x[i] < 0.0 || (positive && x[i] == 0.0))
      fail(file, name, fmt::format("value at index {} is {}: must be finite and {}", i, x[i], positive ? "> 0" : ">= 0"));
    if (i > 0 && !(x[i] > x[i - 1]))
      fail(file, name,
           fmt::format("must be strictly increasing: index {} has {}, index {} has {}", i - 1, x[i - 1], i, x[i]));
  }
}

void check_irradiance(const std::vector<double>& e, const std::vector<double>& x, const char* x_name, const char* x_units,
                      const std::string& file) {
  if (e.size() != x.size())
    fail(file, irradiance_name, fmt::format("has {} values, expected {} (one per {})", e.size(), x.size(), x_name));
  for (std::size_t i = 0; i < e.size(); ++i)
    if (!std::isfinite(e[i]) || e[i] < 0.0)
      fail(file, irradiance_name,
           fmt::format("value {} at index {} ({} {} {}): must be finite and >= 0", e[i], i, x_name, x[i], x_units));
}

// Factor from the wavelength unit to nm.
std::optional<double> wavelength_to_nm(const std::string& u) {
  if (u == "nm") return 1.0;
  if (one_of(u, {"um", "µm", "micron", "microns", "micrometer", "micrometre"})) return 1000.0;
  return std::nullopt;
}

// Factor from the irradiance unit to W m-2 nm-1 (wavelength form).
std::optional<double> per_wavelength_to_per_nm(const std::string& u) {
  if (one_of(u, {"W m-2 nm-1", "W/m2/nm", "W m^-2 nm^-1", "W m-2 nm^-1"})) return 1.0;
  if (one_of(u, {"W m-2 um-1", "W/m2/um", "W m^-2 um^-1", "W m-2 um^-1", "W m-2 µm-1", "W/m2/µm", "W m-2 micron-1"}))
    return 1e-3;
  return std::nullopt;
}

bool per_wavenumber(const std::string& u) {
  return one_of(u, {"W m-2 (cm-1)-1", "W m-2 cm", "W/m2/cm-1", "W m^-2 (cm^-1)^-1", "W m-2 (cm^-1)^-1", "W/(m2 cm-1)"});
}

SolarSpectrum read_wavenumber_form(const netCDF::NcFile& nc, const std::string& file) {
  Column1d nu = read_1d(nc, "wavenumber", "wavenumber", file);
  if (!one_of(nu.units, {"cm-1", "cm^-1", "1/cm", "cm**-1"}))
    fail(file, "wavenumber", fmt::format("units \"{}\" not accepted (expected \"cm-1\")", nu.units_raw));
  check_coordinate(nu.values, "wavenumber", false, file);
  Column1d e = read_1d(nc, irradiance_name, "wavenumber", file);
  if (!per_wavenumber(e.units))
    fail(file, irradiance_name,
         fmt::format("units \"{}\" not accepted on the wavenumber form (expected \"W m-2 (cm-1)-1\")", e.units_raw));
  check_irradiance(e.values, nu.values, "wavenumber", "cm-1", file);
  SolarSpectrum s;
  s.wavenumber_cm1 = std::move(nu.values);
  s.irradiance_w_m2_cm1 = std::move(e.values);
  return s;
}

SolarSpectrum read_wavelength_form(const netCDF::NcFile& nc, const std::string& file) {
  Column1d lambda = read_1d(nc, "wavelength", "wavelength", file);
  const auto to_nm = wavelength_to_nm(lambda.units);
  if (!to_nm) fail(file, "wavelength", fmt::format("units \"{}\" not accepted (expected \"nm\" or \"um\")", lambda.units_raw));
  check_coordinate(lambda.values, "wavelength", true, file);
  Column1d e = read_1d(nc, irradiance_name, "wavelength", file);
  const auto to_per_nm = per_wavelength_to_per_nm(e.units);
  if (!to_per_nm)
    fail(file, irradiance_name,
         fmt::format("units \"{}\" not accepted on the wavelength form (expected \"W m-2 nm-1\" or \"W m-2 um-1\")",
                     e.units_raw));
  check_irradiance(e.values, lambda.values, "wavelength", lambda.units_raw.c_str(), file);
  // E_nu |d nu| = E_lambda |d lambda| with nu = 1e7 / lambda_nm (cm-1 per nm^-1), so
  // |d lambda_nm / d nu| = 1e7 / nu^2 = lambda_nm^2 / 1e7 and E_nu = E_lambda,nm * lambda_nm^2 / 1e7.
  const std::size_t n = lambda.values.size();
  SolarSpectrum s;
  s.wavenumber_cm1.resize(n);
  s.irradiance_w_m2_cm1.resize(n);
  for (std::size_t i = 0; i < n; ++i) {
    const double nm = lambda.values[i] * *to_nm;
    const std::size_t j = n - 1 - i; // increasing wavelength is decreasing wavenumber
    s.wavenumber_cm1[j] = 1e7 / nm;
    s.irradiance_w_m2_cm1[j] = e.values[i] * *to_per_nm * nm * nm / 1e7;
  }
  return s;
}

} // namespace

double SolarSpectrum::irradiance(double nu_cm1) const noexcept {
  const std::vector<double>& x = wavenumber_cm1;
  const std::vector<double>& y = irradiance_w_m2_cm1;
  if (x.size() < 2 || y.size() != x.size() || !(nu_cm1 >= x.front() && nu_cm1 <= x.back())) return 0.0;
  if (nu_cm1 == x.back()) return y.back();
  // x[k] <= nu < x[k + 1]; at a file point f = 0, so the file's value comes back exactly.
  const auto k = static_cast<std::size_t>(std::upper_bound(x.begin(), x.end(), nu_cm1) - x.begin()) - 1;
  const double f = (nu_cm1 - x[k]) / (x[k + 1] - x[k]);
  return y[k] + f * (y[k + 1] - y[k]);
}

bool SolarSpectrum::covers(double lower_cm1, double upper_cm1) const noexcept {
  if (wavenumber_cm1.size() < 2) return false;
  const double lo = wavenumber_cm1.front(), hi = wavenumber_cm1.back();
  return lower_cm1 >= lo - 1e-9 * std::max(1.0, lo) && upper_cm1 <= hi + 1e-9 * std::max(1.0, hi);
}

double SolarSpectrum::total_w_m2() const noexcept {
  double sum = 0.0;
  for (std::size_t i = 1; i < wavenumber_cm1.size() && i < irradiance_w_m2_cm1.size(); ++i)
    sum += 0.5 * (irradiance_w_m2_cm1[i] + irradiance_w_m2_cm1[i - 1]) * (wavenumber_cm1[i] - wavenumber_cm1[i - 1]);
  return sum;
}

void validate(const SolarSpectrum& spectrum, const std::string& file) {
  check_coordinate(spectrum.wavenumber_cm1, "wavenumber", false, file);
  check_irradiance(spectrum.irradiance_w_m2_cm1, spectrum.wavenumber_cm1, "wavenumber", "cm-1", file);
}

SolarSpectrum read_solar_spectrum_file(const std::filesystem::path& path) {
  const std::string file = path.string();
  if (!std::filesystem::is_regular_file(path)) throw FileError(file, "no such solar spectrum file");
  SolarSpectrum s;
  try {
    netCDF::NcFile nc(file, netCDF::NcFile::read);
    const int ncid = nc.getId();
    int version = format_version;
    if (has_attribute(ncid, NC_GLOBAL, "solar_spectrum_format_version") &&
        (nc_get_att_int(ncid, NC_GLOBAL, "solar_spectrum_format_version", &version) != NC_NOERR ||
         version > format_version))
      fail(file, "solar_spectrum_format_version",
           fmt::format("format version {} is newer than this bandstack reads ({})", version, format_version));
    const bool has_nu = !nc.getVar("wavenumber").isNull();
    const bool has_lambda = !nc.getVar("wavelength").isNull();
    if (has_nu && has_lambda)
      fail(file, "wavelength", "give either a wavenumber or a wavelength coordinate, not both");
    if (!has_nu && !has_lambda)
      fail(file, "wavenumber",
           "missing coordinate variable: a solar spectrum file needs wavenumber(wavenumber) in cm-1 or "
           "wavelength(wavelength) in nm or um");
    s = has_nu ? read_wavenumber_form(nc, file) : read_wavelength_form(nc, file);
    if (auto v = text_attribute(ncid, NC_GLOBAL, "title", file, "title")) s.title = *v;
    if (auto v = text_attribute(ncid, NC_GLOBAL, "source", file, "source")) s.source = *v;
  } catch (const netCDF::exceptions::NcException& e) {
    std::string what = e.what();
    what = what.substr(0, what.find('\n'));
    throw FileError(file, "cannot read as a netCDF solar spectrum file: " + what);
  }
  validate(s, file);
  return s;
}

void write_solar_spectrum_file(const std::filesystem::path& path, const SolarSpectrum& spectrum) {
  validate(spectrum, path.string());
  io::AtomicOutput output(path);
  try {
    netCDF::NcFile nc(output.temporary_path().string(), netCDF::NcFile::replace, netCDF::NcFile::nc4);
    nc.putAtt("Conventions", "CF-1.8");
    nc.putAtt("title", spectrum.title);
    nc.putAtt("source", spectrum.source);
    nc.putAtt("history", fmt::format("written by bandstack {}", version()));
    nc.putAtt("solar_spectrum_format_version", netCDF::ncInt, format_version);
    const netCDF::NcDim dim = nc.addDim("wavenumber", spectrum.wavenumber_cm1.size());
    netCDF::NcVar nu = nc.addVar("wavenumber", netCDF::ncDouble, dim);
    nu.putAtt("units", "cm-1");
    nu.putAtt("long_name", "wavenumber");
    nu.putVar(spectrum.wavenumber_cm1.data());
    netCDF::NcVar e = nc.addVar(irradiance_name, netCDF::ncDouble, dim);
    e.putAtt("units", "W m-2 (cm-1)-1");
    e.putAtt("long_name", "solar spectral irradiance per unit wavenumber");
    e.putVar(spectrum.irradiance_w_m2_cm1.data());
    nc.close();
  } catch (const netCDF::exceptions::NcException& e) {
    std::string what = e.what();
    what = what.substr(0, what.find('\n'));
    throw FileError(path.string(), "cannot write the solar spectrum file: " + what);
  }
  output.commit();
}

} // namespace bandstack::spectral
