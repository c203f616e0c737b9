#include "circuit/expand_stage.h"

#include "circuit/inverting_topology.h"

namespace hushgain {

Netlist ExpandStage(const Stage& stage) {
  switch (stage.topology) {
    case Topology::kInverting:
      return ExpandInverting(stage);
  }
  return ExpandInverting(stage);
}

double BalanceResistorOhm(const Stage& stage) {
  switch (stage.topology) {
    case Topology::kInverting:
      return InvertingBalanceOhm(stage);
  }
  return InvertingBalanceOhm(stage);
}

}  // namespace hushgain
