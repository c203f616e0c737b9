#include "budget/compute_budget.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <cstdio>
#include <utility>
#include <vector>

#include "analysis/frequency_response.h"
#include "analysis/loop_gain.h"
#include "base/physical_constants.h"
#include "base/printf.h"
#include "budget/feedback_capacitor.h"
#include "budget/headroom.h"
#include "budget/offset.h"
#include "budget/resistor_excess.h"
#include "budget/stage_evaluator.h"
#include "budget/tee_pi.h"
#include "circuit/expand_stage.h"
#include "circuit/feedback_network.h"
#include "circuit/stage_at_temperature.h"
#include "circuit/tee_equivalents.h"
#include "circuit/transimpedance_topology.h"
#include "noise/spectrum_evaluator.h"

namespace hushgain {
namespace {

// The closed-loop bandwidth search stops at this multiple of the GBW: no
// single-op-amp stage has gain there.
constexpr double kBandwidthSearchPerGbw = 100.0;
// Below this magnitude a non-positive DC loop gain is taken as rounding
// noise around zero rather than as positive feedback.
constexpr double kLoopGainSignFloor = 1e-6;
// A noise gain that rises less than this above its DC value is "flat" (the
// 0.01 dB the report also uses for peaking).
constexpr double kFlatNoiseGainDb = 0.01;

// Fails when `value` is not finite; names the quantity.
Status CheckFinite(double value, const std::string& what) {
  if (std::isfinite(value)) return Status::Ok();
  return Status::Fail(what + " is not finite");
}

// The excitations the budget reads besides the noise sources.
struct Ports {
  Port signal, e_n, i_plus, i_minus;
  struct Junction {
    std::string name;
    Port port;
    double amperes = 0;
    bool is_signal = false;
  };
  std::vector<Junction> junctions;
};

Ports CompilePorts(const Netlist& net, const SpectrumEvaluator& ev) {
  Ports p;
  p.signal = ev.Compile(net.signal);
  p.e_n = ev.Compile(Excitation{OpAmpInputVoltage{0}});
  p.i_plus =
      ev.Compile(Excitation{CurrentInjection{net.opamps[0].plus, kGround}});
  p.i_minus =
      ev.Compile(Excitation{CurrentInjection{net.opamps[0].minus, kGround}});
  for (const JunctionCurrent& j : net.junction_currents)
    p.junctions.push_back({j.name,
                           ev.Compile(Excitation{CurrentInjection{j.b, j.a}}),
                           j.amperes, j.is_signal});
  return p;
}

// DC: signal gain, noise gain and the offset block, with the finite A0.
Status DcFigures(const Stage& stage, const Netlist& net, const Ports& p,
                 SpectrumEvaluator& ev, Budget& b) {
  Status s = ev.SolveAt(0.0);
  if (!s.ok) return s;
  b.signal_gain_dc = ev.Transfer(p.signal).real();
  b.noise_gain_dc = std::abs(ev.Transfer(p.e_n));
  // A dark current is an error of the output; the photocurrent is the
  // signal's DC level. Both are DC outputs for the headroom.
  double dark_v = 0;
  for (const Ports::Junction& j : p.junctions) {
    const double volts = j.amperes * ev.Transfer(j.port).real();
    if (!j.is_signal) dark_v += volts;
    b.dc_outputs.push_back({j.name, volts});
  }
  if (stage.dc_input != 0)
    b.dc_outputs.push_back({"dc_input", stage.dc_input * b.signal_gain_dc});
  b.offset =
      SumOffsets(stage.opamp, b.noise_gain_dc, ev.Transfer(p.i_plus).real(),
                 ev.Transfer(p.i_minus).real(), dark_v);
  b.offset.balance_resistor_ohm = BalanceResistorOhm(stage);
  for (const Resistor& r : net.resistors)
    if (r.name == "R_plus") b.offset.plus_resistor_ohm = r.ohms;
  return Status::Ok();
}

// Gains and every contributor's densities at the reference frequency.
Status ReferenceFigures(const Stage& /*stage*/, const Ports& p,
                        SpectrumEvaluator& ev, Budget& b) {
  const int n = ev.source_count();
  std::vector<double> psd(n);
  Status s = ev.Densities(b.reference_hz, psd.data());
  if (!s.ok) return s;
  const std::complex<double> gain_ref = ev.Transfer(p.signal);
  b.signal_gain_ref = std::abs(gain_ref);
  b.signal_gain_phase_ref_deg = std::arg(gain_ref) * 180.0 / kPi;
  b.noise_gain_ref = std::abs(ev.Transfer(p.e_n));
  b.contributors.resize(n);
  double total_density_sq = 0;
  for (int k = 0; k < n; ++k) {
    const NoiseSource& source = ev.sources()[k];
    Contributor& c = b.contributors[k];
    c.name = source.name;
    c.kind = source.kind;
    c.output_density_ref_v_per_rthz = std::sqrt(psd[k]);
    c.gain_to_output_ref = std::abs(ev.SourceTransfer(k));
    double source_psd = source.PsdAt(b.reference_hz);
    // A resistor's thermal and excess noise are reported as voltage
    // densities in series with it (4kTR; e_ex).
    if (source.resistor_ohm > 0) {
      const double ohms = source.resistor_ohm;
      source_psd *= ohms * ohms;
      c.gain_to_output_ref /= ohms;
    }
    c.source_density_ref = std::sqrt(source_psd);
    total_density_sq += psd[k];
  }
  b.output_density_ref_v_per_rthz = std::sqrt(total_density_sq);
  b.input_density_ref_per_rthz =
      b.output_density_ref_v_per_rthz / b.signal_gain_ref;
  return Status::Ok();
}

// The band integral of every contributor at once.
Status BandNoise(const Stage& stage, const BudgetOptions& options,
                 const Ports& p, SpectrumEvaluator& ev, Budget& b,
                 std::vector<LogInterval>* partition) {
  const int n = ev.source_count();
  // A tabulated op-amp density has a kink at each of its points.
  IntegrationOptions integration = options.integration;
  for (const NoiseTable* table :
       {&stage.opamp.voltage_noise_table, &stage.opamp.current_noise_table})
    for (double f : table->Breakpoints(stage.band_low_hz, stage.band_high_hz))
      integration.breakpoints_hz.push_back(f);
  // Component n is the input-referred density S_out(f) / |G(f)|^2, scaled
  // by |G(f_ref)|^2 so that it weighs like the output power in the
  // integrator's error control (equal to it for a flat gain).
  const double g_ref = b.signal_gain_ref;
  IntegrationResult integral = IntegrateBand(
      stage.band_low_hz, stage.band_high_hz, n + 1,
      [&](double f, double* out) {
        Status st = ev.Densities(f, out);
        if (!st.ok) return st;
        double total = 0;
        for (int k = 0; k < n; ++k) total += out[k];
        const double g = std::abs(ev.Transfer(p.signal)) / g_ref;
        out[n] = total / (g * g);
        return st;
      },
      integration);
  if (!integral.status.ok) return integral.status;
  double total_power = 0;
  for (int k = 0; k < n; ++k) {
    Status s = CheckFinite(integral.integrals[k],
                           "the output noise of " + b.contributors[k].name);
    if (!s.ok) return s;
    total_power += integral.integrals[k];
  }
  for (int k = 0; k < n; ++k) {
    b.contributors[k].output_rms_v = std::sqrt(integral.integrals[k]);
    b.contributors[k].share =
        total_power > 0 ? integral.integrals[k] / total_power : 0;
  }
  std::stable_sort(b.contributors.begin(), b.contributors.end(),
                   [](const Contributor& l, const Contributor& r) {
                     return l.share > r.share;
                   });
  b.excess_advice = AdviseExcess(b.contributors, std::sqrt(total_power), stage,
                                 options.upgrade_candidates);
  *partition = integral.partition;
  b.output_rms_v = std::sqrt(total_power);
  b.output_peak_to_peak_v = kPeakToPeakPerRms * b.output_rms_v;
  Status finite = CheckFinite(integral.integrals[n],
                              "the input-referred noise (the signal gain "
                              "vanishes inside the band)");
  if (!finite.ok) return finite;
  b.input_rms = std::sqrt(integral.integrals[n]) / g_ref;
  b.input_rms_at_reference_gain = b.output_rms_v / g_ref;
  b.integration_evaluations = integral.evaluations;
  const double summed = total_power + integral.integrals[n];
  b.integration_relative_error =
      summed > 0 ? integral.error_estimate / summed : 0;
  if (!integral.converged)
    b.warnings.push_back(Printf(
        "noise integration stopped at an estimated relative error of "
        "%.2g (asked %.2g)",
        b.integration_relative_error, options.integration.relative_tolerance));
  return Status::Ok();
}

// The closed-loop response and the e_n noise gain across frequency.
Status ResponseFigures(const Stage& stage, const Ports& p,
                       SpectrumEvaluator& ev, Budget& b) {
  const double f_max = kBandwidthSearchPerGbw * stage.opamp.gbw_hz;
  // Measured against the passband (the DC gain, or for a stage that blocks
  // DC its largest in-band gain), so the band and the reference move none
  // of these figures.
  const double f_lo =
      1e-3 * std::min(stage.band_low_hz,
                      stage.opamp.gbw_hz / stage.opamp.open_loop_gain);
  // One adjoint solve gives every transfer to the output: the scan of the
  // signal's response also samples the e_n noise gain, whose maximum is
  // then refined from those samples.
  std::vector<std::pair<double, double>> noise_gain_samples;
  PassbandResponse response = SummarizePassband(
      [&](double f, std::complex<double>* h) {
        Status st = ev.SolveAt(f);
        *h = ev.Transfer(p.signal);
        if (st.ok && f >= f_lo && f <= f_max)
          noise_gain_samples.push_back({f, std::abs(ev.Transfer(p.e_n))});
        return st;
      },
      stage.band_low_hz, stage.band_high_hz, f_lo, f_max, 10);
  if (!response.status.ok) return response.status;
  b.blocks_dc = response.blocks_dc;
  b.passband_gain = response.passband_gain;
  b.bandwidth_3db_hz =
      response.high_corner_found ? response.high_corner_hz : 0.0;
  b.bandwidth_low_hz = response.low_corner_found ? response.low_corner_hz : 0;
  b.peaking_db = response.peaking_db;
  b.peak_hz = response.peak_hz;
  // The e_n noise gain's true maximum over frequency, from three decades
  // below the band to the search limit; "flat" when it never rises above
  // its DC value by more than kFlatNoiseGainDb. The samples serve when the
  // scan started at f_lo itself (the response passed there); otherwise the
  // noise gain gets its own scan.
  const GainFunction noise_gain = [&](double f, std::complex<double>* h) {
    Status st = ev.SolveAt(f);
    *h = ev.Transfer(p.e_n);
    return st;
  };
  std::sort(noise_gain_samples.begin(), noise_gain_samples.end());
  ResponseMaximum ng;
  if (!noise_gain_samples.empty() && noise_gain_samples.front().first == f_lo) {
    std::vector<double> f_hz, magnitude;
    for (const auto& [f, m] : noise_gain_samples) {
      if (!f_hz.empty() && f == f_hz.back()) continue;
      f_hz.push_back(f);
      magnitude.push_back(m);
    }
    ng = LargestSampledMagnitude(noise_gain, f_hz, magnitude);
  } else {
    ng = LargestMagnitude(noise_gain, f_lo, f_max, 10);
  }
  if (!ng.status.ok) return ng.status;
  b.noise_gain_flat =
      ng.at_low_end ||
      ng.magnitude <= b.noise_gain_dc * std::pow(10.0, kFlatNoiseGainDb / 20);
  b.noise_gain_peak = b.noise_gain_flat ? b.noise_gain_dc : ng.magnitude;
  b.noise_gain_peak_hz = b.noise_gain_flat ? 0 : ng.f_hz;
  if (b.bandwidth_3db_hz > 0 && b.bandwidth_3db_hz < b.band_high_hz)
    b.warnings.push_back(
        "the closed-loop -3 dB bandwidth (" + HzText(b.bandwidth_3db_hz) +
        ") is below the band's upper edge (" + HzText(b.band_high_hz) + ")");
  if (b.bandwidth_low_hz > b.band_low_hz)
    b.warnings.push_back("the low -3 dB corner (" + HzText(b.bandwidth_low_hz) +
                         ") is above the band's lower edge (" +
                         HzText(b.band_low_hz) + ")");
  return Status::Ok();
}

// The loop of the actual network: phase margin and crossover.
Status LoopFigures(const Stage& stage, const MnaSystem& system, Budget& b) {
  LoopGainSolver solver(system, 0, stage.opamp);
  const double start =
      1e-3 * std::min(stage.band_low_hz,
                      stage.opamp.gbw_hz / stage.opamp.open_loop_gain);
  LoopSummary loop = SummarizeLoop(solver, start, 1e3 * stage.opamp.gbw_hz);
  if (!loop.status.ok) return loop.status;
  b.loop = {loop.crossover_found, loop.crossover_hz, loop.phase_margin_deg,
            loop.dc_loop_gain};
  // A loop gain far below 1 that is zero or negative is rounding, not
  // positive feedback: a feedback network attenuating by more than the
  // double range (1e-100 ohm beside 1e100 ohm) leaves T(0) ~ 1e-400, whose
  // computed value is noise of either sign. Say so instead.
  if (!(loop.dc_loop_gain > 0) &&
      !(std::fabs(loop.dc_loop_gain) >= kLoopGainSignFloor))
    return Status::Fail(Printf(
        "no usable feedback: the DC loop gain is below %.0e and its sign "
        "is lost in rounding (the feedback network attenuates far more "
        "than the op-amp gains)",
        kLoopGainSignFloor));
  if (!(loop.dc_loop_gain > 0))
    return Status::Fail("the feedback is positive at DC (loop gain " +
                        Printf("%.4g", loop.dc_loop_gain) + ")");
  if (loop.dc_loop_gain < 1)
    b.warnings.push_back(Printf(
        "the DC loop gain is %.3g, below 1: the stage runs open loop and "
        "its gain is set by the op-amp's A0, not by its resistors",
        loop.dc_loop_gain));
  if (!loop.crossover_found) return Status::Ok();
  if (loop.phase_margin_deg <= 0)
    return Status::Fail(Printf("the loop is unstable: phase margin %.1f deg at "
                               "the %.4g Hz crossover",
                               loop.phase_margin_deg, loop.crossover_hz) +
                        "; add or raise the feedback capacitor");
  if (loop.phase_margin_deg < kSeverePhaseMarginDeg)
    b.warnings.push_back(Printf(
        "severe: phase margin %.1f deg (below 20 deg) at %.4g Hz: the stage "
        "is close to oscillation and its noise peaks",
        loop.phase_margin_deg, loop.crossover_hz));
  else if (loop.phase_margin_deg < kLowPhaseMarginDeg)
    b.warnings.push_back(
        Printf("low phase margin %.1f deg (below 45 deg) at %.4g Hz",
               loop.phase_margin_deg, loop.crossover_hz));
  return Status::Ok();
}

// The op-amp's output current with the output at full scale: the DC
// solution for the signal, scaled to the full-scale output, read at the
// controlled source's current (load plus feedback network, exact for the
// stage as built).
Status OutputDrive(const Stage& stage, const MnaSystem& system, const Ports& p,
                   Budget& b) {
  b.output_current_limit_a = stage.opamp.output_current_limit_a;
  if (!stage.full_scale_output_v || b.signal_gain_dc == 0) return Status::Ok();
  ComplexVector x;
  Status s = DirectSolve(system, 0.0, p.signal, &x);
  if (!s.ok) return s;
  const double fs = *stage.full_scale_output_v;
  const double amperes =
      std::abs(x[system.OpAmpRow(0)].real()) * fs / std::fabs(b.signal_gain_dc);
  b.full_scale_output_current_a = amperes;
  if (amperes > stage.opamp.output_current_limit_a) {
    b.problems.push_back(StageProblem::kOutputCurrent);
    b.warnings.push_back(
        Printf("at the full-scale %.4g V the op-amp must source %.3g mA", fs,
               amperes * 1e3) +
        Printf(", beyond its %.3g mA output limit: raise the load or feedback "
               "resistance",
               stage.opamp.output_current_limit_a * 1e3));
  }
  return Status::Ok();
}

// The DC output against the full-scale swing and the supply
// (budget/headroom.h).
void Headroom(const Stage& stage, Budget& b) {
  HeadroomInputs in;
  in.offset_v = b.offset.worst_case_v;
  double dc_sum = 0;
  for (const DcOutputTerm& t : b.dc_outputs) dc_sum += t.volts;
  in.dc_total_v = std::fabs(b.offset.vos_v) + std::fabs(b.offset.ib_v) +
                  std::fabs(b.offset.ios_v) + std::fabs(dc_sum);
  in.dc_outputs = b.dc_outputs;
  in.full_scale_v = stage.full_scale_output_v;
  in.supply_span_v = stage.opamp.supply_v;
  HeadroomCheck check = CheckHeadroom(in);
  for (std::string& w : check.warnings) b.warnings.push_back(std::move(w));
  for (StageProblem p : check.problems) b.problems.push_back(p);
}

// The signal gain of the same network with an ideal op-amp (A0 1e12, its
// pole at 1 GHz, no output resistance): what the resistors and capacitors
// ask for. Where the real gain at the band's edges or the reference falls
// more than 3 dB below it, the op-amp cannot deliver the stage.
Status GainCollapse(const Stage& stage, const Ports& p, SpectrumEvaluator& ev,
                    Budget& b) {
  Stage ideal = stage;
  ideal.opamp.open_loop_gain = 1e12;
  ideal.opamp.gbw_hz = 1e21;
  ideal.opamp.output_resistance_ohm = 0;
  const Netlist net = ExpandStage(ideal);
  MnaSystem system;
  Status s = MnaSystem::Build(net, &system);
  if (!s.ok) return s;
  AdjointSolver solver(system);
  const Port signal = system.Compile(net.signal);
  double worst_ratio = 1, worst_hz = 0, worst_real = 0, worst_ideal = 0;
  for (double f : {b.band_low_hz, b.reference_hz, b.band_high_hz}) {
    s = solver.SolveAt(f);
    if (!s.ok) return s;
    const double g_ideal = std::abs(solver.Transfer(signal));
    s = ev.SolveAt(f);
    if (!s.ok) return s;
    const double g = std::abs(ev.Transfer(p.signal));
    if (g_ideal > 0 && g / g_ideal < worst_ratio) {
      worst_ratio = g / g_ideal;
      worst_hz = f;
      worst_real = g;
      worst_ideal = g_ideal;
    }
  }
  if (worst_ratio < 1 / std::sqrt(2.0)) {
    b.problems.push_back(StageProblem::kGainCollapsed);
    b.warnings.push_back(
        Printf("the signal gain has collapsed %.1f dB below the ideal "
               "network's",
               -20 * std::log10(worst_ratio)) +
        " at " + HzText(worst_hz) +
        Printf(" (%.4g against %.4g)", worst_real, worst_ideal) +
        ": the op-amp's gain (GBW, A0, output resistance) cannot deliver the "
        "stage in its band");
  }
  return Status::Ok();
}

void PhotodiodeFigures(const Stage& stage, Budget& b) {
  PhotodiodeBlock pd;
  pd.responsivity_a_per_w = stage.photodiode.responsivity_a_per_w;
  if (pd.responsivity_a_per_w > 0) {
    pd.nep_w_per_rthz = b.input_density_ref_per_rthz / pd.responsivity_a_per_w;
    pd.nep_rms_w = b.input_rms / pd.responsivity_a_per_w;
  }
  pd.input_capacitance_f = InputCapacitanceF(stage);
  if (stage.feedback.capacitor_f > 0)
    pd.noise_gain_plateau_estimate =
        1 + pd.input_capacitance_f / stage.feedback.capacitor_f;
  const Photodiode& diode = stage.photodiode;
  pd.photocurrent_a = diode.photocurrent_a;
  pd.reverse_bias_v = diode.reverse_bias_v;
  pd.dark_current_a = DarkCurrentFlows(diode) ? diode.dark_current_a : 0;
  pd.shunt_resistance_ohm = diode.shunt_resistance_ohm;
  if (stage.feedback.kind == Feedback::Kind::kTee)
    pd.tee_noise_equivalent_ohm = TeeNoiseEquivalentOhm(stage.feedback.tee);
  if (!DarkCurrentFlows(diode) && diode.dark_current_a > 0)
    b.warnings.push_back(
        "the photodiode's dark current is not counted: at zero bias "
        "(photovoltaic) it does not flow; give \"reverse_bias\" to count it "
        "with its shot noise");
  b.photodiode = pd;
}

// The charge figures of a capacitive sensor (budget.h, ChargeBlock).
void ChargeFigures(const Stage& stage, Budget& b) {
  const CapacitiveSensor& sensor = *stage.capacitive;
  ChargeBlock c;
  const double cs = sensor.capacitance_f;
  c.sensor_capacitance_f = cs;
  c.leakage_resistance_ohm = sensor.leakage_resistance_ohm;
  c.input_resistor_ohm = stage.input_resistor_ohm;
  c.charge_gain_v_per_c = b.passband_gain / cs;
  c.input_rms_c = b.input_rms * cs;
  c.input_density_ref_c_per_rthz = b.input_density_ref_per_rthz * cs;
  c.feedback_dc_ohm = FeedbackEquivalentOhm(stage.feedback);
  c.feedback_is_tee = stage.feedback.kind == Feedback::Kind::kTee;
  const double cf = stage.feedback.capacitor_f;
  if (cf > 0) c.low_corner_estimate_hz = 1 / (2 * kPi * c.feedback_dc_ohm * cf);
  if (!(stage.input_resistor_ohm > 0)) {
    c.input_capacitance_f = InputCapacitanceF(stage);
    if (cf > 0) c.noise_gain_plateau_estimate = 1 + c.input_capacitance_f / cf;
    if (!(cf > 0))
      b.warnings.push_back(
          "no feedback capacitor: the sensor's capacitance drives the - input "
          "straight into the feedback resistance, so the stage differentiates "
          "its charge (gain rising with frequency) instead of measuring it; "
          "a charge amplifier needs C_f");
  }
  b.charge = c;
}

// The closed-form corners of the stage's coupling capacitors.
void AcCouplingFigures(const Stage& stage, Budget& b) {
  AcCouplingBlock a;
  if (stage.feedback.kind == Feedback::Kind::kTee &&
      stage.feedback.tee.c3_f > 0) {
    const TeeNetwork& t = stage.feedback.tee;
    a.c3_f = t.c3_f;
    a.shunt_corner_hz = 1 / (2 * kPi * t.r3_ohm * t.c3_f);
    a.feedback_dc_ohm = FeedbackDcTransresistanceOhm(stage.feedback);
  }
  if (stage.input_capacitor_f > 0) {
    a.input_capacitor_f = stage.input_capacitor_f;
    if (!stage.capacitive)
      a.input_corner_hz =
          1 /
          (2 * kPi * (stage.source.resistance_ohm + stage.input_resistor_ohm) *
           stage.input_capacitor_f);
  }
  if (a.c3_f > 0 || a.input_capacitor_f > 0) b.ac_coupling = a;
}

}  // namespace

BudgetOutcome ComputeBudgetAsGiven(const Stage& requested,
                                   const BudgetOptions& options) {
  BudgetOutcome outcome;
  Budget& b = outcome.budget;
  Stage stage = requested;
  if (stage.capacitor_target) {
    CapacitorOutcome cap =
        ChooseFeedbackCapacitor(stage, *stage.capacitor_target);
    if (!cap.status.ok) return {cap.status, b, {}, {}};
    b.capacitor_choice = cap.choice;
    stage.feedback.capacitor_f = cap.choice.chosen_f;
    stage.capacitor_target.reset();
  }
  b.stage_name = stage.name;
  b.opamp_class = stage.opamp.class_name;
  b.opamp_gbw_hz = stage.opamp.gbw_hz;
  b.opamp_open_loop_gain = stage.opamp.open_loop_gain;
  b.temperature_k = stage.temperature_k;
  b.band_low_hz = stage.band_low_hz;
  b.band_high_hz = stage.band_high_hz;
  b.reference_hz = ReferenceFrequencyHz(stage);
  b.full_scale_output_v = stage.full_scale_output_v;
  b.feedback_capacitor_f = stage.feedback.capacitor_f;
  b.input_unit = stage.topology == Topology::kTransimpedance ? "A" : "V";

  Netlist netlist;
  SpectrumEvaluator evaluator;
  Status s =
      PrepareStageEvaluator(stage, &netlist, &evaluator, &b.resistor_drops);
  if (!s.ok) return {s, b, {}, {}};
  const Ports ports = CompilePorts(netlist, evaluator);

  const bool full = !options.noise_and_offset_only;
  if (full) s = LoopFigures(stage, evaluator.system(), b);
  if (s.ok) s = DcFigures(stage, netlist, ports, evaluator, b);
  if (s.ok) s = ReferenceFigures(stage, ports, evaluator, b);
  if (s.ok)
    s = BandNoise(stage, options, ports, evaluator, b,
                  &outcome.noise_partition);
  if (s.ok && full) s = ResponseFigures(stage, ports, evaluator, b);
  if (s.ok && full) s = OutputDrive(stage, evaluator.system(), ports, b);
  if (s.ok && full) s = GainCollapse(stage, ports, evaluator, b);
  if (s.ok && full)
    s = TeePiFigures(stage, netlist, evaluator.system(), ports.signal, &b);
  if (!s.ok) return {s, b, {}, {}};
  Headroom(stage, b);

  if (stage.full_scale_output_v && b.output_rms_v > 0) {
    const double fs = *stage.full_scale_output_v;
    b.snr_db = 20.0 * std::log10(fs / std::sqrt(2.0) / b.output_rms_v);
    b.dynamic_range_db = 20.0 * std::log10(2.0 * fs / b.output_peak_to_peak_v);
  }
  if (stage.topology == Topology::kTransimpedance) PhotodiodeFigures(stage, b);
  if (stage.capacitive) ChargeFigures(stage, b);
  AcCouplingFigures(stage, b);
  if (stage.sensitivity) {
    MeasurandBlock m;
    m.unit = stage.sensitivity->per;
    m.sensitivity = stage.sensitivity->value;
    m.sensitivity_unit = b.input_unit;
    double rms = b.input_rms, density = b.input_density_ref_per_rthz;
    if (stage.sensitivity->in_charge && b.charge) {
      m.sensitivity_unit = "C";
      rms = b.charge->input_rms_c;
      density = b.charge->input_density_ref_c_per_rthz;
    }
    m.input_referred_rms = rms / m.sensitivity;
    m.input_referred_density_at_reference = density / m.sensitivity;
    b.measurand = m;
  }

  for (double v :
       {b.signal_gain_ref, b.noise_gain_ref, b.output_rms_v, b.input_rms,
        b.offset.worst_case_v, b.input_density_ref_per_rthz}) {
    s = CheckFinite(v, "a budget figure at " + HzText(b.reference_hz));
    if (!s.ok) return {s, b, {}, {}};
  }

  outcome.stage_used = stage;
  outcome.status = Status::Ok();
  return outcome;
}

BudgetOutcome ComputeBudget(const Stage& requested,
                            const BudgetOptions& options) {
  return ComputeBudgetAsGiven(
      StageAtTemperature(requested, requested.temperature_k), options);
}

}  // namespace hushgain
