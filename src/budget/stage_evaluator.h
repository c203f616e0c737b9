// The engine set up for one stage, the one way every computation sees it:
// the stage expanded into its netlist, the MNA system built, and every
// noise source collected: thermal, shot, the op-amp's, and each resistor's
// excess noise from the DC operating point (budget/resistor_excess.h). The
// budget, the spectrum samples and the plots all start here, so they never
// disagree on which contributors exist.
#ifndef HUSHGAIN_BUDGET_STAGE_EVALUATOR_H_
#define HUSHGAIN_BUDGET_STAGE_EVALUATOR_H_

#include <vector>

#include "base/status.h"
#include "budget/budget.h"
#include "circuit/netlist.h"
#include "circuit/stage.h"
#include "noise/spectrum_evaluator.h"

namespace hushgain {

// `stage` is already at its temperature (circuit/stage_at_temperature.h) and
// has a fixed feedback capacitor. `drops` (may be null) receives each
// resistor's DC drop.
Status PrepareStageEvaluator(const Stage& stage, Netlist* netlist,
                             SpectrumEvaluator* evaluator,
                             std::vector<ResistorDrop>* drops);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_STAGE_EVALUATOR_H_
