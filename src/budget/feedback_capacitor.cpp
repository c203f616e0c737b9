#include "budget/feedback_capacitor.h"

#include <cmath>
#include <complex>
#include <cstdio>

#include "analysis/bracketed_root.h"
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
// The chosen C_f is found to this, in ln C_f.
constexpr double kCapacitorTolerance = 1e-10;
// The bracket around the estimate widens by this, in ln C_f (a factor 2).
constexpr double kBracketStep = 0.69314718055994531;

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

// The C_f where a measure falling with C_f passes `target`, by Brent's
// method in ln C_f to kCapacitorTolerance. The bracket starts at the estimate
// and widens by kBracketStep either way, so a monotonic measure is bracketed in
// two or three measures; at the ends of 1 aF .. 1 uF the end is the answer.
// `at_smallest` is the measure at 1 aF.
template <typename Measure>
Status FindCapacitor(Measure measure, double target, double estimate_f,
                     double at_smallest, double* found) {
  const double lo_end = std::log(kSmallestF), hi_end = std::log(kLargestF);
  // g > 0 on the side of small C_f.
  auto g = [&](double x, double* value) {
    double m = 0;
    Status s = measure(std::exp(x), &m);
    *value = m - target;
    return s;
  };
  double x = std::log(estimate_f);
  if (!(x > lo_end && x < hi_end)) x = 0.5 * (lo_end + hi_end);
  double gx = 0;
  Status s = g(x, &gx);
  if (!s.ok) return s;
  double lo = lo_end, g_lo = at_smallest - target;
  double hi = hi_end, g_hi = 0;
  bool have_hi = false;
  if (gx > 0) {
    // The root lies above: step up until the sign changes.
    lo = x, g_lo = gx;
    for (double next = x + kBracketStep;; next += kBracketStep) {
      next = std::fmin(next, hi_end);
      s = g(next, &g_hi);
      if (!s.ok) return s;
      hi = next;
      if (!(g_hi > 0)) {
        have_hi = true;
        break;
      }
      lo = next, g_lo = g_hi;
      if (next >= hi_end) break;
    }
    if (!have_hi) {
      *found = kLargestF;  // still short of the target at 1 uF
      return Status::Ok();
    }
  } else {
    hi = x, g_hi = gx;
    for (double next = x - kBracketStep; next > lo_end; next -= kBracketStep) {
      double g_next = 0;
      s = g(next, &g_next);
      if (!s.ok) return s;
      if (g_next > 0) {
        lo = next, g_lo = g_next;
        break;
      }
      hi = next, g_hi = g_next;
    }
  }
  double root = 0;
  s = FindBracketedRoot(g, lo, g_lo, hi, g_hi, kCapacitorTolerance, &root);
  if (!s.ok) return s;
  *found = std::exp(root);
  return Status::Ok();
}

}  // namespace

double InputCapacitanceF(const Stage& stage) {
  double diode = 0;
  if (stage.topology == Topology::kTransimpedance)
    diode = stage.photodiode.capacitance_f;
  else if (stage.capacitive && !(stage.input_resistor_ohm > 0))
    diode = stage.capacitive->capacitance_f;
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
    out.status = FindCapacitor(measure, kButterworthQ, out.choice.estimate_f,
                               q_min, &out.choice.chosen_f);
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
  // The phase margin is not monotonic in C_f when R_out and the pin
  // capacitances shape the loop, so the set that meets the target is
  // bracketed on a log grid over 1 aF .. 1 uF (kGridPerDecade points a
  // decade) and its lower edge bisected between the last grid point that
  // fails and the first that meets it: the smallest C_f that meets it.
  constexpr int kGridPerDecade = 8;
  const int n = static_cast<int>(
      std::round(kGridPerDecade * std::log10(kLargestF / kSmallestF)));
  double pm_min = 0;
  out.status = measure(kSmallestF, &pm_min);
  if (!out.status.ok) return out;
  if (pm_min >= target.phase_margin_deg) {
    out.choice.chosen_f = 0;
    return out;
  }
  double best_pm = pm_min, best_f = kSmallestF, prev_f = kSmallestF;
  double prev_pm = pm_min;
  for (int i = 1; i <= n; ++i) {
    const double cf = kSmallestF * std::pow(kLargestF / kSmallestF,
                                            static_cast<double>(i) / n);
    double pm = 0;
    out.status = measure(cf, &pm);
    if (!out.status.ok) return out;
    if (pm >= target.phase_margin_deg) {
      // The lower edge of the set that meets it, by Brent's method between
      // the last grid point that fails and this one.
      double root = 0;
      out.status = FindBracketedRoot(
          [&](double x, double* value) {
            Status s = measure(std::exp(x), value);
            *value -= target.phase_margin_deg;
            return s;
          },
          std::log(prev_f), prev_pm - target.phase_margin_deg, std::log(cf),
          pm - target.phase_margin_deg, kCapacitorTolerance, &root);
      if (!out.status.ok) return out;
      out.choice.chosen_f = std::exp(root);
      return out;
    }
    if (pm > best_pm) {
      best_pm = pm;
      best_f = cf;
    }
    prev_f = cf;
    prev_pm = pm;
  }
  char buf[200];
  std::snprintf(buf, sizeof buf,
                "no feedback capacitor from 1 aF to 1 uF gives a phase margin "
                "of %.4g deg (the best found: %.4g deg at %.3g F)",
                target.phase_margin_deg, best_pm, best_f);
  out.status = Status::Fail(buf);
  return out;
}

}  // namespace hushgain
