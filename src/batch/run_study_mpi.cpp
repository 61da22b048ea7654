// batch::run_study_mpi: blocks of columns handed out to the ranks of an MPI job on request; rank 0
// also computes, and writes every block into the one resumable result file (batch/run_mpi.hpp).
#include "bandstack/batch/run_mpi.hpp"

#include <algorithm>
#include <array>
#include <atomic>
#include <cstdint>
#include <cstdlib>
#include <cstring>
#include <deque>
#include <exception>
#include <memory>
#include <optional>
#include <utility>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/io/result_packing.hpp"
#include "bandstack/io/resumable_output.hpp"
#include "batch/interrupt.hpp"
#include "batch/progress.hpp"
#include "batch/run_context.hpp"

#ifdef BANDSTACK_HAS_MPI
#include <mpi.h>
#endif

namespace bandstack::batch {

#ifndef BANDSTACK_HAS_MPI

bool mpi_built() noexcept { return false; }

// Without MPI, a process started by mpirun still learns its rank and the job's size from the
// launcher's environment, so that several copies do not all write the same file.
MpiSession::MpiSession(int&, char**&) {
  for (const auto& [size, rank] : {std::pair{"OMPI_COMM_WORLD_SIZE", "OMPI_COMM_WORLD_RANK"}, std::pair{"PMI_SIZE", "PMI_RANK"}})
    if (const char* n = std::getenv(size)) {
      size_ = std::max(1, std::atoi(n));
      if (const char* r = std::getenv(rank)) rank_ = std::atoi(r);
      return;
    }
}
MpiSession::~MpiSession() = default;
void MpiSession::abort(int code) const { std::exit(code); }
RunOutcome run_study_mpi(const io::Study& study, const RunOptions& options, const MpiSession& session) {
  if (session.size() > 1)
    throw InputError("this bandstack was built without MPI (BANDSTACK_MPI off): run it without mpirun, or rebuild it "
                     "with an MPI library installed (Debian: libopenmpi-dev)");
  return run_study(study, options);
}

#else

bool mpi_built() noexcept { return true; }

namespace {

// Started by an MPI launcher: Open MPI, MPICH/Hydra (PMI), Slurm's srun with PMIx.
bool launched_by_mpi() {
  for (const char* name : {"OMPI_COMM_WORLD_SIZE", "PMI_SIZE", "PMIX_RANK", "PMI_RANK"})
    if (std::getenv(name) != nullptr) return true;
  return false;
}

constexpr int tag_assign = 1; // rank 0 -> worker: {first, count}; count 0 = stop
constexpr int tag_result = 2; // worker -> rank 0: a packed block (with the worker's result shape)
constexpr int tag_error = 3;  // worker -> rank 0: {exit code} + message

// A result message: [number of shape numbers][shape numbers][packed block bytes].
std::vector<char> result_message(const std::vector<double>& shape, const io::PackedBlock& block) {
  std::vector<char> out(sizeof(std::uint64_t) + shape.size() * sizeof(double));
  const std::uint64_t n = shape.size();
  std::memcpy(out.data(), &n, sizeof n);
  if (!shape.empty()) std::memcpy(out.data() + sizeof n, shape.data(), shape.size() * sizeof(double));
  const std::vector<char> bytes = block.to_bytes();
  out.insert(out.end(), bytes.begin(), bytes.end());
  return out;
}

struct ResultMessage {
  std::optional<io::ResultShape> shape;
  io::PackedBlock block;
};

ResultMessage read_result_message(const std::vector<char>& bytes) {
  std::uint64_t n = 0;
  if (bytes.size() < sizeof n) throw InternalError("an MPI result message is too short");
  std::memcpy(&n, bytes.data(), sizeof n);
  if (n > (bytes.size() - sizeof n) / sizeof(double)) throw InternalError("an MPI result message is malformed");
  ResultMessage m;
  std::vector<double> shape(n);
  if (n > 0) {
    std::memcpy(shape.data(), bytes.data() + sizeof n, n * sizeof(double));
    m.shape = io::ResultShape::decode(shape);
  }
  const std::size_t offset = sizeof n + n * sizeof(double);
  m.block = io::PackedBlock::from_bytes(std::span<const char>(bytes.data() + offset, bytes.size() - offset));
  return m;
}

// The packed block of `results` (first column `first`): with `packer` when one exists (made from the
// first computed result seen), else, for a block whose every column failed, statuses and errors only.
io::PackedBlock pack_results(std::optional<io::ResultPacker>& packer, std::optional<io::ResultShape>& shape,
                             const RunContext& run, std::size_t first, const std::vector<ColumnResult>& results) {
  if (!packer) {
    const auto ok = std::find_if(results.begin(), results.end(), [](const ColumnResult& r) { return !r.failed(); });
    if (ok != results.end()) {
      shape = io::ResultShape::of(*ok);
      packer.emplace(*shape, run.info, run.expanded.axes);
    }
  }
  if (packer) return packer->pack(first, results);
  io::PackedBlock block;
  block.first = first;
  block.count = results.size();
  for (const ColumnResult& r : results) {
    block.status.push_back(static_cast<signed char>(r.status));
    block.errors.push_back(r.error);
  }
  return block;
}

int exit_code_of(const std::exception_ptr& error) {
  try {
    std::rethrow_exception(error);
  } catch (const Error& e) {
    return static_cast<int>(e.exit_code());
  } catch (...) {
    return static_cast<int>(ExitCode::internal_error);
  }
}

std::string message_of(const std::exception_ptr& error) {
  try {
    std::rethrow_exception(error);
  } catch (const std::exception& e) {
    return e.what();
  } catch (...) {
    return "unknown error";
  }
}

// An error met on another rank, raised again on rank 0 with its exit code.
Error remote_error(int rank, int code, const std::string& message) {
  return Error(fmt::format("(rank {}) {}", rank, message), code == 2 ? ExitCode::bad_input : ExitCode::internal_error);
}

// A worker: computes the blocks rank 0 assigns (keeping one in hand while the last result travels)
// and sends each back packed, until told to stop.
void work(const RunContext& run) {
  std::deque<std::array<std::uint64_t, 2>> queue;
  std::optional<io::ResultPacker> packer;
  std::optional<io::ResultShape> shape;
  std::vector<char> sending;
  MPI_Request request = MPI_REQUEST_NULL;
  Progress quiet(0, 0, false);
  std::atomic<std::size_t> done{0};
  const auto take_assignments = [&](bool wait) {
    for (;;) {
      int arrived = 0;
      if (wait && queue.empty()) {
        MPI_Probe(0, tag_assign, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
        arrived = 1;
      } else {
        MPI_Iprobe(0, tag_assign, MPI_COMM_WORLD, &arrived, MPI_STATUS_IGNORE);
      }
      if (!arrived) return;
      std::array<std::uint64_t, 2> a{};
      MPI_Recv(a.data(), 2, MPI_UINT64_T, 0, tag_assign, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
      queue.push_back(a);
    }
  };
  try {
    for (;;) {
      take_assignments(true);
      const auto [first, count] = queue.front();
      queue.pop_front();
      if (count == 0) break;
      const std::vector<ColumnResult> results = compute_block(run, first, count, quiet, done);
      const io::PackedBlock block = pack_results(packer, shape, run, first, results);
      std::vector<char> message = result_message(shape ? shape->encode() : std::vector<double>{}, block);
      MPI_Wait(&request, MPI_STATUS_IGNORE);
      sending = std::move(message);
      MPI_Isend(sending.data(), static_cast<int>(sending.size()), MPI_BYTE, 0, tag_result, MPI_COMM_WORLD, &request);
    }
    MPI_Wait(&request, MPI_STATUS_IGNORE);
  } catch (...) {
    const std::exception_ptr error = std::current_exception();
    MPI_Wait(&request, MPI_STATUS_IGNORE);
    const std::string text = message_of(error);
    std::vector<char> message(sizeof(int) + text.size());
    const int code = exit_code_of(error);
    std::memcpy(message.data(), &code, sizeof code);
    std::memcpy(message.data() + sizeof code, text.data(), text.size());
    MPI_Send(message.data(), static_cast<int>(message.size()), MPI_BYTE, 0, tag_error, MPI_COMM_WORLD);
    // Rank 0 ends the job; until then take what it sends.
    for (;;) {
      std::array<std::uint64_t, 2> a{};
      MPI_Recv(a.data(), 2, MPI_UINT64_T, 0, tag_assign, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
    }
  }
}

// Rank 0: hands out blocks, computes blocks itself between messages, writes every block.
class Coordinator {
public:
  Coordinator(const RunContext& run, const RunOptions& options, int ranks)
      : run_(run), options_(options), ranks_(ranks), block_(options.chunk_columns),
        blocks_((run.total + block_ - 1) / block_), written_(blocks_, false), outstanding_(ranks, 0),
        stopped_(ranks, false) {}

  RunOutcome run() {
    RunOutcome outcome;
    outcome.output_file = run_.path;
    outcome.experiment_names = run_.info.experiment_names;
    outcome.column_count = run_.total;
    std::size_t start = resume_point(run_.path, run_.hash, options_, run_.total);
    if (start > 0 && !io::working_file_opens(run_.path)) { // blocks arrive out of order: open it before
      note(options_, fmt::format("starting {} afresh: the unfinished file of the interrupted run cannot be reopened",
                                 run_.path.string()));
      io::discard_resumable(run_.path);
      start = 0;
    }
    outcome.resumed_from = start;
    resuming_ = start > 0;
    prefix_ = next_ = start / block_;
    std::fill(written_.begin(), written_.begin() + static_cast<long>(prefix_), true);
    Progress progress(run_.total, start, options_.progress);
    progress_ = &progress;
    done_ = start;
    outcome_ = &outcome;
    try {
      for (int r = 1; r < ranks_; ++r) {
        assign(r);
        assign(r);
      }
      while (prefix_ < blocks_) {
        drain();
        if (InterruptGuard::signal_received() != 0) stopping_ = true;
        if (!stopping_ && next_ < blocks_) {
          compute_own(next_++);
        } else if (std::any_of(outstanding_.begin(), outstanding_.end(), [](int n) { return n > 0; })) {
          MPI_Status status;
          MPI_Probe(MPI_ANY_SOURCE, MPI_ANY_TAG, MPI_COMM_WORLD, &status);
          handle(status);
        } else {
          break; // stopped by a signal, everything handed out is in
        }
      }
      for (int r = 1; r < ranks_; ++r)
        if (!stopped_[r]) send_stop(r);
      progress.finish();
      if (prefix_ < blocks_) { // interrupted
        outcome.interrupted_by = InterruptGuard::signal_received();
        outcome.columns_written = std::min(prefix_ * block_, run_.total);
        return outcome;
      }
      if (!writer_) fail_without_columns(run_.path, outcome);
      writer_->close();
      io::finish_resumable(run_.path);
    } catch (...) {
      progress.finish();
      writer_.reset();
      io::discard_resumable(run_.path);
      throw;
    }
    outcome.columns_written = run_.total;
    return outcome;
  }

private:
  void assign(int r) {
    if (stopping_ || next_ >= blocks_) {
      if (!stopped_[r]) send_stop(r);
      return;
    }
    const std::size_t b = next_++;
    const std::array<std::uint64_t, 2> a{b * block_, std::min(block_, run_.total - b * block_)};
    MPI_Send(a.data(), 2, MPI_UINT64_T, r, tag_assign, MPI_COMM_WORLD);
    ++outstanding_[r];
  }

  void send_stop(int r) {
    const std::array<std::uint64_t, 2> stop{0, 0};
    MPI_Send(stop.data(), 2, MPI_UINT64_T, r, tag_assign, MPI_COMM_WORLD);
    stopped_[r] = true;
  }

  void drain() {
    for (;;) {
      int arrived = 0;
      MPI_Status status;
      MPI_Iprobe(MPI_ANY_SOURCE, MPI_ANY_TAG, MPI_COMM_WORLD, &arrived, &status);
      if (!arrived) return;
      handle(status);
    }
  }

  void handle(const MPI_Status& status) {
    int size = 0;
    MPI_Get_count(&status, MPI_BYTE, &size);
    std::vector<char> bytes(static_cast<std::size_t>(size));
    MPI_Recv(bytes.data(), size, MPI_BYTE, status.MPI_SOURCE, status.MPI_TAG, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
    if (status.MPI_TAG == tag_error) {
      int code = 1;
      if (bytes.size() >= sizeof code) std::memcpy(&code, bytes.data(), sizeof code);
      throw remote_error(status.MPI_SOURCE, code,
                         bytes.size() > sizeof code ? std::string(bytes.begin() + sizeof code, bytes.end()) : "");
    }
    ResultMessage m = read_result_message(bytes);
    --outstanding_[status.MPI_SOURCE];
    assign(status.MPI_SOURCE);
    if (m.shape && !shape_) shape_ = m.shape;
    accept(std::move(m.block));
  }

  void compute_own(std::size_t b) {
    const std::size_t first = b * block_, count = std::min(block_, run_.total - first);
    std::atomic<std::size_t> own{0};
    Progress quiet(0, 0, false);
    const std::vector<ColumnResult> results = compute_block(run_, first, count, quiet, own);
    accept(pack_results(packer_, shape_, run_, first, results));
  }

  // Counts the block's failures, then writes it (or keeps it until the file can be defined).
  void accept(io::PackedBlock block) {
    for (std::size_t i = 0; i < block.count; ++i) {
      if (block.status[i] == 0) continue;
      count_failure(*outcome_, block.errors[i]);
    }
    done_ += block.count;
    progress_->update(done_);
    if (!writer_ && shape_) open_writer();
    if (!writer_) {
      pending_.push_back(std::move(block));
      return;
    }
    write(block);
    for (const io::PackedBlock& p : pending_) write(p);
    pending_.clear();
  }

  void open_writer() {
    const batch::ColumnResult sample = shape_->sample();
    if (resuming_) {
      try {
        writer_.emplace(io::ResultFileWriter::reopen(io::working_path(run_.path), sample, run_.info, run_.expanded.axes));
        return;
      } catch (const FileError& e) { // opened at the start, but not as this run's file
        throw FileError(run_.path.string(), std::string("cannot continue the interrupted run (run again with --restart): ") +
                                                e.what());
      }
    }
    writer_.emplace(io::working_path(run_.path), sample, run_.info, run_.expanded.axes,
                    io::StorageSettings{options_.deflate_level, options_.chunk_columns});
  }

  void write(const io::PackedBlock& block) {
    writer_->write_packed(block);
    written_[block.first / block_] = true;
    const std::size_t before = prefix_;
    while (prefix_ < blocks_ && written_[prefix_]) ++prefix_;
    if (prefix_ == before) return;
    writer_->sync();
    io::write_checkpoint(io::checkpoint_path(run_.path),
                         io::Checkpoint{run_.hash, options_.chunk_columns, run_.total, std::min(prefix_ * block_, run_.total)});
  }

  const RunContext& run_;
  const RunOptions& options_;
  int ranks_;
  std::size_t block_, blocks_;
  std::vector<bool> written_;
  std::vector<int> outstanding_;
  std::vector<bool> stopped_;
  std::size_t prefix_ = 0, next_ = 0, done_ = 0;
  bool stopping_ = false, resuming_ = false;
  std::optional<io::ResultShape> shape_;
  std::optional<io::ResultPacker> packer_;
  std::optional<io::ResultFileWriter> writer_;
  std::vector<io::PackedBlock> pending_;
  Progress* progress_ = nullptr;
  RunOutcome* outcome_ = nullptr;
};

} // namespace

MpiSession::MpiSession(int& argc, char**& argv) {
  if (!launched_by_mpi()) return;
  int provided = 0;
  MPI_Init_thread(&argc, &argv, MPI_THREAD_FUNNELED, &provided);
  initialised_ = true;
  MPI_Comm_rank(MPI_COMM_WORLD, &rank_);
  MPI_Comm_size(MPI_COMM_WORLD, &size_);
}

MpiSession::~MpiSession() {
  if (initialised_) MPI_Finalize();
}

void MpiSession::abort(int code) const {
  if (initialised_) MPI_Abort(MPI_COMM_WORLD, code);
  std::exit(code);
}

RunOutcome run_study_mpi(const io::Study& study, const RunOptions& options, const MpiSession& session) {
  if (session.size() <= 1) return run_study(study, options);
  const bool writer = session.rank() == 0;
  // Every rank sets up the run; if any cannot, all stop (rank 0 reports its own error, or says that
  // another rank failed).
  std::unique_ptr<RunContext> run;
  std::exception_ptr error;
  try {
    run = std::make_unique<RunContext>(study, options, writer);
  } catch (...) {
    error = std::current_exception();
  }
  int ok = error ? 0 : 1, all_ok = 0;
  MPI_Allreduce(&ok, &all_ok, 1, MPI_INT, MPI_MIN, MPI_COMM_WORLD);
  if (!all_ok) {
    if (error && writer) std::rethrow_exception(error);
    if (writer) throw InputError("another rank of the MPI job could not set up the run (its error is on its stderr)");
    if (error) std::rethrow_exception(error);
    RunOutcome quiet;
    return quiet;
  }
  InterruptGuard guard; // under mpirun a signal ends the job; a resumed run continues from the checkpoint
  if (!writer) {
    work(*run);
    RunOutcome outcome;
    outcome.column_count = run->total;
    return outcome;
  }
  return Coordinator(*run, options, session.size()).run();
}

#endif

} // namespace bandstack::batch
