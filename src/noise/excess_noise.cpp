#include "noise/excess_noise.h"

#include <cmath>

namespace hushgain {
namespace {
const double kLn10 = std::log(10.0);
}  // namespace

double ExcessNoiseCoefficient(double noise_index_db, double v_dc) {
  const double per_decade_v =
      std::pow(10.0, noise_index_db / 20.0) * 1e-6 * v_dc;
  return per_decade_v * per_decade_v / kLn10;
}

double ExcessNoiseDensity(double noise_index_db, double v_dc, double f_hz) {
  return std::sqrt(ExcessNoiseCoefficient(noise_index_db, v_dc) / f_hz);
}

double ExcessNoiseRms(double noise_index_db, double v_dc, double f_low_hz,
                      double f_high_hz) {
  return std::pow(10.0, noise_index_db / 20.0) * 1e-6 * std::fabs(v_dc) *
         std::sqrt(std::log10(f_high_hz / f_low_hz));
}

std::vector<NoiseSource> ExcessNoiseSources(
    const Netlist& netlist, const std::vector<ResistorExcess>& resistors) {
  std::vector<NoiseSource> out;
  for (const ResistorExcess& e : resistors) {
    if (e.v_dc == 0) continue;
    const Resistor& r = netlist.resistors[e.resistor];
    NoiseSource s;
    s.name = r.name + " excess";
    s.kind = NoiseKind::kExcess;
    s.excitation = CurrentInjection{r.a, r.b};
    s.flicker_psd =
        ExcessNoiseCoefficient(e.noise_index_db, e.v_dc) / (r.ohms * r.ohms);
    s.resistor_ohm = r.ohms;
    out.push_back(s);
  }
  return out;
}

}  // namespace hushgain
