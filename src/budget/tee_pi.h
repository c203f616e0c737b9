// The T network explained: its pi (star-mesh) equivalent
// (circuit/tee_equivalents.h) and the currents in the pi's arms, read from
// the engine's solution of the stage as built.
//
// With S = R1 R2 + R2 R3 + R3 R1 the pi has a bridge S/R3 = Req from the
// summing node to the output, an input arm S/R2 from the summing node to
// ground and an output arm S/R1 from the output to ground. The pi is exact
// at its three terminals, so its arm currents follow from the node voltages
// v_n (summing node) and v_o (output) of the signal's solution:
//   I_bridge = (v_n - v_o) / Req,  I_in = v_n / (S/R2),  I_out = v_o / (S/R1)
// and the input arm's share of the bridge current is
//   |I_in| / |I_bridge| = (R2/R3) |v_n| / |v_n - v_o|,
// which for an op-amp of open-loop gain A(f) with no output resistance is
// (R2/R3) / |1 + A(f)|: tiny at DC, growing toward the crossover. To e_n
// and Vos the input arm is a second resistor from the summing node to
// ground, so the DC noise gain 1 + Req/R_a + R2/R3 carries the term
// Req / (S/R2) = R2/R3 beyond the plain resistor's 1 + Req/R_a.
// With C3 in series with R3 the same holds with Z3 = R3 + 1/(j w C3) in
// place of R3: the arms are the T's well above 1/(2 pi R3 C3), and the
// input arm's share is |R2/Z3| |v_n| / |v_n - v_o|, 0 at DC (no input arm:
// the DC noise gain is 1 + (R1 + R2)/R_a).
#ifndef HUSHGAIN_BUDGET_TEE_PI_H_
#define HUSHGAIN_BUDGET_TEE_PI_H_

#include "analysis/mna_system.h"
#include "base/status.h"
#include "budget/budget.h"
#include "circuit/netlist.h"
#include "circuit/stage.h"

namespace hushgain {

// Fills budget->tee_pi for a T-network stage (nothing otherwise):
// the arms, the noise-equivalent resistance, the input arm's current
// fraction at DC, the reference and the band's upper edge (direct solves of
// the signal), and with a full-scale swing the output arm's current and its
// share of the op-amp's output current (budget->full_scale_output_current_a
// must be filled first). Fails when a solve fails.
Status TeePiFigures(const Stage& stage, const Netlist& net,
                    const MnaSystem& system, Port signal, Budget* budget);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_TEE_PI_H_
