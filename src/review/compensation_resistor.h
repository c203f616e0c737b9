// The bias-current compensation resistor R_plus: the value that cancels
// the Ib term (the DC resistance seen by the - input), and the budget of the
// stage with the + input grounded against R_plus at that value (with the
// stage's bypass capacitor C_plus, if any). R_plus's thermal noise and i_n+
// through it ride on the full noise gain; a capacitor across R_plus shorts
// them above 1 / (2 pi R_plus C_plus) while keeping the DC balance.
#ifndef HUSHGAIN_REVIEW_COMPENSATION_RESISTOR_H_
#define HUSHGAIN_REVIEW_COMPENSATION_RESISTOR_H_

#include "base/status.h"
#include "budget/budget.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"

namespace hushgain {

// `stage` is at its temperature with its feedback capacitor fixed;
// `nominal` is its budget (computed with `options`), which stands for the
// stage without R_plus when the stage has none.
Status ComputeCompensationBlock(const Stage& stage, const Budget& nominal,
                                const BudgetOptions& options,
                                CompensationBlock* block);

}  // namespace hushgain

#endif  // HUSHGAIN_REVIEW_COMPENSATION_RESISTOR_H_
