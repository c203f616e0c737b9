// `hushgain spread STAGE.json --samples N --seed S`: the Monte Carlo of a
// stage over resistor tolerances, op-amp offsets and temperature
// (montecarlo/spread.h), with yields against limits, the samples as CSV and,
// with --plot, the histograms as a picture (report/spread_plot_script.h).
#ifndef HUSHGAIN_CLI_SPREAD_COMMAND_H_
#define HUSHGAIN_CLI_SPREAD_COMMAND_H_

#include <cstdint>
#include <string>

namespace hushgain {

struct SpreadCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;    // --device: replaces the stage's op-amp when set
  long samples = 10000;  // at least 1
  std::uint64_t seed = 1;
  int threads = 0;       // 0 = every hardware thread
  std::string csv_path;  // every sample as CSV; empty = no CSV
  // The summary on stdout: text, json, markdown or csv (--csv FILE is the
  // per-sample file, not this).
  std::string format = "text";
  bool json = false;      // the same as --format json
  std::string plot_path;  // .png, .svg or .pdf histograms; empty = no picture
  // Limits as typed ("0.5%", "5m", "100u"); empty = none.
  std::string gain_error_limit;
  std::string offset_limit;
  std::string noise_limit;
};

// Prints the summary on stdout; a progress bar on stderr when it is a
// terminal. Returns an exit code (cli/exit_codes.h); 130 when interrupted
// by SIGINT (nothing written); kExitToolFailed when --plot is given and
// gnuplot is missing (checked before the run) or fails. Throws Error for
// bad input.
int RunSpreadCommand(const SpreadCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_SPREAD_COMMAND_H_
