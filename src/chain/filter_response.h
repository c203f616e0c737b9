// The magnitude response of the chain's filter (circuit/signal_chain.h),
// every kind normalised to |H(cutoff)|^2 = |H(0)|^2 / 2 and scaled by the
// passband gain g; x = f / cutoff:
//   none         |H|^2 = g^2
//   single_pole  |H|^2 = g^2 / (1 + x^2)
//   butterworth  |H|^2 = g^2 / (1 + x^(2n))
//   bessel       |H|^2 = g^2 |B_n(0) / B_n(j w3 x)|^2, B_n the reverse
//                Bessel polynomial (B_0 = 1, B_1 = s + 1,
//                B_n = (2n - 1) B_(n-1) + s^2 B_(n-2)), w3 its -3 dB
//                frequency, found once by bisection (the response falls
//                monotonically)
// and its noise-equivalent bandwidth
//   ENBW = integral of |H(f)|^2 / |H(0)|^2 df from 0 to infinity,
// integrated numerically for every kind (integrate/band_integral.h), so a
// Butterworth filter's closed form (pi / 2n) / sin(pi / 2n) x cutoff is a
// check, not a copy.
#ifndef HUSHGAIN_CHAIN_FILTER_RESPONSE_H_
#define HUSHGAIN_CHAIN_FILTER_RESPONSE_H_

#include <vector>

#include "circuit/signal_chain.h"

namespace hushgain {

class FilterResponse {
 public:
  // A valid filter (io checks the stage file): order 1 .. kMaxFilterOrder
  // (1 for a single pole), cutoff > 0 and gain > 0 unless kind is kNone.
  explicit FilterResponse(const ChainFilter& filter);

  // |H(f)|^2, f >= 0.
  double PowerGain(double f_hz) const;

  const ChainFilter& filter() const { return filter_; }

 private:
  ChainFilter filter_;
  std::vector<double> bessel_;  // B_n's coefficients, s^0 first
  double bessel_w3_ = 1;
};

// The ENBW in Hz; 0 for kNone (no band limit).
double NoiseBandwidthHz(const FilterResponse& response);

}  // namespace hushgain

#endif  // HUSHGAIN_CHAIN_FILTER_RESPONSE_H_
