#include "cli/devices_command.h"

#include <vector>

#include "cli/exit_codes.h"
#include "cli/output_format.h"
#include "cli/text_output.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/suggest.h"
#include "report/device_report.h"

namespace hushgain {

int RunDevicesCommand(const DevicesCommandOptions& options) {
  const std::string format =
      ResolveOutputFormat(options.format, options.json, false);
  const DeviceLibrary library = LoadDeviceLibrary(options.devices_dir);
  if (options.name.empty()) {
    WriteReport(DeviceListReport(library, format), format);
    return kExitOk;
  }
  if (!library.opamps.count(options.name) &&
      !library.resistors.count(options.name)) {
    std::vector<std::string> names = library.OpAmpNames();
    for (const std::string& r : library.ResistorNames()) names.push_back(r);
    throw Error("command line", "",
                "devices: no device \"" + options.name + "\" in " +
                    options.devices_dir + DidYouMean(options.name, names));
  }
  WriteReport(DeviceDetailReport(library, options.name, format), format);
  return kExitOk;
}

}  // namespace hushgain
