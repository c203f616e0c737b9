// Running gnuplot on a script we wrote, with a real exit status (no shell,
// no pipe that dies of SIGPIPE): the script goes to a temporary file, and
// gnuplot is started directly on it with stdout discarded and stderr
// captured.
#ifndef HUSHGAIN_REPORT_RUN_GNUPLOT_H_
#define HUSHGAIN_REPORT_RUN_GNUPLOT_H_

#include <string>

namespace hushgain {

// The Debian package that provides gnuplot without a display.
inline constexpr const char* kGnuplotPackage = "gnuplot-nox";

// The full path of an executable "gnuplot" on PATH, or "" when there is
// none.
std::string FindGnuplot();

struct GnuplotRun {
  bool ok = false;
  std::string message;      // why it failed: exit status and gnuplot's words
  std::string stderr_text;  // everything gnuplot wrote on stderr
};

// Runs `gnuplot_path` on `script`. Fails when the script cannot be written
// to the temporary folder ($TMPDIR or /tmp), gnuplot cannot start, or
// gnuplot exits non-zero or on a signal. Never throws.
GnuplotRun RunGnuplot(const std::string& gnuplot_path,
                      const std::string& script);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_RUN_GNUPLOT_H_
