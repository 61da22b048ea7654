#include "batch/interrupt.hpp"

#include <csignal>

namespace bandstack::batch {

namespace {

volatile std::sig_atomic_t received = 0;
struct sigaction previous_int {};
struct sigaction previous_term {};

extern "C" void record_signal(int signal) { received = signal; }

} // namespace

InterruptGuard::InterruptGuard() {
  received = 0;
  struct sigaction action {};
  action.sa_handler = record_signal;
  sigemptyset(&action.sa_mask);
  action.sa_flags = SA_RESETHAND | SA_RESTART; // the second signal acts as usual
  sigaction(SIGINT, &action, &previous_int);
  sigaction(SIGTERM, &action, &previous_term);
}

InterruptGuard::~InterruptGuard() {
  sigaction(SIGINT, &previous_int, nullptr);
  sigaction(SIGTERM, &previous_term, nullptr);
}

int InterruptGuard::signal_received() noexcept { return received; }

} // namespace bandstack::batch
