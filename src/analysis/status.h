// Numerical trouble returned as data from the computing core: a singular
// network, a solve that lost its accuracy, an integral that did not
// converge. The message names the frequency and, where known, the node.
#ifndef HUSHGAIN_ANALYSIS_STATUS_H_
#define HUSHGAIN_ANALYSIS_STATUS_H_

#include <string>

namespace hushgain {

struct Status {
  bool ok = true;
  std::string message;  // empty when ok

  static Status Ok() { return {}; }
  static Status Fail(std::string why) { return {false, std::move(why)}; }
};

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_STATUS_H_
