// The Monte Carlo against the nominal budget and against statistics derived
// in the tests: exact reproduction with zero spread, the gain-error sigma of
// two uniform resistors, the offset block at the nominal temperature, the
// worst case as a bound, and independence from the thread count.
#include "montecarlo/spread.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "analysis/restamp_solver.h"
#include "circuit/expand_stage.h"
#include "circuit/stage_at_temperature.h"
#include "montecarlo/spread_statistics.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// Zero spread goes through the same arithmetic as the budget up to the
// order of sums and the solver's pivoting: agreement to rounding.
constexpr double kRelRounding = 1e-11;

// The shared JFET-like T-network stage at one temperature, with a DC input,
// no offsets to draw (Vos = Ios = 0, no drift, a constant bias current) and
// parts without a tolerance of their own (tests set the ones they draw).
Stage TeeWithFiniteGbw() {
  Stage s = test::JfetTeeStage();
  s.temperature_range.reset();
  s.opamp.vos_v = 0;
  s.opamp.vos_drift_v_per_k = 0;
  s.opamp.ios_a = 0;
  s.opamp.ib_law = BiasTemperatureLaw::kNone;
  s.opamp.ib_law_value = 0;
  s.dc_input = 1e-3;
  s.resistors->tolerance = 0;
  return s;
}

SpreadRun Run(const Stage& stage, long samples, int threads = 2,
              std::uint64_t seed = 7) {
  SpreadOptions options;
  options.samples = samples;
  options.seed = seed;
  options.threads = threads;
  SpreadRun run = RunSpread(stage, options);
  REQUIRE_MESSAGE(run.status.ok, run.status.message);
  REQUIRE(static_cast<long>(run.size()) == samples);
  return run;
}

// Every sample of a run whole (its draws replayed).
std::vector<SpreadSample> Samples(const SpreadRun& run) {
  std::vector<SpreadSample> out;
  for (std::size_t i = 0; i < run.size(); ++i) out.push_back(run.Sample(i));
  return out;
}

TEST_CASE("with every tolerance zero each sample equals the nominal budget") {
  // Zero resistor tolerance, no offsets to draw (Vos = Ios = 0), no range:
  // every sample is the nominal stage.
  const Stage stage = TeeWithFiniteGbw();
  const SpreadRun run = Run(stage, 300);
  const Budget& b = run.nominal;
  CHECK(RelErr(run.nominal_gain, b.signal_gain_dc) < kRelRounding);
  for (const SpreadSample& s : Samples(run)) {
    CHECK(s.gain_error == 0.0);
    CHECK(RelErr(s.noise_rms_v, b.output_rms_v) < kRelRounding);
    CHECK(RelErr(s.offset_v, b.offset.ib_v) < kRelRounding);
    CHECK(s.temperature_k == stage.temperature_k);
  }
}

TEST_CASE(
    "tabulated densities on a rank-2 network: zero spread equals the budget") {
  // The T network on the JFET-like part has a capacitance of rank 2
  // (checked), so every source's |H|^2 comes from
  // RestampSolver::TransferNorms without the node voltages; a tabulated e_n
  // and i_n (the latter scaled with the bias current at 40 C) go through
  // the same norms, on the Gauss nodes cut at the tables' points. With zero
  // spread each sample is the budget.
  Stage stage = TeeWithFiniteGbw();
  stage.temperature_k = kDeviceReferenceK + 15;
  stage.opamp.voltage_noise_table.f_hz = {1, 30, 300, 3e3, 1e5};
  stage.opamp.voltage_noise_table.density = {3e-7, 2e-8, 9e-9, 2e-8, 5e-9};
  stage.opamp.current_noise_table.f_hz = {1, 100, 1e5};
  stage.opamp.current_noise_table.density = {1e-13, 1e-14, 5e-14};
  stage.opamp.current_noise_temperature =
      CurrentNoiseTemperature::kWithBiasCurrent;
  {
    const Netlist net = ExpandStage(stage);
    MnaSystem system;
    REQUIRE(MnaSystem::Build(net, &system).ok);
    CHECK(RestampSolver(system, net).capacitance_rank() == 2);
  }
  const SpreadRun run = Run(stage, 50);
  CHECK(run.noise_nodes * 15 == run.noise_nodes_full * 7);
  const Budget& b = run.nominal;
  for (const SpreadSample& x : Samples(run))
    CHECK(RelErr(x.noise_rms_v, b.output_rms_v) < kRelRounding);
}

