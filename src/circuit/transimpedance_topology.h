// The transimpedance (photodiode) template: the photocurrent flows into the
// summing node (- input), where the photodiode's junction capacitance C_d and
// shunt resistance R_sh also sit (to ground), with its dark current's shot
// noise; feedback R_f or a T network with C_f to the output; optional R_plus
// and load as for the inverting stage.
//
//   I_ph, C_d, R_sh --+-- (-) op-amp out --+-- output
//                     +---- feedback ------+
#ifndef HUSHGAIN_CIRCUIT_TRANSIMPEDANCE_TOPOLOGY_H_
#define HUSHGAIN_CIRCUIT_TRANSIMPEDANCE_TOPOLOGY_H_

#include "circuit/netlist.h"
#include "circuit/stage.h"

namespace hushgain {

// The DC resistance seen from the - input: R_sh || (R_f, or R1 + R2 || R3).
double TransimpedanceBalanceOhm(const Stage& stage);

// Builds the netlist; the signal is a unit current into the summing node, so
// the signal gain is the transimpedance in V/A (negative).
Netlist ExpandTransimpedance(const Stage& stage);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_TRANSIMPEDANCE_TOPOLOGY_H_
