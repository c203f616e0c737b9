// The chain's second gain stage (chain/second_stage.h) through the chain's
// noise (chain/chain_noise.h), against closed forms.
#include "chain/second_stage.h"

#include <doctest/doctest.h>

#include <cmath>

#include "chain/chain_noise.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

FrontEndSpectra White(double d) {
  FrontEndSpectra s;
  s.names = {"white"};
  s.densities = [d](double, double* psd) {
    psd[0] = d * d;
    return Status::Ok();
  };
  return s;
}

SignalChain Chain(const SecondStage& second) {
  SignalChain c;
  c.second_stage = second;
  c.adc.bits = 24;
  c.adc.full_scale_v = 5.0;
  c.adc.sample_rate_hz = 1e6;
  return c;
}

ChainBlock Compute(const FrontEndSpectra& s, const SignalChain& c,
                   double band_low_hz, double temperature_k = 300) {
  ChainNoiseOptions options;
  options.band_low_hz = band_low_hz;
  options.temperature_k = temperature_k;
  options.integration.relative_tolerance = 1e-10;
  ChainNoiseOutcome out = ComputeChainNoise(s, c, options);
  REQUIRE_MESSAGE(out.status.ok, out.status.message);
  return out.block;
}

const ChainNoiseShare& Block(const ChainBlock& c, const std::string& name) {
  for (const ChainNoiseShare& b : c.blocks)
    if (b.name == name) return b;
  FAIL("no block " << name);
  return c.blocks.front();
}

TEST_CASE("two stages add as sqrt((front x G2)^2 + (e_n2 x G2)^2)") {
  // The cascade with white noise and flat gains (the Friis-style sum of
  // uncorrelated noises, each through the gain after it): over the counted
  // bandwidth B = f_top - f_L, front end d sqrt(B) and the second stage's
  // e_n sqrt(B), both times G2.
  const double d = 40e-9, e = 7e-9, g2 = 25;
  SecondStage s;
  s.gain = g2;
  s.noise_gain = g2;
  s.input_noise.density = e;
  const ChainBlock c = Compute(White(d), Chain(s), 10.0);
  const double b = c.counted_to_hz - 10.0;  // flat: the count's limit
  CHECK(c.fold_limited);
  const double front = d * std::sqrt(b), second = e * std::sqrt(b);
  CHECK(RelErr(c.analog_rms_v, std::sqrt(std::pow(front * g2, 2) +
                                         std::pow(second * g2, 2))) < 1e-6);
  CHECK(RelErr(Block(c, "front end").rms_v, front * g2) < 1e-6);
  CHECK(RelErr(Block(c, "second stage").rms_v, second * g2) < 1e-6);
  CHECK(c.chain_gain_dc == g2);
}

TEST_CASE("the second stage's e_n rides its noise gain and its 1/f corner") {
  // e_n^2 (1 + f_c/f) NG^2 over [f_L, f_top] integrates to
  // e_n^2 NG^2 (f_c ln(f_top/f_L) + f_top - f_L) (REFERENCES.md section 4);
  // an inverting stage's noise gain 1 + |G| (section 6).
  const double e = 5e-9, fc = 200, g = -10;
  SecondStage s;
  s.gain = g;
  s.noise_gain = 11;
  s.input_noise = {e, fc};
  const ChainBlock c = Compute(White(0), Chain(s), 1.0);
  const double top = c.counted_to_hz;
  const double expected = e * e * 121 * (fc * std::log(top / 1.0) + top - 1.0);
  CHECK(RelErr(std::pow(Block(c, "second stage").rms_v, 2), expected) < 1e-6);
}

TEST_CASE("the second stage's i_n and source resistance add i_n^2 R^2 + 4kTR") {
  // Thermal noise 4kTR (REFERENCES.md section 1), i_n through R, both
  // times the signal gain; white, over the counted bandwidth.
  const double i = 2e-12, r = 10e3, g = 4, t = 300;
  SecondStage s;
  s.gain = g;
  s.noise_gain = g;
  s.input_current_noise = {i, 0};
  s.source_resistance_ohm = r;
  const ChainBlock c = Compute(White(0), Chain(s), 1.0, t);
  const double psd = (i * i * r * r + test::FourKT(t) * r) * g * g;
  CHECK(RelErr(std::pow(Block(c, "second stage").rms_v, 2),
               psd * (c.counted_to_hz - 1.0)) < 1e-6);
}

TEST_CASE("a second stage set by GBW has one pole at GBW over its noise gain") {
  // Pole f_p = GBW / NG (REFERENCES.md section 11); white noise through it
  // integrates to d^2 G^2 f_p (atan(f_top/f_p) - atan(f_L/f_p)).
  const double d = 30e-9, g = 10, gbw = 1e6;
  SecondStage s;
  s.gain = g;
  s.noise_gain = g;
  s.gbw_hz = gbw;
  s.bandwidth_hz = gbw / g;
  const double fp = 1e5;
  CHECK(RelErr(SecondStagePowerGain(s, fp), g * g / 2) < test::kRelTight);
  const ChainBlock c = Compute(White(d), Chain(s), 1.0);
  CHECK_FALSE(c.fold_limited);
  const double expected =
      d * d * g * g * fp *
      (std::atan(c.counted_to_hz / fp) - std::atan(1.0 / fp));
  CHECK(RelErr(std::pow(Block(c, "front end").rms_v, 2), expected) < 1e-6);
}

}  // namespace
}  // namespace hushgain
