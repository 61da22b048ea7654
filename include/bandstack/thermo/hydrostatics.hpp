#pragma once
// Virtual temperature and heights of pressure levels from the hypsometric equation.
#include <vector>

namespace bandstack::thermo {

// Virtual temperature, K: the temperature dry air would need to have the density of the moist air
// at the same pressure. With the water mole fraction x (mol/mol, in [0, 1)) and eps = M_h2o / M_dry,
// the molar mass of moist air is M_dry (1 - x (1 - eps)), hence T_v = T / (1 - x (1 - eps)).
// Throws InputError for T <= 0 or x outside [0, 1).
[[nodiscard]] double virtual_temperature_k(double temperature_k, double water_mole_fraction);

// Height of each level above the bottom (last) level, m, integrating the hypsometric equation
// layer by layer: z_i − z_{i+1} = (R_d T_v,i / g) ln(p_{i+1} / p_i), using the layer's virtual
// temperature. level_pressure_pa has N+1 >= 2 values strictly increasing downward (index 0 = top,
// which must be > 0 Pa); layer_temperature_k has N values; layer_water_mole_fraction has N values
// or is empty for dry air. With gravity_m_s2 = standard_gravity_m_s2 the heights are geopotential
// heights. Returns N+1 values, the last one 0. Throws InputError naming the offending level/layer.
[[nodiscard]] std::vector<double> level_heights_m(const std::vector<double>& level_pressure_pa,
                                                  const std::vector<double>& layer_temperature_k,
                                                  const std::vector<double>& layer_water_mole_fraction,
                                                  double gravity_m_s2);

} // namespace bandstack::thermo
