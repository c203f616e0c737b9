#include "circuit/transimpedance_topology.h"

#include "circuit/feedback_network.h"

namespace hushgain {

double TransimpedanceBalanceOhm(const Stage& stage) {
  const double feedback = FeedbackDcOhm(stage.feedback);
  const double shunt = stage.photodiode.shunt_resistance_ohm;
  if (shunt <= 0) return feedback;
  // The diode's DC path from the - input: R_s in series with R_sh.
  const double diode = shunt + stage.photodiode.series_resistance_ohm;
  return diode * feedback / (diode + feedback);
}

bool DarkCurrentFlows(const Photodiode& pd) { return pd.reverse_bias_v > 0; }

Netlist ExpandTransimpedance(const Stage& stage) {
  Netlist net;
  const Photodiode& pd = stage.photodiode;
  NodeId summing = net.AddNode("summing");
  NodeId output = net.AddNode("output");
  NodeId junction = summing;
  if (pd.series_resistance_ohm > 0) {
    junction = net.AddNode("junction");
    net.resistors.push_back(
        {"R_s", junction, summing, pd.series_resistance_ohm, true});
  }
  NodeId bias = kGround;
  if (DarkCurrentFlows(pd) && pd.bias_noise_v_per_rthz > 0) {
    // The bias supply holds the diode's far side at AC ground; only its
    // noise is seen (the dark current as given already includes the
    // leakage the bias drives through R_sh).
    bias = net.AddNode("bias");
    net.voltage_sources.push_back(
        {"V_bias", bias, kGround, pd.bias_noise_v_per_rthz});
  }
  net.signal = CurrentInjection{junction, bias};
  net.output = output;
  if (pd.capacitance_f > 0)
    net.capacitors.push_back({"C_d", junction, bias, pd.capacitance_f});
  if (pd.shunt_resistance_ohm > 0)
    net.resistors.push_back(
        {"R_sh", junction, bias, pd.shunt_resistance_ohm, true});
  // Both currents flow the way the signal does: into the junction node.
  if (pd.photocurrent_a > 0)
    net.junction_currents.push_back(
        {"I_ph", bias, junction, pd.photocurrent_a, true});
  if (DarkCurrentFlows(pd) && pd.dark_current_a > 0)
    net.junction_currents.push_back(
        {"I_dark", bias, junction, pd.dark_current_a, false});
  AddFeedback(stage.feedback, summing, output, &net);
  AddOpAmpWithLoad(stage, summing, output, TransimpedanceBalanceOhm(stage),
                   &net);
  return net;
}

}  // namespace hushgain
