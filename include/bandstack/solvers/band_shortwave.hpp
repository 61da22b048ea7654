#pragma once
// Shortwave fluxes and heating rates of a column by band: the shortwave optics
// (shortwave_optics.hpp) for every g-point, the delta-Eddington two-stream and adding kernel
// (shortwave.hpp) for all g-points at once, fluxes summed over the g-points of each band and over
// the bands.
//
// Sunlight at the top, per g-point, on a surface normal to the beam (W m-2):
//   S_g = solar_constant * sun.distance_factor * sun.daylight_fraction * solar_weight[g]
// so the incoming flux on a horizontal surface is solar_constant * distance_factor *
// daylight_fraction * cos_zenith (with a daily-mean sun, the daily-mean insolation; sun.hpp).
// Night (cos_zenith <= 0 or daylight_fraction = 0): every flux and heating rate is 0 and the
// optics are not computed. The surface is Lambertian with the same albedo for the direct beam and
// diffuse light: column.surface_albedo, or one value per band.
//
// Example, many columns with one band set (one workspace and result per thread):
//   const auto tables = bandstack::solvers::make_shortwave_optics_tables(set);
//   bandstack::solvers::BandShortwaveWorkspace ws;
//   bandstack::solvers::ShortwaveResult r;
//   for (const auto& column : columns)
//     bandstack::solvers::solve_band_shortwave(column, tables, {}, 1361.0, ws, r);
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/atmosphere/sun.hpp"
#include "bandstack/solvers/shortwave.hpp"
#include "bandstack/solvers/shortwave_optics.hpp"
#include "bandstack/solvers/shortwave_result.hpp"
#include "bandstack/spectral/band_set.hpp"

#include <span>
#include <vector>

namespace bandstack::solvers {

// Everything one column's solve needs besides its inputs; reuse it so that repeated solves do not
// allocate. One per thread.
struct BandShortwaveWorkspace {
  ShortwaveOpticsWorkspace optics_workspace;
  ShortwaveOptics optics;
  ShortwaveWorkspace kernel_workspace;
  std::vector<double> toa_flux;          // per g-point, W m-2 normal to the beam
  std::vector<double> albedo;            // per g-point
  std::vector<double> flux_up;           // [k * n_g + g]
  std::vector<double> flux_down_direct;  // [k * n_g + g]
  std::vector<double> flux_down_diffuse; // [k * n_g + g]
};

// Fluxes (W m-2) at the N+1 levels and heating rates (K/day, heating.hpp, net = down - up) of the N
// layers of `column`, in total and by band, into `result` (every field of ShortwaveResult, including
// the band edges; resized as needed). The flux of a band is the sum over its g-points, a total the
// sum over bands in band order; direct and diffuse totals are summed over g-points in the same order.
// surface_albedo_by_band: empty for column.surface_albedo in every band, otherwise one value in
// [0, 1] per band. solar_constant_w_m2: total solar irradiance at 1 AU (finite, >= 0).
// Throws InputError for an invalid column or sun (cos_zenith not finite or > 1, distance_factor not
// finite and >= 0, daylight_fraction outside [0, 1]), a state outside the tables, or bad albedos.
void solve_band_shortwave(const atmosphere::Column& column, const ShortwaveOpticsTables& tables,
                          std::span<const double> surface_albedo_by_band, double solar_constant_w_m2,
                          BandShortwaveWorkspace& workspace, ShortwaveResult& result);

// Convenience for one column: builds the tables from `set` (validating it) on every call.
[[nodiscard]] ShortwaveResult
solve_band_shortwave(const atmosphere::Column& column, const spectral::BandSet& set,
                     std::span<const double> surface_albedo_by_band = {},
                     double solar_constant_w_m2 = atmosphere::total_solar_irradiance_w_m2);

// Completes a band-resolved result: with result.band_lower_cm1, band_upper_cm1, flux_up_by_band and
// flux_down_by_band filled ([b * (N+1) + k], W m-2), sets flux_up and flux_down to the sums over
// bands (in band order) and the heating rates (K/day), total and by band, from the column's level
// pressures and gravity. Leaves flux_down_direct and flux_down_diffuse alone. Throws InputError on
// inconsistent sizes.
void finish_shortwave_result(const atmosphere::Column& column, ShortwaveResult& result);

} // namespace bandstack::solvers
