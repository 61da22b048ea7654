#pragma once
// Moist thermodynamics of air. All inputs and outputs SI: Pa, K, mol/mol, kg/kg, m.
// Umbrella for the thermo module; the functions live in the headers included below.
#include "bandstack/thermo/humidity.hpp"
#include "bandstack/thermo/hydrostatics.hpp"
#include "bandstack/thermo/lapse_rate.hpp"
#include "bandstack/thermo/saturation.hpp"
