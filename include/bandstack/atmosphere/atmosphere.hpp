#pragma once
// Umbrella for the atmosphere module: the Column state, vertical grids, the U.S. Standard
// Atmosphere 1976, built-in profiles, their water vapour and ozone, the lapse-rate tropopause.
#include "bandstack/atmosphere/column.hpp"
#include "bandstack/atmosphere/grid.hpp"
#include "bandstack/atmosphere/humidity_profile.hpp"
#include "bandstack/atmosphere/ozone.hpp"
#include "bandstack/atmosphere/profiles.hpp"
#include "bandstack/atmosphere/sun.hpp"
#include "bandstack/atmosphere/tropopause.hpp"
#include "bandstack/atmosphere/us_standard_1976.hpp"
