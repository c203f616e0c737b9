#include "chain/second_stage.h"

#include "base/physical_constants.h"

namespace hushgain {
namespace {

// 1 / (1 + (f / f_p)^2), or 1 without a pole.
double PoleFactor(const SecondStage& stage, double f_hz) {
  if (!(stage.bandwidth_hz > 0)) return 1;
  const double x = f_hz / stage.bandwidth_hz;
  return 1 / (1 + x * x);
}

double WithCorner(const CornerNoise& noise, double f_hz) {
  return noise.density * noise.density * (1 + noise.corner_hz / f_hz);
}

}  // namespace

double SecondStagePowerGain(const SecondStage& stage, double f_hz) {
  return stage.gain * stage.gain * PoleFactor(stage, f_hz);
}

double SecondStageNoisePsd(const SecondStage& stage, double f_hz,
                           double temperature_k) {
  const double r = stage.source_resistance_ohm;
  const double at_input_signal_path =
      WithCorner(stage.input_current_noise, f_hz) * r * r +
      4 * kBoltzmannJPerK * temperature_k * r;
  return (WithCorner(stage.input_noise, f_hz) * stage.noise_gain *
              stage.noise_gain +
          at_input_signal_path * stage.gain * stage.gain) *
         PoleFactor(stage, f_hz);
}

}  // namespace hushgain
