#include "circuit/stage_resistors.h"

namespace hushgain {

std::vector<std::pair<std::string, double*>> StageResistors(Stage& stage) {
  std::vector<std::pair<std::string, double*>> out;
  if (stage.topology == Topology::kInverting && stage.capacitive) {
    if (stage.capacitive->leakage_resistance_ohm > 0)
      out.push_back({"R_leak", &stage.capacitive->leakage_resistance_ohm});
    if (stage.input_resistor_ohm > 0)
      out.push_back({"R_in", &stage.input_resistor_ohm});
  } else if (stage.topology == Topology::kInverting) {
    if (stage.source.resistance_ohm > 0)
      out.push_back({"R_source", &stage.source.resistance_ohm});
    out.push_back({"R_in", &stage.input_resistor_ohm});
  } else {
    if (stage.photodiode.shunt_resistance_ohm > 0)
      out.push_back({"R_sh", &stage.photodiode.shunt_resistance_ohm});
    if (stage.photodiode.series_resistance_ohm > 0)
      out.push_back({"R_s", &stage.photodiode.series_resistance_ohm});
  }
  if (stage.feedback.kind == Feedback::Kind::kResistor) {
    out.push_back({"R_f", &stage.feedback.resistor_ohm});
  } else {
    out.push_back({"R1", &stage.feedback.tee.r1_ohm});
    out.push_back({"R2", &stage.feedback.tee.r2_ohm});
    out.push_back({"R3", &stage.feedback.tee.r3_ohm});
  }
  if (stage.plus_resistor.mode == PlusResistor::Mode::kValue)
    out.push_back({"R_plus", &stage.plus_resistor.ohms});
  if (stage.load_ohm) out.push_back({"R_load", &*stage.load_ohm});
  return out;
}

}  // namespace hushgain
