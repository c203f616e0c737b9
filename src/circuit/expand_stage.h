// Stage -> Netlist, by topology. Adding a topology means adding a template
// file and a case here; the solver never changes.
#ifndef HUSHGAIN_CIRCUIT_EXPAND_STAGE_H_
#define HUSHGAIN_CIRCUIT_EXPAND_STAGE_H_

#include "circuit/netlist.h"
#include "circuit/stage.h"

namespace hushgain {

Netlist ExpandStage(const Stage& stage);

// The R_plus value that cancels the bias-current error for this topology.
double BalanceResistorOhm(const Stage& stage);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_EXPAND_STAGE_H_
