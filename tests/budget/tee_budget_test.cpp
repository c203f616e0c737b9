// The budget of a T-network inverting stage against the worked example of
// REFERENCES.md section 6 (values chosen there; noise gains derived there by
// sympy nodal analysis; star-mesh transform: Kennelly 1899).
#include <doctest/doctest.h>

#include <cmath>

#include "budget/compute_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::FindContributor;
using test::RelErr;

constexpr double kRin = 4.7e3, kR1 = 47e3, kR2 = 220e3, kR3 = 2.2e3;

Stage WorkedExample() {
  OpAmpModel m = test::IdealOpAmp(5e-9, 0.5e-12);
  m.vos_v = 25e-6;
  m.ib_a = 0.95e-9;  // Ib- = 1.0 nA, Ib+ = 0.9 nA
  m.ios_a = 0.1e-9;
  Stage s = test::TeeStage(kRin, kR1, kR2, kR3, m, 300.0);
  s.band_low_hz = 1e-6;  // a 1 kHz brick-wall band, as in the example
  s.band_high_hz = 1e3;
  s.reference_hz = 1.0;
  return s;
}

Budget Compute(const Stage& stage) { return test::ComputeOrFail(stage, 1e-7); }

TEST_CASE("tee feedback acts as R1 + R2 + R1*R2/R3 at DC") {
  const Budget b = Compute(WorkedExample());
  const double req = kR1 + kR2 + kR1 * kR2 / kR3;
  CHECK(RelErr(req, 4.967e6) < test::kRelTight);
  CHECK(RelErr(b.signal_gain_dc, -req / kRin) < test::kRelIdeal);
  CHECK(RelErr(b.signal_gain_dc, -1056.8085) < 1e-7);
  REQUIRE(b.tee.has_value());
  CHECK(RelErr(b.tee->equivalent_resistance_ohm, req) < test::kRelTight);
}

TEST_CASE(
    "tee noise gain is 1 + R2/R3 + Req/Rin; above the plain 1 + Req/Rin") {
  const Budget b = Compute(WorkedExample());
  const double req = kR1 + kR2 + kR1 * kR2 / kR3;
  const double ng_t = 1 + kR2 / kR3 + req / kRin;
  CHECK(RelErr(ng_t, (1 + kR2 / kR3) * (1 + kR1 / kRin) + kR2 / kRin) <
        test::kRelTight);
  CHECK(RelErr(b.noise_gain_dc, ng_t) < test::kRelIdeal);
  CHECK(RelErr(b.noise_gain_dc, 1157.8085) < 1e-7);
  CHECK(RelErr(b.tee->plain_noise_gain_dc, 1057.8085) < 1e-7);
}

TEST_CASE("tee contributors match their closed-form output densities") {
  const Budget b = Compute(WorkedExample());
  const double kt4 = test::FourKT(300.0);
  const double req = kR1 + kR2 + kR1 * kR2 / kR3;
  const double ng_t = 1 + kR2 / kR3 + req / kRin;
  struct Row {
    const char* name;
    double closed_form;
    double published_nv;
  };
  const Row rows[] = {
      {"R_in", req * std::sqrt(kt4 / kRin), 9325.615},
      {"R1", std::sqrt(kt4 * kR1) * (1 + kR2 / kR3), 2818.400},
      {"R2", std::sqrt(kt4 * kR2), 60.373},
      {"R3", kR2 * std::sqrt(kt4 / kR3), 603.731},
      {"e_n", 5e-9 * ng_t, 5789.043},
      {"i_n-", 0.5e-12 * req, 2483.500},
  };
  double sum_sq = 0;
  for (const Row& r : rows) {
    CAPTURE(r.name);
    const double engine =
        FindContributor(b, r.name).output_density_ref_v_per_rthz;
    CHECK(RelErr(engine, r.closed_form) < test::kRelIdeal);
    CHECK(RelErr(engine * 1e9, r.published_nv) < 2e-6);  // 3 decimals published
    sum_sq += r.closed_form * r.closed_form;
  }
  CHECK(RelErr(b.output_density_ref_v_per_rthz * 1e9, 11617.20) < 1e-6);
  CHECK(RelErr(b.output_density_ref_v_per_rthz, std::sqrt(sum_sq)) <
        test::kRelIdeal);
  // Referred to the input: 10.992 72 nV/rtHz; over 1 kHz: 367.368 uV rms.
  CHECK(RelErr(b.input_density_ref_per_rthz * 1e9, 10.99272) < 1e-6);
  CHECK(RelErr(b.output_rms_v * 1e6, 367.368) < 2e-6);
}

