#include "circuit/transimpedance_topology.h"

#include "circuit/feedback_network.h"

namespace hushgain {

double TransimpedanceBalanceOhm(const Stage& stage) {
  const double feedback = FeedbackDcOhm(stage.feedback);
  const double shunt = stage.photodiode.shunt_resistance_ohm;
  if (shunt <= 0) return feedback;
  return shunt * feedback / (shunt + feedback);
}

Netlist ExpandTransimpedance(const Stage& stage) {
  Netlist net;
  const Photodiode& pd = stage.photodiode;
  NodeId summing = net.AddNode("summing");
  NodeId output = net.AddNode("output");
  net.signal = CurrentInjection{summing, kGround};
  net.output = output;
  if (pd.capacitance_f > 0)
    net.capacitors.push_back({"C_d", summing, kGround, pd.capacitance_f});
  if (pd.shunt_resistance_ohm > 0)
    net.resistors.push_back(
        {"R_sh", summing, kGround, pd.shunt_resistance_ohm, true});
  if (pd.dark_current_a > 0)
    net.junction_currents.push_back(
        {"I_dark", kGround, summing, pd.dark_current_a});
  AddFeedback(stage.feedback, summing, output, &net);
  AddOpAmpWithLoad(stage, summing, output, TransimpedanceBalanceOhm(stage),
                   &net);
  return net;
}

}  // namespace hushgain