TEST_CASE(
    "a lit reverse-biased photodiode away from 25 C: zero spread equals the "
    "budget") {
  // The dark current and R_sh follow the photodiode's doubling law, the
  // photocurrent is the signal's DC level (no offset) but sets the DC drops
  // of the excess noise: the same figures as the budget's, to rounding.
  Stage s;
  s.name = "lit receiver";
  s.temperature_k = kDeviceReferenceK + 17;
  s.band_low_hz = 1;
  s.band_high_hz = 10e3;
  s.reference_hz = 100;
  s.topology = Topology::kTransimpedance;
  s.opamp = TeeWithFiniteGbw().opamp;
  s.photodiode = {100e-12, 1e9, 2e-9, 0.5, 300e-9, 5, 0, 0, 9};
  s.feedback.resistor_ohm = 1e6;
  s.feedback.capacitor_f = 3e-12;
  s.resistors =
      ResistorSpec{"thick-film", {"thick film", -10, 100e-6, 0.01}, 0.0};
  const SpreadRun run = Run(s, 50);
  const Budget& b = run.nominal;
  REQUIRE(b.offset.dark_v != 0);
  for (const SpreadSample& x : Samples(run)) {
    CHECK(RelErr(x.noise_rms_v, b.output_rms_v) < kRelRounding);
    CHECK(RelErr(x.offset_v, b.offset.ib_v + b.offset.dark_v) < kRelRounding);
  }
}

TEST_CASE(
    "a capacitive sensor has no DC gain: its spread reads |gain| at the "
    "reference") {
  // C_s in series blocks DC, so the DC gain is 0 and an error relative to
  // it is 0/0. With zero spread every sample's |gain| at the reference is
  // the budget's, to rounding; with R_in spread the charge gain C_s / C_f
  // hardly moves (R_in and R_f only shape the corners).
  Stage stage = TeeWithFiniteGbw();
  stage.capacitive = CapacitiveSensor{1e-9, 10e9};
  stage.dc_input = 0;
  stage.feedback.capacitor_f = 100e-12;
  const SpreadRun run = Run(stage, 200);
  CHECK(run.gain_hz == 1e3);
  CHECK(RelErr(run.nominal_gain, run.nominal.signal_gain_ref) < kRelRounding);
  for (const SpreadSample& x : Samples(run)) {
    CHECK(x.gain_error == 0.0);
    CHECK(RelErr(x.gain, run.nominal.signal_gain_ref) < kRelRounding);
    CHECK(RelErr(x.noise_rms_v, run.nominal.output_rms_v) < kRelRounding);
  }
  // A voltage source keeps its DC gain.
  CHECK(Run(TeeWithFiniteGbw(), 2).gain_hz == 0);
}

TEST_CASE(
    "gain error of two 1 % uniform resistors: sigma from the ratio of two "
    "uniforms") {
  // G = Rf/Rin; with Rf = Rf0 (1 + a), Rin = Rin0 (1 + b), a and b uniform on
  // [-t, t], the relative error is (1 + a)/(1 + b) - 1. Exactly:
  //   E[(1 + a)^2] = 1 + t^2/3,  E[1/(1 + b)] = ln((1 + t)/(1 - t)) / (2t),
  //   E[1/(1 + b)^2] = 1 / (1 - t^2),
  //   var = (1 + t^2/3) / (1 - t^2) - (ln((1 + t)/(1 - t)) / (2t))^2,
  // and to first order sigma = t sqrt(2/3) (each uniform has variance t^2/3).
  const double t = 0.01;
  const double mean_inverse = std::log((1 + t) / (1 - t)) / (2 * t);
  const double exact_sigma =
      std::sqrt((1 + t * t / 3) / (1 - t * t) - mean_inverse * mean_inverse);
  const double first_order = t * std::sqrt(2.0 / 3.0);
  CHECK(RelErr(exact_sigma, first_order) < 1e-3);
  Stage stage =
      test::InvertingStage(10e3, 100e3, test::IdealOpAmp(1e-9, 0), 300.0);
  stage.resistors = ResistorSpec{"x", {"test film", -40, 0, t}, t};
  const SpreadRun run = Run(stage, 100000);
  const SpreadSummary summary = Summarize(run, {});
  CHECK(RelErr(summary.gain_error.sigma, exact_sigma) < 0.02);
  // The ratio's support: |error| <= (1 + t)/(1 - t) - 1.
  CHECK(summary.gain_error.max <= (1 + t) / (1 - t) - 1);
  CHECK(summary.gain_error.min >= (1 - t) / (1 + t) - 1);
  // The run keeps only the figures; a sample's resistors are replayed from
  // its seed and index. They are the ones its gain was computed with: the
  // inverting gain -R_f / (R_source + R_in) (REFERENCES.md section 4; A0
  // 1e12 leaves 1e-11 of loop error).
  const auto index_of = [&run](const std::string& name) {
    const auto at =
        std::find(run.resistor_names.begin(), run.resistor_names.end(), name);
    REQUIRE(at != run.resistor_names.end());
    return static_cast<std::size_t>(at - run.resistor_names.begin());
  };
  const std::size_t r_in = index_of("R_in"), r_f = index_of("R_f");
  std::vector<double> ohms;
  for (std::size_t i : {0ul, 1ul, 4095ul, 99999ul}) {
    CAPTURE(i);
    const SpreadSample sample = run.Sample(i, &ohms);
    REQUIRE(ohms.size() == run.resistor_names.size());
    CHECK(ohms[r_in] != 10e3);  // drawn
    const double source = stage.source.resistance_ohm;
    CHECK(RelErr(sample.gain, -ohms[r_f] / (source + ohms[r_in])) < 1e-9);
    CHECK(sample.gain_error == run.GainError(i));
  }
}

