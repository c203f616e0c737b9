// `hushgain tia snr STAGE.json --power-range 1n..1m`: the signal-to-noise
// ratio of a photodiode stage over its band against incident optical power,
// the noise-equivalent power and where the stage saturates
// (design/tia_snr.h); --plot draws SNR against power, log-log.
#ifndef HUSHGAIN_CLI_TIA_SNR_COMMAND_H_
#define HUSHGAIN_CLI_TIA_SNR_COMMAND_H_

#include <string>

namespace hushgain {

struct TiaSnrCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;       // --device: replaces the stage's op-amp when set
  std::string power_range;  // "LOW..HIGH", optical powers: "1n..1m"
  int points = 31;
  std::string format = "text";  // text, json, markdown or csv
  bool json = false;            // the same as --format json
  bool csv = false;             // the same as --format csv
  std::string plot_path;        // .png, .svg or .pdf; empty = none
};

// Prints the report on stdout; returns an exit code (cli/exit_codes.h).
// Throws Error for bad input.
int RunTiaSnrCommand(const TiaSnrCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_TIA_SNR_COMMAND_H_
