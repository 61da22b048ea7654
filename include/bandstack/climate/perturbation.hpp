#pragma once
// What an experiment changes in a base state: gases, bands, insolation, albedo, stratospheric water.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/climate/column_state.hpp"
#include "bandstack/core/gas.hpp"

namespace bandstack::climate {

enum class GasChangeKind {
  scale,  // multiply the mole fraction in every layer by value (>= 0, finite)
  set,    // set the mole fraction in every layer to value (mol/mol, in [0, 1))
  remove  // set the mole fraction to 0 everywhere (value unused)
};

struct GasChange {
  Gas gas = Gas::co2;
  GasChangeKind kind = GasChangeKind::scale;
  double value = 1.0;
};

struct Perturbation {
  std::string name;                                  // e.g. "doubled_co2"
  std::vector<GasChange> gas_changes;                // applied in order
  std::vector<std::size_t> removed_longwave_bands;   // 0-based band indices of the longwave band set
  std::vector<std::size_t> removed_shortwave_bands;  // 0-based band indices of the shortwave band set
  double insolation_scale = 1.0;                     // multiplies the sunlight at the top (> 0 finite... >= 0)
  std::optional<double> surface_albedo;              // new broadband albedo, [0, 1]
  std::optional<double> stratospheric_h2o_mole_fraction; // new water mole fraction above the tropopause

  // True when the experiment needs a radiation of its own (band removals).
  [[nodiscard]] bool removes_bands() const noexcept {
    return !removed_longwave_bands.empty() || !removed_shortwave_bands.empty();
  }
};

// Checks values (InputError naming the perturbation and the item): scale factors finite and >= 0,
// set values in [0, 1), insolation_scale finite and >= 0, albedo in [0, 1], stratospheric water in
// [0, 1), and, with water at fixed relative humidity, no "set" of h2o (the relative humidity decides
// the tropospheric water there; scale and remove are allowed).
void validate(const Perturbation& perturbation, const WaterSettings& water);

// Applies the gas, insolation, albedo and stratospheric-water changes to `column` and `water`
// (band removals are the radiation's business, see radiation.hpp).
// - Gas changes act on column's mole fractions. For h2o with water at fixed relative humidity they
//   also act on water.h2o_scale (scale multiplies it, remove sets it to 0), so that the change
//   survives the re-evaluation of water from the temperatures; water.stratospheric_mole_fraction
//   is scaled (or zeroed) alike, so that the re-evaluated stratosphere and the lower bound it sets
//   agree with the changed column.
// - insolation_scale multiplies column.sun.distance_factor.
// - stratospheric_h2o_mole_fraction: water.stratospheric_mole_fraction takes the new value; with water
//   at fixed relative humidity the column's water is then re-evaluated by update_water (the new value
//   above the cold point, as the equilibrium will have it); with fixed mixing ratio the h2o mole
//   fraction of the layers above the tropopause (i < tropopause_level) is set to it.
// Calls validate first.
void apply_perturbation(const Perturbation& perturbation, std::size_t tropopause_level, atmosphere::Column& column,
                        WaterSettings& water);

// log2 of the CO2 factor when the perturbation only scales CO2 (by a factor > 0, != 1) and changes
// nothing else; nullopt otherwise. For "warming per CO2 doubling" = dTs / doublings.
[[nodiscard]] std::optional<double> co2_doublings(const Perturbation& perturbation);

} // namespace bandstack::climate
