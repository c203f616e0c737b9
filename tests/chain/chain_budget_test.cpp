// A stage's chain through the review (chain/chain_budget.h,
// review/review.h): the stage's own contributors reach the converter
// through the filter, and a chain that cannot work draws its warnings.
#include "chain/chain_budget.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

Stage WithChain(double sample_rate_hz, double cutoff_hz) {
  // R_in 1 k, R_f 100 k, an ideal op-amp with e_n 5 nV/rtHz: a white
  // output density up to far beyond the chain.
  Stage s = test::InvertingStage(1e3, 100e3, test::IdealOpAmp(5e-9), 300.0);
  s.band_low_hz = 1.0;
  s.band_high_hz = 1e3;
  s.reference_hz = 100.0;
  SignalChain chain;
  ChainFilter f;
  f.kind = ChainFilter::Kind::kButterworth;
  f.order = 2;
  f.cutoff_hz = cutoff_hz;
  chain.filter = f;
  chain.adc.bits = 16;
  chain.adc.full_scale_v = 10.0;
  chain.adc.sample_rate_hz = sample_rate_hz;
  s.chain = chain;
  return s;
}

TEST_CASE(
    "a stage's white output noise reaches the converter times the filter's "
    "ENBW") {
  // REFERENCES.md section 6: the output density of R_in, R_f and e_n is
  // 4kT R_in (R_f/R_in)^2 + 4kT R_f + (e_n NG)^2 with NG = 1 + R_f/R_in;
  // through a 2nd-order Butterworth (ENBW 1.110720735 f_c, section 3) from
  // f_L = 1 Hz: S (1.110720735 f_c - f_L).
  const Stage s = WithChain(100e3, 2e3);
  const Budget b = test::ComputeOrFail(s, 1e-8);
  REQUIRE(b.chain);
  const double four_kt = test::FourKT(300.0);
  const double ng = 101;
  const double psd =
      four_kt * 1e3 * 100.0 * 100.0 + four_kt * 100e3 + 5e-9 * ng * 5e-9 * ng;
  const double expected = psd * (1.110720735 * 2e3 - 1.0);
  const ChainNoiseShare& front = b.chain->blocks.front();
  CHECK(front.name == "front end");
  CHECK(RelErr(front.rms_v * front.rms_v, expected) < 1e-4);
  // The contributors keep the budget's names, largest first: e_n (NG 101
  // x 5 nV) over R_in (100 x 4.07 nV).
  REQUIRE(b.chain->front_end_contributors.size() >= 3);
  CHECK(b.chain->front_end_contributors[0].name == "e_n");
  CHECK(b.chain->front_end_contributors[1].name == "R_in");
  // A chain that can work draws no warning.
  CHECK(b.warnings.empty());
}

TEST_CASE("a chain that cannot work says why") {
  Stage s = WithChain(1.5e3, 500.0);
  s.full_scale_output_v = 6.0;
  const Budget b = test::ComputeOrFail(s, 1e-4);
  const std::vector<std::string> expected = {
      "the band's upper edge (1000 Hz) is above the converter's Nyquist "
      "frequency (750 Hz): the signal aliases",
      "the filter's -3 dB cutoff (500 Hz) is below the band's upper edge "
      "(1000 Hz): it cuts the signal",
      "the stage's full-scale swing (12 V peak to peak at the converter) "
      "exceeds the converter's 10 V input range",
  };
  for (const std::string& w : expected)
    CHECK(std::find(b.warnings.begin(), b.warnings.end(), w) !=
          b.warnings.end());
  CHECK(b.warnings.size() == expected.size());
}

TEST_CASE("no filter in front of the converter leaves the fold at its limit") {
  Stage s = WithChain(100e3, 2e3);
  s.chain->filter.reset();
  const Budget b = test::ComputeOrFail(s, 1e-4);
  REQUIRE(b.chain);
  CHECK(b.chain->fold_limited);
  REQUIRE(b.warnings.size() == 1);
  CHECK(b.warnings[0] ==
        "the noise above the converter's Nyquist frequency was counted up to "
        "5e+10 Hz and had still not fallen away: the folded noise is a floor; "
        "add or steepen the filter");
}

TEST_CASE("a stage without a chain has no chain block") {
  Stage s = WithChain(100e3, 2e3);
  s.chain.reset();
  CHECK_FALSE(test::ComputeOrFail(s, 1e-4).chain);
}

}  // namespace
}  // namespace hushgain
