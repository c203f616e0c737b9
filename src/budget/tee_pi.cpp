#include "budget/tee_pi.h"

#include <cmath>
#include <complex>

#include "base/physical_constants.h"
#include "circuit/tee_equivalents.h"

namespace hushgain {
namespace {

NodeId FindNode(const Netlist& net, const char* name) {
  for (NodeId n = 0; n < net.node_count(); ++n)
    if (net.node_names[n] == name) return n;
  return kGround;
}

}  // namespace

Status TeePiFigures(const Stage& stage, const Netlist& net,
                    const MnaSystem& system, Port signal, Budget* budget) {
  if (stage.feedback.kind != Feedback::Kind::kTee) return Status::Ok();
  const TeeNetwork& t = stage.feedback.tee;
  TeePiBlock pi;
  pi.arms = StarMesh(t);
  pi.noise_equivalent_ohm = TeeNoiseEquivalentOhm(t);
  pi.input_arm_noise_gain = t.r2_ohm / t.r3_ohm;

  const int summing = system.NodeIndex(FindNode(net, "summing"));
  const int output = system.NodeIndex(net.output);
  auto fraction = [&](double f_hz, double* out) {
    ComplexVector x;
    Status s = DirectSolve(system, f_hz, signal, &x);
    if (!s.ok) return s;
    const std::complex<double> v_n = summing >= 0 ? x[summing] : 0.0;
    const std::complex<double> v_o = output >= 0 ? x[output] : 0.0;
    const double bridge = std::abs(v_n - v_o);
    // R2 / Z3 with Z3 = R3 + 1/(j w C3) (R2/R3 without C3).
    double r2_over_z3 = pi.input_arm_noise_gain;
    if (t.c3_f > 0)
      r2_over_z3 =
          f_hz > 0 ? t.r2_ohm / std::abs(std::complex<double>(
                                    t.r3_ohm, -1 / (2 * kPi * f_hz * t.c3_f)))
                   : 0;
    *out = bridge > 0 ? r2_over_z3 * std::abs(v_n) / bridge : 0;
    return Status::Ok();
  };
  pi.fraction_at_dc.f_hz = 0;
  pi.fraction_at_reference.f_hz = budget->reference_hz;
  pi.fraction_at_band_high.f_hz = stage.band_high_hz;
  for (TeePiBlock::ArmFraction* a :
       {&pi.fraction_at_dc, &pi.fraction_at_reference,
        &pi.fraction_at_band_high}) {
    Status s = fraction(a->f_hz, &a->fraction);
    if (!s.ok) return s;
  }
  if (stage.full_scale_output_v) {
    pi.output_arm_current_a =
        *stage.full_scale_output_v / pi.arms.output_arm_ohm;
    if (budget->full_scale_output_current_a &&
        *budget->full_scale_output_current_a > 0)
      pi.output_arm_share =
          *pi.output_arm_current_a / *budget->full_scale_output_current_a;
  }
  budget->tee_pi = pi;
  return Status::Ok();
}

}  // namespace hushgain
