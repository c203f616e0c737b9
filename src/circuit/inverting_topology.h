// The inverting stage template: source (with its resistance) -> [C_input]
// -> R_in -> summing node (- input); feedback from the summing node to the
// output as one resistor R_f or a T network R1 (summing node to tee), R2
// (tee to output), R3 (tee to ground, through C3 when given), an optional
// capacitor C_f across the whole feedback path; an optional R_plus from the +
// input to ground; an optional load R_load at the output.
//
//   Vs --R_source--+--R_in--+-- (-) op-amp out --+-- output
//                           |                    |
//                           +---- feedback ------+
//
// A capacitive sensor replaces the source: its open-circuit voltage Vs
// behind its capacitance C_s, the leakage R_leak across its terminals (the
// sensor node to ground), then R_in when given, else the sensor node is the
// summing node itself (a charge amplifier: the sensor's charge flows into
// C_f, V_out = -Q / C_f in the passband).
//
//   Vs --C_s--+-- [R_in] --+-- (-) op-amp out --+-- output
//             |            +---- feedback ------+
//           R_leak
//             |
//            gnd
#ifndef HUSHGAIN_CIRCUIT_INVERTING_TOPOLOGY_H_
#define HUSHGAIN_CIRCUIT_INVERTING_TOPOLOGY_H_

#include "circuit/feedback_network.h"
#include "circuit/netlist.h"
#include "circuit/stage.h"

namespace hushgain {

// The DC resistance seen from the - input with the op-amp output and the
// source at AC ground: (R_source + R_in) || (R_f, or R1 + R2 || R3, or R1 +
// R2 with C3). For a capacitive sensor the input's DC path is R_in + R_leak
// (none without a leakage resistance: C_s blocks DC); none with an input
// capacitor. Bias currents cancel when R_plus
// equals it.
double InvertingBalanceOhm(const Stage& stage);

// Builds the netlist. Element values are taken as given; io has validated
// them (positive, finite).
Netlist ExpandInverting(const Stage& stage);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_INVERTING_TOPOLOGY_H_
