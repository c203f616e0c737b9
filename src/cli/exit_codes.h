// The documented exit codes of the hushgain command (README, "Exit codes").
#ifndef HUSHGAIN_CLI_EXIT_CODES_H_
#define HUSHGAIN_CLI_EXIT_CODES_H_

namespace hushgain {

inline constexpr int kExitOk = 0;
inline constexpr int kExitAnalysisRefused = 1;  // singular network, ...
inline constexpr int kExitUsage = 2;            // bad command line or input
inline constexpr int kExitInterrupted = 130;    // stopped by SIGINT (128 + 2)

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_EXIT_CODES_H_
