#pragma once
// Private to batch: SIGINT and SIGTERM ask a run to stop after the current block of columns.
namespace bandstack::batch {

// While alive, SIGINT and SIGTERM only record that they arrived (a second one of the same kind then
// acts as usual, i.e. ends the process). The previous handlers come back on destruction.
class InterruptGuard {
public:
  InterruptGuard();
  ~InterruptGuard();
  InterruptGuard(const InterruptGuard&) = delete;
  InterruptGuard& operator=(const InterruptGuard&) = delete;
  // The signal number that arrived since construction, or 0.
  [[nodiscard]] static int signal_received() noexcept;
};

} // namespace bandstack::batch
