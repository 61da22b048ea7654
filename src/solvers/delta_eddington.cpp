// Same floating-point assumptions as adding.cpp, so that both compile the shared layer code alike.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math")
#endif

#include "bandstack/solvers/delta_eddington.hpp"

#include "bandstack/core/error.hpp"
#include "solvers/delta_eddington_kernel.hpp"

#include <cmath>
#include <limits>
#include <string>

namespace bandstack::solvers {

namespace {

void check(double value, double lo, double hi, const char* item, const char* expected) {
  if (!(value >= lo && value <= hi))
    throw InputError(InputPlace::of(item), "value " + std::to_string(value) + " " + expected);
}

void check_layer(double tau, double omega, double g) {
  check(tau, 0.0, std::numeric_limits<double>::max(), "optical_depth", "must be finite and >= 0");
  check(omega, 0.0, 1.0, "single_scattering_albedo", "must lie in [0, 1]");
  check(g, -1.0, 1.0, "asymmetry_factor", "must lie in [-1, 1]");
}

} // namespace

DeltaScaled delta_eddington_scaling(double optical_depth, double single_scattering_albedo, double asymmetry) {
  check_layer(optical_depth, single_scattering_albedo, asymmetry);
  return detail::delta_scale(optical_depth, single_scattering_albedo, asymmetry);
}

LayerReflectance delta_eddington_layer(double optical_depth, double single_scattering_albedo, double asymmetry,
                                       double cos_zenith) {
  check_layer(optical_depth, single_scattering_albedo, asymmetry);
  if (!(cos_zenith > 0.0 && cos_zenith <= 1.0))
    throw InputError(InputPlace::of("cos_zenith"),
                     "value " + std::to_string(cos_zenith) + " must lie in (0, 1] (the sun above the horizon)");
  return detail::delta_eddington_unchecked(optical_depth, single_scattering_albedo, asymmetry, cos_zenith);
}

} // namespace bandstack::solvers
