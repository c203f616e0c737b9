// The response measured against its passband (analysis/frequency_response.h)
// on closed-form transfer functions written in the test.
#include "analysis/frequency_response.h"

#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <vector>

#include "base/physical_constants.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

TEST_CASE("a band-pass that blocks DC has both corners, against its maximum") {
  // H(s) = G (s/w_l) / ((1 + s/w_l)(1 + s/w_h)). With r = w_h / w_l its
  // largest |H| is G r / (1 + r) at sqrt(w_l w_h); |H|^2 = max^2 / 2 gives,
  // in u = w^2, the quadratic
  //   (r^2 / (w_l^2 w_h^2)) u^2
  //     + (r^2 (1/w_l^2 + 1/w_h^2) - 2 (1 + r)^2 / w_l^2) u + r^2 = 0,
  // whose two roots are the exact corners (derived here from |H|^2).
  const double g = 1000, fl = 20, fh = 50e3;
  const double wl = 2 * kPi * fl, wh = 2 * kPi * fh, r = wh / wl;
  const GainFunction h = [&](double f, std::complex<double>* out) {
    const std::complex<double> s(0, 2 * kPi * f);
    *out = g * (s / wl) / ((1.0 + s / wl) * (1.0 + s / wh));
    return Status::Ok();
  };
  const double qa = r * r / (wl * wl * wh * wh);
  const double qb = r * r * (1 / (wl * wl) + 1 / (wh * wh)) -
                    2 * (1 + r) * (1 + r) / (wl * wl);
  const double qc = r * r;
  const double disc = std::sqrt(qb * qb - 4 * qa * qc);
  const double low_hz = std::sqrt((-qb - disc) / (2 * qa)) / (2 * kPi);
  const double high_hz = std::sqrt((-qb + disc) / (2 * qa)) / (2 * kPi);

  // The same figures whatever band the maximum is read in.
  for (const auto& [band_low, band_high] :
       {std::pair{100.0, 10e3}, std::pair{500.0, 2e3}, std::pair{30.0, 40e3}}) {
    CAPTURE(band_low);
    const PassbandResponse p =
        SummarizePassband(h, band_low, band_high, 1e-3, 1e9, 10);
    REQUIRE(p.status.ok);
    CHECK(p.blocks_dc);
    CHECK(RelErr(p.passband_gain, g * r / (1 + r)) < 1e-9);
    REQUIRE(p.low_corner_found);
    REQUIRE(p.high_corner_found);
    CHECK(RelErr(p.low_corner_hz, low_hz) < 1e-7);
    CHECK(RelErr(p.high_corner_hz, high_hz) < 1e-7);
    CHECK(p.peaking_db < 1e-9);
  }
}

TEST_CASE("a second-order low-pass: -3 dB and peaking against the DC gain") {
  // H = 1 / (1 + s/(Q w0) + s^2/w0^2), Q = 1: with y = (f / f0)^2,
  // |H|^2 = 1 / ((1 - y)^2 + y). |H|^2 = 1/2 at y^2 - y - 1 = 0, y =
  // (1 + sqrt 5) / 2; the denominator is least at y = 1/2, where |H|^2 =
  // 1 / (1/4 + 1/2) = 4/3, 1.2494 dB (derived here).
  const double f0 = 1e3;
  const GainFunction h = [&](double f, std::complex<double>* out) {
    const std::complex<double> x(0, f / f0);
    *out = 1.0 / (1.0 + x + x * x);
    return Status::Ok();
  };
  const double bw = f0 * std::sqrt((1 + std::sqrt(5.0)) / 2);
  const double peaking = 10 * std::log10(4.0 / 3.0);
  // Bands below, around and above the corner: nothing moves.
  for (double band_low : {1.0, 300.0, 2e3}) {
    CAPTURE(band_low);
    const PassbandResponse p =
        SummarizePassband(h, band_low, band_low * 10, 1e-3, 1e7, 10);
    REQUIRE(p.status.ok);
    CHECK_FALSE(p.blocks_dc);
    CHECK(p.passband_gain == 1.0);
    // Brent's method refines the corner to 1e-10 in ln f.
    CHECK(RelErr(p.high_corner_hz, bw) < 1e-9);
    CHECK(std::fabs(p.peaking_db - peaking) < 1e-9);
    CHECK(RelErr(p.peak_hz, f0 / std::sqrt(2.0)) < 1e-5);
  }
}

TEST_CASE("the largest magnitude of uneven samples is refined between them") {
  // The same Q = 1 low-pass: |H| is largest at f0 / sqrt 2, where |H|^2 =
  // 4/3 (derived above). Samples at uneven frequencies, as a scan of
  // another transfer leaves them, the lowest at the range's low end.
  const double f0 = 1e3;
  const GainFunction h = [&](double f, std::complex<double>* out) {
    const std::complex<double> x(0, f / f0);
    *out = 1.0 / (1.0 + x + x * x);
    return Status::Ok();
  };
  std::vector<double> f = {1.0, 10.0, 230.0, 500.0, 900.0, 1e4, 1e5};
  std::vector<double> m;
  for (double fi : f) {
    std::complex<double> v;
    REQUIRE(h(fi, &v).ok);
    m.push_back(std::abs(v));
  }
  const ResponseMaximum r = LargestSampledMagnitude(h, f, m);
  REQUIRE(r.status.ok);
  CHECK_FALSE(r.at_low_end);
  CHECK(RelErr(r.magnitude, std::sqrt(4.0 / 3.0)) < 1e-10);
  CHECK(RelErr(r.f_hz, f0 / std::sqrt(2.0)) < 1e-5);
  // A response falling from the low end: the maximum is the first sample.
  const std::vector<double> falling = {3.0, 2.0, 1.0};
  const ResponseMaximum low =
      LargestSampledMagnitude(h, {1.0, 2.0, 3.0}, falling);
  CHECK(low.at_low_end);
  CHECK(low.magnitude == 3.0);
  CHECK(low.f_hz == 1.0);
}

}  // namespace
}  // namespace hushgain
