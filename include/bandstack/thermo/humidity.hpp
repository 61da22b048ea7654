#pragma once
// Conversions between measures of water vapour. x = mole fraction in moist air (mol/mol),
// r = mass mixing ratio (kg water per kg dry air), q = specific humidity (kg water per kg moist air),
// e = vapour partial pressure (Pa), rh = relative humidity as a fraction (1 = saturated), with respect
// to saturation_vapour_pressure_pa(T) (liquid above 273.16 K, ice below).
namespace bandstack::thermo {

[[nodiscard]] double mass_mixing_ratio_from_mole_fraction(double x);
[[nodiscard]] double mole_fraction_from_mass_mixing_ratio(double r);
[[nodiscard]] double specific_humidity_from_mole_fraction(double x);
[[nodiscard]] double mole_fraction_from_specific_humidity(double q);
[[nodiscard]] double relative_humidity_from_mole_fraction(double x, double pressure_pa, double temperature_k);
// Mole fraction for a given relative humidity. The vapour pressure is capped below the total pressure.
[[nodiscard]] double mole_fraction_from_relative_humidity(double rh, double pressure_pa, double temperature_k);
// Saturation mole fraction e_s(T)/p (capped as above).
[[nodiscard]] double saturation_mole_fraction(double pressure_pa, double temperature_k);

} // namespace bandstack::thermo
