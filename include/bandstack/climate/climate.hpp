#pragma once
// Equilibrium of columns: radiation callbacks, convective adjustment, column state, equilibrium solvers.
#include "bandstack/climate/column_state.hpp"
#include "bandstack/climate/convective_adjustment.hpp"
#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/climate/radiation.hpp"
