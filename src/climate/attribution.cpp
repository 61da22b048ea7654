#include "bandstack/climate/attribution.hpp"

#include "bandstack/core/constants.hpp"

#include <cmath>

namespace bandstack::climate {

namespace {

// Counts the radiative calls and turns OLR into the greenhouse effect sigma Ts^4 - OLR (W m-2).
struct GreenhouseMeter {
  double surface_emission_w_m2 = 0.0;
  long calls = 0;
  RadiationOutput out;

  double operator()(const NetHeating& radiation, const atmosphere::Column& column) {
    radiation(column, out);
    ++calls;
    return surface_emission_w_m2 - out.olr_w_m2;
  }
};

// `column` with the listed gases set to 0 mol/mol in every layer (temperatures untouched).
atmosphere::Column with_gases_removed(const atmosphere::Column& column, const std::array<bool, gas_count>& removed) {
  atmosphere::Column copy = column;
  for (Gas g : all_gases)
    if (removed[index(g)]) copy.gas(g).assign(copy.gas(g).size(), 0.0);
  return copy;
}

} // namespace

GreenhouseAttribution attribute_greenhouse_effect(const atmosphere::Column& column, const NetHeating& radiation,
                                                  const RadiationWithBands& band_radiation,
                                                  std::size_t longwave_band_count) {
  GreenhouseAttribution result;
  GreenhouseMeter meter;
  meter.surface_emission_w_m2 = constants::stefan_boltzmann_w_m2_k4 * std::pow(column.surface_temperature_k, 4);
  result.surface_emission_w_m2 = meter.surface_emission_w_m2;

  const double g_all = meter(radiation, column);
  result.olr_w_m2 = meter.out.olr_w_m2;
  result.greenhouse_effect_w_m2 = g_all;

  std::array<bool, gas_count> every{};
  every.fill(true);
  const double g_none = meter(radiation, with_gases_removed(column, every));
  for (Gas g : all_gases) {
    std::array<bool, gas_count> only{};
    only[index(g)] = true;
    result.gas_removal_w_m2[index(g)] = g_all - meter(radiation, with_gases_removed(column, only));
    std::array<bool, gas_count> others = every;
    others[index(g)] = false;
    result.gas_addition_w_m2[index(g)] = meter(radiation, with_gases_removed(column, others)) - g_none;
  }

  if (band_radiation && longwave_band_count > 0) {
    // The reference G(all bands) from the same band radiation, so that band shares are differences
    // of one method even if `radiation` is another.
    const double g_bands = meter(band_radiation(std::vector<bool>(longwave_band_count, true)), column);
    const double g_no_band = meter(band_radiation(std::vector<bool>(longwave_band_count, false)), column);
    result.band_removal_w_m2.resize(longwave_band_count);
    result.band_addition_w_m2.resize(longwave_band_count);
    for (std::size_t b = 0; b < longwave_band_count; ++b) {
      std::vector<bool> flags(longwave_band_count, true);
      flags[b] = false;
      result.band_removal_w_m2[b] = g_bands - meter(band_radiation(flags), column);
      flags.assign(longwave_band_count, false);
      flags[b] = true;
      result.band_addition_w_m2[b] = meter(band_radiation(flags), column) - g_no_band;
    }
  }
  result.radiative_calls = meter.calls;
  return result;
}

} // namespace bandstack::climate
