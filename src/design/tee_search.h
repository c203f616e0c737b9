// The standard-value T-network search: every (R1, R2, R3) drawn from a
// sorted list of values (and, with a free input resistor, every R_in from a
// second list) whose DC gain, as the full engine computes it (finite A0,
// output resistance, load), lies within a relative tolerance of the target,
// ranked by a figure of merit; only networks the full engine finds in
// tolerance are listed, in the full engine's order.
//
// What is guaranteed. For the rankings by input-referred noise (the
// default) and by offset, the list is the true top N of every network in
// tolerance under the full engine's figure (for input noise: to the
// integrator's accuracy, below). The closed form takes the op-amp at the
// stage's temperature, as the full engine does (Vos with its drift, Ib, Ios
// and a bias-following i_n by their law: circuit/stage_at_temperature.h):
//  - Gain. The DC gain is below the ideal Req/Ra (the loop's T/(1+T) < 1;
//    design/closed_form_budget.h gives it exactly for the macro model), so a
//    network with Req/Ra below the window cannot be in it; above it, the
//    shortfall is at most delta = 2/T_min + 1e-6 with the smallest loop gain
//    T_min = A0 rho / NG_max (rho: R_o into the load parallel to R2 >= the
//    smallest value; NG_max = 1 + vmax/vmin + 2 g_hi). Every network whose
//    closed-form DC gain is within the tolerance (+1e-9) is a candidate;
//    the engine's gain then decides.
//  - Input noise. With an ideal op-amp the input-referred density of R_in,
//    R_source, R1, R2, R3 and i_n- is exactly the closed form's at every
//    frequency (each injects a current into the virtual ground that does
//    not depend on C_f or the pin capacitances: referred through the input
//    admittance 1/Ra, which is real), and e_n's is at least the closed
//    form's (|Y_f + 1/Ra + Y_arm + j w C| / (1/Ra) is at least its real
//    part, the DC value). The finite loop gain cancels between the signal
//    and every source it does not bypass. The + input resistor's noise and
//    i_n+ reach the + pin through R_plus in parallel with its bypass
//    capacitor and the pin capacitances, at worst as at the band's top:
//    their terms count times 1 / (1 + Rp w_H (C_plus + C_cm + C_diff))^2
//    (ClosedFormModel::plus_shunt_s; C_diff counts fully while the loop
//    does not peak in the band, |1 + T| >= 1). So the full figure is at
//    least sqrt(P0)/(Req/Ra), P0 the closed-form power with those terms so
//    scaled; the bound is that times 1 - 1e-6 (rounding, the output
//    resistance's feedthrough). Without them it lay a tenth of the power
//    below every network of a low-gain stage with an automatic R_plus,
//    and thousands were budgeted to no purpose.
//    The engine's figure itself is exact only to the integrator's relative
//    tolerance tol on the power, so a network left out is at worst
//    3 tol below the N-th listed (networks that close differ by less than
//    the figures' own accuracy), and a verified network counts as breaking
//    the bound only when it falls below it by more than 3 tol.
//  - Offset. The DC offsets pass through the loop as the signal does: the
//    full figure is the closed form times DC gain / ideal gain, less 1e-6.
// The candidates are ordered by that bound and verified until the next
// bound exceeds the N-th verified figure. Every verified network is checked
// against its bound; a failure is a warning (the list may then miss one).
// For output noise and the weighted figure there is no such bound: the full
// engine verifies the closed-form best until the next one's closed-form
// figure times the smallest full/closed ratio seen, less `verify_margin`,
// is worse than the N-th, at most 512 budgets (a warning says so).
//
// How it stays exhaustive and fast:
//  1. For each (R_in, R1) the gain window fixes Req in an interval, so
//     R3 = R1 R2 / (Req - R1 - R2) lies in an interval that moves up with
//     R2; a two-pointer walk over the sorted R3 values finds the candidates
//     of every R2 without scanning (the DC gain test then decides).
//  2. Lower bounds of the figure over all R2, R3 for a given (R_in, R1)
//     skip whole rows that cannot beat the current pool (a strict
//     comparison, so the result does not depend on the order).
//  3. Survivors are kept in a pool of the best `pool` candidates (ties
//     broken on R_in, R1, R2, R3; values and score only); when
//     verification exhausts it, the search runs again with a pool four
//     times larger. Of the verified networks only the best `top` keep
//     their budgets: memory is the pool's keys and `top` budgets, however
//     many networks are budgeted.
// Work is shared between `threads` workers by rows; the list and every
// count reported are the same for any thread count. Nothing here prints:
// progress reaches the caller through a callback, cancellation through an
// atomic flag.
#ifndef HUSHGAIN_DESIGN_TEE_SEARCH_H_
#define HUSHGAIN_DESIGN_TEE_SEARCH_H_

#include <atomic>
#include <cstdint>
#include <functional>
#include <limits>
#include <string>
#include <vector>

