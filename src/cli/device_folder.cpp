#include "cli/device_folder.h"

#include <filesystem>
#include <fstream>
#include <string>
#include <system_error>

#include "io/error.h"

// The installed device folder relative to the binary's folder; the build
// computes it from the install directories (cmake/install.cmake).
#ifndef HUSHGAIN_DEVICES_FROM_PROGRAM
#define HUSHGAIN_DEVICES_FROM_PROGRAM "../share/hushgain/devices"
#endif

namespace hushgain {
namespace {

namespace fs = std::filesystem;

bool IsFolder(const std::string& path) {
  std::error_code ec;
  return !path.empty() && fs::is_directory(path, ec);
}

// The first line of `file`, empty when it cannot be read.
std::string FirstLine(const fs::path& file) {
  std::ifstream in(file);
  std::string line;
  if (!in || !std::getline(in, line)) return "";
  if (!line.empty() && line.back() == '\r') line.pop_back();
  return line;
}

}  // namespace

std::string LocateDeviceFolder(const DeviceFolderInputs& inputs) {
  if (inputs.option) {
    if (!IsFolder(*inputs.option))
      throw Error(*inputs.option, "",
                  "device folder not found (given by --devices)");
    return *inputs.option;
  }
  if (inputs.environment && !inputs.environment->empty()) {
    if (!IsFolder(*inputs.environment))
      throw Error(*inputs.environment, "",
                  "device folder not found (given by HUSHGAIN_DEVICES)");
    return *inputs.environment;
  }
  std::string looked;
  if (!inputs.program_folder.empty()) {
    const fs::path program(inputs.program_folder);
    const std::string installed =
        (program / HUSHGAIN_DEVICES_FROM_PROGRAM).lexically_normal().string();
    if (IsFolder(installed)) return installed;
    looked = installed + " (beside the program)";
    const fs::path marker = program / kSourceDevicesFile;
    const std::string source = FirstLine(marker);
    if (!source.empty()) {
      if (IsFolder(source)) return source;
      looked +=
          ", " + source + " (the source tree named in " + marker.string() + ")";
    }
  }
  if (looked.empty()) looked = "nowhere (the program's folder is unknown)";
  throw Error("command line", "",
              "device folder not found; looked in " + looked +
                  "; give --devices DIR or set HUSHGAIN_DEVICES");
}

std::string ProgramFolder(const char* argv0) {
  std::error_code ec;
  fs::path exe = fs::read_symlink("/proc/self/exe", ec);
  if (ec || exe.empty()) {
    if (argv0 == nullptr || std::string(argv0).find('/') == std::string::npos)
      return "";
    exe = fs::absolute(argv0, ec);
    if (ec) return "";
  }
  return exe.parent_path().string();
}

}  // namespace hushgain
