#include "bandstack/solvers/longwave.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"

#include <array>
#include <cmath>
#include <string>
#include <utility>

namespace bandstack::solvers {

namespace {


// Below this slant optical depth the factors come from their Taylor series: 1 - exp(-x) and
// 1 - (1 - exp(-x))/x both cancel for small x. With 12 terms the truncation error at x = 0.25 is
// below 2e-17 relative; above it the cancellation costs at most a factor ~8 (a few 1e-15
// relative), and plain exp is cheaper than expm1.
constexpr double series_limit = 0.25;
constexpr std::size_t series_terms = 12;
// inv_factorial[m] = 1 / (m + 1)!
constexpr std::array<double, series_terms + 1> inv_factorial = [] {
  std::array<double, series_terms + 1> c{};
  double f = 1.0;
  for (std::size_t m = 0; m < c.size(); ++m) {
    f *= static_cast<double>(m + 1);
    c[m] = 1.0 / f;
  }
  return c;
}();

void fail(const char* item, std::size_t level, const std::string& message) {
  InputPlace place;
  place.item = item;
  place.level = static_cast<long>(level);
  throw InputError(place, message);
}

void check_inputs(std::span<const double> tau, std::span<const double> source, std::span<const double> source_layer,
                  double source_surface, double emissivity, const AngularQuadrature& angles, std::span<double> up,
                  std::span<double> down) {
  const std::size_t n = tau.size();
  if (n == 0) fail("optical_depth", 0, "the longwave solver needs at least one layer");
  if (source.size() != n + 1)
    fail("planck_source_level", 0,
         "has " + std::to_string(source.size()) + " values, expected layers + 1 = " + std::to_string(n + 1));
  if (source_layer.size() != n)
    fail("planck_source_layer", 0,
         "has " + std::to_string(source_layer.size()) + " values, expected one per layer = " + std::to_string(n));
  if (up.size() != n + 1 || down.size() != n + 1)
    fail("longwave_flux", 0, "flux outputs need layers + 1 = " + std::to_string(n + 1) + " values");
  for (std::size_t i = 0; i < n; ++i)
    if (!(tau[i] >= 0.0) || !std::isfinite(tau[i])) fail("optical_depth", i, "must be finite and >= 0");
  for (std::size_t k = 0; k <= n; ++k)
    if (!(source[k] >= 0.0) || !std::isfinite(source[k])) fail("planck_source_level", k, "must be finite and >= 0");
  for (std::size_t i = 0; i < n; ++i)
    if (!(source_layer[i] >= 0.0) || !std::isfinite(source_layer[i]))
      fail("planck_source_layer", i, "must be finite and >= 0");
  if (!(source_surface >= 0.0) || !std::isfinite(source_surface))
    throw InputError(InputPlace::of("planck_source_surface"), "must be finite and >= 0");
  if (!(emissivity >= 0.0 && emissivity <= 1.0)) throw InputError(InputPlace::of("surface_emissivity"), "must lie in [0, 1]");
  validate(angles);
}

} // namespace

LayerFactors linear_in_tau_factors(double x) noexcept {
  if (x < series_limit) {
    // 1 - e^-x = sum_{k>=1} (-1)^{k+1} x^k / k!   and   1 - (1 - e^-x)/x = sum_{k>=1} (-1)^{k+1} x^k / (k+1)!,
    // both to x^12 by Horner.
    double a = inv_factorial[series_terms - 1];
    for (std::size_t m = series_terms - 1; m-- > 0;)
      a = inv_factorial[m] - x * a;
    double g = inv_factorial[series_terms];
    for (std::size_t m = series_terms; m-- > 1;)
      g = inv_factorial[m] - x * g;
    return {x * a, x * g};
  }
  const double a = 1.0 - std::exp(-x);
  return {a, 1.0 - a / x};
}

void longwave_fluxes(std::span<const double> tau_layer, std::span<const double> source_level,
                     std::span<const double> source_layer, double source_surface, double surface_emissivity,
                     const AngularQuadrature& angles, std::span<double> flux_up, std::span<double> flux_down,
                     LongwaveWorkspace& workspace) {
  check_inputs(tau_layer, source_level, source_layer, source_surface, surface_emissivity, angles, flux_up, flux_down);
  const std::size_t n = tau_layer.size();
  const std::size_t n_dir = angles.size();
  workspace.absorptance.resize(n * n_dir);
  workspace.linear_source.resize(n * n_dir);
  const std::span<const double> b = source_level;
  const std::span<const double> b_layer = source_layer;

  for (std::size_t k = 0; k <= n; ++k) {
    flux_up[k] = 0.0;
    flux_down[k] = 0.0;
  }

  // Schwarzschild's equation dI/ds = B - I along a slant path (s = slant optical depth), solved
  // exactly across one layer of slant depth x = tau/mu with B linear in s from B_in at entry to
  // B_out at exit:
  //   I_out = I_in e^{-x} + B_in (1 - e^{-x}) + (B_out - B_in) [1 - (1 - e^{-x})/x]
  // (e.g. Thomas & Stamnes 1999, Radiative Transfer in the Atmosphere and Ocean, ch. 5, and
  // Toon et al. 1989, JGR 94, 16287, for the linear-in-optical-depth source; from memory). The
  // line goes through the layer value at the layer's centre, B_in = 2 B_layer - B_out (the
  // layer-source form of Clough, Iacono & Moncet 1992, JGR 97, 15761; from memory), so with
  // a = 1 - e^{-x}, g = 1 - a/x:
  //   I_out = I_in - a (I_in - B_layer) + c (B_out - B_layer),   c = 2 g - a = a w(x) in [0, a].
  // Thick layers tend to I_out = B_out, thin ones to I_out = I_in + x (B_layer - I_in) without
  // cancellation (c = x^2/6 + O(x^3) is a small correction; its rounding error is ~1e-16 x).
  for (std::size_t j = 0; j < n_dir; ++j) {
    const double inv_mu = 1.0 / angles.mu[j];
    const double pi_w = constants::pi * angles.weight[j];
    double* a = workspace.absorptance.data() + j * n;
    double* c = workspace.linear_source.data() + j * n;
    double radiance = 0.0; // nothing enters at the top
    for (std::size_t i = 0; i < n; ++i) {
      const LayerFactors f = linear_in_tau_factors(tau_layer[i] * inv_mu);
      a[i] = f.absorptance;
      c[i] = 2.0 * f.linear_source - f.absorptance;
      radiance += -a[i] * (radiance - b_layer[i]) + c[i] * (b[i + 1] - b_layer[i]);
      flux_down[i + 1] += pi_w * radiance;
    }
  }

  // Lambertian surface: emits e B_s and reflects (1 - e) of the downward flux isotropically.
  const double radiance_surface =
      surface_emissivity * source_surface + (1.0 - surface_emissivity) * flux_down[n] / constants::pi;
  for (std::size_t j = 0; j < n_dir; ++j) {
    const double pi_w = constants::pi * angles.weight[j];
    const double* a = workspace.absorptance.data() + j * n;
    const double* c = workspace.linear_source.data() + j * n;
    double radiance = radiance_surface;
    flux_up[n] += pi_w * radiance;
    for (std::size_t i = n; i-- > 0;) {
      radiance += -a[i] * (radiance - b_layer[i]) + c[i] * (b[i] - b_layer[i]);
      flux_up[i] += pi_w * radiance;
    }
  }
}

void longwave_fluxes(std::span<const double> tau_layer, std::span<const double> source_level,
                     std::span<const double> source_layer, double source_surface, double surface_emissivity,
                     const AngularQuadrature& angles, std::span<double> flux_up, std::span<double> flux_down) {
  LongwaveWorkspace workspace;
  longwave_fluxes(tau_layer, source_level, source_layer, source_surface, surface_emissivity, angles, flux_up, flux_down,
                  workspace);
}

} // namespace bandstack::solvers
