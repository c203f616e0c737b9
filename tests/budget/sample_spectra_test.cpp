#include "budget/sample_spectra.h"

#include <doctest/doctest.h>

#include <cmath>

#include "budget/compute_budget.h"
#include "budget/frequency_grid.h"
#include "integrate/cumulative_power.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

TEST_CASE("sampled densities of an inverting stage follow the textbook terms") {
  // REFERENCES.md section 6, plain feedback (ideal op-amp, low frequency):
  // output terms sqrt(4kTRin) Rf/Rin, sqrt(4kTRf), e_n NG with
  // NG = 1 + Rf/Rin; signal gain -Rf/Rin. The "simple example": Rin = 2.2k,
  // Rf = 330k, 300 K, e_n = 5 nV/rtHz, i_n = 0.5 pA/rtHz.
  const double rin = 2.2e3, rf = 330e3, t = 300.0;
  const Stage stage =
      test::InvertingStage(rin, rf, test::IdealOpAmp(5e-9, 0.5e-12), t);
  const SpectrumOutcome out = SampleSpectra(stage, {1.0, 3.0});
  REQUIRE(out.status.ok);
  const SpectrumSamples& s = out.samples;
  const double ng = 1.0 + rf / rin;
  const int k_rin = s.Find("R_in"), k_rf = s.Find("R_f"), k_en = s.Find("e_n"),
            k_in = s.Find("i_n-");
  REQUIRE(k_rin >= 0);
  REQUIRE(k_rf >= 0);
  REQUIRE(k_en >= 0);
  REQUIRE(k_in >= 0);
  for (int i = 0; i < 2; ++i) {
    CHECK(RelErr(s.density_v_per_rthz[k_rin][i],
                 std::sqrt(test::FourKT(t) * rin) * rf / rin) <
          test::kRelIdeal);
    CHECK(RelErr(s.density_v_per_rthz[k_rf][i],
                 std::sqrt(test::FourKT(t) * rf)) < test::kRelIdeal);
    CHECK(RelErr(s.density_v_per_rthz[k_en][i], 5e-9 * ng) < test::kRelIdeal);
    CHECK(RelErr(s.density_v_per_rthz[k_in][i], 0.5e-12 * rf) <
          test::kRelIdeal);
    CHECK(RelErr(s.signal_gain_abs[i], rf / rin) < test::kRelIdeal);
    CHECK(RelErr(s.noise_gain_abs[i], ng) < test::kRelIdeal);
    // Loop gain T = A beta with beta = 1 / NG for this network, and the
    // dominant-pole A(s) = A0 / (1 + s / w_p), f_p = GBW / A0 = 1 kHz
    // (REFERENCES.md section 11): |T| = A0 / sqrt(1 + (f / f_p)^2) / NG.
    const double f = s.f_hz[i];
    const double a0 = 1e12, f_pole = 1e15 / a0;
    CHECK(RelErr(s.loop_gain_abs[i],
                 a0 / std::sqrt(1 + (f / f_pole) * (f / f_pole)) / ng) <
          test::kRelIdeal);
    double sum = 0;
    for (const auto& d : s.density_v_per_rthz) sum += d[i] * d[i];
    CHECK(RelErr(s.total_v_per_rthz[i], std::sqrt(sum)) < test::kRelTight);
  }
  // REFERENCES.md section 6: RSS of the four terms 1192.821 nV/rtHz.
  CHECK(RelErr(s.total_v_per_rthz[0], 1192.821e-9) < 1e-6);
}

TEST_CASE("sampled spectra integrate to the budget's band total") {
  // The budget integrates adaptively (tolerance 1e-4); the trapezoid in
  // log f on a 200-per-decade grid is within about 1e-5 of it on these
  // smooth densities (O(h^2), see integrate/cumulative_power.h).
  Stage stage = test::TeeStage(4.7e3, 47e3, 220e3, 2.2e3,
                               test::IdealOpAmp(5e-9, 0.5e-12));
  stage.opamp.f_cv_hz = 10.0;
  stage.opamp.gbw_hz = 1e6;
  stage.opamp.open_loop_gain = 1e6;
  stage.band_low_hz = 0.1;
  stage.band_high_hz = 2e3;
  const BudgetOutcome budget = ComputeBudget(stage, BudgetOptions{});
  REQUIRE(budget.status.ok);
  const std::vector<double> f =
      LogFrequencyGrid(stage.band_low_hz, stage.band_high_hz, 200);
  const SpectrumOutcome out = SampleSpectra(stage, f);
  REQUIRE(out.status.ok);
  std::vector<double> psd;
  for (double d : out.samples.total_v_per_rthz) psd.push_back(d * d);
  const double rms = std::sqrt(CumulativeLogTrapezoid(f, psd).back());
  CHECK(RelErr(rms, budget.budget.output_rms_v) < 1e-4);
}

}  // namespace
}  // namespace hushgain
