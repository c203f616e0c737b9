#include "montecarlo/spread_statistics.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace hushgain {

double Percentile(const std::vector<double>& sorted, double p) {
  assert(!sorted.empty());
  const double h = (static_cast<double>(sorted.size()) - 1.0) * p;
  const std::size_t lo = static_cast<std::size_t>(std::floor(h));
  if (lo + 1 >= sorted.size()) return sorted.back();
  return sorted[lo] +
         (h - static_cast<double>(lo)) * (sorted[lo + 1] - sorted[lo]);
}

Distribution Describe(std::vector<double> values) {
  assert(!values.empty());
  Distribution d;
  const double n = static_cast<double>(values.size());
  double sum = 0;
  for (double v : values) sum += v;
  d.mean = sum / n;
  double squares = 0;  // two passes: no cancellation
  for (double v : values) squares += (v - d.mean) * (v - d.mean);
  d.sigma = values.size() > 1 ? std::sqrt(squares / (n - 1.0)) : 0.0;
  std::sort(values.begin(), values.end());
  d.p_low = Percentile(values, kLowPercentile);
  d.p_high = Percentile(values, kHighPercentile);
  d.min = values.front();
  d.max = values.back();
  return d;
}

SpreadYield Yield(const std::vector<SpreadSample>& samples,
                  const SpreadLimits& limits) {
  SpreadYield y;
  if (samples.empty()) return y;
  long gain = 0, offset = 0, noise = 0, all = 0;
  for (const SpreadSample& s : samples) {
    const bool g =
        !limits.gain_error || std::fabs(s.gain_error) <= *limits.gain_error;
    const bool o =
        !limits.offset_v || std::fabs(s.offset_v) <= *limits.offset_v;
    const bool n = !limits.noise_v || s.noise_rms_v <= *limits.noise_v;
    gain += g;
    offset += o;
    noise += n;
    all += g && o && n;
  }
  const double count = static_cast<double>(samples.size());
  if (limits.gain_error) y.gain_error = gain / count;
  if (limits.offset_v) y.offset = offset / count;
  if (limits.noise_v) y.noise = noise / count;
  if (limits.gain_error || limits.offset_v || limits.noise_v)
    y.all = all / count;
  return y;
}

SpreadSummary Summarize(const std::vector<SpreadSample>& samples,
                        const SpreadLimits& limits) {
  SpreadSummary out;
  std::vector<double> g, o, n;
  g.reserve(samples.size());
  o.reserve(samples.size());
  n.reserve(samples.size());
  for (const SpreadSample& s : samples) {
    g.push_back(s.gain_error);
    o.push_back(s.offset_v);
    n.push_back(s.noise_rms_v);
  }
  out.gain_error = Describe(std::move(g));
  out.offset = Describe(std::move(o));
  out.noise = Describe(std::move(n));
  out.yield = Yield(samples, limits);
  return out;
}

}  // namespace hushgain
