#include "review/tee_comparison.h"

#include <cmath>

#include "circuit/feedback_network.h"

namespace hushgain {

Stage PlainEquivalent(const Stage& tee_stage) {
  Stage plain = tee_stage;
  plain.feedback.kind = Feedback::Kind::kResistor;
  plain.feedback.resistor_ohm = FeedbackEquivalentOhm(tee_stage.feedback);
  return plain;
}
namespace {

// Below this relative difference a contributor counts as unchanged.
constexpr double kSameRelative = 1e-3;

const Contributor* Find(const Budget& budget, const std::string& name) {
  for (const Contributor& c : budget.contributors)
    if (c.name == name) return &c;
  return nullptr;
}

}  // namespace

TeeComparison CompareTee(const Budget& tee, const Budget& plain,
                         double equivalent_resistance_ohm) {
  TeeComparison out;
  out.equivalent_resistance_ohm = equivalent_resistance_ohm;
  out.plain_output_rms_v = plain.output_rms_v;
  out.plain_input_rms = plain.input_rms;
  out.noise_cost_ratio = tee.output_rms_v / plain.output_rms_v;
  out.tee_noise_gain_ref = tee.noise_gain_ref;
  out.plain_noise_gain_ref = plain.noise_gain_ref;
  out.tee_noise_gain_dc = tee.noise_gain_dc;
  out.plain_noise_gain_dc = plain.noise_gain_dc;
  out.plain_bandwidth_3db_hz = plain.bandwidth_3db_hz;
  out.plain_offset_worst_case_v = plain.offset.worst_case_v;

  for (const Contributor& c : tee.contributors) {
    TeeChange change;
    change.name = c.name;
    change.tee_output_rms_v = c.output_rms_v;
    if (const Contributor* p = Find(plain, c.name)) {
      change.plain_output_rms_v = p->output_rms_v;
      double relative = (c.output_rms_v - p->output_rms_v) /
                        std::max(p->output_rms_v, 1e-300);
      change.kind = relative > kSameRelative    ? TeeChange::Kind::kRaised
                    : relative < -kSameRelative ? TeeChange::Kind::kLowered
                                                : TeeChange::Kind::kSame;
    } else {
      change.kind = TeeChange::Kind::kAdded;
    }
    out.changes.push_back(change);
  }
  for (const Contributor& p : plain.contributors) {
    if (Find(tee, p.name)) continue;
    TeeChange change;
    change.name = p.name;
    change.kind = TeeChange::Kind::kRemoved;
    change.plain_output_rms_v = p.output_rms_v;
    out.changes.push_back(change);
  }
  return out;
}

}  // namespace hushgain
