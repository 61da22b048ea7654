#pragma once
// Longwave fluxes for one column and one g-point (or one band, or the grey case) without
// scattering: the Schwarzschild equation integrated along each quadrature direction, with the
// Planck source varying linearly in optical depth inside every layer.
//
// Vertical convention (as atmosphere::Column): index 0 is the top of the atmosphere; layer i lies
// between level i (above) and level i + 1 (below); level N is the surface.
#include "bandstack/solvers/angular_quadrature.hpp"

#include <cstddef>
#include <span>
#include <vector>

namespace bandstack::solvers {

// Scratch memory reused between calls so the kernel does not allocate once it has grown to the
// largest (layers x directions) seen. One workspace per thread; never share it between threads.
struct LongwaveWorkspace {
  std::vector<double> absorptance;   // 1 - exp(-tau/mu), layers x directions
  std::vector<double> linear_source; // 1 - (1 - exp(-tau/mu)) / (tau/mu), layers x directions
};

// Upward and downward fluxes (W m-2, both positive in their own direction) at the N+1 levels.
//   tau_layer          N vertical (normal-incidence) optical depths, each finite and >= 0
//   source_level       N+1 Planck radiances at the levels (W m-2 sr-1, integrated over the band or
//                      g-point interval; for the grey case sigma T^4 / pi), index 0 = top
//   source_surface     Planck radiance of the surface (W m-2 sr-1) at its skin temperature
//   surface_emissivity in [0, 1]; the surface reflects (1 - e) of the downward flux diffusely
//   angles             directions and weights (see angular_quadrature.hpp for the normalisation)
//   flux_up, flux_down N+1 values each, overwritten
// No radiance enters at the top. Throws InputError for wrong sizes, negative or non-finite
// optical depths or sources, an emissivity outside [0, 1] or invalid angles.
void longwave_fluxes(std::span<const double> tau_layer, std::span<const double> source_level, double source_surface,
                     double surface_emissivity, const AngularQuadrature& angles, std::span<double> flux_up,
                     std::span<double> flux_down, LongwaveWorkspace& workspace);

// Same, with a temporary workspace (allocates).
void longwave_fluxes(std::span<const double> tau_layer, std::span<const double> source_level, double source_surface,
                     double surface_emissivity, const AngularQuadrature& angles, std::span<double> flux_up,
                     std::span<double> flux_down);

// The layer factors of the linear-in-tau solution for slant optical depth x = tau / mu >= 0:
//   absorptance    a = 1 - exp(-x)             (the transmittance is 1 - a)
//   linear_source  g = 1 - (1 - exp(-x)) / x   (-> x/2 as x -> 0, -> 1 as x -> inf)
// both accurate to about 1e-14 relative for every x >= 0 (series below x = 0.25). With these, the
// radiance leaving a layer whose source is B_in on the entry side and B_out on the exit side is
//   I_out = I_in - a (I_in - B_in) + g (B_out - B_in).
// Exposed for the other solvers and for tests.
struct LayerFactors {
  double absorptance;
  double linear_source;
};
[[nodiscard]] LayerFactors linear_in_tau_factors(double slant_tau) noexcept;

} // namespace bandstack::solvers
