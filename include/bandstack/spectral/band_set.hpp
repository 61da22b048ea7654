#pragma once
// A band set: k-distributions of every absorber in every band, tabulated on a reference (p, T)
// grid, plus the Planck fraction of each g-point. Built by the band builder, stored in a band-set
// file (docs/band-set-file.md), used by the band optics.
//
// g-points are spectral-mapping bins: each g-point stands for a set of fine-grid wavenumbers of its
// band, chosen once by sorting the band's absorption at a reference state; the same set is used at
// every (p, T) (the correlated-k assumption). Hence each g-point has its own Planck fraction.
//
// A shortwave band set (built from a recipe with a [solar] table) also has the share of the incoming
// solar flux of each g-point and, optionally, its Rayleigh scattering cross-section; a longwave set
// leaves both empty.
#include <array>
#include <cstddef>
#include <string>
#include <vector>

#include "bandstack/spectral/absorber.hpp"

namespace bandstack::spectral {

struct BandSet {
  // Bands (n_band), contiguous and increasing: band b covers [band_lower_cm1[b], band_upper_cm1[b]].
  std::vector<double> band_lower_cm1;
  std::vector<double> band_upper_cm1;
  // g-points (n_g). The g-points of one band are contiguous and in band order.
  std::vector<std::size_t> gpoint_band;   // band index of each g-point
  std::vector<double> gpoint_weight;      // share of the band's wavenumber interval; sums to 1 per band
  // Reference grid of the tables, both strictly increasing.
  std::vector<double> ref_pressure_pa;    // n_p
  std::vector<double> ref_temperature_k;  // n_t
  // absorption_coefficient[((a * n_g + g) * n_t + t) * n_p + p] for absorber a (see absorber.hpp for
  // units). Absorbers with absorber_present[a] == false are all zero.
  std::vector<double> absorption_coefficient;
  std::array<bool, absorber_count> absorber_present{};
  // Planck fraction of each g-point within its band, planck_fraction[g * n_pt + t] at
  // planck_temperature_k[t] (strictly increasing). Sums to 1 over the g-points of a band.
  std::vector<double> planck_temperature_k; // n_pt
  std::vector<double> planck_fraction;
  // Shortwave sets only (empty otherwise). solar_weight[g]: the share of the solar flux at the top
  // of the atmosphere that falls on the g-point's wavenumbers; sums to 1 over all g-points of the
  // set (the set carries the whole total solar irradiance). rayleigh_cross_section_m2_kg[g]: the
  // solar-weighted mean Rayleigh scattering cross-section per unit mass of air of those wavenumbers
  // (m2 kg-1; tau = value * air mass in kg m-2); empty if the set has no Rayleigh scattering.
  std::vector<double> solar_weight;
  std::vector<double> rayleigh_cross_section_m2_kg;
  // Provenance, written to the file's global attributes.
  std::string name;                 // e.g. "default_lw"
  std::string source_description;   // the absorber source's description()
  std::string recipe_text;          // the build recipe
  std::string builder_version;      // bandstack version that built it

  [[nodiscard]] std::size_t band_count() const noexcept { return band_lower_cm1.size(); }
  [[nodiscard]] std::size_t gpoint_count() const noexcept { return gpoint_band.size(); }
  [[nodiscard]] bool is_shortwave() const noexcept { return !solar_weight.empty(); }
  [[nodiscard]] double kappa(Absorber a, std::size_t g, std::size_t t, std::size_t p) const noexcept {
    return absorption_coefficient[((index(a) * gpoint_count() + g) * ref_temperature_k.size() + t) * ref_pressure_pa.size() + p];
  }
};

// Checks sizes, ordering, finiteness, non-negative coefficients, weights and Planck fractions summing
// to 1 per band (1e-9); for shortwave sets, solar weights in [0, 1] summing to 1 over the set (1e-9)
// and finite, non-negative Rayleigh cross-sections (present only with solar weights). Throws
// InputError naming `file` and the variable.
void validate(const BandSet& set, const std::string& file = "");

// A copy of `set` in which only the bands flagged in `active` (one flag per band) absorb: every
// absorber's coefficient (gases and continuum) is zeroed at the g-points of inactive bands, so those
// bands become transparent; Planck fractions, solar weights and Rayleigh scattering are kept.
// Used to remove bands in experiments and for band attribution. Throws InputError (item
// "active_bands") if active.size() != band_count().
[[nodiscard]] BandSet with_active_bands(const BandSet& set, const std::vector<bool>& active);

} // namespace bandstack::spectral
