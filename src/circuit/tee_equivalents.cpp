#include "circuit/tee_equivalents.h"

namespace hushgain {

PiEquivalent StarMesh(const TeeNetwork& tee) {
  const double r1 = tee.r1_ohm, r2 = tee.r2_ohm, r3 = tee.r3_ohm;
  const double s = r1 * r2 + r2 * r3 + r3 * r1;
  return {s / r3, s / r2, s / r1};
}

double TeeNoiseEquivalentOhm(const TeeNetwork& tee) {
  const double r1 = tee.r1_ohm, r2 = tee.r2_ohm, r3 = tee.r3_ohm;
  const double req = StarMesh(tee).bridge_ohm;
  const double g1 = 1 + r2 / r3;  // R1's output noise gain
  const double g3 = r2 / r3;      // R3's
  return req * req / (r1 * g1 * g1 + r2 + r3 * g3 * g3);
}

}  // namespace hushgain
