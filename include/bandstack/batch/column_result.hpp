#pragma once
// What one column of a run produces: its state and its longwave and shortwave fluxes. Plain data, written by io.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/solvers/shortwave_result.hpp"

namespace bandstack::batch {

struct ColumnResult {
  atmosphere::Column column;        // the state the fluxes were computed for
  solvers::LongwaveResult longwave;   // fluxes at levels (N+1), heating rates per layer (N)
  solvers::ShortwaveResult shortwave; // empty (no levels) when the run has no shortwave

  [[nodiscard]] bool has_shortwave() const noexcept { return !shortwave.flux_up.empty(); }
};

} // namespace bandstack::batch
