#pragma once
// Private to batch: a one-line progress display on stderr for long runs.
#include <chrono>
#include <cstddef>
#include <mutex>

namespace bandstack::batch {

class Progress {
public:
  // Shows nothing unless `enabled`. `done` columns of `total` are finished already (a resumed run).
  Progress(std::size_t total, std::size_t done, bool enabled);
  // Columns finished so far; redraws the line at most 4 times a second. Any thread may call it
  // (a call that finds another one drawing returns at once).
  void update(std::size_t done);
  // Clears the line (before other output).
  void finish();

private:
  using Clock = std::chrono::steady_clock;
  std::size_t total_, start_done_;
  bool enabled_;
  bool drawn_ = false;
  std::mutex mutex_;
  Clock::time_point start_, last_;
};

} // namespace bandstack::batch
