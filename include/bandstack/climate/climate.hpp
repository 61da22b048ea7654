#pragma once
// Equilibrium of columns: radiation callbacks, convective adjustment, column state, equilibrium solvers;
// experiments on them: perturbations, forcing, feedbacks; attribution of the greenhouse effect.
#include "bandstack/climate/attribution.hpp"
#include "bandstack/climate/column_state.hpp"
#include "bandstack/climate/convective_adjustment.hpp"
#include "bandstack/climate/equilibrium.hpp"
#include "bandstack/climate/experiment.hpp"
#include "bandstack/climate/feedbacks.hpp"
#include "bandstack/climate/forcing.hpp"
#include "bandstack/climate/perturbation.hpp"
#include "bandstack/climate/radiation.hpp"
