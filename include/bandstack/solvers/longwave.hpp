#pragma once
// Longwave fluxes for one column and one g-point (or one band, or the grey case) without
// scattering: the Schwarzschild equation integrated along each quadrature direction.
//
// Source inside a layer: a layer value B_layer (Planck at the layer temperature) and the level
// value B_exit where the ray leaves the layer (top level for upward rays, bottom level for
// downward rays), as in Clough, Iacono & Moncet (1992, JGR 97, 15761; from memory). Along a ray of
// slant optical depth x = tau / mu across the layer
//   I_out = I_in e^{-x} + (1 - e^{-x}) B_eff,   B_eff = B_layer + w(x) (B_exit - B_layer).
// We use the exact w of a source linear in optical depth that takes B_layer at the layer's
// optical-depth centre and B_exit at the exit,
//   w(x) = coth(x/2) - 2/x   (= x/6 - x^3/360 + ... for small x, -> 1 as x -> inf, in [0, 1)),
// of which Clough et al.'s Pade form 0.2 x / (1 + 0.2 x) is an approximation (from memory; it
// differs by up to 0.135 near x = 8). Thin layers thus emit x B_layer whatever their level values
// (layer temperatures are seen directly), thick layers B_exit. With B_layer the mean of the two
// level values this is the plain linear-in-tau solution between levels.
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
  std::vector<double> linear_source; // (1 - exp(-tau/mu)) w(tau/mu) (see above), layers x directions
};

// Upward and downward fluxes (W m-2, both positive in their own direction) at the N+1 levels.
//   tau_layer          N vertical (normal-incidence) optical depths, each finite and >= 0
//   source_level       N+1 Planck radiances at the levels (W m-2 sr-1, integrated over the band or
//                      g-point interval; for the grey case sigma T^4 / pi), index 0 = top
//   source_layer       N Planck radiances at the layer temperatures (same units), index 0 = top
//   source_surface     Planck radiance of the surface (W m-2 sr-1) at its skin temperature
//   surface_emissivity in [0, 1]; the surface reflects (1 - e) of the downward flux diffusely
//   angles             directions and weights (see angular_quadrature.hpp for the normalisation)
//   flux_up, flux_down N+1 values each, overwritten
// No radiance enters at the top. Throws InputError for wrong sizes, negative or non-finite
// optical depths or sources (level or layer), an emissivity outside [0, 1] or invalid angles.
void longwave_fluxes(std::span<const double> tau_layer, std::span<const double> source_level,
                     std::span<const double> source_layer, double source_surface, double surface_emissivity,
                     const AngularQuadrature& angles, std::span<double> flux_up, std::span<double> flux_down,
                     LongwaveWorkspace& workspace);

// Same, with a temporary workspace (allocates).
void longwave_fluxes(std::span<const double> tau_layer, std::span<const double> source_level,
                     std::span<const double> source_layer, double source_surface, double surface_emissivity,
                     const AngularQuadrature& angles, std::span<double> flux_up, std::span<double> flux_down);

// The layer factors of the linear-in-tau solution for slant optical depth x = tau / mu >= 0:
//   absorptance    a = 1 - exp(-x)             (the transmittance is 1 - a)
//   linear_source  g = 1 - (1 - exp(-x)) / x   (-> x/2 as x -> 0, -> 1 as x -> inf)
// both accurate to about 1e-14 relative for every x >= 0 (series below x = 0.25). With these, the
// radiance leaving a layer whose source is linear in optical depth from B_in on the entry side to
// B_out on the exit side is
//   I_out = I_in - a (I_in - B_in) + g (B_out - B_in);
// with the layer value B_layer at the centre (B_in = 2 B_layer - B_out), as the kernels use it,
//   I_out = I_in - a (I_in - B_layer) + (2 g - a) (B_out - B_layer),   i.e. a w(x) = 2 g - a.
// Exposed for the other solvers and for tests.
struct LayerFactors {
  double absorptance;
  double linear_source;
};
[[nodiscard]] LayerFactors linear_in_tau_factors(double slant_tau) noexcept;

} // namespace bandstack::solvers
