#include "circuit/inverting_topology.h"

namespace hushgain {

double InvertingBalanceOhm(const Stage& stage) {
  const double feedback = FeedbackDcOhm(stage.feedback);
  // A capacitor in series with the input passes no DC.
  if (stage.input_capacitor_f > 0) return feedback;
  if (stage.capacitive) {
    const double leak = stage.capacitive->leakage_resistance_ohm;
    if (!(leak > 0)) return feedback;
    const double input = leak + stage.input_resistor_ohm;
    return input * feedback / (input + feedback);
  }
  const double input = stage.source.resistance_ohm + stage.input_resistor_ohm;
  return input * feedback / (input + feedback);
}

namespace {

// Vs, C_s and R_leak; returns the sensor node (the summing node when the
// stage has no input resistor).
NodeId AddCapacitiveSensor(const Stage& stage, NodeId source, NodeId summing,
                           Netlist* net) {
  const CapacitiveSensor& sensor = *stage.capacitive;
  NodeId terminal = summing;
  if (stage.input_resistor_ohm > 0) terminal = net->AddNode("sensor");
  net->capacitors.push_back({"C_s", source, terminal, sensor.capacitance_f});
  if (sensor.leakage_resistance_ohm > 0)
    net->resistors.push_back(
        {"R_leak", terminal, kGround, sensor.leakage_resistance_ohm, true});
  return terminal;
}

}  // namespace

Netlist ExpandInverting(const Stage& stage) {
  Netlist net;
  NodeId source = net.AddNode("source");
  NodeId input = source;
  if (!stage.capacitive && stage.source.resistance_ohm > 0) {
    input = net.AddNode("input");
    net.resistors.push_back(
        {"R_source", source, input, stage.source.resistance_ohm, true});
  }
  NodeId summing = net.AddNode("summing");
  NodeId output = net.AddNode("output");
  net.voltage_sources.push_back({"V_signal", source, kGround, 0.0});
  net.signal = SourceVoltage{0};
  net.output = output;
  if (stage.capacitive)
    input = AddCapacitiveSensor(stage, source, summing, &net);
  if (input != summing && stage.input_capacitor_f > 0) {
    const NodeId coupled = net.AddNode("coupled");
    net.capacitors.push_back(
        {"C_input", input, coupled, stage.input_capacitor_f});
    input = coupled;
  }
  if (input != summing)
    net.resistors.push_back(
        {"R_in", input, summing, stage.input_resistor_ohm, true});
  AddFeedback(stage.feedback, summing, output, &net);
  AddOpAmpWithLoad(stage, summing, output, InvertingBalanceOhm(stage), &net);
  return net;
}

}  // namespace hushgain
