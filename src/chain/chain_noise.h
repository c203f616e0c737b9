// The noise at the converter's input: every contributor of the stage
// through the chain, the chain's own noise, and what folds into the first
// Nyquist zone from above it. With H(f) the filter's response
// (chain/filter_response.h) and S_k(f) contributor k's density at the
// stage's output,
//   S_adc,k(f)  = S_k(f) |G2(f)|^2 |H(f)|^2  (the stage's contributors)
//   S_2nd(f)    = S_2(f) |H(f)|^2            (the second stage's own)
//   S_filter(f) = e_filter^2 |H(f)|^2        (its own noise at its input)
// with G2 and S_2 the second stage's gain and own output noise
// (chain/second_stage.h; G2 = 1 without one)
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

// The chain's analog densities at the converter's input, S_adc,k for each
// stage contributor, then S_2nd, then S_filter (the formulas above), at
// one frequency.
class ChainDensities {
 public:
  // `front_end` must outlive this object; `chain` is copied.
  ChainDensities(const FrontEndSpectra& front_end, const SignalChain& chain,
                 double temperature_k);

  int components() const { return n_ + 2; }

  // Fills out[0 .. components() - 1], V^2/Hz; f_hz > 0.
  Status operator()(double f_hz, double* out) const;

  // Their sum at f.
  Status Total(double f_hz, double* total) const;

  const FilterResponse& filter() const { return filter_; }

 private:
  const FrontEndSpectra& front_end_;
  std::optional<SecondStage> second_;
  FilterResponse filter_;
  double temperature_k_;
  int n_;
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

// `chain` must be valid (io checks the stage file) and `options` too
// (asserted). Never prints.
ChainNoiseOutcome ComputeChainNoise(const FrontEndSpectra& front_end,
                                    const SignalChain& chain,
                                    const ChainNoiseOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_CHAIN_CHAIN_NOISE_H_
