// `hushgain tee sweep STAGE.json` and `hushgain tee search STAGE.json`:
// trading noise for resistor size in a T network, and proposing standard-
// value networks for a gain (README, "T-network design").
#ifndef HUSHGAIN_CLI_TEE_COMMAND_H_
#define HUSHGAIN_CLI_TEE_COMMAND_H_

#include <string>

namespace hushgain {

// Values are the command line's text, parsed (with their units) here so
// that every message names the option.
struct TeeSweepCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;  // --device: replaces the stage's op-amp when set
  std::string min;     // smallest "largest resistor"; empty: Req / 1000
  int points = 13;
  std::string ratio;  // R1/R2: a number, "stage", or empty (the default rule)
  // text (default), json, markdown or csv; --csv and --json are synonyms
  // (cli/output_format.h).
  std::string format = "text";
  bool csv = false;
  bool json = false;
  double tolerance = 1e-4;  // relative, on the total output noise power
  // When set, also draw the sweep (report/tee_plot_script.h) to this .png
  // or .svg file, written to a temporary name and renamed.
  std::string plot_path;
};

struct TeeSearchCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;  // --device: replaces the stage's op-amp when set
  std::string series = "E96";
  std::string min;  // empty: max / 1000
  std::string max;
  std::string gain;  // empty: the stage's own
  std::string gain_tolerance = "1%";
  bool free_input = false;
  std::string input_min;  // empty: the same as min
  std::string input_max;  // empty: the same as max
  // input-noise, noise (output), offset, weighted
  std::string rank = "input-noise";
  double offset_weight = 0.5;
  int top = 10;
  int threads = 0;              // 0: one per core
  std::string format = "text";  // as for the sweep
  bool csv = false;
  bool json = false;
  double tolerance = 1e-4;
  // When set, also draw the ranked networks (report/tee_plot_script.h).
  std::string plot_path;
};

// Print on stdout and return an exit code (cli/exit_codes.h): 0, or 1 when
// the analysis is refused or a search finds no network in tolerance, or 130
// when Ctrl-C stopped a search (the best found so far is printed and
// plotted), or 3 when --plot is given and gnuplot is missing (checked
// before any work; the message names gnuplot-nox) or fails.
// Throw Error for bad input (the caller prints it; exit code 2).
int RunTeeSweepCommand(const TeeSweepCommandOptions& options);
int RunTeeSearchCommand(const TeeSearchCommandOptions& options);

// The names of the tee subcommands, for "did you mean".
inline const char* const kTeeSubcommands[] = {"sweep", "search"};

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_TEE_COMMAND_H_
