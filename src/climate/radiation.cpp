#include "bandstack/climate/radiation.hpp"

#include <cmath>
#include <memory>
#include <utility>

#include "bandstack/core/error.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/band_shortwave.hpp"

namespace bandstack::climate {

NetHeating grey_net_heating(const solvers::GreyOptics& optics, const solvers::AngularQuadrature& angles,
                            double surface_absorbed_solar_w_m2) {
  if (!std::isfinite(surface_absorbed_solar_w_m2) || surface_absorbed_solar_w_m2 < 0.0)
    throw InputError(InputPlace::of("surface_absorbed_solar"), "must be finite and >= 0 W m-2");
  solvers::validate(angles);
  return [optics, angles, solar = surface_absorbed_solar_w_m2](const atmosphere::Column& column, RadiationOutput& out) {
    const solvers::LongwaveResult lw = solvers::solve_grey_longwave(column, optics, angles);
    out.heating_k_day = lw.heating_rate_k_day;
    out.net_flux_w_m2.resize(lw.flux_up.size());
    for (std::size_t k = 0; k < lw.flux_up.size(); ++k) out.net_flux_w_m2[k] = solar + lw.flux_down[k] - lw.flux_up[k];
    out.olr_w_m2 = lw.olr();
    out.absorbed_solar_w_m2 = solar;
  };
}

namespace {

struct BandTables {
  solvers::BandOpticsTables longwave;
  solvers::ShortwaveOpticsTables shortwave;
};

// Scratch of one callback copy; copying the callback copies it, so copies never share it.
struct BandScratch {
  solvers::BandLongwaveWorkspace lw_workspace;
  solvers::BandShortwaveWorkspace sw_workspace;
  solvers::LongwaveResult lw;
  solvers::ShortwaveResult sw;
};

} // namespace

NetHeating band_net_heating(const spectral::BandSet& longwave_set, const spectral::BandSet& shortwave_set,
                            const solvers::AngularQuadrature& angles, double solar_constant_w_m2) {
  if (!std::isfinite(solar_constant_w_m2) || solar_constant_w_m2 < 0.0)
    throw InputError(InputPlace::of("solar_constant"), "must be finite and >= 0 W m-2");
  solvers::validate(angles);
  auto tables = std::make_shared<const BandTables>(BandTables{solvers::make_band_optics_tables(longwave_set),
                                                              solvers::make_shortwave_optics_tables(shortwave_set)});
  return [tables, angles, solar_constant_w_m2, scratch = BandScratch{}](const atmosphere::Column& column,
                                                                        RadiationOutput& out) mutable {
    solvers::solve_band_longwave(column, tables->longwave, angles, {}, scratch.lw_workspace, scratch.lw);
    solvers::solve_band_shortwave(column, tables->shortwave, {}, solar_constant_w_m2, scratch.sw_workspace,
                                  scratch.sw);
    const std::size_t n = column.layer_count();
    out.heating_k_day.resize(n);
    for (std::size_t i = 0; i < n; ++i)
      out.heating_k_day[i] = scratch.lw.heating_rate_k_day[i] + scratch.sw.heating_rate_k_day[i];
    out.net_flux_w_m2.resize(n + 1);
    for (std::size_t k = 0; k <= n; ++k)
      out.net_flux_w_m2[k] = scratch.sw.flux_down[k] - scratch.sw.flux_up[k] + scratch.lw.flux_down[k] - scratch.lw.flux_up[k];
    out.olr_w_m2 = scratch.lw.olr();
    out.absorbed_solar_w_m2 = scratch.sw.absorbed_solar();
  };
}

RadiationWithBands band_net_heating_with_bands(const spectral::BandSet& longwave_set,
                                               const spectral::BandSet& shortwave_set,
                                               const solvers::AngularQuadrature& angles, double solar_constant_w_m2) {
  if (!std::isfinite(solar_constant_w_m2) || solar_constant_w_m2 < 0.0)
    throw InputError(InputPlace::of("solar_constant"), "must be finite and >= 0 W m-2");
  solvers::validate(angles);
  auto sets = std::make_shared<const std::pair<spectral::BandSet, spectral::BandSet>>(longwave_set, shortwave_set);
  return [sets, angles, solar_constant_w_m2](const std::vector<bool>& active_longwave_bands) {
    return band_net_heating(spectral::with_active_bands(sets->first, active_longwave_bands), sets->second, angles,
                            solar_constant_w_m2);
  };
}

} // namespace bandstack::climate
