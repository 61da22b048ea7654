#pragma once
// How the equilibrium solvers turn layer temperatures into a full Column: level temperatures
// from layer temperatures, and water vapour held at a fixed relative humidity or mixing ratio.
#include "bandstack/atmosphere/column.hpp"

namespace bandstack::climate {

enum class WaterTreatment {
  fixed_mole_fraction,     // water stays as in the starting column
  fixed_relative_humidity  // re-evaluated from the temperatures at every radiative call
};

struct WaterSettings {
  WaterTreatment treatment = WaterTreatment::fixed_mole_fraction;
  // fixed_relative_humidity: the Manabe & Wetherald (1967) profile of atmosphere/humidity_profile.hpp
  // with this surface value (fraction) below the tropopause, and stratospheric_mole_fraction (mol/mol)
  // above it. The tropopause is taken at the coldest layer (the cold point).
  double surface_relative_humidity = 0.77;
  double stratospheric_mole_fraction = 4e-6;
  // fixed_relative_humidity: multiplies the tropospheric water from the relative humidity (experiments
  // that scale or remove h2o); >= 0. The stratospheric value is not scaled.
  double h2o_scale = 1.0;
};

// Level temperatures (K) from the layer temperatures of `column`: interior level k (1..N-1) is
// interpolated linearly in ln p between the layers k-1 and k (at their layer pressures); the top
// level takes the top layer's temperature (isothermal above the top layer's centre); the surface
// level is the skin temperature when surface_air_is_skin (a convective region reaching the
// ground), otherwise extrapolated quadratically in ln p from the three lowest layers (kept within a
// factor 0.8-1.25 of the lowest layer), so that a radiative equilibrium may keep its air-ground
// temperature jump. Writes column.temperature_level_k (resized to N+1).
// Throws InputError if the column has no layers or inconsistent sizes.
void set_level_temperatures(atmosphere::Column& column, bool surface_air_is_skin);

// Re-evaluates the water-vapour mole fraction of `column` from its layer temperatures when the
// treatment is fixed_relative_humidity; does nothing for fixed_mole_fraction. Throws InputError
// for a temperature outside the saturation formulas (110-332 K) or bad settings.
void update_water(atmosphere::Column& column, const WaterSettings& water);

} // namespace bandstack::climate
