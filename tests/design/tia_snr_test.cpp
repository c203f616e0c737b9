// SNR of a photodiode stage against optical power: the noise grows by the
// photocurrent's own shot noise (Schottky 1918), the NEP is where the SNR
// curve crosses 1, and the stage saturates where its DC output reaches the
// headroom. Expected values are built here from closed forms.
#include "design/tia_snr.h"

#include <doctest/doctest.h>

#include <cmath>

#include "base/physical_constants.h"
#include "budget/compute_budget.h"
#include "circuit/stage_at_temperature.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

constexpr double kRf = 1e6, kResp = 0.5, kBackground = 100e-9;

// A lit receiver at 25 °C on an ideal op-amp with e_n and i_n.
Stage Receiver() {
  Stage s = test::ReceiverStage(test::IdealOpAmp(10e-9, 10e-15), 100e-12, 1e9,
                                kRf, 2e-12);
  s.opamp.vos_v = 1e-3;
  s.opamp.supply_v = 10;
  s.photodiode.responsivity_a_per_w = kResp;
  s.photodiode.photocurrent_a = kBackground;
  s.full_scale_output_v = 3;
  return s;
}

TiaSnrResult Run(const Stage& s, double lo, double hi, int points) {
  TiaSnrOptions o;
  o.power_min_w = lo;
  o.power_max_w = hi;
  o.points = points;
  REQUIRE(o.Validate().empty());
  TiaSnrResult r = ComputeTiaSnr(s, o);
  REQUIRE_MESSAGE(r.status.ok, r.status.message);
  return r;
}

TEST_CASE(
    "the input noise grows as N0^2 + 2 q R P B with the signal light's shot "
    "noise") {
  // The photocurrent enters where the signal does, so its input-referred
  // density is sqrt(2 q I) at every frequency (Schottky 1918) and adds
  // 2 q R P (f_high - f_low) to the input noise power.
  const Stage s = Receiver();
  const TiaSnrResult r = Run(s, 1e-9, 1e-3, 13);
  const double band = s.band_high_hz - s.band_low_hz;
  for (const TiaSnrPoint& p : r.points) {
    CAPTURE(p.power_w);
    const double expected =
        std::sqrt(r.noise_floor_a * r.noise_floor_a +
                  2 * kElementaryChargeC * kResp * p.power_w * band);
    CHECK(RelErr(p.input_rms_a, expected) < 2e-4);  // integration 1e-4 on power
    CHECK(RelErr(p.snr, kResp * p.power_w / p.input_rms_a) < test::kRelTight);
  }
  // Shot noise takes over at high power: SNR grows as sqrt(P) there.
  const TiaSnrPoint& a = r.points[r.points.size() - 2];
  const TiaSnrPoint& b = r.points.back();
  CHECK(std::log(b.snr / a.snr) / std::log(b.power_w / a.power_w) ==
        doctest::Approx(0.5).epsilon(0.02));
  CHECK(b.shot_share > 0.9);
}

TEST_CASE("the NEP over the band is the power where the SNR curve crosses 1") {
  const Stage s = Receiver();
  const TiaSnrResult r = Run(s, 1e-9, 1e-3, 7);
  REQUIRE(r.nep_w > 0);
  // The closed form R P = q B + sqrt((q B)^2 + N0^2) (design/tia_snr.h).
  const double qb = kElementaryChargeC * (s.band_high_hz - s.band_low_hz);
  CHECK(RelErr(r.nep_w * kResp,
               qb + std::sqrt(qb * qb + r.noise_floor_a * r.noise_floor_a)) <
        1e-3);
  // A curve sampled densely around it crosses 1 there: log-log
  // interpolation between the two points that bracket SNR = 1.
  const TiaSnrResult near = Run(s, r.nep_w / 3, r.nep_w * 3, 41);
  double crossing = 0;
  for (std::size_t i = 1; i < near.points.size(); ++i) {
    const TiaSnrPoint& lo = near.points[i - 1];
    const TiaSnrPoint& hi = near.points[i];
    if (lo.snr < 1 && hi.snr >= 1) {
      const double t = std::log(1 / lo.snr) / std::log(hi.snr / lo.snr);
      crossing = lo.power_w * std::pow(hi.power_w / lo.power_w, t);
    }
  }
  CHECK(RelErr(crossing, r.nep_w) < 1e-3);
  // And a budget of the stage lit at the NEP has SNR 1.
  Stage lit = s;
  lit.photodiode.photocurrent_a += kResp * r.nep_w;
  const BudgetOutcome at = ComputeBudget(lit, {});
  REQUIRE(at.status.ok);
  CHECK(RelErr(kResp * r.nep_w / at.budget.input_rms, 1.0) < 1e-3);
}

TEST_CASE(
    "the stage saturates where the DC output and the offset reach the "
    "full-scale swing") {
  // Ideal op-amp: the DC output is -(I_bg + R P) R_f and the worst-case
  // offset Vos (1 + R_f / R_sh) (REFERENCES.md section 7 at DC), so the
  // 3 V full scale is reached at R P_sat = (3 - I_bg R_f - Vos NG) / R_f.
  const Stage s = Receiver();
  const TiaSnrResult r = Run(s, 1e-7, 1e-4, 31);
  const double offset = 1e-3 * (1 + kRf / 1e9);
  const double expected = (3 - kBackground * kRf - offset) / kRf / kResp;
  CHECK(RelErr(r.saturation_power_w, expected) < test::kRelIdeal);
  CHECK(r.limit_name == "full-scale swing");
  for (const TiaSnrPoint& p : r.points) {
    CAPTURE(p.power_w);
    CHECK(p.saturated == (p.power_w > expected * (1 + 1e-9)));
    CHECK(RelErr(p.dc_output_v, -(kBackground + kResp * p.power_w) * kRf) <
          test::kRelIdeal);
  }
  // Without a full scale the limit is half the 10 V supply span.
  Stage no_fs = s;
  no_fs.full_scale_output_v.reset();
  const TiaSnrResult half = Run(no_fs, 1e-7, 1e-4, 3);
  CHECK(half.limit_name == "half the supply span");
  CHECK(RelErr(half.saturation_power_w, (5 - kBackground * kRf - offset) / kRf /
                                            kResp) < test::kRelIdeal);
}

TEST_CASE("tia snr options name the field and the rule") {
  TiaSnrOptions o;
  o.power_min_w = 0;
  o.power_max_w = 1;
  CHECK(o.Validate() == "power_min_w: expected a positive power, got 0");
  o.power_min_w = 1e-3;
  o.power_max_w = 1e-6;
  CHECK(o.Validate() ==
        "power_max_w: expected a power above power_min_w (0.001 W), got 1e-06");
  o.power_max_w = 1;
  o.points = 1;
  CHECK(o.Validate() == "points: expected 2 to 10000, got 1");
}

}  // namespace
}  // namespace hushgain
