#include "budget/stage_evaluator.h"

#include "budget/resistor_excess.h"
#include "circuit/expand_stage.h"

namespace hushgain {

Status PrepareStageEvaluator(const Stage& stage, Netlist* netlist,
                             SpectrumEvaluator* evaluator,
                             std::vector<ResistorDrop>* drops) {
  *netlist = ExpandStage(stage);
  Status s =
      SpectrumEvaluator::Create(*netlist, stage.temperature_k, evaluator);
  if (!s.ok) return s;
  std::vector<ResistorDrop> local;
  std::vector<NoiseSource> excess;
  s = ExcessNoiseOfStage(stage, *netlist, evaluator->system(),
                         drops ? drops : &local, &excess);
  if (!s.ok) return s;
  evaluator->AddSources(excess);
  return Status::Ok();
}

}  // namespace hushgain
