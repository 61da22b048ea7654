#pragma once
// The band builder: k-distributions by spectral mapping, from an absorber source on a fine
// wavenumber grid to a BandSet (docs/build-recipe.md describes the recipe and the method).
//
// Per band: every absorber's kappa is evaluated on the fine grid at the band's ordering state and
// combined into one key, the optical depth per unit mass of air,
//   key(nu) = sum over gases of kappa_gas(nu) * q_gas  +  kappa_self(nu) * q_h2o * e_h2o     (m2 kg-1)
// (q = mass mixing ratio x * M_gas / M_dry_air, e_h2o = x_h2o * p). The band's fine-grid points are
// sorted by that key (ascending; ties by wavenumber), and the sorted sequence is cut into g-points at
// the band's g boundaries. A g-point is thus a fixed set of wavenumbers; its table entry at each
// reference (p, T) is the mean over that set of kappa(p, T), its Planck fraction the share of the
// band's Planck integral that falls on that set, and its weight the share of the band's points.
//
// Shortwave sets (a recipe with a [solar] table): the key also has the Rayleigh scattering
// cross-section per unit mass of air (rayleigh.hpp) added, so g-points follow the extinction, and
// each g-point gets its solar weight (its share of the solar spectrum over the whole set) and its
// solar-weighted mean Rayleigh cross-section.
#include "bandstack/core/gas.hpp"
#include "bandstack/spectral/absorber.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <array>
#include <cstddef>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace bandstack::spectral {

// The state at which a band's absorption is sorted into g-points.
struct OrderingState {
  double pressure_pa = 50000.0;
  double temperature_k = 260.0;
  std::array<double, gas_count> mole_fraction{}; // mol mol-1, indexed by index(Gas)
};

// How the table entry of a g-point is formed from the kappa of its wavenumbers.
enum class GpointMean {
  // (1/n) sum kappa_i: exact for optically thin paths and linear, so the g-point optical depths of
  // several absorbers add exactly as the line-resolved ones do (the default).
  arithmetic,
  // -<kappa> ln <exp(-kappa_i / <kappa>)>: the kappa that gives the bin's mean transmission on the
  // path of unit mean optical depth (<= arithmetic; equal when the bin's kappa is uniform).
  transmission,
};

struct BandRecipe {
  double lower_cm1 = 0.0;
  double upper_cm1 = 0.0;
  // g boundaries in [0, 1], strictly increasing, first 0 and last 1: one more than the band's
  // g-points. g = 0 is the weakest end of the sorted key.
  std::vector<double> g_boundaries;
  OrderingState ordering; // the recipe's [ordering_state] with the band's own overrides applied
};

// The solar source of a shortwave set: a spectral irradiance proportional to the Planck function
// B_nu(T_b(nu)) at a brightness temperature T_b that is `temperature_k` everywhere except between
// the first and last of the optional nodes, where it is interpolated linearly in wavenumber between
// them (to follow a measured spectrum, e.g. its ultraviolet deficit); or, with `spectrum_file`, the
// spectral irradiance of a solar spectrum file (solar_spectrum.hpp), interpolated linearly to the
// fine grid, which it must cover. Only the shape matters: the solar weights are normalised to sum to
// 1 over the set.
struct SolarRecipe {
  double temperature_k = 5772.0;                   // K (unused with spectrum_file)
  std::vector<double> brightness_node_cm1;         // strictly increasing, or empty
  std::vector<double> brightness_node_k;           // same size, K
  // key `spectrum_file` (resolved against the recipe's folder): the solar spectrum instead of the
  // blackbody; excludes brightness nodes.
  std::optional<std::filesystem::path> spectrum_file;
  bool rayleigh_scattering = true;                 // store Rayleigh cross-sections (rayleigh.hpp)

  // T_b at nu_cm1 (K).
  [[nodiscard]] double brightness_temperature_k(double nu_cm1) const noexcept;
};

struct BuildRecipe {
  std::string name; // the band set's name, e.g. "default_lw"
  std::string file; // where the recipe was read from (messages, provenance)
  std::string text; // the recipe text (provenance)
  // Exactly one of the two absorber sources, as absolute or recipe-relative-resolved paths.
  std::optional<std::filesystem::path> absorber_recipe;    // key `absorbers` (analytic recipe)
  std::optional<std::filesystem::path> cross_section_file; // key `cross_section_file`
  double wavenumber_step_cm1 = 0.1;                        // fine grid step, 0.01 .. 1
  GpointMean gpoint_mean = GpointMean::arithmetic;
  std::vector<BandRecipe> bands;            // contiguous, increasing
  std::vector<double> ref_pressure_pa;      // strictly increasing (log-spaced by the parser)
  std::vector<double> ref_temperature_k;    // strictly increasing
  std::vector<double> planck_temperature_k; // strictly increasing
  std::optional<SolarRecipe> solar;         // key [solar]: set => a shortwave set

  [[nodiscard]] std::size_t gpoint_count() const noexcept {
    std::size_t n = 0;
    for (const BandRecipe& b : bands)
      n += b.g_boundaries.size() - 1;
    return n;
  }
};

// g boundaries for n g-points whose widths shrink by `ratio` from one g-point to the next
// (ratio 1: equal widths; ratio < 1: finer towards the strong end g = 1). n >= 1, ratio in (0, 1].
[[nodiscard]] std::vector<double> geometric_g_boundaries(std::size_t n, double ratio);

// Parses a build recipe (TOML, docs/build-recipe.md). `file` names the recipe in messages and is the
// folder relative paths are resolved against. Every problem is collected and reported in one
// InputError, each with file:line:column and the key (e.g. "bands[3].upper_cm1").
[[nodiscard]] BuildRecipe parse_build_recipe(std::string_view text, const std::string& file);
// Reads and parses a recipe file (FileError if it cannot be read).
[[nodiscard]] BuildRecipe load_build_recipe(const std::filesystem::path& path);

// The recipe's absorber source: an AnalyticAbsorber for `absorbers`, a CrossSectionAbsorber for
// `cross_section_file`. Throws FileError / InputError from reading that file.
[[nodiscard]] std::unique_ptr<AbsorberSource> open_absorber_source(const BuildRecipe& recipe);

// Builds the band set. Runs in parallel on the current oneTBB arena; the result is bit-identical for
// any number of threads. Throws InputError if the recipe is inconsistent (bands not on the fine grid,
// a g-point with no wavenumbers) or the source gives a negative or non-finite kappa.
[[nodiscard]] BandSet build_band_set(const BuildRecipe& recipe, const AbsorberSource& source);

// The optical-depth-per-unit-air-mass weights of the ordering key for each absorber at `state`
// (m2 kg-1 of air per m2 kg-1 of gas for gases; times Pa for the self-continuum): key = sum_a w_a kappa_a.
[[nodiscard]] std::array<double, absorber_count> ordering_key_weights(const OrderingState& state) noexcept;

} // namespace bandstack::spectral
