#include "design/tee_sweep.h"

#include <cassert>
#include <cmath>
#include <cstdio>

#include "circuit/inverting_topology.h"
#include "review/tee_comparison.h"

namespace hushgain {

std::string TeeSweepOptions::Validate() const {
  char buf[128];
  if (!(min_largest_ohm >= 0) || !std::isfinite(min_largest_ohm)) {
    std::snprintf(buf, sizeof buf,
                  "min_largest_ohm: expected a positive resistance, got %g",
                  min_largest_ohm);
    return buf;
  }
  if (points < 2 || points > kMaxTeeSweepPoints)
    return "points: expected 2 to " + std::to_string(kMaxTeeSweepPoints) +
           ", got " + std::to_string(points);
  if (r1_over_r2 && !(*r1_over_r2 > 0 && std::isfinite(*r1_over_r2))) {
    std::snprintf(buf, sizeof buf,
                  "r1_over_r2: expected a positive ratio, got %g", *r1_over_r2);
    return buf;
  }
  return budget.Validate();
}

TeeNetwork TeeForLargest(double req, double largest,
                         std::optional<double> r1_over_r2) {
  assert(largest > 0 && largest < req);
  const double l = largest;
  TeeNetwork t;
  if (!r1_over_r2) {
    if (3 * l <= req) {
      t.r1_ohm = l;
      t.r2_ohm = l;
      t.r3_ohm = l * l / (req - 2 * l);
    } else {
      t.r1_ohm = l;
      t.r3_ohm = l;
      t.r2_ohm = (req - l) / 2;
    }
    return t;
  }
  const double rho = *r1_over_r2;
  t.r1_ohm = rho >= 1 ? l : rho * l;
  t.r2_ohm = rho >= 1 ? l / rho : l;
  const double sum = t.r1_ohm + t.r2_ohm;
  if (sum < req) {
    t.r3_ohm = t.r1_ohm * t.r2_ohm / (req - sum);
    if (t.r3_ohm <= l) return t;
  }
  // R3 = L: (rho / L) R2^2 + (1 + rho) R2 - Req = 0, the positive root in
  // the form that does not cancel.
  const double b = 1 + rho;
  t.r3_ohm = l;
  t.r2_ohm = 2 * req / (b + std::sqrt(b * b + 4 * rho * req / l));
  t.r1_ohm = rho * t.r2_ohm;
  return t;
}

TeeSweepResult SweepTee(const Stage& stage, const TeeSweepOptions& options) {
  assert(stage.feedback.kind == Feedback::Kind::kTee);
  assert(options.Validate().empty());
  TeeSweepResult result;
  const double req = FeedbackEquivalentOhm(stage.feedback);
  result.equivalent_ohm = req;
  const double smallest =
      options.min_largest_ohm > 0 ? options.min_largest_ohm : req / 1000;
  assert(smallest < req);
  const BudgetOptions& budget_options = options.budget;

  const Stage plain_stage = PlainEquivalent(stage);
  BudgetOutcome plain = ComputeBudget(plain_stage, budget_options);
  if (!plain.status.ok) {
    result.status = Status::Fail("the plain stage: " + plain.status.message);
    return result;
  }
  TeeSweepRow end;
  end.largest_ohm = req;
  end.plain = true;
  end.tee = {req, 0, 0};
  end.budget = plain.budget;
  end.noise_cost_ratio = 1;
  result.rows.push_back(end);

  const int last = options.points - 1;
  for (int i = 1; i <= last; ++i) {
    // L_i = Req (smallest / Req)^(i / last); the last one exactly smallest.
    const double l = i == last ? smallest
                               : req * std::pow(smallest / req,
                                                static_cast<double>(i) / last);
    TeeSweepRow row;
    row.largest_ohm = l;
    row.tee = TeeForLargest(req, l, options.r1_over_r2);
    // The stage's C3 (if any) stays in series with each new R3.
    row.tee.c3_f = stage.feedback.tee.c3_f;
    Stage s = stage;
    s.feedback.tee = row.tee;
    BudgetOutcome outcome = ComputeBudget(s, budget_options);
    if (!outcome.status.ok) {
      char buf[96];
      std::snprintf(buf, sizeof buf, "largest resistor %.6g ohm: ", l);
      result.status = Status::Fail(buf + outcome.status.message);
      return result;
    }
    row.budget = std::move(outcome.budget);
    row.noise_cost_ratio = row.budget.output_rms_v / plain.budget.output_rms_v;
    result.rows.push_back(std::move(row));
  }
  result.status = Status::Ok();
  return result;
}

}  // namespace hushgain
