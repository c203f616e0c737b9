// The signal chain of a stage (Stage::chain) as the budget reports it: the
// stage's own contributors, from the same evaluator the budget uses
// (budget/stage_evaluator.h), through the chain to the converter
// (chain/chain_noise.h), and the warnings a chain that cannot work draws:
//   - the band reaches above the converter's Nyquist frequency;
//   - the second stage's pole or the filter is more than 3 dB down
//     inside the band;
//   - the stage's full-scale swing overdrives the converter;
//   - the fold reached its search limit with the tail still there.
#ifndef HUSHGAIN_CHAIN_CHAIN_BUDGET_H_
#define HUSHGAIN_CHAIN_CHAIN_BUDGET_H_

#include <string>
#include <vector>

#include "base/status.h"
#include "budget/chain_block.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"

namespace hushgain {

struct ChainOutcome {
  Status status;  // numerical trouble, as the budget's
  ChainBlock block;
  std::vector<std::string> warnings;
};

// `stage` as the budget computed it (BudgetOutcome::stage_used: at its
// temperature, the feedback capacitor fixed) and with a chain. Never
// prints.
ChainOutcome ComputeChain(const Stage& stage, const BudgetOptions& options);

// The chain on a frequency grid, for the plots: the analog noise density
// at the converter's input (the sum of chain/chain_noise.h's densities)
// and the filter's |H(f)| (its gain included; 1 without a filter).
struct ChainSamples {
  std::vector<double> f_hz;
  std::vector<double> analog_psd;  // V^2/Hz
  std::vector<double> filter_abs;  // V/V
};

struct ChainSamplesOutcome {
  Status status;  // a frequency that could not be solved, named
  ChainSamples samples;
};

// `stage` as the budget computed it, with a chain; every f > 0.
ChainSamplesOutcome SampleChain(const Stage& stage,
                                const std::vector<double>& f_hz);

}  // namespace hushgain

#endif  // HUSHGAIN_CHAIN_CHAIN_BUDGET_H_
