#pragma once
// Vertical grids in pressure for built-in columns. Index 0 is the top of the atmosphere, the
// last level is the surface (the convention of column.hpp).
#include <cstddef>
#include <vector>

namespace bandstack::atmosphere {

// How level pressures are spaced between the top and the surface.
enum class Spacing {
  log_pressure,    // equal steps in ln p: equal thickness in height for an isothermal atmosphere
  linear_pressure  // equal steps in p: equal mass per layer
};

// A grid of `layers` layers between top_pressure_pa and surface_pressure_pa (both Pa).
struct GridSpec {
  std::size_t layers = 60;
  double top_pressure_pa = 10.0;
  double surface_pressure_pa = 101325.0;
  Spacing spacing = Spacing::log_pressure;
};

// Level pressures (Pa), layers + 1 values strictly increasing; [0] = top_pressure_pa exactly and
// [layers] = surface_pressure_pa exactly. Throws InputError (item "layers", "top_pressure" or
// "surface_pressure") unless layers >= 1 and 0 < top < surface, both finite.
// Example: {2 layers, 10 Pa, 1000 Pa, log_pressure} gives {10, 100, 1000}.
[[nodiscard]] std::vector<double> level_pressures_pa(const GridSpec& grid);

// Layer pressures (Pa) for given level pressures: the mean of the two bounding levels, N values.
[[nodiscard]] std::vector<double> layer_pressures_pa(const std::vector<double>& level_pressure_pa);

} // namespace bandstack::atmosphere
