// The parameters of an op-amp macro model, SI units throughout.
//
//   gain          A(s) = A0 / (1 + s / w_p), w_p = 2 pi GBW / A0
//   voltage noise e_n(f)^2 = e_w^2 (1 + f_cv / f) + e_table(f)^2, with Vos,
//                 in series with the + input between the pin and the ideal
//                 amplifier
//   current noise i_n(f)^2 = i_w^2 (1 + f_ci / f) + i_table(f)^2, each pin
//                 to ground, the two pins uncorrelated
//                 (the tables: circuit/noise_table.h; empty when not given)
//   bias          Ib+ = Ib + Ios/2, Ib- = Ib - Ios/2, flowing into the pins
//   pins          Ccm from each pin to ground, Cdiff between the pins
//   output        Rout in series with the output (noiseless)
#ifndef HUSHGAIN_CIRCUIT_OPAMP_MODEL_H_
#define HUSHGAIN_CIRCUIT_OPAMP_MODEL_H_

#include <string>

#include "circuit/noise_table.h"

namespace hushgain {

// How the input bias current changes with temperature.
enum class BiasTemperatureLaw {
  kNone,         // constant
  kDoubling,     // Ib(T) = Ib(25 °C) * 2^((T - 25 °C) / interval): FET inputs
  kCoefficient,  // Ib(T) = Ib(25 °C) * (1 + coefficient * (T - 25 °C))
};

// How the current noise changes with temperature. A FET or CMOS input's
// current noise is the shot noise of its gate current, i_n = sqrt(2 q I_b)
// (Schottky 1918), so i_n^2 follows I_b: i_n(T) = i_n(25 °C) sqrt(k(T)),
// k(T) the bias-current law's factor.
enum class CurrentNoiseTemperature {
  kConstant,         // i_n as given at every temperature
  kWithBiasCurrent,  // i_n^2 scales with I_b(T) / I_b(25 °C)
};

// How Vos and Ios spread from part to part (the Monte Carlo,
// montecarlo/spread.h): uniform within +-offset_voltage and +-offset_current
// (read as maxima), or Gaussian with them as sigma (read as typical values).
// Default uniform.
enum class OffsetDistribution {
  kUniform,
  kGaussian,
};

struct OpAmpModel {
  std::string class_name;          // "precision bipolar"; shown in reports
  double e_w_v_per_rthz = 0;       // white voltage noise density
  double f_cv_hz = 0;              // 1/f corner of the voltage noise
  double i_w_a_per_rthz = 0;       // white current noise density, each pin
  double f_ci_hz = 0;              // 1/f corner of the current noise
  NoiseTable voltage_noise_table;  // tabulated e_n, on top of e_w and f_cv
  NoiseTable current_noise_table;  // tabulated i_n, on top of i_w and f_ci
  CurrentNoiseTemperature current_noise_temperature =
      CurrentNoiseTemperature::kConstant;
  double open_loop_gain = 1e6;  // A0, V/V
  double gbw_hz = 1e6;          // gain-bandwidth product
  double output_resistance_ohm = 0;
  double c_cm_f = 0;    // common-mode input capacitance, each pin to ground
  double c_diff_f = 0;  // differential input capacitance, pin to pin
  double vos_v = 0;     // input offset voltage, magnitude (sign unknown)
  double vos_drift_v_per_k = 0;
  double ib_a = 0;   // input bias current into each pin, signed
  double ios_a = 0;  // input offset current, magnitude (sign unknown)
  BiasTemperatureLaw ib_law = BiasTemperatureLaw::kNone;
  double ib_law_value = 0;  // doubling interval in K, or coefficient per K
  OffsetDistribution offset_distribution = OffsetDistribution::kUniform;
  double output_current_limit_a = 0.02;
  double supply_v = 30;  // total supply span, V
};

// The model's densities at one frequency (the formulas at the top), V/rtHz
// and A/rtHz; f_hz > 0.
double VoltageNoiseDensity(const OpAmpModel& model, double f_hz);
double CurrentNoiseDensity(const OpAmpModel& model, double f_hz);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_OPAMP_MODEL_H_
