// Resistor excess (current) noise from the noise index (IEC 60195; Conrad,
// Newman and Stansbury 1960): NI = 20 log10(U_decade[µV] / V_DC[V]), the rms
// noise in one decade of frequency per volt of DC drop. For a 1/f density
// S(f) = K / f every decade holds K ln 10, so
//   e_ex(f) = 10^(NI/20) 1e-6 V_DC / sqrt(ln(10) f)          [V/rtHz]
//   K       = (10^(NI/20) 1e-6 V_DC)^2 / ln 10               [V^2]
// a voltage in series with the resistor, which the netlist takes as the
// current e_ex / R across it (S_i = K / (R^2 f)).
#ifndef HUSHGAIN_NOISE_EXCESS_NOISE_H_
#define HUSHGAIN_NOISE_EXCESS_NOISE_H_

#include <vector>

#include "circuit/netlist.h"
#include "noise/noise_source.h"

namespace hushgain {

// K of S(f) = K / f, V^2, for a noise index in dB and a DC drop in volts.
double ExcessNoiseCoefficient(double noise_index_db, double v_dc);

// e_ex(f) in V/rtHz.
double ExcessNoiseDensity(double noise_index_db, double v_dc, double f_hz);

// The rms over [f_low, f_high]: 10^(NI/20) 1e-6 V_DC sqrt(log10(f_high /
// f_low)).
double ExcessNoiseRms(double noise_index_db, double v_dc, double f_low_hz,
                      double f_high_hz);

// One resistor of a netlist with its noise index and DC drop.
struct ResistorExcess {
  int resistor = 0;  // index into Netlist::resistors
  double noise_index_db = 0;
  double v_dc = 0;  // volts across it (a to b); the sign does not matter
};

// One kExcess source per entry with a non-zero drop, named "<R> excess".
std::vector<NoiseSource> ExcessNoiseSources(
    const Netlist& netlist, const std::vector<ResistorExcess>& resistors);

}  // namespace hushgain

#endif  // HUSHGAIN_NOISE_EXCESS_NOISE_H_
