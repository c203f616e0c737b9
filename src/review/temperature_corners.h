// The budget at the ends of a stage's temperature range: the offset terms,
// worst case and drift, the output noise and the dominant term at each end,
// each from a full budget of the stage moved to that temperature
// (circuit/stage_at_temperature.h).
#ifndef HUSHGAIN_REVIEW_TEMPERATURE_CORNERS_H_
#define HUSHGAIN_REVIEW_TEMPERATURE_CORNERS_H_

#include <string>

#include "base/status.h"
#include "budget/budget.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"

namespace hushgain {

// "Vos", "Ib", "Ios" or "dark current": the largest term by magnitude.
std::string DominantOffsetTerm(const OffsetBlock& offset);

// The corner of a computed budget.
TemperatureCorner CornerOf(const Budget& budget);

// `stage` has 25 °C values and a temperature range; `nominal` is its budget
// at the nominal temperature; `capacitor_f` the feedback capacitor that
// budget used (an "auto" one is not chosen again at each end).
Status ComputeTemperatureBlock(const Stage& stage, const Budget& nominal,
                               double capacitor_f, const BudgetOptions& options,
                               TemperatureBlock* block);

}  // namespace hushgain

#endif  // HUSHGAIN_REVIEW_TEMPERATURE_CORNERS_H_
