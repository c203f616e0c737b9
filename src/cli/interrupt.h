// Ctrl-C for long work (tee search, spread): while an InterruptScope lives,
// SIGINT sets a flag the core polls (through the pointer it is given), and
// so does every further Ctrl-C: however many arrive, the command ends the
// documented way (exit 130, one message; spread writes no file). After an
// interrupted scope SIGINT stays ignored until the program ends. (Ctrl-\,
// SIGQUIT, still ends it at once.) The flag is the one global of the
// program, and only here: a signal handler can reach nothing else.
#ifndef HUSHGAIN_CLI_INTERRUPT_H_
#define HUSHGAIN_CLI_INTERRUPT_H_

#include <atomic>
#include <csignal>

namespace hushgain {

class InterruptScope {
 public:
  InterruptScope();   // clears the flag, installs the handler
  ~InterruptScope();  // restores the previous handler, or ignores SIGINT
                      // from then on when interrupted
  InterruptScope(const InterruptScope&) = delete;
  InterruptScope& operator=(const InterruptScope&) = delete;

  const std::atomic<bool>* flag() const;
  bool interrupted() const { return flag()->load(); }

 private:
  void (*previous_)(int);
};

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_INTERRUPT_H_
