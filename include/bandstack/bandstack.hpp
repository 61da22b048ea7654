#pragma once
// Umbrella header: the whole public interface of the bandstack library.
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/gas.hpp"
#include "bandstack/core/units.hpp"
#include "bandstack/core/version.hpp"

#include "bandstack/thermo/thermo.hpp"

#include "bandstack/spectral/absorber.hpp"
#include "bandstack/spectral/analytic_absorber.hpp"
#include "bandstack/spectral/band_builder.hpp"
#include "bandstack/spectral/band_set.hpp"
#include "bandstack/spectral/band_set_summary.hpp"
#include "bandstack/spectral/cross_section_file.hpp"
#include "bandstack/spectral/planck.hpp"
#include "bandstack/spectral/rayleigh.hpp"
#include "bandstack/spectral/solar_spectrum.hpp"

#include "bandstack/atmosphere/atmosphere.hpp"

#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/band_optics.hpp"
#include "bandstack/solvers/grey.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/solvers/heating.hpp"
#include "bandstack/solvers/longwave.hpp"
#include "bandstack/solvers/longwave_many.hpp"
#include "bandstack/solvers/reference_longwave.hpp"
#include "bandstack/solvers/band_shortwave.hpp"
#include "bandstack/solvers/delta_eddington.hpp"
#include "bandstack/solvers/shortwave.hpp"
#include "bandstack/solvers/shortwave_optics.hpp"
#include "bandstack/solvers/shortwave_result.hpp"

#include "bandstack/climate/climate.hpp"

#include "bandstack/io/atomic_output.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/io/band_set_file.hpp"
#include "bandstack/io/builtin_files.hpp"
#include "bandstack/io/demo_study.hpp"
#include "bandstack/io/profile_file.hpp"
#include "bandstack/io/profile_sun.hpp"
#include "bandstack/io/result_writer.hpp"
#include "bandstack/io/study.hpp"

#include "bandstack/batch/column_result.hpp"
#include "bandstack/batch/run.hpp"

#include "bandstack/report/report.hpp"
