#include "chain/second_stage_network.h"

#include <cassert>
#include <complex>

#include "budget/stage_evaluator.h"

namespace hushgain {

Stage SecondStageInChain(const Stage& front, const Stage& network) {
  Stage s = network;
  s.temperature_k = front.temperature_k;
  s.temperature_range.reset();
  s.band_low_hz = front.band_low_hz;
  s.band_high_hz = front.band_high_hz;
  s.reference_hz = front.reference_hz;
  // Its swing is the front stage's times its gain: the converter's check
  // (chain/chain_budget.h) sees it, not its own headroom figure.
  s.full_scale_output_v.reset();
  s.chain.reset();
  return s;
}

Status SecondStageNetwork::Prepare(const Stage& front,
                                   const SecondStage& second,
                                   const BudgetOptions& options) {
  assert(second.is_network());
  const std::string prefix = "second stage " + second.file + ": ";
  BudgetOutcome budget =
      ComputeBudget(SecondStageInChain(front, *second.network), options);
  if (!budget.status.ok) return Status::Fail(prefix + budget.status.message);
  const Budget& b = budget.budget;
  for (const std::string& w : b.warnings) warnings_.push_back(prefix + w);
  figures_.stage_name = b.stage_name;
  figures_.opamp_class = b.opamp_class;
  figures_.signal_gain_dc = b.signal_gain_dc;
  figures_.passband_gain = b.passband_gain;
  figures_.signal_gain_ref = b.signal_gain_ref;
  figures_.noise_gain_ref = b.noise_gain_ref;
  figures_.bandwidth_3db_hz = b.bandwidth_3db_hz;

  evaluator_ = std::make_unique<SpectrumEvaluator>();
  Status s = PrepareStageEvaluator(budget.stage_used, &netlist_,
                                   evaluator_.get(), nullptr);
  if (!s.ok) return Status::Fail(prefix + s.message);
  spectra_.names.clear();
  for (const NoiseSource& source : evaluator_->sources())
    spectra_.names.push_back(source.name);
  spectra_.passband_gain = b.passband_gain;
  SpectrumEvaluator* ev = evaluator_.get();
  const Port signal = ev->Compile(netlist_.signal);
  spectra_.densities = [ev, signal, prefix](double f_hz, double* power_gain,
                                            double* psd) {
    // Densities solves at f; the signal's transfer is read from that solve.
    Status st = ev->Densities(f_hz, psd);
    if (!st.ok) return Status::Fail(prefix + st.message);
    *power_gain = std::norm(ev->Transfer(signal));
    return Status::Ok();
  };
  return Status::Ok();
}

}  // namespace hushgain
