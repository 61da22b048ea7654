#pragma once
// Shortwave band optics: for every layer and g-point of a column, the extinction optical depth,
// single-scattering albedo and asymmetry factor the two-stream kernel (shortwave.hpp) takes, from a
// shortwave band set (spectral::BandSet with solar weights, band_set.hpp).
//
//   absorption:  tau_abs,g,i from the set's absorption tables exactly as for the longwave
//                (band_optics.hpp: the same interpolation, the same extrapolation and limits)
//   Rayleigh:    tau_R,g,i = r_g * (p_i+1 - p_i) / g       r_g = rayleigh_cross_section_m2_kg[g]
//   extinction:  tau = tau_abs + tau_R;  omega = tau_R / tau (0 where tau = 0);  asymmetry 0
// The air mass is that of the whole (moist) layer; Rayleigh scattering is symmetric, so the
// asymmetry factor is 0 (Bodhaine et al. 1999, rayleigh.hpp; common practice).
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/solvers/band_optics.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <cstddef>
#include <vector>

namespace bandstack::solvers {

// A shortwave band set rearranged for fast optics. Build once per set and share read-only.
struct ShortwaveOpticsTables {
  BandOpticsTables absorption;        // absorption tables (and the set's band layout)
  std::vector<double> solar_weight;   // n_g, sums to 1 over the set
  std::vector<double> rayleigh_m2_kg; // n_g, m2 per kg of air (zeros if the set has none)

  [[nodiscard]] std::size_t band_count() const noexcept { return absorption.band_count(); }
  [[nodiscard]] std::size_t gpoint_count() const noexcept { return absorption.gpoint_count(); }
};

// Validates the set and rearranges it. Throws InputError for an invalid set or one without solar
// weights (a longwave set), naming the set.
[[nodiscard]] ShortwaveOpticsTables
make_shortwave_optics_tables(const spectral::BandSet& set,
                             PressureInterpolation pressure_interpolation = PressureInterpolation::linear_in_p);

// Optical properties of one column, g-point-fastest ([i * n_g + g], N x n_g) as
// shortwave_fluxes_many reads them.
struct ShortwaveOptics {
  std::size_t layer_count = 0;
  std::size_t gpoint_count = 0;
  std::vector<double> optical_depth;            // extinction, absorption + Rayleigh
  std::vector<double> single_scattering_albedo; // in [0, 1]
  std::vector<double> asymmetry;                // 0
  std::vector<double> absorption_optical_depth; // absorption only
};

// Per-column scratch. One per thread.
struct ShortwaveOpticsWorkspace {
  BandOpticsWorkspace band_workspace;
  BandOptics band_optics;
};

// Optics of `column` into `out` (resized; no allocation once grown). Validates the column; throws
// InputError as compute_band_optics does for a state outside the tables, naming the level.
void compute_shortwave_optics(const atmosphere::Column& column, const ShortwaveOpticsTables& tables,
                              ShortwaveOptics& out, ShortwaveOpticsWorkspace& workspace);

// Convenience: tables built from `set` for this one call.
[[nodiscard]] ShortwaveOptics compute_shortwave_optics(const atmosphere::Column& column, const spectral::BandSet& set);

} // namespace bandstack::solvers
