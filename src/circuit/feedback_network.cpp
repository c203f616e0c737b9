#include "circuit/feedback_network.h"

namespace hushgain {

double FeedbackEquivalentOhm(const Feedback& feedback) {
  if (feedback.kind == Feedback::Kind::kResistor) return feedback.resistor_ohm;
  const TeeNetwork& t = feedback.tee;
  return t.r1_ohm + t.r2_ohm + t.r1_ohm * t.r2_ohm / t.r3_ohm;
}

double FeedbackDcTransresistanceOhm(const Feedback& feedback) {
  if (feedback.kind == Feedback::Kind::kTee && feedback.tee.c3_f > 0)
    return feedback.tee.r1_ohm + feedback.tee.r2_ohm;
  return FeedbackEquivalentOhm(feedback);
}

double FeedbackDcOhm(const Feedback& feedback) {
  if (feedback.kind == Feedback::Kind::kResistor) return feedback.resistor_ohm;
  const TeeNetwork& t = feedback.tee;
  if (t.c3_f > 0) return t.r1_ohm + t.r2_ohm;
  return t.r1_ohm + t.r2_ohm * t.r3_ohm / (t.r2_ohm + t.r3_ohm);
}

void AddFeedback(const Feedback& fb, NodeId summing, NodeId output,
                 Netlist* net) {
  if (fb.kind == Feedback::Kind::kResistor) {
    net->resistors.push_back({"R_f", summing, output, fb.resistor_ohm, true});
  } else {
    NodeId tee = net->AddNode("tee");
    net->resistors.push_back({"R1", summing, tee, fb.tee.r1_ohm, true});
    net->resistors.push_back({"R2", tee, output, fb.tee.r2_ohm, true});
    NodeId shunt = kGround;
    if (fb.tee.c3_f > 0) {
      shunt = net->AddNode("shunt");
      net->capacitors.push_back({"C3", shunt, kGround, fb.tee.c3_f});
    }
    net->resistors.push_back({"R3", tee, shunt, fb.tee.r3_ohm, true});
  }
  if (fb.capacitor_f > 0)
    net->capacitors.push_back({"C_f", summing, output, fb.capacitor_f});
}

void AddOpAmpWithLoad(const Stage& stage, NodeId summing, NodeId output,
                      double balance_ohm, Netlist* net) {
  // Without R_plus the + input is tied to ground, and i_n+ and Ib+ flow
  // straight into it.
  NodeId plus = kGround;
  if (stage.plus_resistor.mode != PlusResistor::Mode::kNone) {
    plus = net->AddNode("plus");
    double ohms = stage.plus_resistor.mode == PlusResistor::Mode::kAuto
                      ? balance_ohm
                      : stage.plus_resistor.ohms;
    net->resistors.push_back({"R_plus", plus, kGround, ohms, true});
    if (stage.plus_resistor_bypass_f > 0)
      net->capacitors.push_back(
          {"C_plus", plus, kGround, stage.plus_resistor_bypass_f});
  }
  if (stage.load_ohm)
    net->resistors.push_back(
        {"R_load", output, kGround, *stage.load_ohm, true});
  net->opamps.push_back({"op-amp", plus, summing, output, stage.opamp});
}

}  // namespace hushgain
