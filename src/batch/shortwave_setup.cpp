#include "batch/shortwave_setup.hpp"

#include <filesystem>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/io/band_catalog.hpp"
#include "bandstack/solvers/band_shortwave.hpp"

namespace bandstack::batch {

ShortwaveSetup prepare_shortwave(const io::Study& study) {
  ShortwaveSetup setup;
  const io::ShortwaveSettings& sw = study.shortwave;
  if (sw.method == io::ShortwaveMethod::none) {
    setup.description = "none";
    return setup;
  }
  const std::filesystem::path folder =
      study.source_file.empty() ? std::filesystem::path() : std::filesystem::path(study.source_file).parent_path();
  setup.band_set = io::load_band_set(sw.band_set, folder);
  if (!setup.band_set->is_shortwave())
    throw InputError(InputPlace{study.source_file, "shortwave.band_set", {}, {}, {}, {}},
                     "'" + sw.band_set + "' is a longwave band set (it has no solar weights)");
  setup.tables = solvers::make_shortwave_optics_tables(*setup.band_set);
  setup.solar_constant_w_m2 = sw.solar_constant_w_m2;
  setup.description = fmt::format("band set '{}' ({} bands, {} g-points; {}); solar constant {} W m-2; "
                                   "delta-Eddington two-stream with adding",
                                   setup.band_set->name, setup.band_set->band_count(), setup.band_set->gpoint_count(),
                                   setup.band_set->source_description, sw.solar_constant_w_m2);
  return setup;
}

solvers::ShortwaveResult solve_shortwave(const ShortwaveSetup& setup, const atmosphere::Column& column,
                                         std::span<const double> surface_albedo_by_band) {
  solvers::ShortwaveResult result;
  if (!setup.tables) return result;
  thread_local solvers::BandShortwaveWorkspace workspace; // reused per thread, as for the longwave
  solvers::solve_band_shortwave(column, *setup.tables, surface_albedo_by_band, setup.solar_constant_w_m2, workspace, result);
  return result;
}

} // namespace bandstack::batch
