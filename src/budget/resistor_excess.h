// Resistor excess noise in the budget: the DC solution of the stage gives
// each resistor's drop, its technology's noise index gives a 1/f source
// (noise/excess_noise.h), and the advice names the resistor whose
// technology is worth upgrading.
//
// DC stimuli (the operating point the excess noise sees): the stage's DC
// input level (V of the source, or A of photocurrent into the summing node),
// +Vos in the op-amp's input, Ib+ = Ib + Ios/2 and Ib- = Ib - Ios/2 leaving
// the pin nodes (Ios taken with a positive sign), and the dark current.
#ifndef HUSHGAIN_BUDGET_RESISTOR_EXCESS_H_
#define HUSHGAIN_BUDGET_RESISTOR_EXCESS_H_

#include <optional>
#include <vector>

#include "analysis/dc_solution.h"
#include "analysis/mna_system.h"
#include "budget/budget.h"
#include "circuit/netlist.h"
#include "circuit/stage.h"
#include "noise/excess_noise.h"

namespace hushgain {

// The stimuli above, for `opamp` and `dc_input` (a sample may change them).
std::vector<DcStimulus> StageDcStimuli(const Netlist& netlist,
                                       const MnaSystem& system,
                                       const OpAmpModel& opamp,
                                       double dc_input);

// Every netlist resistor with a technology (ResistorSpecFor), with its drop
// from the solution `unknowns` of the stimuli above.
std::vector<ResistorExcess> ResistorExcessList(
    const Stage& stage, const Netlist& netlist, const MnaSystem& system,
    const std::vector<double>& unknowns);

// Solves the DC point, fills `drops` and returns the excess sources.
Status ExcessNoiseOfStage(const Stage& stage, const Netlist& netlist,
                          const MnaSystem& system,
                          std::vector<ResistorDrop>* drops,
                          std::vector<NoiseSource>* sources);

// The excess contributor with the largest share, when there is one, and
// the total output rms with its resistor in each candidate technology that
// is quieter (lower noise index). `contributors` must carry every excess
// contributor (before negligible ones are left out).
std::optional<ExcessAdvice> AdviseExcess(
    const std::vector<Contributor>& contributors, double output_rms_v,
    const Stage& stage, const std::vector<ResistorSpec>& candidates);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_RESISTOR_EXCESS_H_
