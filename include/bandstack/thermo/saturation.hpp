#pragma once
// Saturation vapour pressure over plane surfaces of pure liquid water and of ice.
// Formulation: Murphy, D. M. and Koop, T. (2005), "Review of the vapour pressures of ice and
// supercooled water for atmospheric applications", Q. J. R. Meteorol. Soc. 131, 1539-1565,
// eq. (7) for ice (valid above 110 K) and eq. (10) for liquid (valid 123 K < T < 332 K).
namespace bandstack::thermo {

// Over ice, Pa. Throws InputError for T outside the published validity range.
[[nodiscard]] double saturation_vapour_pressure_ice_pa(double temperature_k);
// Over liquid water (supercooled below 273.15 K), Pa. Throws InputError outside validity.
[[nodiscard]] double saturation_vapour_pressure_liquid_pa(double temperature_k);
// Over liquid at and above 273.16 K, over ice below (the usual meteorological convention).
[[nodiscard]] double saturation_vapour_pressure_pa(double temperature_k);

} // namespace bandstack::thermo
