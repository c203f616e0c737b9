// Which part to change: the logarithmic sensitivities of the stage's
// figures to each of its parameters, through the engine.
//
// For a parameter x (a resistor, a capacitor, a photodiode or sensor
// value, an op-amp parameter) and a figure F (the output noise rms, the
// worst-case DC offset, the -3 dB bandwidth):
//   s = d ln F / d ln x,
// so a 1 % rise of x moves F by about s %. Computed by central differences
// in u = ln x on the stage as computed (at its temperature, an "auto" C_f
// fixed at the value chosen), with two steps h and 2h, h = 1e-3:
//   D(h) = (ln F(u + h) - ln F(u - h)) / 2h
//   s = (4 D(h) - D(2h)) / 3            (Richardson: error O(h^4))
//   error estimate |D(h) - D(2h)| / 3   (the O(h^2) term Richardson removes)
// The noise is integrated on the nodes of the stage's own converged
// partition (integrate/band_integral.h, QuadratureNodes) for every
// perturbed stage, so the integrator's adaptivity never shows up as a
// jump in F; the offset is exact at DC and the bandwidth is bisected to
// 1e-8 (an error below 1e-5 on s at this h).
//
// Exact identities (tests): with e_n white, d ln(rms) / d ln(e_w) is e_n's
// share of the output noise power; for a resistor whose only effect is its
// own thermal noise (a + input resistor without i_n or pin capacitance),
// d ln(rms) / d ln(R) is half its share.
//
// The passband gain's sensitivity is computed the same way: it tells which
// parts set the gain, whose noise sensitivity is mostly the gain's own.
//
// The advice: among the parameters that do not set the gain (|d ln gain /
// d ln x| below kGainSettingSensitivity), the one with the largest |s| on
// the noise; the whole budget is computed again with x halved (s > 0) or
// doubled (s < 0), and the change of the output noise is that budget's,
// not s extrapolated.
#ifndef HUSHGAIN_REVIEW_SENSITIVITY_H_
#define HUSHGAIN_REVIEW_SENSITIVITY_H_

#include <vector>

#include "base/status.h"
#include "budget/budget.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"

namespace hushgain {

// A parameter moving the passband gain by more than 1 % per 100 % sets it.
inline constexpr double kGainSettingSensitivity = 0.01;

// `outcome` is the stage's budget (ComputeBudget or ReviewStage), whose
// stage_used and noise_partition the differences start from. Fills
// `block` with one row per parameter that is present and non-zero, ranked
// by the largest |s| of the three figures. Fails when a perturbed budget
// fails.
Status ComputeSensitivity(const BudgetOutcome& outcome,
                          const BudgetOptions& options,
                          SensitivityBlock* block);

}  // namespace hushgain

#endif  // HUSHGAIN_REVIEW_SENSITIVITY_H_
