// Fast evaluation of the dimensionless Planck integrals (see planck_detail.hpp).
//
// Three regimes, each chosen so that no step loses more than a few ulp:
//  * x >= x_switch: the one-sided tail from x to infinity by the exponential series, obtained by
//    expanding 1/(e^t - 1) = sum_n e^{-nt} and integrating term by term (e.g. Siegel & Howell,
//    "Thermal Radiation Heat Transfer", blackbody-function series; Widger & Woodall 1976,
//    Bull. Am. Meteorol. Soc. 57, 1217; both citations from memory):
//        int_x^inf f = sum_n e^{-nx} (x^3/n + 3x^2/n^2 + 6x/n^3 + 6/n^4)
//        int_x^inf g = sum_n e^{-nx} (x^4 + 4x^3/n + 12x^2/n^2 + 24x/n^3 + 24/n^4)
//    (the second from integrating g by parts: int g = [-x^4/(e^x-1)] + 4 int f).
//    Every term is positive, so there is no cancellation; it converges like e^{-nx}, which is
//    slow for small x.
//  * x < x_switch: the head from 0 to x by the Bernoulli (Debye-like) power series
//        t/(e^t-1) = sum_k B_k t^k / k!  =>  int_0^x f = x^3/3 - x^4/8 + sum_k B_2k x^{2k+3}/((2k+3)(2k)!)
//        t^2 e^t/(e^t-1)^2 = 1 - sum_k (2k-1) B_2k t^{2k}/(2k)!
//                          =>  int_0^x g = x^3/3 - sum_k (2k-1) B_2k x^{2k+3}/((2k+3)(2k)!)
//    convergent for x < 2 pi; at x_switch = 2 the terms fall like pi^{-2k}.
//  * narrow bands (x2 - x1 <= narrow_width): a difference of two one-sided integrals would cancel
//    (a 0.01 cm-1 band loses ~5 digits), so the band is integrated directly by Gauss-Legendre.
//    The integrands are analytic with their nearest poles at +-2 pi i, so for a half-width h the
//    error falls like (4 pi / h)^{-2n}: below 1e-17 for h <= 0.25 and n = 7 points.
#include "spectral/planck_detail.hpp"

#include <algorithm>
#include <array>
#include <boost/math/quadrature/gauss.hpp>
#include <boost/math/special_functions/bernoulli.hpp>
#include <boost/math/special_functions/factorials.hpp>
#include <cmath>

namespace bandstack::spectral::detail {
namespace {

constexpr double pi = constants::pi;
constexpr double x_switch = 2.0;
constexpr double narrow_width = 0.5;
constexpr unsigned gauss_points = 7;
// exp(-745) underflows to zero in double; beyond this the integrands and tails are exactly 0.
constexpr double x_underflow = 745.0;
// Number of terms of the tail series: the first omitted term is below e^{-tail_exponent} of the
// first one, i.e. under 1e-17 relative.
constexpr double tail_exponent = 39.0;
constexpr int head_terms = 20;

// At most ceil(tail_exponent / x_switch) terms are ever summed; 1/n from a table saves a division.
constexpr int max_tail_terms = 20;
static_assert(max_tail_terms >= tail_exponent / x_switch);
constexpr std::array<double, max_tail_terms + 1> inverse_integers = [] {
  std::array<double, max_tail_terms + 1> inv{};
  for (int n = 1; n <= max_tail_terms; ++n)
    inv[static_cast<std::size_t>(n)] = 1.0 / n;
  return inv;
}();

int tail_terms(double x) { return static_cast<int>(std::ceil(tail_exponent / x)); }

// B_2k / (2k)! * 1/(2k+3), k = 1..head_terms, the shared part of both head series.
const std::array<double, head_terms>& head_coefficients() {
  static const std::array<double, head_terms> table = [] {
    std::array<double, head_terms> c{};
    for (int k = 1; k <= head_terms; ++k) {
      const auto n = static_cast<unsigned>(2 * k);
      c[static_cast<std::size_t>(k - 1)] =
          boost::math::bernoulli_b2n<double>(k) / (boost::math::factorial<double>(n) * (2.0 * k + 3.0));
    }
    return c;
  }();
  return table;
}

struct PlanckKernel {
  static constexpr double total = pi * pi * pi * pi / 15.0;

