// `hushgain compare STAGE.json`: the same stage budgeted with every op-amp
// of the device folder, or with the ones --devices-list names (device names
// or part files, as --device takes them), one row each, ranked by
// input-referred noise or worst-case offset (design/opamp_comparison.h).
#ifndef HUSHGAIN_CLI_COMPARE_COMMAND_H_
#define HUSHGAIN_CLI_COMPARE_COMMAND_H_

#include <string>

namespace hushgain {

struct CompareCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  // --devices-list a,b,c: device names or part files; empty = every op-amp
  // of the device folder.
  std::string devices_list;
  std::string rank = "input-noise";  // input-noise or offset
  std::string format = "text";       // text, json, markdown or csv
  bool json = false;                 // the same as --format json
  bool csv = false;                  // the same as --format csv
  double tolerance = 1e-4;  // relative, on each budget's output noise power
  // .png, .svg or .pdf: input-referred noise per op-amp as bars split by
  // kind of contributor (report/compare_plot_script.h); empty = none.
  std::string plot_path;
};

// Prints the report on stdout and each device's warnings and refusal on
// stderr; returns an exit code (cli/exit_codes.h): kExitOk when at least
// one device budgets the stage, kExitAnalysisRefused when none does (the
// report is printed all the same). Throws Error for bad input: an unknown
// --rank, an unknown or repeated device, an empty --devices-list item, a
// device folder without op-amps.
int RunCompareCommand(const CompareCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_COMPARE_COMMAND_H_
