#include "design/tia_suggest.h"

#include <doctest/doctest.h>

#include <cmath>

#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// The REFERENCES.md section 7 photodiode and op-amp: C = C_d + C_in = 50 pF,
// GBW = 10 MHz. The Butterworth bandwidth is f_0 = sqrt(GBW / (2 pi R_f
// (C + C_f))) with C_f = sqrt(2 w_t R_f C - 1) / (w_t R_f) (derived there).
Stage Photodiode() {
  Stage s;
  s.name = "suggest";
  s.temperature_k = 300;
  s.band_low_hz = 1;
  s.band_high_hz = 10e3;
  s.reference_hz = 1e3;
  s.topology = Topology::kTransimpedance;
  s.photodiode.capacitance_f = 47e-12;
  s.photodiode.responsivity_a_per_w = 0.5;
  s.opamp = test::IdealOpAmp(10e-9, 1e-15);
  s.opamp.open_loop_gain = 1e9;
  s.opamp.gbw_hz = 10e6;
  s.opamp.c_cm_f = 3e-12;
  s.feedback.resistor_ohm = 1e6;
  return s;
}

double FlatBandwidth(double rf) {
  const double c = 50e-12, wt = 2 * kPi * 10e6;
  const double cf = std::sqrt(2 * wt * rf * c - 1) / (wt * rf);
  return std::sqrt(10e6 / (2 * kPi * rf * (c + cf)));
}

TEST_CASE("a 1 ohm candidate whose bandwidth lies beyond the search counts") {
  // With R_out 100 ohm and R_f 1 ohm the transimpedance never falls 3 dB
  // below 100 x GBW (the response is not found there: more than any
  // target). Before, that read as "0 Hz flat" and refused the whole list,
  // while the same list from 10 ohm succeeded.
  Stage stage = Photodiode();
  stage.opamp.output_resistance_ohm = 100;
  TiaSuggestOptions options;
  options.bandwidth_hz = 50e3;
  options.rows = 1;
  for (double r = 1; r <= 1e7; r *= 10) options.resistors_ohm.push_back(r);
  const TiaSuggestion with_one = SuggestTransimpedance(stage, options);
  REQUIRE_MESSAGE(with_one.status.ok, with_one.status.message);
  options.resistors_ohm.erase(options.resistors_ohm.begin());
  const TiaSuggestion from_ten = SuggestTransimpedance(stage, options);
  REQUIRE_MESSAGE(from_ten.status.ok, from_ten.status.message);
  REQUIRE(with_one.best >= 0);
  CHECK(with_one.rows[with_one.best].rf_ohm ==
        from_ten.rows[from_ten.best].rf_ohm);
}

TEST_CASE(
    "the largest E12 feedback resistor for 50 kHz is the one the closed form "
    "allows") {
  TiaSuggestOptions options;
  options.bandwidth_hz = 50e3;
  // E12 over 1 M .. 82 M (IEC 60063).
  for (double decade : {1e6, 1e7})
    for (double v :
         {1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2})
      options.resistors_ohm.push_back(v * decade);
  options.rows = 3;
  REQUIRE(options.Validate().empty());
  // Section 7 closed form: 12 M is flat to 51.3 kHz, 15 M only to 45.9 kHz.
  CHECK(FlatBandwidth(12e6) > 50e3);
  CHECK(FlatBandwidth(15e6) < 50e3);

  const TiaSuggestion s = SuggestTransimpedance(Photodiode(), options);
  REQUIRE_MESSAGE(s.status.ok, s.status.message);
  REQUIRE(s.rows.size() ==
          4);  // 8.2 M, 10 M, 12 M meet it; 15 M shown as missing it
  REQUIRE(s.best == 2);
  CHECK(s.rows[s.best].rf_ohm == 12e6);
  CHECK(s.rows[s.best].meets_target);
  CHECK_FALSE(s.rows[3].meets_target);
  CHECK(s.rows[3].rf_ohm == 15e6);
  for (int i = 0; i <= s.best; ++i) {
    CAPTURE(i);
    CHECK(RelErr(s.rows[i].bandwidth_3db_hz, 50e3) <
          1e-3);  // C_f set for the target
    CHECK(RelErr(s.rows[i].butterworth_bandwidth_hz,
                 FlatBandwidth(s.rows[i].rf_ohm)) < 0.01);
    CHECK(s.rows[i].peaking_db < 0.01);  // at least as damped as Butterworth
  }
  // Larger R_f, less input current noise (R_f's 4kT/R_f falls).
  CHECK(s.rows[2].input_density_a_per_rthz <
        s.rows[0].input_density_a_per_rthz);
  // GBW / (2 pi C f^2) = 12.73 M, the textbook estimate of the largest R_f.
  CHECK(RelErr(s.largest_rf_estimate_ohm, 10e6 / (2 * kPi * 50e-12 * 2.5e9)) <
        test::kRelTight);
}

TEST_CASE("a target no candidate reaches says what to change") {
  TiaSuggestOptions options;
  options.bandwidth_hz = 5e6;
  options.resistors_ohm = {1e6, 10e6};
  const TiaSuggestion s = SuggestTransimpedance(Photodiode(), options);
  CHECK_FALSE(s.status.ok);
  CHECK(s.status.message.find(
            "a faster op-amp or a smaller photodiode is needed") !=
        std::string::npos);
}

