// The parts of a run shared by the single-process and the MPI runner (batch/run_context.hpp).
#include "batch/run_context.hpp"

#include <fmt/format.h>
#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "bandstack/io/resumable_output.hpp"
#include "batch/column_blocks.hpp"

namespace bandstack::batch {

namespace {
// Hash of everything that decides the file's contents: program version, study (text, path, and the
// bytes of its profile file), block size and deflate level. Thread count is not part of it.
std::string run_hash(const io::Study& study, const io::ExpandedStudy& expanded, const RunOptions& options) {
  std::uint64_t h = io::fnv1a(version());
  h = io::fnv1a(study.source_file, h);
  h = io::fnv1a(study.source_text, h);
  h = io::fnv1a(fmt::format("|{}|{}|{}|", options.chunk_columns, options.deflate_level, io::column_count(expanded.study)), h);
  if (expanded.profile) h = io::fnv1a(fmt::format("profile {:016x}", expanded.profile->content_hash()), h);
  return fmt::format("{:016x}", h);
}

// Marks `result` failed with the message of the exception being handled, unless failures stop the
// run (then it rethrows).
void record_failure(ColumnResult& result, bool stop) {
  try {
    throw;
  } catch (const InputError& e) {
    if (stop) throw;
    result = ColumnResult{};
    result.status = ColumnStatus::invalid_input;
    result.error = e.what();
  } catch (const ConvergenceError& e) {
    if (stop) throw;
    result = ColumnResult{};
    result.status = ColumnStatus::not_converged;
    result.error = e.what();
  }
}

io::RunInfo run_info(const io::Study& study, const LongwaveSetup& lw, const ShortwaveSetup& sw) {
  io::RunInfo info;
  info.title = study.title;
  info.study_file = study.source_file;
  info.study_text = study.source_text;
  info.command_line = study.source_file.empty() ? "bandstack demo" : "bandstack run " + study.source_file;
  info.longwave_method = lw.description;
  info.shortwave_method = sw.description;
  info.equilibrium_method = describe_equilibrium(study);
  for (const climate::Perturbation& p : study.experiments) info.experiment_names.push_back(p.name);
  return info;
}

} // namespace

void note(const RunOptions& options, const std::string& text) {
  if (options.note) options.note(text);
}

// Where a run starts: 0, or after the columns an interrupted run of the same study recorded.
std::size_t resume_point(const std::filesystem::path& path, const std::string& hash, const RunOptions& options,
                         std::size_t total) {
  const std::optional<io::Checkpoint> record = io::read_checkpoint(io::checkpoint_path(path));
  const bool working = std::filesystem::exists(io::working_path(path));
  if (!record && !working) return 0;
  if (options.resume && record && working && record->run_hash == hash && record->columns_total == total &&
      record->chunk_columns == options.chunk_columns) {
    note(options, fmt::format("resuming {} after column {} of {} (checkpoint of an interrupted run)", path.string(),
                              record->columns_written, total));
    return record->columns_written;
  }
  note(options, fmt::format("starting {} afresh: {}", path.string(),
                            !options.resume ? "resuming is switched off"
                            : !record || !working ? "the unfinished file of an earlier run is incomplete"
                                                  : "an earlier unfinished run had another study or other settings"));
  io::discard_resumable(path);
  return 0;
}

// Columns [first, first + count): built and computed in parallel, each result in its own slot; a
// column that fails is recorded in its slot (record_failure).
std::vector<ColumnResult> compute_block(const RunContext& plan, std::size_t first, std::size_t count, Progress& progress,
                                        std::atomic<std::size_t>& done) {
  std::vector<ColumnResult> results(count);
  const auto work = [&] {
    const BlockInputs inputs(plan.expanded, first, count, !plan.stop_on_column_error);
    tbb::parallel_for(std::size_t{0}, count, [&](std::size_t i) {
      try {
        const atmosphere::Column column = inputs.build(first + i);
        compute_one(plan.expanded.study, plan.longwave, plan.shortwave, plan.climate, first + i, column, results[i]);
      } catch (...) {
        record_failure(results[i], plan.stop_on_column_error);
        results[i].column.name = io::column_spec(plan.expanded.study, first + i).name;
      }
      progress.update(done.fetch_add(1) + 1);
    });
  };
  if (plan.threads == 0) {
    work();
  } else {
    tbb::task_arena arena(static_cast<int>(plan.threads));
    arena.execute(work);
  }
  return results;
}

void count_failure(RunOutcome& outcome, const std::string& error) {
  ++outcome.failed_columns;
  if (outcome.first_failures.size() < max_failures_kept) outcome.first_failures.push_back(error);
}

void fail_without_columns(const std::filesystem::path& path, const RunOutcome& outcome) {
  throw InputError(InputPlace{path.string(), "", {}, {}, {}, {}},
                   fmt::format("no column could be computed; the first failure: {}",
                               outcome.first_failures.empty() ? std::string("?") : outcome.first_failures.front()));
}

RunContext::RunContext(const io::Study& study, const RunOptions& options, bool writes_output)
    : path(output_path(study, options)), expanded(checked_columns(study, options, path, writes_output)),
      total(io::column_count(expanded.study)), longwave(prepare_longwave(expanded.study)),
      shortwave(prepare_shortwave(expanded.study)), climate(checked_climate(expanded.study, longwave, shortwave)),
      info(run_info(study, longwave, shortwave)), hash(run_hash(study, expanded, options)), threads(options.threads),
      stop_on_column_error(options.stop_on_column_error) {
  if (total == 0) throw InputError(InputPlace{path.string(), "", {}, {}, {}, {}}, "nothing to write: the run has no columns");
}

io::ExpandedStudy RunContext::checked_columns(const io::Study& study, const RunOptions& options,
                                              const std::filesystem::path& path, bool writes_output) {
  if (writes_output) io::check_output_folder(path); // fail before the work, not after
  if (options.chunk_columns == 0) throw InternalError("RunOptions::chunk_columns must be at least 1");
  return io::prepare_columns(study);
}

ClimateSetup RunContext::checked_climate(const io::Study& flat, const LongwaveSetup& lw, const ShortwaveSetup& sw) {
  check_band_properties(flat, lw, sw);
  return prepare_climate(flat, lw, sw);
}

} // namespace bandstack::batch
