#include "design/tia_snr.h"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "budget/compute_budget.h"

namespace hushgain {
namespace {

// The NEP's refinement stops at this |SNR - 1|, or after this many budgets.
constexpr double kNepTolerance = 1e-6;
constexpr int kNepIterations = 30;
// The NEP's budgets are integrated tighter than the curve's, so the
// refinement sees SNR to better than its own tolerance.
constexpr double kNepIntegrationTolerance = 1e-9;

// The budget of `stage` with photocurrent I_bg + R P.
struct Evaluated {
  Status status;
  Budget budget;
};
Evaluated Evaluate(const Stage& stage, double signal_a, double tolerance) {
  Stage lit = stage;
  lit.photodiode.photocurrent_a += signal_a;
  BudgetOptions options;
  options.noise_and_offset_only = true;
  options.integration.relative_tolerance = tolerance;
  BudgetOutcome outcome = ComputeBudget(lit, options);
  return {outcome.status, std::move(outcome.budget)};
}

double DcOutputV(const Budget& b) {
  double v = 0;
  for (const DcOutputTerm& t : b.dc_outputs) v += t.volts;
  return v;
}

double ShotShare(const Budget& b) {
  for (const Contributor& c : b.contributors)
    if (c.name == "I_ph") return c.share;
  return 0;
}

}  // namespace

std::string TiaSnrOptions::Validate() const {
  if (!(power_min_w > 0 && std::isfinite(power_min_w)))
    return Printf("power_min_w: expected a positive power, got %g",
                  power_min_w);
  if (!(power_max_w > power_min_w && std::isfinite(power_max_w)))
    return Printf("power_max_w: expected a power above power_min_w (%g W)",
                  power_min_w) +
           Printf(", got %g", power_max_w);
  if (points < 2 || points > kMaxTiaSnrPoints)
    return "points: expected 2 to " + std::to_string(kMaxTiaSnrPoints) +
           ", got " + std::to_string(points);
  return "";
}

HeadroomLimit OutputHeadroomLimit(const Stage& stage) {
  HeadroomLimit limit{0.5 * stage.opamp.supply_v, "half the supply span"};
  if (stage.full_scale_output_v && *stage.full_scale_output_v < limit.volts)
    limit = {*stage.full_scale_output_v, "full-scale swing"};
  return limit;
}

TiaSnrResult ComputeTiaSnr(const Stage& stage, const TiaSnrOptions& options) {
  assert(stage.topology == Topology::kTransimpedance);
  assert(options.Validate().empty());
  TiaSnrResult r;
  const double resp = stage.photodiode.responsivity_a_per_w;
  assert(resp > 0);
  r.responsivity_a_per_w = resp;
  r.background_current_a = stage.photodiode.photocurrent_a;
  r.band_low_hz = stage.band_low_hz;
  r.band_high_hz = stage.band_high_hz;

  // No signal light: the noise floor, the DC level, the transimpedance.
  Evaluated dark = Evaluate(stage, 0, kNepIntegrationTolerance);
  if (!dark.status.ok) {
    r.status = dark.status;
    return r;
  }
  const Budget& b0 = dark.budget;
  // An "auto" C_f does not depend on the light: keep the one chosen.
  Stage fixed = stage;
  fixed.feedback.capacitor_f = b0.feedback_capacitor_f;
  fixed.capacitor_target.reset();
  r.noise_floor_a = b0.input_rms;
  r.offset_worst_case_v = b0.offset.worst_case_v;
  r.dc_transimpedance_ohm = b0.signal_gain_dc;
  const double dc0 = DcOutputV(b0);

  const HeadroomLimit limit = OutputHeadroomLimit(stage);
  r.limit_v = limit.volts;
  r.limit_name = limit.name;
  const double room = r.limit_v - std::fabs(dc0) - r.offset_worst_case_v;
  const double per_watt = resp * std::fabs(r.dc_transimpedance_ohm);
  if (room <= 0) {
    r.saturation_power_w = 0;
    r.warnings.push_back(
        "the stage is saturated without signal light: its DC output (" +
        Printf("%.4g V", dc0) + ") and worst-case offset (" +
        Printf("%.4g V", r.offset_worst_case_v) + ") exceed the " +
        r.limit_name + " (" + Printf("%.4g V", r.limit_v) + ")");
  } else {
    r.saturation_power_w = room / per_watt;
  }

  // The NEP: the closed form first, then full budgets.
  const double qb =
      kElementaryChargeC * (stage.band_high_hz - stage.band_low_hz);
  double power =
      (qb + std::sqrt(qb * qb + r.noise_floor_a * r.noise_floor_a)) / resp;
  double snr = 0;
  double last_power = 0, last_snr = 0;
  for (int k = 0; k < kNepIterations; ++k) {
    Evaluated e = Evaluate(fixed, resp * power, kNepIntegrationTolerance);
    if (!e.status.ok) {
      r.status = e.status;
      return r;
    }
    snr = resp * power / e.budget.input_rms;
    if (std::fabs(snr - 1) < kNepTolerance) break;
    // Secant in log P against log SNR; the slope lies between 1/2 (shot
    // noise dominant) and 1 (a fixed noise floor).
    double slope = 1;
    if (last_power > 0 && last_power != power)
      slope = std::log(snr / last_snr) / std::log(power / last_power);
    slope = std::clamp(slope, 0.25, 1.5);
    last_power = power;
    last_snr = snr;
    power *= std::exp(-std::log(snr) / slope);
  }
  r.nep_w = power;
  if (std::fabs(snr - 1) >= kNepTolerance)
    r.warnings.push_back(Printf(
        "the noise-equivalent power did not converge: SNR %.6g at the last "
        "step",
        snr));

  // The curve.
  const double ratio = options.power_max_w / options.power_min_w;
  for (int i = 0; i < options.points; ++i) {
    const double p =
        options.power_min_w *
        std::pow(ratio, static_cast<double>(i) / (options.points - 1));
    Evaluated e = Evaluate(fixed, resp * p,
                           BudgetOptions{}.integration.relative_tolerance);
    if (!e.status.ok) {
      r.status = e.status;
      return r;
    }
    TiaSnrPoint pt;
    pt.power_w = p;
    pt.signal_current_a = resp * p;
    pt.input_rms_a = e.budget.input_rms;
    pt.output_rms_v = e.budget.output_rms_v;
    pt.snr = pt.signal_current_a / pt.input_rms_a;
    pt.shot_share = ShotShare(e.budget);
    pt.dc_output_v = DcOutputV(e.budget);
    pt.saturated =
        std::fabs(pt.dc_output_v) + e.budget.offset.worst_case_v > r.limit_v;
    r.points.push_back(pt);
  }
  r.status = Status::Ok();
  return r;
}

}  // namespace hushgain
