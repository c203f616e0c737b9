#include "circuit/stage.h"

#include <cmath>

namespace hushgain {

double ReferenceFrequencyHz(const Stage& stage) {
  if (stage.reference_hz) return *stage.reference_hz;
  return std::sqrt(stage.band_low_hz * stage.band_high_hz);
}

}  // namespace hushgain
