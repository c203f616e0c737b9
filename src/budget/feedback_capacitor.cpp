#include "budget/feedback_capacitor.h"

#include <cmath>
#include <complex>
#include <cstdio>

#include "analysis/frequency_response.h"
#include "analysis/loop_gain.h"
#include "analysis/mna_system.h"
#include "base/physical_constants.h"
#include "circuit/expand_stage.h"
#include "circuit/feedback_network.h"

namespace hushgain {
namespace {

constexpr double kSmallestF = 1e-18;
constexpr double kLargestF = 1e-6;
constexpr double kButterworthQ = 0.70710678118654752;

// Where the loop and response scans start and stop: well below the op-amp's
// open-loop pole and the band, and far above the GBW.
double ScanStartHz(const Stage& s) {
  return 1e-3 *
         std::min(s.band_low_hz, s.opamp.gbw_hz / s.opamp.open_loop_gain);
}
double ScanStopHz(const Stage& s) { return 1e3 * s.opamp.gbw_hz; }

Stage WithCapacitor(const Stage& stage, double farads) {
  Stage s = stage;
  s.feedback.capacitor_f = farads;
  s.capacitor_target.reset();
  return s;
}

struct Q {
  Status status;
  double q = 0;
  bool found = false;
};

Q ResponseQ(const Stage& stage) {
  const Netlist net = ExpandStage(stage);
  MnaSystem system;
  Status s = MnaSystem::Build(net, &system);
  if (!s.ok) return {s};
  AdjointSolver solver(system);
  const Port signal = system.Compile(net.signal);
  QualityFactor q = SecondOrderQ(
      [&](double f, std::complex<double>* h) {
        Status st = solver.SolveAt(f);
        *h = solver.Transfer(signal);
        return st;
      },
      ScanStartHz(stage), ScanStopHz(stage));
  return {q.status, q.q, q.found};
}

std::string Degrees(double d) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "phase margin %.4g deg", d);
  return buf;
}

// Bisection in log C_f for `rises(C_f) - target` changing sign.
template <typename Measure>
Status Bisect(Measure measure, double target, bool rising, double* found) {
  double lo = std::log(kSmallestF), hi = std::log(kLargestF);
  for (int i = 0; i < 80 && hi - lo > 1e-7; ++i) {
    const double mid = 0.5 * (lo + hi);
    double value = 0;
    Status s = measure(std::exp(mid), &value);
    if (!s.ok) return s;
    const bool above = value >= target;
    if (above == rising)
      hi = mid;
    else
      lo = mid;
  }
  *found = std::exp(0.5 * (lo + hi));
  return Status::Ok();
}

}  // namespace

double InputCapacitanceF(const Stage& stage) {
  const double diode = stage.topology == Topology::kTransimpedance
                           ? stage.photodiode.capacitance_f
                           : 0;
  return diode + stage.opamp.c_cm_f + stage.opamp.c_diff_f;
}

StageLoop ComputeStageLoop(const Stage& stage) {
  StageLoop out;
  const Netlist net = ExpandStage(stage);
  MnaSystem system;
  out.status = MnaSystem::Build(net, &system);
  if (!out.status.ok) return out;
  LoopGainSolver solver(system, 0, stage.opamp);
  LoopSummary summary =
      SummarizeLoop(solver, ScanStartHz(stage), ScanStopHz(stage));
  out.status = summary.status;
  out.loop.crossover_found = summary.crossover_found;
  out.loop.crossover_hz = summary.crossover_hz;
  out.loop.phase_margin_deg = summary.phase_margin_deg;
  out.loop.dc_loop_gain = summary.dc_loop_gain;
  return out;
}

CapacitorOutcome ChooseFeedbackCapacitor(const Stage& stage,
                                         const CapacitorTarget& target) {
  CapacitorOutcome out;
  const double c = InputCapacitanceF(stage);
  const double rf = FeedbackEquivalentOhm(stage.feedback);
  const double gbw = stage.opamp.gbw_hz;
  if (target.kind == CapacitorTarget::Kind::kButterworth) {
    out.choice.target = "butterworth";
    out.choice.estimate_f = std::sqrt(c / (kPi * rf * gbw));
    out.choice.estimate_rule = "sqrt(C / (pi Rf GBW))";
    auto measure = [&](double cf, double* q) {
      Q r = ResponseQ(WithCapacitor(stage, cf));
      // No -90 degree turn below the scan's end: a first-order response, Q ~ 0.
      *q = r.found ? r.q : 0.0;
      return r.status;
    };
    double q_min = 0;
    out.status = measure(kSmallestF, &q_min);
    if (!out.status.ok) return out;
    if (q_min <= kButterworthQ) {
      out.choice.chosen_f = 0;  // flat without a capacitor
      return out;
    }
    out.status =
        Bisect(measure, kButterworthQ, /*rising=*/false, &out.choice.chosen_f);
    return out;
  }
  out.choice.target = Degrees(target.phase_margin_deg);
  out.choice.estimate_f = std::sqrt(c / (2 * kPi * rf * gbw));
  out.choice.estimate_rule =
      "sqrt(C / (2 pi Rf GBW)), the classic 45 deg estimate";
  auto measure = [&](double cf, double* pm) {
    StageLoop r = ComputeStageLoop(WithCapacitor(stage, cf));
    *pm = r.loop.crossover_found ? r.loop.phase_margin_deg : 180.0;
    return r.status;
  };
  double pm_max = 0, pm_min = 0;
  out.status = measure(kLargestF, &pm_max);
  if (out.status.ok) out.status = measure(kSmallestF, &pm_min);
  if (!out.status.ok) return out;
  if (pm_min >= target.phase_margin_deg) {
    out.choice.chosen_f = 0;
    return out;
  }
  if (pm_max < target.phase_margin_deg) {
    char buf[160];
    std::snprintf(buf, sizeof buf,
                  "no feedback capacitor up to 1 uF gives a phase margin of "
                  "%.4g deg (at most %.4g)",
                  target.phase_margin_deg, pm_max);
    out.status = Status::Fail(buf);
    return out;
  }
  out.status = Bisect(measure, target.phase_margin_deg, /*rising=*/true,
                      &out.choice.chosen_f);
  return out;
}

}  // namespace hushgain
