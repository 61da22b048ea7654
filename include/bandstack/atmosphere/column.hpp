#pragma once
// The state of one atmospheric column: the input to optics and solvers.
//
// Vertical convention (used everywhere in bandstack): index 0 is the top of the atmosphere and
// indices grow downward. A column of N layers has N+1 levels (layer interfaces); layer i lies
// between level i (above) and level i+1 (below); level N is the surface. Pressure therefore
// increases strictly with the index.
#include <array>
#include <cstddef>
#include <string>
#include <vector>

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/gas.hpp"

namespace bandstack::atmosphere {

// Where the Sun is, for the shortwave. cos_zenith <= 0 means night (no direct beam).
struct SunGeometry {
  double cos_zenith = 0.5;               // cosine of the solar zenith angle
  double distance_factor = 1.0;          // (mean Earth-Sun distance / actual distance)^2
  double daylight_fraction = 1.0;        // fraction of the period the Sun is up (daily means); with an
                                         // insolation-weighted cos_zenith, the effective fraction that
                                         // conserves the mean insolation (see sun.hpp)
};

struct Column {
  std::string name;                                // label carried to the output
  std::vector<double> pressure_level_pa;           // N+1, strictly increasing, [N] = surface pressure
  std::vector<double> temperature_level_k;         // N+1, air temperature at the levels
  std::vector<double> pressure_layer_pa;           // N, representative layer pressure
  std::vector<double> temperature_layer_k;         // N, representative layer temperature
  std::array<std::vector<double>, gas_count> mole_fraction; // per gas, N values: mol per mol of moist air
  double surface_temperature_k = 288.0;            // skin temperature of the surface
  double surface_emissivity = 1.0;                 // broadband longwave emissivity, 0..1
  double surface_albedo = 0.3;                     // broadband shortwave albedo, 0..1
  double gravity_m_s2 = constants::standard_gravity_m_s2; // constant through the column
  SunGeometry sun;

  [[nodiscard]] std::size_t layer_count() const noexcept { return pressure_layer_pa.size(); }
  [[nodiscard]] std::size_t level_count() const noexcept { return pressure_level_pa.size(); }
  [[nodiscard]] const std::vector<double>& gas(Gas g) const noexcept { return mole_fraction[index(g)]; }
  [[nodiscard]] std::vector<double>& gas(Gas g) noexcept { return mole_fraction[index(g)]; }
};

// Checks sizes, finiteness, strictly increasing pressure, positive temperatures, mole fractions in
// [0, 1), emissivity and albedo in [0, 1]. Throws InputError naming `where` plus the offending
// variable and level. `where` usually carries the file and the column index.
void validate(const Column& column, const InputPlace& where = {});

// Mass of air per unit area in each layer, Δp / g (kg m-2), N values.
[[nodiscard]] std::vector<double> layer_air_mass_kg_m2(const Column& column);

// Mass of one gas per unit area in each layer (kg m-2), N values:
// Δp/g · x_gas · M_gas / M_moist, with M_moist = (1 − x_h2o) M_dry + x_h2o M_h2o.
[[nodiscard]] std::vector<double> layer_gas_mass_kg_m2(const Column& column, Gas gas);

} // namespace bandstack::atmosphere
