#pragma once
// A small shortwave build recipe shared by the shortwave builder tests: 2000-50000 cm-1 on a 1 cm-1
// grid in three bands (4 + 3 + 3 g-points), a coarse reference grid and a mid-troposphere ordering
// state. The caller supplies the header lines (name, absorber source) and the [solar] table.
#include <string>

namespace bandstack::testing {

inline std::string tiny_sw_recipe_body(int pressure_count) {
  std::string text = R"(wavenumber_step_cm1 = 1.0
[reference_grid]
pressure_min_hpa = 1.0
pressure_max_hpa = 1100.0
pressure_count = )";
  text += std::to_string(pressure_count);
  text += R"(
temperature_min_k = 150.0
temperature_max_k = 350.0
temperature_step_k = 200.0
planck_temperature_min_k = 200.0
planck_temperature_max_k = 300.0
planck_temperature_step_k = 100.0
[ordering_state]
pressure_hpa = 500.0
temperature_k = 260.0
h2o_ppmv = 2000.0
co2_ppmv = 400.0
o3_ppmv = 1.0
ch4_ppmv = 1.8
n2o_ppmv = 0.32
[[bands]]
lower_cm1 = 2000.0
upper_cm1 = 9000.0
gpoints = 4
[[bands]]
lower_cm1 = 9000.0
upper_cm1 = 25000.0
gpoints = 3
[[bands]]
lower_cm1 = 25000.0
upper_cm1 = 50000.0
gpoints = 3
)";
  return text;
}

} // namespace bandstack::testing
