#include "budget/compute_budget.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <cstdio>
#include <vector>

#include "analysis/frequency_response.h"
#include "budget/offset.h"
#include "budget/tee_comparison.h"
#include "circuit/expand_stage.h"
#include "circuit/inverting_topology.h"
#include "noise/physical_constants.h"
#include "noise/spectrum_evaluator.h"

namespace hushgain {
namespace {

// The closed-loop bandwidth search stops at this multiple of the GBW: no
// single-op-amp stage has gain there.
constexpr double kBandwidthSearchPerGbw = 100.0;

std::string Hz(double f_hz) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.6g Hz", f_hz);
  return buf;
}

// Fails when `value` is not finite; names the quantity.
Status CheckFinite(double value, const std::string& what) {
  if (std::isfinite(value)) return Status::Ok();
  return Status::Fail(what + " is not finite");
}

}  // namespace

Stage PlainEquivalent(const Stage& tee_stage) {
  Stage plain = tee_stage;
  plain.feedback.kind = Feedback::Kind::kResistor;
  plain.feedback.resistor_ohm = FeedbackEquivalentOhm(tee_stage.feedback);
  return plain;
}

BudgetOutcome ComputeBudget(const Stage& stage, const BudgetOptions& options) {
  BudgetOutcome outcome;
  Budget& b = outcome.budget;
  b.stage_name = stage.name;
  b.opamp_class = stage.opamp.class_name;
  b.opamp_gbw_hz = stage.opamp.gbw_hz;
  b.opamp_open_loop_gain = stage.opamp.open_loop_gain;
  b.temperature_k = stage.temperature_k;
  b.band_low_hz = stage.band_low_hz;
  b.band_high_hz = stage.band_high_hz;
  b.reference_hz = ReferenceFrequencyHz(stage);
  b.full_scale_output_v = stage.full_scale_output_v;

  const Netlist netlist = ExpandStage(stage);
  SpectrumEvaluator evaluator;
  Status s =
      SpectrumEvaluator::Create(netlist, stage.temperature_k, &evaluator);
  if (!s.ok) return {s, b};
  const int n = evaluator.source_count();
  const Port signal = evaluator.Compile(netlist.signal);
  const Port e_n = evaluator.Compile(Excitation{OpAmpInputVoltage{0}});
  const Port i_plus = evaluator.Compile(
      Excitation{CurrentInjection{netlist.opamps[0].plus, kGround}});
  const Port i_minus = evaluator.Compile(
      Excitation{CurrentInjection{netlist.opamps[0].minus, kGround}});

  // DC: signal gain, noise gain and offsets, with the finite A0.
  s = evaluator.SolveAt(0.0);
  if (!s.ok) return {s, b};
  b.signal_gain_dc = evaluator.Transfer(signal).real();
  b.noise_gain_dc = std::abs(evaluator.Transfer(e_n));
  b.offset = SumOffsets(stage.opamp, b.noise_gain_dc,
                        evaluator.Transfer(i_plus).real(),
                        evaluator.Transfer(i_minus).real());
  b.offset.balance_resistor_ohm = BalanceResistorOhm(stage);
  for (const Resistor& r : netlist.resistors)
    if (r.name == "R_plus") b.offset.plus_resistor_ohm = r.ohms;

  // The reference frequency: gains and densities.
  std::vector<double> psd(n);
  s = evaluator.Densities(b.reference_hz, psd.data());
  if (!s.ok) return {s, b};
  const std::complex<double> gain_ref = evaluator.Transfer(signal);
  b.signal_gain_ref = std::abs(gain_ref);
  b.signal_gain_phase_ref_deg = std::arg(gain_ref) * 180.0 / kPi;
  b.noise_gain_ref = std::abs(evaluator.Transfer(e_n));
  b.contributors.resize(n);
  double total_density_sq = 0;
  for (int k = 0; k < n; ++k) {
    const NoiseSource& source = evaluator.sources()[k];
    Contributor& c = b.contributors[k];
    c.name = source.name;
    c.kind = NoiseKindName(source.kind);
    c.output_density_ref_v_per_rthz = std::sqrt(psd[k]);
    c.gain_to_output_ref = std::abs(evaluator.SourceTransfer(k));
    double source_psd = source.PsdAt(b.reference_hz);
    // A resistor's thermal noise is reported as its voltage density 4kTR.
    if (source.kind == NoiseKind::kThermal) {
      const double ohms =
          4.0 * kBoltzmannJPerK * stage.temperature_k / source.white_psd;
      source_psd *= ohms * ohms;
      c.gain_to_output_ref /= ohms;
    }
    c.source_density_ref = std::sqrt(source_psd);
    total_density_sq += psd[k];
  }
  b.output_density_ref_v_per_rthz = std::sqrt(total_density_sq);
  b.input_density_ref_per_rthz =
      b.output_density_ref_v_per_rthz / b.signal_gain_ref;

  // The band integral of every contributor at once.
  IntegrationResult integral = IntegrateBand(
      stage.band_low_hz, stage.band_high_hz, n,
      [&evaluator](double f, double* out) {
        return evaluator.Densities(f, out);
      },
      options.integration);
  if (!integral.status.ok) return {integral.status, b};
  double total_power = 0;
  for (int k = 0; k < n; ++k) {
    s = CheckFinite(integral.integrals[k],
                    "the output noise of " + b.contributors[k].name);
    if (!s.ok) return {s, b};
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
  b.output_rms_v = std::sqrt(total_power);
  b.output_peak_to_peak_v = kPeakToPeakPerRms * b.output_rms_v;
  b.input_rms = b.output_rms_v / b.signal_gain_ref;
  b.integration_evaluations = integral.evaluations;
  b.integration_relative_error =
      total_power > 0 ? integral.error_estimate / total_power : 0;
  if (!integral.converged) {
    char buf[160];
    std::snprintf(buf, sizeof buf,
                  "noise integration stopped at an estimated relative error of "
                  "%.2g (asked %.2g)",
                  b.integration_relative_error,
                  options.integration.relative_tolerance);
    b.warnings.push_back(buf);
  }

  // The closed-loop response.
  ResponseSummary response = SummarizeResponse(
      [&](double f, std::complex<double>* h) {
        Status st = evaluator.SolveAt(f);
        *h = evaluator.Transfer(signal);
        return st;
      },
      b.reference_hz, kBandwidthSearchPerGbw * stage.opamp.gbw_hz);
  if (!response.status.ok) return {response.status, b};
  b.bandwidth_3db_hz = response.bandwidth_3db_hz;
  b.peaking_db = response.peaking_db;
  if (b.bandwidth_3db_hz > 0 && b.bandwidth_3db_hz < b.band_high_hz)
    b.warnings.push_back(
        "the closed-loop -3 dB bandwidth (" + Hz(b.bandwidth_3db_hz) +
        ") is below the band's upper edge (" + Hz(b.band_high_hz) + ")");

  if (stage.full_scale_output_v && b.output_rms_v > 0) {
    const double fs = *stage.full_scale_output_v;
    b.snr_db = 20.0 * std::log10(fs / std::sqrt(2.0) / b.output_rms_v);
    b.dynamic_range_db = 20.0 * std::log10(2.0 * fs / b.output_peak_to_peak_v);
  }

  for (double v :
       {b.signal_gain_ref, b.noise_gain_ref, b.output_rms_v, b.input_rms,
        b.offset.worst_case_v, b.input_density_ref_per_rthz}) {
    s = CheckFinite(v, "a budget figure at " + Hz(b.reference_hz));
    if (!s.ok) return {s, b};
  }

  if (options.compare_tee && stage.feedback.kind == Feedback::Kind::kTee) {
    BudgetOptions plain_options = options;
    plain_options.compare_tee = false;
    BudgetOutcome plain = ComputeBudget(PlainEquivalent(stage), plain_options);
    if (!plain.status.ok) return {plain.status, b};
    b.tee = CompareTee(b, plain.budget, FeedbackEquivalentOhm(stage.feedback));
  }
  outcome.status = Status::Ok();
  return outcome;
}

}  // namespace hushgain
