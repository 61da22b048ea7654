#pragma once
// Shortwave fluxes and heating rates of one column, in total and by band.
#include <cstddef>
#include <vector>

namespace bandstack::solvers {

struct ShortwaveResult {
  std::vector<double> flux_up;             // N+1 levels, W m-2 (index 0 = top)
  std::vector<double> flux_down;           // N+1 levels, W m-2: direct + diffuse
  std::vector<double> flux_down_direct;    // N+1 levels, W m-2, on a horizontal surface
  std::vector<double> flux_down_diffuse;   // N+1 levels, W m-2
  std::vector<double> heating_rate_k_day;  // N layers, K/day

  std::vector<double> band_lower_cm1;          // n_band
  std::vector<double> band_upper_cm1;          // n_band
  std::vector<double> flux_up_by_band;         // [b * (N+1) + k], W m-2
  std::vector<double> flux_down_by_band;       // [b * (N+1) + k], W m-2 (direct + diffuse)
  std::vector<double> heating_rate_by_band;    // [b * N + i], K/day

  [[nodiscard]] std::size_t band_count() const noexcept { return band_lower_cm1.size(); }
  // Incoming solar flux at the top of the atmosphere (W m-2).
  [[nodiscard]] double toa_incoming() const { return flux_down.front(); }
  // Reflected to space (W m-2).
  [[nodiscard]] double reflected() const { return flux_up.front(); }
  // Absorbed by atmosphere and surface together: net flux at the top (W m-2).
  [[nodiscard]] double absorbed_solar() const { return flux_down.front() - flux_up.front(); }
  // Absorbed by the surface (W m-2).
  [[nodiscard]] double surface_absorbed() const { return flux_down.back() - flux_up.back(); }
};

} // namespace bandstack::solvers
