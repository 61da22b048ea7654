#pragma once
// Finding band sets and absorber sources by built-in name or by path.
//
// Built-in names are the recipes compiled in from bands/ (see builtin_files.hpp): band sets
// "default_lw" and "fine_lw", absorber recipe "earth_idealised_absorbers". A built-in band set is read
// from the band-set file generated at build time (or installed) when that file was built from exactly
// the compiled-in recipe by this version of bandstack (the first such file on the search path wins);
// if there is none, it is rebuilt in memory from the recipe, which gives the same numbers (the
// builder is deterministic).
#include <filesystem>
#include <memory>
#include <string>
#include <vector>

#include "bandstack/spectral/absorber.hpp"
#include "bandstack/spectral/band_set.hpp"

namespace bandstack::io {

// Folders searched for built-in band-set files, in order: $BANDSTACK_BAND_PATH (colon-separated),
// the build tree's bands/ folder, the installed share/bandstack/bands folder.
[[nodiscard]] std::vector<std::filesystem::path> band_set_search_path();

// A band set: a built-in name, or a band-set file path (relative paths are taken relative to
// `relative_to`, usually the study file's folder). Throws InputError/FileError naming the path.
[[nodiscard]] spectral::BandSet load_band_set(const std::string& name_or_path,
                                              const std::filesystem::path& relative_to = {});

// Builds a built-in band set from its compiled-in recipe, ignoring any file. Throws InputError for
// an unknown name.
[[nodiscard]] spectral::BandSet build_builtin_band_set(const std::string& name);

// Builds a band set from a recipe: a built-in name ("default_lw") or a build-recipe file path.
[[nodiscard]] spectral::BandSet build_band_set_from_recipe(const std::string& name_or_path);

// An absorber source: a built-in analytic recipe name, an analytic recipe file (.toml) or a
// cross-section file (.nc).
[[nodiscard]] std::unique_ptr<spectral::AbsorberSource> load_absorber_source(const std::string& name_or_path,
                                                                             const std::filesystem::path& relative_to = {});

} // namespace bandstack::io
