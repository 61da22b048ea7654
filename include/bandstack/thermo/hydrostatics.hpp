#pragma once
// Heights of pressure levels from the hypsometric equation.
#include <vector>

namespace bandstack::thermo {

// Virtual temperature T (1 + x (1/eps − 1)... ) written with the water mole fraction x:
// T_v = T / (1 − x (1 − eps)), eps = M_w / M_d.
[[nodiscard]] double virtual_temperature_k(double temperature_k, double water_mole_fraction);

// Height of each level above the bottom (last) level, m, integrating the hypsometric equation
// layer by layer: z_i − z_{i+1} = (R_d T_v,i / g) ln(p_{i+1} / p_i), using the layer's virtual
// temperature. level_pressure_pa has N+1 values increasing downward (index 0 = top, which must
// be > 0 Pa); layer_temperature_k and layer_water_mole_fraction have N values.
[[nodiscard]] std::vector<double> level_heights_m(const std::vector<double>& level_pressure_pa,
                                                  const std::vector<double>& layer_temperature_k,
                                                  const std::vector<double>& layer_water_mole_fraction,
                                                  double gravity_m_s2);

} // namespace bandstack::thermo
