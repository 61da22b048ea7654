#pragma once
// Shortwave fluxes through a column with absorption and scattering: every layer in the
// delta-Eddington approximation (delta_eddington.hpp), layers and a Lambertian surface combined by
// the adding method, with the direct solar beam and the diffuse light kept apart.
//
// Vertical convention as atmosphere::Column: index 0 is the top of the atmosphere; layer i lies
// between levels i and i + 1; level N is the surface. Fluxes are in W m-2 on a horizontal
// surface, each positive in its own direction.
//
// Night: the kernel needs the sun above the horizon (cos_zenith > 0) and throws otherwise; callers
// return zero shortwave fluxes when cos_zenith <= 0.
#include <cstddef>
#include <span>
#include <vector>

namespace bandstack::solvers {

// Scratch memory reused between calls, so that the kernel does not allocate once it has grown to
// the largest (layers x points) seen. One per thread; never share it between threads.
struct ShortwaveWorkspace {
  std::vector<double> scratch; // layer solutions and adding terms; the layout is internal
};

// One g-point of one column.
//   tau                       N extinction optical depths, finite and >= 0
//   single_scattering_albedo  N values in [0, 1]
//   asymmetry                 N asymmetry factors in [-1, 1]
//   cos_zenith                cosine of the solar zenith angle, in (0, 1]
//   toa_flux_w_m2             solar flux on a surface normal to the beam at the top, in this
//                             g-point (W m-2), finite and >= 0
//   surface_albedo_direct     Lambertian reflectance of the surface for the direct beam, [0, 1]
//   surface_albedo_diffuse    the same for diffuse light, [0, 1]
// Outputs, N+1 values each, overwritten:
//   flux_up            diffuse upward flux
//   flux_down_direct   cos_zenith * toa_flux * exp(-tau'_cum / cos_zenith), tau' the
//                      delta-scaled optical depth above the level (the scattered forward peak
//                      counts as direct)
//   flux_down_diffuse  diffuse downward flux (0 at the top). Below weakly scattering, absorbing
//                      layers over a bright surface it can be slightly negative (down to about
//                      -0.07 of the upward flux): the Eddington closure's negative diffuse
//                      reflectance (delta_eddington.hpp); net fluxes and absorption stay
//                      consistent.
// Energy is conserved: toa incoming = flux_up[0] + sum of layer absorption + surface absorption,
// with each layer's absorption equal to what its reflectances and transmittances imply for the
// fluxes entering it. Splitting a homogeneous layer into sub-layers leaves the fluxes unchanged
// (to rounding): the layer solutions are exact solutions of the same two-stream equations.
// Throws InputError naming the item and layer for wrong sizes or values outside the ranges above.
void shortwave_fluxes(std::span<const double> tau, std::span<const double> single_scattering_albedo,
                      std::span<const double> asymmetry, double cos_zenith, double toa_flux_w_m2,
                      double surface_albedo_direct, double surface_albedo_diffuse, std::span<double> flux_up,
                      std::span<double> flux_down_direct, std::span<double> flux_down_diffuse,
                      ShortwaveWorkspace& workspace);

// Same, with a temporary workspace (allocates).
void shortwave_fluxes(std::span<const double> tau, std::span<const double> single_scattering_albedo,
                      std::span<const double> asymmetry, double cos_zenith, double toa_flux_w_m2,
                      double surface_albedo_direct, double surface_albedo_diffuse, std::span<double> flux_up,
                      std::span<double> flux_down_direct, std::span<double> flux_down_diffuse);

// Many g-points (n = point_count) of one column at once, with the same sun; the loops over points
// vectorise. Arrays are point-fastest:
//   tau, single_scattering_albedo, asymmetry    [i * n + q], N x n
//   toa_flux_w_m2, surface_albedo_direct,
//   surface_albedo_diffuse                      [q], n
//   flux_up, flux_down_direct, flux_down_diffuse [k * n + q], (N+1) x n, overwritten
// Each point gives what shortwave_fluxes gives for its column of values (the same layer code;
// within 1e-13 of the flux scale, tested). Throws InputError as shortwave_fluxes does (the message
// names the layer and the g-point).
// Cost (benchmarks/shortwave_bench.cpp, 60 layers x 128 g-points, one thread): about 12 ns per
// layer and g-point, against about 26 ns one g-point at a time.
void shortwave_fluxes_many(std::size_t point_count, std::span<const double> tau,
                           std::span<const double> single_scattering_albedo, std::span<const double> asymmetry,
                           double cos_zenith, std::span<const double> toa_flux_w_m2,
                           std::span<const double> surface_albedo_direct,
                           std::span<const double> surface_albedo_diffuse, std::span<double> flux_up,
                           std::span<double> flux_down_direct, std::span<double> flux_down_diffuse,
                           ShortwaveWorkspace& workspace);

} // namespace bandstack::solvers
