#include "cli/draw_picture.h"

#include <cctype>

#include "cli/diagnostics.h"
#include "cli/exit_codes.h"
#include "io/error.h"
#include "report/run_gnuplot.h"

namespace hushgain {
namespace {

bool EndsWith(const std::string& s, const std::string& suffix) {
  if (s.size() < suffix.size()) return false;
  for (std::size_t i = 0; i < suffix.size(); ++i)
    if (std::tolower(static_cast<unsigned char>(
            s[s.size() - suffix.size() + i])) != suffix[i])
      return false;
  return true;
}

}  // namespace

PlotFormat PictureFormat(const std::string& option, const std::string& path) {
  if (EndsWith(path, ".png")) return PlotFormat::kPng;
  if (EndsWith(path, ".svg")) return PlotFormat::kSvg;
  if (EndsWith(path, ".pdf")) return PlotFormat::kPdf;
  throw Error("command line", "",
              option +
                  ": expected a file name ending in .png, .svg or .pdf, "
                  "got \"" +
                  path + "\"");
}

std::string GnuplotOrExplain(const std::string& who) {
  std::string gnuplot = FindGnuplot();
  if (gnuplot.empty())
    ReportToolFailure({}, who +
                              " needs gnuplot, which is not on PATH; "
                              "install the Debian package " +
                              kGnuplotPackage + " (apt-get install " +
                              kGnuplotPackage + ")");
  return gnuplot;
}

int DrawPicture(
    const std::string& gnuplot, OutputFiles& outputs, OutputFiles::Id id,
    const std::function<std::string(const std::string&)>& script_for,
    const std::atomic<bool>* stop) {
  const std::string temporary = outputs.PictureTemporary(id);
  if (temporary.empty()) return kExitSystem;
  const GnuplotRun run = RunGnuplot(gnuplot, script_for(temporary));
  if (stop != nullptr && stop->load()) {
    outputs.Discard();
    return kExitInterrupted;
  }
  if (!run.ok) {
    outputs.Discard();
    return ReportToolFailure(outputs.Path(id), run.message);
  }
  return kExitOk;
}

}  // namespace hushgain
