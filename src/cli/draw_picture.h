// Drawing a picture with gnuplot for the commands that plot (plot, tee
// sweep --plot, tee search --plot): the format from the file name, gnuplot
// found on PATH, the script run on a temporary name beside the target and
// the picture renamed into place when whole, so a failed or interrupted run
// leaves no partial file and never harms an older one.
#ifndef HUSHGAIN_CLI_DRAW_PICTURE_H_
#define HUSHGAIN_CLI_DRAW_PICTURE_H_

#include <functional>
#include <string>

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

// Writes `target` from the script that `script_for(temporary_path)` returns
// (the script must draw to the path it is given). Returns kExitOk, or
// kExitToolFailed after printing "error: <target>: <why>" when gnuplot
// fails or draws nothing. Throws Error when the target's folder cannot be
// written.
int DrawPicture(
    const std::string& gnuplot, const std::string& target,
    const std::function<std::string(const std::string&)>& script_for);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_DRAW_PICTURE_H_
