// Reference path: band integrals by Boost.Math adaptive quadrature of the spectral functions
// themselves, in wavenumber, sharing nothing with the series path except the constants.
// Finite bands: adaptive Gauss-Kronrod (61 points) to a relative tolerance near machine
// precision. Infinite upper limit: exp-sinh, which suits integrands that decay exponentially.
#include "bandstack/spectral/planck.hpp"
#include "spectral/planck_detail.hpp"

#include <boost/math/quadrature/exp_sinh.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <cmath>
#include <limits>

namespace bandstack::spectral {
namespace {

constexpr double tolerance = 1e-13;
constexpr unsigned max_depth = 15;

template <class F> double integrate_band(const F& f, double nu1_cm1, double nu2_cm1) {
  if (std::isinf(nu2_cm1)) {
    boost::math::quadrature::exp_sinh<double> integrator; // not const: Boost 1.74 lacks const integrate()
    return integrator.integrate(f, nu1_cm1, std::numeric_limits<double>::infinity(), tolerance, nullptr, nullptr,
                                nullptr);
  }
  return boost::math::quadrature::gauss_kronrod<double, 61>::integrate(f, nu1_cm1, nu2_cm1, max_depth, tolerance);
}

} // namespace

double planck_band_radiance_reference(double nu1_cm1, double nu2_cm1, double t_k) {
  detail::check_band(nu1_cm1, nu2_cm1, "planck_band_radiance_reference");
  detail::check_temperature(t_k, "planck_band_radiance_reference");
  return integrate_band([t_k](double nu) { return planck_radiance(nu, t_k); }, nu1_cm1, nu2_cm1);
}

double planck_band_radiance_derivative_reference(double nu1_cm1, double nu2_cm1, double t_k) {
  detail::check_band(nu1_cm1, nu2_cm1, "planck_band_radiance_derivative_reference");
  detail::check_temperature(t_k, "planck_band_radiance_derivative_reference");
  return integrate_band([t_k](double nu) { return planck_radiance_derivative(nu, t_k); }, nu1_cm1, nu2_cm1);
}

} // namespace bandstack::spectral
