#include "report/histogram.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace hushgain {

int RiceBinCount(long samples, int max_bins) {
  if (samples < 1) return 1;
  const double rice = std::ceil(2.0 * std::cbrt(static_cast<double>(samples)));
  return static_cast<int>(std::clamp(rice, 1.0, static_cast<double>(max_bins)));
}

Histogram BinValues(const std::vector<double>& values, int bins) {
  assert(bins >= 1);
  Histogram h;
  double lo = 0, hi = 0;
  bool any = false;
  for (double v : values) {
    if (!std::isfinite(v)) {
      ++h.skipped;
      continue;
    }
    lo = any ? std::min(lo, v) : v;
    hi = any ? std::max(hi, v) : v;
    any = true;
  }
  if (!any) return h;
  if (!(hi > lo)) {
    const double half = std::max(std::fabs(lo) * 1e-6, 1e-300);
    bins = 1;
    lo -= half;
    hi += half;
  }
  const double width = (hi - lo) / bins;
  h.edges.resize(bins + 1);
  for (int k = 0; k < bins; ++k) h.edges[k] = lo + k * width;
  h.edges[bins] = hi;
  h.counts.assign(bins, 0);
  for (double v : values) {
    if (!std::isfinite(v)) continue;
    const long k = static_cast<long>(std::floor((v - lo) / width));
    ++h.counts[std::clamp<long>(k, 0, bins - 1)];
  }
  return h;
}

}  // namespace hushgain
