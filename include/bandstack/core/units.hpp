#pragma once
// Unit conversions used at the edges (study files, profile files, output). Inside the library
// everything is SI (Pa, K, kg, m, s, W m-2, mol/mol), with wavenumber in cm-1.
namespace bandstack::units {

inline constexpr double pa_per_hpa = 100.0;
inline constexpr double mole_fraction_per_ppmv = 1e-6;
inline constexpr double mole_fraction_per_ppbv = 1e-9;

constexpr double hpa_to_pa(double p_hpa) { return p_hpa * pa_per_hpa; }
constexpr double pa_to_hpa(double p_pa) { return p_pa / pa_per_hpa; }
constexpr double celsius_to_kelvin(double t_c) { return t_c + 273.15; }
constexpr double kelvin_to_celsius(double t_k) { return t_k - 273.15; }
constexpr double ppmv_to_mole_fraction(double x_ppmv) { return x_ppmv * mole_fraction_per_ppmv; }
constexpr double mole_fraction_to_ppmv(double x) { return x / mole_fraction_per_ppmv; }
constexpr double km_to_m(double z_km) { return z_km * 1000.0; }
constexpr double m_to_km(double z_m) { return z_m / 1000.0; }
// Wavenumber (cm-1) to wavelength (micrometres) and back: lambda_um = 1e4 / nu_cm1.
constexpr double wavenumber_cm1_to_wavelength_um(double nu_cm1) { return 1e4 / nu_cm1; }
constexpr double wavelength_um_to_wavenumber_cm1(double lambda_um) { return 1e4 / lambda_um; }
// Heating rate: K s-1 to K day-1.
constexpr double per_second_to_per_day(double rate_per_s) { return rate_per_s * 86400.0; }

} // namespace bandstack::units
