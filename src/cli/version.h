// The version line of `hushgain --version`: the CMake project version, and
// the git revision the binary was built from when the source was a git
// checkout ("hushgain 0.1.0 (git 1a2b3c4)", "-dirty" when it had local
// changes); a build from a release tarball prints the version alone.
#ifndef HUSHGAIN_CLI_VERSION_H_
#define HUSHGAIN_CLI_VERSION_H_

#include <string>

namespace hushgain {

std::string VersionLine();

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_VERSION_H_
