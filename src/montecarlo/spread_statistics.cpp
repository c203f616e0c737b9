#include "montecarlo/spread_statistics.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace hushgain {
namespace {

// x[(n - 1) p] interpolated, given the order statistics lo and lo + 1.
double Interpolate(std::size_t n, double p, double at_lo, double at_next) {
  const double h = (static_cast<double>(n) - 1.0) * p;
  const std::size_t lo = static_cast<std::size_t>(std::floor(h));
  return at_lo + (h - static_cast<double>(lo)) * (at_next - at_lo);
}

}  // namespace

double Percentile(const std::vector<double>& sorted, double p) {
  assert(!sorted.empty());
  const double h = (static_cast<double>(sorted.size()) - 1.0) * p;
  const std::size_t lo = static_cast<std::size_t>(std::floor(h));
  if (lo + 1 >= sorted.size()) return sorted.back();
  return Interpolate(sorted.size(), p, sorted[lo], sorted[lo + 1]);
}

double SelectPercentile(std::vector<double>& values, double p) {
  assert(!values.empty());
  const std::size_t n = values.size();
  const double h = (static_cast<double>(n) - 1.0) * p;
  const std::size_t lo = static_cast<std::size_t>(std::floor(h));
  if (lo + 1 >= n) return *std::max_element(values.begin(), values.end());
  std::nth_element(values.begin(), values.begin() + lo, values.end());
  // Everything after position lo is at least values[lo]: the next order
  // statistic is their smallest.
  const double next = *std::min_element(values.begin() + lo + 1, values.end());
  return Interpolate(n, p, values[lo], next);
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
  const auto [lo, hi] = std::minmax_element(values.begin(), values.end());
  d.min = *lo;
  d.max = *hi;
  d.p_low = SelectPercentile(values, kLowPercentile);
  d.p_high = SelectPercentile(values, kHighPercentile);
  return d;
}

SpreadYield Yield(const SpreadRun& run, const SpreadLimits& limits) {
  SpreadYield y;
  const std::size_t size = run.size();
  if (size == 0) return y;
  const SpreadFigures& f = run.figures;
  long gain = 0, offset = 0, noise = 0, all = 0;
  for (std::size_t i = 0; i < size; ++i) {
    const bool g =
        !limits.gain_error || std::fabs(run.GainError(i)) <= *limits.gain_error;
    const bool o =
        !limits.offset_v || std::fabs(f.offset_v[i]) <= *limits.offset_v;
    const bool n = !limits.noise_v || f.noise_rms_v[i] <= *limits.noise_v;
    gain += g;
    offset += o;
    noise += n;
    all += g && o && n;
  }
  const double count = static_cast<double>(size);
  if (limits.gain_error) y.gain_error = gain / count;
  if (limits.offset_v) y.offset = offset / count;
  if (limits.noise_v) y.noise = noise / count;
  if (limits.gain_error || limits.offset_v || limits.noise_v)
    y.all = all / count;
  return y;
}

SpreadSummary Summarize(const SpreadRun& run, const SpreadLimits& limits) {
  SpreadSummary out;
  std::vector<double> g(run.size());
  for (std::size_t i = 0; i < g.size(); ++i) g[i] = run.GainError(i);
  out.gain_error = Describe(std::move(g));
  out.offset = Describe(run.figures.offset_v);
  out.noise = Describe(run.figures.noise_rms_v);
  out.yield = Yield(run, limits);
  return out;
}

}  // namespace hushgain
