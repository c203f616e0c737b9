#include "integrate/band_integral.h"

#include <doctest/doctest.h>

#include <cmath>

#include "base/physical_constants.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

IntegrationResult Integrate(double lo, double hi,
                            const std::function<double(double)>& s,
                            double tolerance = 1e-8) {
  IntegrationOptions options;
  options.relative_tolerance = tolerance;
  return IntegrateBand(
      lo, hi, 1,
      [&s](double f, double* out) {
        out[0] = s(f);
        return Status::Ok();
      },
      options);
}

// E_rms = e_w sqrt(f_c ln(f_H/f_L) + (f_H - f_L)), REFERENCES.md section 4
// (derived there; mpmath and scipy.quad agree to 11 digits).
double WhitePlusFlickerRms(double e_w, double fc, double lo, double hi) {
  return e_w * std::sqrt(fc * std::log(hi / lo) + (hi - lo));
}

TEST_CASE(
    "1/f plus white noise integrates to the closed form (section 4 examples)") {
  struct Case {
    double e_w, fc, lo, hi, published_rms;
  };
  const Case cases[] = {
      {10e-9, 100, 0.1, 10e3, 1.055992071e-6},  // example A
      {10e-9, 100, 0.1, 10, 216.890991e-9},     // example B
      {5e-9, 1000, 0.01, 100, 482.450266e-9},   // example C
  };
  for (const Case& c : cases) {
    auto r = Integrate(
        c.lo, c.hi, [&](double f) { return c.e_w * c.e_w * (1 + c.fc / f); },
        1e-6);
    REQUIRE(r.converged);
    const double rms = std::sqrt(r.integrals[0]);
    CHECK(RelErr(rms, WhitePlusFlickerRms(c.e_w, c.fc, c.lo, c.hi)) < 1e-8);
    CHECK(RelErr(rms, c.published_rms) < test::kRelTable);
  }
}

TEST_CASE("a pure 1/f density is integrated exactly on the first pass") {
  // In u = ln f, K/f df = K du: the Kronrod rule is exact, the error
  // estimate zero, and no interval is split.
  auto r = Integrate(
      1e-3, 1e3, [](double f) { return 4.0 / f; }, 1e-12);
  CHECK(r.converged);
  CHECK(r.intervals == 6);  // one per decade, never split
  CHECK(RelErr(r.integrals[0], 4.0 * std::log(1e6)) < 1e-14);
}

TEST_CASE("a single real pole has a noise bandwidth of pi/2 times f_3dB") {
  // ENBW / f_3dB = pi/2 for n = 1 (REFERENCES.md section 3).
  const double f3 = 1e3;
  auto r = Integrate(1e-6, 1e12,
                     [&](double f) { return 1.0 / (1 + (f / f3) * (f / f3)); });
  // The band [1e-6, 1e12] Hz misses f3^2/1e12 + 1e-6 Hz of the infinite
  // integral.
  CHECK(RelErr(r.integrals[0], kPi / 2 * f3) < 1e-8);
}

TEST_CASE("Butterworth noise bandwidths match (pi/2n)/sin(pi/2n)") {
  // REFERENCES.md section 3 table: n = 2: 1.110 720 735; n = 3: 1.047 197 551.
  const double published[] = {1.570796327, 1.110720735, 1.047197551,
                              1.026172153, 1.016640738};
  for (int n = 1; n <= 5; ++n) {
    auto r = Integrate(
        1e-9, 1e9, [&](double x) { return 1.0 / (1 + std::pow(x, 2 * n)); });
    CAPTURE(n);
    CHECK(RelErr(r.integrals[0], published[n - 1]) < 2e-9);
  }
}

TEST_CASE("two cascaded real poles: ENBW = (pi/4) f_p; 1.2203 times f_3dB") {
  // REFERENCES.md section 3: m = 2 identical poles; f_3dB = f_p sqrt(sqrt2 -
  // 1).
  const double fp = 1.0;
  auto r = Integrate(1e-12, 1e9, [&](double f) {
    return 1.0 / std::pow(1 + f * f / (fp * fp), 2);
  });
  CHECK(RelErr(r.integrals[0], kPi / 4 * fp) < 1e-9);
  CHECK(RelErr(r.integrals[0] / (fp * std::sqrt(std::sqrt(2.0) - 1)),
               1.220331226) < test::kRelTable);
}

