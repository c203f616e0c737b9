// What a T network is equivalent to, in closed form (ideal resistors, any
// frequency: the network is resistive).
//
// Star-mesh (Y-delta) transform (Kennelly 1899): the T is a star of R1
// (centre to the summing node), R2 (centre to the output) and R3 (centre to
// ground). With S = R1 R2 + R2 R3 + R3 R1 its mesh (pi) equivalent has the
// arm opposite each star arm R_k equal to S / R_k:
//   bridge      S / R3 = R1 + R2 + R1 R2 / R3 = Req, summing node to output
//   input arm   S / R2, summing node to ground (at the virtual ground)
//   output arm  S / R1, output to ground (a load on the op-amp)
//
// Noise-equivalent resistance: the single resistor from the summing node
// whose thermal current noise 4kT / R_n, times the transresistance Req,
// gives the same output noise as the three resistors of the T (each one's
// output noise gain from REFERENCES.md section 6: R1 -> 1 + R2/R3, R2 -> 1,
// R3 -> R2/R3, at low frequency with the summing node at virtual ground):
//   R_n = Req^2 / (R1 (1 + R2/R3)^2 + R2 + R3 (R2/R3)^2).
// A 102 MOhm T network is as noisy as a resistor of about this value, often
// 100 times smaller; the same figure holds for a T in a photodiode stage.
#ifndef HUSHGAIN_CIRCUIT_TEE_EQUIVALENTS_H_
#define HUSHGAIN_CIRCUIT_TEE_EQUIVALENTS_H_

#include "circuit/stage.h"

namespace hushgain {

// The three arms of the pi equivalent, ohms.
struct PiEquivalent {
  double bridge_ohm = 0;      // S / R3, summing node to output (= Req)
  double input_arm_ohm = 0;   // S / R2, summing node to ground
  double output_arm_ohm = 0;  // S / R1, output to ground
};

// Requires R1, R2, R3 > 0 (as the stage parser does).
PiEquivalent StarMesh(const TeeNetwork& tee);

// R_n above, ohms. Requires R1, R2, R3 > 0.
double TeeNoiseEquivalentOhm(const TeeNetwork& tee);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_TEE_EQUIVALENTS_H_
