#pragma once
// Planck function per wavenumber and its integrals over spectral bands.
//
// Units throughout: wavenumber nu in cm-1, temperature T in K. Spectral radiance B_nu(T) is in
// W m-2 sr-1 (cm-1)-1; band integrals are in W m-2 sr-1; derivatives with respect to T carry an
// extra K-1. Multiply a radiance by pi for the hemispheric flux of a black surface.
//
// Every function throws bandstack::InputError for a wavenumber that is negative, NaN or (as a
// lower limit) infinite, for a band with nu1 >= nu2, and for a temperature that is not positive
// and finite.
//
// Example: the 15 um CO2 band at a 288 K surface, as flux:
//   double f_w_m2 = pi * bandstack::spectral::planck_band_radiance(630.0, 700.0, 288.0);
namespace bandstack::spectral {

// Spectral radiance B_nu(T) in W m-2 sr-1 (cm-1)-1 at wavenumber nu_cm1 >= 0 (finite).
[[nodiscard]] double planck_radiance(double nu_cm1, double t_k);

// dB_nu/dT in W m-2 sr-1 (cm-1)-1 K-1 at wavenumber nu_cm1 >= 0 (finite).
[[nodiscard]] double planck_radiance_derivative(double nu_cm1, double t_k);

// Band radiance: the integral of B_nu(T) d nu over [nu1_cm1, nu2_cm1], in W m-2 sr-1.
// 0 <= nu1_cm1 < nu2_cm1; nu2_cm1 may be +infinity. Fast series path (tens of ns), relative
// error below 1e-12 against the quadrature reference below.
[[nodiscard]] double planck_band_radiance(double nu1_cm1, double nu2_cm1, double t_k);

// The same integral by Boost.Math adaptive quadrature of planck_radiance (Gauss-Kronrod on
// finite bands, exp-sinh for an infinite upper limit). Slow; the yardstick for the fast path.
[[nodiscard]] double planck_band_radiance_reference(double nu1_cm1, double nu2_cm1, double t_k);

// d/dT of planck_band_radiance, in W m-2 sr-1 K-1 (series path), same arguments.
[[nodiscard]] double planck_band_radiance_derivative(double nu1_cm1, double nu2_cm1, double t_k);

// d/dT of the band radiance by quadrature of planck_radiance_derivative (reference path).
[[nodiscard]] double planck_band_radiance_derivative_reference(double nu1_cm1, double nu2_cm1, double t_k);

// Blackbody fraction: the share of the total radiance sigma T^4 / pi that falls in
// [nu1_cm1, nu2_cm1]; dimensionless, in [0, 1]. Same arguments as planck_band_radiance.
[[nodiscard]] double blackbody_fraction(double nu1_cm1, double nu2_cm1, double t_k);

} // namespace bandstack::spectral
