// Modified nodal analysis of a Netlist: Y(s) x = b with Y(s) = G + s C.
//
// Unknowns: the voltage of every node but ground; for each op-amp the
// voltage of its ideal amplifier's output (when R_out > 0) and the current
// of its controlled source; for each voltage source its current.
// The op-amp row reads (1/A0 + s/(2 pi GBW)) V_amp - V_+ + V_- = e, which is
// V_amp = A(s) (V_+ + e - V_-) for A(s) = A0 / (1 + s/w_p), w_p = 2 pi GBW/A0,
// written so that an ideal op-amp (A0, GBW -> infinity) stays well posed.
// e (the excitation of that row) is where e_n and Vos enter.
//
// G and C are stamped once. Solving at a frequency forms Y into preallocated
// storage; nothing allocates per frequency.
#ifndef HUSHGAIN_ANALYSIS_MNA_SYSTEM_H_
#define HUSHGAIN_ANALYSIS_MNA_SYSTEM_H_

#include <memory>
#include <string>
#include <vector>

#include "analysis/linear_algebra.h"
#include "analysis/small_complex_lu.h"
#include "base/status.h"
#include "circuit/netlist.h"

namespace hushgain {

// An excitation compiled to the unknown vector: +1 at `plus`, -1 at `minus`
// (-1 = no entry, for ground). A port whose both entries are -1 excites
// nothing (a source shorted to ground).
struct Port {
  int plus = -1;
  int minus = -1;
  bool IsNull() const { return plus < 0 && minus < 0; }
};

class MnaSystem {
 public:
  // Stamps the netlist. Fails (without stamping) when a node has no DC path
  // to ground through resistors, sources or an op-amp output: such a network
  // is singular at DC. The message names the node.
  static Status Build(const Netlist& netlist, MnaSystem* system);

  int size() const { return static_cast<int>(g_.rows()); }
  int output_index() const { return output_index_; }
  Port Compile(const Excitation& excitation) const;
  // The unknown index of a node's voltage, -1 for ground.
  int NodeIndex(NodeId node) const { return node - 1; }
  // The unknown index of op-amp `k`'s controlled-source row.
  int OpAmpRow(int k) const { return opamp_rows_[k]; }
  // The unknown index of op-amp `k`'s ideal-amplifier output voltage.
  int OpAmpAmplifierNode(int k) const { return opamp_amp_nodes_[k]; }
  // The unknown indices of op-amp `k`'s + and - pins (-1 for ground).
  int OpAmpPlus(int k) const { return opamp_plus_[k]; }
  int OpAmpMinus(int k) const { return opamp_minus_[k]; }
  int opamp_count() const { return static_cast<int>(opamp_rows_.size()); }
  const std::string& UnknownName(int index) const { return names_[index]; }

  const RealMatrix& g() const { return g_; }
  const RealMatrix& c() const { return c_; }

 private:
  RealMatrix g_;
  RealMatrix c_;
  int output_index_ = -1;
  std::vector<int> opamp_rows_;
  std::vector<int> opamp_amp_nodes_;
  std::vector<int> opamp_plus_;
  std::vector<int> opamp_minus_;
  std::vector<int> source_rows_;
  std::vector<std::string> names_;
};

class RestampSolver;

// Solves the transposed (adjoint) system Y(j w)^T z = e_out once per
// frequency, after which the transfer from any excitation b to the output is
// z^T b (Director and Rohrer 1969; Rohrer, Nagel, Meyer and Weber 1971).
//
// C has low rank r (a few capacitors and the op-amp's GBW term). When
// r <= n / 2, a frequency above DC is first solved by RestampSolver's
// Woodbury update on the one real LU of G^T (analysis/restamp_solver.h: an
// r x r complex solve instead of an n x n one), and that z is kept only when
// its relative residual against Y(j w)^T is at most 1e-14, the size the
// dense LU leaves: an update that lost digits (a G ill-conditioned beside
// w C, a cancellation of z0 against j w W y) falls back to the dense
// equilibrated LU below, as does DC, a singular G and r > n / 2.
class AdjointSolver {
 public:
  explicit AdjointSolver(const MnaSystem& system);
  ~AdjointSolver();
  AdjointSolver(const AdjointSolver&) = delete;
  AdjointSolver& operator=(const AdjointSolver&) = delete;

  // Rows and columns are equilibrated before the factorization, so the
  // condition estimate measures the network, not its mix of units. Fails
  // when the equilibrated system's reciprocal condition number is below
  // 1e-13 or the solution's relative residual exceeds 1e-9; the message
  // names the frequency.
  Status SolveAt(double f_hz);

  // Whether the last SolveAt kept the low-rank update's z (for tests).
  bool last_solve_low_rank() const { return last_low_rank_; }
  // r of C's low-rank split, or -1 when only the dense LU is used.
  int capacitance_rank() const;

  // Output voltage per unit excitation at the last solved frequency.
  Complex Transfer(Port port) const {
    Complex t = 0;
    if (port.plus >= 0) t += z_[port.plus];
    if (port.minus >= 0) t -= z_[port.minus];
    return t;
  }

 private:
  const MnaSystem* system_;
  int n_;
  // Y^T's real and imaginary parts (G^T, C^T) and the equilibrated Y^T at
  // the last frequency, row-major.
  std::vector<double> g_t_;
  std::vector<double> c_t_;
  std::vector<double> a_re_;
  std::vector<double> a_im_;
  SmallComplexLu lu_;
  ComplexLu condition_lu_;  // only for the condition estimate
  ComplexVector rhs_;
  ComplexVector z_;
  Eigen::VectorXd row_scale_;
  Eigen::VectorXd column_scale_;
  ComplexMatrix scaled_;  // only for the condition estimate
  ComplexVector scaled_rhs_;
  std::unique_ptr<RestampSolver> low_rank_;  // null: dense only
  bool last_low_rank_ = false;
  Status SolveDense(double f_hz);
};

// The direct solve Y x = b for one excitation, writing every unknown into
// `x`. Used to check the adjoint and where node voltages are needed. Fails
// when the solution is not finite or its relative residual exceeds 1e-9
// (as AdjointSolver::SolveAt); the message names the frequency.
Status DirectSolve(const MnaSystem& system, double f_hz, Port port,
                   ComplexVector* x);

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_MNA_SYSTEM_H_
