// Binning Monte Carlo samples for a histogram picture
// (report/spread_plot_script.h). Pure functions, no I/O.
//   bins      Rice's rule, ceil(2 n^(1/3)), clamped to [1, max_bins]
//             (common practice, no source)
//   edges     bins + 1 equally spaced edges from the smallest to the
//             largest finite value, the last edge exactly the largest;
//             when every value is equal, one bin of half-width
//             max(|value| 1e-6, 1e-300) around it
//   counts    value v falls in bin floor((v - min) / width), the largest
//             value in the last bin, so every finite value is counted once
// Values that are not finite are not binned; they are counted in
// `skipped`. With no finite value the histogram has no bins.
#ifndef HUSHGAIN_REPORT_HISTOGRAM_H_
#define HUSHGAIN_REPORT_HISTOGRAM_H_

#include <vector>

namespace hushgain {

struct Histogram {
  std::vector<double> edges;  // bins + 1, ascending
  std::vector<long> counts;   // bins
  long skipped = 0;           // values that were not finite

  int Bins() const { return static_cast<int>(counts.size()); }
  double Width() const { return edges.size() > 1 ? edges[1] - edges[0] : 0; }
};

// Rice's rule for `samples` values: ceil(2 cbrt(samples)) within
// [1, max_bins]; 1 for fewer than one sample.
int RiceBinCount(long samples, int max_bins);

// `bins` at least 1.
Histogram BinValues(const std::vector<double>& values, int bins);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_HISTOGRAM_H_
