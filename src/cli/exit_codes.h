// The documented exit codes of the hushgain command (README, "Exit codes").
#ifndef HUSHGAIN_CLI_EXIT_CODES_H_
#define HUSHGAIN_CLI_EXIT_CODES_H_

namespace hushgain {

inline constexpr int kExitOk = 0;
inline constexpr int kExitAnalysisRefused = 1;  // singular network, ...
inline constexpr int kExitUsage = 2;            // bad command line or input
// Stopped by Ctrl-C after printing what it had (128 + SIGINT, as shells do).
inline constexpr int kExitInterrupted = 130;
// A program hushgain needs is missing or failed (gnuplot for `plot`).
inline constexpr int kExitToolFailed = 3;
// The system failed under a valid request: out of memory, threads that
// could not be started, any other std::exception that reached main.
inline constexpr int kExitSystem = 4;

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_EXIT_CODES_H_
