// The noise cost of a T network: its budget beside the budget of the plain
// stage with one feedback resistor of the same equivalent resistance.
// Contributors are matched by name: R1, R2, R3 are added by the tee, R_f is
// removed; the rest are raised, lowered or the same (within 0.1 %).
#ifndef HUSHGAIN_REVIEW_TEE_COMPARISON_H_
#define HUSHGAIN_REVIEW_TEE_COMPARISON_H_

#include "budget/budget.h"
#include "circuit/stage.h"

namespace hushgain {

// The plain stage that a T network stands in for: the same stage with one
// feedback resistor equal to the tee's equivalent resistance.
Stage PlainEquivalent(const Stage& tee_stage);

TeeComparison CompareTee(const Budget& tee, const Budget& plain,
                         double equivalent_resistance_ohm);

}  // namespace hushgain

#endif  // HUSHGAIN_REVIEW_TEE_COMPARISON_H_
