#include "circuit/noise_table.h"

#include <doctest/doctest.h>

#include <cmath>
#include <vector>

#include "integrate/band_integral.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// The closed form of a power law, derived here for the test (not the
// library's expm1 form): for d(f) = d0 (f / f0)^s, d^2 = d0^2 (f / f0)^p with
// p = 2 s, an antiderivative is d0^2 f0 (f / f0)^(p + 1) / (p + 1), or
// d0^2 f0 ln f when p = -1.
double PowerLawIntegral(double d0, double f0, double s, double a, double b) {
  const double p = 2 * s;
  if (std::fabs(p + 1) < 1e-15) return d0 * d0 * f0 * std::log(b / a);
  return d0 * d0 * f0 / (p + 1) *
         (std::pow(b / f0, p + 1) - std::pow(a / f0, p + 1));
}

NoiseTable Table(std::vector<double> f, std::vector<double> d,
                 TableEnds ends = TableEnds::kSlope) {
  NoiseTable t;
  t.f_hz = std::move(f);
  t.density = std::move(d);
  t.ends = ends;
  REQUIRE(t.Validate().empty());
  return t;
}

double Slope(double f1, double d1, double f2, double d2) {
  return std::log(d2 / d1) / std::log(f2 / f1);
}

TEST_CASE("a table interpolates linearly in log-log and meets its points") {
  const NoiseTable t = Table({10, 1000}, {100e-9, 10e-9});
  CHECK(RelErr(t.DensityAt(10), 100e-9) < test::kRelTight);
  CHECK(RelErr(t.DensityAt(1000), 10e-9) < test::kRelTight);
  // Half way in log f is half way in log d: sqrt(100 x 10) nV.
  CHECK(RelErr(t.DensityAt(100), std::sqrt(100e-9 * 10e-9)) < test::kRelTight);
  // Beyond the ends: slope -1/2 continues, or the end value stays.
  CHECK(RelErr(t.DensityAt(1e5), 1e-9) < test::kRelTight);
  CHECK(RelErr(t.DensityAt(0.1), 1e-6) < test::kRelTight);
  const NoiseTable flat = Table({10, 1000}, {100e-9, 10e-9}, TableEnds::kFlat);
  CHECK(RelErr(flat.DensityAt(1e5), 10e-9) < test::kRelTight);
  CHECK(RelErr(flat.DensityAt(0.1), 100e-9) < test::kRelTight);
}

TEST_CASE("a two-segment power law integrates to its closed form") {
  // 1 Hz..100 Hz falls as f^-1 (d^2 as f^-2, steeper than 1/f), then rises
  // as f^+1/2 to 10 kHz: the closed form is the sum of the two pieces.
  const NoiseTable t = Table({1, 100, 1e4}, {1e-6, 10e-9, 100e-9});
  const double expected = PowerLawIntegral(1e-6, 1, -1, 1, 100) +
                          PowerLawIntegral(10e-9, 100, 0.5, 100, 1e4);
  CHECK(RelErr(t.PsdIntegral(1, 1e4), expected) < 1e-12);
  // The band inside the table and beyond both ends (slopes continue).
  const double inside = PowerLawIntegral(1e-6, 1, -1, 3, 100) +
                        PowerLawIntegral(10e-9, 100, 0.5, 100, 5e3);
  CHECK(RelErr(t.PsdIntegral(3, 5e3), inside) < 1e-12);
  const double wide = PowerLawIntegral(1e-6, 1, -1, 0.1, 100) +
                      PowerLawIntegral(10e-9, 100, 0.5, 100, 1e5);
  CHECK(RelErr(t.PsdIntegral(0.1, 1e5), wide) < 1e-12);
  // A 1/f segment (p = -1) takes the logarithm.
  const NoiseTable pink = Table({1, 100}, {10e-9, 1e-9});
  CHECK(RelErr(pink.PsdIntegral(2, 50), 1e-16 * 1 * std::log(50.0 / 2)) <
        1e-12);
}

TEST_CASE(
    "the band integrator is exact on a table with a steep segment and a "
    "bump") {
  // A curve as read off a datasheet: a rise steeper than 1/f at low
  // frequency, a bump (a peak between 100 Hz and 1 kHz), a white floor.
  const std::vector<double> f = {1, 10, 100, 300, 1000, 1e4, 1e5};
  const std::vector<double> d = {2e-6, 60e-9, 12e-9, 30e-9, 9e-9, 8e-9, 8e-9};
  const NoiseTable t = Table(f, d);
  const double lo = 0.5, hi = 2e5;
  // The closed form, piece by piece (slopes from the points, the end slopes
  // continued below 1 Hz and above 100 kHz).
  double expected =
      PowerLawIntegral(d[0], f[0], Slope(f[0], d[0], f[1], d[1]), lo, f[0]);
  for (std::size_t i = 0; i + 1 < f.size(); ++i)
    expected += PowerLawIntegral(
        d[i], f[i], Slope(f[i], d[i], f[i + 1], d[i + 1]), f[i], f[i + 1]);
  expected +=
      PowerLawIntegral(d[6], f[6], Slope(f[5], d[5], f[6], d[6]), f[6], hi);
  CHECK(RelErr(t.PsdIntegral(lo, hi), expected) < 1e-12);

  IntegrationOptions options;
  options.relative_tolerance = 1e-8;
  options.breakpoints_hz = t.Breakpoints(lo, hi);
  CHECK(options.breakpoints_hz.size() == f.size());
  IntegrationResult r = IntegrateBand(
      lo, hi, 1,
      [&t](double freq, double* out) {
        out[0] = t.PsdAt(freq);
        return Status::Ok();
      },
      options);
  REQUIRE(r.converged);
  CHECK(RelErr(r.integrals[0], expected) < 1e-6);
  // Every kink is a cut of the partition.
  for (double point : f) {
    bool cut = false;
    for (const LogInterval& iv : r.partition)
      cut = cut || std::fabs(iv.a - std::log(point)) < 1e-12;
    CHECK_MESSAGE(cut, "no cut at " << point << " Hz");
  }
}

TEST_CASE("a table's validation names the bad point") {
  NoiseTable t;
  t.f_hz = {10};
  t.density = {1e-9};
  CHECK(t.Validate() == "a table needs at least two points, got one");
  t.f_hz = {10, 10};
  t.density = {1e-9, 1e-9};
  CHECK(t.Validate() ==
        "point 1: frequencies must increase strictly from point to point");
  t.f_hz = {10, 20};
  t.density = {1e-9, 0};
  CHECK(t.Validate() == "point 1: the density must be positive");
  t.density = {1e-9, 2e-9};
  CHECK(t.Validate().empty());
}

TEST_CASE("scaling a table scales its power integral by the square") {
  NoiseTable t = Table({10, 100, 1000}, {5e-15, 2e-15, 4e-15});
  const double before = t.PsdIntegral(1, 1e4);
  t.Scale(std::sqrt(2.0));
  CHECK(RelErr(t.PsdIntegral(1, 1e4), 2 * before) < test::kRelTight);
}

}  // namespace
}  // namespace hushgain
