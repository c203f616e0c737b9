// The transimpedance (photodiode) template: the photodiode's junction
// (photocurrent I_ph and dark current I_dark with their shot noise,
// capacitance C_d, shunt resistance R_sh) between its junction node and its
// bias node, its series resistance R_s from the junction node to the summing
// node (- input); feedback R_f or a T network with C_f to the output;
// optional R_plus and load as for the inverting stage. The bias node is
// ground, or behind the noisy bias supply V_bias when a reverse bias with a
// bias noise is given. The dark current flows only under reverse bias.
//
//   bias --+-- I_ph, I_dark, C_d, R_sh --+-- R_s --+-- (-) op-amp out --+-- out
//                                                   +---- feedback -------+
#ifndef HUSHGAIN_CIRCUIT_TRANSIMPEDANCE_TOPOLOGY_H_
#define HUSHGAIN_CIRCUIT_TRANSIMPEDANCE_TOPOLOGY_H_

#include "circuit/netlist.h"
#include "circuit/stage.h"

namespace hushgain {

// The DC resistance seen from the - input: (R_s + R_sh) || (R_f, or
// R1 + R2 || R3).
double TransimpedanceBalanceOhm(const Stage& stage);

// True when the diode is reverse biased, so its dark current flows.
bool DarkCurrentFlows(const Photodiode& photodiode);

// Builds the netlist; the signal is a unit current into the junction node
// (the summing node when R_s = 0), drawn from the bias node, so
// the signal gain is the transimpedance in V/A (negative).
Netlist ExpandTransimpedance(const Stage& stage);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_TRANSIMPEDANCE_TOPOLOGY_H_
