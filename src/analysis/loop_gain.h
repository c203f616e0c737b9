// The loop gain of an op-amp in its actual network, as a return ratio
// (Bode): drive the op-amp's ideal-amplifier node with 1 V from outside,
// removing the controlled-source relation, solve the network for the input
// difference v_d = V+ - V-, and
//   T(j w) = -A(j w) v_d,   A(s) = 1 / (1/A0 + s / (2 pi GBW)).
// Every pin capacitance, the output resistance and the load are included.
// For a negative-feedback loop T(0) > 0; the phase margin is
// 180 deg + arg T at the first frequency where |T| falls through 1, with the
// phase unwrapped from DC.
#ifndef HUSHGAIN_ANALYSIS_LOOP_GAIN_H_
#define HUSHGAIN_ANALYSIS_LOOP_GAIN_H_

#include <memory>
#include <vector>

#include "analysis/linear_algebra.h"
#include "analysis/mna_system.h"
#include "analysis/restamp_solver.h"
#include "analysis/small_complex_lu.h"
#include "base/status.h"
#include "circuit/opamp_model.h"

namespace hushgain {

class LoopGainSolver {
 public:
  LoopGainSolver(const MnaSystem& system, int opamp, const OpAmpModel& model);

  // Writes T(j 2 pi f); fails like AdjointSolver::SolveAt. Above DC, with
  // C of rank r <= n / 2, the network is first solved by RestampSolver's
  // low-rank update on one real LU of G (as AdjointSolver::SolveAt), kept
  // at a residual of at most kLowRankResidualLimit; otherwise the dense LU.
  Status LoopGainAt(double f_hz, Complex* loop_gain);
  // Whether the last LoopGainAt kept the low-rank update (for tests).
  bool last_solve_low_rank() const { return last_low_rank_; }

 private:
  int n_;
  // G and C with the controlled-source row replaced, and Y at the last
  // frequency, row-major (the split storage SmallComplexLu reads).
  std::vector<double> g_;
  std::vector<double> c_;
  std::vector<double> y_re_;
  std::vector<double> y_im_;
  SmallComplexLu lu_;
  ComplexVector b_;
  ComplexVector x_;
  int plus_;
  int minus_;
  double inverse_a0_;
  double inverse_wt_;
  // (G + j w C) x = e_row as RestampSolver's transposed solve of G^T, C^T;
  // null when C's rank is above n / 2.
  std::unique_ptr<RestampSolver> low_rank_;
  bool last_low_rank_ = false;
};

struct LoopSummary {
  Status status;
  double dc_loop_gain = 0;  // T at the lowest scanned frequency, real part
  bool crossover_found = false;
  double crossover_hz = 0;      // |T| = 1
  double phase_margin_deg = 0;  // 180 + arg T(crossover), unwrapped
};

// Scans f_start_hz .. f_max_hz (log, `points_per_decade`) for the first
// unity crossing and refines it by Brent's method in log f
// (analysis/bracketed_root.h) to 1e-10.
LoopSummary SummarizeLoop(LoopGainSolver& solver, double f_start_hz,
                          double f_max_hz, int points_per_decade = 8);

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_LOOP_GAIN_H_
