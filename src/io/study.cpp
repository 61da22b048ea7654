#include "bandstack/io/study.hpp"

#include <algorithm>
#include <fstream>
#include <set>
#include <sstream>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/core/units.hpp"
#include "io/study_climate.hpp"
#include "io/toml_reader.hpp"

namespace bandstack::io {

namespace {

using detail::TomlReader;

void read_grid(TomlReader& r, const toml::table& root, atmosphere::GridSpec& grid) {
  const toml::table* t = r.table(root, "", "grid");
  if (!t) return;
  r.reject_unknown_keys(*t, "grid", {"layers", "top_pressure_hpa", "surface_pressure_hpa", "spacing"});
  if (auto v = r.integer(*t, "grid", "layers", 1, 100000)) grid.layers = static_cast<std::size_t>(*v);
  if (auto v = r.number(*t, "grid", "top_pressure_hpa", 1e-6, 1e6)) grid.top_pressure_pa = units::hpa_to_pa(*v);
  if (auto v = r.number(*t, "grid", "surface_pressure_hpa", 1e-6, 1e6)) grid.surface_pressure_pa = units::hpa_to_pa(*v);
  if (auto v = r.string(*t, "grid", "spacing")) {
    if (*v == "log_pressure") grid.spacing = atmosphere::Spacing::log_pressure;
    else if (*v == "linear_pressure") grid.spacing = atmosphere::Spacing::linear_pressure;
    else r.problem(t->get("spacing")->source(), "grid.spacing", "must be \"log_pressure\" or \"linear_pressure\", not \"" + *v + "\"");
  }
  if (grid.top_pressure_pa >= grid.surface_pressure_pa)
    r.problem(t->source(), "grid", "top_pressure_hpa must be below surface_pressure_hpa");
}

void read_longwave(TomlReader& r, const toml::table& root, LongwaveSettings& lw) {
  const toml::table* t = r.table(root, "", "longwave");
  if (!t) return;
  r.reject_unknown_keys(*t, "longwave",
                        {"method", "band_set", "absorbers", "reference_step_cm1", "angular_quadrature", "gauss_angles",
                         "diffusivity_factor", "grey_mass_absorption_m2_per_kg"});
  if (auto v = r.string(*t, "longwave", "method")) {
    if (*v == "grey") lw.method = LongwaveMethod::grey;
    else if (*v == "bands") lw.method = LongwaveMethod::bands;
    else if (*v == "reference") lw.method = LongwaveMethod::reference;
    else r.problem(t->get("method")->source(), "longwave.method", "must be \"bands\", \"reference\" or \"grey\", not \"" + *v + "\"");
  }
  if (auto v = r.string(*t, "longwave", "band_set")) lw.band_set = *v;
  if (auto v = r.string(*t, "longwave", "absorbers")) lw.absorbers = *v;
  if (auto v = r.number(*t, "longwave", "reference_step_cm1", 0.01, 1.0)) lw.reference_step_cm1 = *v;
  if (auto v = r.string(*t, "longwave", "angular_quadrature")) {
    if (*v == "gauss") lw.angle_method = AngleMethod::gauss;
    else if (*v == "diffusivity") lw.angle_method = AngleMethod::diffusivity;
    else r.problem(t->get("angular_quadrature")->source(), "longwave.angular_quadrature", "must be \"gauss\" or \"diffusivity\", not \"" + *v + "\"");
  }
  if (auto v = r.integer(*t, "longwave", "gauss_angles", 1, 8)) lw.gauss_angles = static_cast<std::size_t>(*v);
  if (auto v = r.number(*t, "longwave", "diffusivity_factor", 1.0, 2.0)) lw.diffusivity_factor = *v;
  const std::string prefix = "longwave.grey_mass_absorption_m2_per_kg";
  if (const toml::table* k = r.table(*t, "longwave", "grey_mass_absorption_m2_per_kg")) {
    std::set<std::string> names;
    for (Gas g : all_gases) names.insert(std::string(gas_name(g)));
    r.reject_unknown_keys(*k, prefix, names);
    for (Gas g : all_gases)
      if (auto v = r.number(*k, prefix, std::string(gas_name(g)), 0.0, 1e6)) lw.grey.mass_absorption_m2_kg[index(g)] = *v;
  }
}

void read_shortwave(TomlReader& r, const toml::table& root, ShortwaveSettings& sw) {
  const toml::table* t = r.table(root, "", "shortwave");
  if (!t) return;
  r.reject_unknown_keys(*t, "shortwave", {"method", "band_set", "solar_constant_w_m2"});
  if (auto v = r.string(*t, "shortwave", "method")) {
    if (*v == "bands") sw.method = ShortwaveMethod::bands;
    else if (*v == "none") sw.method = ShortwaveMethod::none;
    else r.problem(t->get("method")->source(), "shortwave.method", "must be \"bands\" or \"none\", not \"" + *v + "\"");
  }
  if (auto v = r.string(*t, "shortwave", "band_set")) sw.band_set = *v;
  if (auto v = r.number(*t, "shortwave", "solar_constant_w_m2", 0.0, 1e5)) sw.solar_constant_w_m2 = *v;
}

void read_sun(TomlReader& r, const toml::table& t, const std::string& prefix, SunSpec& sun) {
  sun.cos_zenith = r.number(t, prefix, "cos_zenith", 0.0, 1.0);
  sun.latitude_deg = r.number(t, prefix, "latitude_deg", -90.0, 90.0);
  sun.day_of_year = r.number(t, prefix, "day_of_year", 1.0, 366.0);
  sun.local_solar_time_h = r.number(t, prefix, "local_solar_time_h", 0.0, 24.0);
  const bool by_place = sun.latitude_deg || sun.day_of_year || sun.local_solar_time_h;
  if (sun.cos_zenith && by_place)
    r.problem(t.get("cos_zenith")->source(), prefix + ".cos_zenith",
              "give either cos_zenith or latitude_deg/day_of_year(/local_solar_time_h), not both");
  else if (by_place && !(sun.latitude_deg && sun.day_of_year))
    r.problem(t.source(), prefix, "the Sun's position needs both latitude_deg and day_of_year");
}

// profile_file and [columns.variables]; the built-in profile's own keys do not apply then.
void read_profile_file_keys(TomlReader& r, const toml::table& t, const std::string& prefix, const std::string& file_name,
                            ColumnSpec& spec) {
  for (const char* key : {"profile", "surface_temperature_k", "surface_relative_humidity", "stratospheric_h2o_ppmv", "ozone_scale"})
    if (t.contains(key))
      r.problem(t.get(key)->source(), prefix + "." + key, "does not apply to a column read from a profile_file");
  if (auto v = r.string(t, prefix, "sun_from_file")) {
    if (*v == "instantaneous") spec.sun.from_file = SunFromFile::instantaneous;
    else if (*v == "daily_mean") spec.sun.from_file = SunFromFile::daily_mean;
    else r.problem(t.get("sun_from_file")->source(), prefix + ".sun_from_file",
                   "must be \"instantaneous\" or \"daily_mean\", not \"" + *v + "\"");
    for (const char* key : {"cos_zenith", "latitude_deg", "day_of_year", "local_solar_time_h"})
      if (t.contains(key))
        r.problem(t.get(key)->source(), prefix + "." + key, "cannot be given with sun_from_file (the file gives the Sun)");
  }
  if (auto v = r.string(t, prefix, "profile_file")) {
    std::filesystem::path path(*v);
    if (path.is_relative() && !file_name.empty()) path = std::filesystem::path(file_name).parent_path() / path;
    spec.profile_file = path;
  }
  const std::string vprefix = prefix + ".variables";
  if (const toml::table* v = r.table(t, prefix, "variables")) {
    ProfileVariables& m = spec.profile_variables;
    r.reject_unknown_keys(*v, vprefix, {"pressure", "temperature", "surface_temperature", "surface_pressure", "h2o", "co2", "o3",
                                        "ch4", "n2o", "vertical_dimension"});
    const std::pair<const char*, std::string*> names[] = {
        {"pressure", &m.pressure}, {"temperature", &m.temperature}, {"surface_temperature", &m.surface_temperature},
        {"surface_pressure", &m.surface_pressure}, {"h2o", &m.h2o}, {"co2", &m.co2}, {"o3", &m.o3}, {"ch4", &m.ch4},
        {"n2o", &m.n2o}, {"vertical_dimension", &m.vertical_dimension}};
    for (const auto& [key, target] : names)
      if (auto name = r.string(*v, vprefix, key)) *target = *name;
  }
}

ColumnSpec read_column(TomlReader& r, const toml::table& t, std::size_t i, const std::string& file_name) {
  const std::string prefix = fmt::format("columns[{}]", i);
  r.reject_unknown_keys(t, prefix,
                        {"name", "profile", "surface_temperature_k", "surface_relative_humidity", "stratospheric_h2o_ppmv",
                         "co2_ppmv", "ch4_ppmv", "n2o_ppmv", "ozone_scale", "surface_emissivity", "surface_albedo",
                         "cos_zenith", "latitude_deg", "day_of_year", "local_solar_time_h", "surface_emissivity_by_band",
                         "surface_albedo_by_band", "profile_file", "variables", "sun_from_file"});
  ColumnSpec spec;
  spec.name = r.string(t, prefix, "name").value_or(fmt::format("column_{}", i));
  atmosphere::ProfileSettings& s = spec.settings;
  if (t.contains("profile_file")) {
    read_profile_file_keys(r, t, prefix, file_name, spec);
  } else if (auto v = r.string(t, prefix, "profile")) {
    if (auto p = atmosphere::profile_from_name(*v)) s.profile = *p;
    else r.problem(t.get("profile")->source(), prefix + ".profile",
                   "unknown built-in profile \"" + *v + "\" (known: us_standard_1976, tropical, midlatitude_summer, high_latitude_winter)");
  } else {
    r.problem(t.source(), prefix + ".profile", "missing: every column needs a built-in profile or a profile_file");
  }
  if (auto v = r.number(t, prefix, "surface_temperature_k", 150.0, 330.0)) s.surface_temperature_k = *v;
  if (auto v = r.number(t, prefix, "surface_relative_humidity", 0.0, 1.0)) s.surface_relative_humidity = *v;
  if (auto v = r.number(t, prefix, "stratospheric_h2o_ppmv", 0.0, 1e4)) s.stratospheric_h2o_mole_fraction = units::ppmv_to_mole_fraction(*v);
  if (auto v = r.number(t, prefix, "co2_ppmv", 0.0, 1e5)) s.co2_mole_fraction = units::ppmv_to_mole_fraction(*v);
  if (auto v = r.number(t, prefix, "ch4_ppmv", 0.0, 1e5)) s.ch4_mole_fraction = units::ppmv_to_mole_fraction(*v);
  if (auto v = r.number(t, prefix, "n2o_ppmv", 0.0, 1e5)) s.n2o_mole_fraction = units::ppmv_to_mole_fraction(*v);
  if (auto v = r.number(t, prefix, "ozone_scale", 0.0, 100.0)) s.ozone_scale = *v;
  if (auto v = r.number(t, prefix, "surface_emissivity", 0.0, 1.0)) s.surface_emissivity = *v;
  if (auto v = r.number(t, prefix, "surface_albedo", 0.0, 1.0)) s.surface_albedo = *v;
  if (!spec.sun.from_file) read_sun(r, t, prefix, spec.sun);
  if (t.contains("sun_from_file") && !t.contains("profile_file"))
    r.problem(t.get("sun_from_file")->source(), prefix + ".sun_from_file", "needs a profile_file column");
  spec.surface_emissivity_by_band = r.number_array(t, prefix, "surface_emissivity_by_band", 0.0, 1.0);
  spec.surface_albedo_by_band = r.number_array(t, prefix, "surface_albedo_by_band", 0.0, 1.0);
  return spec;
}

} // namespace

Study parse_study(std::string_view text, const std::string& file_name) {
  toml::table root;
  try {
    root = toml::parse(text, file_name);
  } catch (const toml::parse_error& e) {
    const auto& where = e.source().begin;
    throw InputError(fmt::format("{}:{}:{}: TOML syntax error: {}", file_name, where.line, where.column, e.description()));
  }
  TomlReader r(file_name);
  r.reject_unknown_keys(root, "", {"title", "grid", "longwave", "shortwave", "output", "columns", "equilibrium", "experiments",
                              "attribution", "sweeps"});

  Study study;
  study.source_file = file_name;
  study.source_text = std::string(text);
  study.title = r.string(root, "", "title").value_or("");
  read_grid(r, root, study.grid);
  read_longwave(r, root, study.longwave);
  read_shortwave(r, root, study.shortwave);
  detail::read_equilibrium(r, root, study);
  detail::read_experiments(r, root, study);
  detail::read_attribution(r, root, study);
  detail::read_sweeps(r, root, study);

  std::string output_name = "bandstack_result.nc";
  if (const toml::table* t = r.table(root, "", "output")) {
    r.reject_unknown_keys(*t, "output", {"file"});
    if (auto v = r.string(*t, "output", "file")) {
      if (v->empty()) r.problem(t->get("file")->source(), "output.file", "must not be empty");
      else output_name = *v;
    }
  }
  // A relative output path is taken relative to the folder of the study file.
  std::filesystem::path out(output_name);
  if (out.is_relative() && !file_name.empty()) out = std::filesystem::path(file_name).parent_path() / out;
  study.output_file = out;

  const auto tables = r.table_array(root, "", "columns");
  if (tables.empty() && !root.get("columns")) r.problem("no columns: add at least one [[columns]] table");
  std::set<std::string> seen;
  for (std::size_t i = 0; i < tables.size(); ++i) {
    ColumnSpec spec = read_column(r, *tables[i], i, file_name);
    if (!seen.insert(spec.name).second)
      r.problem(tables[i]->source(), fmt::format("columns[{}].name", i), "duplicate column name \"" + spec.name + "\"");
    study.columns.push_back(std::move(spec));
  }
  if (study.attribution.bands && study.longwave.method != LongwaveMethod::bands)
    r.problem("attribution.bands needs the longwave method \"bands\"");
  for (std::size_t i = 0; i < study.experiments.size(); ++i) {
    const climate::Perturbation& p = study.experiments[i];
    if (!p.removed_longwave_bands.empty() && study.longwave.method != LongwaveMethod::bands)
      r.problem(fmt::format("experiments[{}].remove_longwave_bands needs the longwave method \"bands\"", i));
    if (!p.removed_shortwave_bands.empty() && study.shortwave.method != ShortwaveMethod::bands)
      r.problem(fmt::format("experiments[{}].remove_shortwave_bands needs the shortwave method \"bands\"", i));
  }
  detail::check_column_count(r, study);
  const bool from_file = std::any_of(study.columns.begin(), study.columns.end(),
                                     [](const ColumnSpec& c) { return !c.profile_file.empty(); });
  if (from_file && study.columns.size() > 1)
    r.problem("a study with a profile_file column has only that column (the file's columns are the study's columns)");
  if (from_file)
    for (const SweepAxis& sweep : study.sweeps)
      if (sweep.key == "surface_relative_humidity" || sweep.key == "stratospheric_h2o_ppmv" || sweep.key == "ozone_scale")
        r.problem("[[sweeps]] key \"" + sweep.key + "\" belongs to the built-in profiles and cannot be swept with a profile_file column");
  r.throw_if_problems();
  return study;
}

Study load_study(const std::filesystem::path& path) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) throw FileError(path.string(), "is a folder, not a study file");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw FileError(path.string(), "cannot open the study file for reading");
  std::ostringstream text;
  text << in.rdbuf();
  if (in.bad()) throw FileError(path.string(), "error while reading the study file");
  return parse_study(text.str(), path.string());
}

} // namespace bandstack::io
