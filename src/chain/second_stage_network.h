// A chain's second stage given as a stage file (SecondStage::network): its
// own network, expanded and solved by the engine like any stage.
//
// The front stage's output drives the second stage's input resistor as an
// ideal voltage source (0 ohm: a closed-loop op-amp output is far below any
// input resistor; the file has no "source"), so its signal transfer G2(f)
// is the file's own signal gain V_out2 / V_in2, and its own contributors
// are every noise source of its network as its budget finds them (R_in's
// and R_f's 4kTR, the op-amp's e_n and i_n, excess noise), each at its
// output: S_2,j(f) = |H_j(f)|^2 S_j(f) (noise/spectrum_evaluator.h). The
// chain multiplies the front stage's contributors by |G2(f)|^2 and adds
// the S_2,j before the filter (chain/chain_noise.h).
//
// It is evaluated as part of the front stage's circuit: at the front
// stage's temperature, over its band and reference frequency (the file's
// own band_Hz, reference_frequency_Hz, temperature_C and
// full_scale_output_V are not used), with
// an "auto" feedback capacitor chosen by its own budget
// (budget/compute_budget.h), whose warnings are handed on, each starting
// "second stage <file>: ".
#ifndef HUSHGAIN_CHAIN_SECOND_STAGE_NETWORK_H_
#define HUSHGAIN_CHAIN_SECOND_STAGE_NETWORK_H_

#include <memory>
#include <string>
#include <vector>

#include "base/status.h"
#include "budget/chain_block.h"
#include "budget/compute_budget.h"
#include "chain/chain_noise.h"
#include "circuit/netlist.h"
#include "circuit/stage.h"
#include "noise/spectrum_evaluator.h"

namespace hushgain {

class SecondStageNetwork {
 public:
  SecondStageNetwork() = default;
  // spectra() refers to the evaluator this object holds.
  SecondStageNetwork(const SecondStageNetwork&) = delete;
  SecondStageNetwork& operator=(const SecondStageNetwork&) = delete;

  // `front` as the budget computed it (at its temperature); `second` a
  // stage file's second stage (second.is_network()). Fails as its budget
  // or its network's solve fails, the message starting with the file.
  Status Prepare(const Stage& front, const SecondStage& second,
                 const BudgetOptions& options);

  const SecondStageSpectra& spectra() const { return spectra_; }
  const SecondStageFigures& figures() const { return figures_; }
  // Its budget's warnings, each starting "second stage <file>: ".
  const std::vector<std::string>& warnings() const { return warnings_; }

 private:
  Netlist netlist_;
  std::unique_ptr<SpectrumEvaluator> evaluator_;
  SecondStageSpectra spectra_;
  SecondStageFigures figures_;
  std::vector<std::string> warnings_;
};

// The second stage's Stage as the chain evaluates it: `network` with the
// front stage's temperature, band and reference, no temperature range and
// no full-scale output of its own.
Stage SecondStageInChain(const Stage& front, const Stage& network);

}  // namespace hushgain

#endif  // HUSHGAIN_CHAIN_SECOND_STAGE_NETWORK_H_
