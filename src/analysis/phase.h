// Phase bookkeeping shared by the loop and response scans.
#ifndef HUSHGAIN_ANALYSIS_PHASE_H_
#define HUSHGAIN_ANALYSIS_PHASE_H_

#include "base/physical_constants.h"

namespace hushgain {

// Wraps an angle difference into (-pi, pi], for unwrapping a phase along a
// frequency scan whose steps turn it by less than pi.
inline double WrapPi(double radians) {
  while (radians > kPi) radians -= 2 * kPi;
  while (radians <= -kPi) radians += 2 * kPi;
  return radians;
}

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_PHASE_H_
