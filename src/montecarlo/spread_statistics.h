// The distribution of a Monte Carlo figure, and the yield against limits.
//   mean, sigma      the sample mean and the sample standard deviation
//                    (divisor n - 1; 0 for one sample)
//   p_low, p_high    the 0.135 % and 99.865 % percentiles: the +-3 sigma
//                    points of a Gaussian (Phi(-3) = 0.00135), by linear
//                    interpolation between order statistics,
//                    x[(n - 1) p] (Hyndman and Fan 1996, definition 7)
//   yield            the fraction of samples inside every given limit:
//                    |gain error| <= limit, |offset| <= limit, noise <= limit
#ifndef HUSHGAIN_MONTECARLO_SPREAD_STATISTICS_H_
#define HUSHGAIN_MONTECARLO_SPREAD_STATISTICS_H_

#include <optional>
#include <vector>

#include "montecarlo/spread.h"

namespace hushgain {

inline constexpr double kLowPercentile = 0.00135;
inline constexpr double kHighPercentile = 0.99865;

struct Distribution {
  double mean = 0;
  double sigma = 0;
  double p_low = 0;
  double p_high = 0;
  double min = 0;
  double max = 0;
};

// Requires at least one value; reorders `values` (the percentiles are
// found by selection, in linear time, not by sorting: the same values).
Distribution Describe(std::vector<double> values);

// `sorted` ascending, non-empty; p in [0, 1].
double Percentile(const std::vector<double>& sorted, double p);

// The same for `values` in any order, non-empty (reordered): selects the
// two order statistics the interpolation needs.
double SelectPercentile(std::vector<double>& values, double p);

struct SpreadLimits {
  std::optional<double> gain_error;  // relative, on |gain error|
  std::optional<double> offset_v;    // on |offset|
  std::optional<double> noise_v;     // on the output rms
};

struct SpreadYield {
  std::optional<double> gain_error;
  std::optional<double> offset;
  std::optional<double> noise;
  std::optional<double> all;  // inside every given limit; none without limits
};

SpreadYield Yield(const SpreadRun& run, const SpreadLimits& limits);

struct SpreadSummary {
  Distribution gain_error;
  Distribution offset;
  Distribution noise;
  SpreadYield yield;
};

// The statistics of run.figures, in index order (so the same for any
// thread count); at most one figure's values are copied at a time.
SpreadSummary Summarize(const SpreadRun& run, const SpreadLimits& limits);

}  // namespace hushgain

#endif  // HUSHGAIN_MONTECARLO_SPREAD_STATISTICS_H_
