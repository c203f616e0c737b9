#include "integrate/band_integral.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <queue>
#include <string>

#include "base/printf.h"

namespace hushgain {
namespace {

// Gauss-Kronrod (7, 15) abscissae and weights on [-1, 1], as tabulated in
// QUADPACK (Piessens et al. 1983, routine qk15). xk[1], xk[3], xk[5], xk[7]
// are the Gauss points.
constexpr double kXk[8] = {
    0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
    0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
    0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
    0.207784955007898467600689403773245, 0.0};
constexpr double kWk[8] = {
    0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
    0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
    0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
    0.204432940075298892414161999234649, 0.209482141084727828012999174891714};
constexpr double kWg[4] = {
    0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
    0.381830050505118944950369775488975, 0.417959183673469387755102040816327};

struct Interval {
  double a = 0;  // ln f
  double b = 0;
  double error = 0;  // summed over components
};

struct ByError {
  const std::vector<Interval>* intervals;
  bool operator()(int l, int r) const {
    return (*intervals)[l].error < (*intervals)[r].error;
  }
};

class Integrator {
 public:
  Integrator(int n, const BandIntegrand& integrand)
      : n_(n), integrand_(integrand), values_(n), kronrod_(n), gauss_(n) {}

  // Integrates [a, b] in u = ln f into `out` (n values); returns the error
  // estimate summed over components.
  Status Rule(double a, double b, double* out, double* error) {
    const double center = 0.5 * (a + b);
    const double half = 0.5 * (b - a);
    std::fill(kronrod_.begin(), kronrod_.end(), 0.0);
    std::fill(gauss_.begin(), gauss_.end(), 0.0);
    for (int j = 0; j < 15; ++j) {
      const int i = j < 8 ? j : 14 - j;  // node index into the tables
      const double x = j < 8 ? -kXk[i] : kXk[i];
      if (j > 7 && i == 7) continue;  // the centre is node 7 only once
      const double u = center + half * x;
      const double f = std::exp(u);
      Status s = integrand_(f, values_.data());
      ++evaluations_;
      if (!s.ok) return s;
      const bool gauss_node = (i % 2) == 1;
      const double wg = i == 7 ? kWg[3] : gauss_node ? kWg[i / 2] : 0.0;
      for (int k = 0; k < n_; ++k) {
        const double v = values_[k] * f;  // S(f) df = S(e^u) e^u du
        kronrod_[k] += kWk[i] * v;
        if (gauss_node || i == 7) gauss_[k] += wg * v;
      }
    }
    double err = 0;
    for (int k = 0; k < n_; ++k) {
      out[k] = half * kronrod_[k];
      err += std::fabs(half * (kronrod_[k] - gauss_[k]));
    }
    *error = err;
    return Status::Ok();
  }

  int evaluations() const { return evaluations_; }

