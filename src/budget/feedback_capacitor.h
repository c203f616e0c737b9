// Choosing the feedback capacitor for a target, on the computed network:
//   butterworth   the C_f at which the closed-loop response's second-order
//                 Q (analysis/frequency_response.h, SecondOrderQ) is 1/sqrt 2
//   phase margin  the C_f at which the loop's phase margin
//                 (analysis/loop_gain.h) equals the target
// Both are found by Brent's method in log C_f between 1 aF and 1 µF (Q falls
// and the margin rises with C_f), to 1e-10 in log C_f: the butterworth
// bracket grows from the textbook estimate by factors of 2, the phase
// margin's is one step of a log grid over the whole range (the margin is
// not always monotonic). The textbook estimates for a photodiode stage
// with C = C_d + C_in at the - input (Graeme, Photodiode Amplifiers, 1996):
//   butterworth  C_f ~ sqrt(C / (pi R_f GBW))
//   45 degrees   C_f ~ sqrt(C / (2 pi R_f GBW)), which gives Q ~ 1 and a true
//                margin near 52 degrees (REFERENCES.md section 7)
#ifndef HUSHGAIN_BUDGET_FEEDBACK_CAPACITOR_H_
#define HUSHGAIN_BUDGET_FEEDBACK_CAPACITOR_H_

#include "base/status.h"
#include "budget/budget.h"
#include "circuit/stage.h"

namespace hushgain {

struct CapacitorOutcome {
  Status status;  // fails when the target cannot be met in 1 aF .. 1 µF
  CapacitorChoice choice;
};

CapacitorOutcome ChooseFeedbackCapacitor(const Stage& stage,
                                         const CapacitorTarget& target);

// The capacitance at the - input that the textbook estimates use:
// C_d + C_cm + C_diff (the + input at AC ground); a capacitive sensor's C_s
// in place of C_d when it drives the - input directly (no R_in).
double InputCapacitanceF(const Stage& stage);

// The phase margin and crossover of a stage's loop (every topology).
struct StageLoop {
  Status status;
  LoopBlock loop;
};
StageLoop ComputeStageLoop(const Stage& stage);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_FEEDBACK_CAPACITOR_H_
