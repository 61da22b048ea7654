#pragma once
// Rayleigh scattering by air: the scattering cross-section per molecule and per unit mass of air
// (what a shortwave band set stores per g-point), and the optical depth of a standard column.
//
//   tau_R of a layer = rayleigh_cross_section_m2_kg(nu) * (delta p / g)     (air mass in kg m-2)
//
// Source: Bodhaine, Wood, Dutton & Slusser (1999, J. Atmos. Oceanic Technol. 16, 1854-1861): the
// rational fits of their eq. 29 (cross-section) and eq. 30 (optical depth of a column at
// 1013.25 hPa) for dry air with 360 ppm CO2. The fits are used from 0.2 um up to 1 um; beyond 1 um
// the value at 1 um is continued with the lambda^-4 law. Rayleigh scattering is conservative and its
// phase function symmetric (asymmetry factor 0).
namespace bandstack::spectral {

// Shortest wavelength (um) and highest wavenumber (cm-1) at which the fits are used.
inline constexpr double rayleigh_min_wavelength_um = 0.2;
inline constexpr double rayleigh_max_wavenumber_cm1 = 1e4 / rayleigh_min_wavelength_um; // 50000

// Molar mass of the air the cross-sections refer to, kg mol-1: dry air with 360 ppm CO2,
// (15.0556 x_CO2 + 28.9595) g/mol (Bodhaine et al. 1999, from memory).
inline constexpr double rayleigh_air_molar_mass_kg_mol = (15.0556 * 360e-6 + 28.9595) * 1e-3;

// Rayleigh scattering cross-section per molecule of air, cm2, at wavelength_um >= 0.2 um.
// Throws InputError for a smaller or non-finite wavelength.
[[nodiscard]] double rayleigh_cross_section_cm2(double wavelength_um);

// Rayleigh optical depth (dimensionless) of the standard column of Bodhaine et al. (1999): surface
// pressure 1013.25 hPa, sea level, 45 degrees latitude. wavelength_um >= 0.2 (InputError otherwise).
[[nodiscard]] double rayleigh_optical_depth_standard(double wavelength_um);

// Rayleigh scattering cross-section per unit mass of air, m2 kg-1, at wavenumber nu_cm1 in
// (0, 50000] cm-1: rayleigh_cross_section_cm2 * 1e-4 * N_A / rayleigh_air_molar_mass_kg_mol.
// Throws InputError outside that range.
[[nodiscard]] double rayleigh_cross_section_m2_kg(double nu_cm1);

} // namespace bandstack::spectral
