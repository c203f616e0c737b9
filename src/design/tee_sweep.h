// The T-network sweep: the stage's equivalent feedback resistance Req is
// kept, and the largest resistor allowed, L, is swept from Req (the plain
// single resistor) down to a small value; at each L the rule below picks
// R1, R2, R3 and the full engine computes the budget.
//
// The rule (default): among networks with every resistor <= L and
// R1 + R2 + R1 R2 / R3 = Req, take the one with the smallest k = R2 / R3,
// the term the tee adds to the e_n noise gain 1 + k + Req / Ra. Since
// k = (Req - R1 - R2) / R1, that is R1 = L and R2 as large as R3 <= L
// allows:
//   L <= Req / 3:  R1 = R2 = L,  R3 = L^2 / (Req - 2 L)
//   L >= Req / 3:  R1 = R3 = L,  R2 = (Req - L) / 2
// (the two meet at R1 = R2 = R3 = Req / 3). As L -> Req, R2 -> 0 and the
// tee tends to the plain resistor R1 = Req.
// With a fixed ratio rho = R1 / R2: the larger of R1, R2 is L and R3 =
// R1 R2 / (Req - R1 - R2); where that R3 would exceed L (or R1 + R2 >= Req),
// R3 = L instead and R2 solves (rho / L) R2^2 + (1 + rho) R2 = Req.
// The end point L = Req is evaluated as the plain stage itself
// (PlainEquivalent), so it reproduces the plain stage's budget exactly;
// the noise cost ratio of every row is its output noise over that row's.
#ifndef HUSHGAIN_DESIGN_TEE_SWEEP_H_
#define HUSHGAIN_DESIGN_TEE_SWEEP_H_

#include <optional>
#include <string>
#include <vector>

#include "base/status.h"
#include "budget/budget.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"

namespace hushgain {

// The documented range of --points: 2 to 10000.
inline constexpr int kMaxTeeSweepPoints = 10000;

struct TeeSweepOptions {
  // The smallest L, ohms; 0 means Req / 1000. Must lie below Req.
  double min_largest_ohm = 0;
  // Rows from L = Req down to the smallest L, equally spaced in log L,
  // both ends included. At least 2.
  int points = 13;
  // R1 / R2 fixed (> 0); unset means the least-noise-gain rule above.
  std::optional<double> r1_over_r2;
  BudgetOptions budget;

  // Empty when valid; otherwise names the field, its value and the rule.
  std::string Validate() const;
};

struct TeeSweepRow {
  double largest_ohm = 0;       // L
  bool plain = false;           // the end point: one resistor R1 = Req
  TeeNetwork tee;               // R1, R2, R3 (R2 = R3 = 0 for the plain row)
  Budget budget;                // the full engine's
  double noise_cost_ratio = 0;  // output rms / the plain row's output rms
};

struct TeeSweepResult {
  Status status;
  double equivalent_ohm = 0;
  std::vector<TeeSweepRow> rows;  // L descending; rows[0] is the plain stage
};

// The network of the rule above for equivalent resistance `req_ohm` and
// largest resistor `largest_ohm` (0 < largest < req).
TeeNetwork TeeForLargest(double req_ohm, double largest_ohm,
                         std::optional<double> r1_over_r2);

// `stage` must have T-network feedback and valid options (asserted).
TeeSweepResult SweepTee(const Stage& stage, const TeeSweepOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_DESIGN_TEE_SWEEP_H_