TEST_CASE(
    "the plain equivalent gives the published plain-Rf column and the noise "
    "cost") {
  const Budget b = Compute(WorkedExample());
  // Plain Rf = 4.967 M: RSS 11 008.685 nV/rtHz; the tee costs 11617.20 /
  // 11008.685.
  const double plain_rms_published = 11008.685e-9 * std::sqrt(1e3 - 1e-6);
  CHECK(RelErr(b.tee->plain_output_rms_v, plain_rms_published) < 2e-6);
  CHECK(RelErr(b.tee->noise_cost_ratio, 11617.20 / 11008.685) < 2e-6);
  // R1, R2, R3 are added; R_f is replaced; e_n is raised by NG_T / NG.
  bool saw_r3 = false, saw_rf = false, saw_en = false;
  for (const TeeChange& c : b.tee->changes) {
    if (c.name == "R3") saw_r3 = c.kind == TeeChange::Kind::kAdded;
    if (c.name == "R_f") saw_rf = c.kind == TeeChange::Kind::kRemoved;
    if (c.name == "e_n") {
      saw_en = c.kind == TeeChange::Kind::kRaised;
      CHECK(RelErr(c.tee_output_rms_v / c.plain_output_rms_v,
                   1157.8085 / 1057.8085) < 1e-6);
    }
    if (c.name == "R_in") CHECK(c.kind == TeeChange::Kind::kSame);
  }
  CHECK(saw_r3);
  CHECK(saw_rf);
  CHECK(saw_en);
}

TEST_CASE("tee offsets: Vos NG_T; Ib- Req and the balance resistor Req/NG_T") {
  const Budget b = Compute(WorkedExample());
  // Vout = Vos NG_T + Ib- Req - Ib+ Rp NG_T; with Rp = 0: 28.945 21 + 4.967 mV.
  CHECK(RelErr(b.offset.vos_v * 1e3, 28.94521) < 1e-6);
  CHECK(RelErr((b.offset.ib_v + b.offset.ios_v) * 1e3, 4.967) < 1e-6);
  CHECK(RelErr(b.offset.worst_case_v * 1e3, 33.91221) < 1e-6);
  // Rp(balance) = Rin || (R1 + R2 || R3) = 4290.001 ohm.
  CHECK(RelErr(b.offset.balance_resistor_ohm, 4290.001) < 1e-6);
}

TEST_CASE("tee with R_plus = 4.3k: offsets and the noise the resistor adds") {
  Stage stage = WorkedExample();
  stage.plus_resistor = {PlusResistor::Mode::kValue, 4.3e3};
  const Budget b = Compute(stage);
  // Ib+ adds -4.480 72 mV; with Ios taken positive (Ib- > Ib+) the total is
  // 29.431 49 mV. Vos and Ios have unknown sign: the budget keeps magnitudes,
  // so the signed total is Vos + Ib term + Ios term here.
  CHECK(RelErr((b.offset.vos_v + b.offset.ib_v + b.offset.ios_v) * 1e3,
               29.43149) < 1e-6);
  CHECK(RelErr(FindContributor(b, "R_plus").output_density_ref_v_per_rthz * 1e9,
               9772.445) < 1e-6);
  CHECK(RelErr(FindContributor(b, "i_n+").output_density_ref_v_per_rthz * 1e9,
               2489.288) < 1e-6);
  CHECK(RelErr(b.output_density_ref_v_per_rthz * 1e9, 15383.65) < 1e-6);
}

TEST_CASE("tee bandwidth is set by NG_T; not by the signal gain") {
  // REFERENCES.md section 11: the section 6 tee with A0 = 1e6, GBW = 10 MHz
  // has f_3dB = GBW/NG_T + f_p = 8 647.0 Hz.
  Stage stage = WorkedExample();
  stage.opamp.open_loop_gain = 1e6;
  stage.opamp.gbw_hz = 1e7;
  const Budget b = Compute(stage);
  const double ng_t =
      b.noise_gain_dc * (1e6 + 1157.8085) / 1e6;  // the ideal NG_T
  CHECK(RelErr(b.bandwidth_3db_hz, 1e7 / ng_t + 10.0) < 1e-6);
  CHECK(RelErr(b.bandwidth_3db_hz, 8647.0) < 1e-5);
  CHECK(b.tee->plain_bandwidth_3db_hz > b.bandwidth_3db_hz);
}

}  // namespace
}  // namespace hushgain
