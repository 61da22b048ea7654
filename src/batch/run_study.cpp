// batch::run_study: computes a study block of columns by block and streams the blocks into a
// resumable result file (working file + checkpoint record, see io/resumable_output.hpp).
#include <algorithm>
#include <atomic>
#include <future>
#include <optional>

#include <fmt/format.h>

#include "bandstack/batch/run.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/io/result_writer.hpp"
#include "bandstack/io/resumable_output.hpp"
#include "batch/interrupt.hpp"
#include "batch/progress.hpp"
#include "batch/run_context.hpp"

namespace bandstack::batch {

RunOutcome run_study(const io::Study& study, const RunOptions& options) {
  const RunContext plan(study, options);
  const std::filesystem::path& path = plan.path;
  const io::ExpandedStudy& expanded = plan.expanded;
  const std::size_t total = plan.total;
  const io::RunInfo& info = plan.info;
  const std::string& hash = plan.hash;

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
  // A block is written (and synced, and recorded) on a thread of its own while the next is computed.
  // Only that thread calls netCDF meanwhile: a block that reads a profile file waits for it first.
  std::future<void> writing;
  const auto wait_for_writing = [&writing] {
    if (writing.valid()) writing.get();
  };
  std::size_t first = start;
  try {
    while (first < total) {
      const std::size_t count = std::min(options.chunk_columns, total - first);
      if (expanded.profile) wait_for_writing();
      std::vector<ColumnResult> results = compute_block(plan, first, count, progress, done);
      for (const ColumnResult& r : results)
        if (r.failed()) count_failure(outcome, r.error);
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
      if (keep)
        for (const ColumnResult& r : results) outcome.summaries.push_back(summarise(r));
      wait_for_writing();
      writing = std::async(std::launch::async, [&writer, &path, record, block = std::move(results), first, count] {
        writer->write_block(first, block);
        writer->sync();
        io::Checkpoint now = record;
        now.columns_written = first + count;
        io::write_checkpoint(io::checkpoint_path(path), now);
      });
      first += count;
      if (const int signal = InterruptGuard::signal_received(); signal != 0 && first < total) {
        wait_for_writing();
        progress.finish();
        outcome.interrupted_by = signal;
        outcome.columns_written = first;
        outcome.summaries.clear();
        return outcome;
      }
    }
    wait_for_writing();
    if (!writer) // every column failed (or every one after the resume point)
      fail_without_columns(path, outcome);
    writer->close();
    io::finish_resumable(path);
  } catch (...) {
    try {
      wait_for_writing(); // the writer must outlive its thread; the first error is the one reported
    } catch (...) { // NOLINT(bugprone-empty-catch)
    }
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