 private:
  int n_;
  const BandIntegrand& integrand_;
  std::vector<double> values_;
  std::vector<double> kronrod_;
  std::vector<double> gauss_;
  int evaluations_ = 0;
};

}  // namespace

std::string IntegrationOptions::Validate() const {
  if (!(relative_tolerance > 0 && relative_tolerance < 1))
    return Printf(
        "relative_tolerance: expected a relative tolerance in (0, "
        "1), got %g",
        relative_tolerance);
  if (!(intervals_per_decade > 0 && intervals_per_decade <= 1000))
    return Printf("intervals_per_decade: expected a count in (0, 1000], got %g",
                  intervals_per_decade);
  if (max_intervals < 1)
    return "max_intervals: expected at least 1, got " +
           std::to_string(max_intervals);
  for (double f : breakpoints_hz)
    if (!(f > 0 && std::isfinite(f)))
      return Printf("breakpoints_hz: expected positive frequencies, got %g", f);
  return {};
}

IntegrationResult IntegrateBand(double f_low_hz, double f_high_hz, int n,
                                const BandIntegrand& integrand,
                                const IntegrationOptions& options) {
  assert(f_low_hz > 0 && f_high_hz > f_low_hz && n >= 1);
  assert(options.Validate().empty());
  IntegrationResult result;
  Integrator rule(n, integrand);

  const double ua = std::log(f_low_hz);
  const double ub = std::log(f_high_hz);
  const double decades = std::log10(f_high_hz / f_low_hz);
  int initial =
      static_cast<int>(std::ceil(decades * options.intervals_per_decade));
  initial = std::max(1, std::min(initial, options.max_intervals));

  std::vector<Interval> intervals;
  std::vector<double> sums;  // n per interval
  intervals.reserve(options.max_intervals);
  sums.reserve(static_cast<std::size_t>(options.max_intervals) * n);
  std::priority_queue<int, std::vector<int>, ByError> worst{
      ByError{&intervals}};

  // The cuts of the initial partition: evenly spaced in u, and every
  // breakpoint inside the band (one closer than 1e-9 of the band to a cut
  // already there would only make a sliver).
  std::vector<double> cuts;
  for (int i = 0; i <= initial; ++i)
    cuts.push_back(ua + (ub - ua) * i / initial);
  for (double f : options.breakpoints_hz) {
    const double u = std::log(f);
    if (u > ua && u < ub) cuts.push_back(u);
  }
  std::sort(cuts.begin(), cuts.end());
  const double sliver = 1e-9 * (ub - ua);
  std::vector<double> kept = {cuts.front()};
  for (std::size_t i = 1; i + 1 < cuts.size(); ++i)
    if (cuts[i] - kept.back() > sliver && ub - cuts[i] > sliver)
      kept.push_back(cuts[i]);
  kept.push_back(ub);
  initial = std::min(static_cast<int>(kept.size()) - 1, options.max_intervals);
  kept.resize(initial + 1);
  kept.back() = ub;

  double total_error = 0;
  for (int i = 0; i < initial; ++i) {
    Interval iv{kept[i], kept[i + 1], 0};
    sums.resize(sums.size() + n);
    Status s = rule.Rule(iv.a, iv.b, &sums[sums.size() - n], &iv.error);
    if (!s.ok) {
      result.status = s;
      return result;
    }
    intervals.push_back(iv);
    worst.push(static_cast<int>(intervals.size() - 1));
    total_error += iv.error;
  }

  auto total = [&] {
    double t = 0;
    for (double v : sums) t += v;
    return t;
  };
  std::vector<double> left(n), right(n);
  while (true) {
    double sum = total();
    if (total_error <= options.relative_tolerance * std::fabs(sum)) {
      result.converged = true;
      break;
    }
    if (static_cast<int>(intervals.size()) >= options.max_intervals) break;
    int index = worst.top();
    worst.pop();
    Interval parent = intervals[index];
    double mid = 0.5 * (parent.a + parent.b);
    Interval l{parent.a, mid, 0}, r{mid, parent.b, 0};
    Status s = rule.Rule(l.a, l.b, left.data(), &l.error);
    if (s.ok) s = rule.Rule(r.a, r.b, right.data(), &r.error);
    if (!s.ok) {
      result.status = s;
      return result;
    }
    total_error += l.error + r.error - parent.error;
    intervals[index] = l;
    std::copy(left.begin(), left.end(),
              sums.begin() + static_cast<long>(index) * n);
    intervals.push_back(r);
    sums.insert(sums.end(), right.begin(), right.end());
    worst.push(index);
    worst.push(static_cast<int>(intervals.size() - 1));
  }

  result.integrals.assign(n, 0.0);
  for (std::size_t i = 0; i < intervals.size(); ++i)
    for (int k = 0; k < n; ++k) result.integrals[k] += sums[i * n + k];
  // Re-sum the error: the running total drifts by rounding.
  double err = 0;
  for (const Interval& iv : intervals) err += iv.error;
  result.error_estimate = err;
  result.evaluations = rule.evaluations();
  result.intervals = static_cast<int>(intervals.size());
  result.partition.reserve(intervals.size());
  for (const Interval& iv : intervals) result.partition.push_back({iv.a, iv.b});
  return result;
}

std::vector<QuadratureNode> QuadratureNodes(
    const std::vector<LogInterval>& partition) {
  std::vector<QuadratureNode> nodes;
  nodes.reserve(partition.size() * 15);
  for (const LogInterval& iv : partition) {
    const double center = 0.5 * (iv.a + iv.b);
    const double half = 0.5 * (iv.b - iv.a);
    // The same node order and arithmetic as Integrator::Rule.
    for (int j = 0; j < 15; ++j) {
      const int i = j < 8 ? j : 14 - j;
      const double x = j < 8 ? -kXk[i] : kXk[i];
      if (j > 7 && i == 7) continue;
      const double f = std::exp(center + half * x);
      nodes.push_back({f, half * kWk[i] * f});
    }
  }
  return nodes;
}

std::vector<QuadratureNode> GaussNodes(
    const std::vector<LogInterval>& partition) {
  std::vector<QuadratureNode> nodes;
  nodes.reserve(partition.size() * 7);
  for (const LogInterval& iv : partition) {
    const double center = 0.5 * (iv.a + iv.b);
    const double half = 0.5 * (iv.b - iv.a);
    // The odd nodes of QuadratureNodes' order: xk[1], xk[3], xk[5] on the
    // left, the centre xk[7], then xk[5], xk[3], xk[1] on the right.
    for (int j = 1; j < 15; j += 2) {
      const int i = j < 8 ? j : 14 - j;
      const double x = j < 8 ? -kXk[i] : kXk[i];
      const double f = std::exp(center + half * x);
      nodes.push_back({f, half * kWg[i / 2] * f});
    }
  }
  return nodes;
}

}  // namespace hushgain
