// A stage evaluated at a temperature. Device and resistor values are taken
// as given at 25 °C (the datasheet convention) and moved to T:
//   resistors  R(T) = R (1 + tc (T - 25 °C)), tc from the resistor's
//              technology (none: unchanged)
//   Vos        |Vos(T)| = |Vos| + |drift| |T - 25 °C|: the magnitude's worst
//              case, as the sign of the drift is unknown
//   Ib, Ios    Ib(T) = Ib k(T), Ios(T) = Ios k(T), with k(T) from the
//              class's law (OpAmpModel::ib_law): 2^((T - 25 °C)/interval) or
//              1 + coefficient (T - 25 °C). Ios scales like Ib (an offset
//              current is a mismatch of the two bias currents).
//   i_n        with current_noise_temperature "with_bias_current":
//              i_n(T) = i_n(25 °C) sqrt(|k(T)|), white level and table alike
//              (gate shot noise sqrt(2 q I_b), Schottky 1918); else as given
//   noise      4kT at T (the stage's temperature_k becomes T)
// An "auto" R_plus is a real part: its value is the balance value at 25 °C,
// and at T it drifts with its own technology like the others (so the Ib term
// cancels exactly only where the resistors' tempcos agree).
//   photodiode dark current I_dark(T) = I_dark d(T), shunt resistance
//              R_sh(T) = R_sh / d(T), d(T) = 2^((T - 25 °C) / interval): the
//              dark current doubles and R_sh halves every interval (common
//              practice for silicon: about every 8 to 10 °C; the stage's
//              doubling_interval_C, default 10). A technology given to R_sh
//              adds its tempco on top. The photocurrent is left as given.
#ifndef HUSHGAIN_CIRCUIT_STAGE_AT_TEMPERATURE_H_
#define HUSHGAIN_CIRCUIT_STAGE_AT_TEMPERATURE_H_

#include "circuit/opamp_model.h"
#include "circuit/stage.h"

namespace hushgain {

// 25 °C in kelvin: the temperature at which device values are given.
inline constexpr double kDeviceReferenceK = 298.15;

// k(T) of the bias-current law; 1 at 25 °C.
double BiasCurrentFactor(const OpAmpModel& opamp, double temperature_k);

// The factor on the current noise density at T: sqrt(|k(T)|) when the
// current noise follows the bias current, else 1.
double CurrentNoiseFactor(const OpAmpModel& opamp, double temperature_k);

// The photodiode's d(T) = 2^((T - 25 °C) / interval); 1 at 25 °C.
double PhotodiodeTemperatureFactor(const Photodiode& photodiode,
                                   double temperature_k);

// The resistance factor 1 + tc (T - 25 °C).
double ResistorTemperatureFactor(double tempco_per_k, double temperature_k);

// The stage at `temperature_k` (the range, if any, is kept).
Stage StageAtTemperature(const Stage& stage, double temperature_k);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_STAGE_AT_TEMPERATURE_H_
