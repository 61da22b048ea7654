#pragma once
// Conversions between measures of water vapour. x = mole fraction in moist air (mol/mol),
// r = mass mixing ratio (kg water per kg dry air), q = specific humidity (kg water per kg moist air),
// e = vapour partial pressure = x p (Pa), rh = relative humidity as a fraction (1 = saturated), with
// respect to saturation_vapour_pressure_pa(T) (liquid at and above 273.16 K, ice below).
// eps = M_h2o / M_dry (constants.hpp), so r = eps x / (1 - x) and q = r / (1 + r).
// Every function throws InputError for out-of-range input (negative amounts, x >= 1, p <= 0, T
// outside the saturation formulas' range), naming the argument.
namespace bandstack::thermo {

// Largest water mole fraction the relative-humidity conversions return: the vapour pressure is
// capped at this fraction of the total pressure. A guard, not physics: e_s can exceed p at low
// pressure and warm temperature (e.g. near the stratopause, e_s(270 K) = 470 Pa > p = 100 Pa), where
// a relative humidity is meaningless; callers setting water by relative humidity aloft should limit
// it themselves (e.g. by a cold-trap minimum).
inline constexpr double max_water_mole_fraction = 0.9;

// r from x (x in [0, 1)), kg/kg.
[[nodiscard]] double mass_mixing_ratio_from_mole_fraction(double x);
// x from r (r >= 0), mol/mol.
[[nodiscard]] double mole_fraction_from_mass_mixing_ratio(double r);
// q from x (x in [0, 1)), kg/kg.
[[nodiscard]] double specific_humidity_from_mole_fraction(double x);
// x from q (q in [0, 1)), mol/mol.
[[nodiscard]] double mole_fraction_from_specific_humidity(double q);
// rh = x p / e_s(T), a fraction (may exceed 1 for supersaturated input).
[[nodiscard]] double relative_humidity_from_mole_fraction(double x, double pressure_pa, double temperature_k);
// x = min(rh e_s(T), max_water_mole_fraction p) / p for rh >= 0; never reaches 1.
[[nodiscard]] double mole_fraction_from_relative_humidity(double rh, double pressure_pa, double temperature_k);
// Saturation mole fraction min(e_s(T) / p, max_water_mole_fraction).
[[nodiscard]] double saturation_mole_fraction(double pressure_pa, double temperature_k);

} // namespace bandstack::thermo
