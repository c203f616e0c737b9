#include "circuit/expand_stage.h"

#include "circuit/inverting_topology.h"
#include "circuit/transimpedance_topology.h"

namespace hushgain {

namespace {

Netlist ExpandTopology(const Stage& stage) {
  switch (stage.topology) {
    case Topology::kInverting:
      return ExpandInverting(stage);
    case Topology::kTransimpedance:
      return ExpandTransimpedance(stage);
  }
  return ExpandInverting(stage);
}

}  // namespace

Netlist ExpandStage(const Stage& stage) {
  Netlist net = ExpandTopology(stage);
  if (stage.sensor_noise)
    net.signal_noise = {stage.sensor_noise->density,
                        stage.sensor_noise->corner_hz};
  return net;
}

double BalanceResistorOhm(const Stage& stage) {
  switch (stage.topology) {
    case Topology::kInverting:
      return InvertingBalanceOhm(stage);
    case Topology::kTransimpedance:
      return TransimpedanceBalanceOhm(stage);
  }
  return InvertingBalanceOhm(stage);
}

}  // namespace hushgain