#include "base/status.h"
#include "base/worker_pool.h"
#include "budget/budget.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"
#include "design/closed_form_budget.h"

namespace hushgain {

enum class TeeRanking {
  kInputNoise,  // input-referred noise rms over the band (the default)
  kNoise,       // total output noise rms over the band
  kOffset,      // worst-case output offset at DC
  kWeighted,    // (1 - w) noise / noise_ref + w offset / offset_ref
};

// The documented range of --top: 1 to 10000.
inline constexpr int kMaxTeeSearchTop = 10000;

struct TeeSearchOptions {
  // R1, R2 and R3 are drawn from these values (ohms, ascending, > 0).
  std::vector<double> values;
  // Empty: R_in stays the stage's. Otherwise R_in is drawn from these
  // (ohms, ascending, > 0).
  std::vector<double> input_values;
  // Target |signal gain| = Req / (R_source + R_in), > 0.
  double target_gain = 0;
  // Relative: |gain / target - 1| <= gain_tolerance. Default 1 %.
  double gain_tolerance = 0.01;
  TeeRanking ranking = TeeRanking::kInputNoise;
  // kWeighted: the weight w of the offset, in [0, 1]. The references are the
  // figures of the stage as given (closed form for the closed-form score,
  // full engine for the shown one); a zero reference drops its term.
  double offset_weight = 0.5;
  int top = 10;  // how many are shown, >= 1
  // The initial pool of closed-form best candidates (grows when needed).
  // 0 means max(4 top, top + 32).
  int pool = 0;
  // Slack of the verification stop rule (see above). Default 0.25 %, a
  // little above the spread of the full/closed ratio among networks of the
  // same gain in the examples.
  double verify_margin = 0.0025;
  int threads = 2;  // >= 1
  // false only for benchmarks of the closed-form phase: the result then
  // holds the closed-form best, without budgets, and nothing is verified.
  bool verify = true;
  BudgetOptions budget;
  // Called from the calling thread, about every 0.1 s, with the fraction of
  // the closed-form sweep done (0 .. 1). May be empty.
  std::function<void(double fraction)> progress;
  // When set and it becomes true, the search stops, verifies what it has
  // and returns the best so far with `cancelled` set. May be null.
  const std::atomic<bool>* cancel = nullptr;

  // Empty when valid; otherwise names the field, its value and the rule.
  std::string Validate() const;
};

struct TeeCandidate {
  double r_in_ohm = 0;
  double r1_ohm = 0;
  double r2_ohm = 0;
  double r3_ohm = 0;
  ClosedFormFigures closed;  // the closed-form figures
  double closed_score = 0;   // the closed-form figure of merit
  double score = 0;          // the full engine's figure of merit
  Budget budget;             // the full engine's budget (with the tee
                             // comparison for the shown candidates)
};

struct TeeSearchResult {
  Status status;                   // numerical trouble in a full-engine budget
  std::vector<TeeCandidate> best;  // at most `top`, best first
  std::uint64_t combinations = 0;  // size of the space before pruning
  // Work counters for benchmarks: they depend on how the workers met the
  // pool's threshold, so they vary with the thread count; not reported.
  std::uint64_t in_tolerance = 0;  // closed-form evaluations (gain met)
  std::uint64_t rows_pruned = 0;   // (R_in, R1) rows skipped by a bound
  int verified = 0;                // full-engine budgets computed
  bool cancelled = false;
  std::vector<std::string> warnings;
};

// The stage supplies everything but the network (op-amp, band, source,
// R_plus mode, load) and, when input_values is empty, R_in. Options must be
// valid (asserted).
TeeSearchResult SearchTee(const Stage& stage, const TeeSearchOptions& options);

// The ideal-gain window of the search (see "Gain" above): a network whose
// DC gain is at most g_hi has Req/Ra below ideal_gain_max (infinite when
// the loop gain may be below 4), and DC gain / ideal gain at least
// loop_factor_min (0 then).
struct DcGainWindow {
  double ideal_gain_max = std::numeric_limits<double>::infinity();
  double loop_factor_min = 0;
};
DcGainWindow WindowOf(const ClosedFormModel& model,
                      const TeeSearchOptions& options, double vmin,
                      double vmax);

// 1 - epsilon of the ranking's bound: 1 - 1e-6 for input noise and offset,
// 1 otherwise.
double BoundFactor(const TeeSearchOptions& options);

// The stage with R_in and the T network replaced.
Stage WithTee(const Stage& stage, double r_in, double r1, double r2, double r3);

// The figure of merit of a full-engine budget for `options.ranking`, with
// the references of the stage as given.
double FullScore(const Budget& budget, const TeeSearchOptions& options,
                 double noise_ref_v, double offset_ref_v);

}  // namespace hushgain

#endif  // HUSHGAIN_DESIGN_TEE_SEARCH_H_
