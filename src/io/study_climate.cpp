#include "io/study_climate.hpp"

#include <set>
#include <string>

#include <fmt/format.h>

#include "bandstack/core/units.hpp"

namespace bandstack::io::detail {

namespace {

// Reads a string key that must be one of `choices`; returns its index, or nullopt (absent or bad).
std::optional<std::size_t> choice(TomlReader& r, const toml::table& t, const std::string& prefix, const std::string& key,
                                  const std::vector<std::string>& choices) {
  const auto v = r.string(t, prefix, key);
  if (!v) return std::nullopt;
  for (std::size_t i = 0; i < choices.size(); ++i)
    if (*v == choices[i]) return i;
  std::string list;
  for (const std::string& c : choices) list += (list.empty() ? "\"" : ", \"") + c + "\"";
  r.problem(t.get(key)->source(), prefix + "." + key, "must be one of " + list + ", not \"" + *v + "\"");
  return std::nullopt;
}

// A table of gas name -> number, e.g. { co2 = 2.0 }.
std::vector<std::pair<Gas, double>> gas_table(TomlReader& r, const toml::table& t, const std::string& prefix,
                                              const std::string& key, double lo, double hi) {
  std::vector<std::pair<Gas, double>> values;
  const toml::table* g = r.table(t, prefix, key);
  if (!g) return values;
  const std::string name = prefix + "." + key;
  for (auto&& [gas_key, node] : *g) {
    const std::string gas_text(gas_key.str());
    const auto gas = gas_from_name(gas_text);
    if (!gas) {
      r.problem(gas_key.source(), name + "." + gas_text, "unknown gas (known: h2o, co2, o3, ch4, n2o)");
      continue;
    }
    if (auto v = r.number(*g, name, gas_text, lo, hi)) values.emplace_back(*gas, *v);
  }
  return values;
}

climate::Perturbation read_experiment(TomlReader& r, const toml::table& t, std::size_t i) {
  const std::string prefix = fmt::format("experiments[{}]", i);
  r.reject_unknown_keys(t, prefix,
                        {"name", "scale_gases", "set_gases_ppmv", "remove_gases", "remove_longwave_bands",
                         "remove_shortwave_bands", "insolation_scale", "surface_albedo", "stratospheric_h2o_ppmv"});
  climate::Perturbation p;
  p.name = r.string(t, prefix, "name").value_or(fmt::format("experiment_{}", i));
  std::set<Gas> changed;
  const auto once = [&](Gas gas, const std::string& key) {
    if (changed.insert(gas).second) return true;
    r.problem(t.get(key)->source(), prefix + "." + key,
              fmt::format("{} is changed twice in one experiment (give each gas one change)", gas_name(gas)));
    return false;
  };
  for (const std::string& name : r.string_array(t, prefix, "remove_gases")) {
    const auto gas = gas_from_name(name);
    if (!gas) r.problem(t.get("remove_gases")->source(), prefix + ".remove_gases", "unknown gas \"" + name + "\" (known: h2o, co2, o3, ch4, n2o)");
    else if (once(*gas, "remove_gases")) p.gas_changes.push_back({*gas, climate::GasChangeKind::remove, 0.0});
  }
  for (const auto& [gas, ppmv] : gas_table(r, t, prefix, "set_gases_ppmv", 0.0, 1e5))
    if (once(gas, "set_gases_ppmv"))
      p.gas_changes.push_back({gas, climate::GasChangeKind::set, units::ppmv_to_mole_fraction(ppmv)});
  for (const auto& [gas, factor] : gas_table(r, t, prefix, "scale_gases", 0.0, 1e4))
    if (once(gas, "scale_gases")) p.gas_changes.push_back({gas, climate::GasChangeKind::scale, factor});
  for (long long b : r.integer_array(t, prefix, "remove_longwave_bands", 0, 100000))
    p.removed_longwave_bands.push_back(static_cast<std::size_t>(b));
  for (long long b : r.integer_array(t, prefix, "remove_shortwave_bands", 0, 100000))
    p.removed_shortwave_bands.push_back(static_cast<std::size_t>(b));
  if (auto v = r.number(t, prefix, "insolation_scale", 0.0, 100.0)) p.insolation_scale = *v;
  p.surface_albedo = r.number(t, prefix, "surface_albedo", 0.0, 1.0);
  if (auto v = r.number(t, prefix, "stratospheric_h2o_ppmv", 0.0, 1e4))
    p.stratospheric_h2o_mole_fraction = units::ppmv_to_mole_fraction(*v);
  // Judged by the keys given, so that a change whose value was rejected is not reported twice.
  const std::size_t change_keys = t.size() - (t.contains("name") ? 1 : 0);
  if (change_keys == 0)
    r.problem(t.source(), prefix, "changes nothing: give at least one of scale_gases, set_gases_ppmv, remove_gases, "
                                  "remove_longwave_bands, remove_shortwave_bands, insolation_scale, surface_albedo, "
                                  "stratospheric_h2o_ppmv");
  return p;
}

} // namespace

void read_equilibrium(TomlReader& r, const toml::table& root, Study& study) {
  const toml::table* t = r.table(root, "", "equilibrium");
  if (!t) return;
  const std::string prefix = "equilibrium";
  r.reject_unknown_keys(*t, prefix,
                        {"convection", "critical_lapse_rate_k_per_km", "water", "surface_temperature",
                         "heating_tolerance_k_per_day", "flux_tolerance_w_m2", "max_newton_iterations",
                         "time_marching_fallback"});
  climate::EquilibriumSettings s;
  if (auto c = choice(r, *t, prefix, "convection", {"fixed_lapse_rate", "moist_adiabat", "none"}))
    s.convection.kind = *c == 0 ? climate::ConvectionKind::fixed_lapse_rate
                                : *c == 1 ? climate::ConvectionKind::moist_adiabat : climate::ConvectionKind::none;
  if (auto v = r.number(*t, prefix, "critical_lapse_rate_k_per_km", 0.1, 30.0)) s.convection.critical_lapse_rate_k_km = *v;
  s.water.treatment = climate::WaterTreatment::fixed_relative_humidity;
  if (auto c = choice(r, *t, prefix, "water", {"fixed_relative_humidity", "fixed_mixing_ratio"}))
    s.water.treatment = *c == 0 ? climate::WaterTreatment::fixed_relative_humidity : climate::WaterTreatment::fixed_mole_fraction;
  if (auto c = choice(r, *t, prefix, "surface_temperature", {"energy_balance", "fixed"}))
    s.surface = *c == 0 ? climate::SurfaceTreatment::energy_balance : climate::SurfaceTreatment::fixed;
  if (auto v = r.number(*t, prefix, "heating_tolerance_k_per_day", 1e-8, 1.0)) s.heating_tolerance_k_day = *v;
  if (auto v = r.number(*t, prefix, "flux_tolerance_w_m2", 1e-8, 10.0)) s.flux_tolerance_w_m2 = *v;
  if (auto v = r.integer(*t, prefix, "max_newton_iterations", 0, 1000)) s.max_newton_iterations = static_cast<int>(*v);
  if (auto v = r.boolean(*t, prefix, "time_marching_fallback")) s.time_marching_fallback = *v;
  study.equilibrium = s;
}

void read_experiments(TomlReader& r, const toml::table& root, Study& study) {
  const auto tables = r.table_array(root, "", "experiments");
  std::set<std::string> seen;
  for (std::size_t i = 0; i < tables.size(); ++i) {
    climate::Perturbation p = read_experiment(r, *tables[i], i);
    if (!seen.insert(p.name).second)
      r.problem(tables[i]->source(), fmt::format("experiments[{}].name", i), "duplicate experiment name \"" + p.name + "\"");
    study.experiments.push_back(std::move(p));
  }
}

void read_attribution(TomlReader& r, const toml::table& root, Study& study) {
  const toml::table* t = r.table(root, "", "attribution");
  if (!t) return;
  r.reject_unknown_keys(*t, "attribution", {"bands"});
  study.attribution.enabled = true;
  study.attribution.bands = r.boolean(*t, "attribution", "bands").value_or(study.longwave.method == LongwaveMethod::bands);
}

} // namespace bandstack::io::detail
