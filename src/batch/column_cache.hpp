#pragma once
// Private to batch: built-in columns shared between the columns of a study that differ only in what
// make_column merely assigns (well-mixed gases, surface emissivity and albedo). Building the
// temperature, water and ozone profiles (a moist adiabat for the tropical profile, hypsometric
// heights) costs far more than a radiative solve of a thin column; a sweep of CO2 builds them once.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/profiles.hpp"

namespace bandstack::batch {

// atmosphere::make_column(settings, grid, name), bit-identical, from a process-wide cache of the
// profiles of recent settings (bounded; thread-safe).
[[nodiscard]] atmosphere::Column cached_make_column(const atmosphere::ProfileSettings& settings,
                                                    const atmosphere::GridSpec& grid, const std::string& name);

} // namespace bandstack::batch
