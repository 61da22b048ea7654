#include "batch/longwave_setup.hpp"

#include <filesystem>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/grey.hpp"
#include "bandstack/solvers/reference_longwave.hpp"

namespace bandstack::batch {

namespace {

solvers::AngularQuadrature quadrature_for(const io::LongwaveSettings& lw) {
  return lw.angle_method == io::AngleMethod::gauss ? solvers::gauss_quadrature(static_cast<int>(lw.gauss_angles))
                                                   : solvers::diffusivity_quadrature(lw.diffusivity_factor);
}

std::filesystem::path study_folder(const io::Study& study) {
  return study.source_file.empty() ? std::filesystem::path() : std::filesystem::path(study.source_file).parent_path();
}

} // namespace

LongwaveSetup prepare_longwave(const io::Study& study) {
  const io::LongwaveSettings& lw = study.longwave;
  LongwaveSetup setup;
  setup.angles = quadrature_for(lw);
  std::string angles_text = lw.angle_method == io::AngleMethod::gauss
                                      ? fmt::format("{}-point Gauss angular quadrature", lw.gauss_angles)
                                      : fmt::format("diffusivity factor {}", lw.diffusivity_factor);
  switch (lw.method) {
  case io::LongwaveMethod::grey: {
    setup.description = "grey: constant mass absorption coefficients (m2 kg-1)";
    for (Gas g : all_gases) setup.description += fmt::format(" {}={}", gas_name(g), lw.grey.mass_absorption_m2_kg[index(g)]);
    break;
  }
  case io::LongwaveMethod::bands: {
    setup.band_set = io::load_band_set(lw.band_set, study_folder(study));
    setup.tables = solvers::make_band_optics_tables(*setup.band_set);
    setup.description = fmt::format("band set '{}' ({} bands, {} g-points; {})", setup.band_set->name,
                                    setup.band_set->band_count(), setup.band_set->gpoint_count(),
                                    setup.band_set->source_description);
    break;
  }
  case io::LongwaveMethod::reference: {
    // The yardstick always integrates over angle with at least 4 Gauss points per hemisphere.
    if (lw.angle_method != io::AngleMethod::gauss || lw.gauss_angles < 4) {
      setup.angles = solvers::gauss_quadrature(4);
      angles_text = "4-point Gauss angular quadrature (the reference's minimum)";
    }
    setup.band_set = io::load_band_set(lw.band_set, study_folder(study));
    setup.absorbers = io::load_absorber_source(lw.absorbers, study_folder(study));
    const spectral::BandSet& set = *setup.band_set;
    setup.band_edges_cm1 = set.band_lower_cm1;
    setup.band_edges_cm1.push_back(set.band_upper_cm1.back());
    setup.reference_grid =
        spectral::make_wavenumber_grid(setup.band_edges_cm1.front(), setup.band_edges_cm1.back(), lw.reference_step_cm1);
    setup.description = fmt::format("line-resolved reference: {}, {} cm-1 steps over {}-{} cm-1, summed in the bands of '{}'",
                                    setup.absorbers->description(), lw.reference_step_cm1, setup.band_edges_cm1.front(),
                                    setup.band_edges_cm1.back(), set.name);
    break;
  }
  }
  setup.description +=
      "; " + angles_text + "; Planck source at layer temperatures and exit levels, linear in optical depth in layers";
  return setup;
}

std::size_t longwave_band_count(const LongwaveSetup& setup) { return setup.band_set ? setup.band_set->band_count() : 0; }

solvers::LongwaveResult solve_longwave(const io::Study& study, const LongwaveSetup& setup, const atmosphere::Column& column,
                                       std::span<const double> surface_emissivity_by_band) {
  switch (study.longwave.method) {
  case io::LongwaveMethod::grey: return solvers::solve_grey_longwave(column, study.longwave.grey, setup.angles);
  case io::LongwaveMethod::bands: {
    // One workspace per thread, reused across columns: fresh large allocations per column cost page
    // faults that do not scale across threads. Its contents never reach the results.
    thread_local solvers::BandLongwaveWorkspace workspace;
    solvers::LongwaveResult result;
    solvers::solve_band_longwave(column, *setup.tables, setup.angles, surface_emissivity_by_band, workspace, result);
    return result;
  }
  case io::LongwaveMethod::reference:
    return solvers::solve_reference_longwave(column, *setup.absorbers, setup.reference_grid, setup.band_edges_cm1,
                                             setup.angles, surface_emissivity_by_band);
  }
  throw InternalError("unknown longwave method");
}

} // namespace bandstack::batch
