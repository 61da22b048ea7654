#include "bandstack/io/result_writer.hpp"

#include <chrono>
#include <ctime>
#include <functional>
#include <vector>

#include <fmt/format.h>
#include <netcdf>

#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "bandstack/thermo/humidity.hpp"

namespace bandstack::io {

namespace {

using netCDF::NcDim;
using netCDF::NcFile;
using netCDF::NcVar;

struct Attributes {
  const char* units;
  const char* long_name;
  const char* standard_name; // nullptr where CF has none
};

NcVar add_variable(NcFile& file, const std::string& name, const std::vector<NcDim>& dims, const Attributes& a) {
  NcVar var = file.addVar(name, netCDF::ncDouble, dims);
  var.putAtt("units", a.units);
  var.putAtt("long_name", a.long_name);
  if (a.standard_name) var.putAtt("standard_name", a.standard_name);
  if (dims.front().getName() == "column") var.putAtt("coordinates", "column_name");
  return var;
}

// Gathers one value per column (or per column and level/layer) into a row-major buffer.
void put_per_column(NcVar var, std::span<const batch::ColumnResult> results,
                    const std::function<double(const batch::ColumnResult&)>& get) {
  std::vector<double> data;
  data.reserve(results.size());
  for (const auto& r : results) data.push_back(get(r));
  var.putVar(data.data());
}

void put_profile(NcVar var, std::span<const batch::ColumnResult> results, std::size_t length,
                 const std::function<const std::vector<double>&(const batch::ColumnResult&)>& get) {
  std::vector<double> data;
  data.reserve(results.size() * length);
  for (const auto& r : results) {
    const std::vector<double>& v = get(r);
    if (v.size() != length) throw InternalError("profile length mismatch while writing " + var.getName());
    data.insert(data.end(), v.begin(), v.end());
  }
  var.putVar(data.data());
}

std::string utc_now() {
  const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
  std::tm tm{};
  gmtime_r(&now, &tm);
  char buffer[32];
  std::strftime(buffer, sizeof buffer, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buffer;
}

const char* gas_standard_name(Gas g) {
  switch (g) {
  case Gas::co2: return "mole_fraction_of_carbon_dioxide_in_air";
  case Gas::o3: return "mole_fraction_of_ozone_in_air";
  case Gas::ch4: return "mole_fraction_of_methane_in_air";
  case Gas::n2o: return "mole_fraction_of_nitrous_oxide_in_air";
  case Gas::h2o: return nullptr; // water is also written as specific_humidity, which CF names
  }
  return nullptr;
}

// Longwave results by band: a CF coordinate `band_lw` (band centre, cm-1) with bounds, and the
// by-band fluxes and heating rates.
void write_longwave_bands(NcFile& file, std::span<const batch::ColumnResult> results, const NcDim& column,
                          const NcDim& level, const NcDim& layer) {
  const solvers::LongwaveResult& first = results.front().longwave;
  const std::size_t n_band = first.band_count();
  const std::size_t n_level = level.getSize();
  const std::size_t n_layer = layer.getSize();
  const NcDim band = file.addDim("band_lw", n_band);
  const NcDim bounds = file.addDim("bounds", 2);
  std::vector<double> centre(n_band), edges(2 * n_band);
  for (std::size_t b = 0; b < n_band; ++b) {
    centre[b] = 0.5 * (first.band_lower_cm1[b] + first.band_upper_cm1[b]);
    edges[2 * b] = first.band_lower_cm1[b];
    edges[2 * b + 1] = first.band_upper_cm1[b];
  }
  NcVar coord = file.addVar("band_lw", netCDF::ncDouble, band);
  coord.putAtt("units", "cm-1");
  coord.putAtt("long_name", "centre wavenumber of the longwave band");
  coord.putAtt("bounds", "band_lw_bounds");
  coord.putVar(centre.data());
  NcVar bound = file.addVar("band_lw_bounds", netCDF::ncDouble, {band, bounds});
  bound.putAtt("units", "cm-1");
  bound.putAtt("long_name", "lower and upper wavenumber of the longwave band");
  bound.putVar(edges.data());

  std::vector<double> up, down, heating;
  for (std::size_t c = 0; c < results.size(); ++c) {
    const solvers::LongwaveResult& lw = results[c].longwave;
    if (lw.band_lower_cm1 != first.band_lower_cm1 || lw.band_upper_cm1 != first.band_upper_cm1)
      throw InternalError("all columns of one result file must use the same longwave bands");
    BANDSTACK_ASSERT(lw.flux_up_by_band.size() == n_band * n_level && lw.heating_rate_by_band.size() == n_band * n_layer);
    up.insert(up.end(), lw.flux_up_by_band.begin(), lw.flux_up_by_band.end());
    down.insert(down.end(), lw.flux_down_by_band.begin(), lw.flux_down_by_band.end());
    heating.insert(heating.end(), lw.heating_rate_by_band.begin(), lw.heating_rate_by_band.end());
  }
  add_variable(file, "lw_flux_up_by_band", {column, band, level}, {"W m-2", "upwelling longwave flux in each band", nullptr})
      .putVar(up.data());
  add_variable(file, "lw_flux_down_by_band", {column, band, level}, {"W m-2", "downwelling longwave flux in each band", nullptr})
      .putVar(down.data());
  add_variable(file, "lw_heating_rate_by_band", {column, band, layer}, {"K day-1", "longwave radiative heating rate in each band", nullptr})
      .putVar(heating.data());
}

void write_contents(NcFile& file, std::span<const batch::ColumnResult> results, const RunInfo& info) {
  const std::size_t n_columns = results.size();
  const std::size_t n_layers = results.front().column.layer_count();
  std::size_t name_length = 1;
  for (const auto& r : results) name_length = std::max(name_length, r.column.name.size());

  const NcDim column = file.addDim("column", n_columns);
  const NcDim level = file.addDim("level", n_layers + 1);
  const NcDim layer = file.addDim("layer", n_layers);
  const NcDim name_dim = file.addDim("name_length", name_length);

  NcVar names = file.addVar("column_name", netCDF::ncChar, {column, name_dim});
  names.putAtt("long_name", "column label from the study");
  std::vector<char> chars(n_columns * name_length, '\0');
  for (std::size_t c = 0; c < n_columns; ++c)
    std::copy(results[c].column.name.begin(), results[c].column.name.end(), chars.begin() + static_cast<long>(c * name_length));
  names.putVar(chars.data());

  using R = batch::ColumnResult;
  const std::vector<NcDim> per_level{column, level};
  const std::vector<NcDim> per_layer{column, layer};
  put_profile(add_variable(file, "pressure_level", per_level, {"Pa", "air pressure at layer interfaces (level 0 = top of atmosphere)", "air_pressure"}),
              results, n_layers + 1, [](const R& r) -> const auto& { return r.column.pressure_level_pa; });
  put_profile(add_variable(file, "temperature_level", per_level, {"K", "air temperature at layer interfaces", "air_temperature"}),
              results, n_layers + 1, [](const R& r) -> const auto& { return r.column.temperature_level_k; });
  put_profile(add_variable(file, "pressure_layer", per_layer, {"Pa", "mean air pressure of the layer", "air_pressure"}),
              results, n_layers, [](const R& r) -> const auto& { return r.column.pressure_layer_pa; });
  put_profile(add_variable(file, "temperature_layer", per_layer, {"K", "air temperature of the layer", "air_temperature"}),
              results, n_layers, [](const R& r) -> const auto& { return r.column.temperature_layer_k; });
  for (Gas g : all_gases) {
    const std::string name = std::string(gas_name(g)) + "_mole_fraction";
    const std::string long_name = std::string(gas_name(g)) + " mole fraction in moist air";
    put_profile(add_variable(file, name, per_layer, {"mol mol-1", long_name.c_str(), gas_standard_name(g)}), results, n_layers,
                [g](const R& r) -> const auto& { return r.column.gas(g); });
  }
  std::vector<std::vector<double>> specific_humidity;
  for (const auto& r : results) {
    std::vector<double> q;
    for (double x : r.column.gas(Gas::h2o)) q.push_back(thermo::specific_humidity_from_mole_fraction(x));
    specific_humidity.push_back(std::move(q));
  }
  {
    std::vector<double> flat;
    for (const auto& q : specific_humidity) flat.insert(flat.end(), q.begin(), q.end());
    add_variable(file, "specific_humidity", per_layer, {"kg kg-1", "mass of water vapour per mass of moist air", "specific_humidity"})
        .putVar(flat.data());
  }

  put_profile(add_variable(file, "lw_flux_up", per_level, {"W m-2", "upwelling longwave flux", "upwelling_longwave_flux_in_air"}),
              results, n_layers + 1, [](const R& r) -> const auto& { return r.longwave.flux_up; });
  put_profile(add_variable(file, "lw_flux_down", per_level, {"W m-2", "downwelling longwave flux", "downwelling_longwave_flux_in_air"}),
              results, n_layers + 1, [](const R& r) -> const auto& { return r.longwave.flux_down; });
  put_profile(add_variable(file, "lw_heating_rate", per_layer,
                           {"K day-1", "longwave radiative heating rate", "tendency_of_air_temperature_due_to_longwave_heating"}),
              results, n_layers, [](const R& r) -> const auto& { return r.longwave.heating_rate_k_day; });

  if (results.front().longwave.band_count() > 0) write_longwave_bands(file, results, column, level, layer);

  const std::vector<NcDim> scalar{column};
  put_per_column(add_variable(file, "olr", scalar, {"W m-2", "outgoing longwave radiation at the top of the atmosphere", "toa_outgoing_longwave_flux"}),
                 results, [](const R& r) { return r.longwave.olr(); });
  put_per_column(add_variable(file, "surface_lw_flux_down", scalar,
                              {"W m-2", "downwelling longwave flux at the surface", "surface_downwelling_longwave_flux_in_air"}),
                 results, [](const R& r) { return r.longwave.surface_down(); });
  put_per_column(add_variable(file, "surface_temperature", scalar, {"K", "surface skin temperature", "surface_temperature"}),
                 results, [](const R& r) { return r.column.surface_temperature_k; });
  put_per_column(add_variable(file, "surface_emissivity", scalar, {"1", "broadband longwave emissivity of the surface", nullptr}),
                 results, [](const R& r) { return r.column.surface_emissivity; });
  put_per_column(add_variable(file, "surface_albedo", scalar, {"1", "broadband shortwave albedo of the surface", "surface_albedo"}),
                 results, [](const R& r) { return r.column.surface_albedo; });

  file.putAtt("Conventions", "CF-1.8");
  file.putAtt("title", info.title.empty() ? std::string("bandstack results") : info.title);
  file.putAtt("source", std::string("bandstack ") + std::string(version()));
  file.putAtt("history", utc_now() + ": " + (info.command_line.empty() ? std::string("bandstack") : info.command_line));
  file.putAtt("study_file", info.study_file.empty() ? std::string("(built-in demo)") : info.study_file);
  file.putAtt("study_text", info.study_text);
  file.putAtt("longwave_method", info.longwave_method);
  file.putAtt("vertical_index_convention", "level and layer index 0 is the top of the atmosphere; the last level is the surface");
  file.putAtt("comment", std::string(caution_text()));
}

} // namespace

void write_result_file(const std::filesystem::path& path, std::span<const batch::ColumnResult> results, const RunInfo& info) {
  if (results.empty()) throw InputError(InputPlace{path.string(), "", {}, {}, {}, {}}, "nothing to write: the run has no columns");
  const std::size_t levels = results.front().column.level_count();
  for (std::size_t c = 0; c < results.size(); ++c)
    if (results[c].column.level_count() != levels)
      throw InputError(InputPlace{path.string(), "level", {}, {}, static_cast<long>(c), {}},
                       fmt::format("all columns of one file need the same number of levels ({} here, {} in column 0)",
                                   results[c].column.level_count(), levels));
  AtomicOutput out(path);
  try {
    NcFile file(out.temporary_path().string(), NcFile::replace, NcFile::nc4);
    write_contents(file, results, info);
    file.close();
  } catch (const netCDF::exceptions::NcException& e) {
    throw FileError(path.string(), std::string("netCDF error while writing: ") + e.what());
  }
  out.commit();
}

} // namespace bandstack::io
