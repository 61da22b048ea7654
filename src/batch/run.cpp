#include "bandstack/batch/run.hpp"

#include <fmt/format.h>
#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include "bandstack/atmosphere/sun.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/units.hpp"
#include "bandstack/io/sweep.hpp"
#include "batch/climate_setup.hpp"
#include "batch/column_cache.hpp"
#include "batch/column_blocks.hpp"
#include "batch/longwave_setup.hpp"
#include "batch/shortwave_setup.hpp"

namespace bandstack::batch {

atmosphere::SunGeometry sun_geometry(const io::SunSpec& sun) {
  if (sun.cos_zenith) return {*sun.cos_zenith, 1.0, 1.0};
  if (sun.latitude_deg && sun.day_of_year) {
    if (sun.local_solar_time_h)
      return atmosphere::instantaneous_geometry(*sun.latitude_deg, *sun.day_of_year, *sun.local_solar_time_h);
    return atmosphere::daily_mean_geometry(*sun.latitude_deg, *sun.day_of_year);
  }
  // Global mean: the Sun at cos zenith 0.5 for half of the time gives S0/4 at the top (common practice).
  return {0.5, 1.0, 0.5};
}

namespace {

// Swept values that act on a column read from a profile file (the others act through the spec; the
// parser refuses sweeps of the built-in profile's own keys with a profile file).
void apply_swept_values(const io::ColumnSpec& spec, atmosphere::Column& column) {
  const std::size_t n = column.layer_count();
  for (const auto& [key, value] : spec.swept_values) {
    if (key == "co2_ppmv") column.gas(Gas::co2).assign(n, units::ppmv_to_mole_fraction(value));
    else if (key == "ch4_ppmv") column.gas(Gas::ch4).assign(n, units::ppmv_to_mole_fraction(value));
    else if (key == "n2o_ppmv") column.gas(Gas::n2o).assign(n, units::ppmv_to_mole_fraction(value));
    else if (key == "surface_emissivity") column.surface_emissivity = value;
    else if (key == "surface_albedo") column.surface_albedo = value;
    else if (key == "surface_temperature_k") column.surface_temperature_k = value;
  }
}

} // namespace

// Column i of the study's expansion (io::column_spec).
atmosphere::Column build_column(const io::Study& study, std::size_t i, const atmosphere::Column* file_column,
                                const std::optional<io::SunSpec>& file_sun) {
  const io::ColumnSpec spec = io::column_spec(study, i);
  try {
    atmosphere::Column column;
    if (spec.given_column || spec.profile_column) {
      if (!spec.given_column && !file_column) throw InternalError(fmt::format("column {}: its profile was not read", i));
      column = spec.given_column ? *spec.given_column : *file_column; // from a profile file
      column.name = spec.name;
      apply_swept_values(spec, column);
    } else {
      column = cached_make_column(spec.settings, study.grid, spec.name);
    }
    if (spec.sun.from_file && !file_sun) throw InternalError(fmt::format("column {}: its Sun was not read", i));
    column.sun = sun_geometry(spec.sun.from_file ? *file_sun : spec.sun);
    if (spec.solar_constant_w_m2) {
      // A swept solar constant scales the sunlight of this column against the study's own.
      const double s0 = study.shortwave.solar_constant_w_m2;
      if (!(s0 > 0.0))
        throw InputError(InputPlace{study.source_file, "shortwave.solar_constant_w_m2", {}, {}, {}, {}},
                         "sweeping solar_constant_w_m2 needs a study solar constant > 0");
      column.sun.distance_factor *= *spec.solar_constant_w_m2 / s0;
    }
    return column;
  } catch (const InputError& e) {
    throw InputError(InputPlace{study.source_file, fmt::format("columns[{}] \"{}\"", i, spec.name), {}, {},
                                static_cast<long>(i), {}},
                     e.what());
  }
}

BlockInputs::BlockInputs(const io::ExpandedStudy& expanded, std::size_t first, std::size_t count, bool per_column)
    : expanded_(expanded) {
  if (!expanded.profile || count == 0) return;
  file_first_ = io::file_column_of(expanded.study, first);
  const std::size_t file_count = io::file_column_of(expanded.study, first + count - 1) + 1 - file_first_;
  try {
    file_columns_ = expanded.profile->read(file_first_, file_count);
    file_errors_.assign(file_count, nullptr);
  } catch (const InputError&) {
    if (!per_column) throw;
    file_columns_.assign(file_count, atmosphere::Column{});
    file_errors_.assign(file_count, nullptr);
    for (std::size_t f = 0; f < file_count; ++f) {
      try {
        file_columns_[f] = std::move(expanded.profile->read(file_first_ + f, 1).front());
      } catch (const InputError&) {
        file_errors_[f] = std::current_exception();
      }
    }
  }
}

atmosphere::Column BlockInputs::build(std::size_t i) const {
  if (!expanded_.profile) return build_column(expanded_.study, i);
  const std::size_t f = io::file_column_of(expanded_.study, i);
  const std::size_t k = f - file_first_;
  if (file_errors_.at(k)) std::rethrow_exception(file_errors_[k]);
  return build_column(expanded_.study, i, &file_columns_[k], io::file_sun(expanded_, f));
}

std::vector<atmosphere::Column> build_block(const io::ExpandedStudy& expanded, std::size_t first, std::size_t count) {
  const BlockInputs inputs(expanded, first, count, false);
  std::vector<atmosphere::Column> columns(count);
  tbb::parallel_for(std::size_t{0}, count, [&](std::size_t k) { columns[k] = inputs.build(first + k); });
  return columns;
}

std::vector<atmosphere::Column> build_columns(const io::Study& study) {
  const io::ExpandedStudy expanded = io::prepare_columns(study);
  return build_block(expanded, 0, io::column_count(expanded.study));
}

// Per-band surface properties must match the band sets the study uses.
void check_band_properties(const io::Study& study, const LongwaveSetup& lw, const ShortwaveSetup& sw) {
  const std::size_t n_lw = longwave_band_count(lw);
  const std::size_t n_sw = sw.band_set ? sw.band_set->band_count() : 0;
  for (std::size_t c = 0; c < study.columns.size(); ++c) {
    const io::ColumnSpec& spec = study.columns[c];
    const auto check = [&](const std::vector<double>& values, std::size_t bands, const char* key, const char* what) {
      if (values.empty() || values.size() == bands) return;
      InputPlace place{study.source_file, fmt::format("columns[{}].{}", c, key), {}, {}, static_cast<long>(c), {}};
      throw InputError(place, bands == 0 ? fmt::format("needs a {} band set (the study's {} method has no bands)", what, what)
                                         : fmt::format("has {} values, but the {} band set has {} bands", values.size(), what, bands));
    };
    check(spec.surface_emissivity_by_band, n_lw, "surface_emissivity_by_band", "longwave");
    check(spec.surface_albedo_by_band, n_sw, "surface_albedo_by_band", "shortwave");
  }
}

void compute_one(const io::Study& study, const LongwaveSetup& setup, const ShortwaveSetup& sw_setup,
                 const ClimateSetup& climate_setup, std::size_t c, const atmosphere::Column& column, ColumnResult& result) {
  result.column = column;
  try {
    compute_climate(climate_setup, c, column, result);
    const io::ColumnSpec spec = io::column_spec(study, c);
    result.longwave = solve_longwave(study, setup, result.column, spec.surface_emissivity_by_band);
    result.shortwave = solve_shortwave(sw_setup, result.column, spec.surface_albedo_by_band);
  } catch (const InputError& e) {
    throw InputError(InputPlace{study.source_file, fmt::format("columns[{}] \"{}\"", c, column.name), {}, {},
                                static_cast<long>(c), {}},
                     e.what());
  } catch (const ConvergenceError& e) {
    throw ConvergenceError(fmt::format("{}: columns[{}] \"{}\": {}", study.source_file.empty() ? "demo" : study.source_file,
                                       c, column.name, e.what()));
  }
}

namespace {

// Runs `work` on `threads` worker threads (0 = all).
template <class Work> void in_arena(std::size_t threads, const Work& work) {
  if (threads == 0) {
    work();
  } else {
    tbb::task_arena arena(static_cast<int>(threads));
    arena.execute(work);
  }
}

std::vector<ColumnResult> compute_with(const io::Study& study, const LongwaveSetup& setup, const ShortwaveSetup& sw_setup,
                                       const std::vector<atmosphere::Column>& columns, std::size_t threads) {
  check_band_properties(study, setup, sw_setup);
  const ClimateSetup climate_setup = prepare_climate(study, setup, sw_setup);
  std::vector<ColumnResult> results(columns.size());
  in_arena(threads, [&] {
    tbb::parallel_for(std::size_t{0}, columns.size(), [&](std::size_t c) {
      compute_one(study, setup, sw_setup, climate_setup, c, columns[c], results[c]);
    });
  });
  return results;
}

} // namespace

StudyCheck check_study(const io::Study& study) {
  const io::ExpandedStudy expanded = io::prepare_columns(study);
  const io::Study& flat = expanded.study;
  StudyCheck result;
  result.column_count = io::column_count(flat);
  // A block of columns at a time, so that checking a large study takes little memory.
  constexpr std::size_t block = 256;
  for (std::size_t first = 0; first < result.column_count; first += block) {
    const std::vector<atmosphere::Column> columns =
        build_block(expanded, first, std::min(block, result.column_count - first));
    if (first == 0) result.layer_count = columns.front().layer_count();
  }
  const LongwaveSetup lw = prepare_longwave(flat);
  const ShortwaveSetup sw = prepare_shortwave(flat);
  check_band_properties(flat, lw, sw);
  (void)prepare_climate(flat, lw, sw);
  return result;
}

std::vector<ColumnResult> compute_columns(const io::Study& study, const std::vector<atmosphere::Column>& columns,
                                          std::size_t threads) {
  const io::Study flat = io::prepare_columns(study).study;
  return compute_with(flat, prepare_longwave(flat), prepare_shortwave(flat), columns, threads);
}

std::filesystem::path output_path(const io::Study& study, const RunOptions& options) {
  if (options.output_directory.empty()) return study.output_file;
  return options.output_directory / study.output_file.filename();
}

ColumnSummary summarise(const ColumnResult& r) {
  ColumnSummary s;
  s.name = r.column.name;
  if (r.failed()) {
    s.error = r.error;
    return s;
  }
  s.surface_temperature_k = r.column.surface_temperature_k;
  s.olr_w_m2 = r.longwave.olr();
  s.surface_lw_down_w_m2 = r.longwave.surface_down();
  if (r.has_shortwave()) s.absorbed_solar_w_m2 = r.shortwave.absorbed_solar();
  for (const climate::ExperimentResult& x : r.experiments) {
    ColumnSummary::Experiment e{x.forcing.toa_instantaneous_w_m2, x.forcing.adjusted_w_m2, std::nullopt};
    if (x.equilibrium) e.surface_temperature_change_k = x.surface_temperature_change_k;
    s.experiments.push_back(e);
  }
  return s;
}

namespace {

// "2 of 30 columns failed ...", or "" when none did.
std::string failure_lines(const RunOutcome& outcome) {
  if (outcome.failed_columns == 0) return {};
  std::string text = fmt::format("{} of {} columns failed (column_status and column_error in the file){}\n",
                                 outcome.failed_columns, outcome.column_count,
                                 outcome.first_failures.empty() ? "" : "; the first:");
  for (const std::string& e : outcome.first_failures) text += "  " + e + "\n";
  return text;
}

} // namespace

std::string format_summary(const RunOutcome& outcome) {
  if (outcome.summaries.size() != outcome.column_count || outcome.summaries.empty())
    return fmt::format("{} columns{}\n{}wrote {}\n", outcome.column_count,
                       outcome.resumed_from > 0 ? fmt::format(" ({} of them from the interrupted run)", outcome.resumed_from) : "",
                       failure_lines(outcome), outcome.output_file.string());
  std::string text = fmt::format("{:<28} {:>9} {:>9} {:>9} {:>9} {:>9}   (W m-2; T in K)\n", "column", "T_surf",
                                 "OLR", "LW_down", "ASR", "TOA_net");
  for (const ColumnSummary& r : outcome.summaries) {
    if (!r.error.empty()) {
      text += fmt::format("{:<28} failed (see below)\n", r.name);
      continue;
    }
    const auto asr = r.absorbed_solar_w_m2;
    text += fmt::format("{:<28} {:>9.2f} {:>9.2f} {:>9.2f} {:>9} {:>9}\n", r.name, r.surface_temperature_k, r.olr_w_m2,
                        r.surface_lw_down_w_m2, asr ? fmt::format("{:.2f}", *asr) : "-",
                        asr ? fmt::format("{:.2f}", *asr - r.olr_w_m2) : "-");
  }
  if (!outcome.experiment_names.empty()) {
    text += fmt::format("\n{:<28} {:<28} {:>9} {:>9} {:>9}   (forcing in W m-2; dT_surf in K)\n", "column", "experiment",
                        "F_TOA", "F_adj", "dT_surf");
    for (const ColumnSummary& r : outcome.summaries)
      for (std::size_t e = 0; e < r.experiments.size() && e < outcome.experiment_names.size(); ++e) { // none if failed
        const ColumnSummary::Experiment& x = r.experiments[e];
        text += fmt::format("{:<28} {:<28} {:>9.3f} {:>9.3f} {:>9}\n", r.name, outcome.experiment_names[e], x.forcing_toa_w_m2,
                            x.forcing_adjusted_w_m2,
                            x.surface_temperature_change_k ? fmt::format("{:.3f}", *x.surface_temperature_change_k) : "-");
      }
  }
  return text + failure_lines(outcome) + fmt::format("wrote {}\n", outcome.output_file.string());
}

} // namespace bandstack::batch
