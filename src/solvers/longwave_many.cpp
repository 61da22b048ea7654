// GCC keeps floating-point selects (x < c ? a : b) out of vectorised loops as long as it assumes
// that floating-point operations may trap (-ftrapping-math, its default). bandstack never enables
// floating-point traps, so this file drops that assumption; Clang does not make it by default.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math")
#endif

#include "bandstack/solvers/longwave_many.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "solvers/longwave_many_kernel.hpp"
#include "solvers/vector_math.hpp"

#include <cmath>
#include <limits>
#include <string>

namespace bandstack::solvers {

namespace {

// a = 1 - e^-x and g = 1 - (1 - e^-x)/x from one expm1 reduction (vector_math.hpp). While the
// reduction leaves n = 0 (x up to ln2/2), r = -x exactly and a = x - x^2 s(-x), so
// g = 1 - a/x = x s(-x) with no cancellation; beyond, a/x <= 0.85 and 1 - a/x loses under one
// digit. Both stay within a few 1e-16 relative for every x >= 0, x = 0 included (a = g = 0).
// Returned: a and the exit-side factor c = 2 g - a = a w(x) of longwave.cpp (c ~ x^2/6 for small
// x, computed with an absolute error ~1e-16 x, negligible next to the layer's emission x B_layer).
inline void layer_factors(double x, double& absorptance, double& exit_factor) noexcept {
  const detail::Expm1Parts e = detail::expm1_parts(-x);
  const double a = -(e.scale * (e.r + e.r * (e.r * e.s)) + (e.scale - 1.0));
  const bool reduced = e.n != 0.0;
  const double safe_x = reduced ? x : 1.0;
  const double g = reduced ? 1.0 - a / safe_x : x * e.s;
  absorptance = a;
  exit_factor = 2.0 * g - a;
}

[[noreturn]] void fail(const char* item, std::size_t level, const std::string& message) {
  InputPlace place;
  place.item = item;
  place.level = static_cast<long>(level);
  throw InputError(place, message);
}

void check_range(std::span<const double> values, double lo, double hi, const char* item, std::size_t per_level,
                 const char* what) {
  if (detail::count_outside(values.data(), values.size(), lo, hi) == 0.0) return;
  for (std::size_t m = 0; m < values.size(); ++m)
    if (!(values[m] >= lo && values[m] <= hi))
      fail(item, m / per_level, "value " + std::to_string(values[m]) + " at spectral point " +
                                    std::to_string(m % per_level) + " " + what);
}

// One layer for every point, downward: factors from the slant optical depth, stored for the
// upward pass, radiance updated and its flux contribution added at the level below (set, in the
// first direction: that spares zeroing the fluxes).
template <bool first>
inline void down_layer_loop(std::size_t n, double inv_mu, double pi_w, const double* __restrict tau,
                            const double* __restrict b_layer, const double* __restrict b_exit, double* __restrict a,
                            double* __restrict c, double* __restrict radiance, double* __restrict flux) {
  for (std::size_t q = 0; q < n; ++q) {
    double aq, cq;
    layer_factors(tau[q] * inv_mu, aq, cq);
    a[q] = aq;
    c[q] = cq;
    double r = radiance[q];
    r += -aq * (r - b_layer[q]) + cq * (b_exit[q] - b_layer[q]);
    radiance[q] = r;
    if constexpr (first) flux[q] = pi_w * r;
    else flux[q] += pi_w * r;
  }
}

BANDSTACK_VECTOR_CLONES
void down_through_layer(std::size_t n, double inv_mu, double pi_w, const double* __restrict tau,
                        const double* __restrict b_layer, const double* __restrict b_exit, double* __restrict a,
                        double* __restrict c, double* __restrict radiance, double* __restrict flux, bool first) {
  if (first) down_layer_loop<true>(n, inv_mu, pi_w, tau, b_layer, b_exit, a, c, radiance, flux);
  else down_layer_loop<false>(n, inv_mu, pi_w, tau, b_layer, b_exit, a, c, radiance, flux);
}

// One layer for every point, upward, with the factors of the downward pass.
template <bool first>
inline void up_layer_loop(std::size_t n, double pi_w, const double* __restrict b_layer, const double* __restrict b_exit,
                          const double* __restrict a, const double* __restrict c, double* __restrict radiance,
                          double* __restrict flux) {
  for (std::size_t q = 0; q < n; ++q) {
    double r = radiance[q];
    r += -a[q] * (r - b_layer[q]) + c[q] * (b_exit[q] - b_layer[q]);
    radiance[q] = r;
    if constexpr (first) flux[q] = pi_w * r;
    else flux[q] += pi_w * r;
  }
}

BANDSTACK_VECTOR_CLONES
void up_through_layer(std::size_t n, double pi_w, const double* __restrict b_layer, const double* __restrict b_exit,
                      const double* __restrict a, const double* __restrict c, double* __restrict radiance,
                      double* __restrict flux, bool first) {
  if (first) up_layer_loop<true>(n, pi_w, b_layer, b_exit, a, c, radiance, flux);
  else up_layer_loop<false>(n, pi_w, b_layer, b_exit, a, c, radiance, flux);
}

} // namespace

void longwave_fluxes_many(std::size_t point_count, std::span<const double> tau, std::span<const double> source_level,
                          std::span<const double> source_layer, std::span<const double> source_surface,
                          std::span<const double> surface_emissivity, const AngularQuadrature& angles,
                          std::span<double> flux_up, std::span<double> flux_down, LongwaveManyWorkspace& workspace) {
  const std::size_t n = point_count;
  if (n == 0) fail("spectral_points", 0, "the longwave solver needs at least one spectral point");
  if (tau.empty() || tau.size() % n != 0)
    fail("optical_depth", 0,
         "has " + std::to_string(tau.size()) + " values, expected a positive multiple of the " + std::to_string(n) +
             " spectral points");
  const std::size_t layers = tau.size() / n;
  const std::size_t level_values = (layers + 1) * n;
  if (source_level.size() != level_values)
    fail("planck_source_level", 0,
         "has " + std::to_string(source_level.size()) + " values, expected (layers + 1) x points = " +
             std::to_string(level_values));
  if (source_layer.size() != layers * n)
    fail("planck_source_layer", 0,
         "has " + std::to_string(source_layer.size()) +
             " values, expected layers x points = " + std::to_string(layers * n));
  if (source_surface.size() != n || surface_emissivity.size() != n)
    fail("planck_source_surface", 0, "surface source and emissivity need one value per spectral point");
  if (flux_up.size() != level_values || flux_down.size() != level_values)
    fail("longwave_flux", 0, "flux outputs need (layers + 1) x points = " + std::to_string(level_values) + " values");
  validate(angles);
  constexpr double largest = std::numeric_limits<double>::max();
  check_range(tau, 0.0, largest, "optical_depth", n, "must be finite and >= 0");
  check_range(source_level, 0.0, largest, "planck_source_level", n, "must be finite and >= 0");
  check_range(source_layer, 0.0, largest, "planck_source_layer", n, "must be finite and >= 0");
  check_range(source_surface, 0.0, largest, "planck_source_surface", n, "must be finite and >= 0");
  check_range(surface_emissivity, 0.0, 1.0, "surface_emissivity", n, "must lie in [0, 1]");
  detail::longwave_fluxes_many_kernel(n, layers, tau.data(), source_level.data(), source_layer.data(),
                                      source_surface.data(), surface_emissivity.data(), angles, flux_up.data(),
                                      flux_down.data(), workspace);
}

namespace detail {

void longwave_fluxes_many_kernel(std::size_t n, std::size_t layers, const double* tau_in, const double* source_level,
                                 const double* source_layer, const double* source_surface,
                                 const double* surface_emissivity, const AngularQuadrature& angles, double* flux_up,
                                 double* flux_down, LongwaveManyWorkspace& workspace) {
  const std::size_t n_dir = angles.size();
  workspace.absorptance.resize(n_dir * layers * n);
  workspace.linear_source.resize(n_dir * layers * n);
  workspace.radiance.resize(n);
  workspace.surface_radiance.resize(n);
  double* __restrict radiance = workspace.radiance.data();
  double* __restrict up = flux_up;
  double* __restrict down = flux_down;
  const double* __restrict b = source_level;
  const double* __restrict b_layer = source_layer;
  const double* __restrict t = tau_in;
  // Every level is set by the first direction but these two: nothing enters at the top, and the
  // surface's upward flux is summed below.
  for (std::size_t q = 0; q < n; ++q) {
    down[q] = 0.0;
    up[layers * n + q] = 0.0;
  }

  // Per direction and layer, exactly the update of longwave_fluxes (longwave.cpp, which derives
  // it): I_out = I_in - a (I_in - B_layer) + c (B_exit - B_layer), c = a w(x).
  double* a_all = workspace.absorptance.data();
  double* c_all = workspace.linear_source.data();
  for (std::size_t j = 0; j < n_dir; ++j) {
    const double inv_mu = 1.0 / angles.mu[j];
    const double pi_w = constants::pi * angles.weight[j];
    for (std::size_t q = 0; q < n; ++q)
      radiance[q] = 0.0; // nothing enters at the top
    for (std::size_t i = 0; i < layers; ++i) {
      const std::size_t at = (j * layers + i) * n;
      down_through_layer(n, inv_mu, pi_w, t + i * n, b_layer + i * n, b + (i + 1) * n, a_all + at, c_all + at, radiance,
                         down + (i + 1) * n, j == 0);
    }
  }

  // Lambertian surface: emits e B_s and reflects (1 - e) of the downward flux isotropically.
  double* __restrict surface = workspace.surface_radiance.data();
  const double* __restrict down_surface = down + layers * n;
  for (std::size_t q = 0; q < n; ++q) {
    const double e = surface_emissivity[q];
    surface[q] = e * source_surface[q] + (1.0 - e) * down_surface[q] / constants::pi;
  }
  for (std::size_t j = 0; j < n_dir; ++j) {
    const double pi_w = constants::pi * angles.weight[j];
    double* __restrict u_surface = up + layers * n;
    for (std::size_t q = 0; q < n; ++q) {
      radiance[q] = surface[q];
      u_surface[q] += pi_w * surface[q];
    }
    for (std::size_t i = layers; i-- > 0;) {
      const std::size_t at = (j * layers + i) * n;
      up_through_layer(n, pi_w, b_layer + i * n, b + i * n, a_all + at, c_all + at, radiance, up + i * n, j == 0);
    }
  }
}

} // namespace detail

} // namespace bandstack::solvers
