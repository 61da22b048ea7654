#pragma once
// The embedded analytic absorber recipe: idealised absorption features (exponential bands and the
// water-vapour self-continuum) read from a TOML text file in bands/ (docs/absorber-recipe.md).
//
//   exponential band: kappa(nu, p, T) = kappa_ref * (max(p, p_min)/p_ref)^n * (T/T_ref)^m * exp(-|nu - nu_c| / l)
//                     with l = decay_lower_cm1 below the centre and decay_upper_cm1 above it
//                     (p_min = minimum_pressure_pa, 0 = no floor: below it lines stop narrowing),
//                     (l = 0: no absorption on that side; l = inf: flat, kappa_ref, on that side),
//                     and zero outside [lower_cm1, upper_cm1].           kappa in m2 kg-1 of the gas
//   gaussian band:    kappa(nu) = kappa_peak * exp(-(nu - nu_c)^2 / (2 s^2))
//                     with s = width_lower_cm1 below the centre and width_upper_cm1 above it, zero
//                     outside [lower_cm1, upper_cm1], independent of p and T: the broad electronic
//                     bands of a molecule (ozone's Hartley-Huggins and Chappuis bands), whose
//                     cross-sections are not pressure broadened.               kappa in m2 kg-1 of the gas
//   self-continuum:   C_s(nu, T) = (a + b exp(-beta nu)) exp(T0 (1/T - 1/T_ref))
//                     in cm2 molecule-1 atm-1 (Roberts, Selby & Biberman 1976), converted to
//                     kappa = C_s * 1e-4 * N_A / M_h2o / 101325           in m2 kg-1 Pa-1
#include <array>
#include <filesystem>
#include <limits>
#include <string>
#include <string_view>
#include <vector>

#include "bandstack/spectral/absorber.hpp"

