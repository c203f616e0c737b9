// `hushgain devices [NAME]`: the device folder's op-amps and resistor
// technologies with their key figures, or one device in full
// (report/device_report.h).
#ifndef HUSHGAIN_CLI_DEVICES_COMMAND_H_
#define HUSHGAIN_CLI_DEVICES_COMMAND_H_

#include <string>

namespace hushgain {

struct DevicesCommandOptions {
  std::string devices_dir;
  std::string name;  // empty: the list
  std::string format = "text";
  bool json = false;
};

// Prints on stdout; returns an exit code. Throws Error for an unknown name
// (with "did you mean") or format.
int RunDevicesCommand(const DevicesCommandOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CLI_DEVICES_COMMAND_H_
