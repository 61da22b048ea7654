#pragma once
// Line-resolved longwave reference: the equations of the band solver (longwave.hpp: no scattering,
// layer and exit-level Planck sources, angular quadrature, Lambertian surface)
// solved for every interval of a fine wavenumber grid, with absorption straight from an absorber
// source. It is the yardstick for band sets, not a different physics.
//
// Per fine-grid interval q of width d_nu centred on nu_q:
//   tau_q,i  = sum over absorbers of kappa_a(nu_q; p_i, T_i) * m_a,i   (x e_h2o,i for the
//              self-continuum), with the layer state and amounts of band_optics.hpp;
//   source   = B_nu(nu_q, T) * d_nu at the levels, layers and surface (midpoint rule: relative error
//              about (c2 d_nu / T)^2 / 24 per interval, 1e-10 at 0.01 cm-1 and 1e-6 at 1 cm-1 for
//              T ~ 250 K; c2 = 1.4388 cm K).
// Fluxes of an interval count towards the band holding its midpoint. Wavenumbers outside the grid
// contribute nothing (the grid should cover the Planck spectrum of the column, e.g. 10-3000 cm-1).
//
// Angles: the issue this solver answers asks for at least 4 Gauss directions for the yardstick
// (gauss_quadrature(4)); any valid quadrature is accepted so that band and reference solvers can be
// compared with identical angles in tests.
//
// Cost: about (layers x absorbers) absorber evaluations plus (levels + layers) Planck evaluations and
// (layers x directions) kernel steps per fine-grid point; see benchmarks/band_longwave_bench.cpp.
// The grid is processed in chunks of 1024 points in fixed order, so memory stays small
// and the result is deterministic.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/spectral/absorber.hpp"

#include <span>

namespace bandstack::solvers {

// Fluxes and heating rates of `column`, total and by band (every field of LongwaveResult).
//   source                  absorption coefficients (AbsorberSource::absorption at each layer state)
//   grid                    the fine grid; it must lie within [band_edges_cm1.front(), .back()]
//   band_edges_cm1          n_band + 1 strictly increasing edges (cm-1): band b is [edge b, edge b+1]
//   angles                  directions (use >= 4 Gauss directions for a reference)
//   surface_emissivity_by_band  empty for column.surface_emissivity everywhere, else one value per band
// Throws InputError for an invalid column, grid, edges, emissivities or angles, and when the source
// rejects a layer state (rethrown naming the layer).
[[nodiscard]] LongwaveResult solve_reference_longwave(const atmosphere::Column& column,
                                                      const spectral::AbsorberSource& source,
                                                      const spectral::WavenumberGrid& grid,
                                                      std::span<const double> band_edges_cm1,
                                                      const AngularQuadrature& angles,
                                                      std::span<const double> surface_emissivity_by_band = {});

} // namespace bandstack::solvers
