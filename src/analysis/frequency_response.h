// Bandwidth and peaking of a computed response (not a formula): the -3 dB
// frequency is where |H(f)| first falls to |H(f_ref)| / sqrt(2) above the
// reference frequency, found on a log scan and refined by bisection in log f;
// the peaking is the largest |H(f)| / |H(f_ref)| above f_ref, in dB (0 when
// the response never rises).
#ifndef HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_
#define HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_

#include <complex>
#include <functional>

#include "analysis/status.h"

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

// Scans f_ref .. f_max_hz at `points_per_decade`.
ResponseSummary SummarizeResponse(const GainFunction& gain, double f_ref_hz,
                                  double f_max_hz, int points_per_decade = 20);

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_FREQUENCY_RESPONSE_H_
