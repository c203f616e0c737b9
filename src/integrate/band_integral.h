// Adaptive, error-controlled integration of several spectral densities at
// once over a frequency band, in log f:
//   integral of S_k(f) df from f_low to f_high
//     = integral of S_k(e^u) e^u du from ln f_low to ln f_high.
// In u a 1/f density is a constant and a white one an exponential, so the
// Gauss-Kronrod (7, 15) rule is exact on 1/f terms and converges fast on the
// rest. All components share the evaluations: one call of the integrand
// gives every contributor's density at one frequency (one network solve).
// The interval with the largest error estimate is halved until the summed
// estimate |K15 - G7| over all components falls below
// relative_tolerance * (sum of all integrals).
// A tabulated density (circuit/noise_table.h) is a power law between its
// points, an exponential in u there, but has a kink at every point; the
// points are given as breakpoints, the initial partition is cut at each,
// and no rule straddles a kink.
#ifndef HUSHGAIN_INTEGRATE_BAND_INTEGRAL_H_
#define HUSHGAIN_INTEGRATE_BAND_INTEGRAL_H_

#include <functional>
#include <string>
#include <vector>

#include "base/status.h"

namespace hushgain {

struct IntegrationOptions {
  // Target relative error on the total (the sum of all components).
  double relative_tolerance = 1e-4;
  // The initial partition: this many intervals per decade, at least one.
  double intervals_per_decade = 1.0;
  // Refinement stops here even when the tolerance is not met.
  int max_intervals = 5000;
  // Frequencies where the integrand has a kink: the initial partition is cut
  // there too. Those outside the band are ignored; each must be positive.
  std::vector<double> breakpoints_hz;

  // Empty when valid; otherwise names the field, its value and the rule.
  std::string Validate() const;
};

// One interval of the partition, in u = ln f.
struct LogInterval {
  double a = 0;
  double b = 0;
};

struct IntegrationResult {
  Status status;                  // a failing integrand stops the integration
  std::vector<double> integrals;  // one per component, units of S times Hz
  double error_estimate = 0;      // absolute, on the sum of the components
  int evaluations = 0;            // integrand calls
  int intervals = 0;
  bool converged = false;  // error_estimate met the tolerance
  // The final partition, in the order the integral sums it.
  std::vector<LogInterval> partition;
};

// Fills `values[0 .. n-1]` with the densities at `f_hz` (all >= 0).
using BandIntegrand = std::function<Status(double f_hz, double* values)>;

// Requires 0 < f_low < f_high, n >= 1 and valid options (asserted: the
// callers validate user input first).
IntegrationResult IntegrateBand(double f_low_hz, double f_high_hz, int n,
                                const BandIntegrand& integrand,
                                const IntegrationOptions& options);

// A fixed quadrature node: integral of S(f) df ~ sum of weight_hz * S(f_hz).
struct QuadratureNode {
  double f_hz = 0;
  double weight_hz = 0;
};

// The Kronrod-15 nodes of every interval of `partition` with their weights
// (half-width x Kronrod weight x f, the Jacobian of u = ln f): re-integrating
// a changed integrand on the nodes a converged adaptive run chose, at a fixed
// cost. Applied to the integrand of that run it gives the same integral to
// rounding.
std::vector<QuadratureNode> QuadratureNodes(
    const std::vector<LogInterval>& partition);

// The Gauss-7 nodes of every interval of `partition` with their Gauss
// weights (half-width x Gauss weight x f): the embedded rule whose
// difference from the Kronrod one is the integrator's error estimate. Node
// k (0 to 6) of interval i is node 15 i + 2 k + 1 of QuadratureNodes, the
// same frequency to the bit.
std::vector<QuadratureNode> GaussNodes(
    const std::vector<LogInterval>& partition);

}  // namespace hushgain

#endif  // HUSHGAIN_INTEGRATE_BAND_INTEGRAL_H_
