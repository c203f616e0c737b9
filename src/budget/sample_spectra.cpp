#include "budget/sample_spectra.h"

#include <cmath>
#include <complex>
#include <cstdio>

#include "analysis/loop_gain.h"
#include "budget/feedback_capacitor.h"
#include "budget/stage_evaluator.h"
#include "circuit/stage_at_temperature.h"
#include "noise/spectrum_evaluator.h"

namespace hushgain {
namespace {

Status NotFinite(const std::string& what, double f_hz) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.6g Hz", f_hz);
  return Status::Fail(what + " is not finite at " + buf);
}

}  // namespace

int SpectrumSamples::Find(const std::string& name) const {
  for (std::size_t k = 0; k < names.size(); ++k)
    if (names[k] == name) return static_cast<int>(k);
  return -1;
}

Stage StageAsBudgeted(const Stage& stage, const Budget& budget) {
  Stage out = stage;
  if (out.capacitor_target) {
    out.feedback.capacitor_f = budget.feedback_capacitor_f;
    out.capacitor_target.reset();
  }
  return out;
}

SpectrumOutcome SampleSpectra(const Stage& requested,
                              const std::vector<double>& f_hz) {
  SpectrumOutcome outcome;
  SpectrumSamples& out = outcome.samples;
  Stage stage = StageAtTemperature(requested, requested.temperature_k);
  if (stage.capacitor_target) {
    const CapacitorOutcome cap =
        ChooseFeedbackCapacitor(stage, *stage.capacitor_target);
    if (!cap.status.ok) return {cap.status, out};
    stage.feedback.capacitor_f = cap.choice.chosen_f;
    stage.capacitor_target.reset();
  }
  Netlist netlist;
  SpectrumEvaluator evaluator;
  Status s = PrepareStageEvaluator(stage, &netlist, &evaluator, nullptr);
  if (!s.ok) return {s, out};
  const int n = evaluator.source_count();
  const Port signal = evaluator.Compile(netlist.signal);
  const Port e_n = evaluator.Compile(Excitation{OpAmpInputVoltage{0}});

  const std::size_t points = f_hz.size();
  out.f_hz = f_hz;
  for (const NoiseSource& source : evaluator.sources()) {
    out.names.push_back(source.name);
    out.kinds.push_back(source.kind);
  }
  out.density_v_per_rthz.assign(n, std::vector<double>(points));
  out.total_v_per_rthz.resize(points);
  out.signal_gain_abs.resize(points);
  out.noise_gain_abs.resize(points);
  out.loop_gain_abs.resize(points);
  LoopGainSolver loop(evaluator.system(), 0, stage.opamp);

  std::vector<double> psd(n);
  for (std::size_t i = 0; i < points; ++i) {
    s = evaluator.Densities(f_hz[i], psd.data());
    if (!s.ok) return {s, out};
    double total = 0;
    for (int k = 0; k < n; ++k) {
      if (!std::isfinite(psd[k]))
        return {NotFinite("the output noise of " + out.names[k], f_hz[i]), out};
      out.density_v_per_rthz[k][i] = std::sqrt(psd[k]);
      total += psd[k];
    }
    out.total_v_per_rthz[i] = std::sqrt(total);
    out.signal_gain_abs[i] = std::abs(evaluator.Transfer(signal));
    out.noise_gain_abs[i] = std::abs(evaluator.Transfer(e_n));
    if (!std::isfinite(out.signal_gain_abs[i]))
      return {NotFinite("the signal gain", f_hz[i]), out};
    if (!std::isfinite(out.noise_gain_abs[i]))
      return {NotFinite("the noise gain", f_hz[i]), out};
    Complex t;
    s = loop.LoopGainAt(f_hz[i], &t);
    if (!s.ok) return {s, out};
    out.loop_gain_abs[i] = std::abs(t);
    if (!std::isfinite(out.loop_gain_abs[i]))
      return {NotFinite("the loop gain", f_hz[i]), out};
  }
  outcome.status = Status::Ok();
  return outcome;
}

}  // namespace hushgain
