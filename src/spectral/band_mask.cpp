#include "bandstack/core/error.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <algorithm>
#include <fmt/format.h>

namespace bandstack::spectral {

BandSet with_active_bands(const BandSet& set, const std::vector<bool>& active) {
  if (active.size() != set.band_count())
    throw InputError(InputPlace::of("active_bands"),
                     fmt::format("has {} flags, expected one per band ({})", active.size(), set.band_count()));
  BandSet out = set;
  const std::size_t n_g = set.gpoint_count();
  const std::size_t per_gpoint = set.ref_temperature_k.size() * set.ref_pressure_pa.size();
  // absorption_coefficient is [((a * n_g + g) * n_t + t) * n_p + p]: one contiguous block of
  // n_t * n_p values per (absorber, g-point), zeroed whole for the g-points of inactive bands.
  if (out.absorption_coefficient.size() != absorber_count * n_g * per_gpoint) return out; // validate() reports it
  for (std::size_t a = 0; a < absorber_count; ++a)
    for (std::size_t g = 0; g < n_g; ++g) {
      const std::size_t b = set.gpoint_band[g];
      if (b < active.size() && active[b]) continue;
      const auto first = out.absorption_coefficient.begin() + static_cast<std::ptrdiff_t>((a * n_g + g) * per_gpoint);
      std::fill(first, first + static_cast<std::ptrdiff_t>(per_gpoint), 0.0);
    }
  return out;
}

} // namespace bandstack::spectral
