// Bandwidth and peaking of a computed response (not a formula): the -3 dB
// frequency is where |H(f)| first falls to |H(f_ref)| / sqrt(2) above the
// reference frequency, found on a log scan and refined by bisection in log f;
// the peaking is the largest |H(f)| / |H(f_ref)| above f_ref, in dB (0 when
// the response never rises).
#ifndef HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_
#define HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_

#include <complex>
#include <functional>

#include "base/status.h"

namespace hushgain {

// Writes H(j 2 pi f) into `gain`.
using GainFunction =
    std::function<Status(double f_hz, std::complex<double>* gain)>;

struct ResponseSummary {
  Status status;
  double bandwidth_3db_hz = 0;  // 0 when no -3 dB point below f_max
  bool bandwidth_found = false;
  double peaking_db = 0;
  double peak_hz = 0;
};

// Scans f_ref .. f_max_hz at `points_per_decade`; the peak is refined by a
// golden-section search around the largest sample.
ResponseSummary SummarizeResponse(const GainFunction& gain, double f_ref_hz,
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
