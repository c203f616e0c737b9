#include "analysis/mna_system.h"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "analysis/restamp_solver.h"
#include "base/physical_constants.h"

namespace hushgain {
namespace {

// Relative residual above which a solve is refused as inaccurate. LU with
// partial pivoting on these small systems leaves ~1e-15; 1e-9 leaves room
// for badly scaled but still meaningful networks.
constexpr double kMaxRelativeResidual = 1e-9;
// Below this reciprocal condition number (of the equilibrated matrix) the
// answer has fewer than about three good digits: refuse it.
constexpr double kMinReciprocalCondition = 1e-13;
constexpr double kPivotSpreadForConditionCheck = 1e-6;

void StampConductance(RealMatrix& m, int a, int b, double value) {
  if (a >= 0) m(a, a) += value;
  if (b >= 0) m(b, b) += value;
  if (a >= 0 && b >= 0) {
    m(a, b) -= value;
    m(b, a) -= value;
  }
}

// |re| + |im|: the size of an entry for scaling and residuals.
double Size(Complex z) { return std::fabs(z.real()) + std::fabs(z.imag()); }

// |r| / (|A| |x| + 1) in the norms built on Size: the largest row sum of A,
// the largest entry of x and r. Within a factor 2 of the same ratio in
// moduli.
double RelativeResidual(const ComplexMatrix& a, const ComplexVector& x,
                        const ComplexVector& r) {
  const int n = static_cast<int>(a.rows());
  double row_sum = 0, x_max = 0, r_max = 0;
  for (int i = 0; i < n; ++i) {
    double sum = 0;
    for (int j = 0; j < n; ++j) sum += Size(a(i, j));
    row_sum = std::max(row_sum, sum);
    x_max = std::max(x_max, Size(x[i]));
    r_max = std::max(r_max, Size(r[i]));
  }
  return r_max / (row_sum * x_max + 1.0);
}

int Find(std::vector<int>& parent, int i) {
  while (parent[i] != i) i = parent[i] = parent[parent[i]];
  return i;
}

void Union(std::vector<int>& parent, int a, int b) {
  parent[Find(parent, a)] = Find(parent, b);
}

}  // namespace

Status MnaSystem::Build(const Netlist& net, MnaSystem* system) {
  // Every node needs a DC path to ground, or G is singular.
  std::vector<int> parent(net.node_count());
  std::iota(parent.begin(), parent.end(), 0);
  for (const Resistor& r : net.resistors) Union(parent, r.a, r.b);
  for (const VoltageSource& v : net.voltage_sources)
    Union(parent, v.plus, v.minus);
  for (const OpAmp& op : net.opamps) Union(parent, op.out, kGround);
  for (NodeId n = 1; n < net.node_count(); ++n) {
    if (Find(parent, n) != Find(parent, kGround))
      return Status::Fail("node '" + net.node_names[n] +
                          "' has no DC path to ground");
  }

  MnaSystem s;
  s.names_.assign(net.node_names.begin() + 1, net.node_names.end());
  int next = net.node_count() - 1;
  for (const OpAmp& op : net.opamps) {
    if (op.model.output_resistance_ohm > 0) {
      s.opamp_amp_nodes_.push_back(next++);
      s.names_.push_back(op.name + " amplifier");
    } else {
      s.opamp_amp_nodes_.push_back(s.NodeIndex(op.out));
    }
    s.opamp_rows_.push_back(next++);
    s.opamp_plus_.push_back(s.NodeIndex(op.plus));
    s.opamp_minus_.push_back(s.NodeIndex(op.minus));
    s.names_.push_back(op.name + " source current");
  }
  for (const VoltageSource& v : net.voltage_sources) {
    s.source_rows_.push_back(next++);
    s.names_.push_back(v.name + " current");
  }
  s.g_ = RealMatrix::Zero(next, next);
  s.c_ = RealMatrix::Zero(next, next);

  for (const Resistor& r : net.resistors)
    StampConductance(s.g_, s.NodeIndex(r.a), s.NodeIndex(r.b), 1.0 / r.ohms);
  for (const Capacitor& c : net.capacitors)
    StampConductance(s.c_, s.NodeIndex(c.a), s.NodeIndex(c.b), c.farads);

  for (std::size_t k = 0; k < net.opamps.size(); ++k) {
    const OpAmp& op = net.opamps[k];
    const OpAmpModel& m = op.model;
    int amp = s.opamp_amp_nodes_[k];
    int row = s.opamp_rows_[k];
    int p = s.NodeIndex(op.plus);
    int n = s.NodeIndex(op.minus);
    // Controlled source from ground to the amplifier node; its current
    // enters the amplifier node.
    s.g_(amp, row) -= 1.0;
    s.g_(row, amp) += 1.0 / m.open_loop_gain;
    s.c_(row, amp) += 1.0 / (2.0 * kPi * m.gbw_hz);
    if (p >= 0) s.g_(row, p) -= 1.0;
    if (n >= 0) s.g_(row, n) += 1.0;
    if (m.output_resistance_ohm > 0)
      StampConductance(s.g_, amp, s.NodeIndex(op.out),
                       1.0 / m.output_resistance_ohm);
    StampConductance(s.c_, p, -1, m.c_cm_f);
    StampConductance(s.c_, n, -1, m.c_cm_f);
    StampConductance(s.c_, p, n, m.c_diff_f);
  }
  for (std::size_t k = 0; k < net.voltage_sources.size(); ++k) {
    const VoltageSource& v = net.voltage_sources[k];
    int row = s.source_rows_[k];
    int p = s.NodeIndex(v.plus);
    int n = s.NodeIndex(v.minus);
    // The source current leaves node + into the source.
    if (p >= 0) {
      s.g_(p, row) += 1.0;
      s.g_(row, p) += 1.0;
    }
    if (n >= 0) {
      s.g_(n, row) -= 1.0;
      s.g_(row, n) -= 1.0;
    }
  }
  s.output_index_ = s.NodeIndex(net.output);
  *system = std::move(s);
  return Status::Ok();
}

Port MnaSystem::Compile(const Excitation& excitation) const {
  struct Visitor {
    const MnaSystem& s;
    Port operator()(const CurrentInjection& i) const {
      return {s.NodeIndex(i.into), s.NodeIndex(i.out_of)};
    }
    Port operator()(const OpAmpInputVoltage& v) const {
      return {s.opamp_rows_[v.opamp], -1};
    }
    Port operator()(const SourceVoltage& v) const {
      return {s.source_rows_[v.source], -1};
    }
  };
  return std::visit(Visitor{*this}, excitation);
}

AdjointSolver::AdjointSolver(const MnaSystem& system)
    : system_(&system),
      n_(system.size()),
      g_t_(static_cast<std::size_t>(n_) * n_),
      c_t_(static_cast<std::size_t>(n_) * n_),
      a_re_(static_cast<std::size_t>(n_) * n_),
      a_im_(static_cast<std::size_t>(n_) * n_),
      lu_(n_),
      condition_lu_(n_),
      rhs_(ComplexVector::Zero(n_)),
      z_(n_),
      row_scale_(n_),
      column_scale_(n_),
      scaled_(n_, n_),
      scaled_rhs_(n_) {
  if (system.output_index() >= 0) rhs_[system.output_index()] = 1.0;
  // Y^T row by row: row i of Y^T is column i of G and C.
  for (int i = 0; i < n_; ++i)
    for (int j = 0; j < n_; ++j) {
      g_t_[i * n_ + j] = system.g()(j, i);
      c_t_[i * n_ + j] = system.c()(j, i);
    }
  low_rank_ = std::make_unique<RestampSolver>(system.g(), system.c(),
                                              system.output_index());
  if (low_rank_->capacitance_rank() < 0) low_rank_.reset();
}

AdjointSolver::~AdjointSolver() = default;

int AdjointSolver::capacitance_rank() const {
  return low_rank_ ? low_rank_->capacitance_rank() : -1;
}

Status AdjointSolver::SolveAt(double f_hz) {
  last_low_rank_ = false;
  if (f_hz != 0 && low_rank_ && low_rank_->SolveAdjointWithinLimit(f_hz)) {
    const double* zr = low_rank_->adjoint_real();
    const double* zi = low_rank_->adjoint_imag();
    for (int i = 0; i < n_; ++i) z_[i] = Complex(zr[i], zi[i]);
    last_low_rank_ = true;
    return Status::Ok();
  }
  return SolveDense(f_hz);
}

Status AdjointSolver::SolveDense(double f_hz) {
  const double w = 2.0 * kPi * f_hz;
  const int n = n_;
  double* ar = a_re_.data();
  double* ai = a_im_.data();
  // Y^T = G^T + j w C^T, row by row, with each row's largest entry and its
  // sum for the residual's scale. Equilibrate: scale each row, then each
  // column, to a largest entry of 1, sizes measured as |re| + |im| (within
  // sqrt 2 of the modulus, and no hypot: see analysis/small_complex_lu.h).
  double row_sum_max = 0;
  for (int i = 0; i < n; ++i) {
    double largest = 0, sum = 0;
    for (int j = 0; j < n; ++j) {
      const double re = g_t_[i * n + j], im = w * c_t_[i * n + j];
      ar[i * n + j] = re;
      ai[i * n + j] = im;
      const double size = std::fabs(re) + std::fabs(im);
      largest = std::max(largest, size);
      sum += size;
    }
    row_scale_[i] = largest > 0 ? 1.0 / largest : 1.0;
    row_sum_max = std::max(row_sum_max, sum);
  }
  for (int j = 0; j < n; ++j) {
    double m = 0;
    for (int i = 0; i < n; ++i)
      m = std::max(m, (std::fabs(ar[i * n + j]) + std::fabs(ai[i * n + j])) *
                          row_scale_[i]);
    column_scale_[j] = m > 0 ? 1.0 / m : 1.0;
  }
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      const double scale = row_scale_[i] * column_scale_[j];
      ar[i * n + j] *= scale;
      ai[i * n + j] *= scale;
    }
  // A column without a nonzero pivot is singular. The condition estimate
  // (a third of the cost of a solve) runs only when the pivots spread over
  // more than 1e6, the sign of a badly conditioned system.
  bool singular = !lu_.Factor(ar, ai);
  if (!singular) {
    const double smallest_pivot = lu_.SmallestPivot();
    const bool suspicious =
        smallest_pivot < kPivotSpreadForConditionCheck * lu_.LargestPivot();
    singular = !(smallest_pivot >= kMinReciprocalCondition);
    if (!singular && suspicious) {
      for (int i = 0; i < n; ++i)
        for (int j = 0; j < n; ++j)
          scaled_(i, j) = Complex(ar[i * n + j], ai[i * n + j]);
      condition_lu_.compute(scaled_);
      singular = !(condition_lu_.rcond() >= kMinReciprocalCondition);
    }
  }
  if (singular)
    return Status::Fail(
        "the network is singular or too ill-conditioned to "
        "solve at " +
        HzText(f_hz));
  scaled_rhs_ = row_scale_.asDiagonal() * rhs_;
  lu_.Solve(scaled_rhs_, &z_);
  z_.array() *= column_scale_.array();
  // The residual Y^T z - e_out against |Y^T| |z| + 1, in the norms of
  // RelativeResidual, from the unscaled matrix.
  double z_max = 0, r_max = 0;
  for (int i = 0; i < n; ++i) z_max = std::max(z_max, Size(z_[i]));
  for (int i = 0; i < n; ++i) {
    double sr = -rhs_[i].real(), si = -rhs_[i].imag();
    for (int j = 0; j < n; ++j) {
      const double gr = g_t_[i * n + j], gi = w * c_t_[i * n + j];
      const double zr = z_[j].real(), zi = z_[j].imag();
      sr += gr * zr - gi * zi;
      si += gr * zi + gi * zr;
    }
    r_max = std::max(r_max, std::fabs(sr) + std::fabs(si));
  }
  const double relative = r_max / (row_sum_max * z_max + 1.0);
  if (!z_.allFinite() || !(relative <= kMaxRelativeResidual))
    return Status::Fail(
        "the network is singular or too ill-conditioned to "
        "solve at " +
        HzText(f_hz));
  return Status::Ok();
}

Status DirectSolve(const MnaSystem& system, double f_hz, Port port,
                   ComplexVector* x) {
  const double w = 2.0 * kPi * f_hz;
  ComplexMatrix y(system.size(), system.size());
  y.real() = system.g();
  y.imag() = w * system.c();
  ComplexVector b = ComplexVector::Zero(system.size());
  if (port.plus >= 0) b[port.plus] += 1.0;
  if (port.minus >= 0) b[port.minus] -= 1.0;
  SmallComplexLu lu(system.size());
  if (!lu.Factor(y))
    return Status::Fail("the network is singular at " + HzText(f_hz));
  lu.Solve(b, x);
  if (!x->allFinite())
    return Status::Fail("the network is singular at " + HzText(f_hz));
  // The same residual test as the adjoint solve: a solution that does not
  // satisfy its own equations is refused, never used.
  const ComplexVector residual = y * *x - b;
  if (!(RelativeResidual(y, *x, residual) <= kMaxRelativeResidual))
    return Status::Fail(
        "the network is singular or too ill-conditioned to solve at " +
        HzText(f_hz));
  return Status::Ok();
}

}  // namespace hushgain
