#include "chain/filter_response.h"

#include <cassert>
#include <cmath>
#include <complex>

#include "integrate/band_integral.h"

namespace hushgain {
namespace {

// B_n by the recurrence B_n = (2n - 1) B_(n-1) + s^2 B_(n-2).
std::vector<double> ReverseBesselPolynomial(int n) {
  std::vector<double> older = {1.0};     // B_0
  std::vector<double> old = {1.0, 1.0};  // B_1
  if (n == 0) return older;
  for (int k = 2; k <= n; ++k) {
    std::vector<double> next(k + 1, 0.0);
    for (std::size_t i = 0; i < old.size(); ++i)
      next[i] += (2 * k - 1) * old[i];
    for (std::size_t i = 0; i < older.size(); ++i) next[i + 2] += older[i];
    older = old;
    old = next;
  }
  return old;
}

// |B(j w) / B(0)|^2.
double BesselAttenuation(const std::vector<double>& b, double w) {
  std::complex<double> sum = 0;
  const std::complex<double> s(0, w);
  for (std::size_t i = b.size(); i-- > 0;) sum = sum * s + b[i];
  return std::norm(sum) / (b[0] * b[0]);
}

// The integral's ends, in cutoffs: below kHeadX the response is flat to
// 1e-18 (|H|^2 = 1 - O(x^2)), above kTailX it falls as x^(-2n) and its
// tail is added in closed form.
constexpr double kHeadX = 1e-9;
constexpr double kTailX = 1e9;

}  // namespace

FilterResponse::FilterResponse(const ChainFilter& filter) : filter_(filter) {
  if (filter.kind != ChainFilter::Kind::kBessel) return;
  assert(filter.order >= 1 && filter.order <= kMaxFilterOrder);
  bessel_ = ReverseBesselPolynomial(filter.order);
  // The -3 dB frequency of B_n as it stands (unit group delay): between
  // 1e-3 and 1e3 for every order up to kMaxFilterOrder; bisection in log w.
  double lo = 1e-3, hi = 1e3;
  for (int i = 0; i < 200 && hi / lo > 1 + 1e-15; ++i) {
    const double mid = std::sqrt(lo * hi);
    if (BesselAttenuation(bessel_, mid) < 2.0)
      lo = mid;
    else
      hi = mid;
  }
  bessel_w3_ = std::sqrt(lo * hi);
}

double FilterResponse::PowerGain(double f_hz) const {
  const double g2 = filter_.gain * filter_.gain;
  if (filter_.kind == ChainFilter::Kind::kNone) return g2;
  const double x = f_hz / filter_.cutoff_hz;
  switch (filter_.kind) {
    case ChainFilter::Kind::kSinglePole:
      return g2 / (1 + x * x);
    case ChainFilter::Kind::kButterworth:
      return g2 / (1 + std::pow(x, 2 * filter_.order));
    case ChainFilter::Kind::kBessel:
      return g2 / BesselAttenuation(bessel_, bessel_w3_ * x);
    case ChainFilter::Kind::kNone:
      break;
  }
  return g2;
}

double NoiseBandwidthHz(const FilterResponse& response) {
  const ChainFilter& f = response.filter();
  if (f.kind == ChainFilter::Kind::kNone) return 0;
  const double fc = f.cutoff_hz;
  const double g2 = f.gain * f.gain;
  IntegrationOptions options;
  options.relative_tolerance = 1e-12;
  options.intervals_per_decade = 4;
  options.breakpoints_hz = {fc};
  const IntegrationResult r = IntegrateBand(
      kHeadX * fc, kTailX * fc, 1,
      [&](double f_hz, double* out) {
        out[0] = response.PowerGain(f_hz) / g2;
        return Status::Ok();
      },
      options);
  const int n = f.kind == ChainFilter::Kind::kSinglePole ? 1 : f.order;
  const double tail =
      response.PowerGain(kTailX * fc) / g2 * kTailX * fc / (2 * n - 1);
  return kHeadX * fc + r.integrals[0] + tail;
}

}  // namespace hushgain
