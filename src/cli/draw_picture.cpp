#include "cli/draw_picture.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cctype>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <iostream>

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
    const std::string& gnuplot, const std::string& target,
    const std::function<std::string(const std::string&)>& script_for) {
  // gnuplot writes a temporary file beside the target, created here first
  // so an unwritable place is reported as such; it is renamed when whole.
  const std::string temporary = target + ".tmp-" + std::to_string(::getpid());
  const int fd = ::open(temporary.c_str(), O_WRONLY | O_CREAT | O_EXCL, 0644);
  if (fd < 0)
    throw Error(target, "",
                std::string("cannot write: ") + std::strerror(errno));
  ::close(fd);

  const GnuplotRun run = RunGnuplot(gnuplot, script_for(temporary));
  struct stat st;
  if (!run.ok || ::stat(temporary.c_str(), &st) != 0 || st.st_size == 0) {
    std::remove(temporary.c_str());
    return ReportToolFailure(target,
                             run.ok ? "gnuplot wrote no picture" : run.message);
  }
  if (std::rename(temporary.c_str(), target.c_str()) != 0) {
    const std::string why = std::strerror(errno);
    std::remove(temporary.c_str());
    throw Error(target, "", "cannot write: " + why);
  }
  return kExitOk;
}

}  // namespace hushgain
