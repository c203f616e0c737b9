// The standard-value T-network search: every (R1, R2, R3) drawn from a
// sorted list of values (and, with a free input resistor, every R_in from a
// second list) whose closed-loop gain Req / (R_source + R_in) lies within a
// relative tolerance of the target, ranked by a figure of merit; the best
// `top` are re-verified by the full engine and ranked by its figures.
//
// How it stays exhaustive and fast:
//  1. For each (R_in, R1) the gain window fixes Req in [Req_lo, Req_hi], so
//     R3 = R1 R2 / (Req - R1 - R2) lies in an interval that moves up with
//     R2; a two-pointer walk over the sorted R3 values finds the candidates
//     of every R2 without scanning (the exact gain test then decides).
//  2. Closed-form lower bounds (ideal op-amp, design/closed_form_budget.h)
//     of the figure over all R2, R3 for a given (R_in, R1), and over all R1
//     for a given R_in, skip whole rows that cannot beat the current pool
//     (a strict comparison, so the result does not depend on the order).
//  3. Survivors are scored by the closed-form budget and kept in a pool of
//     the best `pool` candidates (ties broken on R_in, R1, R2, R3).
//  4. The full engine (finite GBW, every contributor, band integration)
//     verifies pool members in closed-form order until no unverified one
//     can enter the top: verification stops when the next candidate's
//     closed-form figure times the smallest full/closed ratio seen so far,
//     less `verify_margin`, is worse than the current top-th full figure.
//     When the pool runs out first, the search runs again with a pool four
//     times larger. At most 512 budgets are computed (a warning says so).
//     The shown ranking is the full engine's.
// Work is shared between `threads` std::threads by rows; the answer is the
// same for any thread count. Nothing here prints: progress reaches the
// caller through a callback, cancellation through an atomic flag.
#ifndef HUSHGAIN_DESIGN_TEE_SEARCH_H_
#define HUSHGAIN_DESIGN_TEE_SEARCH_H_

#include <atomic>
#include <cstdint>
#include <functional>
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
  kNoise,     // total output noise rms over the band
  kOffset,    // worst-case output offset at DC
  kWeighted,  // (1 - w) noise / noise_ref + w offset / offset_ref
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
  TeeRanking ranking = TeeRanking::kNoise;
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
  std::uint64_t in_tolerance = 0;  // closed-form evaluations (gain met);
                                   // rows skipped by a bound not counted
  std::uint64_t rows_pruned = 0;   // (R_in, R1) rows skipped by a bound
  int verified = 0;                // full-engine budgets for the ranking
  bool cancelled = false;
  std::vector<std::string> warnings;
};

// The stage supplies everything but the network (op-amp, band, source,
// R_plus mode, load) and, when input_values is empty, R_in. Options must be
// valid (asserted).
TeeSearchResult SearchTee(const Stage& stage, const TeeSearchOptions& options);

// The stage with R_in and the T network replaced.
Stage WithTee(const Stage& stage, double r_in, double r1, double r2, double r3);

// The figure of merit of a full-engine budget for `options.ranking`, with
// the references of the stage as given.
double FullScore(const Budget& budget, const TeeSearchOptions& options,
                 double noise_ref_v, double offset_ref_v);

}  // namespace hushgain

#endif  // HUSHGAIN_DESIGN_TEE_SEARCH_H_
