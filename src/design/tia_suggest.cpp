#include "design/tia_suggest.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "budget/compute_budget.h"
#include "budget/feedback_capacitor.h"

namespace hushgain {
namespace {

Stage WithFeedback(const Stage& stage, double rf, double cf) {
  Stage s = stage;
  s.feedback.kind = Feedback::Kind::kResistor;
  s.feedback.resistor_ohm = rf;
  s.feedback.capacitor_f = cf;
  s.capacitor_target.reset();
  return s;
}

BudgetOptions QuickOptions() { return BudgetOptions{}; }

// The budget's -3 dB bandwidth, infinite when it lies beyond the budget's
// search (a bandwidth of 0 there means "not found below 100 x GBW": more
// than any target, not less).
double BandwidthOrBeyond(const Budget& b) {
  return b.bandwidth_3db_hz > 0 ? b.bandwidth_3db_hz
                                : std::numeric_limits<double>::infinity();
}

// The Butterworth C_f and the bandwidth it gives at `rf`.
Status Flat(const Stage& stage, double rf, double* cf, double* bandwidth_hz) {
  CapacitorOutcome cap = ChooseFeedbackCapacitor(
      WithFeedback(stage, rf, 0),
      CapacitorTarget{CapacitorTarget::Kind::kButterworth, 0});
  if (!cap.status.ok) return cap.status;
  *cf = cap.choice.chosen_f;
  BudgetOutcome b = ComputeBudget(WithFeedback(stage, rf, *cf), QuickOptions());
  if (!b.status.ok) return b.status;
  *bandwidth_hz = BandwidthOrBeyond(b.budget);
  return Status::Ok();
}

// The C_f >= cf_flat that puts the -3 dB point on the target (the bandwidth
// falls as C_f grows).
Status CapacitorForBandwidth(const Stage& stage, double rf, double cf_flat,
                             double target_hz, double* cf) {
  double lo = std::log(std::max(cf_flat, 1e-18)), hi = std::log(1e-6);
  for (int i = 0; i < 60 && hi - lo > 1e-6; ++i) {
    const double mid = 0.5 * (lo + hi);
    BudgetOutcome b =
        ComputeBudget(WithFeedback(stage, rf, std::exp(mid)), QuickOptions());
    if (!b.status.ok) return b.status;
    (BandwidthOrBeyond(b.budget) >= target_hz ? lo : hi) = mid;
  }
  *cf = std::exp(0.5 * (lo + hi));
  return Status::Ok();
}

Status FillRow(const Stage& stage, double rf, double cf, double flat_hz,
               bool meets, TiaCandidate* row) {
  BudgetOutcome b = ComputeBudget(WithFeedback(stage, rf, cf), QuickOptions());
  if (!b.status.ok) return b.status;
  const Budget& x = b.budget;
  row->rf_ohm = rf;
  row->cf_f = cf;
  row->meets_target = meets;
  row->bandwidth_3db_hz = x.bandwidth_3db_hz;
  row->butterworth_bandwidth_hz = std::isfinite(flat_hz) ? flat_hz : 0;
  row->phase_margin_deg = x.loop.phase_margin_deg;
  row->peaking_db = x.peaking_db;
  row->output_rms_v = x.output_rms_v;
  row->input_rms_a = x.input_rms;
  row->input_density_a_per_rthz = x.input_density_ref_per_rthz;
  row->nep_w_per_rthz = x.photodiode ? x.photodiode->nep_w_per_rthz : 0;
  return Status::Ok();
}

}  // namespace

std::string TiaSuggestOptions::Validate() const {
  if (!(bandwidth_hz > 0 && std::isfinite(bandwidth_hz)))
    return Printf("bandwidth_hz: expected a positive frequency, got %g",
                  bandwidth_hz);
  if (resistors_ohm.empty())
    return "resistors_ohm: expected at least one candidate resistor, got none";
  if (rows < 1 || rows > kMaxTiaRows)
    return "rows: expected 1 to " + std::to_string(kMaxTiaRows) + ", got " +
           std::to_string(rows);
  return {};
}

TiaSuggestion SuggestTransimpedance(const Stage& stage,
                                    const TiaSuggestOptions& options) {
  TiaSuggestion out;
  std::vector<double> rf = options.resistors_ohm;
  std::sort(rf.begin(), rf.end());
  rf.erase(std::unique(rf.begin(), rf.end()), rf.end());
  const double c = InputCapacitanceF(stage);
  const double f = options.bandwidth_hz;
  out.largest_rf_estimate_ohm =
      c > 0 ? stage.opamp.gbw_hz / (2 * kPi * c * f * f) : 0;

  // Bisection for the largest index whose flat bandwidth reaches the target.
  auto flat = [&](int i, double* cf, double* bw) {
    return Flat(stage, rf[i], cf, bw);
  };
  double cf_lo = 0, bw_lo = 0;
  out.status = flat(0, &cf_lo, &bw_lo);
  if (!out.status.ok) return out;
  if (bw_lo < f) {
    char buf[200];
    std::snprintf(
        buf, sizeof buf,
        "even the smallest candidate R_f (%.4g ohm) reaches only %.4g Hz flat, "
        "below the %.4g Hz target: a faster op-amp or a smaller photodiode is "
        "needed",
        rf[0], bw_lo, f);
    out.status = Status::Fail(buf);
    return out;
  }
  int lo = 0, hi = static_cast<int>(
                  rf.size());  // rf[lo] meets; rf[hi] (if any) does not
  while (hi - lo > 1) {
    const int mid = (lo + hi) / 2;
    double cf = 0, bw = 0;
    out.status = flat(mid, &cf, &bw);
    if (!out.status.ok) return out;
    (bw >= f ? lo : hi) = mid;
  }

  const int first = std::max(0, lo - options.rows + 1);
  for (int i = first; i <= lo; ++i) {
    double cf_flat = 0, bw_flat = 0, cf = 0;
    out.status = flat(i, &cf_flat, &bw_flat);
    if (out.status.ok)
      out.status = CapacitorForBandwidth(stage, rf[i], cf_flat, f, &cf);
    TiaCandidate row;
    if (out.status.ok)
      out.status = FillRow(stage, rf[i], cf, bw_flat, true, &row);
    if (!out.status.ok) return out;
    out.rows.push_back(row);
  }
  out.best = static_cast<int>(out.rows.size()) - 1;
  if (hi < static_cast<int>(rf.size())) {
    // The next value up, Butterworth-compensated, to show what is missed.
    double cf_flat = 0, bw_flat = 0;
    out.status = flat(hi, &cf_flat, &bw_flat);
    TiaCandidate row;
    if (out.status.ok)
      out.status = FillRow(stage, rf[hi], cf_flat, bw_flat, false, &row);
    if (!out.status.ok) return out;
    out.rows.push_back(row);
  }
  return out;
}

}  // namespace hushgain
