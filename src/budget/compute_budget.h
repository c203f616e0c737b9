// Stage -> Budget: expand the stage, solve the network, integrate every
// contributor's output density over the band, sum the offsets at DC and,
// for a T network, compare with the plain resistor of the same equivalent
// resistance.
//   output_rms = sqrt(integral of S_out(f) df over the band)
//   input_rms  = output_rms / |signal gain(f_ref)|
#ifndef HUSHGAIN_BUDGET_COMPUTE_BUDGET_H_
#define HUSHGAIN_BUDGET_COMPUTE_BUDGET_H_

#include <string>

#include "analysis/status.h"
#include "budget/budget.h"
#include "circuit/stage.h"
#include "integrate/band_integral.h"

namespace hushgain {

struct BudgetOptions {
  // Relative tolerance 1e-4 on the total output noise power by default.
  IntegrationOptions integration;
  // For a T network, also compute the plain-resistor stage (default on).
  bool compare_tee = true;

  std::string Validate() const { return integration.Validate(); }
};

struct BudgetOutcome {
  Status status;  // numerical trouble: singular network, non-finite result
  Budget budget;
};

// The stage must be valid (io validates user input). Never prints.
BudgetOutcome ComputeBudget(const Stage& stage, const BudgetOptions& options);

// The plain stage that a T network stands in for: the same stage with one
// feedback resistor equal to the tee's equivalent resistance.
Stage PlainEquivalent(const Stage& tee_stage);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_COMPUTE_BUDGET_H_
