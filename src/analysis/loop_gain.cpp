#include "analysis/loop_gain.h"

#include <cmath>
#include <cstdio>

#include "analysis/bracketed_root.h"
#include "analysis/phase.h"

namespace hushgain {
namespace {

// The crossover is found to this, in ln f: far below the printed digits.
constexpr double kCrossoverTolerance = 1e-10;

}  // namespace

LoopGainSolver::LoopGainSolver(const MnaSystem& system, int opamp,
                               const OpAmpModel& model)
    : n_(system.size()),
      g_(static_cast<std::size_t>(n_) * n_),
      c_(static_cast<std::size_t>(n_) * n_),
      y_re_(static_cast<std::size_t>(n_) * n_),
      y_im_(static_cast<std::size_t>(n_) * n_),
      lu_(n_),
      b_(ComplexVector::Zero(n_)),
      x_(n_),
      plus_(system.OpAmpPlus(opamp)),
      minus_(system.OpAmpMinus(opamp)),
      inverse_a0_(1.0 / model.open_loop_gain),
      inverse_wt_(1.0 / (2.0 * kPi * model.gbw_hz)) {
  for (int i = 0; i < n_; ++i)
    for (int j = 0; j < n_; ++j) {
      g_[i * n_ + j] = system.g()(i, j);
      c_[i * n_ + j] = system.c()(i, j);
    }
  // Replace the controlled-source row by V_amp = 1.
  const int row = system.OpAmpRow(opamp);
  for (int j = 0; j < n_; ++j) g_[row * n_ + j] = c_[row * n_ + j] = 0;
  g_[row * n_ + system.OpAmpAmplifierNode(opamp)] = 1.0;
  b_[row] = 1.0;
  RealMatrix g_t(n_, n_), c_t(n_, n_);
  for (int i = 0; i < n_; ++i)
    for (int j = 0; j < n_; ++j) {
      g_t(i, j) = g_[j * n_ + i];
      c_t(i, j) = c_[j * n_ + i];
    }
  low_rank_ = std::make_unique<RestampSolver>(g_t, c_t, row);
  if (low_rank_->capacitance_rank() < 0) low_rank_.reset();
}

Status LoopGainSolver::LoopGainAt(double f_hz, Complex* loop_gain) {
  const double w = 2.0 * kPi * f_hz;
  const Complex a = 1.0 / Complex(inverse_a0_, w * inverse_wt_);
  last_low_rank_ = false;
  if (w != 0 && low_rank_ && low_rank_->SolveAdjointWithinLimit(f_hz)) {
    const double* xr = low_rank_->adjoint_real();
    const double* xi = low_rank_->adjoint_imag();
    Complex vd = 0;
    if (plus_ >= 0) vd += Complex(xr[plus_], xi[plus_]);
    if (minus_ >= 0) vd -= Complex(xr[minus_], xi[minus_]);
    last_low_rank_ = true;
    *loop_gain = -a * vd;
    return Status::Ok();
  }
  for (std::size_t i = 0; i < g_.size(); ++i) {
    y_re_[i] = g_[i];
    y_im_[i] = w * c_[i];
  }
  if (!lu_.Factor(y_re_.data(), y_im_.data()))
    return Status::Fail("the loop cannot be solved at " + HzText(f_hz));
  lu_.Solve(b_, &x_);
  if (!x_.allFinite())
    return Status::Fail("the loop cannot be solved at " + HzText(f_hz));
  Complex vd = 0;
  if (plus_ >= 0) vd += x_[plus_];
  if (minus_ >= 0) vd -= x_[minus_];
  *loop_gain = -a * vd;
  return Status::Ok();
}

LoopSummary SummarizeLoop(LoopGainSolver& solver, double f_start_hz,
                          double f_max_hz, int points_per_decade) {
  LoopSummary out;
  Complex t;
  out.status = solver.LoopGainAt(f_start_hz, &t);
  if (!out.status.ok) return out;
  out.dc_loop_gain = t.real();
  double phase = std::arg(t);  // unwrapped, radians
  double f_prev = f_start_hz;
  double mag_prev = std::abs(t);
  double phase_prev = phase;
  const double step = std::pow(10.0, 1.0 / points_per_decade);
  for (double f = f_start_hz * step; f <= f_max_hz * step; f *= step) {
    out.status = solver.LoopGainAt(f, &t);
    if (!out.status.ok) return out;
    phase += WrapPi(std::arg(t) - phase);
    const double mag = std::abs(t);
    if (mag_prev >= 1.0 && mag < 1.0) {
      // Brent's method on ln |T| in ln f; the phase at the crossover is
      // unwrapped from the scan point below it (one step turns it by less
      // than pi).
      Complex t_root = t;
      double u_root = std::log(f), x = 0;
      out.status = FindBracketedRoot(
          [&](double u, double* value) {
            Status st = solver.LoopGainAt(std::exp(u), &t_root);
            u_root = u;
            *value = std::log(std::abs(t_root));
            return st;
          },
          std::log(f_prev), std::log(mag_prev), std::log(f), std::log(mag),
          kCrossoverTolerance, &x);
      if (!out.status.ok) return out;
      out.crossover_hz = std::exp(x);
      if (x != u_root) {
        out.status = solver.LoopGainAt(out.crossover_hz, &t_root);
        if (!out.status.ok) return out;
      }
      const double phase_root =
          phase_prev + WrapPi(std::arg(t_root) - phase_prev);
      out.crossover_found = true;
      out.phase_margin_deg = 180.0 + phase_root * 180.0 / kPi;
      return out;
    }
    f_prev = f;
    mag_prev = mag;
    phase_prev = phase;
  }
  return out;
}

}  // namespace hushgain
