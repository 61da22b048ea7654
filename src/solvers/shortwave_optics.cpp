#include "bandstack/solvers/shortwave_optics.hpp"

#include "bandstack/core/error.hpp"

#include <fmt/format.h>

namespace bandstack::solvers {

ShortwaveOpticsTables make_shortwave_optics_tables(const spectral::BandSet& set,
                                                   PressureInterpolation pressure_interpolation) {
  if (!set.is_shortwave())
    throw InputError(
        InputPlace::of("solar_weight"),
        fmt::format("band set '{}' has no solar weights: it is a longwave set, not a shortwave one", set.name));
  ShortwaveOpticsTables t;
  t.absorption = make_band_optics_tables(set, pressure_interpolation); // validates the set
  t.solar_weight = set.solar_weight;
  t.rayleigh_m2_kg = set.rayleigh_cross_section_m2_kg;
  t.rayleigh_m2_kg.resize(set.gpoint_count(), 0.0);
  return t;
}

void compute_shortwave_optics(const atmosphere::Column& column, const ShortwaveOpticsTables& tables,
                              ShortwaveOptics& out, ShortwaveOpticsWorkspace& ws) {
  const std::size_t n_g = tables.gpoint_count();
  if (tables.solar_weight.size() != n_g || tables.rayleigh_m2_kg.size() != n_g)
    throw InputError("shortwave optics tables are inconsistent: build them with make_shortwave_optics_tables");
  // The absorption optical depths, by the longwave machinery (it validates the column). Its Planck
  // sources are a by-product here: cheap next to the two-stream solve.
  compute_band_optics(column, tables.absorption, ws.band_optics, ws.band_workspace);
  const std::size_t n = column.layer_count();
  out.layer_count = n;
  out.gpoint_count = n_g;
  out.optical_depth.resize(n * n_g);
  out.single_scattering_albedo.resize(n * n_g);
  out.asymmetry.assign(n * n_g, 0.0);
  out.absorption_optical_depth.assign(ws.band_optics.optical_depth.begin(), ws.band_optics.optical_depth.end());
  const double* r = tables.rayleigh_m2_kg.data();
  for (std::size_t i = 0; i < n; ++i) {
    const double air_mass = (column.pressure_level_pa[i + 1] - column.pressure_level_pa[i]) / column.gravity_m_s2;
    const double* tau_abs = out.absorption_optical_depth.data() + i * n_g;
    double* tau = out.optical_depth.data() + i * n_g;
    double* omega = out.single_scattering_albedo.data() + i * n_g;
    for (std::size_t g = 0; g < n_g; ++g) {
      const double tau_r = r[g] * air_mass;
      tau[g] = tau_abs[g] + tau_r;
      omega[g] = tau[g] > 0.0 ? tau_r / tau[g] : 0.0;
    }
  }
}

ShortwaveOptics compute_shortwave_optics(const atmosphere::Column& column, const spectral::BandSet& set) {
  const ShortwaveOpticsTables tables = make_shortwave_optics_tables(set);
  ShortwaveOptics out;
  ShortwaveOpticsWorkspace ws;
  compute_shortwave_optics(column, tables, out, ws);
  return out;
}

} // namespace bandstack::solvers
