// The noise at the converter's input: every contributor of the stage
// through the chain, the chain's own noise, and what folds into the first
// Nyquist zone from above it. With H(f) the filter's response
// (chain/filter_response.h) and S_k(f) contributor k's density at the
// stage's output,
//   S_adc,k(f)  = S_k(f) |G2(f)|^2 |H(f)|^2  (the stage's contributors)
//   S_2nd,j(f)  = S_2,j(f) |H(f)|^2          (the second stage's own)
//   S_filter(f) = e_filter^2 |H(f)|^2        (its own noise at its input)
// with G2 and S_2 the second stage's gain and own output noise: a gain
// block's closed form (chain/second_stage.h, one component j), or a
// stage file's network, contributor by contributor
// (SecondStageSpectra, from chain/second_stage_network.h); G2 = 1 and
// S_2 = 0 without a second stage
// and the analog power at the converter is their integral from the band's
// low edge f_L (where the stage's count starts; 1/f noise needs it) to
// f_N = sample_rate / 2, plus, folded back into the first zone, from f_N
// on. The converter adds its own noise and q / sqrt(12), whose power P_c
// spread over the first zone is the density P_c / f_N.
//
// Where the fold stops: the count goes up in steps of half a decade and
// stops at the end of the second step in a row at which the tail beyond,
// estimated from the density's local log-log slope m (tail = S(f) f /
// (m - 1) for m > 1, unbounded otherwise), is below tail_fraction of the
// whole noise power at the converter; that frequency is counted_to_hz.
// With no filter, or one too gentle, the count stops at search_decades
// above f_N and says so (fold_limited).
#ifndef HUSHGAIN_CHAIN_CHAIN_NOISE_H_
#define HUSHGAIN_CHAIN_CHAIN_NOISE_H_

#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "base/status.h"
#include "budget/chain_block.h"
#include "chain/filter_response.h"
#include "circuit/signal_chain.h"
#include "integrate/band_integral.h"

namespace hushgain {

// The stage's output noise, contributor by contributor.
struct FrontEndSpectra {
  std::vector<std::string> names;
  // Fills psd[0 .. names.size() - 1] with S_k(f_hz), V^2/Hz at the stage's
  // output; f_hz > 0.
  std::function<Status(double f_hz, double* psd)> densities;
};

// A second stage given as a stage file: its network's signal gain and its
// own contributors.
struct SecondStageSpectra {
  std::vector<std::string> names;  // its contributors
  // Writes |G2(f)|^2 (its input to its output) into *power_gain and
  // S_2,j(f) into psd[0 .. names.size() - 1], V^2/Hz at its output;
  // f_hz > 0.
  std::function<Status(double f_hz, double* power_gain, double* psd)> densities;
  // Its passband gain |G2| (the swing it hands on to the converter).
  double passband_gain = 1;
};

// The chain's analog densities at the converter's input, S_adc,k for each
// stage contributor, then S_2nd,j (one for a gain block or none), then
// S_filter (the formulas above), at one frequency.
class ChainDensities {
 public:
  // `front_end` (and `network`, when given) must outlive this object;
  // `chain` is copied. `network` is required when the chain's second stage
  // is a stage file (SecondStage::is_network), and ignored otherwise.
  ChainDensities(const FrontEndSpectra& front_end, const SignalChain& chain,
                 double temperature_k,
                 const SecondStageSpectra* network = nullptr);

  int components() const { return n_ + m_ + 1; }
  int second_stage_components() const { return m_; }

  // Fills out[0 .. components() - 1], V^2/Hz; f_hz > 0.
  Status operator()(double f_hz, double* out) const;

  // Their sum at f.
  Status Total(double f_hz, double* total) const;

  const FilterResponse& filter() const { return filter_; }

 private:
  const FrontEndSpectra& front_end_;
  std::optional<SecondStage> second_;
  const SecondStageSpectra* network_;  // null: no network
  FilterResponse filter_;
  double temperature_k_;
  int n_;  // the stage's contributors
  int m_;  // the second stage's own components
};

struct ChainNoiseOptions {
  double band_low_hz = 0;         // f_L, > 0 and below the Nyquist frequency
  double temperature_k = 298.15;  // of the second stage's source resistance
  // The band integrals' options (relative tolerance 1e-4 by default).
  IntegrationOptions integration;
  // The fold stops where what lies beyond is below this fraction of the
  // noise power at the converter: below the integrals' own tolerance.
  double tail_fraction = 1e-5;
  // ... or this many decades above the Nyquist frequency.
  double search_decades = 6;

  // Empty when valid; otherwise "field: expected ..., got ...".
  std::string Validate() const;
};

struct ChainNoiseOutcome {
  Status status;  // a failing density, or a non-finite integral
  ChainBlock block;
};

// The second stage's row in the chain's blocks: "second stage", or for a
// stage file "second stage " and its path as the stage file writes it.
std::string SecondStageBlockName(const SecondStage& second);

// `chain` must be valid (io checks the stage file) and `options` too
// (asserted); `network` as for ChainDensities. Never prints.
ChainNoiseOutcome ComputeChainNoise(
    const FrontEndSpectra& front_end, const SignalChain& chain,
    const ChainNoiseOptions& options,
    const SecondStageSpectra* network = nullptr);

}  // namespace hushgain

#endif  // HUSHGAIN_CHAIN_CHAIN_NOISE_H_
