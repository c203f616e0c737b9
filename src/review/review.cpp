#include "review/review.h"

#include "chain/chain_budget.h"
#include "circuit/feedback_network.h"
#include "circuit/stage_at_temperature.h"
#include "review/compensation_resistor.h"
#include "review/sensitivity.h"
#include "review/tee_comparison.h"
#include "review/temperature_corners.h"

namespace hushgain {
namespace {

// The plain stage is the designer's alternative: built from the stage as
// given (its own "auto" R_plus fitted to it), with the capacitor the budget
// chose, then moved to the same temperature.
Status ComparePlain(const Stage& requested, const BudgetOptions& options,
                    BudgetOutcome* outcome) {
  Stage given = requested;
  given.feedback.capacitor_f = outcome->stage_used.feedback.capacitor_f;
  given.capacitor_target.reset();
  const Stage plain_stage =
      StageAtTemperature(PlainEquivalent(given), requested.temperature_k);
  BudgetOutcome plain = ComputeBudgetAsGiven(plain_stage, options);
  if (!plain.status.ok) return plain.status;
  outcome->budget.tee =
      CompareTee(outcome->budget, plain.budget,
                 FeedbackEquivalentOhm(outcome->stage_used.feedback));
  return Status::Ok();
}

}  // namespace

BudgetOutcome ReviewStage(const Stage& stage, const ReviewOptions& options) {
  BudgetOutcome outcome = ComputeBudget(stage, options.budget);
  if (!outcome.status.ok) return outcome;
  auto fail = [&](const Status& s) {
    return BudgetOutcome{s, outcome.budget, {}, {}};
  };
  if (options.compensation) {
    CompensationBlock block;
    Status s = ComputeCompensationBlock(outcome.stage_used, outcome.budget,
                                        options.budget, &block);
    if (!s.ok) return fail(s);
    outcome.budget.compensation = block;
  }
  if (options.compare_tee && stage.feedback.kind == Feedback::Kind::kTee) {
    Status s = ComparePlain(stage, options.budget, &outcome);
    if (!s.ok) return fail(s);
  }
  if (options.temperature_corners && stage.temperature_range) {
    TemperatureBlock block;
    Status s = ComputeTemperatureBlock(stage, outcome.budget,
                                       outcome.stage_used.feedback.capacitor_f,
                                       options.budget, &block);
    if (!s.ok) {
      outcome.status = s;
      return outcome;
    }
    outcome.budget.temperature = block;
  }
  if (options.sensitivity) {
    SensitivityBlock block;
    Status s = ComputeSensitivity(outcome, options.budget, &block);
    if (!s.ok) return fail(s);
    outcome.budget.sensitivity = std::move(block);
  }
  if (options.chain && outcome.stage_used.chain) {
    ChainOutcome chain = ComputeChain(outcome.stage_used, options.budget);
    if (!chain.status.ok) return fail(chain.status);
    outcome.budget.chain = chain.block;
    for (std::string& w : chain.warnings)
      outcome.budget.warnings.push_back(std::move(w));
  }
  return outcome;
}

}  // namespace hushgain
