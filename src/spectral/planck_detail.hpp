#pragma once
// Private to src/spectral: argument checks and the dimensionless Planck integrals behind
// planck.cpp, in x = c2 nu / T.
//   f(x) = x^3 / (e^x - 1)                  (radiance,  integral over (0, inf) = pi^4 / 15)
//   g(x) = x^4 e^x / (e^x - 1)^2            (d/dT,      integral over (0, inf) = 4 pi^4 / 15)
// so that  band radiance        = 2 k^4 T^4 / (h^3 c^2) * integral of f over [x1, x2]
//          its derivative in T  = 2 k^4 T^3 / (h^3 c^2) * integral of g over [x1, x2].
#include "bandstack/core/constants.hpp"

namespace bandstack::spectral::detail {

// Second radiation constant c2 = h c / k_B built from the exact 2019-SI defining constants rather
// than the 10-digit rounded CODATA value: the rounding (3.5e-10 relative) would be multiplied by
// x ~ 70 in the Wien tail and break agreement with independent evaluations at 1e-9.
inline constexpr double second_radiation_m_k =
    constants::planck_j_s * constants::speed_of_light_m_s / constants::boltzmann_j_k;
inline constexpr double second_radiation_cm_k = 100.0 * second_radiation_m_k;

// Integral of f (planck) or g (derivative) over [x1, x2], 0 <= x1 < x2 <= +inf. `width` is
// x2 - x1 computed as scale * (nu2 - nu1), which keeps narrow bands accurate far from x = 0.
double planck_integral_x(double x1, double x2, double width);
double planck_derivative_integral_x(double x1, double x2, double width);

// The integrands themselves, safe at x = 0 and for large x (underflow to 0).
double planck_integrand_x(double x);
double planck_derivative_integrand_x(double x);

// Argument checks shared by the fast and reference paths; throw InputError naming `function`.
void check_temperature(double t_k, const char* function);
void check_wavenumber(double nu_cm1, const char* function);
void check_band(double nu1_cm1, double nu2_cm1, const char* function);

// Prefactors: B_nu = radiance_factor * nu^3 / (e^x - 1) with nu in cm-1 (the 1e8 is 100^3 from
// nu^3 in m-3 times 100 for "per cm-1" instead of "per m-1"), and
// band radiance = band_factor * T^4 * integral of f (no wavenumber unit left in it).
inline constexpr double radiance_factor =
    2.0 * constants::planck_j_s * constants::speed_of_light_m_s * constants::speed_of_light_m_s * 1e8;
inline constexpr double band_factor = 2.0 * (constants::boltzmann_j_k * constants::boltzmann_j_k) *
                                      (constants::boltzmann_j_k * constants::boltzmann_j_k) /
                                      (constants::planck_j_s * constants::planck_j_s * constants::planck_j_s *
                                       constants::speed_of_light_m_s * constants::speed_of_light_m_s);

} // namespace bandstack::spectral::detail
