#pragma once
// One experiment on a base state: forcing, and, when the base is an equilibrium, the new equilibrium
// with its surface-temperature change, sensitivity and feedback terms.
#include <cmath>
#include <limits>
#include <optional>

#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/climate/feedbacks.hpp"
#include "bandstack/climate/forcing.hpp"
#include "bandstack/climate/perturbation.hpp"

namespace bandstack::climate {

struct ExperimentResult {
  ForcingResult forcing;
  std::size_t tropopause_level = 0;                  // of the base state, used for all of the above
  std::optional<EquilibriumResult> equilibrium;      // the perturbed equilibrium (base was one)
  double surface_temperature_change_k = std::numeric_limits<double>::quiet_NaN();
  double warming_per_co2_doubling_k = std::numeric_limits<double>::quiet_NaN(); // CO2-only scalings
  FeedbackTerms feedbacks;                           // NaN members without an equilibrium
};

// The base state: either an equilibrium (then the experiment solves the perturbed equilibrium from
// it with the same settings, water and surface treatment included) or a column taken as it is
// (forcing only).
struct BaseState {
  atmosphere::Column column;
  std::optional<EquilibriumResult> equilibrium;      // set: column == equilibrium->column
};

// Runs `perturbation` on `base`. The tropopause is the top of the convective region for an
// equilibrium with convection (Manabe & Wetherald 1967), otherwise the lapse-rate tropopause
// (atmosphere/tropopause.hpp). perturbed_radiation is the radiation with the perturbation's band
// removals (base_radiation when it removes none). With an equilibrium the water settings are those
// of `settings` after apply_perturbation. The feedback terms are computed only when |dTs| >= 1e-3 K.
// Throws InputError / ConvergenceError (naming the experiment) like the parts it calls.
[[nodiscard]] ExperimentResult run_experiment(const BaseState& base, const NetHeating& base_radiation,
                                              const NetHeating& perturbed_radiation, const Perturbation& perturbation,
                                              const EquilibriumSettings& settings);

} // namespace bandstack::climate
