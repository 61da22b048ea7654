#include "batch/progress.hpp"

#include <cstdio>

#include <fmt/format.h>

namespace bandstack::batch {

Progress::Progress(std::size_t total, std::size_t done, bool enabled)
    : total_(total), start_done_(done), enabled_(enabled), start_(Clock::now()), last_(start_) {}

void Progress::update(std::size_t done) {
  if (!enabled_) return;
  const std::unique_lock lock(mutex_, std::try_to_lock);
  if (!lock.owns_lock()) return;
  const Clock::time_point now = Clock::now();
  if (drawn_ && now - last_ < std::chrono::milliseconds(250) && done < total_) return;
  last_ = now;
  const double seconds = std::chrono::duration<double>(now - start_).count();
  const double rate = seconds > 0 ? static_cast<double>(done - start_done_) / seconds : 0.0;
  std::string left = "?";
  if (rate > 0) {
    const auto s = static_cast<long>(static_cast<double>(total_ - done) / rate + 0.5);
    left = s >= 3600 ? fmt::format("{}h{:02}m", s / 3600, s / 60 % 60) : fmt::format("{}m{:02}s", s / 60, s % 60);
  }
  std::fputs(fmt::format("\r{} of {} columns ({:.0f}%), {:.1f} columns/s, {} left   ", done, total_,
                         100.0 * static_cast<double>(done) / static_cast<double>(total_), rate, left)
                 .c_str(),
             stderr);
  std::fflush(stderr);
  drawn_ = true;
}

void Progress::finish() {
  const std::lock_guard lock(mutex_);
  if (!drawn_) return;
  std::fputs("\r\033[K", stderr);
  std::fflush(stderr);
  drawn_ = false;
}

} // namespace bandstack::batch
