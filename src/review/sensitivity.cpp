#include "review/sensitivity.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <string>

#include "budget/stage_evaluator.h"
#include "integrate/band_integral.h"
#include "noise/spectrum_evaluator.h"

namespace hushgain {
namespace {

constexpr double kStep = 1e-3;  // h in ln x

// One parameter of the stage: its name, unit, and where it lives.
struct Parameter {
  std::string name;
  std::string unit;
  std::function<double*(Stage&)> at;
};

// Every parameter a designer could change, present in `stage` and non-zero.
std::vector<Parameter> ParametersOf(const Stage& stage) {
  std::vector<Parameter> all = {
      {"R_source", "ohm", [](Stage& s) { return &s.source.resistance_ohm; }},
      {"R_in", "ohm", [](Stage& s) { return &s.input_resistor_ohm; }},
      {"R_plus", "ohm",
       [](Stage& s) {
         return s.plus_resistor.mode == PlusResistor::Mode::kValue
                    ? &s.plus_resistor.ohms
                    : nullptr;
       }},
      {"C_plus", "F", [](Stage& s) { return &s.plus_resistor_bypass_f; }},
      {"R_load", "ohm",
       [](Stage& s) { return s.load_ohm ? &*s.load_ohm : nullptr; }},
      {"e_n", "V/rtHz", [](Stage& s) { return &s.opamp.e_w_v_per_rthz; }},
      {"e_n corner", "Hz", [](Stage& s) { return &s.opamp.f_cv_hz; }},
      {"i_n", "A/rtHz", [](Stage& s) { return &s.opamp.i_w_a_per_rthz; }},
      {"i_n corner", "Hz", [](Stage& s) { return &s.opamp.f_ci_hz; }},
      {"A0", "V/V", [](Stage& s) { return &s.opamp.open_loop_gain; }},
      {"GBW", "Hz", [](Stage& s) { return &s.opamp.gbw_hz; }},
      {"R_out", "ohm", [](Stage& s) { return &s.opamp.output_resistance_ohm; }},
      {"C_cm", "F", [](Stage& s) { return &s.opamp.c_cm_f; }},
      {"C_diff", "F", [](Stage& s) { return &s.opamp.c_diff_f; }},
      {"Vos", "V", [](Stage& s) { return &s.opamp.vos_v; }},
      {"Ib", "A", [](Stage& s) { return &s.opamp.ib_a; }},
      {"Ios", "A", [](Stage& s) { return &s.opamp.ios_a; }},
  };
  if (stage.feedback.kind == Feedback::Kind::kTee) {
    all.push_back(
        {"R1", "ohm", [](Stage& s) { return &s.feedback.tee.r1_ohm; }});
    all.push_back(
        {"R2", "ohm", [](Stage& s) { return &s.feedback.tee.r2_ohm; }});
    all.push_back(
        {"R3", "ohm", [](Stage& s) { return &s.feedback.tee.r3_ohm; }});
  } else {
    all.push_back(
        {"R_f", "ohm", [](Stage& s) { return &s.feedback.resistor_ohm; }});
  }
  all.push_back({"C_f", "F", [](Stage& s) { return &s.feedback.capacitor_f; }});
  if (stage.topology == Topology::kTransimpedance) {
    all.push_back(
        {"C_d", "F", [](Stage& s) { return &s.photodiode.capacitance_f; }});
    all.push_back({"R_sh", "ohm", [](Stage& s) {
                     return &s.photodiode.shunt_resistance_ohm;
                   }});
    all.push_back({"R_s", "ohm", [](Stage& s) {
                     return &s.photodiode.series_resistance_ohm;
                   }});
    all.push_back(
        {"I_ph", "A", [](Stage& s) { return &s.photodiode.photocurrent_a; }});
    all.push_back(
        {"I_dark", "A", [](Stage& s) { return &s.photodiode.dark_current_a; }});
  }
  if (stage.capacitive) {
    all.push_back(
        {"C_s", "F", [](Stage& s) { return &s.capacitive->capacitance_f; }});
    all.push_back({"R_leak", "ohm", [](Stage& s) {
                     return &s.capacitive->leakage_resistance_ohm;
                   }});
  }
  if (stage.sensor_noise)
    all.push_back(
        {"sensor noise",
         stage.topology == Topology::kTransimpedance ? "A/rtHz" : "V/rtHz",
         [](Stage& s) { return &s.sensor_noise->density; }});
  std::vector<Parameter> present;
  Stage probe = stage;
  for (Parameter& p : all) {
    const double* x = p.at(probe);
    if (x && *x != 0 && std::isfinite(*x)) present.push_back(std::move(p));
  }
  return present;
}

// The output noise power of `stage` on fixed nodes.
Status FrozenNoisePower(const Stage& stage,
                        const std::vector<QuadratureNode>& nodes,
                        double* power) {
  Netlist net;
  SpectrumEvaluator ev;
  Status s = PrepareStageEvaluator(stage, &net, &ev, nullptr);
  if (!s.ok) return s;
  std::vector<double> psd(ev.source_count());
  double sum = 0;
  for (const QuadratureNode& n : nodes) {
    s = ev.Densities(n.f_hz, psd.data());
    if (!s.ok) return s;
    double total = 0;
    for (double v : psd) total += v;
    sum += n.weight_hz * total;
  }
  *power = sum;
  return Status::Ok();
}

// The three figures of a stage: noise power on the frozen nodes, offset
// and bandwidth from a budget.
struct Figures {
  double noise_power = 0;
  double offset_v = 0;
  double bandwidth_hz = 0;
  double gain = 0;
};

Status FiguresOf(const Stage& stage, const std::vector<QuadratureNode>& nodes,
                 const BudgetOptions& options, Figures* f) {
  Status s = FrozenNoisePower(stage, nodes, &f->noise_power);
  if (!s.ok) return s;
  BudgetOutcome b = ComputeBudgetAsGiven(stage, options);
  if (!b.status.ok) return b.status;
  f->offset_v = b.budget.offset.worst_case_v;
  f->bandwidth_hz = b.budget.bandwidth_3db_hz;
  f->gain = b.budget.passband_gain;
  return Status::Ok();
}

// Richardson-extrapolated central difference from F at u +- h and u +- 2h
// (ln F values), with its error estimate.
double Derivative(double m2, double m1, double p1, double p2, double h,
                  double* error) {
  const double d1 = (p1 - m1) / (2 * h);
  const double d2 = (p2 - m2) / (4 * h);
  *error = std::fabs(d1 - d2) / 3;
  return (4 * d1 - d2) / 3;
}

}  // namespace

Status ComputeSensitivity(const BudgetOutcome& outcome,
                          const BudgetOptions& options,
                          SensitivityBlock* block) {
  SensitivityBlock out;
  out.step = kStep;
  const Stage& base = outcome.stage_used;
  const std::vector<QuadratureNode> nodes =
      QuadratureNodes(outcome.noise_partition);
  BudgetOptions quiet = options;
  for (const Parameter& p : ParametersOf(base)) {
    Figures f[4];
    const double steps[4] = {-2 * kStep, -kStep, kStep, 2 * kStep};
    for (int i = 0; i < 4; ++i) {
      Stage s = base;
      double* x = p.at(s);
      *x *= std::exp(steps[i]);
      Status st = FiguresOf(s, nodes, quiet, &f[i]);
      if (!st.ok) return Status::Fail(p.name + " changed: " + st.message);
    }
    SensitivityRow row;
    row.parameter = p.name;
    row.unit = p.unit;
    Stage probe = base;
    row.value = *p.at(probe);
    double err = 0;
    // ln rms = ln(power) / 2.
    row.noise =
        0.5 * Derivative(std::log(f[0].noise_power), std::log(f[1].noise_power),
                         std::log(f[2].noise_power), std::log(f[3].noise_power),
                         kStep, &err);
    out.largest_error = std::max(out.largest_error, 0.5 * err);
    auto all_positive = [&](double Figures::*m) {
      for (const Figures& x : f)
        if (!(x.*m > 0)) return false;
      return true;
    };
    if (all_positive(&Figures::offset_v)) {
      row.offset = Derivative(std::log(f[0].offset_v), std::log(f[1].offset_v),
                              std::log(f[2].offset_v), std::log(f[3].offset_v),
                              kStep, &err);
      out.largest_error = std::max(out.largest_error, err);
    }
    if (all_positive(&Figures::bandwidth_hz)) {
      row.bandwidth =
          Derivative(std::log(f[0].bandwidth_hz), std::log(f[1].bandwidth_hz),
                     std::log(f[2].bandwidth_hz), std::log(f[3].bandwidth_hz),
                     kStep, &err);
      out.largest_error = std::max(out.largest_error, err);
    }
    if (all_positive(&Figures::gain)) {
      row.gain =
          Derivative(std::log(f[0].gain), std::log(f[1].gain),
                     std::log(f[2].gain), std::log(f[3].gain), kStep, &err);
      out.largest_error = std::max(out.largest_error, err);
    }
    out.rows.push_back(row);
  }
  auto size = [](const SensitivityRow& r) {
    return std::max({std::fabs(r.noise), std::fabs(r.offset.value_or(0)),
                     std::fabs(r.bandwidth.value_or(0))});
  };
  std::stable_sort(out.rows.begin(), out.rows.end(),
                   [&](const SensitivityRow& a, const SensitivityRow& b) {
                     return size(a) > size(b);
                   });
  // The advice: the largest |s| on the noise, the change made in full.
  const SensitivityRow* best = nullptr;
  for (const SensitivityRow& r : out.rows) {
    if (std::fabs(r.gain.value_or(0)) >= kGainSettingSensitivity) continue;
    if (!best || std::fabs(r.noise) > std::fabs(best->noise)) best = &r;
  }
  if (best && best->noise != 0) {
    for (const Parameter& p : ParametersOf(base)) {
      if (p.name != best->parameter) continue;
      Stage s = base;
      const double factor = best->noise > 0 ? 0.5 : 2.0;
      *p.at(s) *= factor;
      BudgetOutcome changed = ComputeBudgetAsGiven(s, options);
      if (changed.status.ok && outcome.budget.output_rms_v > 0) {
        out.advice_parameter = p.name;
        out.advice_factor = factor;
        out.advice_noise_ratio =
            changed.budget.output_rms_v / outcome.budget.output_rms_v;
      }
    }
  }
  *block = std::move(out);
  return Status::Ok();
}

}  // namespace hushgain
