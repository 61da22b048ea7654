#pragma once
// Longwave fluxes and heating rates of one column, in total and (for band solvers) by band.
#include <cstddef>
#include <vector>

namespace bandstack::solvers {

struct LongwaveResult {
  std::vector<double> flux_up;            // N+1 levels, W m-2, positive upward (index 0 = top)
  std::vector<double> flux_down;          // N+1 levels, W m-2, positive downward
  std::vector<double> heating_rate_k_day; // N layers, K/day (see heating.hpp)

  // By band; all empty for the grey solver. n_band = band_lower_cm1.size().
  std::vector<double> band_lower_cm1;          // n_band
  std::vector<double> band_upper_cm1;          // n_band
  std::vector<double> flux_up_by_band;         // [b * (N+1) + k], W m-2
  std::vector<double> flux_down_by_band;       // [b * (N+1) + k], W m-2
  std::vector<double> heating_rate_by_band;    // [b * N + i], K/day

  [[nodiscard]] std::size_t band_count() const noexcept { return band_lower_cm1.size(); }
  // Outgoing longwave radiation: flux_up at the top level (W m-2).
  [[nodiscard]] double olr() const;
  // Downward flux at the surface level (W m-2).
  [[nodiscard]] double surface_down() const;
};

} // namespace bandstack::solvers
