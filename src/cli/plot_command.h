// `hushgain plot STAGE.json -o out.png|out.svg`: the plot sheet of a stage
// (report/plot_script.h) drawn by gnuplot. The picture is written to a
// temporary name beside the target and renamed, so a failed run leaves no
// partial file.
#ifndef HUSHGAIN_CLI_PLOT_COMMAND_H_
#define HUSHGAIN_CLI_PLOT_COMMAND_H_

#include <string>

#include "base/status.h"
#include "budget/budget.h"
#include "circuit/stage.h"
#include "report/plot_script.h"

namespace hushgain {

struct PlotCommandOptions {
  std::string stage_path;
  std::string devices_dir;
  std::string device;  // --device: replaces the stage's op-amp when set
  // Required; the extension picks the format: .png (pngcairo) or .svg.
  std::string output_path;
  // "" for the whole sheet, or one of spectrum, cumulative, gain.
  std::string only;
  // When set, the gnuplot script is also saved here (drawing straight to
  // output_path), for a designer to edit and run with `gnuplot FILE`.
  std::string script_path;
};

// Points per decade of the plot grid (band edges on the grid).
inline constexpr double kPlotPointsPerDecade = 50;

// The plot sheet's data for a budgeted stage: samples on a log grid from
// below the band to above it (band edges on the grid), and the cumulative
// rms over the band. `status` says when a frequency could not be solved.
struct SheetData {
  Status status = Status::Ok();
  PlotData data;
};
SheetData SampleSheet(const Stage& stage, const Budget& budget);

// Returns an exit code (cli/exit_codes.h): kExitToolFailed when gnuplot is
// missing (the message names the package gnuplot-nox) or fails. Throws
// Error for bad input, naming the option or the file.
int RunPlotCommand(const PlotCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_PLOT_COMMAND_H_
