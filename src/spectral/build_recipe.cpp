#include "bandstack/core/error.hpp"
#include "bandstack/core/units.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"
#include "bandstack/spectral/band_builder.hpp"
#include "bandstack/spectral/cross_section_file.hpp"
#include "io/toml_reader.hpp"

#include <cmath>
#include <fmt/format.h>
#include <fstream>
#include <set>
#include <sstream>

namespace bandstack::spectral {

namespace {

using io::detail::TomlReader;

std::string ppmv_key(Gas g) { return std::string(gas_name(g)) + "_ppmv"; }

std::set<std::string> ordering_keys() {
  std::set<std::string> keys{"pressure_hpa", "temperature_k"};
  for (Gas g : all_gases)
    keys.insert(ppmv_key(g));
  return keys;
}

// Reads the keys of an ordering-state table into `state`; with `require_all`, absent keys are problems.
void read_ordering(TomlReader& r, const toml::table& t, const std::string& prefix, OrderingState& state,
                   bool require_all) {
  r.reject_unknown_keys(t, prefix, ordering_keys());
  const auto missing = [&](const std::string& key) {
    if (require_all && !t.contains(key)) r.problem(t.source(), prefix + "." + key, "missing");
  };
  missing("pressure_hpa");
  if (auto v = r.number(t, prefix, "pressure_hpa", 1e-6, 2000.0)) state.pressure_pa = units::hpa_to_pa(*v);
  missing("temperature_k");
  if (auto v = r.number(t, prefix, "temperature_k", 50.0, 500.0)) state.temperature_k = *v;
  for (Gas g : all_gases) {
    missing(ppmv_key(g));
    if (auto v = r.number(t, prefix, ppmv_key(g), 0.0, 1e6))
      state.mole_fraction[index(g)] = units::ppmv_to_mole_fraction(*v);
  }
}

// A list of numbers (TOML array); absent gives nullopt.
std::optional<std::vector<double>> number_list(TomlReader& r, const toml::table& t, const std::string& prefix,
                                               const std::string& key) {
  const toml::node* node = t.get(key);
  if (!node) return std::nullopt;
  const std::string name = prefix + "." + key;
  if (!node->is_array()) {
    r.problem(node->source(), name, "expected a list of numbers, e.g. [0, 0.5, 1]");
    return std::nullopt;
  }
  std::vector<double> values;
  for (const toml::node& e : *node->as_array()) {
    if (!e.is_number()) {
      r.problem(e.source(), name, "expected a list of numbers, e.g. [0, 0.5, 1]");
      return std::nullopt;
    }
    values.push_back(e.is_integer() ? static_cast<double>(e.as_integer()->get()) : e.as_floating_point()->get());
  }
  return values;
}

struct GpointRule {
  double ratio = 1.0;
};

struct Edges {
  std::optional<double> lower, upper; // as read; nullopt if absent or invalid
};

Edges read_band(TomlReader& r, const toml::table& t, std::size_t i, const GpointRule& rule, const OrderingState& global,
                BuildRecipe& recipe) {
  const std::string prefix = fmt::format("bands[{}]", i);
  r.reject_unknown_keys(t, prefix, {"lower_cm1", "upper_cm1", "gpoints", "g_ratio", "g_boundaries", "ordering_state"});
  BandRecipe band;
  band.ordering = global;
  const auto lower = r.number(t, prefix, "lower_cm1", 0.0, 1e5);
  const auto upper = r.number(t, prefix, "upper_cm1", 0.0, 1e5);
  const auto gpoints = r.integer(t, prefix, "gpoints", 1, 256);
  for (const char* key : {"lower_cm1", "upper_cm1", "gpoints"})
    if (!t.contains(key)) r.problem(t.source(), prefix + "." + key, "missing");
  if (lower && upper && !(*upper > *lower))
    r.problem(t.get("upper_cm1")->source(), prefix + ".upper_cm1",
              fmt::format("must exceed lower_cm1 ({} cm-1)", *lower));
  if (lower) band.lower_cm1 = *lower;
  if (upper) band.upper_cm1 = *upper;

  const auto ratio = r.number(t, prefix, "g_ratio", 1e-3, 1.0);
  const auto boundaries = number_list(r, t, prefix, "g_boundaries");
  if (ratio && boundaries)
    r.problem(t.get("g_ratio")->source(), prefix + ".g_ratio", "give g_ratio or g_boundaries, not both");
  if (gpoints) {
    const auto n = static_cast<std::size_t>(*gpoints);
    if (boundaries) {
      const std::vector<double>& g = *boundaries;
      const auto& where = t.get("g_boundaries")->source();
      bool ok = g.size() == n + 1;
      if (!ok)
        r.problem(where, prefix + ".g_boundaries",
                  fmt::format("needs gpoints + 1 = {} values, has {}", n + 1, g.size()));
      for (std::size_t k = 1; ok && k < g.size(); ++k)
        if (!(g[k] > g[k - 1])) ok = false, r.problem(where, prefix + ".g_boundaries", "must be strictly increasing");
      if (ok && (g.front() != 0.0 || g.back() != 1.0))
        ok = false, r.problem(where, prefix + ".g_boundaries", "must start at 0 and end at 1");
      if (ok) band.g_boundaries = g;
    } else {
      band.g_boundaries = geometric_g_boundaries(n, ratio.value_or(rule.ratio));
    }
  }
  if (const toml::table* o = r.table(t, prefix, "ordering_state"))
    read_ordering(r, *o, prefix + ".ordering_state", band.ordering, false);
  recipe.bands.push_back(std::move(band));
  return Edges{lower, upper};
}

void check_bands(TomlReader& r, const std::vector<const toml::table*>& tables, const std::vector<Edges>& edges,
                 std::optional<double> step, const toml::table& root) {
  if (tables.empty()) {
    r.problem(root.source(), "bands", "missing: the recipe needs at least one [[bands]] table");
    return;
  }
  for (std::size_t i = 1; i < edges.size(); ++i) {
    if (edges[i].lower && edges[i - 1].upper && *edges[i].lower != *edges[i - 1].upper)
      r.problem(
          tables[i]->get("lower_cm1")->source(), fmt::format("bands[{}].lower_cm1", i),
          fmt::format("bands must be contiguous and increasing: expected {} (the upper edge of bands[{}]), got {}",
                      *edges[i - 1].upper, i - 1, *edges[i].lower));
  }
  // Every band edge must fall on the fine grid that starts at the first band's lower edge.
  if (!step || !edges.front().lower) return;
  const double start = *edges.front().lower;
  for (std::size_t i = 0; i < edges.size(); ++i) {
    for (const char* key : {"lower_cm1", "upper_cm1"}) {
      const std::optional<double> edge = std::string(key) == "lower_cm1" ? edges[i].lower : edges[i].upper;
      if (!edge) continue;
      const toml::node* node = tables[i]->get(key);
      const double steps = (*edge - start) / *step;
      if (std::abs(steps - std::round(steps)) > 1e-9 * std::max(1.0, std::abs(steps)))
        r.problem(node->source(), fmt::format("bands[{}].{}", i, key),
                  fmt::format("{} cm-1 is not on the fine grid (a whole number of {} cm-1 steps from {} cm-1)", *edge,
                              *step, start));
    }
  }
}

// n values from lo to hi, equally spaced in ln(value), with the end points exact.
std::vector<double> log_spaced(double lo, double hi, std::size_t n) {
  std::vector<double> v(n);
  for (std::size_t k = 0; k < n; ++k)
    v[k] = std::exp(std::log(lo) + (std::log(hi) - std::log(lo)) * static_cast<double>(k) / static_cast<double>(n - 1));
  v.front() = lo;
  v.back() = hi;
  return v;
}

std::optional<std::vector<double>> stepped(TomlReader& r, const toml::table& t, const std::string& prefix,
                                           const std::string& stem) {
  const auto lo = r.number(t, prefix, stem + "_min_k", 1.0, 1000.0);
  const auto hi = r.number(t, prefix, stem + "_max_k", 1.0, 1000.0);
  const auto step = r.number(t, prefix, stem + "_step_k", 0.01, 1000.0);
  for (const std::string& key : {stem + "_min_k", stem + "_max_k", stem + "_step_k"})
    if (!t.contains(key)) r.problem(t.source(), prefix + "." + key, "missing");
  if (!lo || !hi || !step) return std::nullopt;
  const double steps = (*hi - *lo) / *step;
  if (!(*hi > *lo) || std::abs(steps - std::round(steps)) > 1e-9 * steps || steps > 10000.0) {
    r.problem(t.get(stem + "_max_k")->source(), prefix + "." + stem + "_max_k",
              fmt::format("must exceed {}_min_k by a whole number of {}_step_k (got {} .. {} step {})", stem, stem, *lo,
                          *hi, *step));
    return std::nullopt;
  }
  std::vector<double> v;
  const auto n = static_cast<std::size_t>(std::round(steps)) + 1;
  for (std::size_t k = 0; k < n; ++k)
    v.push_back(*lo + static_cast<double>(k) * *step);
  v.back() = *hi;
  return v;
}

void read_reference_grid(TomlReader& r, const toml::table& root, BuildRecipe& recipe) {
  const toml::table* t = r.table(root, "", "reference_grid");
  if (!t) {
    if (!root.contains("reference_grid"))
      r.problem(root.source(), "reference_grid", "missing: the recipe needs a [reference_grid] table");
    return;
  }
  const std::string prefix = "reference_grid";
  r.reject_unknown_keys(*t, prefix,
                        {"pressure_min_hpa", "pressure_max_hpa", "pressure_count", "temperature_min_k",
                         "temperature_max_k", "temperature_step_k", "planck_temperature_min_k",
                         "planck_temperature_max_k", "planck_temperature_step_k"});
  const auto lo = r.number(*t, prefix, "pressure_min_hpa", 1e-6, 2000.0);
  const auto hi = r.number(*t, prefix, "pressure_max_hpa", 1e-6, 2000.0);
  const auto n = r.integer(*t, prefix, "pressure_count", 2, 1000);
  for (const char* key : {"pressure_min_hpa", "pressure_max_hpa", "pressure_count"})
    if (!t->contains(key)) r.problem(t->source(), prefix + "." + key, "missing");
  if (lo && hi && !(*hi > *lo))
    r.problem(t->get("pressure_max_hpa")->source(), prefix + ".pressure_max_hpa", "must exceed pressure_min_hpa");
  else if (lo && hi && n)
    recipe.ref_pressure_pa = log_spaced(units::hpa_to_pa(*lo), units::hpa_to_pa(*hi), static_cast<std::size_t>(*n));
  if (auto v = stepped(r, *t, prefix, "temperature")) recipe.ref_temperature_k = *v;
  if (auto v = stepped(r, *t, prefix, "planck_temperature")) recipe.planck_temperature_k = *v;
}

// [solar] spectrum_file: the solar spectrum from a file, which excludes the blackbody keys.
void read_solar_spectrum_key(TomlReader& r, const toml::table& t, const BuildRecipe& recipe, SolarRecipe& solar) {
  const std::string key = "solar.spectrum_file";
  const toml::source_region& where = t.get("spectrum_file")->source();
  if (auto file = r.string(t, "solar", "spectrum_file")) {
    if (file->empty()) {
      r.problem(where, key, "must not be empty");
    } else {
      const std::filesystem::path p(*file);
      solar.spectrum_file = p.is_absolute() ? p : std::filesystem::path(recipe.file).parent_path() / p;
    }
  }
  for (const char* other : {"temperature_k", "brightness_temperature_cm1", "brightness_temperature_k"})
    if (const toml::node* node = t.get(other))
      r.problem(where, key,
                fmt::format("give spectrum_file or the blackbody source, not both (solar.{} is on line {})", other,
                            node->source().begin.line));
}

// [solar] temperature_k and the optional brightness-temperature nodes.
void read_solar_blackbody(TomlReader& r, const toml::table& table, SolarRecipe& solar) {
  const toml::table* t = &table;
  const std::string prefix = "solar";
  if (auto v = r.number(*t, prefix, "temperature_k", 1000.0, 100000.0))
    solar.temperature_k = *v;
  else if (!t->contains("temperature_k"))
    r.problem(t->source(), prefix + ".temperature_k",
              "missing: the blackbody temperature of the solar source, e.g. 5772.0 (or a spectrum_file instead)");
  const auto nodes_cm1 = number_list(r, *t, prefix, "brightness_temperature_cm1");
  const auto nodes_k = number_list(r, *t, prefix, "brightness_temperature_k");
  if (nodes_cm1.has_value() != nodes_k.has_value()) {
    r.problem(t->source(), prefix + ".brightness_temperature_k",
              "give brightness_temperature_cm1 and brightness_temperature_k together");
  } else if (nodes_cm1 && nodes_k) {
    const auto& where = t->get("brightness_temperature_k")->source();
    bool ok = nodes_cm1->size() == nodes_k->size() && nodes_cm1->size() >= 2;
    if (!ok)
      r.problem(where, prefix + ".brightness_temperature_k",
                fmt::format("needs one temperature per wavenumber node and at least two nodes (got {} and {})",
                            nodes_cm1->size(), nodes_k->size()));
    for (std::size_t k = 0; ok && k < nodes_cm1->size(); ++k) {
      if (!((*nodes_cm1)[k] >= 0.0) || (k > 0 && !((*nodes_cm1)[k] > (*nodes_cm1)[k - 1])))
        ok = false, r.problem(t->get("brightness_temperature_cm1")->source(), prefix + ".brightness_temperature_cm1",
                              "must be >= 0 and strictly increasing");
      else if (!((*nodes_k)[k] >= 1000.0 && (*nodes_k)[k] <= 100000.0))
        ok = false, r.problem(where, prefix + ".brightness_temperature_k",
                              fmt::format("value {} is outside [1000, 100000] K", (*nodes_k)[k]));
    }
    if (ok) {
      solar.brightness_node_cm1 = *nodes_cm1;
      solar.brightness_node_k = *nodes_k;
    }
  }
}

// The [solar] table: its presence makes the set a shortwave set (docs/build-recipe.md).
void read_solar(TomlReader& r, const toml::table& root, BuildRecipe& recipe) {
  const toml::table* t = r.table(root, "", "solar");
  if (!t) return;
  const std::string prefix = "solar";
  r.reject_unknown_keys(*t, prefix,
                        {"temperature_k", "brightness_temperature_cm1", "brightness_temperature_k", "rayleigh_scattering",
                         "spectrum_file"});
  SolarRecipe solar;
  if (t->contains("spectrum_file"))
    read_solar_spectrum_key(r, *t, recipe, solar);
  else
    read_solar_blackbody(r, *t, solar);
  if (const toml::node* node = t->get("rayleigh_scattering")) {
    if (const auto* b = node->as_boolean())
      solar.rayleigh_scattering = b->get();
    else
      r.problem(node->source(), prefix + ".rayleigh_scattering", "expected true or false");
  }
  recipe.solar = solar;
}

void read_source(TomlReader& r, const toml::table& root, BuildRecipe& recipe) {
  const std::filesystem::path folder = std::filesystem::path(recipe.file).parent_path();
  const auto resolve = [&](const std::string& value) {
    const std::filesystem::path p(value);
    return p.is_absolute() ? p : folder / p;
  };
  const auto analytic = r.string(root, "", "absorbers");
  const auto cross = r.string(root, "", "cross_section_file");
  if (analytic && cross)
    r.problem(root.get("cross_section_file")->source(), "cross_section_file",
              "give `absorbers` or `cross_section_file`, not both");
  else if (!root.contains("absorbers") && !root.contains("cross_section_file"))
    r.problem(root.source(), "absorbers",
              "missing: name the absorber source, `absorbers = \"RECIPE.toml\"` or `cross_section_file = \"FILE.nc\"`");
  if (analytic && !analytic->empty()) recipe.absorber_recipe = resolve(*analytic);
  if (cross && !cross->empty()) recipe.cross_section_file = resolve(*cross);
  if ((analytic && analytic->empty()) || (cross && cross->empty()))
    r.problem(root.source(), analytic ? "absorbers" : "cross_section_file", "must not be empty");
}

} // namespace

std::vector<double> geometric_g_boundaries(std::size_t n, double ratio) {
  if (n == 0 || !(ratio > 0.0 && ratio <= 1.0))
    throw InputError(
        fmt::format("g boundaries need at least one g-point and a ratio in (0, 1], got {} and {}", n, ratio));
  std::vector<double> widths(n);
  double total = 0.0;
  for (std::size_t k = 0; k < n; ++k)
    total += (widths[k] = std::pow(ratio, static_cast<double>(k)));
  std::vector<double> g(n + 1, 0.0);
  for (std::size_t k = 0; k < n; ++k)
    g[k + 1] = g[k] + widths[k] / total;
  g.back() = 1.0;
  return g;
}

BuildRecipe parse_build_recipe(std::string_view text, const std::string& file) {
  const std::string file_name = file.empty() ? std::string("(build recipe)") : file;
  toml::table root;
  try {
    root = toml::parse(text, file_name);
  } catch (const toml::parse_error& e) {
    const auto& where = e.source().begin;
    throw InputError(
        fmt::format("{}:{}:{}: TOML syntax error: {}", file_name, where.line, where.column, e.description()));
  }
  TomlReader r(file_name);
  BuildRecipe recipe;
  recipe.file = file;
  recipe.text = std::string(text);
  r.reject_unknown_keys(root, "",
                        {"name", "absorbers", "cross_section_file", "wavenumber_step_cm1", "gpoint_mean", "gpoints",
                         "reference_grid", "ordering_state", "bands", "solar"});
  if (auto v = r.string(root, "", "name"))
    recipe.name = *v;
  else if (!root.contains("name"))
    r.problem(root.source(), "name", "missing: the band set needs a name");
  read_source(r, root, recipe);
  const auto step = r.number(root, "", "wavenumber_step_cm1", 0.01, 1.0);
  if (step)
    recipe.wavenumber_step_cm1 = *step;
  else if (!root.contains("wavenumber_step_cm1"))
    r.problem(root.source(), "wavenumber_step_cm1", "missing");
  if (auto v = r.string(root, "", "gpoint_mean")) {
    if (*v == "arithmetic")
      recipe.gpoint_mean = GpointMean::arithmetic;
    else if (*v == "transmission")
      recipe.gpoint_mean = GpointMean::transmission;
    else
      r.problem(root.get("gpoint_mean")->source(), "gpoint_mean",
                "must be \"arithmetic\" or \"transmission\", not \"" + *v + "\"");
  }
  GpointRule rule;
  if (const toml::table* g = r.table(root, "", "gpoints")) {
    r.reject_unknown_keys(*g, "gpoints", {"rule", "ratio"});
    if (auto v = r.string(*g, "gpoints", "rule"); v && *v != "geometric")
      r.problem(g->get("rule")->source(), "gpoints.rule",
                "must be \"geometric\" (the only rule so far), not \"" + *v + "\"");
    if (auto v = r.number(*g, "gpoints", "ratio", 1e-3, 1.0)) rule.ratio = *v;
  }
  read_reference_grid(r, root, recipe);
  read_solar(r, root, recipe);
  OrderingState global;
  if (const toml::table* o = r.table(root, "", "ordering_state"))
    read_ordering(r, *o, "ordering_state", global, true);
  else if (!root.contains("ordering_state"))
    r.problem(root.source(), "ordering_state", "missing: the recipe needs an [ordering_state] table");

  const std::vector<const toml::table*> tables = r.table_array(root, "", "bands");
  std::vector<Edges> edges;
  for (std::size_t i = 0; i < tables.size(); ++i)
    edges.push_back(read_band(r, *tables[i], i, rule, global, recipe));
  check_bands(r, tables, edges, step, root);

  if (!r.problems().empty()) {
    std::ostringstream out;
    out << r.problems().size() << (r.problems().size() == 1 ? " problem" : " problems") << " in the build recipe:";
    for (const std::string& p : r.problems())
      out << "\n  " << p;
    throw InputError(out.str());
  }
  return recipe;
}

BuildRecipe load_build_recipe(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw FileError(path.string(), "cannot open the build recipe for reading");
  std::ostringstream text;
  text << in.rdbuf();
  if (in.bad()) throw FileError(path.string(), "error while reading the build recipe");
  return parse_build_recipe(text.str(), path.string());
}

std::unique_ptr<AbsorberSource> open_absorber_source(const BuildRecipe& recipe) {
  if (recipe.absorber_recipe) return std::make_unique<AnalyticAbsorber>(load_absorber_recipe(*recipe.absorber_recipe));
  if (recipe.cross_section_file) return std::make_unique<CrossSectionAbsorber>(*recipe.cross_section_file);
  throw InputError(InputPlace{recipe.file, "absorbers", {}, {}, {}, {}}, "the recipe names no absorber source");
}

} // namespace bandstack::spectral