TEST_CASE(
    "output offset at the nominal temperature equals the budget's offset "
    "block") {
  // Zero tolerance, no range: the offset of a sample is its Vos times the
  // budget's DC noise gain plus the budget's Ib term (signed), and with Vos
  // = 0 its Ios term is the budget's |Ios term| scaled by |Ios_sample| / Ios.
  Stage stage = TeeWithFiniteGbw();
  stage.opamp.vos_v = 300e-6;
  const SpreadRun with_vos = Run(stage, 500);
  const OffsetBlock& o = with_vos.nominal.offset;
  for (const SpreadSample& s : Samples(with_vos))
    CHECK(std::fabs(s.offset_v - (s.vos_v * o.noise_gain_dc + o.ib_v)) <=
          kRelRounding * o.worst_case_v);
  stage.opamp.vos_v = 0;
  stage.opamp.ios_a = 2e-12;
  const SpreadRun with_ios = Run(stage, 500);
  const OffsetBlock& p = with_ios.nominal.offset;
  for (const SpreadSample& s : Samples(with_ios))
    CHECK(RelErr(std::fabs(s.offset_v - p.ib_v),
                 std::fabs(s.ios_a) / 2e-12 * p.ios_v) < 1e-9);
}

TEST_CASE("the worst-case offset bounds every sample with the same limits") {
  // Tolerances 0.1 % and 1 %, tempco, -20 .. 70 °C, uniform Vos (with drift)
  // and Ios, FET Ib doubling every 10 °C, an auto R_plus.
  Stage stage = TeeWithFiniteGbw();
  stage.opamp.vos_v = 300e-6;
  stage.opamp.vos_drift_v_per_k = 3e-6;
  stage.opamp.ios_a = 2e-12;
  stage.opamp.ib_law = BiasTemperatureLaw::kDoubling;
  stage.opamp.ib_law_value = 10;
  stage.plus_resistor.mode = PlusResistor::Mode::kAuto;
  stage.temperature_range = TemperatureRange{253.15, 343.15};
  stage.resistors->tolerance = 0.001;
  stage.resistor_overrides["R3"] = {
      "thick-film", {"thick film", -10, 100e-6, 0.01}, 0.01};
  const SpreadRun run = Run(stage, 20000);
  REQUIRE(run.worst_case_offset_v > 0);
  double largest = 0;
  for (const SpreadSample& s : Samples(run))
    largest = std::max(largest, std::fabs(s.offset_v));
  CHECK(largest <= run.worst_case_offset_v);
  // Not vacuous: the samples reach well into the bound (Vos dominates; a
  // uniform Vos reaches 90 % of its range in 10 % of the samples).
  CHECK(largest > 0.8 * run.worst_case_offset_v);
}

