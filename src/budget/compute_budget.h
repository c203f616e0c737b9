// Stage -> Budget of ONE stage as given: expand the stage, solve the
// network, integrate every contributor's output density over the band and
// sum the offsets at DC. The blocks that put this budget beside other
// budgets (plain resistor, temperature corners, compensation resistor) are
// composed above it, in review/review.h.
//   output_rms = sqrt(integral of S_out(f) df over the band)
//   input_rms  = sqrt(integral of S_out(f) / |signal gain(f)|^2 df)
#ifndef HUSHGAIN_BUDGET_COMPUTE_BUDGET_H_
#define HUSHGAIN_BUDGET_COMPUTE_BUDGET_H_

#include <string>
#include <vector>

#include "base/status.h"
#include "budget/budget.h"
#include "circuit/stage.h"
#include "integrate/band_integral.h"

namespace hushgain {

struct BudgetOptions {
  // Relative tolerance 1e-4 on the total output noise power by default.
  IntegrationOptions integration;
  // Noise and offset only: no loop, response or output-drive figures (for
  // the auxiliary budgets of a comparison, which read nothing else).
  bool noise_and_offset_only = false;
  // Quieter technologies the excess-noise advice may propose (the device
  // library's resistor technologies; empty = no alternatives).
  std::vector<ResistorSpec> upgrade_candidates;

  std::string Validate() const { return integration.Validate(); }
};

struct BudgetOutcome {
  Status status;  // numerical trouble: singular network, non-finite result
  Budget budget;
  // The converged partition of the noise integral (for re-integration on
  // the same nodes, integrate/band_integral.h).
  std::vector<LogInterval> noise_partition;
  // The stage as computed: at its nominal temperature, with an "auto"
  // feedback capacitor chosen.
  Stage stage_used;
};

// The stage must be valid (io validates user input). Its device and
// resistor values are at 25 °C; the budget is computed at the stage's
// temperature (circuit/stage_at_temperature.h). Never prints.
BudgetOutcome ComputeBudget(const Stage& stage, const BudgetOptions& options);

// The same for a stage already moved to its temperature (no further
// temperature laws applied).
BudgetOutcome ComputeBudgetAsGiven(const Stage& stage,
                                   const BudgetOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_COMPUTE_BUDGET_H_
