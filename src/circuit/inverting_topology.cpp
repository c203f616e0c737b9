#include "circuit/inverting_topology.h"

namespace hushgain {

double InvertingBalanceOhm(const Stage& stage) {
  const double input = stage.source.resistance_ohm + stage.input_resistor_ohm;
  const double feedback = FeedbackDcOhm(stage.feedback);
  return input * feedback / (input + feedback);
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
  net.voltage_sources.push_back({"V_signal", source, kGround, 0.0});
  net.signal = SourceVoltage{0};
  net.output = output;
  net.resistors.push_back(
      {"R_in", input, summing, stage.input_resistor_ohm, true});
  AddFeedback(stage.feedback, summing, output, &net);
  AddOpAmpWithLoad(stage, summing, output, InvertingBalanceOhm(stage), &net);
  return net;
}

}  // namespace hushgain
