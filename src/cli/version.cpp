#include "cli/version.h"

// Written by cmake/version.cmake at every build (rewritten only when the
// revision changes, so only this file recompiles): defines
// HUSHGAIN_VERSION_STRING and HUSHGAIN_GIT_REVISION ("" outside git).
#include "hushgain_version.h"

namespace hushgain {

std::string VersionLine() {
  std::string line = std::string("hushgain ") + HUSHGAIN_VERSION_STRING;
  const std::string revision = HUSHGAIN_GIT_REVISION;
  if (!revision.empty()) line += " (git " + revision + ")";
  return line;
}

}  // namespace hushgain
