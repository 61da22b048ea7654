#pragma once
// Physical constants in SI units. Defining constants are exact in the 2019 SI (CODATA 2018,
// NIST SP 961); derived ones are rounded to the digits CODATA 2018 publishes.
namespace bandstack::constants {

inline constexpr double pi = 3.14159265358979323846;

// CODATA 2018 (exact defining constants)
inline constexpr double planck_j_s = 6.62607015e-34;          // h
inline constexpr double speed_of_light_m_s = 299792458.0;     // c
inline constexpr double boltzmann_j_k = 1.380649e-23;         // k_B
inline constexpr double avogadro_per_mol = 6.02214076e23;     // N_A
// CODATA 2018 (derived; published values)
inline constexpr double molar_gas_j_mol_k = 8.314462618;          // R = N_A k_B
inline constexpr double stefan_boltzmann_w_m2_k4 = 5.670374419e-8; // sigma
inline constexpr double second_radiation_m_k = 1.438776877e-2;     // c2 = h c / k_B
inline constexpr double wien_wavelength_m_k = 2.897771955e-3;      // b (wavelength form)
inline constexpr double wien_frequency_hz_k = 5.878925757e10;      // b' (frequency form)

// Standard acceleration of gravity, 3rd CGPM (1901), exact by definition.
inline constexpr double standard_gravity_m_s2 = 9.80665;

// Molar masses in kg/mol. Dry air: U.S. Standard Atmosphere 1976 (M0 = 28.9644 g/mol).
// Gases: IUPAC standard atomic weights summed (common practice, 4 to 5 significant digits).
inline constexpr double molar_mass_dry_air_kg_mol = 28.9644e-3;
inline constexpr double molar_mass_h2o_kg_mol = 18.01528e-3;
inline constexpr double molar_mass_co2_kg_mol = 44.0095e-3;
inline constexpr double molar_mass_o3_kg_mol = 47.9982e-3;
inline constexpr double molar_mass_ch4_kg_mol = 16.0425e-3;
inline constexpr double molar_mass_n2o_kg_mol = 44.0128e-3;

// Specific gas constants derived from the above (J kg-1 K-1).
inline constexpr double gas_constant_dry_air_j_kg_k = molar_gas_j_mol_k / molar_mass_dry_air_kg_mol;
inline constexpr double gas_constant_water_vapour_j_kg_k = molar_gas_j_mol_k / molar_mass_h2o_kg_mol;

// Thermodynamic properties used by convection and heating rates (common practice values,
// e.g. Emanuel 1994 "Atmospheric Convection", Table of constants; from memory).
inline constexpr double specific_heat_dry_air_j_kg_k = 1004.64;  // c_pd at constant pressure
inline constexpr double latent_heat_vaporisation_j_kg = 2.501e6; // L_v at 0 degC
inline constexpr double latent_heat_sublimation_j_kg = 2.834e6;  // L_s at 0 degC

inline constexpr double seconds_per_day = 86400.0;
inline constexpr double triple_point_water_k = 273.16;
inline constexpr double zero_celsius_k = 273.15;

} // namespace bandstack::constants
