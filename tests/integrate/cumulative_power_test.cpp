#include "integrate/cumulative_power.h"

#include <doctest/doctest.h>

#include <cmath>

#include "budget/frequency_grid.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

std::vector<double> Psd(const std::vector<double>& f, double e_w,
                        double corner_hz) {
  std::vector<double> out;
  for (double x : f) out.push_back(e_w * e_w * (1.0 + corner_hz / x));
  return out;
}

TEST_CASE("a 1/f density is integrated exactly in log f") {
  // S = K / f: integral from f1 to f2 is K ln(f2 / f1) (derived here); in
  // u = ln f the integrand S(f) f = K is constant, so the trapezoid rule is
  // exact on any grid.
  const std::vector<double> f = LogFrequencyGrid(0.1, 10.0, 7);
  std::vector<double> psd;
  for (double x : f) psd.push_back(2e-16 / x);
  const std::vector<double> p = CumulativeLogTrapezoid(f, psd);
  CHECK(p.front() == 0.0);
  CHECK(RelErr(p.back(), 2e-16 * std::log(100.0)) < test::kRelTight);
  CHECK(RelErr(p[3], 2e-16 * std::log(f[3] / f[0])) < test::kRelTight);
}

TEST_CASE("1/f plus white noise over a band matches the closed form") {
  // REFERENCES.md section 4, example A [derived here]: e_w = 10 nV/rtHz,
  // f_c = 100 Hz, 0.1 Hz to 10 kHz:
  //   E_rms = e_w sqrt(f_c ln(fH/fL) + (fH - fL)) = 1.055 992 071 uV.
  const double expected =
      10e-9 * std::sqrt(100.0 * std::log(1e5) + (1e4 - 0.1));
  CHECK(RelErr(expected, 1.055992071e-6) < 1e-9);
  // The trapezoid error is O(h^2) in the log step: at 50 points per decade
  // about 2e-4 on the white part; at 1000 per decade below 1e-6.
  for (auto [ppd, tolerance] : {std::pair{50.0, 3e-4}, {1000.0, 1e-6}}) {
    const std::vector<double> f = LogFrequencyGrid(0.1, 1e4, ppd);
    const double rms =
        std::sqrt(CumulativeLogTrapezoid(f, Psd(f, 10e-9, 100.0)).back());
    CHECK(RelErr(rms, expected) < tolerance);
  }
}

TEST_CASE("the log grid holds both edges and steps evenly in log f") {
  const std::vector<double> f = LogFrequencyGrid(0.05, 5.0, 50);
  // Two decades at 50 per decade: 100 intervals, 101 points.
  REQUIRE(f.size() == 101);
  CHECK(f.front() == 0.05);
  CHECK(f.back() == 5.0);
  for (std::size_t i = 1; i < f.size(); ++i)
    CHECK(RelErr(f[i] / f[i - 1], std::pow(10.0, 1.0 / 50)) < 1e-12);
  // A band of a fraction of a decade still gets at least one interval.
  CHECK(LogFrequencyGrid(1.0, 1.01, 50).size() == 2);
  // Joined grids share their meeting point once.
  const std::vector<double> joined =
      JoinGrids({LogFrequencyGrid(1, 10, 5), LogFrequencyGrid(10, 100, 5)});
  CHECK(joined.size() == 11);
  CHECK(joined[5] == 10.0);
}

}  // namespace
}  // namespace hushgain
