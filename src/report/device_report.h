// The `devices` report: what the device folder holds, and one device in
// full, so a user sees what a name means before budgeting with it.
//   list    one table of op-amps (class, e_n at 1 kHz, e_n corner, i_n at
//           1 kHz, GBW, Vos, Ib, illustrative or user) and one of resistor
//           technologies (noise index, tempco, tolerance)
//   detail  every parameter of one op-amp or resistor technology, its file,
//           its label or source, and the points of its noise tables
// Formats: text, markdown, csv (the op-amp table, or the detail as
// key/value records, SI units) and json (SI units).
#ifndef HUSHGAIN_REPORT_DEVICE_REPORT_H_
#define HUSHGAIN_REPORT_DEVICE_REPORT_H_

#include <string>

#include "io/device_library.h"
#include "report/table.h"

namespace hushgain {

// The frequency at which the list quotes e_n and i_n (a datasheet's usual
// spot frequency: common practice, no source).
inline constexpr double kDeviceSpotHz = 1e3;

// One op-amp's parameters, one row each (parameter, value with its unit),
// as `devices NAME` and the design note show them.
Table OpAmpParameterTable(const OpAmpModel& model);

std::string DeviceListReport(const DeviceLibrary& library,
                             const std::string& format);

// `name` must be in the library (an op-amp or a resistor technology).
std::string DeviceDetailReport(const DeviceLibrary& library,
                               const std::string& name,
                               const std::string& format);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_DEVICE_REPORT_H_
