#include "budget/frequency_grid.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace hushgain {

std::vector<double> LogFrequencyGrid(double f_low_hz, double f_high_hz,
                                     double points_per_decade) {
  assert(f_low_hz > 0 && f_high_hz > f_low_hz && points_per_decade > 0);
  const double decades = std::log10(f_high_hz / f_low_hz);
  // The small slack keeps 2 decades at 50 per decade at 100 intervals
  // instead of 101 when log10 rounds up.
  const int n = std::max(
      1, static_cast<int>(std::ceil(points_per_decade * decades - 1e-9)));
  std::vector<double> f(n + 1);
  const double log_low = std::log(f_low_hz);
  const double step = std::log(f_high_hz / f_low_hz) / n;
  for (int i = 0; i <= n; ++i) f[i] = std::exp(log_low + step * i);
  f.front() = f_low_hz;  // exact edges, whatever exp() rounds to
  f.back() = f_high_hz;
  return f;
}

std::vector<double> JoinGrids(const std::vector<std::vector<double>>& grids) {
  std::vector<double> out;
  for (const std::vector<double>& g : grids) {
    for (std::size_t i = 0; i < g.size(); ++i) {
      if (i == 0 && !out.empty() && out.back() == g[0]) continue;
      out.push_back(g[i]);
    }
  }
  return out;
}

}  // namespace hushgain
