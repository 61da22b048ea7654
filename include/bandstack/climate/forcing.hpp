#pragma once
// Radiative forcing of a perturbation on a base state: instantaneous (all temperatures fixed) at the
// top of the atmosphere and at the tropopause, and stratosphere-adjusted under the fixed dynamical
// heating assumption (Fels, Mahlman, Schwarzkopf & Sinclair 1980, J. Atmos. Sci. 37, 2265-2297;
// Ramanathan & Dickinson 1979): the layers above the tropopause relax until their radiative heating
// equals that of the base state (so the unchanged dynamical heating still balances it), while the
// troposphere, the surface and all water stay as they were. Forcing is the change of the net
// downward flux (LW + SW, W m-2), positive when the perturbation warms.
#include <cstddef>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/climate/radiation.hpp"

namespace bandstack::climate {

struct AdjustmentSettings {
  double heating_tolerance_k_day = 1e-3;  // max |H_perturbed - H_base| over stratospheric layers
  int max_iterations = 30;                // Newton steps
  double jacobian_step_k = 1e-3;          // forward-difference perturbation
  double max_step_k = 30.0;               // largest temperature change of one step
};

struct ForcingResult {
  double toa_instantaneous_w_m2 = 0.0;         // dN at the top, temperatures fixed
  double tropopause_instantaneous_w_m2 = 0.0;  // dN at the tropopause level, temperatures fixed
  double adjusted_w_m2 = 0.0;                  // dN at the tropopause after the stratosphere adjusted
  double adjusted_toa_w_m2 = 0.0;              // dN at the top after adjustment (= adjusted_w_m2 when
                                               // the adjustment converged; reported as a check)
  std::vector<double> adjusted_temperature_layer_k; // N: stratosphere adjusted, troposphere as base
  atmosphere::Column adjusted_column;          // the perturbed column after the adjustment (its gases,
                                               // adjusted layer and level temperatures); the reference
                                               // state of partial_radiative_perturbation(..., forcing)
  int adjustment_iterations = 0;
  long radiative_calls = 0;                    // all evaluations made here
};

// base / base_radiation: the base state and its radiation. perturbed / perturbed_radiation: the same
// temperatures with the perturbation applied (gases, albedo, sun; a radiation without the removed
// bands). tropopause_level: level index (1..N-1) of the tropopause; layers i < tropopause_level are
// the stratosphere. The levels of the adjusted stratosphere move by the change of the layer
// temperatures interpolated as climate::set_level_temperatures interpolates (top level with the top
// layer, interior levels linear in ln p), down to and including the tropopause level, whose lower
// layer does not change; the levels below keep their values. (Interpolating the change keeps a
// column whose levels did not come from set_level_temperatures unchanged until it adjusts; moving
// the tropopause level too avoids a layer-to-layer zigzag, since the longwave sources sit at the
// levels and a pinned level would fix one side of the lowest stratospheric layer.)
// Throws InputError for mismatched columns or a bad tropopause level; ConvergenceError (naming the
// residual) if the adjustment does not converge.
[[nodiscard]] ForcingResult compute_forcing(const atmosphere::Column& base, const NetHeating& base_radiation,
                                            const atmosphere::Column& perturbed, const NetHeating& perturbed_radiation,
                                            std::size_t tropopause_level, const AdjustmentSettings& settings = {});

} // namespace bandstack::climate
