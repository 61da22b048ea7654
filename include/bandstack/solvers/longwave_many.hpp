#pragma once
// Longwave fluxes for many spectral points of one column at once: the g-points of a band set, or
// the wavenumber intervals of the line-resolved reference. The equations are those of
// longwave_fluxes (longwave.hpp: no scattering, a layer source and the exit level's source
// combined as in Clough, Iacono & Moncet 1992, Gauss or diffusivity directions, Lambertian
// surface), point by point; only the data layout differs. Arrays are stored point-fastest, so the
// loops over points vectorise while the recurrence runs down (and up) the layers.
//
// Vertical convention as atmosphere::Column: index 0 is the top; layer i lies between levels i and
// i + 1; level N is the surface.
#include "bandstack/solvers/angular_quadrature.hpp"

#include <cstddef>
#include <span>
#include <vector>

namespace bandstack::solvers {

// Scratch memory reused between calls (layer factors of every direction). One per thread.
struct LongwaveManyWorkspace {
  std::vector<double> absorptance;      // directions x layers x points
  std::vector<double> linear_source;    // directions x layers x points: (1 - exp(-x)) w(x), longwave.hpp
  std::vector<double> radiance;         // points
  std::vector<double> surface_radiance; // points
};

// Upward and downward fluxes (W m-2) of `point_count` independent spectral points (n) through N
// layers. All arrays are point-fastest:
//   tau                [i * n + q]  N x n vertical optical depths, finite and >= 0
//   source_level       [k * n + q]  (N+1) x n Planck radiances of each point's interval at the
//                                   levels (W m-2 sr-1), finite and >= 0
//   source_layer       [i * n + q]  N x n Planck radiances at the layer temperatures (W m-2 sr-1),
//                                   finite and >= 0
//   source_surface     [q]          n Planck radiances of the surface (W m-2 sr-1)
//   surface_emissivity [q]          n emissivities in [0, 1]
//   flux_up, flux_down [k * n + q]  (N+1) x n, overwritten
// Each point gives what longwave_fluxes gives for its column of values (within 1e-13 relative;
// tested). Throws InputError for inconsistent sizes, values out of range or invalid angles.
void longwave_fluxes_many(std::size_t point_count, std::span<const double> tau, std::span<const double> source_level,
                          std::span<const double> source_layer, std::span<const double> source_surface,
                          std::span<const double> surface_emissivity, const AngularQuadrature& angles,
                          std::span<double> flux_up, std::span<double> flux_down, LongwaveManyWorkspace& workspace);

} // namespace bandstack::solvers
