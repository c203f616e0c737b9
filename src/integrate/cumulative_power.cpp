#include "integrate/cumulative_power.h"

#include <cassert>
#include <cmath>

namespace hushgain {

std::vector<double> CumulativeLogTrapezoid(const std::vector<double>& f_hz,
                                           const std::vector<double>& psd) {
  assert(f_hz.size() == psd.size());
  std::vector<double> out(f_hz.size(), 0.0);
  for (std::size_t i = 1; i < f_hz.size(); ++i) {
    assert(f_hz[i] > f_hz[i - 1] && f_hz[i - 1] > 0);
    const double du = std::log(f_hz[i] / f_hz[i - 1]);
    out[i] =
        out[i - 1] + 0.5 * du * (psd[i - 1] * f_hz[i - 1] + psd[i] * f_hz[i]);
  }
  return out;
}

}  // namespace hushgain
