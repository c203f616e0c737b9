// The parts every inverting-family template shares: the feedback path (one
// resistor or a T network, with an optional capacitor across it) and the
// op-amp with its + input resistor and output load.
#ifndef HUSHGAIN_CIRCUIT_FEEDBACK_NETWORK_H_
#define HUSHGAIN_CIRCUIT_FEEDBACK_NETWORK_H_

#include "circuit/netlist.h"
#include "circuit/stage.h"

namespace hushgain {

// The feedback path's transresistance: R_f, or R1 + R2 + R1 R2 / R3 for a
// T network (star-mesh transform; Kennelly 1899); with C3 in series with R3
// that is its value well above 1/(2 pi R3 C3).
double FeedbackEquivalentOhm(const Feedback& feedback);

// The feedback path's DC transresistance: FeedbackEquivalentOhm, or R1 + R2
// when C3 opens the shunt arm at DC.
double FeedbackDcTransresistanceOhm(const Feedback& feedback);

// The DC resistance of the feedback path seen from the - input with the
// output at AC ground: R_f, or R1 + R2 || R3 (R1 + R2 with C3).
double FeedbackDcOhm(const Feedback& feedback);

// Adds R_f (or R1, R2, R3 and the tee node, and C3 below R3) and C_f
// between `summing` and `output`.
void AddFeedback(const Feedback& feedback, NodeId summing, NodeId output,
                 Netlist* net);

// Adds R_plus (none, a value, or `balance_ohm` for "auto") with its bypass
// capacitor C_plus when the stage sets one, the load and
// the op-amp with its - input at `summing` and its output at `output`.
void AddOpAmpWithLoad(const Stage& stage, NodeId summing, NodeId output,
                      double balance_ohm, Netlist* net);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_FEEDBACK_NETWORK_H_
