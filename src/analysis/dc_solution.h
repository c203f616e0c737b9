// The DC operating point of a netlist's linear network: G x = sum of
// value_k b_k at f = 0, for stimuli such as the DC input level, Vos (a
// voltage in the op-amp's input row), the bias currents (a current leaving
// each pin node) and a photodiode's dark current.
#ifndef HUSHGAIN_ANALYSIS_DC_SOLUTION_H_
#define HUSHGAIN_ANALYSIS_DC_SOLUTION_H_

#include <vector>

#include "analysis/mna_system.h"
#include "base/status.h"

namespace hushgain {

struct DcStimulus {
  Port port;         // from MnaSystem::Compile
  double value = 0;  // V for a voltage excitation, A for a current one
};

// Writes every unknown of `system` into `unknowns` (node voltages at
// MnaSystem::NodeIndex). Fails when G is singular (names "DC").
Status SolveDc(const MnaSystem& system, const std::vector<DcStimulus>& stimuli,
               std::vector<double>* unknowns);

// The voltage of `node` in a solution (0 for ground).
double NodeVoltage(const MnaSystem& system, const std::vector<double>& unknowns,
                   NodeId node);

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_DC_SOLUTION_H_
