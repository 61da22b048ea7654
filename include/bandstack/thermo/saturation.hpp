#pragma once
// Saturation vapour pressure over plane surfaces of pure liquid water and of ice.
// Formulation: Murphy, D. M. and Koop, T. (2005), "Review of the vapour pressures of ice and
// supercooled water for atmospheric applications", Q. J. R. Meteorol. Soc. 131, 1539-1565,
// eq. (7) for ice (valid above 110 K) and eq. (10) for liquid (valid 123 K < T < 332 K).
// Example: saturation_vapour_pressure_pa(273.16) == 611.657 Pa (triple point, both phases).
namespace bandstack::thermo {

// Validity limits of the two formulas, K (Murphy & Koop 2005, eqs. 7 and 10).
inline constexpr double ice_formula_min_temperature_k = 110.0;
inline constexpr double liquid_formula_min_temperature_k = 123.0;
inline constexpr double liquid_formula_max_temperature_k = 332.0;

// Over ice, Pa, for 110 K < T <= 273.16 K. Throws InputError outside that range (or non-finite T).
[[nodiscard]] double saturation_vapour_pressure_ice_pa(double temperature_k);
// Over liquid water (supercooled below 273.15 K), Pa, for 123 K < T < 332 K.
// Throws InputError outside that range (or non-finite T).
[[nodiscard]] double saturation_vapour_pressure_liquid_pa(double temperature_k);
// Over liquid at and above 273.16 K, over ice below (the usual meteorological convention), Pa,
// for 110 K < T < 332 K. Throws InputError outside that range.
[[nodiscard]] double saturation_vapour_pressure_pa(double temperature_k);

} // namespace bandstack::thermo
