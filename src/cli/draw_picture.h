// Drawing a picture with gnuplot for the commands that plot (plot, tee
// sweep --plot, tee search --plot, tia snr --plot, spread --plot, note):
// the format from the file name, gnuplot found on PATH, the script run on
// the output's temporary (cli/output_files.h), which the command's
// OutputFiles::Commit() checks for its end and renames into place, so a
// failed or interrupted run leaves no partial file and never harms an
// older one.
#ifndef HUSHGAIN_CLI_DRAW_PICTURE_H_
#define HUSHGAIN_CLI_DRAW_PICTURE_H_

#include <atomic>
#include <functional>
#include <string>

#include "cli/output_files.h"
#include "report/plot_script.h"

namespace hushgain {

// PNG for ".png", SVG for ".svg", PDF for ".pdf" (any case). Throws Error
// naming `option` otherwise: "-o: expected a file name ending in .png, .svg or
// .pdf, got "x"".
PlotFormat PictureFormat(const std::string& option, const std::string& path);

// The path of gnuplot, or "" after printing on stderr
// "error: <who> needs gnuplot, which is not on PATH; install the Debian
// package gnuplot-nox (apt-get install gnuplot-nox)"; the caller then
// returns kExitToolFailed.
std::string GnuplotOrExplain(const std::string& who);

// Draws picture `id` of `outputs` from the script that
// `script_for(temporary_path)` returns (the script must draw to the path it
// is given). Returns kExitOk (the picture waits for outputs.Commit()), or,
// with every temporary removed, kExitToolFailed after "error: <target>:
// <why>" when gnuplot fails, kExitSystem when the temporary cannot be made,
// or kExitInterrupted, with nothing said, when `stop` was set meanwhile
// (Ctrl-C reaches gnuplot too).
int DrawPicture(
    const std::string& gnuplot, OutputFiles& outputs, OutputFiles::Id id,
    const std::function<std::string(const std::string&)>& script_for,
    const std::atomic<bool>* stop = nullptr);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_DRAW_PICTURE_H_
