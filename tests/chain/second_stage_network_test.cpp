// A chain's second stage given as a stage file (chain/second_stage_network.h):
// its network solved by the engine, against the gain block it equals where
// the models coincide, and against the single-pole closed form.
#include "chain/second_stage_network.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <memory>
#include <string>
#include <vector>

#include "chain/chain_budget.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// Agreement between the network and its gain block: both integrate the same
// shapes, so only the engine's ideal op-amp (A0 1e12, GBW 1e15: parts in
// 1e10 at these gains) and the integrals' own tolerance (1e-10) separate
// them.
constexpr double kRelSame = 1e-6;

// The front stage of chain_budget_test: R_in 1 k, R_f 100 k, an ideal
// op-amp with e_n 5 nV/rtHz at 300 K, 1 Hz .. 1 kHz; a 2nd-order
// Butterworth at 2 kHz into a 16-bit converter sampling at 100 kHz.
Stage Front(const SecondStage& second) {
  Stage s = test::InvertingStage(1e3, 100e3, test::IdealOpAmp(5e-9), 300.0);
  s.band_low_hz = 1.0;
  s.band_high_hz = 1e3;
  s.reference_hz = 100.0;
  SignalChain chain;
  ChainFilter f;
  f.kind = ChainFilter::Kind::kButterworth;
  f.order = 2;
  f.cutoff_hz = 2e3;
  chain.filter = f;
  chain.adc.bits = 16;
  chain.adc.full_scale_v = 10.0;
  chain.adc.sample_rate_hz = 100e3;
  chain.second_stage = second;
  s.chain = chain;
  return s;
}

SecondStage FileStage(const Stage& network, const std::string& file) {
  SecondStage s;
  s.file = file;
  s.network = std::make_shared<const Stage>(network);
  return s;
}

const ChainNoiseShare& Block(const ChainBlock& c, const std::string& name) {
  for (const ChainNoiseShare& b : c.blocks)
    if (b.name == name) return b;
  FAIL("no block " << name);
  return c.blocks.front();
}

double Share(const std::vector<ChainNoiseShare>& list,
             const std::string& name) {
  for (const ChainNoiseShare& s : list)
    if (s.name == name) return s.share;
  FAIL("no contributor " << name);
  return 0;
}

TEST_CASE("a second stage file of x(-R2/R1) equals its gain block") {
  // REFERENCES.md section 6, plain feedback with an ideal op-amp: the
  // second stage R1 = 2 k, R2 = 20 k has gain -R2/R1 = -10, NG = 11, and
  // at its output e_n NG, i_n- R2, sqrt(4kT R1) R2/R1 and sqrt(4kT R2)
  // (thermal noise 4kTR, section 1), all white. Its source is the front
  // stage's output, a 0 ohm voltage source: no source resistance of its
  // own. The gain block of chain/second_stage.h gives
  //   e'^2 NG^2 + (i_n^2 R_s^2 + 4kT R_s) G^2
  // so with R_s = R1 (i_n R1 G = i_n R2, 4kT R1 G^2 as R1's term) and
  // e'^2 = e_n^2 + 4kT R2 / NG^2 (R2's term) the two models coincide.
  const double r1 = 2e3, r2 = 20e3, e_n = 7e-9, i_n = 1.5e-12, t = 300.0;
  const double g = r2 / r1, ng = 1 + r2 / r1;
  Stage network = test::InvertingStage(r1, r2, test::IdealOpAmp(e_n, i_n));
  network.name = "x10";
  // Its own temperature is not the chain's: the front stage's 300 K holds.
  network.temperature_k = 350.0;
  network.band_low_hz = 123.0;
  network.band_high_hz = 456.0;

  SecondStage block;
  block.gain = -g;
  block.noise_gain = ng;
  block.input_noise.density =
      std::sqrt(e_n * e_n + test::FourKT(t) * r2 / (ng * ng));
  block.input_current_noise.density = i_n;
  block.source_resistance_ohm = r1;

  const Budget by_block = test::ComputeOrFail(Front(block), 1e-10);
  const Budget by_file =
      test::ComputeOrFail(Front(FileStage(network, "x10.json")), 1e-10);
  REQUIRE(by_block.chain);
  REQUIRE(by_file.chain);
  const ChainBlock& a = *by_block.chain;
  const ChainBlock& b = *by_file.chain;
  CHECK(RelErr(Block(b, "front end").rms_v, Block(a, "front end").rms_v) <
        kRelSame);
  CHECK(RelErr(Block(b, "second stage x10.json").rms_v,
               Block(a, "second stage").rms_v) < kRelSame);
  CHECK(RelErr(b.analog_rms_v, a.analog_rms_v) < kRelSame);
  CHECK(RelErr(b.total_rms_v, a.total_rms_v) < kRelSame);
  CHECK(RelErr(b.adc.snr_db, a.adc.snr_db) < kRelSame);
  CHECK(RelErr(b.adc.enob_bits, a.adc.enob_bits) < kRelSame);
  CHECK(RelErr(b.adc.noise_free_bits, a.adc.noise_free_bits) < kRelSame);
  CHECK(RelErr(b.counted_to_hz, a.counted_to_hz) < kRelSame);
  CHECK(RelErr(b.chain_gain_dc, a.chain_gain_dc) < kRelSame);
  CHECK(b.dominant == a.dominant);

  // Its contributors split its power as the closed form's terms do.
  const double four_kt = test::FourKT(t);
  const double psd = e_n * e_n * ng * ng + i_n * i_n * r2 * r2 +
                     four_kt * r1 * g * g + four_kt * r2;
  const double second_share = Block(b, "second stage x10.json").share;
  CHECK(RelErr(Share(b.second_stage_contributors, "e_n"),
               second_share * e_n * e_n * ng * ng / psd) < kRelSame);
  CHECK(RelErr(Share(b.second_stage_contributors, "R_in"),
               second_share * four_kt * r1 * g * g / psd) < kRelSame);
  CHECK(RelErr(Share(b.second_stage_contributors, "R_f"),
               second_share * four_kt * r2 / psd) < kRelSame);
  CHECK(RelErr(Share(b.second_stage_contributors, "i_n-"),
               second_share * i_n * i_n * r2 * r2 / psd) < kRelSame);
  CHECK(b.second_stage_contributors.front().name == "e_n");

  REQUIRE(b.second_stage_network);
  CHECK(b.second_stage_network->stage_name == "x10");
  CHECK(RelErr(b.second_stage_network->signal_gain_dc, -g) < kRelSame);
  CHECK(RelErr(b.second_stage_network->noise_gain_ref, ng) < kRelSame);
  CHECK(by_file.warnings.empty());
}

