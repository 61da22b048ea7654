#include "batch/climate_setup.hpp"

#include <fmt/format.h>

#include "bandstack/climate/attribution.hpp"
#include "bandstack/climate/experiment.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/io/sweep.hpp"
#include "bandstack/solvers/band_longwave.hpp"
#include "bandstack/solvers/band_shortwave.hpp"
#include "bandstack/spectral/band_set.hpp"

namespace bandstack::batch {

namespace {

InputPlace experiment_place(const io::Study& study, std::size_t e, const std::string& key) {
  return InputPlace{study.source_file, fmt::format("experiments[{}].{}", e, key), {}, {}, {}, {}};
}

std::vector<bool> active_flags(std::size_t bands, const std::vector<std::size_t>& removed) {
  std::vector<bool> active(bands, true);
  for (std::size_t b : removed) active[b] = false;
  return active;
}

std::shared_ptr<const LongwaveSetup> masked_longwave(const LongwaveSetup& base, const std::vector<bool>& active) {
  auto setup = std::make_shared<LongwaveSetup>();
  setup->angles = base.angles;
  setup->band_set = spectral::with_active_bands(*base.band_set, active);
  setup->tables = solvers::make_band_optics_tables(*setup->band_set);
  setup->description = base.description;
  return setup;
}

std::shared_ptr<const ShortwaveSetup> masked_shortwave(const ShortwaveSetup& base, const std::vector<bool>& active) {
  auto setup = std::make_shared<ShortwaveSetup>();
  setup->band_set = spectral::with_active_bands(*base.band_set, active);
  setup->tables = solvers::make_shortwave_optics_tables(*setup->band_set);
  setup->solar_constant_w_m2 = base.solar_constant_w_m2;
  setup->description = base.description;
  return setup;
}

void check_experiment(const io::Study& study, std::size_t e, std::size_t n_lw, std::size_t n_sw) {
  const climate::Perturbation& p = study.experiments[e];
  for (std::size_t b : p.removed_longwave_bands)
    if (b >= n_lw)
      throw InputError(experiment_place(study, e, "remove_longwave_bands"),
                       fmt::format("band {} does not exist: the longwave band set has bands 0..{}", b, n_lw - 1));
  for (std::size_t b : p.removed_shortwave_bands)
    if (b >= n_sw)
      throw InputError(experiment_place(study, e, "remove_shortwave_bands"),
                       fmt::format("band {} does not exist: the shortwave band set has bands 0..{}", b, n_sw - 1));
  for (std::size_t c = 0; c < study.columns.size(); ++c) {
    const io::ColumnSpec& spec = study.columns[c];
    if (p.surface_albedo && !spec.surface_albedo_by_band.empty())
      throw InputError(experiment_place(study, e, "surface_albedo"),
                       fmt::format("column \"{}\" sets surface_albedo_by_band, which a broadband albedo change would not "
                                   "reach; remove one of the two", spec.name));
    climate::WaterSettings water;
    if (study.equilibrium) water = study.equilibrium->water;
    try {
      climate::validate(p, water);
    } catch (const InputError& error) {
      throw InputError(experiment_place(study, e, error.place().item), error.message());
    }
  }
}

climate::WaterSettings water_for(const climate::EquilibriumSettings& s, const io::ColumnSpec& spec) {
  climate::WaterSettings water = s.water;
  water.surface_relative_humidity = spec.settings.surface_relative_humidity;
  water.stratospheric_mole_fraction = spec.settings.stratospheric_h2o_mole_fraction;
  return water;
}

} // namespace

ClimateSetup prepare_climate(const io::Study& study, const LongwaveSetup& longwave, const ShortwaveSetup& shortwave) {
  ClimateSetup setup;
  setup.study = &study;
  setup.longwave = &longwave;
  setup.shortwave = &shortwave;
  const std::size_t n_lw = longwave_band_count(longwave);
  const std::size_t n_sw = shortwave.band_set ? shortwave.band_set->band_count() : 0;
  for (std::size_t e = 0; e < study.experiments.size(); ++e) {
    check_experiment(study, e, n_lw, n_sw);
    const climate::Perturbation& p = study.experiments[e];
    setup.experiment_longwave.push_back(
        p.removed_longwave_bands.empty() ? nullptr : masked_longwave(longwave, active_flags(n_lw, p.removed_longwave_bands)));
    setup.experiment_shortwave.push_back(
        p.removed_shortwave_bands.empty() ? nullptr : masked_shortwave(shortwave, active_flags(n_sw, p.removed_shortwave_bands)));
  }
  if (study.attribution.bands) {
    setup.attribution_longwave[std::vector<bool>(n_lw, false)] = masked_longwave(longwave, std::vector<bool>(n_lw, false));
    // All bands active: the study's own set-up (not owned here).
    setup.attribution_longwave[std::vector<bool>(n_lw, true)] = std::shared_ptr<const LongwaveSetup>(std::shared_ptr<void>(), &longwave);
    for (std::size_t b = 0; b < n_lw; ++b) {
      std::vector<bool> only(n_lw, false), without(n_lw, true);
      only[b] = true;
      without[b] = false;
      setup.attribution_longwave[only] = masked_longwave(longwave, only);
      setup.attribution_longwave[without] = masked_longwave(longwave, without);
    }
  }
  return setup;
}

std::string describe_equilibrium(const io::Study& study) {
  if (!study.equilibrium) return "";
  const climate::EquilibriumSettings& s = *study.equilibrium;
  const std::string convection =
      s.convection.kind == climate::ConvectionKind::none           ? "pure radiative equilibrium"
      : s.convection.kind == climate::ConvectionKind::moist_adiabat ? "convective adjustment to the moist pseudo-adiabat"
          : fmt::format("convective adjustment to {} K/km", s.convection.critical_lapse_rate_k_km);
  const std::string water = s.water.treatment == climate::WaterTreatment::fixed_relative_humidity
                                ? "water at fixed relative humidity (Manabe & Wetherald 1967 profile)"
                                : "water at fixed mixing ratio";
  const std::string surface = s.surface == climate::SurfaceTreatment::energy_balance ? "surface temperature from the energy balance"
                                                                                      : "surface temperature fixed";
  return fmt::format("{}; {}; {}; Newton's method (grouped finite-difference Jacobian with Broyden updates){}; converged at "
                     "max |heating| <= {} K/day in radiative layers and |net flux| <= {} W m-2",
                     convection, water, surface, s.time_marching_fallback ? " with time marching as fallback" : "",
                     s.heating_tolerance_k_day, s.flux_tolerance_w_m2);
}

climate::NetHeating study_radiation(const io::Study& study, const LongwaveSetup& longwave, const ShortwaveSetup& shortwave,
                                    const io::ColumnSpec& spec) {
  return [&study, &longwave, &shortwave, &spec](const atmosphere::Column& column, climate::RadiationOutput& out) {
    const solvers::LongwaveResult lw = solve_longwave(study, longwave, column, spec.surface_emissivity_by_band);
    const solvers::ShortwaveResult sw = solve_shortwave(shortwave, column, spec.surface_albedo_by_band);
    const std::size_t n = column.layer_count();
    const bool has_sw = !sw.flux_up.empty();
    out.heating_k_day = lw.heating_rate_k_day;
    out.net_flux_w_m2.resize(n + 1);
    for (std::size_t k = 0; k <= n; ++k) {
      out.net_flux_w_m2[k] = lw.flux_down[k] - lw.flux_up[k];
      if (has_sw) out.net_flux_w_m2[k] += sw.flux_down[k] - sw.flux_up[k];
    }
    if (has_sw)
      for (std::size_t i = 0; i < n; ++i) out.heating_k_day[i] += sw.heating_rate_k_day[i];
    out.olr_w_m2 = lw.olr();
    out.absorbed_solar_w_m2 = has_sw ? sw.absorbed_solar() : 0.0;
  };
}

void compute_climate(const ClimateSetup& setup, std::size_t c, const atmosphere::Column& start, ColumnResult& result) {
  const io::Study& study = *setup.study;
  const io::ColumnSpec spec = io::column_spec(study, c); // outlives every callback made here
  const climate::NetHeating radiation = study_radiation(study, *setup.longwave, *setup.shortwave, spec);
  climate::BaseState base{start, std::nullopt};
  climate::EquilibriumSettings settings;
  if (study.equilibrium) {
    settings = *study.equilibrium;
    settings.water = water_for(settings, spec);
    if (spec.critical_lapse_rate_k_km) settings.convection.critical_lapse_rate_k_km = *spec.critical_lapse_rate_k_km;
    base.equilibrium = climate::solve_equilibrium(start, radiation, settings);
    base.column = base.equilibrium->column;
  }
  result.column = base.column;
  result.equilibrium = base.equilibrium;
  for (std::size_t e = 0; e < study.experiments.size(); ++e) {
    const LongwaveSetup& lw = setup.experiment_longwave[e] ? *setup.experiment_longwave[e] : *setup.longwave;
    const ShortwaveSetup& sw = setup.experiment_shortwave[e] ? *setup.experiment_shortwave[e] : *setup.shortwave;
    const climate::NetHeating perturbed = study_radiation(study, lw, sw, spec);
    result.experiments.push_back(climate::run_experiment(base, radiation, perturbed, study.experiments[e], settings));
  }
  if (study.attribution.enabled) {
    climate::RadiationWithBands by_bands;
    if (study.attribution.bands)
      by_bands = [&setup, &study, &spec](const std::vector<bool>& active) {
        const auto found = setup.attribution_longwave.find(active);
        if (found == setup.attribution_longwave.end()) throw InternalError("band attribution asked for an unprepared band mask");
        return study_radiation(study, *found->second, *setup.shortwave, spec);
      };
    result.attribution = climate::attribute_greenhouse_effect(base.column, radiation, by_bands,
                                                              study.attribution.bands ? longwave_band_count(*setup.longwave) : 0);
  }
}

} // namespace bandstack::batch
