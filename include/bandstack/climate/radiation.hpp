#pragma once
// The radiation an equilibrium calculation needs from a column, behind one callback type so that
// the equilibrium solver does not depend on a particular radiative method.
#include <functional>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/grey.hpp"
#include "bandstack/spectral/band_set.hpp"

namespace bandstack::climate {

// What one radiative evaluation of a column gives, longwave plus shortwave.
struct RadiationOutput {
  std::vector<double> heating_k_day;   // N layers, K/day, as solvers/heating.hpp defines it
  std::vector<double> net_flux_w_m2;   // N+1 levels, net downward flux (down - up, LW + SW), W m-2
  double olr_w_m2 = 0.0;               // outgoing longwave flux at the top, W m-2
  double absorbed_solar_w_m2 = 0.0;    // shortwave absorbed by the column and the surface, W m-2

  // Net downward flux at the top of the atmosphere (absorbed solar - OLR), W m-2.
  [[nodiscard]] double toa_net_w_m2() const { return net_flux_w_m2.front(); }
  // Net downward flux into the surface (shortwave + longwave), W m-2.
  [[nodiscard]] double surface_net_w_m2() const { return net_flux_w_m2.back(); }
};

// Radiative heating of a column. The callback fills every member of `out` (resizing its vectors).
// The heating rates must come from the net fluxes with c_p = constants::specific_heat_dry_air_j_kg_k
// and the column's gravity (so that sum_i c_p dp_i/g H_i / 86400 + surface_net = toa_net), which
// the equilibrium solver uses to form the energy balance of a convective region.
// A callback may keep scratch space: use one copy per thread (a copy gets its own scratch).
// Throws InputError for a column its method cannot handle (e.g. a temperature outside its tables).
using NetHeating = std::function<void(const atmosphere::Column& column, RadiationOutput& out)>;

// Grey longwave only (solvers::solve_grey_longwave with `optics` and `angles`), with sunlight
// absorbed only by the surface: surface_absorbed_solar_w_m2 (finite, >= 0) enters both the surface
// and the top-of-atmosphere balance; the atmosphere absorbs no sunlight.
// Throws InputError (item "surface_absorbed_solar") for a bad value.
[[nodiscard]] NetHeating grey_net_heating(const solvers::GreyOptics& optics, const solvers::AngularQuadrature& angles,
                                          double surface_absorbed_solar_w_m2);

// Band longwave (solvers::solve_band_longwave with `angles`) plus band shortwave
// (solvers::solve_band_shortwave, the column's sun and albedo, solar_constant_w_m2 at 1 AU).
// The optics tables are built once here and shared read-only by all copies of the callback.
// Usually with io::load_band_set("default_lw") and io::load_band_set("default_sw").
// Throws InputError for invalid sets (or a longwave set given as the shortwave one).
[[nodiscard]] NetHeating band_net_heating(const spectral::BandSet& longwave_set, const spectral::BandSet& shortwave_set,
                                          const solvers::AngularQuadrature& angles, double solar_constant_w_m2);

// The radiation of a band set with only the flagged longwave bands absorbing (inactive bands made
// transparent: their gas and continuum absorption is zeroed; see spectral::with_active_bands).
// One flag per longwave band.
using RadiationWithBands = std::function<NetHeating(const std::vector<bool>& active_longwave_bands)>;

// band_net_heating of spectral::with_active_bands(longwave_set, flags) and shortwave_set; the sets
// are copied once and shared read-only by all copies of the returned function. Every call builds new
// optics tables (a few milliseconds for the default sets). Throws InputError (item
// "solar_constant" or the angles) for bad arguments here, and from each call what with_active_bands
// and band_net_heating throw.
[[nodiscard]] RadiationWithBands band_net_heating_with_bands(const spectral::BandSet& longwave_set,
                                                             const spectral::BandSet& shortwave_set,
                                                             const solvers::AngularQuadrature& angles,
                                                             double solar_constant_w_m2);

} // namespace bandstack::climate
