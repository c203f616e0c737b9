// Does the stage's DC output leave room for its signal? The output of an
// op-amp on a supply span S swings at most +-S/2 about mid-supply (rail to
// rail at best: common practice, no source). With the full-scale swing FS
// (stage key full_scale_output_V, optional), the check warns when
//   worst-case offset       > FS, or > S/2
//   any DC output term |v|  > FS, or > S/2   (budget/dc_output.h)
//   DC total + FS           > S/2            (the signal clips)
//   FS                      > S/2
// where DC total = the op-amp's offset terms (|Vos| + |Ib| + |Ios| terms)
// + |the signed sum of the DC output terms| (their signs are known).
// A pure function; the warnings' texts and their problems are in step.
#ifndef HUSHGAIN_BUDGET_HEADROOM_H_
#define HUSHGAIN_BUDGET_HEADROOM_H_

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "budget/dc_output.h"
#include "budget/stage_problem.h"

namespace hushgain {

struct HeadroomInputs {
  double offset_v = 0;  // the worst-case output offset, as reported (>= 0)
  // The worst-case DC output magnitude: op-amp terms plus the DC terms.
  double dc_total_v = 0;
  std::vector<DcOutputTerm> dc_outputs;
  std::optional<double> full_scale_v;
  double supply_span_v = 0;  // total, V (> 0)
};

struct HeadroomCheck {
  std::vector<std::string> warnings;
  std::vector<StageProblem> problems;  // one per kind found, in order
};

HeadroomCheck CheckHeadroom(const HeadroomInputs& inputs);

// The same checks without the texts, as StageProblemBit()s: for many
// samples (spread).
std::uint32_t HeadroomProblemBits(const HeadroomInputs& inputs);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_HEADROOM_H_
