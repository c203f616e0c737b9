#include "analysis/frequency_response.h"

#include <cmath>

namespace hushgain {

ResponseSummary SummarizeResponse(const GainFunction& gain, double f_ref_hz,
                                  double f_max_hz, int points_per_decade) {
  ResponseSummary out;
  std::complex<double> h;
  out.status = gain(f_ref_hz, &h);
  if (!out.status.ok) return out;
  const double reference = std::abs(h);
  const double threshold = reference / std::sqrt(2.0);
  double peak = reference;
  out.peak_hz = f_ref_hz;

  const double step = std::pow(10.0, 1.0 / points_per_decade);
  double f_prev = f_ref_hz;
  for (double f = f_ref_hz * step; f <= f_max_hz * step; f *= step) {
    out.status = gain(f, &h);
    if (!out.status.ok) return out;
    const double magnitude = std::abs(h);
    if (magnitude > peak) {
      peak = magnitude;
      out.peak_hz = f;
    }
    if (magnitude < threshold) {
      // Bisect in log f between f_prev (above threshold) and f (below).
      double lo = f_prev, hi = f;
      for (int i = 0; i < 60 && hi / lo > 1 + 1e-9; ++i) {
        double mid = std::sqrt(lo * hi);
        out.status = gain(mid, &h);
        if (!out.status.ok) return out;
        (std::abs(h) < threshold ? hi : lo) = mid;
      }
      out.bandwidth_3db_hz = std::sqrt(lo * hi);
      out.bandwidth_found = true;
      break;
    }
    f_prev = f;
  }
  out.peaking_db = 20.0 * std::log10(peak / reference);
  return out;
}

}  // namespace hushgain
