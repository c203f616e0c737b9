// What the signal chain after the stage adds to the budget (stage file
// "chain": filter and converter, circuit/signal_chain.h): the noise at the
// converter's input, block by block, and the converter's figures. A plain
// value, computed by chain/chain_budget.h and printed by report/.
// Every rms here is at the converter's input, counted from the band's low
// edge over the first Nyquist zone and, folded into it, above the Nyquist
// frequency up to counted_to_hz (chain/chain_noise.h says where that is).
#ifndef HUSHGAIN_BUDGET_CHAIN_BLOCK_H_
#define HUSHGAIN_BUDGET_CHAIN_BLOCK_H_

#include <optional>
#include <string>
#include <vector>

#include "circuit/signal_chain.h"

namespace hushgain {

// One block's own noise at the converter's input.
struct ChainNoiseShare {
  // "front end", "second stage" (a stage file: "second stage <its path>"),
  // "filter", "converter", "quantization"
  std::string name;
  double rms_v = 0;
  double share = 0;  // of the total noise power at the converter's input
};

// The converter's figures for the total noise at its input, n (V rms),
// a full-scale sine of rms full_scale / (2 sqrt 2) and q = one LSB:
//   snr_db                    20 log10(full_scale / (2 sqrt 2) / n)
//   enob_bits                 (SINAD - 1.76) / 6.02 (IEEE Std 1241) with the
//                             constants' exact values 10 log10 1.5 and
//                             20 log10 2, SINAD = snr_db (no distortion is
//                             modelled), so an ideal converter gives its bits
//   noise_free_bits           log2(full_scale / (6.6 n)) (p-p = 6.6 rms)
//   effective_resolution_bits log2(full_scale / n)
struct AdcFigures {
  double lsb_v = 0;
  double quantization_rms_v = 0;  // q / sqrt(12)
  double own_noise_rms_v = 0;     // apart from quantization
  double noise_lsb_rms = 0;       // n / q
  double snr_db = 0;
  double enob_bits = 0;
  double noise_free_bits = 0;
  double effective_resolution_bits = 0;
};

// A second stage given as a stage file, as its own budget finds it.
struct SecondStageFigures {
  std::string stage_name;       // its "name"
  std::string opamp_class;      // its op-amp
  double signal_gain_dc = 0;    // signed, V/V
  double passband_gain = 0;     // |G2| in its passband
  double signal_gain_ref = 0;   // |G2| at the front stage's reference
  double noise_gain_ref = 0;    // |e_n -> output| at the reference
  double bandwidth_3db_hz = 0;  // its high -3 dB corner; 0 = not found
};

struct ChainBlock {
  SignalChain chain;  // as given, for the report
  // The filter's noise-equivalent bandwidth, integral of |H(f)/H(0)|^2 df
  // from 0 to infinity; 0 without a filter.
  double filter_enbw_hz = 0;
  // Stage output to converter input, V/V: |second stage gain| x filter
  // gain.
  double chain_gain_dc = 0;
  // In chain order: front end, second stage and filter (their own noise;
  // each present when the chain has it), converter, quantization.
  std::vector<ChainNoiseShare> blocks;
  // The stage's contributors at the converter's input, largest first.
  std::vector<ChainNoiseShare> front_end_contributors;
  // A second stage given as a stage file: its own contributors at the
  // converter's input, largest first (empty for a gain block), and what
  // its budget found of it (over the front stage's band, at its
  // temperature).
  std::vector<ChainNoiseShare> second_stage_contributors;
  std::optional<SecondStageFigures> second_stage_network;
  std::string dominant;  // the block with the largest share

  double analog_rms_v = 0;  // everything before the converter
  double total_rms_v = 0;   // analog, the converter's own, quantization

  double nyquist_hz = 0;
  double in_zone_rms_v = 0;  // analog, band low edge to Nyquist
  double folded_rms_v = 0;   // analog, Nyquist to counted_to_hz
  double counted_to_hz = 0;
  // The fold's stop rule: the tail beyond counted_to_hz is below this
  // fraction of the noise power at the converter.
  double tail_fraction = 0;
  // The count stopped at its search limit with the tail still not
  // negligible (no filter, or one too gentle): the folded noise is a floor.
  bool fold_limited = false;
  // The lowest frequency at or above Nyquist where the chain's analog
  // density falls below the converter's own noise density (its own noise
  // and quantization spread evenly over the first Nyquist zone); 0 when it
  // stays above up to counted_to_hz.
  double below_converter_hz = 0;
  double converter_density_v_per_rthz = 0;

  AdcFigures adc;
};

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_CHAIN_BLOCK_H_
