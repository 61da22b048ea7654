#include "bandstack/io/result_writer.hpp"

#include <algorithm>
#include <chrono>
#include <ctime>
#include <vector>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "bandstack/thermo/humidity.hpp"
#include "io/result_define.hpp"

namespace bandstack::io {

namespace detail {

namespace {

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

// The column state: pressures, temperatures, gases.
void describe_state(Table& t) {
  t.profile("pressure_level", "level", {"Pa", "air pressure at layer interfaces (level 0 = top of atmosphere)", "air_pressure"},
            [](const R& r) -> const auto& { return r.column.pressure_level_pa; });
  t.profile("temperature_level", "level", {"K", "air temperature at layer interfaces", "air_temperature"},
            [](const R& r) -> const auto& { return r.column.temperature_level_k; });
  t.profile("pressure_layer", "layer", {"Pa", "mean air pressure of the layer", "air_pressure"},
            [](const R& r) -> const auto& { return r.column.pressure_layer_pa; });
  t.profile("temperature_layer", "layer", {"K", "air temperature of the layer", "air_temperature"},
            [](const R& r) -> const auto& { return r.column.temperature_layer_k; });
  for (Gas g : all_gases) {
    const std::string name = std::string(gas_name(g)) + "_mole_fraction";
    const std::string long_name = std::string(gas_name(g)) + " mole fraction in moist air";
    t.profile(name, "layer", {"mol mol-1", long_name.c_str(), gas_standard_name(g)},
              [g](const R& r) -> const auto& { return r.column.gas(g); });
  }
  t.add("specific_humidity", {"layer"}, {"kg kg-1", "mass of water vapour per mass of moist air", "specific_humidity"}).get =
      [n = t.dim_size("layer")](const R& r, double* out) {
        const std::vector<double>& x = r.column.gas(Gas::h2o);
        if (x.size() != n) throw InternalError("profile length mismatch while writing specific_humidity");
        for (std::size_t i = 0; i < n; ++i) out[i] = thermo::specific_humidity_from_mole_fraction(x[i]);
      };
}

// Surface values; a swept surface property is already the coordinate variable of its own dimension.
void describe_surface(Table& t, std::span<const OutputAxis> axes) {
  const auto swept = [&](const char* name) {
    return std::any_of(axes.begin(), axes.end(), [&](const OutputAxis& a) { return a.name == name && !a.values.empty(); });
  };
  t.scalar("surface_temperature", {"K", "surface skin temperature", "surface_temperature"},
           [](const R& r) { return r.column.surface_temperature_k; });
  if (!swept("surface_emissivity"))
    t.scalar("surface_emissivity", {"1", "broadband longwave emissivity of the surface", nullptr},
             [](const R& r) { return r.column.surface_emissivity; });
  if (!swept("surface_albedo"))
    t.scalar("surface_albedo", {"1", "broadband shortwave albedo of the surface", "surface_albedo"},
             [](const R& r) { return r.column.surface_albedo; });
}

} // namespace

std::vector<netCDF::NcDim> define_axes(netCDF::NcFile& file, std::span<const OutputAxis> axes) {
  std::vector<netCDF::NcDim> dims;
  for (const OutputAxis& axis : axes) {
    const netCDF::NcDim dim = file.addDim(axis.name, axis.size);
    dims.push_back(dim);
    if (!axis.values.empty()) {
      netCDF::NcVar coord = file.addVar(axis.name, netCDF::ncDouble, dim);
      for (const auto& [key, value] : axis.attributes) coord.putAtt(key, value);
      coord.putVar(axis.values.data());
    }
    if (!axis.labels.empty()) {
      const std::string var_name = axis.name + "_name";
      std::size_t length = 1;
      const std::string text = padded_names(axis.labels, length);
      // "name_length" for the columns' labels (the established name), <name>_name_length otherwise.
      const netCDF::NcDim chars = file.addDim(axis.name == "column" ? std::string("name_length") : var_name + "_length", length);
      netCDF::NcVar names = file.addVar(var_name, netCDF::ncChar, {dim, chars});
      names.putAtt("long_name", axis.name == "column" ? std::string("column label from the study") : axis.name + " label");
      names.putVar(text.data());
    }
  }
  return dims;
}

Table describe_result(const R& sample, const RunInfo& info, std::span<const OutputAxis> axes) {
  Table t;
  for (const OutputAxis& axis : axes)
    if (!axis.labels.empty()) t.coordinates += (t.coordinates.empty() ? "" : " ") + axis.name + "_name";
  const std::size_t n_layers = sample.column.layer_count();
  t.add_dim("level", n_layers + 1);
  t.add_dim("layer", n_layers);
  describe_state(t);
  describe_longwave(t, sample);
  describe_shortwave(t, sample);
  describe_equilibrium(t, sample);
  describe_experiments(t, sample, info.experiment_names);
  describe_attribution(t, sample);
  describe_surface(t, axes);
  Variable status;
  status.name = "column_status";
  status.storage = Storage::i8;
  status.of_failed_columns = true;
  status.flag_values = {0, 1, 2};
  status.attributes = {{"long_name", "whether the column was computed"},
                       {"flag_meanings", "ok invalid_input not_converged"},
                       {"comment", "a failed column's other variables hold missing values; column_error says why"}};
  if (!t.coordinates.empty()) status.attributes.emplace_back("coordinates", t.coordinates);
  status.get = [](const R& r, double* out) { *out = static_cast<double>(r.status); };
  t.variables.push_back(std::move(status));
  return t;
}

void put_global_attributes(netCDF::NcFile& file, const RunInfo& info) {
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

} // namespace detail

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
  {
    ResultFileWriter writer(out.temporary_path(), results.front(), info, axes);
    writer.write_block(0, results);
    writer.close();
  }
  out.commit();
}

} // namespace bandstack::io