TEST_CASE(
    "the converged partition's quadrature nodes re-integrate a changed "
    "density") {
  // Two real poles (section 3: ENBW = (pi/4) f_p): the adaptive run's
  // partition, as fixed nodes, gives back its own integral to rounding and
  // integrates the same density with f_p moved by 0.1 % to the run's accuracy.
  const double fp = 1.0;
  auto density = [](double pole) {
    return [pole](double f) {
      return 1.0 / std::pow(1 + f * f / (pole * pole), 2);
    };
  };
  auto r = Integrate(1e-12, 1e9, density(fp), 1e-10);
  REQUIRE(r.converged);
  REQUIRE(static_cast<int>(r.partition.size()) == r.intervals);
  const std::vector<QuadratureNode> nodes = QuadratureNodes(r.partition);
  CHECK(static_cast<int>(nodes.size()) == 15 * r.intervals);
  double same = 0, moved = 0;
  for (const QuadratureNode& n : nodes) {
    same += n.weight_hz * density(fp)(n.f_hz);
    moved += n.weight_hz * density(1.001 * fp)(n.f_hz);
  }
  CHECK(RelErr(same, r.integrals[0]) < 1e-14);
  CHECK(RelErr(moved, kPi / 4 * 1.001 * fp) < 1e-8);
}

TEST_CASE(
    "the Gauss nodes are the embedded 7-point rule on the same frequencies") {
  // In u = ln f, S(f) = u^k / f is u^k: Gauss-Legendre with 7 points is
  // exact to degree 13 and not beyond (the 15-point Kronrod rule is exact to
  // degree 22); the integral over u in [0, 2] is 2^(k+1) / (k + 1).
  const std::vector<LogInterval> partition = {{0.0, 1.0}, {1.0, 2.0}};
  const std::vector<QuadratureNode> gauss = GaussNodes(partition);
  const std::vector<QuadratureNode> kronrod = QuadratureNodes(partition);
  REQUIRE(gauss.size() == 14);
  for (std::size_t i = 0; i < 2; ++i)
    for (std::size_t k = 0; k < 7; ++k)
      CHECK(gauss[7 * i + k].f_hz == kronrod[15 * i + 2 * k + 1].f_hz);
  auto integral = [](const std::vector<QuadratureNode>& nodes, int k) {
    double sum = 0;
    for (const QuadratureNode& n : nodes)
      sum += n.weight_hz * std::pow(std::log(n.f_hz), k) / n.f_hz;
    return sum;
  };
  for (int k : {0, 1, 6, 13}) {
    CAPTURE(k);
    CHECK(RelErr(integral(gauss, k), std::pow(2.0, k + 1) / (k + 1)) < 1e-13);
  }
  // One interval of width 2, degree 14: the rule's error is
  // (b - a)^15 (7!)^4 / (15 (14!)^3) f^(14) with f^(14) = 14! constant
  // (Abramowitz and Stegun 25.4.30), 8.5e-8 of the integral 2^15 / 15.
  const std::vector<QuadratureNode> one = GaussNodes({{0.0, 2.0}});
  const double exact = std::pow(2.0, 15) / 15;
  double factorial_7 = 1, factorial_14 = 1;
  for (int i = 2; i <= 7; ++i) factorial_7 *= i;
  for (int i = 2; i <= 14; ++i) factorial_14 *= i;
  const double error = std::pow(2.0, 15) * std::pow(factorial_7, 4) /
                       (15 * factorial_14 * factorial_14);
  CHECK(RelErr(exact - integral(one, 14), error) < 1e-5);
  CHECK(RelErr(integral(QuadratureNodes({{0.0, 2.0}}), 14), exact) < 1e-13);
}

TEST_CASE("several components share evaluations and keep their own integrals") {
  IntegrationOptions options;
  auto r = IntegrateBand(
      1, 100, 2,
      [](double f, double* out) {
        out[0] = 1.0;
        out[1] = 1.0 / f;
        return Status::Ok();
      },
      options);
  CHECK(RelErr(r.integrals[0], 99.0) < 1e-9);
  CHECK(RelErr(r.integrals[1], std::log(100.0)) < 1e-12);
}

TEST_CASE("a failing integrand stops the integration with its status") {
  IntegrationOptions options;
  auto r = IntegrateBand(
      1, 10, 1, [](double, double*) { return Status::Fail("boom at 3 Hz"); },
      options);
  CHECK_FALSE(r.status.ok);
  CHECK(r.status.message == "boom at 3 Hz");
}

TEST_CASE("options validate with a message naming the field") {
  IntegrationOptions options;
  CHECK(options.Validate().empty());
  options.relative_tolerance = -1;
  CHECK(options.Validate() ==
        "relative_tolerance: expected a relative tolerance in (0, 1), got -1");
}

}  // namespace
}  // namespace hushgain
