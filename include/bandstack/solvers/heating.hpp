#pragma once
// Heating rates of layers from fluxes at their bounding levels.
#include <span>

namespace bandstack::solvers {

// Heating rate of each of the N layers in K/day:
//     out[i] = (g / c_p) * (F_net[i] - F_net[i+1]) / (p[i+1] - p[i]) * 86400 s/day,
// with the net flux F_net = flux_down - flux_up (W m-2, positive downward) and c_p =
// constants::specific_heat_dry_air_j_kg_k. A layer into which more energy flows than leaves warms
// (positive rate). pressure_level_pa (N+1, strictly increasing from the top, index 0), flux_up and
// flux_down (N+1, W m-2), gravity in m s-2 (> 0), out has N values. Throws InputError on wrong
// sizes, non-increasing pressure or non-positive gravity.
void heating_rate_k_day(std::span<const double> pressure_level_pa, std::span<const double> flux_up,
                        std::span<const double> flux_down, double gravity, std::span<double> out);

} // namespace bandstack::solvers
