#include "bandstack/climate/experiment.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "bandstack/atmosphere/tropopause.hpp"
#include "bandstack/core/error.hpp"

namespace bandstack::climate {

namespace {

// The base state's tropopause level, clamped to 1..N-1 (experiment.hpp).
std::size_t tropopause_of(const BaseState& base) {
  const std::size_t n = base.column.layer_count();
  std::size_t top = n;
  if (base.equilibrium && base.equilibrium->convective.size() == n)
    while (top > 0 && base.equilibrium->convective[top - 1])
      --top;
  if (top == n) top = atmosphere::lapse_rate_tropopause_level(base.column);
  return std::clamp<std::size_t>(top, 1, n - 1);
}

FeedbackTerms undefined_feedbacks() {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  return FeedbackTerms{nan, nan, nan, nan, nan, nan};
}

ExperimentResult run(const BaseState& base, const NetHeating& base_radiation, const NetHeating& perturbed_radiation,
                     const Perturbation& perturbation, const EquilibriumSettings& settings) {
  const std::size_t n = base.column.layer_count();
  if (n < 3)
    throw InputError(InputPlace::of("layers"), fmt::format("an experiment needs at least 3 layers, got {}", n));
  if (base.equilibrium && base.equilibrium->column.layer_count() != n)
    throw InputError(InputPlace::of("base column"), "the base column is not the base equilibrium's column");
  ExperimentResult result;
  result.tropopause_level = tropopause_of(base);
  result.feedbacks = undefined_feedbacks();

  atmosphere::Column perturbed = base.column;
  WaterSettings water = settings.water;
  apply_perturbation(perturbation, result.tropopause_level, perturbed, water);

  AdjustmentSettings adjustment;
  adjustment.heating_tolerance_k_day = settings.heating_tolerance_k_day;
  adjustment.jacobian_step_k = settings.jacobian_step_k;
  adjustment.max_step_k = settings.max_step_k;
  result.forcing =
      compute_forcing(base.column, base_radiation, perturbed, perturbed_radiation, result.tropopause_level, adjustment);
  if (!base.equilibrium) return result;

  EquilibriumSettings perturbed_settings = settings;
  perturbed_settings.water = water;
  result.equilibrium = solve_equilibrium(perturbed, perturbed_radiation, perturbed_settings);
  const double dts = result.equilibrium->column.surface_temperature_k - base.column.surface_temperature_k;
  result.surface_temperature_change_k = dts;
  if (const auto doublings = co2_doublings(perturbation)) result.warming_per_co2_doubling_k = dts / *doublings;
  if (std::abs(dts) >= 1e-3)
    result.feedbacks = partial_radiative_perturbation(base.column, base_radiation, result.equilibrium->column,
                                                      perturbed_radiation, result.tropopause_level, result.forcing);
  return result;
}

} // namespace

ExperimentResult run_experiment(const BaseState& base, const NetHeating& base_radiation,
                                const NetHeating& perturbed_radiation, const Perturbation& perturbation,
                                const EquilibriumSettings& settings) {
  // validate names the experiment itself; everything after it is wrapped here.
  validate(perturbation, settings.water);
  const std::string name = perturbation.name.empty() ? "(unnamed)" : perturbation.name;
  try {
    return run(base, base_radiation, perturbed_radiation, perturbation, settings);
  } catch (const InputError& e) {
    throw InputError(e.place(), fmt::format("experiment '{}': {}", name, e.message()));
  } catch (const ConvergenceError& e) {
    throw ConvergenceError(fmt::format("experiment '{}': {}", name, e.what()));
  }
}

} // namespace bandstack::climate
