#include "chain/chain_budget.h"

#include <cassert>
#include <cmath>

#include "base/printf.h"
#include "budget/stage_evaluator.h"
#include "chain/chain_noise.h"
#include "chain/filter_response.h"
#include "chain/second_stage_network.h"
#include "noise/spectrum_evaluator.h"

namespace hushgain {
namespace {

void ChainWarnings(const Stage& stage, const ChainBlock& c,
                   std::vector<std::string>* warnings) {
  if (stage.band_high_hz > c.nyquist_hz)
    warnings->push_back("the band's upper edge (" + HzText(stage.band_high_hz) +
                        ") is above the converter's Nyquist frequency (" +
                        HzText(c.nyquist_hz) + "): the signal aliases");
  if (c.chain.second_stage) {
    // A stage file's -3 dB corner is its own budget's (0: none found).
    const double f_p = c.second_stage_network
                           ? c.second_stage_network->bandwidth_3db_hz
                           : c.chain.second_stage->bandwidth_hz;
    if (f_p > 0 && f_p < stage.band_high_hz)
      warnings->push_back("the " + SecondStageBlockName(*c.chain.second_stage) +
                          "'s bandwidth (" + HzText(f_p) +
                          ") is below the band's upper edge (" +
                          HzText(stage.band_high_hz) + "): it cuts the signal");
  }
  if (c.chain.filter && c.chain.filter->kind != ChainFilter::Kind::kNone) {
    const FilterResponse h(*c.chain.filter);
    const double g = c.chain.filter->gain;
    if (h.PowerGain(stage.band_high_hz) < g * g / 2)
      warnings->push_back("the filter's -3 dB cutoff (" +
                          HzText(c.chain.filter->cutoff_hz) +
                          ") is below the band's upper edge (" +
                          HzText(stage.band_high_hz) + "): it cuts the signal");
  }
  if (stage.full_scale_output_v) {
    const double swing_pp = 2 * *stage.full_scale_output_v * c.chain_gain_dc;
    if (swing_pp > c.chain.adc.full_scale_v * (1 + 1e-9))
      warnings->push_back(
          Printf("the stage's full-scale swing (%.4g V peak to peak",
                 swing_pp) +
          Printf(" at the converter) exceeds the converter's %.4g V input "
                 "range",
                 c.chain.adc.full_scale_v));
  }
  if (c.fold_limited)
    warnings->push_back(
        "the noise above the converter's Nyquist frequency was counted up to " +
        HzText(c.counted_to_hz) +
        " and had still not fallen away: the folded noise is a floor; add or "
        "steepen the filter");
}

// The stage's contributors at its output, from the budget's evaluator.
FrontEndSpectra StageSpectra(SpectrumEvaluator& evaluator) {
  FrontEndSpectra front_end;
  for (const NoiseSource& source : evaluator.sources())
    front_end.names.push_back(source.name);
  front_end.densities = [&evaluator](double f_hz, double* psd) {
    return evaluator.Densities(f_hz, psd);
  };
  return front_end;
}

}  // namespace

ChainSamplesOutcome SampleChain(const Stage& stage,
                                const std::vector<double>& f_hz) {
  assert(stage.chain);
  ChainSamplesOutcome outcome;
  Netlist netlist;
  SpectrumEvaluator evaluator;
  outcome.status = PrepareStageEvaluator(stage, &netlist, &evaluator, nullptr);
  if (!outcome.status.ok) return outcome;
  const FrontEndSpectra front_end = StageSpectra(evaluator);
  SecondStageNetwork network;
  const std::optional<SecondStage>& second = stage.chain->second_stage;
  if (second && second->is_network()) {
    outcome.status = network.Prepare(stage, *second, BudgetOptions{});
    if (!outcome.status.ok) return outcome;
  }
  const ChainDensities densities(front_end, *stage.chain, stage.temperature_k,
                                 &network.spectra());
  ChainSamples& out = outcome.samples;
  for (double f : f_hz) {
    double psd = 0;
    outcome.status = densities.Total(f, &psd);
    if (outcome.status.ok && !std::isfinite(psd))
      outcome.status = Status::Fail("the chain's noise density at " +
                                    HzText(f) + " is not finite");
    if (!outcome.status.ok) return outcome;
    out.f_hz.push_back(f);
    out.analog_psd.push_back(psd);
    out.filter_abs.push_back(std::sqrt(densities.filter().PowerGain(f)));
  }
  return outcome;
}

ChainOutcome ComputeChain(const Stage& stage, const BudgetOptions& options) {
  assert(stage.chain);
  ChainOutcome outcome;
  Netlist netlist;
  SpectrumEvaluator evaluator;
  Status s = PrepareStageEvaluator(stage, &netlist, &evaluator, nullptr);
  if (!s.ok) return {s, {}, {}};
  const FrontEndSpectra front_end = StageSpectra(evaluator);
  ChainNoiseOptions chain_options;
  chain_options.band_low_hz = stage.band_low_hz;
  chain_options.temperature_k = stage.temperature_k;
  chain_options.integration = options.integration;
  // A tabulated op-amp density has a kink at each of its points, and the
  // filter's response bends at its cutoff.
  const double f_high = 1e12;
  for (const NoiseTable* table :
       {&stage.opamp.voltage_noise_table, &stage.opamp.current_noise_table})
    for (double f : table->Breakpoints(stage.band_low_hz, f_high))
      chain_options.integration.breakpoints_hz.push_back(f);
  if (stage.chain->filter &&
      stage.chain->filter->kind != ChainFilter::Kind::kNone)
    chain_options.integration.breakpoints_hz.push_back(
        stage.chain->filter->cutoff_hz);
  SecondStageNetwork network;
  const std::optional<SecondStage>& second = stage.chain->second_stage;
  if (second && second->is_network()) {
    s = network.Prepare(stage, *second, options);
    if (!s.ok) return {s, {}, {}};
    const Stage& net = *second->network;
    for (const NoiseTable* table :
         {&net.opamp.voltage_noise_table, &net.opamp.current_noise_table})
      for (double f : table->Breakpoints(stage.band_low_hz, f_high))
        chain_options.integration.breakpoints_hz.push_back(f);
  }
  ChainNoiseOutcome noise = ComputeChainNoise(
      front_end, *stage.chain, chain_options, &network.spectra());
  if (!noise.status.ok) return {noise.status, {}, {}};
  outcome.block = noise.block;
  if (second && second->is_network())
    outcome.block.second_stage_network = network.figures();
  ChainWarnings(stage, outcome.block, &outcome.warnings);
  for (const std::string& w : network.warnings()) outcome.warnings.push_back(w);
  outcome.status = Status::Ok();
  return outcome;
}

}  // namespace hushgain
