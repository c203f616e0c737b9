// The resistors of a stage by contributor name, as pointers into the Stage,
// so one loop can scale them (temperature, tolerance): R_source, R_in, R_f
// or R1, R2, R3, R_plus (a value only; "auto" is computed), R_load, R_sh,
// R_s, R_leak.
#ifndef HUSHGAIN_CIRCUIT_STAGE_RESISTORS_H_
#define HUSHGAIN_CIRCUIT_STAGE_RESISTORS_H_

#include <string>
#include <utility>
#include <vector>

#include "circuit/stage.h"

namespace hushgain {

// Only the resistors the stage has (a zero source resistance, an absent load,
// shunt, leakage or input resistor of a capacitive sensor are left out). The
// pointers live as long as `stage`.
std::vector<std::pair<std::string, double*>> StageResistors(Stage& stage);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_STAGE_RESISTORS_H_
