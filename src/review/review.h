// The review of one stage: its budget, and beside it the budgets that put
// it in context, composed here once and nowhere else:
//   - compensation resistor: the stage with and without a bias-current
//     compensation resistor at the non-inverting input (review/
//     compensation_resistor.h), on the stage as computed;
//   - T network vs plain resistor: for a T network, the same stage with one
//     feedback resistor equal to the tee's equivalent resistance (review/
//     tee_comparison.h);
//   - temperature corners: with a temperature range, the budget at each end
//     (review/temperature_corners.h);
//   - sensitivity: on request, d ln(figure) / d ln(parameter) for every
//     parameter (review/sensitivity.h), on the stage as computed;
//   - the signal chain: with a chain, the stage's noise through its filter
//     to its converter (chain/chain_budget.h), on the stage as computed.
// Each block calls budget/compute_budget.h downward; nothing calls back up,
// so no flag exists to stop a recursion.
#ifndef HUSHGAIN_REVIEW_REVIEW_H_
#define HUSHGAIN_REVIEW_REVIEW_H_

#include <string>

#include "budget/compute_budget.h"
#include "circuit/stage.h"

namespace hushgain {

struct ReviewOptions {
  // Options of every budget the review computes.
  BudgetOptions budget;
  // For a T network, the plain-resistor comparison (default on).
  bool compare_tee = true;
  // With a temperature range, the budget at each end (default on).
  bool temperature_corners = true;
  // The compensation-resistor block (default on).
  bool compensation = true;
  // With a chain, the chain block (default on).
  bool chain = true;
  // The sensitivities of noise, offset and bandwidth to every parameter
  // (review/sensitivity.h; default off: about 4 budgets a parameter).
  bool sensitivity = false;

  // Empty when valid; otherwise "field: expected ..., got ...".
  std::string Validate() const { return budget.Validate(); }
};

// The stage must be valid (io validates user input). Returns the budget of
// the stage with the requested blocks filled in (Budget::compensation,
// Budget::tee, Budget::temperature, Budget::chain); a failed block fails the
// whole review with its status. Never prints.
BudgetOutcome ReviewStage(const Stage& stage, const ReviewOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_REVIEW_REVIEW_H_
