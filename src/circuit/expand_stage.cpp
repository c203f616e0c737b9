#include "circuit/expand_stage.h"

#include "circuit/inverting_topology.h"
#include "circuit/transimpedance_topology.h"

namespace hushgain {

Netlist ExpandStage(const Stage& stage) {
  switch (stage.topology) {
    case Topology::kInverting:
      return ExpandInverting(stage);
    case Topology::kTransimpedance:
      return ExpandTransimpedance(stage);
  }
  return ExpandInverting(stage);
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
