#pragma once
// Where the tropopause of a column is.
#include <cstddef>

#include "bandstack/atmosphere/column.hpp"

namespace bandstack::atmosphere {

// The lapse-rate tropopause (WMO 1957 definition, as restated e.g. in Holton, An Introduction to
// Dynamic Meteorology; from memory): the lowest level, above the lowest layer, at which the lapse
// rate -dT/dz falls to 2 K/km or less, provided the average lapse rate between that level and every
// level within the next 2 km above it also stays at or below 2 K/km. Heights from the hypsometric
// equation with the layer temperatures (dry air). Uses layer temperatures at layer pressures: the
// lapse rate at level k is taken between the centres of layers k and k-1, and the 2 km test starts
// at the centre of layer k. "Falls to": the search starts above the lowest level whose lapse rate
// exceeds 2 K/km, so a surface-based inversion is not taken for the tropopause.
// Returns the level index k (1..N-1): layers i < k form the stratosphere. If no level qualifies,
// returns the level above the coldest layer. Throws InputError for a column with fewer than 3 layers.
[[nodiscard]] std::size_t lapse_rate_tropopause_level(const Column& column);

} // namespace bandstack::atmosphere
