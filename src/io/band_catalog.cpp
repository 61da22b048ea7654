#include "bandstack/io/band_catalog.hpp"

#include <cstdlib>
#include <sstream>

#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/band_set_file.hpp"
#include "bandstack/io/builtin_files.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"
#include "bandstack/spectral/band_builder.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

namespace bandstack::io {

namespace fs = std::filesystem;

namespace {

// Built-in files are addressed as "bands/<name>.toml" in messages and provenance.
std::string builtin_label(const std::string& file_name) { return "bands/" + file_name; }

// Naming convention of bands/: band-set recipes end in _lw.toml or _sw.toml, absorber recipes in
// _absorbers.toml.
bool is_band_set_name(std::string_view name) {
  return name.size() > 3 && (name.substr(name.size() - 3) == "_lw" || name.substr(name.size() - 3) == "_sw");
}

std::optional<std::string_view> builtin_recipe(const std::string& name) {
  if (!is_band_set_name(name)) return std::nullopt;
  return builtin_file(name + ".toml");
}

fs::path resolve(const std::string& path, const fs::path& relative_to) {
  const fs::path p(path);
  return p.is_relative() && !relative_to.empty() ? relative_to / p : p;
}

std::unique_ptr<spectral::AbsorberSource> builtin_absorbers(const std::string& file_name) {
  if (!file_name.ends_with("_absorbers.toml")) return nullptr;
  const auto text = builtin_file(file_name);
  if (!text) return nullptr;
  return std::make_unique<spectral::AnalyticAbsorber>(spectral::parse_absorber_recipe(*text, builtin_label(file_name)));
}

} // namespace

std::vector<fs::path> band_set_search_path() {
  std::vector<fs::path> folders;
  if (const char* env = std::getenv("BANDSTACK_BAND_PATH")) {
    std::stringstream list(env);
    for (std::string item; std::getline(list, item, ':');)
      if (!item.empty()) folders.emplace_back(item);
  }
#ifdef BANDSTACK_BUILD_BAND_DIR
  folders.emplace_back(BANDSTACK_BUILD_BAND_DIR);
#endif
#ifdef BANDSTACK_INSTALL_BAND_DIR
  folders.emplace_back(BANDSTACK_INSTALL_BAND_DIR);
#endif
  return folders;
}

spectral::BandSet build_builtin_band_set(const std::string& name) {
  const auto text = builtin_recipe(name);
  if (!text) throw InputError(InputPlace{"", "band_set", {}, {}, {}, {}}, "no built-in band set named '" + name + "'");
  const spectral::BuildRecipe recipe = spectral::parse_build_recipe(*text, builtin_label(name + ".toml"));
  std::unique_ptr<spectral::AbsorberSource> source;
  if (recipe.absorber_recipe) source = builtin_absorbers(recipe.absorber_recipe->filename().string());
  if (!source) source = spectral::open_absorber_source(recipe);
  return spectral::build_band_set(recipe, *source);
}

spectral::BandSet build_band_set_from_recipe(const std::string& name_or_path) {
  std::error_code ec;
  if (builtin_recipe(name_or_path) && !fs::exists(name_or_path, ec)) return build_builtin_band_set(name_or_path);
  const spectral::BuildRecipe recipe = spectral::load_build_recipe(name_or_path);
  return spectral::build_band_set(recipe, *spectral::open_absorber_source(recipe));
}

spectral::BandSet load_band_set(const std::string& name_or_path, const fs::path& relative_to) {
  if (const auto text = builtin_recipe(name_or_path)) {
    // A generated file is used only if it was built from exactly this recipe by this version.
    for (const fs::path& folder : band_set_search_path()) {
      const fs::path candidate = folder / (name_or_path + ".nc");
      std::error_code ec;
      if (!fs::is_regular_file(candidate, ec)) continue;
      try {
        spectral::BandSet set = read_band_set(candidate);
        if (set.recipe_text == *text && set.builder_version == version()) return set;
      } catch (const Error&) {
        // An unreadable generated file is not the user's problem: fall back to rebuilding.
      }
    }
    return build_builtin_band_set(name_or_path);
  }
  const fs::path path = resolve(name_or_path, relative_to);
  std::error_code ec;
  if (!fs::exists(path, ec)) {
    std::string known;
    for (std::string_view f : builtin_file_names())
      if (const std::string_view stem = f.substr(0, f.size() - 5); is_band_set_name(stem))
        known += (known.empty() ? "" : ", ") + std::string(stem);
    throw FileError(path.string(), "no such band-set file, and not a built-in band set (built-in: " + known + ")");
  }
  return read_band_set(path);
}

std::unique_ptr<spectral::AbsorberSource> load_absorber_source(const std::string& name_or_path, const fs::path& relative_to) {
  if (auto source = builtin_absorbers(name_or_path + ".toml")) return source;
  const fs::path path = resolve(name_or_path, relative_to);
  if (path.extension() == ".nc") return std::make_unique<spectral::CrossSectionAbsorber>(path);
  return std::make_unique<spectral::AnalyticAbsorber>(spectral::load_absorber_recipe(path));
}

} // namespace bandstack::io
