#include "bandstack/io/sweep.hpp"

#include <algorithm>
#include <memory>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/core/units.hpp"
#include "bandstack/io/profile_sun.hpp"
#include "io/study_climate.hpp"

namespace bandstack::io {

const std::vector<SweepKey>& sweep_keys() {
  // Ranges as read_column in study.cpp checks them.
  static const std::vector<SweepKey> keys{
      {"surface_temperature_k", 150.0, 330.0, "K", "surface temperature of the column"},
      {"surface_relative_humidity", 0.0, 1.0, "1", "surface relative humidity of the Manabe-Wetherald profile"},
      {"stratospheric_h2o_ppmv", 0.0, 1e4, "1e-6", "stratospheric water vapour mole fraction"},
      {"co2_ppmv", 0.0, 1e5, "1e-6", "carbon dioxide mole fraction"},
      {"ch4_ppmv", 0.0, 1e5, "1e-6", "methane mole fraction"},
      {"n2o_ppmv", 0.0, 1e5, "1e-6", "nitrous oxide mole fraction"},
      {"ozone_scale", 0.0, 100.0, "1", "factor on the analytic ozone profile"},
      {"surface_emissivity", 0.0, 1.0, "1", "broadband longwave emissivity of the surface"},
      {"surface_albedo", 0.0, 1.0, "1", "broadband shortwave albedo of the surface"},
      {"cos_zenith", 0.0, 1.0, "1", "cosine of the solar zenith angle"},
      {"latitude_deg", -90.0, 90.0, "degrees_north", "latitude of the Sun's position calculation"},
      {"day_of_year", 1.0, 366.0, "1", "day of the year of the Sun's position calculation"},
      {"local_solar_time_h", 0.0, 24.0, "hour", "local solar time of the Sun's position calculation"},
      // Study-level settings, per column.
      {"solar_constant_w_m2", 0.0, 1e5, "W m-2", "total solar irradiance at 1 au"},
      {"critical_lapse_rate_k_per_km", 0.1, 30.0, "K km-1", "critical lapse rate of the convective adjustment"},
  };
  return keys;
}

const SweepKey* find_sweep_key(std::string_view key) {
  for (const SweepKey& k : sweep_keys())
    if (k.key == key) return &k;
  return nullptr;
}

void set_column_value(ColumnSpec& spec, std::string_view key, double value) {
  spec.swept_values.emplace_back(std::string(key), value);
  atmosphere::ProfileSettings& s = spec.settings;
  SunSpec& sun = spec.sun;
  if (key == "surface_temperature_k") s.surface_temperature_k = value;
  else if (key == "surface_relative_humidity") s.surface_relative_humidity = value;
  else if (key == "stratospheric_h2o_ppmv") s.stratospheric_h2o_mole_fraction = units::ppmv_to_mole_fraction(value);
  else if (key == "co2_ppmv") s.co2_mole_fraction = units::ppmv_to_mole_fraction(value);
  else if (key == "ch4_ppmv") s.ch4_mole_fraction = units::ppmv_to_mole_fraction(value);
  else if (key == "n2o_ppmv") s.n2o_mole_fraction = units::ppmv_to_mole_fraction(value);
  else if (key == "ozone_scale") s.ozone_scale = value;
  else if (key == "surface_emissivity") s.surface_emissivity = value;
  else if (key == "surface_albedo") s.surface_albedo = value;
  else if (key == "cos_zenith") sun = SunSpec{value, std::nullopt, std::nullopt, std::nullopt, std::nullopt};
  else if (key == "latitude_deg") { sun.latitude_deg = value; sun.cos_zenith.reset(); }
  else if (key == "day_of_year") { sun.day_of_year = value; sun.cos_zenith.reset(); }
  else if (key == "local_solar_time_h") { sun.local_solar_time_h = value; sun.cos_zenith.reset(); }
  else if (key == "solar_constant_w_m2") spec.solar_constant_w_m2 = value;
  else if (key == "critical_lapse_rate_k_per_km") spec.critical_lapse_rate_k_km = value;
  else throw InputError(InputPlace::of("sweeps.key"), fmt::format("\"{}\" cannot be swept", key));
}

namespace {

std::size_t sweep_points(const Study& study) {
  std::size_t n = 1;
  for (const SweepAxis& sweep : study.sweeps) n *= sweep.values.size();
  return n;
}

// A study whose one column is a profile file: the file's columns, with its leading dimensions as
// the output axes (a file without leading dimensions gives one "column"). The file is opened and
// checked, its values are read later, block by block.
ExpandedStudy expand_profile_file(const Study& study) {
  const ColumnSpec& spec = study.columns.front();
  const atmosphere::ProfileSettings& s = spec.settings;
  ProfileDefaults defaults;
  defaults.co2_mole_fraction = s.co2_mole_fraction;
  defaults.ch4_mole_fraction = s.ch4_mole_fraction;
  defaults.n2o_mole_fraction = s.n2o_mole_fraction;
  defaults.surface_emissivity = s.surface_emissivity;
  defaults.surface_albedo = s.surface_albedo;
  ExpandedStudy out;
  out.profile = std::make_shared<const ProfileReader>(spec.profile_file, spec.profile_variables, defaults);
  out.study = study;
  out.study.columns.front().profile_column_count = out.profile->column_count();
  // As the study parser limits built-in columns x sweeps (io/study_climate.hpp): a file whose
  // dimensions promise more columns than a run can compute is refused at once.
  const double columns = static_cast<double>(out.profile->column_count()) * static_cast<double>(sweep_points(study));
  if (columns > detail::max_study_columns)
    throw InputError(InputPlace{spec.profile_file.string(), "", {}, {}, {}, {}},
                     fmt::format("the profile file has {} columns{}: {:.0f} columns to compute, more than the {:.0f} one "
                                 "run may have",
                                 out.profile->column_count(),
                                 study.sweeps.empty() ? "" : fmt::format(" x {} sweep values", sweep_points(study)), columns,
                                 detail::max_study_columns));
  for (const LeadingAxis& a : out.profile->axes())
    out.axes.push_back(OutputAxis{a.name, a.size, a.values, {}, a.attributes});
  if (out.axes.empty()) out.axes.push_back(OutputAxis{"column", 1, {}, {spec.name}, {}});
  if (spec.sun.from_file) {
    out.sun = std::make_shared<const ProfileSun>(spec.profile_file, out.profile->axes(), *spec.sun.from_file);
    for (const SweepAxis& sweep : study.sweeps)
      if (sweep.key == "cos_zenith" || sweep.key == "latitude_deg" || sweep.key == "day_of_year" ||
          sweep.key == "local_solar_time_h")
        throw InputError(InputPlace{study.source_file, "sweeps.key", {}, {}, {}, {}},
                         fmt::format("\"{}\" cannot be swept on a column with sun_from_file (the file gives the Sun)",
                                     sweep.key));
  }
  // Sweeps cross the file's columns (built on demand by column_spec; study.sweeps is kept).
  for (const SweepAxis& sweep : study.sweeps) {
    const SweepKey* info = find_sweep_key(sweep.key);
    if (!info) throw InputError(InputPlace{study.source_file, "sweeps.key", {}, {}, {}, {}},
                                fmt::format("\"{}\" cannot be swept", sweep.key));
    out.axes.push_back(OutputAxis{sweep.key, sweep.values.size(), sweep.values, {},
                                  {{"units", std::string(info->units)}, {"long_name", std::string(info->long_name)}}});
  }
  return out;
}

bool from_profile_file(const Study& study) {
  return study.columns.size() == 1 && study.columns.front().profile_column_count > 0;
}

} // namespace

std::size_t column_count(const Study& study) {
  return (from_profile_file(study) ? study.columns.front().profile_column_count : study.columns.size()) *
         sweep_points(study);
}

std::size_t file_column_of(const Study& study, std::size_t i) {
  const std::size_t points = sweep_points(study);
  return points == 0 ? 0 : i / points;
}

ColumnSpec column_spec(const Study& study, std::size_t i) {
  std::size_t rest = i;
  std::vector<std::size_t> index(study.sweeps.size());
  for (std::size_t a = study.sweeps.size(); a-- > 0;) {
    index[a] = rest % study.sweeps[a].values.size();
    rest /= study.sweeps[a].values.size();
  }
  ColumnSpec spec;
  if (from_profile_file(study)) {
    const ColumnSpec& base = study.columns.front();
    if (rest >= base.profile_column_count) throw InternalError(fmt::format("column {} is not in the profile file", i));
    spec = base;
    spec.profile_column = rest;
    if (base.profile_column_count > 1) spec.name = fmt::format("{}[{}]", base.name, rest);
  } else {
    spec = study.columns.at(rest);
  }
  for (std::size_t a = 0; a < study.sweeps.size(); ++a)
    set_column_value(spec, study.sweeps[a].key, study.sweeps[a].values[index[a]]);
  return spec;
}

std::optional<SunSpec> file_sun(const ExpandedStudy& expanded, std::size_t c) {
  if (!expanded.sun) return std::nullopt;
  const ColumnSunPosition p = expanded.sun->position(c);
  SunSpec sun;
  sun.latitude_deg = p.latitude_deg;
  sun.day_of_year = p.day_of_year;
  if (expanded.sun->mode() == SunFromFile::instantaneous) sun.local_solar_time_h = p.local_solar_time_h;
  return sun;
}

std::vector<atmosphere::Column> read_profile_columns(const ExpandedStudy& expanded, std::size_t first,
                                                     std::size_t count) {
  if (!expanded.profile || count == 0) return {};
  const std::size_t begin = file_column_of(expanded.study, first);
  const std::size_t end = file_column_of(expanded.study, first + count - 1) + 1;
  return expanded.profile->read(begin, end - begin);
}

ExpandedStudy prepare_columns(const Study& study) {
  if (study.columns.size() == 1 && !study.columns.front().profile_file.empty()) return expand_profile_file(study);
  // The checks of the eager expansion depend on which keys are swept, not on their values: one value
  // per sweep is enough. The axes are built directly, without copying the study a second time.
  ExpandedStudy out;
  Study probe;
  probe.source_file = study.source_file;
  probe.columns = study.columns;
  for (const SweepAxis& sweep : study.sweeps)
    probe.sweeps.push_back(SweepAxis{sweep.key, {sweep.values.empty() ? 0.0 : sweep.values.front()}});
  out.axes = expand_sweeps(probe).axes;
  for (std::size_t a = 0; a < study.sweeps.size(); ++a) {
    out.axes[a + 1].size = study.sweeps[a].values.size();
    out.axes[a + 1].values = study.sweeps[a].values;
  }
  out.study = study;
  return out;
}

ExpandedStudy expand_sweeps(const Study& study) {
  if (study.columns.size() == 1 && !study.columns.front().profile_file.empty()) {
    ExpandedStudy out = expand_profile_file(study);
    const std::size_t n = column_count(out.study);
    std::vector<std::shared_ptr<const atmosphere::Column>> file_columns;
    for (atmosphere::Column& c : out.profile->read(0, out.profile->column_count()))
      file_columns.push_back(std::make_shared<const atmosphere::Column>(std::move(c)));
    std::vector<ColumnSpec> specs;
    specs.reserve(n);
    for (std::size_t i = 0; i < n; ++i) {
      specs.push_back(column_spec(out.study, i));
      ColumnSpec& spec = specs.back();
      spec.given_column = file_columns[*spec.profile_column];
      if (spec.sun.from_file) spec.sun = *file_sun(out, *spec.profile_column);
      spec.profile_column_count = 0;
    }
    out.study.columns = std::move(specs);
    out.study.sweeps.clear();
    out.profile.reset();
    out.sun.reset();
    return out;
  }
  ExpandedStudy out;
  out.study = study;
  out.study.sweeps.clear();
  OutputAxis column_axis;
  column_axis.name = "column";
  column_axis.size = study.columns.size();
  for (const ColumnSpec& spec : study.columns) column_axis.labels.push_back(spec.name);
  out.axes.push_back(std::move(column_axis));
  std::vector<ColumnSpec> specs = study.columns;
  for (std::size_t a = 0; a < study.sweeps.size(); ++a) {
    const SweepAxis& sweep = study.sweeps[a];
    const SweepKey* info = find_sweep_key(sweep.key);
    if (!info) throw InputError(InputPlace{study.source_file, fmt::format("sweeps[{}].key", a), {}, {}, {}, {}},
                                fmt::format("\"{}\" cannot be swept", sweep.key));
    OutputAxis axis;
    axis.name = sweep.key;
    axis.size = sweep.values.size();
    axis.values = sweep.values;
    axis.attributes = {{"units", std::string(info->units)}, {"long_name", std::string(info->long_name)}};
    out.axes.push_back(std::move(axis));
    std::vector<ColumnSpec> crossed;
    crossed.reserve(specs.size() * sweep.values.size());
    for (const ColumnSpec& spec : specs)
      for (double value : sweep.values) {
        ColumnSpec copy = spec;
        set_column_value(copy, sweep.key, value);
        crossed.push_back(std::move(copy));
      }
    specs = std::move(crossed);
  }
  for (std::size_t c = 0; c < specs.size(); ++c) {
    const SunSpec& sun = specs[c].sun;
    if ((sun.latitude_deg || sun.day_of_year || sun.local_solar_time_h) && !(sun.latitude_deg && sun.day_of_year))
      throw InputError(InputPlace{study.source_file, "sweeps", {}, {}, static_cast<long>(c), {}},
                       fmt::format("column \"{}\": the Sun's position needs both latitude_deg and day_of_year (sweep one, "
                                   "give the other in the column)", specs[c].name));
  }
  out.study.columns = std::move(specs);
  return out;
}

} // namespace bandstack::io
