// Many solves of one network whose resistor (and capacitor) values change
// between solves (a Monte Carlo): the MNA matrices of MnaSystem with the
// resistors' conductance stamps taken out, so new values are stamped into
// preallocated storage, and a small dense LU with partial pivoting
// (row-equilibrated) written for this size (n of about 5 to 15): nothing
// allocates per solve.
//
//   SetResistors  G = G_without_resistors + sum of (1/R_k) stamps
//   SetCapacitors C = C_without_capacitors + sum of C_k stamps, split anew
//   SolveAdjoint  (G + j w C)^T z = e_out, then Transfer(port) = z^T b
//   SolveDirect   G x = b at DC, with the LU of the last DC adjoint solve
//
// C is stamped by few capacitors and the op-amp's GBW term, so its rank r
// is small. C^T = P Q^T is split once (elimination with complete pivoting,
// exact for these sums of rank-one stamps); after one real LU of G^T per
// set of resistor values, each frequency is a Woodbury update:
//   z0 = G^-T e_out, W = G^-T P, K = Q^T W,
//   (I + j w K) y = Q^T z0,  z = z0 - j w W y
// an r x r complex solve instead of an n x n one (for r <= 2 by Cramer's
// rule with W y0 and W adj(K)-part precomputed, one division a frequency).
// With r > n / 2 the dense complex LU is used instead.
#ifndef HUSHGAIN_ANALYSIS_RESTAMP_SOLVER_H_
#define HUSHGAIN_ANALYSIS_RESTAMP_SOLVER_H_

#include <utility>
#include <vector>

#include "analysis/mna_system.h"
#include "base/status.h"
#include "circuit/netlist.h"

namespace hushgain {

// The relative residual (RestampSolver::Residual) at or below which a
// caller keeps the low-rank update's answer: the size the dense LU leaves on
// these networks (about 1e-17 to 1e-15); above it the caller solves densely.
constexpr double kLowRankResidualLimit = 1e-14;

class RestampSolver {
 public:
  // `system` was built from `netlist`; every resistor of the netlist becomes
  // restampable, in the netlist's order.
  RestampSolver(const MnaSystem& system, const Netlist& netlist);
  // No restampable parts: (G + j w C)^T z = e_output for the given G and C
  // (n x n), one DC factorization for every frequency. AdjointSolver's
  // low-rank path passes the system's matrices; LoopGainSolver passes its
  // G and C transposed, for its direct solve.
  RestampSolver(const RealMatrix& g, const RealMatrix& c, int output);

  int size() const { return n_; }
  int resistor_count() const { return static_cast<int>(nodes_.size()); }
  // r of the low-rank split of C, or -1 when the dense complex LU is used.
  int capacitance_rank() const { return rank_; }

  // New values for every resistor (ohms, netlist order).
  void SetResistors(const double* ohms);
  int capacitor_count() const { return static_cast<int>(cap_nodes_.size()); }
  // New values for every capacitor (farads, netlist order); the low-rank
  // split of C is redone into preallocated storage.
  void SetCapacitors(const double* farads);

  // Factors Y(j 2 pi f)^T and solves for z. Fails on a zero or non-finite
  // pivot (names the frequency).
  Status SolveAdjoint(double f_hz);

  // |z^T b|^2 and Re(z^T b) after SolveAdjoint.
  double TransferNorm(Port port) const {
    double re = 0, im = 0;
    if (port.plus >= 0) re += zr_[port.plus], im += zi_[port.plus];
    if (port.minus >= 0) re -= zr_[port.minus], im -= zi_[port.minus];
    return re * re + im * im;
  }
  double TransferReal(Port port) const {
    double re = 0;
    if (port.plus >= 0) re += zr_[port.plus];
    if (port.minus >= 0) re -= zr_[port.minus];
    return re;
  }

  // z after SolveAdjoint (n entries each, and a zero for ground at [n]).
  const double* adjoint_real() const { return zr_.data(); }
  const double* adjoint_imag() const { return zi_.data(); }

  // |A z - e_output| / (|A| |z| + 1) for the last SolveAdjoint's z, A =
  // (G + j w C)^T with the current values, norms built on |re| + |im| (the
  // largest row sum of A, the largest entry of z and of the residual): how
  // a caller judges whether the low-rank update kept its digits.
  double Residual(double f_hz) const;
  // SolveAdjoint judged as a caller with a dense solve to fall back on must
  // judge it: true when it succeeded, z is finite and its Residual is at
  // most kLowRankResidualLimit. (A NaN in z would not raise Residual, whose
  // maxima pass over it, so finiteness is checked first.)
  bool SolveAdjointWithinLimit(double f_hz);

  // The ports whose |transfer|^2 TransferNorms gives, in this order.
  void SetNormPorts(const std::vector<Port>& ports);
  // |z^T b|^2 of every SetNormPorts port at f_hz into norms[0 .. count-1]:
  // SolveAdjoint's figures. With a capacitance of rank 1 or 2 (and f > 0)
  // z itself is not formed: each port's DC transfer and its parts of W y0
  // and W a are kept per set of values, so a frequency costs one division
  // and a few products a port, and TransferNorm/TransferReal still read
  // the last SolveAdjoint.
  Status TransferNorms(double f_hz, double* norms);

  // After SolveAdjoint(0): solves G x = b (b given as unknown-sized vector,
  // overwritten by x). Uses the DC factorization.
  void SolveDirectDc(double* b);

 private:
  int n_ = 0;
  int output_ = -1;
  std::vector<double> g_base_t_;  // G^T without resistors, row-major
  std::vector<double> c_t_;       // C^T, row-major
  std::vector<double> c_base_t_;  // C^T without the capacitors' stamps
  std::vector<std::pair<int, int>> cap_nodes_;  // unknown indices
  std::vector<double> rest_, col_, row_;        // the split's storage
  std::vector<double> g_t_;                 // G^T with the current resistors
  std::vector<std::pair<int, int>> nodes_;  // unknown indices (-1 = ground)
  // Working storage of the factorization: real and imaginary parts.
  std::vector<double> ar_, ai_;
  std::vector<int> pivot_;
  std::vector<double> row_scale_;
  std::vector<double> inv_diag_;  // 1 / U_kk of the last DC factorization
  std::vector<double> zr_, zi_;
  bool real_only_ = false;  // the last factorization was at DC
  // The low-rank split of C^T (n x r each, column-major) and the per-values
  // data of the Woodbury update.
  int rank_ = 0;
  std::vector<double> p_, q_;
  bool prepared_ = false;  // dc_* below match the current resistors
  std::vector<double> dc_lu_, dc_scale_, dc_inv_diag_, dc_z0_, w_, k_, y0_;
  // Rank 2 or less: det K, tr K, W y0 and W adj-part (KeepDcFactorization).
  double det_k_ = 0, trace_k_ = 0;
  std::vector<double> low_u_, low_v_;
  // SetNormPorts: each port's unknown indices (ground: n, a zero entry of
  // dc_z0_, low_u_ and low_v_), and per set of values its DC transfer and
  // its parts of W y0 and W a (rank 2 or less).
  std::vector<std::pair<int, int>> norm_ports_;
  std::vector<double> port_t0_, port_u_, port_v_;
  std::vector<int> dc_pivot_;
  Status Prepare();
  void SplitCapacitance();        // C^T = P Q^T into p_, q_, rank_
  void KeepDcFactorization();     // after a dense DC solve: z0, W, K, y0
  void SolveDc(double* b) const;  // G^T x = b with the DC factorization
};

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_RESTAMP_SOLVER_H_
