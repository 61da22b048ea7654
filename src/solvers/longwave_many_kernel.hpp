#pragma once
// Private to solvers: the many-point longwave kernel without the input checks of
// longwave_fluxes_many, for callers whose inputs are valid by construction (the band solver: optical
// depths and sources from validated band tables and a validated column). Arrays as in
// longwave_fluxes_many: tau and source_layer layers x n, source_level and the fluxes (layers + 1) x n,
// source_surface and surface_emissivity n; the fluxes are overwritten.
#include <cstddef>

#include "bandstack/solvers/longwave_many.hpp"

namespace bandstack::solvers::detail {

void longwave_fluxes_many_kernel(std::size_t n, std::size_t layers, const double* tau, const double* source_level,
                                 const double* source_layer, const double* source_surface,
                                 const double* surface_emissivity, const AngularQuadrature& angles, double* flux_up,
                                 double* flux_down, LongwaveManyWorkspace& workspace);

} // namespace bandstack::solvers::detail
