#pragma once
// An analytic ozone profile: the form of Green (1964, Appl. Opt. 3) as used by Lacis & Hansen
// (1974, J. Atmos. Sci. 31, 118-133), from memory. The ozone amount above altitude h is
//     u(h) = a (1 + exp(-b/c)) / (1 + exp((h - b)/c)),
// a = total column (cm at NTP), b = altitude of the concentration maximum, c = a shape length.
#include <vector>

#include "bandstack/atmosphere/column.hpp"

namespace bandstack::atmosphere {

// Parameters of the Green form. Defaults a = 0.4 cm NTP (400 Dobson units), b = 20 km, c = 5 km
// as quoted by Lacis & Hansen (1974) for a mid-latitude profile (from memory).
struct GreenOzone {
  double total_column_cm_ntp = 0.4;     // a
  double peak_altitude_m = 20000.0;     // b
  double shape_length_m = 5000.0;       // c
};

// Molecules per m3 of an ideal gas at NTP (273.15 K, 101.325 kPa): the Loschmidt constant,
// n0 = p / (k_B T) with CODATA 2018 k_B, = 2.6867811e25 m-3 (CODATA 2018 lists 2.686780111e25).
inline constexpr double loschmidt_per_m3 = 101325.0 / (1.380649e-23 * 273.15);
// One Dobson unit: 1e-5 m of pure ozone at NTP, as molecules per m2.
inline constexpr double molecules_per_m2_per_dobson = 1e-5 * loschmidt_per_m3;

// Ozone above altitude h (m), cm at NTP. Throws InputError for non-finite h or parameters that are
// not positive and finite (a may be 0).
[[nodiscard]] double green_ozone_above_cm(double altitude_m, const GreenOzone& ozone = {});

// Layer-mean ozone mole fraction (mol/mol of moist air) from the difference of u across each layer:
// x_i = scale (u(z_i) - u(z_{i+1})) 1e-2 n0 / (N_A Δp_i / (g M_moist,i)).
// level_altitude_m: N+1 altitudes above sea level (m), decreasing (index 0 = top);
// level_pressure_pa: N+1 increasing; layer_water_mole_fraction: N values (sets M_moist).
// Throws InputError on size mismatch or scale < 0.
[[nodiscard]] std::vector<double> green_ozone_mole_fraction(const std::vector<double>& level_altitude_m,
                                                            const std::vector<double>& level_pressure_pa,
                                                            const std::vector<double>& layer_water_mole_fraction,
                                                            double gravity_m_s2, double scale = 1.0,
                                                            const GreenOzone& ozone = {});

// Total ozone column of a column, Dobson units, from its O3 mole fractions and layer air masses.
[[nodiscard]] double ozone_column_dobson(const Column& column);

} // namespace bandstack::atmosphere
