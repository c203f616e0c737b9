// Device files: generic op-amp classes and resistor technologies with
// class-typical values (never a real part's data), one JSON file each:
//   devices/opamps/<name>.json      {"kind": "opamp", "class": ...,
//   "parameters": {...}} devices/resistors/<name>.json   {"kind":
//   "resistor_technology", ...}
// A device's name is its file name without ".json".
#ifndef HUSHGAIN_IO_DEVICE_LIBRARY_H_
#define HUSHGAIN_IO_DEVICE_LIBRARY_H_

#include <map>
#include <string>
#include <string_view>
#include <vector>

#include "circuit/opamp_model.h"
#include "circuit/resistor_technology.h"
#include "io/json_reader.h"

namespace hushgain {

struct DeviceLibrary {
  std::map<std::string, OpAmpModel> opamps;
  std::map<std::string, ResistorTechnology> resistors;

  std::vector<std::string> OpAmpNames() const;
  std::vector<std::string> ResistorNames() const;
};

// Parses one op-amp device file.
OpAmpModel ParseOpAmpDevice(std::string_view json_text,
                            const std::string& source);

// Parses one resistor technology file.
ResistorTechnology ParseResistorTechnology(std::string_view json_text,
                                           const std::string& source);

// Applies the parameter keys of `reader` (a device's "parameters" or a
// stage's "set") on top of `model`, checking each value's rule (positive
// GBW and A0, non-negative densities, ...). Unknown keys are errors.
void ApplyOpAmpParameters(ObjectReader& reader, OpAmpModel* model);

// Throws unless `reader` gives every parameter an op-amp cannot do without
// (voltage_noise, current_noise, open_loop_gain, gbw).
void RequireCoreOpAmpParameters(ObjectReader& reader);

// Reads every device file under `directory` (opamps/ and resistors/).
// Throws Error naming the file on a bad one, or when the folder is missing.
DeviceLibrary LoadDeviceLibrary(const std::string& directory);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_DEVICE_LIBRARY_H_
