// The whole hushgain command line as a function: parses `argv`, runs the
// command and turns every failure into one line and a documented exit code
// (cli/exit_codes.h); nothing escapes as an exception. main() is only this
// call, and the command-line fuzz target (tests/fuzz/) calls it in-process
// again and again, so a run leaves no state behind: std::cout and std::cerr
// are pointed at `out` and `err` for the call (the commands write through
// them) and put back after, ASCII output (--ascii, the locale) lasts for the
// call only, and a Ctrl-C handler only for the work it guards
// (cli/interrupt.h). Outputs named "-" are written to file descriptor 1
// itself, whatever `out` is (cli/output_files.h); the device folder comes
// from --devices, $HUSHGAIN_DEVICES or the running binary's place
// (cli/device_folder.h).
#ifndef HUSHGAIN_CLI_RUN_CLI_H_
#define HUSHGAIN_CLI_RUN_CLI_H_

#include <ostream>

namespace hushgain {

int RunCli(int argc, char** argv, std::ostream& out, std::ostream& err);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_RUN_CLI_H_
