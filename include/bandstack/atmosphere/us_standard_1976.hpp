#pragma once
// U.S. Standard Atmosphere, 1976 (NOAA, NASA, USAF; U.S. Government Printing Office, Washington
// D.C.), lower part: seven layers of piecewise-linear molecular-scale temperature in geopotential
// height from 0 to 84.852 km, sea-level 288.15 K and 101325 Pa, hydrostatic pressure with the
// standard's own constants (R* = 8.31432 J mol-1 K-1, M0 = 28.9644 g mol-1, g0 = 9.80665 m s-2).
//
// Heights here are GEOPOTENTIAL metres unless the name says geometric. The temperature is the
// molecular-scale temperature T_M, which equals the kinetic temperature below 80 km geometric
// (above, the standard's kinetic T is lower by at most 0.08 K at 86 km; not modelled).
// Outside the defined range the end layers are continued: the -6.5 K/km troposphere below
// -5 km and an isothermal 186.946 K layer above 84.852 km (a bandstack extension, not the standard).
namespace bandstack::atmosphere::us_standard_1976 {

inline constexpr double sea_level_temperature_k = 288.15;
inline constexpr double sea_level_pressure_pa = 101325.0;
inline constexpr double tropopause_temperature_k = 216.65;
inline constexpr double tropopause_height_m = 11000.0;   // geopotential
inline constexpr double tropospheric_lapse_rate_k_m = 0.0065; // temperature falls with height
// The standard's gas constant (it differs from CODATA 2018 in the 5th digit; the tables use it).
inline constexpr double gas_constant_j_mol_k = 8.31432;
inline constexpr double molar_mass_air_kg_mol = 28.9644e-3;
inline constexpr double gravity_m_s2 = 9.80665;
inline constexpr double earth_radius_m = 6356766.0;     // r0, for geopotential <-> geometric

// Molecular-scale temperature (K) at a geopotential height (m). Throws InputError if not finite.
[[nodiscard]] double temperature_k(double geopotential_height_m);
// Pressure (Pa) at a geopotential height (m). Throws InputError if not finite.
[[nodiscard]] double pressure_pa(double geopotential_height_m);
// Inverse of pressure_pa: geopotential height (m) of a pressure (Pa). Throws InputError unless p > 0.
[[nodiscard]] double geopotential_height_m(double pressure_pa);
// Temperature (K) at a pressure (Pa): temperature_k(geopotential_height_m(p)), exact.
[[nodiscard]] double temperature_at_pressure_k(double pressure_pa);

// Geopotential height H = r0 z / (r0 + z) from geometric height z (both m), and its inverse.
[[nodiscard]] double geopotential_from_geometric_m(double geometric_height_m);
[[nodiscard]] double geometric_from_geopotential_m(double geopotential_height_m);

} // namespace bandstack::atmosphere::us_standard_1976
