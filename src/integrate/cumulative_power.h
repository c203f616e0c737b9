// The running integral of a sampled density on its grid, by the trapezoid
// rule in log f (the variable the band integral uses, integrate/
// band_integral.h):
//   P(f_i) = sum over j < i of (u_{j+1} - u_j) (g_j + g_{j+1}) / 2,
//   u = ln f, g = S(f) f,
// so P(f_0) = 0 and P(f_last) approximates the integral of S df over the
// grid. For a cumulative RMS take sqrt(P). A 1/f density is a constant g,
// which the rule integrates exactly; elsewhere the error is O(h^2) in the
// log step h (at 50 points per decade, about 2e-4 relative on a white
// density).
#ifndef HUSHGAIN_INTEGRATE_CUMULATIVE_POWER_H_
#define HUSHGAIN_INTEGRATE_CUMULATIVE_POWER_H_

#include <vector>

namespace hushgain {

// Requires f_hz increasing, all > 0, and psd.size() == f_hz.size()
// (asserted). Units of psd times Hz.
std::vector<double> CumulativeLogTrapezoid(const std::vector<double>& f_hz,
                                           const std::vector<double>& psd);

}  // namespace hushgain

#endif  // HUSHGAIN_INTEGRATE_CUMULATIVE_POWER_H_
