#include "design/tia_suggest.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "budget/compute_budget.h"
#include "budget/feedback_capacitor.h"
#include "circuit/transimpedance_topology.h"
#include "design/tia_snr.h"

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

// The DC output of the photocurrent and dark current, and with the
// worst-case offset the headroom it takes.
void Headroom(const Budget& x, double limit_v, TiaCandidate* row) {
  row->dc_output_v = 0;
  for (const DcOutputTerm& t : x.dc_outputs) row->dc_output_v += t.volts;
  row->headroom_used_v = std::fabs(row->dc_output_v) + x.offset.worst_case_v;
  row->fits_headroom = row->headroom_used_v <= limit_v;
}

// Whether `rf` fits the headroom (C_f plays no part at DC).
Status FitsHeadroom(const Stage& stage, double rf, double limit_v, bool* fits) {
  BudgetOptions options = QuickOptions();
  options.noise_and_offset_only = true;
  BudgetOutcome b = ComputeBudget(WithFeedback(stage, rf, 0), options);
  if (!b.status.ok) return b.status;
  TiaCandidate row;
  Headroom(b.budget, limit_v, &row);
  *fits = row.fits_headroom;
  return Status::Ok();
}

// The part of `series` for a C_f of `cf` (the target's) with `cf_flat`
// the Butterworth C_f: the largest part with parasitic + part <= cf and >=
// cf_flat, else the smallest part above cf - parasitic; 0 when the
// parasitic alone reaches cf.
double SeriesPart(PreferredSeries series, double parasitic_f, double cf,
                  double cf_flat) {
  const double needed = cf - parasitic_f;
  if (needed <= 0) return 0;
  const std::vector<double> parts =
      SeriesValuesInRange(series, needed / 100, needed * 100);
  double best = 0;
  for (double part : parts)
    if (part <= needed * (1 + 1e-9) && parasitic_f + part >= cf_flat)
      best = part;
  if (best > 0) return best;
  for (double part : parts)
    if (part >= needed) return part;
  return parts.empty() ? needed : parts.back();
}

Status FillRow(const Stage& stage, double rf, double cf, double flat_hz,
               bool meets, double limit_v, TiaCandidate* row) {
  BudgetOutcome b = ComputeBudget(WithFeedback(stage, rf, cf), QuickOptions());
  if (!b.status.ok) return b.status;
  const Budget& x = b.budget;
  Headroom(x, limit_v, row);
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
  if (!(parasitic_capacitance_f >= 0 && std::isfinite(parasitic_capacitance_f)))
    return Printf(
        "parasitic_capacitance_f: expected a non-negative capacitance, got %g",
        parasitic_capacitance_f);
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

  // The headroom: the largest index that fits, by the same bisection.
  const HeadroomLimit limit = OutputHeadroomLimit(stage);
  out.headroom_limit_v = limit.volts;
  out.headroom_limit_name = limit.name;
  out.background_current_a =
      stage.photodiode.photocurrent_a + (DarkCurrentFlows(stage.photodiode)
                                             ? stage.photodiode.dark_current_a
                                             : 0);
  bool fits = false;
  out.status = FitsHeadroom(stage, rf[0], limit.volts, &fits);
  if (!out.status.ok) return out;
  if (!fits) {
    out.status = Status::Fail(
        "even the smallest candidate R_f (" + Printf("%.4g ohm", rf[0]) +
        ") puts the output's DC level and offset beyond the " + limit.name +
        " (" + Printf("%.4g V", limit.volts) +
        "): less background light or a larger swing is needed");
    return out;
  }
  int fit_lo = 0, fit_hi = static_cast<int>(rf.size());
  while (fit_hi - fit_lo > 1) {
    const int mid = (fit_lo + fit_hi) / 2;
    out.status = FitsHeadroom(stage, rf[mid], limit.volts, &fits);
    if (!out.status.ok) return out;
    (fits ? fit_lo : fit_hi) = mid;
  }
  if (fit_lo < lo) {
    out.limited_by = TiaLimit::kHeadroom;
    lo = fit_lo;
    hi = fit_lo + 1;
  }

  // A C_f of the series, the parasitic counted in; the row's figures are
  // those of the C_f as built.
  auto built = [&](double cf, double cf_flat, TiaCandidate* row) {
    if (!options.capacitor_series) return cf;
    const double part =
        SeriesPart(*options.capacitor_series, options.parasitic_capacitance_f,
                   cf, cf_flat);
    row->capacitor_part_f = part;
    row->parasitic_alone = part == 0;
    return options.parasitic_capacitance_f + part;
  };

  const int first = std::max(0, lo - options.rows + 1);
  for (int i = first; i <= lo; ++i) {
    double cf_flat = 0, bw_flat = 0, cf = 0;
    out.status = flat(i, &cf_flat, &bw_flat);
    if (out.status.ok)
      out.status = CapacitorForBandwidth(stage, rf[i], cf_flat, f, &cf);
    TiaCandidate row;
    if (out.status.ok) {
      const double total = built(cf, cf_flat, &row);
      out.status =
          FillRow(stage, rf[i], total, bw_flat, true, limit.volts, &row);
      // A C_f as built above the target's (the parasitic alone, or the
      // next part up) may leave the -3 dB point below the target.
      if (total > cf * (1 + 1e-9)) row.meets_target = row.bandwidth_3db_hz >= f;
    }
    if (!out.status.ok) return out;
    out.rows.push_back(row);
  }
  out.best = static_cast<int>(out.rows.size()) - 1;
  if (hi < static_cast<int>(rf.size())) {
    // The next value up, to show what is missed: Butterworth-compensated
    // when the bandwidth binds, at the target's C_f when the headroom does.
    double cf_flat = 0, bw_flat = 0, cf = 0;
    out.status = flat(hi, &cf_flat, &bw_flat);
    const bool reaches = bw_flat >= f;
    cf = cf_flat;
    if (out.status.ok && reaches)
      out.status = CapacitorForBandwidth(stage, rf[hi], cf_flat, f, &cf);
    TiaCandidate row;
    if (out.status.ok)
      out.status = FillRow(stage, rf[hi], built(cf, cf_flat, &row), bw_flat,
                           reaches, limit.volts, &row);
    if (!out.status.ok) return out;
    out.rows.push_back(row);
  }
  return out;
}

}  // namespace hushgain