TEST_CASE("a second stage file with finite GBW has the single-pole response") {
  // REFERENCES.md section 11: A(s) = A0 / (1 + s/w_p), GBW = A0 f_p, and
  // the inverting stage G(s) = -(R2/R1) / (1 + NG/A(s)), so
  //   |G2(f)|^2 = G^2 / ((1 + NG/A0)^2 + (f NG/GBW)^2)
  // (1 + NG/A = 1 + NG/A0 + j f NG/GBW). The section's example: A0 1e6,
  // GBW 10 MHz, R2/R1 = 100, NG 101: DC gain -99.98990, f_-3dB 99 019.90 Hz.
  // Every source of the second stage (e_n NG, R1 (R2/R1), R2's own, i_n-
  // R2) meets the same 1/(1 + NG/A): at the output R2's source sees
  // A/NG / (1 + A/NG) as well.
  const double a0 = 1e6, gbw = 10e6, r1 = 1e3, r2 = 100e3, e_n = 4e-9;
  const double g = r2 / r1, ng = 1 + g, t = 300.0;
  OpAmpModel opamp = test::IdealOpAmp(e_n);
  opamp.open_loop_gain = a0;
  opamp.gbw_hz = gbw;
  const Stage network = test::InvertingStage(r1, r2, opamp);
  Stage front = Front(FileStage(network, "pole.json"));
  front.chain->filter.reset();  // the second stage's pole alone
  const double a = 1 + ng / a0, fp = gbw / ng;
  auto power_gain = [&](double f) {
    return g * g / (a * a + (f / fp) * (f / fp));
  };

  SecondStageNetwork net;
  BudgetOptions options;
  REQUIRE(net.Prepare(front, *front.chain->second_stage, options).ok);
  std::vector<double> psd(net.spectra().names.size());
  for (double f : {1.0, 1e3, 99019.90, 1e6, 1e8}) {
    CAPTURE(f);
    double g2 = 0;
    REQUIRE(net.spectra().densities(f, &g2, psd.data()).ok);
    CHECK(RelErr(g2, power_gain(f)) < 1e-9);
  }
  CHECK(RelErr(net.figures().signal_gain_dc, -99.98990) < test::kRelTable);
  CHECK(RelErr(net.figures().bandwidth_3db_hz, 99019.90) < 1e-6);

  // The front stage's white output density S_1 (section 6, 300 K) and the
  // second stage's own S_2 through the pole, counted from f_L = 1 Hz to
  // where the fold stopped, f_T:
  //   integral of S / (a^2 + (f/f_p)^2) df
  //     = S (f_p / a) (atan(f_T / (a f_p)) - atan(f_L / (a f_p))).
  const double four_kt = test::FourKT(t);
  const double s1 =
      four_kt * 1e3 * 100.0 * 100.0 + four_kt * 100e3 + 5e-9 * 101 * 5e-9 * 101;
  const double s2 = e_n * e_n * ng * ng + four_kt * r1 * g * g + four_kt * r2;
  const Budget b = test::ComputeOrFail(front, 1e-10);
  REQUIRE(b.chain);
  const double top = b.chain->counted_to_hz;
  const double shape =
      (fp / a) * (std::atan(top / (a * fp)) - std::atan(1.0 / (a * fp)));
  CHECK(RelErr(std::pow(Block(*b.chain, "front end").rms_v, 2),
               s1 * g * g * shape) < 1e-6);
  CHECK(RelErr(std::pow(Block(*b.chain, "second stage pole.json").rms_v, 2),
               s2 * shape) < 1e-6);
}

