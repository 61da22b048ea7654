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

// Radiative heating of a column, longwave plus shortwave:
//   heating_k_day       N layers, K/day (resized by the callback), as solvers/heating.hpp defines it
//   toa_net_w_m2        net downward flux at the top of the atmosphere, W m-2 (absorbed solar - OLR)
//   surface_net_w_m2    net downward flux into the surface, W m-2 (shortwave + longwave)
// The heating rates must come from net fluxes with c_p = constants::specific_heat_dry_air_j_kg_k
// and the column's gravity (so that sum_i c_p dp_i/g H_i / 86400 + surface_net = toa_net), which
// the equilibrium solver uses to form the energy balance of a convective region.
// A callback may keep scratch space: use one copy per thread (a copy gets its own scratch).
// Throws InputError for a column its method cannot handle (e.g. a temperature outside its tables).
using NetHeating = std::function<void(const atmosphere::Column& column, std::vector<double>& heating_k_day,
                                      double& toa_net_w_m2, double& surface_net_w_m2)>;

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

} // namespace bandstack::climate
