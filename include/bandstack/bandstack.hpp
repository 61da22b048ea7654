#pragma once
// Umbrella header: the whole public interface of the bandstack library.
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/gas.hpp"
#include "bandstack/core/units.hpp"
#include "bandstack/core/version.hpp"

#include "bandstack/thermo/thermo.hpp"

#include "bandstack/spectral/planck.hpp"

#include "bandstack/atmosphere/atmosphere.hpp"

#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/grey.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/solvers/heating.hpp"
#include "bandstack/solvers/longwave.hpp"

#include "bandstack/io/atomic_output.hpp"
#include "bandstack/io/demo_study.hpp"
#include "bandstack/io/result_writer.hpp"
#include "bandstack/io/study.hpp"

#include "bandstack/batch/column_result.hpp"
#include "bandstack/batch/run.hpp"
