#include "bandstack/solvers/band_longwave.hpp"

#include "solvers/band_result.hpp"
#include "solvers/longwave_many_kernel.hpp"

#include "bandstack/core/error.hpp"
#include "bandstack/solvers/heating.hpp"

#include <fmt/format.h>
#include <string>

namespace bandstack::solvers {

namespace {

[[noreturn]] void fail(const char* item, const std::string& message) {
  InputPlace place;
  place.item = item;
  throw InputError(place, message);
}

} // namespace

void finish_longwave_result(const atmosphere::Column& column, LongwaveResult& result) {
  detail::finish_band_result(column, result, "longwave_result");
}

void solve_band_longwave(const atmosphere::Column& column, const BandOpticsTables& tables,
                         const AngularQuadrature& angles, std::span<const double> surface_emissivity_by_band,
                         BandLongwaveWorkspace& ws, LongwaveResult& result) {
  compute_band_optics(column, tables, ws.optics, ws.optics_workspace); // validates the column
  const std::size_t n = column.layer_count();
  const std::size_t levels = n + 1;
  const std::size_t n_band = tables.band_count();
  const std::size_t n_g = tables.gpoint_count();

  if (!surface_emissivity_by_band.empty() && surface_emissivity_by_band.size() != n_band)
    fail("surface_emissivity_by_band", fmt::format("has {} values, expected one per band ({})",
                                                   surface_emissivity_by_band.size(), n_band));
  for (std::size_t b = 0; b < surface_emissivity_by_band.size(); ++b)
    if (!(surface_emissivity_by_band[b] >= 0.0 && surface_emissivity_by_band[b] <= 1.0))
      fail("surface_emissivity_by_band",
           fmt::format("band {}: emissivity {} must lie in [0, 1]", b, surface_emissivity_by_band[b]));
  ws.emissivity.resize(n_g);
  for (std::size_t g = 0; g < n_g; ++g)
    ws.emissivity[g] = surface_emissivity_by_band.empty() ? column.surface_emissivity
                                                          : surface_emissivity_by_band[tables.gpoint_band[g]];

  ws.flux_up.resize(levels * n_g);
  ws.flux_down.resize(levels * n_g);
  // The optics are valid by construction (validated tables and column): no second pass of checks.
  validate(angles);
  detail::longwave_fluxes_many_kernel(n_g, n, ws.optics.optical_depth.data(), ws.optics.source_level.data(),
                                      ws.optics.source_layer.data(), ws.optics.source_surface.data(),
                                      ws.emissivity.data(), angles, ws.flux_up.data(), ws.flux_down.data(),
                                      ws.kernel_workspace);

  result.band_lower_cm1.assign(tables.band_lower_cm1.begin(), tables.band_lower_cm1.end());
  result.band_upper_cm1.assign(tables.band_upper_cm1.begin(), tables.band_upper_cm1.end());
  result.flux_up_by_band.resize(n_band * levels);
  result.flux_down_by_band.resize(n_band * levels);
  detail::band_sums(ws.flux_up.data(), levels, n_g, tables.band_first_gpoint.data(), n_band, result.flux_up_by_band.data());
  detail::band_sums(ws.flux_down.data(), levels, n_g, tables.band_first_gpoint.data(), n_band,
                    result.flux_down_by_band.data());
  finish_longwave_result(column, result);
}

LongwaveResult solve_band_longwave(const atmosphere::Column& column, const spectral::BandSet& set,
                                   const AngularQuadrature& angles, std::span<const double> surface_emissivity_by_band) {
  const BandOpticsTables tables = make_band_optics_tables(set);
  BandLongwaveWorkspace ws;
  LongwaveResult result;
  solve_band_longwave(column, tables, angles, surface_emissivity_by_band, ws, result);
  return result;
}

} // namespace bandstack::solvers
