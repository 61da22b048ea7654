// Parser of analytic absorber recipes (docs/absorber-recipe.md). Uses the study file's checked
// TOML access so that every problem is reported at once with file:line:column and key.
#include "bandstack/spectral/analytic_absorber.hpp"

#include <fstream>
#include <limits>
#include <set>
#include <sstream>

#include <fmt/format.h>
#include <toml++/toml.h>

#include "bandstack/core/error.hpp"
#include "io/toml_reader.hpp"

namespace bandstack::spectral {

namespace {

using io::detail::TomlReader;

constexpr double inf = std::numeric_limits<double>::infinity();
constexpr double tiny = std::numeric_limits<double>::min(); // "strictly positive" as a closed range
constexpr double huge = std::numeric_limits<double>::max();

// Records a problem if `key` is absent; returns whether it is present.
bool require(TomlReader& r, const toml::table& t, const std::string& prefix, const std::string& key) {
  if (t.get(key)) return true;
  r.problem(t.source(), prefix + "." + key, "missing (this key is required)");
  return false;
}

// A number in [lo, hi] where hi may be +inf and the TOML value `inf` is accepted.
std::optional<double> number_or_inf(TomlReader& r, const toml::table& t, const std::string& prefix,
                                    const std::string& key, double lo) {
  const toml::node* node = t.get(key);
  if (node && node->is_floating_point() && node->as_floating_point()->get() == inf) return inf;
  return r.number(t, prefix, key, lo, huge);
}

std::optional<Absorber> read_absorber(TomlReader& r, const toml::table& t, const std::string& prefix) {
  if (!require(r, t, prefix, "absorber")) return std::nullopt;
  const auto name = r.string(t, prefix, "absorber");
  if (!name) return std::nullopt;
  const auto a = absorber_from_name(*name);
  if (!a) {
    std::string known;
    for (Absorber k : all_absorbers) known += (known.empty() ? "" : ", ") + std::string(absorber_name(k));
    r.problem(t.get("absorber")->source(), prefix + ".absorber", fmt::format("unknown absorber \"{}\" (known: {})", *name, known));
  }
  return a;
}

void read_limits(TomlReader& r, const toml::table& t, const std::string& prefix, double& lower, double& upper) {
  if (auto v = r.number(t, prefix, "lower_cm1", 0.0, huge)) lower = *v;
  if (auto v = number_or_inf(r, t, prefix, "upper_cm1", tiny)) upper = *v;
  if (!(upper > lower)) r.problem(t.source(), prefix + ".upper_cm1", fmt::format("must exceed lower_cm1 ({} <= {})", upper, lower));
}

void read_band(TomlReader& r, const toml::table& t, const std::string& prefix, AnalyticRecipe& recipe) {
  r.reject_unknown_keys(t, prefix,
                        {"kind", "name", "absorber", "center_cm1", "kappa_m2_per_kg", "decay_lower_cm1", "decay_upper_cm1",
                         "lower_cm1", "upper_cm1", "reference_pressure_pa", "pressure_exponent", "minimum_pressure_pa",
                         "reference_temperature_k", "temperature_exponent"});
  ExponentialBand band;
  band.name = r.string(t, prefix, "name").value_or("");
  const auto absorber = read_absorber(r, t, prefix);
  if (absorber && *absorber == Absorber::h2o_self_continuum)
    r.problem(t.get("absorber")->source(), prefix + ".absorber",
              "the self-continuum is not an exponential band: use kind = \"self_continuum\"");
  if (absorber) band.absorber = *absorber;
  for (const char* key : {"center_cm1", "kappa_m2_per_kg", "decay_lower_cm1", "decay_upper_cm1", "reference_pressure_pa",
                          "pressure_exponent"})
    require(r, t, prefix, key);
  if (auto v = r.number(t, prefix, "center_cm1", 0.0, 1e6)) band.center_cm1 = *v;
  if (auto v = r.number(t, prefix, "kappa_m2_per_kg", 0.0, 1e12)) band.kappa_m2_kg = *v;
  if (auto v = number_or_inf(r, t, prefix, "decay_lower_cm1", 0.0)) band.decay_lower_cm1 = *v;
  if (auto v = number_or_inf(r, t, prefix, "decay_upper_cm1", 0.0)) band.decay_upper_cm1 = *v;
  if (auto v = r.number(t, prefix, "reference_pressure_pa", tiny, 1e9)) band.reference_pressure_pa = *v;
  if (auto v = r.number(t, prefix, "pressure_exponent", 0.0, 4.0)) band.pressure_exponent = *v;
  if (auto v = r.number(t, prefix, "minimum_pressure_pa", 0.0, 1e9)) band.minimum_pressure_pa = *v;
  if (t.get("temperature_exponent")) {
    require(r, t, prefix, "reference_temperature_k");
    if (auto v = r.number(t, prefix, "temperature_exponent", -50.0, 50.0)) band.temperature_exponent = *v;
  }
  if (auto v = r.number(t, prefix, "reference_temperature_k", 1.0, 1e4)) band.reference_temperature_k = *v;
  read_limits(r, t, prefix, band.lower_cm1, band.upper_cm1);
  if (band.decay_lower_cm1 == 0.0 && band.decay_upper_cm1 == 0.0 && t.get("decay_lower_cm1") && t.get("decay_upper_cm1"))
    r.problem(t.source(), prefix, "decay_lower_cm1 and decay_upper_cm1 are both 0: the band would have no width");
  recipe.bands.push_back(std::move(band));
}

void read_gaussian(TomlReader& r, const toml::table& t, const std::string& prefix, AnalyticRecipe& recipe) {
  r.reject_unknown_keys(t, prefix,
                        {"kind", "name", "absorber", "center_cm1", "kappa_m2_per_kg", "peak_cross_section_cm2_per_molecule",
                         "width_lower_cm1", "width_upper_cm1", "lower_cm1", "upper_cm1"});
  GaussianBand band;
  band.name = r.string(t, prefix, "name").value_or("");
  const auto absorber = read_absorber(r, t, prefix);
  if (absorber && *absorber == Absorber::h2o_self_continuum)
    r.problem(t.get("absorber")->source(), prefix + ".absorber",
              "the self-continuum is not a Gaussian band: use kind = \"self_continuum\"");
  if (absorber) band.absorber = *absorber;
  for (const char* key : {"center_cm1", "width_lower_cm1", "width_upper_cm1"})
    require(r, t, prefix, key);
  if (auto v = r.number(t, prefix, "center_cm1", 0.0, 1e6)) band.center_cm1 = *v;
  if (auto v = r.number(t, prefix, "width_lower_cm1", tiny, 1e6)) band.width_lower_cm1 = *v;
  if (auto v = r.number(t, prefix, "width_upper_cm1", tiny, 1e6)) band.width_upper_cm1 = *v;
  // The peak as a mass absorption coefficient, or as the cross-section per molecule that laboratory
  // spectroscopy reports (converted with the gas's molar mass).
  const bool has_kappa = t.get("kappa_m2_per_kg") != nullptr;
  const bool has_sigma = t.get("peak_cross_section_cm2_per_molecule") != nullptr;
  if (has_kappa == has_sigma)
    r.problem(t.source(), prefix + ".kappa_m2_per_kg",
              "give exactly one of kappa_m2_per_kg and peak_cross_section_cm2_per_molecule");
  if (auto v = r.number(t, prefix, "kappa_m2_per_kg", 0.0, 1e12); v && has_kappa && !has_sigma) band.kappa_m2_kg = *v;
  if (auto v = r.number(t, prefix, "peak_cross_section_cm2_per_molecule", 0.0, 1e-10); v && has_sigma && !has_kappa)
    band.kappa_m2_kg = *v * cross_section_si_factor(absorber_gas(band.absorber));
  read_limits(r, t, prefix, band.lower_cm1, band.upper_cm1);
  recipe.gaussians.push_back(std::move(band));
}

void read_continuum(TomlReader& r, const toml::table& t, const std::string& prefix, AnalyticRecipe& recipe) {
  r.reject_unknown_keys(t, prefix,
                        {"kind", "name", "absorber", "constant_cm2_per_molecule_atm", "amplitude_cm2_per_molecule_atm",
                         "decay_cm", "reference_temperature_k", "temperature_coefficient_k", "lower_cm1", "upper_cm1"});
  SelfContinuum c;
  c.name = r.string(t, prefix, "name").value_or("");
  const auto absorber = read_absorber(r, t, prefix);
  if (absorber && *absorber != Absorber::h2o_self_continuum)
    r.problem(t.get("absorber")->source(), prefix + ".absorber",
              "a self_continuum feature must have absorber = \"h2o_self_continuum\"");
  for (const char* key : {"constant_cm2_per_molecule_atm", "amplitude_cm2_per_molecule_atm", "decay_cm",
                          "reference_temperature_k", "temperature_coefficient_k"})
    require(r, t, prefix, key);
  if (auto v = r.number(t, prefix, "constant_cm2_per_molecule_atm", 0.0, 1.0)) c.constant_cm2_molecule_atm = *v;
  if (auto v = r.number(t, prefix, "amplitude_cm2_per_molecule_atm", 0.0, 1.0)) c.amplitude_cm2_molecule_atm = *v;
  if (auto v = r.number(t, prefix, "decay_cm", 0.0, 10.0)) c.decay_cm = *v;
  if (auto v = r.number(t, prefix, "reference_temperature_k", 1.0, 1e4)) c.reference_temperature_k = *v;
  if (auto v = r.number(t, prefix, "temperature_coefficient_k", -1e5, 1e5)) c.temperature_coefficient_k = *v;
  read_limits(r, t, prefix, c.lower_cm1, c.upper_cm1);
  recipe.continua.push_back(std::move(c));
}

} // namespace

AnalyticRecipe parse_absorber_recipe(std::string_view text, const std::string& file) {
  toml::table root;
  try {
    root = toml::parse(text, file);
  } catch (const toml::parse_error& e) {
    const auto& where = e.source().begin;
    throw InputError(fmt::format("{}:{}:{}: TOML syntax error: {}", file, where.line, where.column, e.description()));
  }
  TomlReader r(file);
  r.reject_unknown_keys(root, "", {"recipe", "feature"});

  AnalyticRecipe recipe;
  recipe.file = file;
  recipe.source_text = std::string(text);
  if (const toml::table* head = r.table(root, "", "recipe")) {
    r.reject_unknown_keys(*head, "recipe", {"name", "version", "description"});
    require(r, *head, "recipe", "name");
    require(r, *head, "recipe", "version");
    recipe.name = r.string(*head, "recipe", "name").value_or("");
    if (auto v = r.integer(*head, "recipe", "version", 1, 1000000)) recipe.version = static_cast<int>(*v);
    (void)r.string(*head, "recipe", "description");
  } else if (!root.get("recipe")) {
    r.problem("missing [recipe] table with name and version");
  }

  const auto features = r.table_array(root, "", "feature");
  if (features.empty() && !root.get("feature")) r.problem("no features: add at least one [[feature]] table");
  std::set<std::string> names;
  for (std::size_t i = 0; i < features.size(); ++i) {
    const toml::table& t = *features[i];
    const std::string prefix = fmt::format("feature[{}]", i);
    require(r, t, prefix, "name");
    if (auto name = r.string(t, prefix, "name")) {
      if (name->empty()) r.problem(t.get("name")->source(), prefix + ".name", "must not be empty");
      else if (!names.insert(*name).second)
        r.problem(t.get("name")->source(), prefix + ".name", "duplicate feature name \"" + *name + "\"");
    }
    if (!require(r, t, prefix, "kind")) continue;
    const auto kind = r.string(t, prefix, "kind");
    if (!kind) continue;
    if (*kind == "exponential_band") read_band(r, t, prefix, recipe);
    else if (*kind == "gaussian_band") read_gaussian(r, t, prefix, recipe);
    else if (*kind == "self_continuum") read_continuum(r, t, prefix, recipe);
    else
      r.problem(t.get("kind")->source(), prefix + ".kind",
                "unknown feature kind \"" + *kind + "\" (known: exponential_band, gaussian_band, self_continuum)");
  }

  if (!r.problems().empty()) {
    std::ostringstream out;
    out << r.problems().size() << (r.problems().size() == 1 ? " problem" : " problems") << " in the absorber recipe:";
    for (const std::string& p : r.problems()) out << "\n  " << p;
    throw InputError(out.str());
  }
  return recipe;
}

AnalyticRecipe load_absorber_recipe(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw FileError(path.string(), "cannot open the absorber recipe for reading");
  std::ostringstream text;
  text << in.rdbuf();
  if (in.bad()) throw FileError(path.string(), "error while reading the absorber recipe");
  return parse_absorber_recipe(text.str(), path.string());
}

} // namespace bandstack::spectral
