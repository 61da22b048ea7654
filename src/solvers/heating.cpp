#include "bandstack/solvers/heating.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

#include <cmath>
#include <string>
#include <utility>

namespace bandstack::solvers {

namespace {


} // namespace

void heating_rate_k_day(std::span<const double> pressure_level_pa, std::span<const double> flux_up,
                        std::span<const double> flux_down, double gravity, std::span<double> out) {
  const std::size_t n = out.size();
  if (pressure_level_pa.size() != n + 1 || flux_up.size() != n + 1 || flux_down.size() != n + 1)
    throw InputError(InputPlace::of("heating_rate"),
                     "needs layers + 1 = " + std::to_string(n + 1) + " pressure levels and fluxes, got " +
                         std::to_string(pressure_level_pa.size()) + " pressures, " + std::to_string(flux_up.size()) +
                         " upward and " + std::to_string(flux_down.size()) + " downward fluxes");
  if (!(gravity > 0.0) || !std::isfinite(gravity))
    throw InputError(InputPlace::of("gravity"), "must be finite and > 0 m s-2");
  // First law for a layer of mass dp/g per unit area at constant pressure:
  // c_p (dp/g) dT/dt = F_net(top) - F_net(bottom), F_net positive downward.
  const double factor = gravity / constants::specific_heat_dry_air_j_kg_k * constants::seconds_per_day;
  for (std::size_t i = 0; i < n; ++i) {
    const double dp = pressure_level_pa[i + 1] - pressure_level_pa[i];
    if (!(dp > 0.0) || !std::isfinite(dp)) {
      InputPlace place;
      place.item = "pressure_level";
      place.level = static_cast<long>(i + 1);
      throw InputError(place, "pressure must increase strictly from the top (index 0) to the surface");
    }
    const double net_top = flux_down[i] - flux_up[i];
    const double net_bottom = flux_down[i + 1] - flux_up[i + 1];
    out[i] = factor * (net_top - net_bottom) / dp;
  }
}

} // namespace bandstack::solvers