TEST_CASE("suggestion options validate with a message naming the field") {
  TiaSuggestOptions options;
  options.resistors_ohm = {1e6};
  CHECK(options.Validate() ==
        "bandwidth_hz: expected a positive frequency, got 0");
}

TEST_CASE(
    "background light and a full-scale swing cap R_f where the headroom "
    "binds") {
  // Ideal op-amp, no offsets: the DC output is I_bg R_f, so a 4 V swing
  // with 1 uA of background light allows R_f <= 4 M; the 50 kHz target
  // alone would allow 12 M (the test above). E12: 3.9 M is the largest.
  Stage stage = Photodiode();
  stage.photodiode.photocurrent_a = 1e-6;
  stage.full_scale_output_v = 4;
  TiaSuggestOptions options;
  options.bandwidth_hz = 50e3;
  for (double decade : {1e6, 1e7})
    for (double v :
         {1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2})
      options.resistors_ohm.push_back(v * decade);
  options.rows = 2;
  const TiaSuggestion s = SuggestTransimpedance(stage, options);
  REQUIRE_MESSAGE(s.status.ok, s.status.message);
  CHECK(s.limited_by == TiaLimit::kHeadroom);
  CHECK(s.headroom_limit_v == 4);
  CHECK(s.headroom_limit_name == "full-scale swing");
  REQUIRE(s.best == 1);
  CHECK(s.rows[s.best].rf_ohm == 3.9e6);
  CHECK(s.rows[s.best].fits_headroom);
  CHECK(RelErr(s.rows[s.best].dc_output_v, -1e-6 * 3.9e6) < 1e-6);
  // The next value up meets the bandwidth but not the headroom.
  REQUIRE(s.rows.size() == 3);
  CHECK(s.rows[2].rf_ohm == 4.7e6);
  CHECK(s.rows[2].meets_target);
  CHECK_FALSE(s.rows[2].fits_headroom);
  // Without the light the bandwidth binds again.
  stage.photodiode.photocurrent_a = 0;
  CHECK(SuggestTransimpedance(stage, options).limited_by ==
        TiaLimit::kBandwidth);
}

TEST_CASE(
    "C_f from the E6 series with the resistor's parasitic counted in; a "
    "parasitic above the need is the parasitic alone") {
  // IEC 60063 E6: 1.0 1.5 2.2 3.3 4.7 6.8 per decade.
  const double e6[] = {1.0, 1.5, 2.2, 3.3, 4.7, 6.8};
  auto in_e6 = [&](double farads) {
    const double m = farads / std::pow(10.0, std::floor(std::log10(farads)));
    for (double v : e6)
      if (std::fabs(m / v - 1) < 1e-9) return true;
    return false;
  };
  TiaSuggestOptions options;
  options.bandwidth_hz = 20e3;
  options.resistors_ohm = {1e6, 2.2e6, 4.7e6, 10e6};
  options.rows = 3;
  options.capacitor_series = PreferredSeries::kE6;
  options.parasitic_capacitance_f = 0.2e-12;
  const TiaSuggestion s = SuggestTransimpedance(Photodiode(), options);
  REQUIRE_MESSAGE(s.status.ok, s.status.message);
  for (int i = 0; i <= s.best; ++i) {
    const TiaCandidate& r = s.rows[i];
    CAPTURE(r.rf_ohm);
    REQUIRE_FALSE(r.parasitic_alone);
    CHECK(in_e6(r.capacitor_part_f));
    CHECK(RelErr(r.cf_f, 0.2e-12 + r.capacitor_part_f) < test::kRelTight);
    // At or below the target's C_f: the -3 dB point at or above the target,
    // and no peaking (at or above the Butterworth C_f).
    CHECK(r.bandwidth_3db_hz >= 20e3 * (1 - 1e-3));
    CHECK(r.peaking_db < 0.01);
  }
  // A 5 pF parasitic is more than a 20 kHz target allows at 10 M (about
  // 1 / (2 pi 10 M 20 kHz) = 0.8 pF): the parasitic alone, no part, and
  // the -3 dB point falls to the pole of R_f || 5 pF, 1 / (2 pi R_f C_f) =
  // 3.18 kHz (the loop, with GBW 10 MHz and a noise gain of 11 there, moves
  // it by well under 1 %), so the row misses the target.
  options.parasitic_capacitance_f = 5e-12;
  options.resistors_ohm = {10e6};
  const TiaSuggestion alone = SuggestTransimpedance(Photodiode(), options);
  REQUIRE_MESSAGE(alone.status.ok, alone.status.message);
  REQUIRE(alone.best == 0);
  const TiaCandidate& r = alone.rows[0];
  CHECK(r.parasitic_alone);
  CHECK(r.capacitor_part_f == 0);
  CHECK(r.cf_f == 5e-12);
  CHECK(RelErr(r.bandwidth_3db_hz, 1 / (2 * kPi * 10e6 * 5e-12)) < 0.01);
  CHECK_FALSE(r.meets_target);
}

}  // namespace
}  // namespace hushgain
