// A linear netlist: nodes, resistors, capacitors, op-amp macro models and the
// signal source, plus the named excitation points that analysis turns into
// right-hand sides. Topology templates build one; the engine reads it and
// knows nothing of what stage it came from.
#ifndef HUSHGAIN_CIRCUIT_NETLIST_H_
#define HUSHGAIN_CIRCUIT_NETLIST_H_

#include <string>
#include <variant>
#include <vector>

#include "circuit/opamp_model.h"

namespace hushgain {

using NodeId = int;
inline constexpr NodeId kGround = 0;

struct Resistor {
  std::string name;  // the designer's name: "R_in", "R1", "R_plus"
  NodeId a = kGround;
  NodeId b = kGround;
  double ohms = 0;
  bool noisy = true;  // thermal noise 4kTR; a model element is not
};

struct Capacitor {
  std::string name;
  NodeId a = kGround;
  NodeId b = kGround;
  double farads = 0;
};

struct OpAmp {
  std::string name;
  NodeId plus = kGround;
  NodeId minus = kGround;
  NodeId out = kGround;
  OpAmpModel model;
};

// An ideal voltage source from `minus` to `plus`; the signal source is one,
// a photodiode's bias supply another. Its own noise, when it has any, is a
// white voltage density in series (a noise source of the budget).
struct VoltageSource {
  std::string name;
  NodeId plus = kGround;
  NodeId minus = kGround;
  double noise_v_per_rthz = 0;  // 0 = noiseless
};

// A DC current through a junction from node `a` to node `b` (a photodiode's
// dark current or its average photocurrent): no part of the linear network,
// but a source of shot noise 2 q I and of a DC output. A dark current is an
// error of the output (it joins the offset); a photocurrent is the signal's
// own DC level (it does not).
struct JunctionCurrent {
  std::string name;
  NodeId a = kGround;
  NodeId b = kGround;
  double amperes = 0;
  bool is_signal = false;  // true: the photocurrent, not an offset
};

// Where a unit stimulus enters the network.
// A unit current pushed into node `into`, drawn out of node `out_of`.
struct CurrentInjection {
  NodeId into = kGround;
  NodeId out_of = kGround;
};
// A unit voltage in series with the + input of op-amp `opamp` (where e_n and
// Vos sit: between the + pin and the ideal amplifier).
struct OpAmpInputVoltage {
  int opamp = 0;
};
// A unit voltage of voltage source `source`.
struct SourceVoltage {
  int source = 0;
};
using Excitation =
    std::variant<CurrentInjection, OpAmpInputVoltage, SourceVoltage>;

// The source's own noise, a stimulus at the signal's excitation (so it
// reaches the output with the signal gain): density^2 (1 + corner / f), in
// V^2/Hz or A^2/Hz as the signal is a voltage or a current.
struct SignalNoise {
  double density = 0;  // 0 = noiseless
  double corner_hz = 0;
};

struct Netlist {
  std::vector<std::string> node_names{"ground"};  // index = NodeId
  std::vector<Resistor> resistors;
  std::vector<Capacitor> capacitors;
  std::vector<OpAmp> opamps;
  std::vector<VoltageSource> voltage_sources;
  std::vector<JunctionCurrent> junction_currents;
  Excitation signal = SourceVoltage{0};  // the stage's input
  SignalNoise signal_noise;              // the sensor's own noise
  NodeId output = kGround;               // where the output voltage is read

  NodeId AddNode(std::string name) {
    node_names.push_back(std::move(name));
    return static_cast<NodeId>(node_names.size() - 1);
  }
  int node_count() const { return static_cast<int>(node_names.size()); }
};

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_NETLIST_H_
