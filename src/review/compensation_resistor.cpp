#include "review/compensation_resistor.h"

#include "circuit/expand_stage.h"

namespace hushgain {

Status ComputeCompensationBlock(const Stage& stage, const Budget& nominal,
                                const BudgetOptions& options,
                                CompensationBlock* block) {
  BudgetOptions plain = options;
  plain.noise_and_offset_only = true;
  Stage without = stage;
  without.plus_resistor = {};
  without.plus_resistor_bypass_f = 0;
  Stage with = stage;
  with.plus_resistor = {PlusResistor::Mode::kValue, BalanceResistorOhm(stage)};
  // A stage without R_plus (and so without its bypass) is the stage
  // without: its own budget has the figures, the same network solved the
  // same way.
  const bool stage_is_without =
      stage.plus_resistor.mode == PlusResistor::Mode::kNone &&
      stage.plus_resistor_bypass_f == 0;
  BudgetOutcome a;
  if (stage_is_without) {
    a.budget = nominal;
  } else {
    a = ComputeBudgetAsGiven(without, plain);
    if (!a.status.ok) return a.status;
  }
  BudgetOutcome b = ComputeBudgetAsGiven(with, plain);
  if (!b.status.ok) return b.status;
  block->balance_ohm = with.plus_resistor.ohms;
  block->offset_without_v = a.budget.offset.worst_case_v;
  block->offset_with_v = b.budget.offset.worst_case_v;
  block->ib_without_v = a.budget.offset.ib_v;
  block->ib_with_v = b.budget.offset.ib_v;
  block->noise_without_v = a.budget.output_rms_v;
  block->noise_with_v = b.budget.output_rms_v;
  const double with_sq = block->noise_with_v * block->noise_with_v;
  const double without_sq = block->noise_without_v * block->noise_without_v;
  block->added_share = with_sq > 0 ? (with_sq - without_sq) / with_sq : 0;
  block->bypass_f = stage.plus_resistor_bypass_f;
  // Worth doing only when it lowers the worst-case offset by a tenth or
  // more: an Ib term beside a much larger Vos term is not worth a resistor.
  block->worth_doing = block->offset_with_v <=
                       (1 - kCompensationOffsetGain) * block->offset_without_v;
  block->noise_matters = block->worth_doing &&
                         block->added_share > kCompensationNoiseShare &&
                         block->bypass_f == 0;
  return Status::Ok();
}

}  // namespace hushgain
