// Planck function per wavenumber and band integrals: public entry points of the fast path.
// The series and narrow-band quadrature live in planck_series.cpp; the slow quadrature
// yardstick in planck_reference.cpp.
#include "bandstack/spectral/planck.hpp"

#include "bandstack/core/error.hpp"
#include "spectral/planck_detail.hpp"

#include <cmath>
#include <fmt/format.h>
#include <string>

namespace bandstack::spectral {
namespace detail {
namespace {

InputPlace place_of(const char* item) {
  InputPlace place;
  place.item = item;
  return place;
}

} // namespace

void check_temperature(double t_k, const char* function) {
  if (!(t_k > 0.0) || !std::isfinite(t_k)) {
    throw InputError(place_of("temperature"),
                     fmt::format("{}: temperature must be positive and finite (K), got {}", function, t_k));
  }
}

void check_wavenumber(double nu_cm1, const char* function) {
  if (!(nu_cm1 >= 0.0) || !std::isfinite(nu_cm1)) {
    throw InputError(place_of("wavenumber"),
                     fmt::format("{}: wavenumber must be finite and >= 0 (cm-1), got {}", function, nu_cm1));
  }
}

void check_band(double nu1_cm1, double nu2_cm1, const char* function) {
  check_wavenumber(nu1_cm1, function);
  if (!(nu2_cm1 > nu1_cm1)) {
    throw InputError(place_of("band"),
                     fmt::format("{}: band limits must satisfy 0 <= nu1 < nu2 (cm-1; nu2 may be infinite), "
                                 "got [{}, {}]",
                                 function, nu1_cm1, nu2_cm1));
  }
}

} // namespace detail

using detail::second_radiation_cm_k;

namespace {

// A band in x = c2 nu / T, with its width taken from nu2 - nu1 (see planck_detail.hpp).
struct ScaledBand {
  double x1, x2, width;
};

ScaledBand scale_band(double nu1_cm1, double nu2_cm1, double t_k) {
  const double scale = second_radiation_cm_k / t_k;
  return {scale * nu1_cm1, scale * nu2_cm1, scale * (nu2_cm1 - nu1_cm1)};
}

} // namespace

double planck_radiance(double nu_cm1, double t_k) {
  detail::check_wavenumber(nu_cm1, "planck_radiance");
  detail::check_temperature(t_k, "planck_radiance");
  const double x = second_radiation_cm_k * nu_cm1 / t_k;
  // e^{-745} underflows: the radiance is 0 there, and nu^3 / expm1(x) could become inf / inf.
  if (x == 0.0 || x >= 745.0) return 0.0;
  return detail::radiance_factor * nu_cm1 * nu_cm1 * nu_cm1 / std::expm1(x);
}

double planck_radiance_derivative(double nu_cm1, double t_k) {
  detail::check_wavenumber(nu_cm1, "planck_radiance_derivative");
  detail::check_temperature(t_k, "planck_radiance_derivative");
  const double x = second_radiation_cm_k * nu_cm1 / t_k;
  if (x == 0.0 || x >= 745.0) return 0.0;
  // dB/dT = B * x e^x / ((e^x - 1) T) = B * (x / (1 - e^{-x})) / T, grouped so that neither
  // factor is 0/0 when nu^3 underflows at tiny x.
  const double b = detail::radiance_factor * nu_cm1 * nu_cm1 * nu_cm1 / std::expm1(x);
  return b * (x / -std::expm1(-x)) / t_k;
}

double planck_band_radiance(double nu1_cm1, double nu2_cm1, double t_k) {
  detail::check_band(nu1_cm1, nu2_cm1, "planck_band_radiance");
  detail::check_temperature(t_k, "planck_band_radiance");
  const auto [x1, x2, width] = scale_band(nu1_cm1, nu2_cm1, t_k);
  const double t2 = t_k * t_k;
  return detail::band_factor * t2 * t2 * detail::planck_integral_x(x1, x2, width);
}

double planck_band_radiance_derivative(double nu1_cm1, double nu2_cm1, double t_k) {
  detail::check_band(nu1_cm1, nu2_cm1, "planck_band_radiance_derivative");
  detail::check_temperature(t_k, "planck_band_radiance_derivative");
  const auto [x1, x2, width] = scale_band(nu1_cm1, nu2_cm1, t_k);
  return detail::band_factor * t_k * t_k * t_k * detail::planck_derivative_integral_x(x1, x2, width);
}

double blackbody_fraction(double nu1_cm1, double nu2_cm1, double t_k) {
  detail::check_band(nu1_cm1, nu2_cm1, "blackbody_fraction");
  detail::check_temperature(t_k, "blackbody_fraction");
  // pi * band / (sigma T^4) with sigma = 2 pi^5 k^4 / (15 h^3 c^2): the prefactors cancel
  // exactly, leaving the dimensionless integral over its total pi^4 / 15.
  constexpr double pi = constants::pi;
  const auto [x1, x2, width] = scale_band(nu1_cm1, nu2_cm1, t_k);
  return detail::planck_integral_x(x1, x2, width) * (15.0 / (pi * pi * pi * pi));
}

} // namespace bandstack::spectral