namespace bandstack::spectral {

struct ExponentialBand {
  std::string name;                    // unique within the recipe, e.g. "co2_15um"
  Absorber absorber = Absorber::co2;   // a gas (never h2o_self_continuum)
  double center_cm1 = 0.0;             // nu_c
  double kappa_m2_kg = 0.0;            // kappa_ref at the centre, at p_ref and T_ref
  double decay_lower_cm1 = 0.0;        // e-folding width below the centre (0: none, inf: flat)
  double decay_upper_cm1 = 0.0;        // e-folding width above the centre (0: none, inf: flat)
  double lower_cm1 = 0.0;              // feature limits: zero outside [lower_cm1, upper_cm1]
  double upper_cm1 = std::numeric_limits<double>::infinity();
  double reference_pressure_pa = 0.0;  // p_ref
  double pressure_exponent = 1.0;      // n (1 = pressure broadening of the line wings)
  double minimum_pressure_pa = 0.0;    // p_min: pressures below it count as p_min (0 = no floor)
  double reference_temperature_k = 296.0; // T_ref (only used when temperature_exponent != 0)
  double temperature_exponent = 0.0;   // m
};

struct GaussianBand {
  std::string name;                    // unique within the recipe, e.g. "o3_chappuis"
  Absorber absorber = Absorber::o3;    // a gas (never h2o_self_continuum)
  double center_cm1 = 0.0;             // nu_c
  double kappa_m2_kg = 0.0;            // kappa_peak at the centre
  double width_lower_cm1 = 0.0;        // standard deviation s below the centre (> 0)
  double width_upper_cm1 = 0.0;        // standard deviation s above the centre (> 0)
  double lower_cm1 = 0.0;              // feature limits: zero outside [lower_cm1, upper_cm1]
  double upper_cm1 = std::numeric_limits<double>::infinity();
};

struct SelfContinuum {
  std::string name;                        // e.g. "h2o_self_continuum"
  double constant_cm2_molecule_atm = 0.0;  // a
  double amplitude_cm2_molecule_atm = 0.0; // b
  double decay_cm = 0.0;                   // beta (cm, i.e. per cm-1)
  double reference_temperature_k = 296.0;  // T_ref
  double temperature_coefficient_k = 0.0;  // T0
  double lower_cm1 = 0.0;                  // zero outside [lower_cm1, upper_cm1]
  double upper_cm1 = std::numeric_limits<double>::infinity();
};

struct AnalyticRecipe {
  std::string name;        // [recipe] name
  int version = 0;         // [recipe] version
  std::string file;        // where it was read from (for provenance and messages)
  std::string source_text; // the recipe text itself (for provenance)
  std::vector<ExponentialBand> bands;
  std::vector<GaussianBand> gaussians;
  std::vector<SelfContinuum> continua;
};

// Parses a recipe. Every problem is collected and reported in one InputError, each with
// file:line:column and the key (e.g. "feature[2].center_cm1").
[[nodiscard]] AnalyticRecipe parse_absorber_recipe(std::string_view text, const std::string& file);
// Reads and parses a recipe file (FileError if it cannot be read).
[[nodiscard]] AnalyticRecipe load_absorber_recipe(const std::filesystem::path& path);

// The self-continuum cross-section C_s in cm2 molecule-1 atm-1 at nu_cm1 and t_k (no limits applied).
[[nodiscard]] double self_continuum_cm2_molecule_atm(const SelfContinuum& c, double nu_cm1, double t_k) noexcept;
// The factor from cm2 molecule-1 atm-1 (per atm of water vapour pressure) to m2 kg-1 Pa-1.
[[nodiscard]] double self_continuum_si_factor() noexcept;
// The factor from a cross-section in cm2 per molecule of gas `gas` to m2 per kg of that gas:
// 1e-4 * N_A / M_gas.
[[nodiscard]] double cross_section_si_factor(Gas gas) noexcept;

namespace detail {
// One piece of a feature, precomputed by AnalyticAbsorber: on nu in [lower_cm1, upper_cm1) (or
// [lower_cm1, upper_cm1] if upper_inclusive),
// kappa = amplitude * F(state) * exp(slope_cm * (nu - nu_ref_cm1) + curvature_cm2 * (nu - nu_ref_cm1)^2)
// with F = (max(p, p_min)/p_ref)^p_exponent (T/t_ref)^t_exponent for bands, exp(t0 (1/T - 1/t_ref)) for the continuum.
struct SpectralSegment {
  double lower_cm1 = 0.0, upper_cm1 = 0.0;
  bool upper_inclusive = false;
  double amplitude = 0.0; // m2 kg-1, or m2 kg-1 Pa-1 for the continuum
  double nu_ref_cm1 = 0.0, slope_cm = 0.0;
  double curvature_cm2 = 0.0; // -1 / (2 s^2) for a Gaussian half, 0 otherwise
  bool continuum = false;
  double p_ref_pa = 1.0, p_exponent = 0.0, p_min_pa = 0.0, t_ref_k = 296.0, t_exponent = 0.0, t0_k = 0.0;
};
} // namespace detail

// Absorption from an analytic recipe. Thread-safe (absorption() is const and keeps no state).
class AnalyticAbsorber : public AbsorberSource {
public:
  explicit AnalyticAbsorber(AnalyticRecipe recipe);

  // "analytic recipe NAME vVERSION (FILE)".
  [[nodiscard]] std::string description() const override;
  [[nodiscard]] bool provides(Absorber a) const override;
  // Sum of the recipe's features for `a` on `grid`. InputError for a non-positive or non-finite
  // pressure or temperature, or if out.size() != grid.count.
  void absorption(Absorber a, const AbsorberState& state, const WavenumberGrid& grid, std::span<double> out) const override;

  [[nodiscard]] const AnalyticRecipe& recipe() const noexcept { return recipe_; }

private:
  AnalyticRecipe recipe_;
  std::array<std::vector<detail::SpectralSegment>, absorber_count> segments_;
};

} // namespace bandstack::spectral
