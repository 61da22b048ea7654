#pragma once
// Each gas's and each longwave band's share of the greenhouse effect G = sigma Ts^4 - OLR (Kiehl &
// Trenberth 1997, Bull. Amer. Meteor. Soc. 78, 197-208; Schmidt et al. 2010, J. Geophys. Res. 115,
// D20106), at fixed temperatures, two ways since overlap makes them differ:
//   removal:  G(all) - G(all but this one)       (sums to less than G where absorbers overlap)
//   addition: G(this one only) - G(none)         (sums to more than G)
// Water vapour includes its continuum. G(none) is not quite 0 when the surface emissivity is below 1
// or the band set misses part of the spectrum (default_lw: 10-3000 cm-1, ~0.02 % of sigma Ts^4 outside).
#include <array>
#include <cstddef>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/climate/radiation.hpp"
#include "bandstack/core/gas.hpp"

namespace bandstack::climate {

struct GreenhouseAttribution {
  double surface_emission_w_m2 = 0.0;    // sigma Ts^4 (Stefan-Boltzmann, CODATA 2018 sigma)
  double olr_w_m2 = 0.0;                 // of the column as given
  double greenhouse_effect_w_m2 = 0.0;   // sigma Ts^4 - OLR
  std::array<double, gas_count> gas_removal_w_m2{};   // by Gas index
  std::array<double, gas_count> gas_addition_w_m2{};
  std::vector<double> band_removal_w_m2;   // per longwave band; empty without band attribution
  std::vector<double> band_addition_w_m2;
  long radiative_calls = 0;
};

// Attribution for `column` (temperatures and water fixed as given). `radiation`: the full radiation.
// band_radiation / longwave_band_count: for the band attribution (RadiationWithBands is declared in
// radiation.hpp, e.g. band_net_heating_with_bands); an empty function or count 0 skips it.
// Gas removal and addition set mole fractions to 0 in copies of the column (nothing else changes).
// Throws what the radiations throw.
[[nodiscard]] GreenhouseAttribution attribute_greenhouse_effect(const atmosphere::Column& column,
                                                                const NetHeating& radiation,
                                                                const RadiationWithBands& band_radiation,
                                                                std::size_t longwave_band_count);

} // namespace bandstack::climate
