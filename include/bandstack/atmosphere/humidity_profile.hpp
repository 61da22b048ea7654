#pragma once
// Water vapour of built-in columns: the relative-humidity profile of Manabe & Wetherald (1967)
// below the tropopause and a fixed mixing ratio above it.
#include <vector>

#include "bandstack/atmosphere/column.hpp"

namespace bandstack::atmosphere {

// Manabe, S. and Wetherald, R. T. (1967), J. Atmos. Sci. 24, 241-259, eq. for the vertical
// distribution of relative humidity (from memory): RH = RH_s (p/p_s - 0.02) / (1 - 0.02),
// clipped at 0 where p/p_s < 0.02. Fractions (1 = saturated), pressures in Pa.
// Throws InputError unless 0 <= surface_relative_humidity <= 1 and 0 < p, 0 < p_s.
[[nodiscard]] double manabe_wetherald_relative_humidity(double pressure_pa, double surface_pressure_pa,
                                                        double surface_relative_humidity);

// Water-vapour mole fraction (mol/mol of moist air) per layer. In the troposphere
// (layer pressure >= tropopause_pressure_pa): max(x(RH_MW, p, T), floor), with x from
// thermo::mole_fraction_from_relative_humidity; for layers above the tropopause: the floor
// (stratospheric_mole_fraction), as water entering the stratosphere is set by the cold trap.
// layer_pressure_pa and layer_temperature_k have the same length (Pa, K).
[[nodiscard]] std::vector<double> water_vapour_mole_fraction(const std::vector<double>& layer_pressure_pa,
                                                             const std::vector<double>& layer_temperature_k,
                                                             double surface_pressure_pa,
                                                             double surface_relative_humidity,
                                                             double tropopause_pressure_pa,
                                                             double stratospheric_mole_fraction);

// Total precipitable water of a column, kg m-2 (= mm of liquid): the sum of the layers' water mass.
[[nodiscard]] double precipitable_water_kg_m2(const Column& column);

} // namespace bandstack::atmosphere
