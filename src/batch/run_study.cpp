// batch::run_study: computes a study block of columns by block and streams the blocks into a
// resumable result file (working file + checkpoint record, see io/resumable_output.hpp).
#include <algorithm>
#include <atomic>
#include <cstring>
#include <optional>

#include <fmt/format.h>
#include <tbb/parallel_for.h>
#include <tbb/task_arena.h>

#include "bandstack/batch/run.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/io/atomic_output.hpp"
#include "bandstack/io/result_writer.hpp"
#include "bandstack/io/resumable_output.hpp"
#include "bandstack/io/sweep.hpp"
#include "batch/column_blocks.hpp"
#include "batch/interrupt.hpp"
#include "batch/progress.hpp"

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

// Everything fixed for the whole run.
struct Plan {
  const io::ExpandedStudy& expanded;
  const LongwaveSetup& longwave;
  const ShortwaveSetup& shortwave;
  const ClimateSetup& climate;
  std::size_t threads;
  bool stop_on_column_error;
};

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

// Columns [first, first + count): built and computed in parallel, each result in its own slot; a
// column that fails is recorded in its slot (record_failure).
std::vector<ColumnResult> compute_block(const Plan& plan, std::size_t first, std::size_t count, Progress& progress,
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

// Failure messages kept in RunOutcome::first_failures.
constexpr std::size_t max_failures_kept = 5;

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

RunOutcome run_study(const io::Study& study, const RunOptions& options) {
  const std::filesystem::path path = output_path(study, options);
  io::check_output_folder(path); // fail before the work, not after
  if (options.chunk_columns == 0) throw InternalError("RunOptions::chunk_columns must be at least 1");
  const io::ExpandedStudy expanded = io::prepare_columns(study);
  const io::Study& flat = expanded.study;
  const std::size_t total = io::column_count(flat);
  if (total == 0) throw InputError(InputPlace{path.string(), "", {}, {}, {}, {}}, "nothing to write: the run has no columns");
  const LongwaveSetup setup = prepare_longwave(flat);
  const ShortwaveSetup sw_setup = prepare_shortwave(flat);
  check_band_properties(flat, setup, sw_setup);
  const ClimateSetup climate_setup = prepare_climate(flat, setup, sw_setup);
  const io::RunInfo info = run_info(study, setup, sw_setup);
  const Plan plan{expanded, setup, sw_setup, climate_setup, options.threads, options.stop_on_column_error};
  const std::string hash = run_hash(study, expanded, options);

  RunOutcome outcome;
  outcome.output_file = path;
  outcome.experiment_names = info.experiment_names;
  outcome.column_count = total;
  std::size_t start = resume_point(path, hash, options, total);
  outcome.resumed_from = start;
  const bool keep = start == 0 && total <= options.summary_columns;
  const io::StorageSettings storage{options.deflate_level, options.chunk_columns};
  const io::Checkpoint record{hash, options.chunk_columns, total, 0};

  InterruptGuard guard;
  Progress progress(total, start, options.progress);
  std::atomic<std::size_t> done{start};
  std::optional<io::ResultFileWriter> writer;
  // Blocks computed before the file could be defined: it needs one computed column as a sample, and
  // a block may have failed whole. They are written as soon as a column succeeds.
  std::vector<std::pair<std::size_t, std::vector<ColumnResult>>> pending;
  std::optional<std::string> first_error;
  std::size_t first = start;
  try {
    while (first < total) {
      const std::size_t count = std::min(options.chunk_columns, total - first);
      std::vector<ColumnResult> results = compute_block(plan, first, count, progress, done);
      for (const ColumnResult& r : results) {
        if (!r.failed()) continue;
        if (outcome.first_failures.size() < max_failures_kept) outcome.first_failures.push_back(r.error);
        ++outcome.failed_columns;
        if (!first_error) first_error = r.error;
      }
      const auto sample = std::find_if(results.begin(), results.end(), [](const ColumnResult& r) { return !r.failed(); });
      if (!writer && sample == results.end()) { // nothing to define the file from yet
        if (keep)
          for (const ColumnResult& r : results) outcome.summaries.push_back(summarise(r));
        pending.emplace_back(first, std::move(results));
        first += count;
        if (const int signal = InterruptGuard::signal_received(); signal != 0 && first < total) {
          progress.finish(); // the pending blocks are computed again when the run resumes
          outcome.interrupted_by = signal;
          outcome.columns_written = pending.front().first;
          outcome.summaries.clear();
          return outcome;
        }
        continue;
      }
      if (!writer && start > 0) {
        try {
          writer.emplace(io::ResultFileWriter::reopen(io::working_path(path), *sample, info, expanded.axes));
        } catch (const FileError& e) {
          note(options, fmt::format("starting {} afresh: {}", path.string(), e.what()));
          io::discard_resumable(path);
          first = 0;
          start = 0;
          outcome.resumed_from = 0;
          outcome.failed_columns = 0;
          outcome.first_failures.clear();
          outcome.summaries.clear();
          pending.clear();
          done = 0;
          continue;
        }
      }
      if (!writer) writer.emplace(io::working_path(path), *sample, info, expanded.axes, storage);
      for (const auto& [block_first, block] : pending) writer->write_block(block_first, block);
      pending.clear();
      writer->write_block(first, results);
      writer->sync();
      first += count;
      io::Checkpoint now = record;
      now.columns_written = first;
      io::write_checkpoint(io::checkpoint_path(path), now);
      if (keep)
        for (const ColumnResult& r : results) outcome.summaries.push_back(summarise(r));
      if (const int signal = InterruptGuard::signal_received(); signal != 0 && first < total) {
        progress.finish();
        outcome.interrupted_by = signal;
        outcome.columns_written = first;
        outcome.summaries.clear();
        return outcome;
      }
    }
    if (!writer) // every column failed (or every one after the resume point)
      throw InputError(InputPlace{path.string(), "", {}, {}, {}, {}},
                       fmt::format("no column could be computed; the first failure: {}", first_error.value_or("?")));
    writer->close();
    io::finish_resumable(path);
  } catch (...) {
    progress.finish();
    writer.reset();
    io::discard_resumable(path);
    throw;
  }
  progress.finish();
  outcome.columns_written = total;
  return outcome;
}

} // namespace bandstack::batch
