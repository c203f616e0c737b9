#include "cli/interrupt.h"

namespace hushgain {
namespace {

std::atomic<bool> g_interrupted{false};

// Stays installed: a second (or any further) Ctrl-C while the work winds
// down only sets the flag again, so the run still ends the documented way
// (exit 130, its one message, no files). A lock-free atomic store is
// async-signal-safe.
extern "C" void OnInterrupt(int) { g_interrupted.store(true); }
static_assert(std::atomic<bool>::is_always_lock_free);

}  // namespace

InterruptScope::InterruptScope() {
  g_interrupted.store(false);
  previous_ = std::signal(SIGINT, OnInterrupt);
}

InterruptScope::~InterruptScope() {
  // Interrupted, the program is on its way out with exit 130: any further
  // Ctrl-C is ignored to the end, so none can kill it half-way through its
  // message or its clean-up. Otherwise the previous handling comes back.
  if (g_interrupted.load())
    std::signal(SIGINT, SIG_IGN);
  else
    std::signal(SIGINT, previous_ == SIG_ERR ? SIG_DFL : previous_);
}

const std::atomic<bool>* InterruptScope::flag() const { return &g_interrupted; }

}  // namespace hushgain
