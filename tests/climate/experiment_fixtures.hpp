#pragma once
// Columns and radiations shared by the experiment tests (forcing, feedbacks, experiment).
#include <cstddef>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/climate/radiation.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"

namespace experiment_fixtures {

namespace at = bandstack::atmosphere;
namespace cl = bandstack::climate;
namespace bs = bandstack::solvers;

inline constexpr double surface_pressure_pa = 100000.0;
inline constexpr double diffusivity = 1.66;           // Elsasser (1942) diffusivity factor (common practice)
inline constexpr double solar_constant_w_m2 = 1361.0; // Kopp & Lean 2011 (GRL 38, L01706; from memory)

// A dry column on a log-pressure grid (10 Pa to 1000 hPa): atmosphere at t_k, ground at ts_k,
// CO2 well mixed at co2 mol/mol, no other gas.
inline at::Column grey_column(std::size_t layers, double t_k, double ts_k, double co2 = 400e-6) {
  at::Column c;
  c.name = "grey";
  c.pressure_level_pa =
      at::level_pressures_pa(at::GridSpec{layers, 10.0, surface_pressure_pa, at::Spacing::log_pressure});
  c.pressure_layer_pa = at::layer_pressures_pa(c.pressure_level_pa);
  c.temperature_layer_k.assign(layers, t_k);
  c.temperature_level_k.assign(layers + 1, t_k);
  for (auto& x : c.mole_fraction)
    x.assign(layers, 0.0);
  c.gas(bandstack::Gas::co2).assign(layers, co2);
  c.surface_temperature_k = ts_k;
  return c;
}

// Grey longwave with a single diffusivity angle; CO2 absorbs with kappa_co2 (m2 kg-1), water with
// kappa_h2o, plus an absorber with optical depth tau_extra over the whole column; sunlight
// (W m-2) absorbed by the ground only.
inline cl::NetHeating grey_radiation(double kappa_co2, double absorbed_solar_w_m2, double kappa_h2o = 0.0,
                                     double tau_extra = 0.0) {
  bs::GreyOptics optics;
  optics.mass_absorption_m2_kg[bandstack::index(bandstack::Gas::co2)] = kappa_co2;
  optics.mass_absorption_m2_kg[bandstack::index(bandstack::Gas::h2o)] = kappa_h2o;
  optics.extra_tau_per_pa = tau_extra / surface_pressure_pa;
  return cl::grey_net_heating(optics, bs::diffusivity_quadrature(diffusivity), absorbed_solar_w_m2);
}

// Band longwave + shortwave with the default band sets (loaded once) and 2 Gauss angles.
inline cl::NetHeating band_radiation() {
  static const bandstack::spectral::BandSet lw = bandstack::io::load_band_set("default_lw");
  static const bandstack::spectral::BandSet sw = bandstack::io::load_band_set("default_sw");
  return cl::band_net_heating(lw, sw, bs::gauss_quadrature(2), solar_constant_w_m2);
}

// The U.S. Standard Atmosphere 1976 column (profiles.hpp) on `layers` log-spaced layers from 10 Pa,
// lit by the global-mean insolation S0/4: cos zenith 0.5 for half the time (common practice).
inline at::Column us_standard_column(std::size_t layers) {
  at::ProfileSettings s;
  s.profile = at::Profile::us_standard_1976;
  at::Column c = at::make_column(s, at::GridSpec{layers, 10.0, 101325.0, at::Spacing::log_pressure}, "us_standard");
  c.sun.cos_zenith = 0.5;
  c.sun.daylight_fraction = 0.5;
  c.sun.distance_factor = 1.0;
  return c;
}

} // namespace experiment_fixtures
