#include "cli/interrupt.h"

namespace hushgain {
namespace {

std::atomic<bool> g_interrupted{false};

extern "C" void OnInterrupt(int) {
  g_interrupted.store(true);
  std::signal(SIGINT, SIG_DFL);
}

}  // namespace

InterruptScope::InterruptScope() {
  g_interrupted.store(false);
  previous_ = std::signal(SIGINT, OnInterrupt);
}

InterruptScope::~InterruptScope() {
  std::signal(SIGINT, previous_ == SIG_ERR ? SIG_DFL : previous_);
}

const std::atomic<bool>* InterruptScope::flag() const { return &g_interrupted; }

}  // namespace hushgain
