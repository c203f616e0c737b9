// Where the device folder is. An installed hushgain finds its devices beside
// itself; an uninstalled build finds the source tree's; a user can point
// anywhere. The first rule that applies wins:
//   1. --devices DIR (before or after the subcommand)
//   2. the environment variable HUSHGAIN_DEVICES
//   3. <program folder>/../share/hushgain/devices (an installed tree,
//      wherever its prefix was moved)
//   4. the folder named in <program folder>/hushgain-source-devices, a
//      one-line file the build writes beside the uninstalled binary (never
//      installed, so no path of the build machine travels with a package)
// A folder named by rule 1 or 2 must exist; rules 3 and 4 are looked at in
// turn and the error names every place looked at.
#ifndef HUSHGAIN_CLI_DEVICE_FOLDER_H_
#define HUSHGAIN_CLI_DEVICE_FOLDER_H_

#include <optional>
#include <string>

namespace hushgain {

// The name of the file the build writes beside the uninstalled binary.
inline constexpr char kSourceDevicesFile[] = "hushgain-source-devices";

struct DeviceFolderInputs {
  std::optional<std::string> option;       // --devices
  std::optional<std::string> environment;  // $HUSHGAIN_DEVICES
  std::string program_folder;              // folder of the running binary
};

// The device folder by the rules above. Throws hushgain::Error when none is
// found: "NAME: device folder not found (given by --devices)", or, when
// nothing was given, one line naming each folder looked at.
std::string LocateDeviceFolder(const DeviceFolderInputs& inputs);

// The folder of the running binary (/proc/self/exe; `argv0` when that cannot
// be read); empty when neither tells.
std::string ProgramFolder(const char* argv0);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_DEVICE_FOLDER_H_
