// The stage a command budgets: the stage file, read and checked, with its
// op-amp replaced when the command line names another (--device NAME or
// --device path/to/part.json), so a quick "what if" needs no edited file.
// The replacement takes the whole op-amp: the named device's parameters,
// not the stage's "set" overrides (they were written for the stage's own
// part).
#ifndef HUSHGAIN_CLI_STAGE_INPUT_H_
#define HUSHGAIN_CLI_STAGE_INPUT_H_

#include <string>
#include <vector>

#include "circuit/stage.h"
#include "cli/output_files.h"
#include "io/device_library.h"
#include "review/review.h"

namespace hushgain {

// Throws Error: the stage file's own errors, or
// "command line: --device: unknown op-amp device ..." for a bad override.
Stage LoadStageForCommand(const std::string& stage_path,
                          const DeviceLibrary& library,
                          const std::string& device_override);

// The files a command reads, which no output may overwrite
// (OutputFiles::Check): the stage file ("-": standard input), the --device
// part when it names a file, and every file of the device folder.
std::vector<InputFile> CommandInputs(const std::string& stage_path,
                                     const DeviceLibrary& library,
                                     const std::string& device_override);

// The review `budget` prints: every block on, the integral to
// `relative_tolerance`, and the library's resistor technologies as the
// candidates of the excess-noise upgrade advice.
ReviewOptions FullReviewOptions(const DeviceLibrary& library,
                                double relative_tolerance);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_STAGE_INPUT_H_
