#include "circuit/inverting_topology.h"

namespace hushgain {
namespace {

double Parallel(double a, double b) { return a * b / (a + b); }

}  // namespace

double FeedbackEquivalentOhm(const Feedback& feedback) {
  if (feedback.kind == Feedback::Kind::kResistor) return feedback.resistor_ohm;
  const TeeNetwork& t = feedback.tee;
  return t.r1_ohm + t.r2_ohm + t.r1_ohm * t.r2_ohm / t.r3_ohm;
}

double InvertingBalanceOhm(const Stage& stage) {
  const Feedback& fb = stage.feedback;
  double feedback_dc =
      fb.kind == Feedback::Kind::kResistor
          ? fb.resistor_ohm
          : fb.tee.r1_ohm + Parallel(fb.tee.r2_ohm, fb.tee.r3_ohm);
  return Parallel(stage.source.resistance_ohm + stage.input_resistor_ohm,
                  feedback_dc);
}

Netlist ExpandInverting(const Stage& stage) {
  Netlist net;
  NodeId source = net.AddNode("source");
  NodeId input = source;
  if (stage.source.resistance_ohm > 0) {
    input = net.AddNode("input");
    net.resistors.push_back(
        {"R_source", source, input, stage.source.resistance_ohm, true});
  }
  NodeId summing = net.AddNode("summing");
  NodeId output = net.AddNode("output");
  net.voltage_sources.push_back({"V_signal", source, kGround});
  net.signal = SourceVoltage{0};
  net.output = output;

  net.resistors.push_back(
      {"R_in", input, summing, stage.input_resistor_ohm, true});
  const Feedback& fb = stage.feedback;
  if (fb.kind == Feedback::Kind::kResistor) {
    net.resistors.push_back({"R_f", summing, output, fb.resistor_ohm, true});
  } else {
    NodeId tee = net.AddNode("tee");
    net.resistors.push_back({"R1", summing, tee, fb.tee.r1_ohm, true});
    net.resistors.push_back({"R2", tee, output, fb.tee.r2_ohm, true});
    net.resistors.push_back({"R3", tee, kGround, fb.tee.r3_ohm, true});
  }
  if (fb.capacitor_f > 0)
    net.capacitors.push_back({"C_f", summing, output, fb.capacitor_f});

  // Without R_plus the + input is tied to ground, and i_n+ and Ib+ flow
  // straight into it.
  NodeId plus = kGround;
  if (stage.plus_resistor.mode != PlusResistor::Mode::kNone) {
    plus = net.AddNode("plus");
    double ohms = stage.plus_resistor.mode == PlusResistor::Mode::kAuto
                      ? InvertingBalanceOhm(stage)
                      : stage.plus_resistor.ohms;
    net.resistors.push_back({"R_plus", plus, kGround, ohms, true});
  }
  if (stage.load_ohm)
    net.resistors.push_back({"R_load", output, kGround, *stage.load_ohm, true});

  net.opamps.push_back({"op-amp", plus, summing, output, stage.opamp});
  return net;
}

}  // namespace hushgain
