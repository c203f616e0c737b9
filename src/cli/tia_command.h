// `hushgain tia suggest STAGE.json --bandwidth 50k`: feedback resistor and
// capacitor proposals for a photodiode stage and a bandwidth target.
#ifndef HUSHGAIN_CLI_TIA_COMMAND_H_
#define HUSHGAIN_CLI_TIA_COMMAND_H_

#include <string>

namespace hushgain {

struct TiaSuggestCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;          // --device: replaces the stage's op-amp when set
  std::string bandwidth = "";  // a frequency with prefix: "50k"
  std::string series = "E24";  // IEC 60063 series of the candidate R_f
  std::string min = "1k";      // candidate range
  std::string max = "10G";
  int rows = 6;
  std::string background;       // photocurrent "400n"; empty: the stage's own
  std::string full_scale;       // volts "4"; empty: the stage's own (or none)
  std::string cap_series;       // IEC 60063 series of C_f parts; empty: any C_f
  std::string format = "text";  // text, json, markdown or csv
  bool json = false;            // the same as --format json
  bool csv = false;             // the same as --format csv
};

// Prints the table (or JSON) on stdout; returns an exit code
// (cli/exit_codes.h). Throws Error for bad input.
int RunTiaSuggestCommand(const TiaSuggestCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_TIA_COMMAND_H_
