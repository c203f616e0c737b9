// Frequency grids for reports and plots: points equally spaced in log f.
//   f_i = f_low * (f_high / f_low)^(i / n),  i = 0 .. n,
//   n = ceil(points_per_decade * log10(f_high / f_low)), at least 1,
// so both edges are on the grid exactly and the spacing is at most
// 1 / points_per_decade decade.
#ifndef HUSHGAIN_BUDGET_FREQUENCY_GRID_H_
#define HUSHGAIN_BUDGET_FREQUENCY_GRID_H_

#include <vector>

namespace hushgain {

// Requires 0 < f_low_hz < f_high_hz and points_per_decade > 0 (asserted:
// callers pass validated band edges).
std::vector<double> LogFrequencyGrid(double f_low_hz, double f_high_hz,
                                     double points_per_decade);

// Joins grids that meet end to start (a.back() == b.front()) without
// repeating the shared point.
std::vector<double> JoinGrids(const std::vector<std::vector<double>>& grids);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_FREQUENCY_GRID_H_
