// Input checks and the two entry points of the shortwave kernel; the work is in adding.cpp.
// (Selects in the range check vectorise only without the trapping-math assumption; see adding.cpp.)
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math")
#endif

#include "bandstack/solvers/shortwave.hpp"

#include "bandstack/core/error.hpp"
#include "solvers/adding.hpp"
#include "solvers/vector_math.hpp"

#include <limits>
#include <string>

namespace bandstack::solvers {

namespace {

[[noreturn]] void fail(const char* item, std::size_t layer, const std::string& message) {
  throw InputError(InputPlace::of(item, layer), message);
}


// Values are [layer * points + g-point]; a failure names the layer (as the place) and the g-point.
void check_range(std::span<const double> values, std::size_t points, double lo, double hi, const char* item,
                 const char* expected, bool per_layer) {
  if (detail::count_outside(values.data(), values.size(), lo, hi) == 0.0) return;
  for (std::size_t m = 0; m < values.size(); ++m) {
    if (values[m] >= lo && values[m] <= hi) continue;
    const std::string what = "value " + std::to_string(values[m]) + " at g-point " + std::to_string(m % points) +
                             " " + expected;
    if (per_layer) fail(item, m / points, what);
    throw InputError(InputPlace::of(item), what);
  }
}

void check_size(std::span<const double> values, std::size_t expected, const char* item, const char* what) {
  if (values.size() != expected)
    throw InputError(InputPlace::of(item), "has " + std::to_string(values.size()) + " values, expected " + what +
                                               " = " + std::to_string(expected));
}

void check_size(std::span<double> values, std::size_t expected, const char* item) {
  if (values.size() != expected)
    throw InputError(InputPlace::of(item), "output has " + std::to_string(values.size()) +
                                               " values, expected (layers + 1) x g-points = " +
                                               std::to_string(expected));
}

} // namespace

void shortwave_fluxes_many(std::size_t point_count, std::span<const double> tau,
                           std::span<const double> single_scattering_albedo, std::span<const double> asymmetry,
                           double cos_zenith, std::span<const double> toa_flux_w_m2,
                           std::span<const double> surface_albedo_direct,
                           std::span<const double> surface_albedo_diffuse, std::span<double> flux_up,
                           std::span<double> flux_down_direct, std::span<double> flux_down_diffuse,
                           ShortwaveWorkspace& workspace) {
  const std::size_t n = point_count;
  if (n == 0) throw InputError(InputPlace::of("g_points"), "the shortwave solver needs at least one g-point");
  if (tau.empty() || tau.size() % n != 0)
    throw InputError(InputPlace::of("optical_depth"),
                     "has " + std::to_string(tau.size()) + " values, expected a positive multiple of the " +
                         std::to_string(n) + " g-points (layers x g-points)");
  const std::size_t layers = tau.size() / n;
  const std::size_t cells = layers * n;
  const std::size_t level_values = (layers + 1) * n;
  check_size(single_scattering_albedo, cells, "single_scattering_albedo", "layers x g-points");
  check_size(asymmetry, cells, "asymmetry_factor", "layers x g-points");
  check_size(toa_flux_w_m2, n, "toa_solar_flux", "g-points");
  check_size(surface_albedo_direct, n, "surface_albedo_direct", "g-points");
  check_size(surface_albedo_diffuse, n, "surface_albedo_diffuse", "g-points");
  check_size(flux_up, level_values, "shortwave_flux_up");
  check_size(flux_down_direct, level_values, "shortwave_flux_down_direct");
  check_size(flux_down_diffuse, level_values, "shortwave_flux_down_diffuse");
  if (!(cos_zenith > 0.0 && cos_zenith <= 1.0))
    throw InputError(InputPlace::of("cos_zenith"),
                     "value " + std::to_string(cos_zenith) +
                         " must lie in (0, 1]: the kernel needs the sun above the horizon (at night the caller "
                         "sets shortwave fluxes to zero)");
  constexpr double largest = std::numeric_limits<double>::max();
  check_range(tau, n, 0.0, largest, "optical_depth", "must be finite and >= 0", true);
  check_range(single_scattering_albedo, n, 0.0, 1.0, "single_scattering_albedo", "must lie in [0, 1]", true);
  check_range(asymmetry, n, -1.0, 1.0, "asymmetry_factor", "must lie in [-1, 1]", true);
  check_range(toa_flux_w_m2, n, 0.0, largest, "toa_solar_flux", "must be finite and >= 0", false);
  check_range(surface_albedo_direct, n, 0.0, 1.0, "surface_albedo_direct", "must lie in [0, 1]", false);
  check_range(surface_albedo_diffuse, n, 0.0, 1.0, "surface_albedo_diffuse", "must lie in [0, 1]", false);

  const std::size_t scratch = detail::shortwave_scratch_size(layers, n);
  if (workspace.scratch.size() < scratch) workspace.scratch.resize(scratch);

  detail::ShortwaveColumnView v{};
  v.points = n;
  v.layers = layers;
  v.tau = tau.data();
  v.ssa = single_scattering_albedo.data();
  v.asym = asymmetry.data();
  v.mu0 = cos_zenith;
  v.toa_flux = toa_flux_w_m2.data();
  v.albedo_direct = surface_albedo_direct.data();
  v.albedo_diffuse = surface_albedo_diffuse.data();
  v.flux_up = flux_up.data();
  v.flux_down_direct = flux_down_direct.data();
  v.flux_down_diffuse = flux_down_diffuse.data();
  v.scratch = workspace.scratch.data();
  detail::shortwave_column(v);
}

void shortwave_fluxes(std::span<const double> tau, std::span<const double> single_scattering_albedo,
                      std::span<const double> asymmetry, double cos_zenith, double toa_flux_w_m2,
                      double surface_albedo_direct, double surface_albedo_diffuse, std::span<double> flux_up,
                      std::span<double> flux_down_direct, std::span<double> flux_down_diffuse,
                      ShortwaveWorkspace& workspace) {
  if (tau.empty()) throw InputError(InputPlace::of("optical_depth"), "the shortwave solver needs at least one layer");
  shortwave_fluxes_many(1, tau, single_scattering_albedo, asymmetry, cos_zenith, {&toa_flux_w_m2, 1},
                        {&surface_albedo_direct, 1}, {&surface_albedo_diffuse, 1}, flux_up, flux_down_direct,
                        flux_down_diffuse, workspace);
}

void shortwave_fluxes(std::span<const double> tau, std::span<const double> single_scattering_albedo,
                      std::span<const double> asymmetry, double cos_zenith, double toa_flux_w_m2,
                      double surface_albedo_direct, double surface_albedo_diffuse, std::span<double> flux_up,
                      std::span<double> flux_down_direct, std::span<double> flux_down_diffuse) {
  ShortwaveWorkspace workspace;
  shortwave_fluxes(tau, single_scattering_albedo, asymmetry, cos_zenith, toa_flux_w_m2, surface_albedo_direct,
                   surface_albedo_diffuse, flux_up, flux_down_direct, flux_down_diffuse, workspace);
}

} // namespace bandstack::solvers
