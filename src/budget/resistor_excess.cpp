#include "budget/resistor_excess.h"

#include <algorithm>
#include <cmath>

namespace hushgain {

std::vector<DcStimulus> StageDcStimuli(const Netlist& net,
                                       const MnaSystem& system,
                                       const OpAmpModel& opamp,
                                       double dc_input) {
  std::vector<DcStimulus> out;
  if (dc_input != 0) out.push_back({system.Compile(net.signal), dc_input});
  if (net.opamps.empty()) return out;
  const OpAmp& op = net.opamps[0];
  out.push_back(
      {system.Compile(Excitation{OpAmpInputVoltage{0}}), opamp.vos_v});
  // A current flowing into a pin leaves the network there.
  const double ib_plus = opamp.ib_a + 0.5 * opamp.ios_a;
  const double ib_minus = opamp.ib_a - 0.5 * opamp.ios_a;
  out.push_back({system.Compile(Excitation{CurrentInjection{op.plus, kGround}}),
                 -ib_plus});
  out.push_back(
      {system.Compile(Excitation{CurrentInjection{op.minus, kGround}}),
       -ib_minus});
  for (const JunctionCurrent& j : net.junction_currents)
    out.push_back(
        {system.Compile(Excitation{CurrentInjection{j.b, j.a}}), j.amperes});
  return out;
}

std::vector<ResistorExcess> ResistorExcessList(
    const Stage& stage, const Netlist& net, const MnaSystem& system,
    const std::vector<double>& unknowns) {
  std::vector<ResistorExcess> out;
  for (std::size_t k = 0; k < net.resistors.size(); ++k) {
    const Resistor& r = net.resistors[k];
    const ResistorSpec* spec = ResistorSpecFor(stage, r.name);
    if (!spec || !r.noisy) continue;
    const double v =
        NodeVoltage(system, unknowns, r.a) - NodeVoltage(system, unknowns, r.b);
    out.push_back({static_cast<int>(k), spec->technology.noise_index_db, v});
  }
  return out;
}

Status ExcessNoiseOfStage(const Stage& stage, const Netlist& net,
                          const MnaSystem& system,
                          std::vector<ResistorDrop>* drops,
                          std::vector<NoiseSource>* sources) {
  drops->clear();
  sources->clear();
  bool any = stage.resistors.has_value() || !stage.resistor_overrides.empty();
  if (!any) return Status::Ok();
  std::vector<double> x;
  Status s = SolveDc(
      system, StageDcStimuli(net, system, stage.opamp, stage.dc_input), &x);
  if (!s.ok) return s;
  const std::vector<ResistorExcess> list =
      ResistorExcessList(stage, net, system, x);
  for (const ResistorExcess& e : list) {
    const std::string& name = net.resistors[e.resistor].name;
    const ResistorSpec* spec = ResistorSpecFor(stage, name);
    drops->push_back(
        {name, spec->technology.class_name, e.noise_index_db, e.v_dc});
  }
  *sources = ExcessNoiseSources(net, list);
  return Status::Ok();
}

std::optional<ExcessAdvice> AdviseExcess(
    const std::vector<Contributor>& contributors, double output_rms_v,
    const Stage& stage, const std::vector<ResistorSpec>& candidates) {
  const Contributor* worst = nullptr;
  for (const Contributor& c : contributors)
    if (c.kind == NoiseKind::kExcess && (!worst || c.share > worst->share))
      worst = &c;
  if (!worst || !(worst->share > 0)) return std::nullopt;
  ExcessAdvice advice;
  advice.resistor =
      worst->name.substr(0, worst->name.size() - std::string(" excess").size());
  const ResistorSpec* spec = ResistorSpecFor(stage, advice.resistor);
  if (!spec) return std::nullopt;
  advice.technology = spec->technology.class_name;
  advice.noise_index_db = spec->technology.noise_index_db;
  advice.share = worst->share;
  // The excess power scales as 10^(NI/10) at the same drop
  // (noise/excess_noise.h).
  const double total = output_rms_v * output_rms_v;
  const double excess = worst->output_rms_v * worst->output_rms_v;
  for (const ResistorSpec& c : candidates) {
    if (!(c.technology.noise_index_db < advice.noise_index_db)) continue;
    const double ratio = std::pow(
        10.0, (c.technology.noise_index_db - advice.noise_index_db) / 10.0);
    const double changed = std::max(0.0, total - excess + excess * ratio);
    advice.alternatives.push_back({c.technology.class_name,
                                   c.technology.noise_index_db,
                                   std::sqrt(changed)});
  }
  std::sort(advice.alternatives.begin(), advice.alternatives.end(),
            [](const ExcessAdvice::Alternative& l,
               const ExcessAdvice::Alternative& r) {
              return l.noise_index_db < r.noise_index_db;
            });
  return advice;
}

}  // namespace hushgain
