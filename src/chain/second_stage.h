// The second gain stage of a chain (circuit/signal_chain.h SecondStage):
// what it does to a signal and what it adds of its own, at its output.
//   |G2(f)|^2 = gain^2 / (1 + (f / f_p)^2), f_p = bandwidth_hz (flat when 0)
//   S_2(f)    = [e_n^2 (1 + f_ce / f) noise_gain^2
//               + (i_n^2 (1 + f_ci / f) R_s^2 + 4 k T R_s) gain^2]
//               / (1 + (f / f_p)^2)
// Thermal noise 4kTR (Johnson 1928, Nyquist 1928; REFERENCES.md section 1).
#ifndef HUSHGAIN_CHAIN_SECOND_STAGE_H_
#define HUSHGAIN_CHAIN_SECOND_STAGE_H_

#include "circuit/signal_chain.h"

namespace hushgain {

// |G2(f)|^2; f >= 0.
double SecondStagePowerGain(const SecondStage& stage, double f_hz);

// S_2(f) at the stage's output, V^2/Hz; f > 0.
double SecondStageNoisePsd(const SecondStage& stage, double f_hz,
                           double temperature_k);

}  // namespace hushgain

#endif  // HUSHGAIN_CHAIN_SECOND_STAGE_H_