  static double integrand(double x) { return planck_integrand_x(x); }

  static double tail(double x) {
    if (x >= x_underflow) return 0.0;
    const double r = std::exp(-x);
    const int n_max = std::min(tail_terms(x), max_tail_terms); // x >= x_switch here
    const double x2 = x * x;
    const double a = x2 * x, b = 3.0 * x2, c = 6.0 * x;
    double rn = 1.0, sum = 0.0;
    for (int n = 1; n <= n_max; ++n) {
      rn *= r;
      const double inv = inverse_integers[static_cast<std::size_t>(n)];
      sum += rn * inv * (a + inv * (b + inv * (c + 6.0 * inv)));
    }
    return sum;
  }

  static double head(double x) {
    const auto& c = head_coefficients();
    const double y = x * x;
    double p = 0.0;
    for (int k = head_terms; k >= 1; --k)
      p = (p + c[static_cast<std::size_t>(k - 1)]) * y;
    return x * y * ((1.0 / 3.0 - x / 8.0) + p);
  }
};

struct DerivativeKernel {
  static constexpr double total = 4.0 * pi * pi * pi * pi / 15.0;

  static double integrand(double x) { return planck_derivative_integrand_x(x); }

  static double tail(double x) {
    if (x >= x_underflow) return 0.0;
    const double r = std::exp(-x);
    const int n_max = std::min(tail_terms(x), max_tail_terms); // x >= x_switch here
    const double x2 = x * x;
    const double a = x2 * x2, b = 4.0 * x2 * x, c = 12.0 * x2, d = 24.0 * x;
    double rn = 1.0, sum = 0.0;
    for (int n = 1; n <= n_max; ++n) {
      rn *= r;
      const double inv = inverse_integers[static_cast<std::size_t>(n)];
      sum += rn * (a + inv * (b + inv * (c + inv * (d + 24.0 * inv))));
    }
    return sum;
  }

  static double head(double x) {
    const auto& c = head_coefficients();
    const double y = x * x;
    double p = 0.0;
    for (int k = head_terms; k >= 1; --k)
      p = (p - (2.0 * k - 1.0) * c[static_cast<std::size_t>(k - 1)]) * y;
    return x * y * (1.0 / 3.0 + p);
  }
};

template <class Kernel> double upper_integral(double x) {
  return x >= x_switch ? Kernel::tail(x) : Kernel::total - Kernel::head(x);
}

template <class Kernel> double band_integral(double x1, double x2, double width) {
  if (std::isinf(x2)) return upper_integral<Kernel>(x1);
  if (width <= narrow_width) {
    // Nodes from x1 and the width, never from x2 - x1: at x ~ 70 each rounded limit is off by
    // ~1e-14, which is 1e-10 of a 0.01 cm-1 band.
    const double half = 0.5 * width;
    const double centre = x1 + half;
    return half * boost::math::quadrature::gauss<double, gauss_points>::integrate(
                      [centre, half](double u) { return Kernel::integrand(centre + half * u); }, -1.0, 1.0);
  }
  if (x1 >= x_switch) return Kernel::tail(x1) - Kernel::tail(x2);
  if (x2 <= x_switch) return Kernel::head(x2) - Kernel::head(x1);
  // Straddling the switch: the band is wider than narrow_width, so it holds at least ~1/10 of
  // the total and the subtraction below costs at most one digit.
  return (Kernel::total - Kernel::head(x1)) - Kernel::tail(x2);
}

} // namespace

double planck_integrand_x(double x) {
  if (x <= 0.0 || x >= x_underflow) return 0.0;
  return x * x * x / std::expm1(x);
}

double planck_derivative_integrand_x(double x) {
  if (x <= 0.0 || x >= x_underflow) return 0.0;
  // x^4 e^x / (e^x - 1)^2 = [x^3 / (e^x - 1)] [x / (1 - e^{-x})]: expm1 keeps both accurate near
  // 0, and the grouping avoids 0/0 when x^4 underflows.
  return (x * x * x / std::expm1(x)) * (x / -std::expm1(-x));
}

double planck_integral_x(double x1, double x2, double width) { return band_integral<PlanckKernel>(x1, x2, width); }

double planck_derivative_integral_x(double x1, double x2, double width) {
  return band_integral<DerivativeKernel>(x1, x2, width);
}

} // namespace bandstack::spectral::detail
