// The chain filter's response and noise-equivalent bandwidth
// (chain/filter_response.h) against closed forms and an integral of the
// test's own.
#include "chain/filter_response.h"

#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <vector>

#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

ChainFilter Filter(ChainFilter::Kind kind, int order, double cutoff_hz,
                   double gain = 1) {
  ChainFilter f;
  f.kind = kind;
  f.order = order;
  f.cutoff_hz = cutoff_hz;
  f.gain = gain;
  return f;
}

TEST_CASE("butterworth ENBW over cutoff is (pi/2n)/sin(pi/2n) for n = 1 to 5") {
  // REFERENCES.md section 3 (derived there, a Beta-function integral):
  // ENBW/f3 = (pi/2n)/sin(pi/2n); its table 1.570796327, 1.110720735,
  // 1.047197551, 1.026172153, 1.016640738.
  const double table[] = {1.570796327, 1.110720735, 1.047197551, 1.026172153,
                          1.016640738};
  const double fc = 12.5e3;
  for (int n = 1; n <= 5; ++n) {
    CAPTURE(n);
    const double x = kPi / (2 * n);
    const double closed = x / std::sin(x);
    CHECK(RelErr(closed, table[n - 1]) < test::kRelTable);
    const FilterResponse h(Filter(ChainFilter::Kind::kButterworth, n, fc, 3));
    CHECK(RelErr(NoiseBandwidthHz(h) / fc, closed) < 1e-8);
  }
  // One pole is the first-order Butterworth: pi/2.
  const FilterResponse pole(Filter(ChainFilter::Kind::kSinglePole, 1, fc));
  CHECK(RelErr(NoiseBandwidthHz(pole) / fc, kPi / 2) < 1e-8);
}

TEST_CASE("every filter kind is 3 dB down at its cutoff and flat at DC") {
  const double fc = 1e3, g = 2.5;
  for (auto kind : {ChainFilter::Kind::kButterworth, ChainFilter::Kind::kBessel,
                    ChainFilter::Kind::kSinglePole}) {
    for (int n = 1; n <= (kind == ChainFilter::Kind::kSinglePole ? 1 : 10);
         ++n) {
      CAPTURE(n);
      const FilterResponse h(Filter(kind, n, fc, g));
      CHECK(RelErr(h.PowerGain(fc), g * g / 2) < 1e-9);
      CHECK(RelErr(h.PowerGain(1e-6 * fc), g * g) < 1e-9);
    }
  }
  const FilterResponse none(Filter(ChainFilter::Kind::kNone, 0, 0, g));
  CHECK(none.PowerGain(1e9) == g * g);
  CHECK(NoiseBandwidthHz(none) == 0);
}

// The reverse Bessel polynomial from its explicit coefficients (not the
// recurrence the code uses): a_k = (2n - k)! / (2^(n - k) k! (n - k)!)
// (the standard closed form of the Bessel polynomial's coefficients).
std::vector<double> BesselCoefficients(int n) {
  std::vector<double> a(n + 1);
  for (int k = 0; k <= n; ++k)
    a[k] = std::tgamma(2 * n - k + 1) /
           (std::pow(2.0, n - k) * std::tgamma(k + 1) * std::tgamma(n - k + 1));
  return a;
}

double PowerResponse(const std::vector<double>& a, double w) {
  std::complex<double> p = 0, s(0, w), power = 1;
  for (double c : a) {
    p += c * power;
    power *= s;
  }
  return a[0] * a[0] / std::norm(p);
}

TEST_CASE("bessel ENBW matches an independent integral of its response") {
  // Independent of the code: the explicit coefficients above, the -3 dB
  // point by plain bisection, and the integral of |H|^2 over w in (0, inf)
  // by the substitution w = tan(t) and a composite Simpson rule in t.
  for (int n = 1; n <= 5; ++n) {
    CAPTURE(n);
    const std::vector<double> a = BesselCoefficients(n);
    double lo = 0.01, hi = 100;
    for (int i = 0; i < 200; ++i) {
      const double mid = 0.5 * (lo + hi);
      (PowerResponse(a, mid) > 0.5 ? lo : hi) = mid;
    }
    const double w3 = 0.5 * (lo + hi);
    const int steps = 200000;
    const double h = (kPi / 2) / steps;
    double sum = 0;
    for (int i = 0; i <= steps; ++i) {
      const double t = i * h;
      // At t = pi/2 the integrand's limit is 0 for n >= 1 (|H|^2 falls as
      // w^-2n, the Jacobian grows as w^2): the n = 1 limit is 1, for a[0]^2
      // / a[1]^2 = 1 there.
      double value;
      if (i == steps) {
        value = n == 1 ? 1.0 : 0.0;
      } else {
        const double w = std::tan(t);
        value = PowerResponse(a, w) * (1 + w * w);
      }
      const double weight = (i == 0 || i == steps) ? 1 : (i % 2 ? 4 : 2);
      sum += weight * value;
    }
    const double expected_ratio = sum * h / 3 / w3;  // ENBW / f_-3dB
    const double fc = 7e3;
    const FilterResponse resp(Filter(ChainFilter::Kind::kBessel, n, fc));
    CHECK(RelErr(NoiseBandwidthHz(resp) / fc, expected_ratio) < 1e-7);
  }
  // n = 1 is a single pole: pi / 2 (REFERENCES.md section 3).
  const FilterResponse one(Filter(ChainFilter::Kind::kBessel, 1, 1.0));
  CHECK(RelErr(NoiseBandwidthHz(one), kPi / 2) < 1e-8);
}

}  // namespace
}  // namespace hushgain
