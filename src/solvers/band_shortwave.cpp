#include "bandstack/solvers/band_shortwave.hpp"

#include "solvers/band_result.hpp"

#include "bandstack/core/error.hpp"
#include "bandstack/solvers/heating.hpp"

#include <cmath>
#include <fmt/format.h>
#include <string>

namespace bandstack::solvers {

namespace {

[[noreturn]] void fail(const char* item, const std::string& message) {
  throw InputError(InputPlace::of(item), message);
}

void check_sun(const atmosphere::SunGeometry& sun) {
  if (!std::isfinite(sun.cos_zenith) || sun.cos_zenith > 1.0)
    fail("sun.cos_zenith", fmt::format("{} must be finite and at most 1", sun.cos_zenith));
  if (!std::isfinite(sun.distance_factor) || sun.distance_factor < 0.0)
    fail("sun.distance_factor", fmt::format("{} must be finite and >= 0", sun.distance_factor));
  if (!(sun.daylight_fraction >= 0.0 && sun.daylight_fraction <= 1.0))
    fail("sun.daylight_fraction", fmt::format("{} must lie in [0, 1]", sun.daylight_fraction));
}

} // namespace

void finish_shortwave_result(const atmosphere::Column& column, ShortwaveResult& result) {
  detail::finish_band_result(column, result, "shortwave_result");
}

void solve_band_shortwave(const atmosphere::Column& column, const ShortwaveOpticsTables& tables,
                          std::span<const double> surface_albedo_by_band, double solar_constant_w_m2,
                          BandShortwaveWorkspace& ws, ShortwaveResult& result) {
  const std::size_t n_band = tables.band_count();
  const std::size_t n_g = tables.gpoint_count();
  if (!std::isfinite(solar_constant_w_m2) || solar_constant_w_m2 < 0.0)
    fail("solar_constant", fmt::format("{} W m-2 must be finite and >= 0", solar_constant_w_m2));
  check_sun(column.sun);
  if (!surface_albedo_by_band.empty() && surface_albedo_by_band.size() != n_band)
    fail("surface_albedo_by_band",
         fmt::format("has {} values, expected one per band ({})", surface_albedo_by_band.size(), n_band));
  for (std::size_t b = 0; b < surface_albedo_by_band.size(); ++b)
    if (!(surface_albedo_by_band[b] >= 0.0 && surface_albedo_by_band[b] <= 1.0))
      fail("surface_albedo_by_band",
           fmt::format("band {}: albedo {} must lie in [0, 1]", b, surface_albedo_by_band[b]));

  const std::size_t n = column.layer_count();
  const std::size_t levels = n + 1;
  result.band_lower_cm1.assign(tables.absorption.band_lower_cm1.begin(), tables.absorption.band_lower_cm1.end());
  result.band_upper_cm1.assign(tables.absorption.band_upper_cm1.begin(), tables.absorption.band_upper_cm1.end());
  result.flux_up_by_band.assign(n_band * levels, 0.0);
  result.flux_down_by_band.assign(n_band * levels, 0.0);
  result.flux_down_direct.assign(levels, 0.0);
  result.flux_down_diffuse.assign(levels, 0.0);

  const bool night = column.sun.cos_zenith <= 0.0 || column.sun.daylight_fraction == 0.0;
  if (night) {
    atmosphere::validate(column);
    finish_shortwave_result(column, result);
    return;
  }

  compute_shortwave_optics(column, tables, ws.optics, ws.optics_workspace); // validates the column
  const double scale = solar_constant_w_m2 * column.sun.distance_factor * column.sun.daylight_fraction;
  ws.toa_flux.resize(n_g);
  ws.albedo.resize(n_g);
  for (std::size_t g = 0; g < n_g; ++g) {
    ws.toa_flux[g] = scale * tables.solar_weight[g];
    ws.albedo[g] = surface_albedo_by_band.empty() ? column.surface_albedo
                                                  : surface_albedo_by_band[tables.absorption.gpoint_band[g]];
  }
  ws.flux_up.resize(levels * n_g);
  ws.flux_down_direct.resize(levels * n_g);
  ws.flux_down_diffuse.resize(levels * n_g);
  shortwave_fluxes_many(n_g, ws.optics.optical_depth, ws.optics.single_scattering_albedo, ws.optics.asymmetry,
                        column.sun.cos_zenith, ws.toa_flux, ws.albedo, ws.albedo, ws.flux_up, ws.flux_down_direct,
                        ws.flux_down_diffuse, ws.kernel_workspace);

  const std::vector<std::size_t>& first = tables.absorption.band_first_gpoint;
  for (std::size_t b = 0; b < n_band; ++b)
    for (std::size_t k = 0; k < levels; ++k) {
      const double* up = ws.flux_up.data() + k * n_g;
      const double* direct = ws.flux_down_direct.data() + k * n_g;
      const double* diffuse = ws.flux_down_diffuse.data() + k * n_g;
      double sum_up = 0.0, sum_direct = 0.0, sum_diffuse = 0.0;
      for (std::size_t g = first[b]; g < first[b + 1]; ++g) {
        sum_up += up[g];
        sum_direct += direct[g];
        sum_diffuse += diffuse[g];
      }
      result.flux_up_by_band[b * levels + k] = sum_up;
      result.flux_down_by_band[b * levels + k] = sum_direct + sum_diffuse;
      result.flux_down_direct[k] += sum_direct;
      result.flux_down_diffuse[k] += sum_diffuse;
    }
  finish_shortwave_result(column, result);
}

ShortwaveResult solve_band_shortwave(const atmosphere::Column& column, const spectral::BandSet& set,
                                     std::span<const double> surface_albedo_by_band, double solar_constant_w_m2) {
  const ShortwaveOpticsTables tables = make_shortwave_optics_tables(set);
  BandShortwaveWorkspace ws;
  ShortwaveResult result;
  solve_band_shortwave(column, tables, surface_albedo_by_band, solar_constant_w_m2, ws, result);
  return result;
}

} // namespace bandstack::solvers
