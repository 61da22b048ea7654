#pragma once
// Private to batch: what the shortwave computation of every column shares, loaded once.
#include <optional>
#include <span>
#include <string>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/io/study.hpp"
#include "bandstack/solvers/shortwave_optics.hpp"
#include "bandstack/solvers/shortwave_result.hpp"
#include "bandstack/spectral/band_set.hpp"

namespace bandstack::batch {

struct ShortwaveSetup {
  std::optional<spectral::BandSet> band_set;             // empty when the study has no shortwave
  std::optional<solvers::ShortwaveOpticsTables> tables;
  double solar_constant_w_m2 = 0.0;
  std::string description;                               // for the result file's provenance
};

// Loads the shortwave band set the study names (InputError/FileError if it is missing or is not a
// shortwave set). With `method = "none"` the setup is empty.
[[nodiscard]] ShortwaveSetup prepare_shortwave(const io::Study& study);

// Shortwave fluxes of one column; an empty result when the setup is empty. Only reads `setup`.
// surface_albedo_by_band: empty, or one value per band (checked by check_band_properties).
[[nodiscard]] solvers::ShortwaveResult solve_shortwave(const ShortwaveSetup& setup, const atmosphere::Column& column,
                                                       std::span<const double> surface_albedo_by_band = {});

} // namespace bandstack::batch
