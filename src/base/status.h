// Numerical trouble returned as data from the computing core: a singular
// network, a solve that lost its accuracy, an integral that did not
// converge. The message names the frequency and, where known, the node.
#ifndef HUSHGAIN_BASE_STATUS_H_
#define HUSHGAIN_BASE_STATUS_H_

#include <cstdio>
#include <string>

namespace hushgain {

// A frequency for a status message: "1234.5 Hz" (6 significant digits).
inline std::string HzText(double f_hz) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.6g Hz", f_hz);
  return buf;
}

struct Status {
  bool ok = true;
  std::string message;  // empty when ok

  static Status Ok() { return {}; }
  static Status Fail(std::string why) { return {false, std::move(why)}; }
};

}  // namespace hushgain

#endif  // HUSHGAIN_BASE_STATUS_H_
