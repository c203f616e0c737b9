// Output offset at DC from the op-amp's Vos, Ib and Ios:
//   Vout = Vos NG - Ib (H+ + H-) - (Ios/2) (H+ - H-)
// with Ib+ = Ib + Ios/2, Ib- = Ib - Ios/2 flowing into the pins, NG the DC
// noise gain (Vos -> output) and H+- the DC transfer (V/A) of a unit current
// injected into the + and - pin nodes. Vos and Ios have unknown sign, so
// their terms are magnitudes; the worst case adds all three magnitudes.
#ifndef HUSHGAIN_BUDGET_OFFSET_H_
#define HUSHGAIN_BUDGET_OFFSET_H_

#include "budget/budget.h"
#include "circuit/opamp_model.h"

namespace hushgain {

// H+ + H-, the transfer of the bias current. With R_plus at the balance
// value H+ = -H- up to rounding; a residue below 1e-9 of the terms is that
// rounding, not an offset, and is returned as 0.
double BiasCurrentTransfer(double h_plus_ohm, double h_minus_ohm);

// The signed offset of one op-amp whose Vos, Ib and Ios are known with
// their signs (a Monte Carlo draw):
//   Vos NG - Ib (H+ + H-) - (Ios/2) (H+ - H-).
double SignedOffset(double vos_v, double ib_a, double ios_a,
                    double noise_gain_dc, double h_plus_ohm,
                    double h_minus_ohm);

// The offset block of the budget (magnitudes and the worst case).
// `dark_v` is a photodiode's dark-current term (signed), 0 for none.
OffsetBlock SumOffsets(const OpAmpModel& opamp, double noise_gain_dc,
                       double h_plus_ohm, double h_minus_ohm,
                       double dark_v = 0);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_OFFSET_H_
