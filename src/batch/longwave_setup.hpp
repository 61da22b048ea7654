#pragma once
// Private to batch: what the longwave computation of every column of a study shares (angles, band
// set, absorber source), loaded once before the parallel loop and then only read.
#include <memory>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/io/study.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"
#include "bandstack/solvers/band_optics.hpp"
#include "bandstack/solvers/longwave_result.hpp"
#include "bandstack/spectral/absorber.hpp"
#include "bandstack/spectral/band_set.hpp"

namespace bandstack::batch {

struct LongwaveSetup {
  solvers::AngularQuadrature angles;
  std::optional<spectral::BandSet> band_set;            // bands and reference
  std::optional<solvers::BandOpticsTables> tables;      // bands: the band set rearranged for the optics
  std::unique_ptr<spectral::AbsorberSource> absorbers;  // reference only
  spectral::WavenumberGrid reference_grid;              // reference only
  std::vector<double> band_edges_cm1;                   // reference only: n_band + 1 edges
  std::string description;                              // for the result file's provenance
};

// Loads what the study's longwave method needs (InputError/FileError on bad band sets or sources).
[[nodiscard]] LongwaveSetup prepare_longwave(const io::Study& study);

// Longwave fluxes of one column with the prepared setup. Thread-safe: only reads `setup`.
// surface_emissivity_by_band: empty, or one value per band (checked by check_band_properties).
[[nodiscard]] solvers::LongwaveResult solve_longwave(const io::Study& study, const LongwaveSetup& setup,
                                                     const atmosphere::Column& column,
                                                     std::span<const double> surface_emissivity_by_band = {});

// The number of longwave bands the setup resolves (0 for grey).
[[nodiscard]] std::size_t longwave_band_count(const LongwaveSetup& setup);

} // namespace bandstack::batch