TEST_CASE("a second stage file that cuts the band says so by its name") {
  // GBW 10 kHz at NG 101: a -3 dB corner near 99 Hz, below the band's
  // 1 kHz edge (REFERENCES.md section 11).
  OpAmpModel opamp = test::IdealOpAmp(4e-9);
  opamp.open_loop_gain = 1e6;
  opamp.gbw_hz = 10e3;
  const Stage network = test::InvertingStage(1e3, 100e3, opamp);
  const Budget b =
      test::ComputeOrFail(Front(FileStage(network, "slow.json")), 1e-6);
  REQUIRE(b.chain);
  REQUIRE(b.chain->second_stage_network);
  const double f3 = b.chain->second_stage_network->bandwidth_3db_hz;
  CHECK(RelErr(f3, 10e3 / 101 + 10e3 / 1e6) < 1e-6);
  const std::string expected = "the second stage slow.json's bandwidth (" +
                               HzText(f3) +
                               ") is below the band's upper edge (1000 Hz): "
                               "it cuts the signal";
  CHECK(std::find(b.warnings.begin(), b.warnings.end(), expected) !=
        b.warnings.end());
}

TEST_CASE(
    "a second stage file with an automatic C_f is solved with its choice") {
  // "auto" C_f: its own budget chooses it (budget/feedback_capacitor.h);
  // the network the chain solves must be that one, so |G2|^2 at the
  // budget's -3 dB corner is half its passband gain squared (the corner's
  // definition, analysis/frequency_response.h).
  // 100 k into 10 M with 50 pF pins: without C_f the loop rings.
  OpAmpModel opamp = test::JfetLikeOpAmp();
  opamp.c_cm_f = 50e-12;
  opamp.c_diff_f = 50e-12;
  Stage network = test::InvertingStage(100e3, 10e6, opamp);
  network.capacitor_target = CapacitorTarget{};
  const Stage front = Front(FileStage(network, "auto.json"));
  SecondStageNetwork net;
  REQUIRE(net.Prepare(front, *front.chain->second_stage, BudgetOptions{}).ok);
  const SecondStageFigures& fig = net.figures();
  REQUIRE(fig.bandwidth_3db_hz > 0);
  std::vector<double> psd(net.spectra().names.size());
  double g2 = 0;
  REQUIRE(net.spectra().densities(fig.bandwidth_3db_hz, &g2, psd.data()).ok);
  CHECK(RelErr(g2, fig.passband_gain * fig.passband_gain / 2) < 1e-6);
  // Without a C_f the same network is well away from that at the corner,
  // so the check above sees which network was solved.
  Stage bare = network;
  bare.capacitor_target.reset();
  SecondStageNetwork none;
  REQUIRE(
      none.Prepare(front, FileStage(bare, "bare.json"), BudgetOptions{}).ok);
  double bare_g2 = 0;
  psd.resize(none.spectra().names.size());
  REQUIRE(
      none.spectra().densities(fig.bandwidth_3db_hz, &bare_g2, psd.data()).ok);
  CHECK(RelErr(bare_g2, fig.passband_gain * fig.passband_gain / 2) > 0.1);
}

TEST_CASE("the chain's samples see the second stage file's gain") {
  // SampleChain's density at f is the front stage's white S_1 times
  // |G2(f)|^2 = 100 for an ideal x(-10) stage, plus its own white S_2,
  // through the filter (2nd-order Butterworth: |H|^2 = 1 / (1 + (f/f_c)^4)).
  const double r1 = 2e3, r2 = 20e3, t = 300.0;
  const Stage network = test::InvertingStage(r1, r2, test::IdealOpAmp(0));
  const Stage front = Front(FileStage(network, "x10.json"));
  const ChainSamplesOutcome out = SampleChain(front, {10.0, 2e3, 20e3});
  REQUIRE(out.status.ok);
  const double four_kt = test::FourKT(t);
  const double s1 =
      four_kt * 1e3 * 100.0 * 100.0 + four_kt * 100e3 + 5e-9 * 101 * 5e-9 * 101;
  const double s2 = four_kt * r1 * 100.0 + four_kt * r2;
  for (std::size_t i = 0; i < out.samples.f_hz.size(); ++i) {
    const double f = out.samples.f_hz[i];
    const double h2 = 1 / (1 + std::pow(f / 2e3, 4));
    CAPTURE(f);
    CHECK(RelErr(out.samples.analog_psd[i], (s1 * 100.0 + s2) * h2) < kRelSame);
  }
}

}  // namespace
}  // namespace hushgain