TEST_CASE(
    "samples do not depend on the thread count, and the seed changes them") {
  Stage stage = TeeWithFiniteGbw();
  stage.opamp.vos_v = 300e-6;
  stage.resistors->tolerance = 0.01;
  stage.temperature_range = TemperatureRange{253.15, 343.15};
  const SpreadRun one = Run(stage, 3000, 1);
  const SpreadRun two = Run(stage, 3000, 2);
  const SpreadRun other_seed = Run(stage, 3000, 2, 8);
  CHECK(one.figures.offset_v == two.figures.offset_v);
  CHECK(one.figures.noise_rms_v == two.figures.noise_rms_v);
  CHECK(one.figures.gain == two.figures.gain);
  CHECK(one.figures.problems == two.figures.problems);
  CHECK(one.temperature_low_k == two.temperature_low_k);
  CHECK(one.temperature_high_k == two.temperature_high_k);
  CHECK(one.figures.offset_v != other_seed.figures.offset_v);
  bool same_draws = true;
  std::vector<double> ohms_one, ohms_two;
  for (std::size_t i = 0; i < one.size(); ++i) {
    one.Sample(i, &ohms_one);
    two.Sample(i, &ohms_two);
    same_draws = same_draws && ohms_one == ohms_two;
  }
  CHECK(same_draws);
}

TEST_CASE(
    "the scaled Gauss rule of each sample agrees with every Kronrod node") {
  // The reference is the 15-node Kronrod rule on the same partition (the
  // budget's own rule, integrate/band_integral.h). Thick-film parts of 5 %
  // with excess noise at each sample's DC point, capacitors of 10 % and
  // -20 to 70 C move every sample's density in level and in shape; the
  // Gauss-7 rule unscaled is off by up to the budget's tolerance (1e-4 of
  // the power), scaled by the nominal's K / G it must stay within 1e-6.
  Stage stage = test::EveryElementTeeStage();
  stage.band_low_hz = 1;
  stage.band_high_hz = 100e3;
  stage.reference_hz = 1e3;
  stage.opamp.vos_v = 1e-3;
  stage.resistors =
      ResistorSpec{"thick-film", {"thick film", -10, 100e-6, 0.05}, 0.05};
  stage.capacitors.tolerance = 0.1;
  stage.temperature_range = TemperatureRange{253.15, 343.15};
  SpreadOptions options;
  options.samples = 2000;
  options.threads = 2;
  const SpreadRun reduced = RunSpread(stage, options);
  options.every_node = true;
  const SpreadRun every = RunSpread(stage, options);
  REQUIRE(reduced.status.ok);
  REQUIRE(every.status.ok);
  CHECK(every.noise_nodes == every.noise_nodes_full);
  CHECK(reduced.noise_nodes_full == every.noise_nodes_full);
  CHECK(reduced.noise_nodes * 15 == reduced.noise_nodes_full * 7);
  double largest = 0;
  for (std::size_t i = 0; i < reduced.size(); ++i)
    largest = std::max(largest, RelErr(reduced.figures.noise_rms_v[i],
                                       every.figures.noise_rms_v[i]));
  CHECK(largest < 1e-6);
  // The samples do spread: a real test of the rule away from the nominal.
  const SpreadSummary summary = Summarize(every, {});
  CHECK(summary.noise.sigma > 1e-3 * summary.noise.mean);
  CHECK(reduced.figures.gain == every.figures.gain);
  CHECK(reduced.figures.offset_v == every.figures.offset_v);
}

TEST_CASE("Gaussian offsets take the device's value as sigma") {
  // Zero tolerance, Ib = 0: offset = Vos NG with Vos ~ N(0, 100 uV). The
  // sample sigma of 2e4 draws has a relative standard error of
  // 1 / sqrt(2 n) = 0.5 %.
  Stage stage = TeeWithFiniteGbw();
  stage.opamp.ib_a = 0;
  stage.opamp.vos_v = 100e-6;
  stage.opamp.offset_distribution = OffsetDistribution::kGaussian;
  const SpreadRun run = Run(stage, 20000);
  const SpreadSummary summary = Summarize(run, {});
  CHECK(RelErr(summary.offset.sigma,
               100e-6 * run.nominal.offset.noise_gain_dc) < 0.02);
  // Unbounded: some samples pass the 1-sigma "worst case" of the budget.
  CHECK(summary.offset.max > run.nominal.offset.worst_case_v);
}

TEST_CASE("percentiles interpolate between order statistics") {
  // Hyndman and Fan (1996) definition 7: x[(n - 1) p], linear in between.
  const std::vector<double> sorted = {1, 2, 3, 4, 5};
  CHECK(Percentile(sorted, 0.0) == 1);
  CHECK(Percentile(sorted, 1.0) == 5);
  CHECK(RelErr(Percentile(sorted, 0.1), 1.4) < test::kRelTight);
  const Distribution d = Describe({2, 4, 4, 4, 5, 5, 7, 9});
  CHECK(d.mean == 5);
  CHECK(RelErr(d.sigma, std::sqrt(32.0 / 7.0)) <
        test::kRelTight);  // divisor n - 1
}

