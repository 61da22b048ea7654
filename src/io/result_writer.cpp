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
#include "io/netcdf_put.hpp"

namespace bandstack::io {

namespace {

using netCDF::NcDim;
using netCDF::NcFile;
using netCDF::NcVar;
using detail::add_variable;
using detail::put_per_column;
using detail::put_profile;
using detail::write_longwave;
using detail::write_shortwave;

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

// The leading dimensions with their coordinates.
detail::Lead write_axes(NcFile& file, std::span<const OutputAxis> axes) {
  detail::Lead lead;
  for (const OutputAxis& axis : axes) {
    const NcDim dim = file.addDim(axis.name, axis.size);
    lead.dims.push_back(dim);
    if (!axis.values.empty()) {
      NcVar coord = file.addVar(axis.name, netCDF::ncDouble, dim);
      for (const auto& [key, value] : axis.attributes) coord.putAtt(key, value);
      coord.putVar(axis.values.data());
    }
    if (!axis.labels.empty()) {
      const std::string var_name = axis.name + "_name";
      std::size_t length = 1;
      for (const std::string& l : axis.labels) length = std::max(length, l.size());
      // "name_length" for the columns' labels (the established name), <name>_name_length otherwise.
      const NcDim chars = file.addDim(axis.name == "column" ? std::string("name_length") : var_name + "_length", length);
      NcVar names = file.addVar(var_name, netCDF::ncChar, {dim, chars});
      names.putAtt("long_name", axis.name == "column" ? std::string("column label from the study") : axis.name + " label");
      std::vector<char> text(axis.size * length, '\0');
      for (std::size_t i = 0; i < axis.size; ++i)
        std::copy(axis.labels[i].begin(), axis.labels[i].end(), text.begin() + static_cast<long>(i * length));
      names.putVar(text.data());
      lead.coordinates += (lead.coordinates.empty() ? "" : " ") + var_name;
    }
  }
  return lead;
}

void write_contents(NcFile& file, std::span<const batch::ColumnResult> results, const RunInfo& info,
                    std::span<const OutputAxis> axes) {
  const std::size_t n_layers = results.front().column.layer_count();
  const detail::Lead lead = write_axes(file, axes);
  const NcDim level = file.addDim("level", n_layers + 1);
  const NcDim layer = file.addDim("layer", n_layers);

  using R = batch::ColumnResult;
  const std::vector<NcDim> per_level = lead.with({level});
  const std::vector<NcDim> per_layer = lead.with({layer});
  const std::string& coordinates = lead.coordinates;
  put_profile(add_variable(file, "pressure_level", per_level, {"Pa", "air pressure at layer interfaces (level 0 = top of atmosphere)", "air_pressure"}, coordinates),
              results, n_layers + 1, [](const R& r) -> const auto& { return r.column.pressure_level_pa; });
  put_profile(add_variable(file, "temperature_level", per_level, {"K", "air temperature at layer interfaces", "air_temperature"}, coordinates),
              results, n_layers + 1, [](const R& r) -> const auto& { return r.column.temperature_level_k; });
  put_profile(add_variable(file, "pressure_layer", per_layer, {"Pa", "mean air pressure of the layer", "air_pressure"}, coordinates),
              results, n_layers, [](const R& r) -> const auto& { return r.column.pressure_layer_pa; });
  put_profile(add_variable(file, "temperature_layer", per_layer, {"K", "air temperature of the layer", "air_temperature"}, coordinates),
              results, n_layers, [](const R& r) -> const auto& { return r.column.temperature_layer_k; });
  for (Gas g : all_gases) {
    const std::string name = std::string(gas_name(g)) + "_mole_fraction";
    const std::string long_name = std::string(gas_name(g)) + " mole fraction in moist air";
    put_profile(add_variable(file, name, per_layer, {"mol mol-1", long_name.c_str(), gas_standard_name(g)}, coordinates), results, n_layers,
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
    add_variable(file, "specific_humidity", per_layer, {"kg kg-1", "mass of water vapour per mass of moist air", "specific_humidity"}, coordinates)
        .putVar(flat.data());
  }

  write_longwave(file, results, lead, level, layer);
  write_shortwave(file, results, lead, level, layer);
  detail::write_equilibrium(file, results, lead, layer);
  detail::write_experiments(file, results, info.experiment_names, lead, layer);
  detail::write_attribution(file, results, lead);

  const std::vector<NcDim> scalar = lead.dims;
  put_per_column(add_variable(file, "surface_temperature", scalar, {"K", "surface skin temperature", "surface_temperature"}, coordinates),
                 results, [](const R& r) { return r.column.surface_temperature_k; });
  // A swept surface property is already the coordinate variable of its own dimension.
  const auto swept = [&](const char* name) { return !file.getVar(name).isNull(); };
  if (!swept("surface_emissivity"))
    put_per_column(add_variable(file, "surface_emissivity", scalar, {"1", "broadband longwave emissivity of the surface", nullptr}, coordinates),
                   results, [](const R& r) { return r.column.surface_emissivity; });
  if (!swept("surface_albedo"))
    put_per_column(add_variable(file, "surface_albedo", scalar, {"1", "broadband shortwave albedo of the surface", "surface_albedo"}, coordinates),
                   results, [](const R& r) { return r.column.surface_albedo; });

  file.putAtt("Conventions", "CF-1.8");
  file.putAtt("title", info.title.empty() ? std::string("bandstack results") : info.title);
  file.putAtt("source", std::string("bandstack ") + std::string(version()));
  file.putAtt("history", utc_now() + ": " + (info.command_line.empty() ? std::string("bandstack") : info.command_line));
  file.putAtt("study_file", info.study_file.empty() ? std::string("(built-in demo)") : info.study_file);
  file.putAtt("study_text", info.study_text);
  file.putAtt("longwave_method", info.longwave_method);
  if (!info.shortwave_method.empty()) file.putAtt("shortwave_method", info.shortwave_method);
  if (!info.equilibrium_method.empty()) file.putAtt("equilibrium_method", info.equilibrium_method);
  file.putAtt("vertical_index_convention", "level and layer index 0 is the top of the atmosphere; the last level is the surface");
  file.putAtt("comment", std::string(caution_text()));
}

} // namespace

void write_result_file(const std::filesystem::path& path, std::span<const batch::ColumnResult> results, const RunInfo& info,
                       std::span<const OutputAxis> axes) {
  if (results.empty()) throw InputError(InputPlace{path.string(), "", {}, {}, {}, {}}, "nothing to write: the run has no columns");
  const std::size_t levels = results.front().column.level_count();
  for (std::size_t c = 0; c < results.size(); ++c)
    if (results[c].column.level_count() != levels)
      throw InputError(InputPlace{path.string(), "level", {}, {}, static_cast<long>(c), {}},
                       fmt::format("all columns of one file need the same number of levels ({} here, {} in column 0)",
                                   results[c].column.level_count(), levels));
  std::vector<OutputAxis> default_axes;
  if (axes.empty()) {
    OutputAxis column;
    column.name = "column";
    column.size = results.size();
    for (const auto& r : results) column.labels.push_back(r.column.name);
    default_axes.push_back(std::move(column));
    axes = default_axes;
  }
  std::size_t points = 1;
  for (const OutputAxis& a : axes) points *= a.size;
  if (points != results.size())
    throw InternalError(fmt::format("the output axes hold {} columns, the run has {}", points, results.size()));
  AtomicOutput out(path);
  try {
    NcFile file(out.temporary_path().string(), NcFile::replace, NcFile::nc4);
    write_contents(file, results, info, axes);
    file.close();
  } catch (const netCDF::exceptions::NcException& e) {
    throw FileError(path.string(), std::string("netCDF error while writing: ") + first_line(e.what()));
  }
  out.commit();
}

} // namespace bandstack::io
