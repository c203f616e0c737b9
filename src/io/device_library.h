// Device files: op-amp classes and resistor technologies, one JSON file each.
// The shipped files are generic classes with class-typical values (never a
// real part's data) and say so in an "illustrative" line; a user's own part
// (a datasheet copy) needs no such line and may name its "source".
//   devices/opamps/<name>.json      {"kind": "opamp", "class": ...,
//   "parameters": {...}} devices/resistors/<name>.json   {"kind":
//   "resistor_technology", ...}
// A device's name is its file name without ".json".
#ifndef HUSHGAIN_IO_DEVICE_LIBRARY_H_
#define HUSHGAIN_IO_DEVICE_LIBRARY_H_

#include <functional>
#include <map>
#include <string>
#include <string_view>
#include <vector>

#include "circuit/opamp_model.h"
#include "circuit/resistor_technology.h"
#include "io/json_reader.h"

namespace hushgain {

// What a device file says about itself.
struct DeviceFileInfo {
  std::string path;          // the file it was read from
  std::string illustrative;  // a shipped class's label; empty: a user's part
  std::string source;        // free text: where the numbers came from
};

struct DeviceLibrary {
  std::map<std::string, OpAmpModel> opamps;
  std::map<std::string, ResistorTechnology> resistors;
  std::map<std::string, DeviceFileInfo> opamp_files;  // by device name
  std::map<std::string, DeviceFileInfo> resistor_files;

  std::vector<std::string> OpAmpNames() const;
  std::vector<std::string> ResistorNames() const;
};

// Parses one op-amp device file; fills `info` when given.
OpAmpModel ParseOpAmpDevice(std::string_view json_text,
                            const std::string& source,
                            DeviceFileInfo* info = nullptr);

// Parses one resistor technology file; fills `info` when given.
ResistorTechnology ParseResistorTechnology(std::string_view json_text,
                                           const std::string& source,
                                           DeviceFileInfo* info = nullptr);

// Every key a device's "parameters" (or a stage's "set") may hold, in the
// order the README documents them.
std::vector<std::string> OpAmpParameterKeys();

// Applies the parameter keys of `reader` (a device's "parameters" or a
// stage's "set") on top of `model`, checking each value's rule (positive
// GBW and A0, non-negative densities, ...). Unknown keys are errors.
void ApplyOpAmpParameters(ObjectReader& reader, OpAmpModel* model);

// Throws unless `reader` gives every parameter an op-amp cannot do without
// (voltage_noise, current_noise, open_loop_gain, gbw).
void RequireCoreOpAmpParameters(ObjectReader& reader);

// The op-amp a command-line or stage "device" names: a name in `library`,
// or a path to a device file (it holds a "/" or ends in ".json"), read
// through `read_file`. Throws Error(source, path, ...) with a "did you mean"
// for an unknown name.
OpAmpModel FindOpAmp(
    const DeviceLibrary& library, const std::string& device,
    const std::string& source, const std::string& path,
    const std::function<std::string(const std::string&)>& read_file);

// Reads every device file under `directory` (opamps/ and resistors/).
// Throws Error naming the file on a bad one, or when the folder is missing.
DeviceLibrary LoadDeviceLibrary(const std::string& directory);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_DEVICE_LIBRARY_H_
