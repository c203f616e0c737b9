// The spread benchmark: 1e5 Monte Carlo samples of a T-network stage (gain
// error, offset and integrated noise per sample, finite GBW), on every
// hardware thread. Prints `spread_tee_1e5: <s> s`, the median of 5 runs.
#include "bench/spread_bench.h"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <vector>

#include "circuit/stage.h"
#include "montecarlo/spread.h"

namespace hushgain {
namespace {

// A hydrophone-like stage of our own: R_in 10k, tee 100k / 100k / 1.02k,
// 1k source, 2k load, thin-film-like parts (0.1 %, 25 ppm/°C, -35 dB),
// a JFET-like op-amp with a 20 MHz GBW, -20 .. 70 °C, 10 Hz .. 5 kHz.
Stage BenchStage() {
  Stage s;
  s.name = "spread benchmark tee stage";
  s.temperature_k = 298.15;
  s.temperature_range = TemperatureRange{253.15, 343.15};
  s.band_low_hz = 10;
  s.band_high_hz = 5e3;
  s.reference_hz = 1e3;
  OpAmpModel& m = s.opamp;
  m.class_name = "benchmark JFET-like";
  m.e_w_v_per_rthz = 6e-9;
  m.f_cv_hz = 50;
  m.i_w_a_per_rthz = 3e-15;
  m.open_loop_gain = 1e6;
  m.gbw_hz = 20e6;
  m.output_resistance_ohm = 100;
  m.c_cm_f = 5e-12;
  m.c_diff_f = 5e-12;
  m.vos_v = 300e-6;
  m.vos_drift_v_per_k = 3e-6;
  m.ib_a = 5e-12;
  m.ios_a = 2e-12;
  m.ib_law = BiasTemperatureLaw::kDoubling;
  m.ib_law_value = 10;
  s.source.resistance_ohm = 1e3;
  s.input_resistor_ohm = 10e3;
  s.feedback.kind = Feedback::Kind::kTee;
  s.feedback.tee = {100e3, 100e3, 1.02e3};
  s.load_ohm = 2e3;
  ResistorSpec spec;
  spec.technology_name = "thin-film";
  spec.technology = {"thin film", -35, 25e-6, 0.001};
  spec.tolerance = 0.001;
  s.resistors = spec;
  return s;
}

}  // namespace

void RunSpreadBenchmarks() {
  const Stage stage = BenchStage();
  SpreadOptions options;
  options.samples = 100000;
  options.seed = 7;
  std::vector<double> seconds;
  for (int run = 0; run < 5; ++run) {
    const auto start = std::chrono::steady_clock::now();
    const SpreadRun result = RunSpread(stage, options);
    const auto stop = std::chrono::steady_clock::now();
    if (!result.status.ok) {
      std::fprintf(stderr, "spread benchmark failed: %s\n",
                   result.status.message.c_str());
      return;
    }
    seconds.push_back(std::chrono::duration<double>(stop - start).count());
  }
  std::sort(seconds.begin(), seconds.end());
  std::printf("spread_tee_1e5: %.3f s\n", seconds[seconds.size() / 2]);
}

}  // namespace hushgain
