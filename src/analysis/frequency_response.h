// Bandwidth and peaking of a computed response (not a formula): the -3 dB
// frequency is where |H(f)| first falls to |H(f_ref)| / sqrt(2) above the
// reference frequency, found on a log scan and refined by Brent's method in
// log f (analysis/bracketed_root.h);
// the peaking is the largest |H(f)| / |H(f_ref)| above f_ref, in dB (0 when
// the response never rises).
#ifndef HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_
#define HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_

#include <complex>
#include <functional>
#include <vector>

#include "base/status.h"

namespace hushgain {

// Writes H(j 2 pi f) into `gain`.
using GainFunction =
    std::function<Status(double f_hz, std::complex<double>* gain)>;

// The response measured against its passband, so the figures are
// properties of the circuit and not of the band asked about:
//   - the passband gain is |H(0)| for a stage that passes DC; a stage
//     whose |H(0)| is more than 3 dB below its largest in-band gain
//     "blocks DC" (a capacitor in the signal path), and its passband gain
//     is that largest in-band |H|;
//   - the high -3 dB corner is the first frequency above the passband
//     (above DC, or above the in-band maximum) where |H| falls through
//     passband / sqrt(2); the low corner (DC-blocking stages only) the
//     first below the in-band maximum where it does; both refined by
//     Brent's method in log f to 1e-10;
//   - the peaking is the largest |H(f)| over the scan against the passband
//     gain, in dB (0 when |H| never rises above it).
// The band only decides, for a DC-blocking stage, where the passband gain
// is read.
struct PassbandResponse {
  Status status;
  bool blocks_dc = false;
  double dc_gain = 0;              // |H(0)|
  double passband_gain = 0;        // |H(0)|, or the largest in-band |H|
  double passband_hz = 0;          // 0 (DC), or where that in-band maximum is
  bool high_corner_found = false;  // false: no -3 dB point below f_max
  double high_corner_hz = 0;
  bool low_corner_found = false;  // DC-blocking stages only
  double low_corner_hz = 0;
  double peaking_db = 0;
  double peak_hz = 0;  // 0 when there is no peaking
};

// Scans f_lo_hz .. f_max_hz at `points_per_decade` (f_lo_hz far below the
// band and the circuit's lowest corner for a DC-coupled stage: when |H| is
// already 3 dB down there, the scan goes down by decades, at most 12, to
// find where it is not). band_low_hz .. band_high_hz is the band.
PassbandResponse SummarizePassband(const GainFunction& gain, double band_low_hz,
                                   double band_high_hz, double f_lo_hz,
                                   double f_max_hz, int points_per_decade = 20);

// The largest |H(f)| over [f_lo_hz, f_hi_hz]: a log scan at
// `points_per_decade` (both ends included), then a golden-section search in
// log f between the best sample's neighbours, so the maximum is found to
// 1e-6 in log f wherever it lies between scan points. `at_low_end` is true
// when the best sample is f_lo_hz itself (the response never rises above
// its value there).
struct ResponseMaximum {
  Status status;
  double magnitude = 0;
  double f_hz = 0;
  bool at_low_end = false;
};
ResponseMaximum LargestMagnitude(const GainFunction& gain, double f_lo_hz,
                                 double f_hi_hz, int points_per_decade = 20);

// The same search on samples already taken: f_hz ascending (f_hz[0] is the
// low end), magnitude[i] = |H(f_hz[i])|; the golden-section refinement
// between the best sample's neighbours calls `gain`. For a caller whose
// scan of another transfer solved the network at these frequencies anyway.
ResponseMaximum LargestSampledMagnitude(const GainFunction& gain,
                                        const std::vector<double>& f_hz,
                                        const std::vector<double>& magnitude);

// The quality factor of a second-order low-pass read off the response: at
// the frequency f_90 where the phase has turned by -90 degrees from its value
// at f_ref, Q = |H(f_90)| / |H(f_ref)|. Exact for 1/(1 + s/(Q w0) + s^2/w0^2)
// when f_ref << f_90. Returns nullopt when the phase never turns by 90
// degrees below f_max_hz, or on a failed solve (with `status` set).
struct QualityFactor {
  Status status;
  bool found = false;
  double q = 0;
  double f90_hz = 0;
};
QualityFactor SecondOrderQ(const GainFunction& gain, double f_ref_hz,
                           double f_max_hz, int points_per_decade = 20);

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_
