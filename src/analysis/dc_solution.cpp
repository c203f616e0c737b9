#include "analysis/dc_solution.h"

#include <cmath>

namespace hushgain {

Status SolveDc(const MnaSystem& system, const std::vector<DcStimulus>& stimuli,
               std::vector<double>* unknowns) {
  const int n = system.size();
  RealVector b = RealVector::Zero(n);
  for (const DcStimulus& s : stimuli) {
    if (s.port.plus >= 0) b[s.port.plus] += s.value;
    if (s.port.minus >= 0) b[s.port.minus] -= s.value;
  }
  RealLu lu(system.g());
  RealVector x = lu.solve(b);
  const double residual = (system.g() * x - b).cwiseAbs().maxCoeff();
  const double scale = system.g().cwiseAbs().rowwise().sum().maxCoeff() *
                           x.cwiseAbs().maxCoeff() +
                       b.cwiseAbs().maxCoeff();
  if (!x.allFinite() || !(residual <= 1e-9 * scale))
    return Status::Fail("the network is singular at DC (0 Hz)");
  unknowns->assign(x.data(), x.data() + n);
  return Status::Ok();
}

double NodeVoltage(const MnaSystem& system, const std::vector<double>& unknowns,
                   NodeId node) {
  const int i = system.NodeIndex(node);
  return i >= 0 ? unknowns[i] : 0.0;
}

}  // namespace hushgain
