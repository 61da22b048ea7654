#pragma once
// What one column of a run produces: its state, its longwave and shortwave fluxes, and, when the
// study asks, its equilibrium, experiments and greenhouse attribution. Plain data, written by io.
#include <optional>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/climate/attribution.hpp"
#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/climate/experiment.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/solvers/shortwave_result.hpp"

namespace bandstack::batch {

struct ColumnResult {
  atmosphere::Column column;        // the state the fluxes were computed for (the equilibrium, if any)
  solvers::LongwaveResult longwave;   // fluxes at levels (N+1), heating rates per layer (N)
  solvers::ShortwaveResult shortwave; // empty (no levels) when the run has no shortwave
  std::optional<climate::EquilibriumResult> equilibrium;  // [equilibrium]: how it was reached
  std::vector<climate::ExperimentResult> experiments;     // [[experiments]], in study order
  std::optional<climate::GreenhouseAttribution> attribution; // [attribution]

  [[nodiscard]] bool has_shortwave() const noexcept { return !shortwave.flux_up.empty(); }
};

} // namespace bandstack::batch
