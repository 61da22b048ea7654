#include "bandstack/io/band_set_file.hpp"

#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "spectral/netcdf_truncation.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <ctime>
#include <fmt/format.h>
#include <netcdf.h>
#include <netcdf>
#include <optional>
#include <string>
#include <vector>

namespace bandstack::io {

namespace {

using netCDF::NcDim;
using netCDF::NcFile;
using netCDF::NcType;
using netCDF::NcVar;
using spectral::Absorber;
using spectral::BandSet;

// The format version in the global attribute `band_set_format`; bump when the layout changes.
constexpr int format_version = 1;

std::string absorber_units(Absorber a) { return spectral::scales_with_vapour_pressure(a) ? "m2 kg-1 Pa-1" : "m2 kg-1"; }

std::string utc_now() {
  const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
  std::tm tm{};
  gmtime_r(&now, &tm);
  char buffer[32];
  std::strftime(buffer, sizeof buffer, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buffer;
}

NcVar add_double(NcFile& file, const std::string& name, const std::vector<NcDim>& dims, const char* units,
                 const char* long_name) {
  NcVar var = file.addVar(name, netCDF::ncDouble, dims);
  if (units) var.putAtt("units", units);
  var.putAtt("long_name", long_name);
  return var;
}

void put_strings(NcVar var, const std::vector<std::string>& strings, std::size_t length) {
  std::vector<char> chars(strings.size() * length, '\0');
  for (std::size_t i = 0; i < strings.size(); ++i)
    std::copy(strings[i].begin(), strings[i].end(), chars.begin() + static_cast<long>(i * length));
  var.putVar(chars.data());
}

void write_contents(NcFile& file, const BandSet& set) {
  std::vector<Absorber> absorbers;
  for (Absorber a : spectral::all_absorbers)
    if (set.absorber_present[index(a)]) absorbers.push_back(a);
  const std::size_t n_g = set.gpoint_count();
  const std::size_t n_t = set.ref_temperature_k.size();
  const std::size_t n_p = set.ref_pressure_pa.size();

  const NcDim band = file.addDim("band", set.band_count());
  const NcDim gpoint = file.addDim("gpoint", n_g);
  const NcDim absorber = file.addDim("absorber", absorbers.size());
  const NcDim ref_pressure = file.addDim("ref_pressure", n_p);
  const NcDim ref_temperature = file.addDim("ref_temperature", n_t);
  const NcDim planck_temperature = file.addDim("planck_temperature", set.planck_temperature_k.size());
  std::vector<std::string> names, units;
  std::size_t length = 1;
  for (Absorber a : absorbers) {
    names.emplace_back(spectral::absorber_name(a));
    units.push_back(absorber_units(a));
    length = std::max({length, names.back().size(), units.back().size()});
  }
  const NcDim text = file.addDim("absorber_text_length", length);

  add_double(file, "band_lower_wavenumber", {band}, "cm-1", "lower edge of the band").putVar(set.band_lower_cm1.data());
  add_double(file, "band_upper_wavenumber", {band}, "cm-1", "upper edge of the band").putVar(set.band_upper_cm1.data());
  NcVar gpoint_band = file.addVar("gpoint_band", netCDF::ncInt, {gpoint});
  gpoint_band.putAtt("long_name", "band of the g-point (0-based index along dimension band)");
  std::vector<int> bands(set.gpoint_band.begin(), set.gpoint_band.end());
  gpoint_band.putVar(bands.data());
  add_double(file, "gpoint_weight", {gpoint}, "1", "share of the band's wavenumber interval the g-point stands for")
      .putVar(set.gpoint_weight.data());

  NcVar name_var = file.addVar("absorber_name", netCDF::ncChar, {absorber, text});
  name_var.putAtt("long_name", "absorber: a gas, or the water vapour self-continuum");
  put_strings(name_var, names, length);
  NcVar units_var = file.addVar("absorber_units", netCDF::ncChar, {absorber, text});
  units_var.putAtt("long_name", "units of absorption_coefficient for each absorber");
  put_strings(units_var, units, length);

  add_double(file, "ref_pressure", {ref_pressure}, "Pa", "reference pressure of the absorption tables")
      .putVar(set.ref_pressure_pa.data());
  add_double(file, "ref_temperature", {ref_temperature}, "K", "reference temperature of the absorption tables")
      .putVar(set.ref_temperature_k.data());
  add_double(file, "planck_temperature", {planck_temperature}, "K", "temperature of the Planck fraction table")
      .putVar(set.planck_temperature_k.data());

  NcVar kappa = add_double(file, "absorption_coefficient", {absorber, gpoint, ref_temperature, ref_pressure}, nullptr,
                           "mean absorption coefficient of the g-point's wavenumbers");
  kappa.putAtt("units_note", "per absorber, in variable absorber_units: gases in m2 per kg of the gas (tau = k m_gas); "
                             "h2o_self_continuum in m2 kg-1 Pa-1 (tau = k m_h2o e_h2o)");
  kappa.setCompression(true, true, 4);
  std::vector<double> table;
  table.reserve(absorbers.size() * n_g * n_t * n_p);
  for (Absorber a : absorbers) {
    const auto first = set.absorption_coefficient.begin() + static_cast<long>(index(a) * n_g * n_t * n_p);
    table.insert(table.end(), first, first + static_cast<long>(n_g * n_t * n_p));
  }
  kappa.putVar(table.data());
  add_double(file, "planck_fraction", {gpoint, planck_temperature}, "1",
             "share of the band's Planck integral emitted at the g-point's wavenumbers")
      .putVar(set.planck_fraction.data());
  // Shortwave sets only; a reader treats their absence as a longwave set.
  if (!set.solar_weight.empty())
    add_double(file, "solar_weight", {gpoint}, "1",
               "share of the solar flux at the top of the atmosphere on the g-point's wavenumbers")
        .putVar(set.solar_weight.data());
  if (!set.rayleigh_cross_section_m2_kg.empty())
    add_double(file, "rayleigh_cross_section", {gpoint}, "m2 kg-1",
               "solar-weighted mean Rayleigh scattering cross-section per unit mass of air")
        .putVar(set.rayleigh_cross_section_m2_kg.data());

  file.putAtt("Conventions", "CF-1.8");
  file.putAtt("title", "bandstack band set " + set.name);
  file.putAtt("band_set_format", netCDF::ncInt, format_version);
  file.putAtt("name", set.name);
  file.putAtt("source", set.source_description);
  file.putAtt("recipe_text", set.recipe_text);
  file.putAtt("builder_version", set.builder_version);
  file.putAtt("history", utc_now() + ": written by bandstack " + std::string(version()));
  file.putAtt("comment", std::string(caution_text()));
}

// ---- reading ----

class Reader {
public:
  Reader(const std::filesystem::path& path, const NcFile& file) : path_(path.string()), file_(file) {}

  [[noreturn]] void fail(const std::string& item, const std::string& message) const {
    throw InputError(InputPlace{path_, item, {}, {}, {}, {}}, message);
  }

  std::size_t dim(const std::string& name) const {
    const NcDim d = file_.getDim(name);
    if (d.isNull()) fail(name, "dimension missing: not a band-set file, or a damaged one");
    return d.getSize();
  }

  NcVar var(const std::string& name, const std::vector<std::string>& dims) const {
    const NcVar v = file_.getVar(name);
    if (v.isNull()) fail(name, "variable missing");
    std::vector<std::string> actual;
    for (const NcDim& d : v.getDims())
      actual.push_back(d.getName());
    if (actual != dims)
      fail(name, fmt::format("has dimensions ({}), expected ({})", fmt::join(actual, ", "), fmt::join(dims, ", ")));
    return v;
  }

  // Text of a variable's (varid) or the file's (NC_GLOBAL) attribute; nullopt if absent.
  std::optional<std::string> text_attribute(int varid, const std::string& name) const {
    nc_type type = 0;
    std::size_t length = 0;
    if (nc_inq_att(file_.getId(), varid, name.c_str(), &type, &length) != NC_NOERR) return std::nullopt;
    if (type == NC_CHAR) {
      std::string s(length, '\0');
      if (length > 0 && nc_get_att_text(file_.getId(), varid, name.c_str(), s.data()) != NC_NOERR) return std::nullopt;
      while (!s.empty() && s.back() == '\0')
        s.pop_back();
      return s;
    }
    if (type == NC_STRING && length == 1) {
      char* value = nullptr;
      if (nc_get_att_string(file_.getId(), varid, name.c_str(), &value) != NC_NOERR) return std::nullopt;
      std::string s = value ? value : "";
      nc_free_string(1, &value);
      return s;
    }
    fail(name, "attribute is not text");
  }

  // Values of variable `name` on `dims`; a count no band set could have (a damaged file) is refused before
  // anything is allocated for it.
  std::size_t value_count(const std::string& name, const std::vector<std::string>& dims) const {
    constexpr std::size_t max_values = std::size_t{1} << 27; // 1 GiB of doubles
    std::size_t size = 1;
    for (const std::string& d : dims) {
      const std::size_t n = dim(d);
      if (n != 0 && size > max_values / n)
        fail(name, fmt::format("has more than {} values (dimensions {}): not a plausible band set", max_values,
                               fmt::join(dims, " x ")));
      size *= n;
    }
    return size;
  }

  std::vector<double> doubles(const std::string& name, const std::vector<std::string>& dims, const char* units) const {
    const NcVar v = var(name, dims);
    const auto type = v.getType().getTypeClass();
    if (type == NcType::nc_CHAR || type == NcType::nc_STRING || type >= NcType::nc_VLEN) fail(name, "is not numeric");
    if (units) {
      const auto u = text_attribute(v.getId(), "units");
      if (!u) fail(name, fmt::format("units attribute missing, expected \"{}\"", units));
      if (*u != units) fail(name, fmt::format("units \"{}\", expected \"{}\"", *u, units));
    }
    const std::size_t size = value_count(name, dims);
    std::vector<double> values(size);
    if (size > 0) v.getVar(values.data());
    return values;
  }

  std::vector<std::string> strings(const std::string& name, const std::vector<std::string>& dims) const {
    const NcVar v = var(name, dims);
    if (v.getType().getTypeClass() != NcType::nc_CHAR) fail(name, "must be a character array");
    const std::size_t n = dim(dims[0]), length = dim(dims[1]);
    std::vector<char> chars(value_count(name, dims));
    if (!chars.empty()) v.getVar(chars.data());
    std::vector<std::string> out;
    for (std::size_t i = 0; i < n; ++i) {
      std::string s(chars.data() + i * length, length);
      s.erase(std::find(s.begin(), s.end(), '\0'), s.end());
      while (!s.empty() && s.back() == ' ')
        s.pop_back();
      out.push_back(s);
    }
    return out;
  }

  std::string global(const std::string& name) const {
    const auto value = text_attribute(NC_GLOBAL, name);
    if (!value) fail(name, "global attribute missing");
    return *value;
  }

private:
  std::string path_;
  const NcFile& file_;
};

BandSet read_contents(const std::filesystem::path& path, const NcFile& file) {
  const Reader r(path, file);
  int format = 0;
  if (nc_get_att_int(file.getId(), NC_GLOBAL, "band_set_format", &format) != NC_NOERR)
    r.fail("band_set_format", "global attribute missing: not a band-set file");
  if (format != format_version)
    r.fail("band_set_format",
           fmt::format("format version {} is not supported (this bandstack reads version {})", format, format_version));

  BandSet set;
  set.name = r.global("name");
  set.source_description = r.global("source");
  set.recipe_text = r.global("recipe_text");
  set.builder_version = r.global("builder_version");

  set.band_lower_cm1 = r.doubles("band_lower_wavenumber", {"band"}, "cm-1");
  set.band_upper_cm1 = r.doubles("band_upper_wavenumber", {"band"}, "cm-1");
  const std::vector<double> gpoint_band = r.doubles("gpoint_band", {"gpoint"}, nullptr);
  {
    const auto type = file.getVar("gpoint_band").getType().getTypeClass();
    if (type == NcType::nc_FLOAT || type == NcType::nc_DOUBLE) r.fail("gpoint_band", "must be an integer variable");
  }
  for (std::size_t g = 0; g < gpoint_band.size(); ++g) {
    if (!(gpoint_band[g] >= 0.0 && gpoint_band[g] < 1e9))
      r.fail("gpoint_band", fmt::format("index {}: band index {} is out of range", g, gpoint_band[g]));
    set.gpoint_band.push_back(static_cast<std::size_t>(gpoint_band[g]));
  }
  set.gpoint_weight = r.doubles("gpoint_weight", {"gpoint"}, "1");
  set.ref_pressure_pa = r.doubles("ref_pressure", {"ref_pressure"}, "Pa");
  set.ref_temperature_k = r.doubles("ref_temperature", {"ref_temperature"}, "K");
  set.planck_temperature_k = r.doubles("planck_temperature", {"planck_temperature"}, "K");
  set.planck_fraction = r.doubles("planck_fraction", {"gpoint", "planck_temperature"}, "1");
  if (!file.getVar("solar_weight").isNull()) set.solar_weight = r.doubles("solar_weight", {"gpoint"}, "1");
  if (!file.getVar("rayleigh_cross_section").isNull())
    set.rayleigh_cross_section_m2_kg = r.doubles("rayleigh_cross_section", {"gpoint"}, "m2 kg-1");

  const std::vector<std::string> names = r.strings("absorber_name", {"absorber", "absorber_text_length"});
  const std::vector<std::string> units = r.strings("absorber_units", {"absorber", "absorber_text_length"});
  std::vector<Absorber> absorbers;
  for (std::size_t i = 0; i < names.size(); ++i) {
    const auto a = spectral::absorber_from_name(names[i]);
    if (!a) r.fail("absorber_name", fmt::format("index {}: unknown absorber \"{}\"", i, names[i]));
    if (set.absorber_present[index(*a)])
      r.fail("absorber_name", fmt::format("index {}: absorber \"{}\" appears twice", i, names[i]));
    if (units[i] != absorber_units(*a))
      r.fail("absorber_units",
             fmt::format("index {} ({}): units \"{}\", expected \"{}\"", i, names[i], units[i], absorber_units(*a)));
    set.absorber_present[index(*a)] = true;
    absorbers.push_back(*a);
  }
  const std::vector<double> table =
      r.doubles("absorption_coefficient", {"absorber", "gpoint", "ref_temperature", "ref_pressure"}, nullptr);
  const std::size_t block = set.gpoint_count() * set.ref_temperature_k.size() * set.ref_pressure_pa.size();
  set.absorption_coefficient.assign(spectral::absorber_count * block, 0.0);
  for (std::size_t i = 0; i < absorbers.size(); ++i)
    std::copy_n(table.begin() + static_cast<long>(i * block), block,
                set.absorption_coefficient.begin() + static_cast<long>(index(absorbers[i]) * block));
  return set;
}

} // namespace

void write_band_set(const std::filesystem::path& path, const BandSet& set) {
  spectral::validate(set, path.string());
  if (std::none_of(set.absorber_present.begin(), set.absorber_present.end(), [](bool p) { return p; }))
    throw InputError(InputPlace{path.string(), "absorber", {}, {}, {}, {}}, "the band set has no absorbers");
  AtomicOutput out(path);
  try {
    NcFile file(out.temporary_path().string(), NcFile::replace, NcFile::nc4);
    write_contents(file, set);
    file.close();
  } catch (const netCDF::exceptions::NcException& e) {
    throw FileError(path.string(), std::string("netCDF error while writing the band set: ") + first_line(e.what()));
  }
  out.commit();
}

BandSet read_band_set(const std::filesystem::path& path) {
  std::error_code ec;
  if (!std::filesystem::exists(path, ec)) throw FileError(path.string(), "the band-set file does not exist");
  if (std::filesystem::is_directory(path, ec)) throw FileError(path.string(), "is a folder, not a band-set file");
  spectral::detail::check_classic_file(path, path.string());
  BandSet set;
  try {
    const NcFile file(path.string(), NcFile::read);
    set = read_contents(path, file);
  } catch (const netCDF::exceptions::NcException& e) {
    throw FileError(path.string(),
                    std::string("cannot read as a netCDF band-set file (not netCDF, or damaged): ") + first_line(e.what()));
  }
  spectral::validate(set, path.string());
  return set;
}

} // namespace bandstack::io
