#pragma once
// What one column of a run produces: its state and its fluxes. Plain data, written by io.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/solvers/grey.hpp"

namespace bandstack::batch {

struct ColumnResult {
  atmosphere::Column column;        // the state the fluxes were computed for
  solvers::LongwaveResult longwave; // fluxes at levels (N+1), heating rates per layer (N)
};

} // namespace bandstack::batch
