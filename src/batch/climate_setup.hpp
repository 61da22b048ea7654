#pragma once
// Private to batch: what equilibrium, experiments and attribution of a study share, prepared once
// before the parallel loop and then only read: the study's radiation as a climate::NetHeating, and
// the longwave and shortwave set-ups with bands removed (per experiment, and per band for the band
// attribution).
#include <map>
#include <memory>
#include <string>
#include <vector>

#include "bandstack/batch/column_result.hpp"
#include "bandstack/climate/radiation.hpp"
#include "bandstack/io/study.hpp"
#include "batch/longwave_setup.hpp"
#include "batch/shortwave_setup.hpp"

namespace bandstack::batch {

struct ClimateSetup {
  const io::Study* study = nullptr;
  const LongwaveSetup* longwave = nullptr;         // the study's own set-ups (owned by the caller)
  const ShortwaveSetup* shortwave = nullptr;
  // Per experiment: set-ups without the removed bands; nullptr where the experiment removes none.
  std::vector<std::shared_ptr<const LongwaveSetup>> experiment_longwave;
  std::vector<std::shared_ptr<const ShortwaveSetup>> experiment_shortwave;
  // Band attribution: the longwave set-up for each set of active bands it needs.
  std::map<std::vector<bool>, std::shared_ptr<const LongwaveSetup>> attribution_longwave;
};

// Checks the experiments against the band sets (band indices in range; no broadband albedo change
// on a column with per-band albedo; perturbation values) and builds the set-ups. InputError names
// the study file and the experiment.
[[nodiscard]] ClimateSetup prepare_climate(const io::Study& study, const LongwaveSetup& longwave,
                                           const ShortwaveSetup& shortwave);

// One line on the study's equilibrium settings for the result file ("" without [equilibrium]).
[[nodiscard]] std::string describe_equilibrium(const io::Study& study);

// The radiation (LW + SW) of one column spec of the study with the given set-ups, as the climate
// module wants it. The set-ups must outlive the callback.
[[nodiscard]] climate::NetHeating study_radiation(const io::Study& study, const LongwaveSetup& longwave,
                                                  const ShortwaveSetup& shortwave, const io::ColumnSpec& spec);

// Equilibrium (if asked), then experiments and attribution, for column c. Writes result.column,
// result.equilibrium, result.experiments and result.attribution; the caller then computes the
// fluxes of result.column. Only reads `setup`.
void compute_climate(const ClimateSetup& setup, std::size_t c, const atmosphere::Column& start, ColumnResult& result);

} // namespace bandstack::batch