TEST_CASE("yield counts the samples inside every given limit") {
  SpreadRun run;
  run.nominal_gain = 10;
  run.figures.Resize(4);
  run.figures.gain = {10, 10, 10, 10};
  run.figures.offset_v = {1e-3, -3e-3, 2e-3, 0.5e-3};
  run.figures.noise_rms_v = {0, 0, 2e-6, 0};
  SpreadLimits limits;
  limits.offset_v = 2e-3;
  limits.noise_v = 1e-6;
  const SpreadYield y = Yield(run, limits);
  CHECK(*y.offset == 0.75);
  CHECK(*y.noise == 0.75);
  CHECK(*y.all == 0.5);
  CHECK_FALSE(y.gain_error.has_value());
}

}  // namespace
}  // namespace hushgain

namespace hushgain {
namespace {

TEST_CASE(
    "a charge amplifier's gain error follows C_f: 1/(1 + e) - 1 for e uniform "
    "within its tolerance") {
  // In the passband the gain from the sensor's voltage is C_s / C_f (ideal
  // op-amp; REFERENCES.md section 13), so with C_f = C_f0 (1 + e), e uniform
  // on [-t, t], the relative error is 1/(1 + e) - 1, whose moments are
  //   E[1/(1 + e)] = ln((1 + t)/(1 - t)) / (2t),  E[1/(1 + e)^2] = 1/(1 - t^2)
  // (the same integrals as the resistor ratio above).
  const double t = 0.05;
  Stage s = test::InvertingStage(0, 1e9, test::IdealOpAmp(5e-9, 1e-15), 300);
  s.input_resistor_ohm = 0;
  s.capacitive = CapacitiveSensor{1e-9, 0};
  s.feedback.capacitor_f = 100e-12;
  s.band_low_hz = 100;
  s.band_high_hz = 10e3;
  s.reference_hz = 1e3;  // 630 times the corner: C_s/C_f to 2.5e-6
  s.capacitors.tolerance = t;
  const SpreadRun run = Run(s, 40000);
  REQUIRE(run.capacitor_names.size() == 2);  // C_s (no tolerance), C_f
  const double mean_inverse = std::log((1 + t) / (1 - t)) / (2 * t);
  const double sigma = std::sqrt(1 / (1 - t * t) - mean_inverse * mean_inverse);
  const SpreadSummary summary = Summarize(run, {});
  CHECK(RelErr(summary.gain_error.sigma, sigma) < 0.02);
  CHECK(std::fabs(summary.gain_error.mean - (mean_inverse - 1)) <
        4 * sigma / std::sqrt(40000.0));
  CHECK(summary.gain_error.max <= 1 / (1 - t) - 1 + 1e-5);
  CHECK(summary.gain_error.min >= 1 / (1 + t) - 1 - 1e-5);
  // Each sample is the budget of the stage with its drawn capacitors.
  for (int i = 0; i < 3; ++i) {
    CAPTURE(i);
    Stage drawn = s;
    std::vector<double> ohms, capacitors;
    const SpreadSample sample = run.Sample(i, &ohms, &capacitors);
    REQUIRE(capacitors.size() == run.capacitor_names.size());
    for (std::size_t k = 0; k < run.capacitor_names.size(); ++k) {
      const double farads = capacitors[k];
      if (run.capacitor_names[k] == "C_f")
        drawn.feedback.capacitor_f = farads;
      else
        CHECK(farads == 1e-9);  // C_s keeps its value
    }
    const Budget b = test::ComputeOrFail(drawn, 1e-8);
    CHECK(RelErr(sample.gain, b.signal_gain_ref) < 1e-9);
    CHECK(RelErr(sample.noise_rms_v, b.output_rms_v) < 1e-4);
  }
}

TEST_CASE("without capacitor tolerances no capacitor is drawn") {
  Stage s = TeeWithFiniteGbw();
  s.feedback.capacitor_f = 10e-12;
  const SpreadRun run = Run(s, 20);
  CHECK(run.capacitor_names.empty());
  std::vector<double> ohms, farads = {1.0};
  run.Sample(0, &ohms, &farads);
  CHECK(farads.empty());
}

}  // namespace
}  // namespace hushgain
