#pragma once
// What one column of a run produces: its state, its longwave and shortwave fluxes, and, when the
// study asks, its equilibrium, experiments and greenhouse attribution. Plain data, written by io.
#include <optional>
#include <string>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/climate/attribution.hpp"
#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/climate/experiment.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/solvers/shortwave_result.hpp"

namespace bandstack::batch {

// Whether a column of a run was computed. A failed column is recorded (status and message in the
// result file) while the rest of the run goes on, unless the run is told to stop at the first.
enum class ColumnStatus : signed char {
  ok = 0,
  invalid_input = 1, // the column could not be built or computed from its input (InputError)
  not_converged = 2, // its equilibrium (or an experiment's) did not converge (ConvergenceError)
};

struct ColumnResult {
  atmosphere::Column column;        // the state the fluxes were computed for (the equilibrium, if any)
  solvers::LongwaveResult longwave;   // fluxes at levels (N+1), heating rates per layer (N)
  solvers::ShortwaveResult shortwave; // empty (no levels) when the run has no shortwave
  std::optional<climate::EquilibriumResult> equilibrium;  // [equilibrium]: how it was reached
  std::vector<climate::ExperimentResult> experiments;     // [[experiments]], in study order
  std::optional<climate::GreenhouseAttribution> attribution; // [attribution]

  ColumnStatus status = ColumnStatus::ok;
  std::string error; // why the column failed (status != ok); the members above are then empty

  [[nodiscard]] bool failed() const noexcept { return status != ColumnStatus::ok; }
  [[nodiscard]] bool has_shortwave() const noexcept { return !shortwave.flux_up.empty(); }
};

} // namespace bandstack::batch
