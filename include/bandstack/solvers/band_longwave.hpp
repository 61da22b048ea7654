#pragma once
// Longwave fluxes and heating rates of a column by band: the band optics (band_optics.hpp) for
// every g-point, the longwave equations of longwave.hpp for each g-point (computed for all
// g-points at once by longwave_many.hpp), fluxes summed over the g-points of each band and over
// the bands.
//
// Example, many columns with one band set (one workspace and result per thread):
//   const auto tables = bandstack::solvers::make_band_optics_tables(set);
//   bandstack::solvers::BandLongwaveWorkspace ws;
//   bandstack::solvers::LongwaveResult r;
//   for (const auto& column : columns)
//     bandstack::solvers::solve_band_longwave(column, tables, angles, {}, ws, r);
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/band_optics.hpp"
#include "bandstack/solvers/longwave_many.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <span>
#include <vector>

namespace bandstack::solvers {

// Everything one column's band solve needs besides its inputs; reuse it so that repeated solves do
// not allocate. One per thread.
struct BandLongwaveWorkspace {
  BandOpticsWorkspace optics_workspace;
  BandOptics optics;
  LongwaveManyWorkspace kernel_workspace;
  std::vector<double> emissivity;   // per g-point
  std::vector<double> flux_up;      // [k * n_g + g]
  std::vector<double> flux_down;    // [k * n_g + g]
};

// Fluxes (W m-2) at the N+1 levels and heating rates (K/day, heating.hpp) of the N layers of
// `column`, in total and by band, into `result` (every field of LongwaveResult, including the band
// edges; resized as needed). The total is the sum over bands (in band order), the flux of a band
// the sum over its g-points; band heating rates come from band net fluxes.
// surface_emissivity_by_band: empty for column.surface_emissivity in every band, otherwise one
// value in [0, 1] per band. Throws InputError for an invalid column, a state outside the tables
// (band_optics.hpp), wrong emissivities or invalid angles.
void solve_band_longwave(const atmosphere::Column& column, const BandOpticsTables& tables,
                         const AngularQuadrature& angles, std::span<const double> surface_emissivity_by_band,
                         BandLongwaveWorkspace& workspace, LongwaveResult& result);

// Convenience for one column: builds the tables from `set` (validating it) on every call.
[[nodiscard]] LongwaveResult solve_band_longwave(const atmosphere::Column& column, const spectral::BandSet& set,
                                                 const AngularQuadrature& angles,
                                                 std::span<const double> surface_emissivity_by_band = {});

// Completes a band-resolved result: with result.band_lower_cm1, band_upper_cm1, flux_up_by_band
// and flux_down_by_band filled ([b * (N+1) + k], W m-2), sets flux_up and flux_down to the sums
// over bands (in band order) and the heating rates (K/day), total and by band, from the column's
// level pressures and gravity. Shared by the band and the reference solvers. Throws InputError on
// inconsistent sizes.
void finish_longwave_result(const atmosphere::Column& column, LongwaveResult& result);

} // namespace bandstack::solvers
