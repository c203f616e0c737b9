#include "analysis/restamp_solver.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <type_traits>

#include "base/physical_constants.h"

namespace hushgain {
namespace {

// Stamps a conductance into a row-major transposed matrix (the stamp is
// symmetric, so transposing changes nothing).
void Stamp(std::vector<double>& m, int n, int a, int b, double g) {
  if (a >= 0) m[a * n + a] += g;
  if (b >= 0) m[b * n + b] += g;
  if (a >= 0 && b >= 0) {
    m[a * n + b] -= g;
    m[b * n + a] -= g;
  }
}

std::string Hz(double f_hz) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.6g Hz", f_hz);
  return buf;
}

// The factorization and both triangular solves, for a size known at
// compile time (N > 0: the loops unroll) or at run time (N = 0). kReal (at
// DC, w = 0) leaves out the imaginary parts, all zero there, and keeps
// 1 / U_kk of each pivot in inv_diag (one division a pivot).
template <int N, bool kReal>
bool FactorAndSolve(int runtime_n, double w, const double* __restrict g_t,
                    const double* __restrict c_t, int output,
                    double* __restrict ar, double* __restrict ai,
                    int* __restrict pivot, double* __restrict row_scale,
                    double* __restrict inv_diag, double* __restrict zr,
                    double* __restrict zi) {
  const int n = N > 0 ? N : runtime_n;
  // Form A = Y^T and equilibrate its rows to a largest entry of 1 (NaN
  // entries skipped, as std::fmax does).
  for (int i = 0; i < n; ++i) {
    double largest = 0;
    for (int j = 0; j < n; ++j) {
      const double re = g_t[i * n + j];
      ar[i * n + j] = re;
      double m = std::fabs(re);
      if constexpr (!kReal) {
        const double im = w * c_t[i * n + j];
        ai[i * n + j] = im;
        m += std::fabs(im);
      }
      if (m > largest) largest = m;
    }
    const double s = largest > 0 ? 1.0 / largest : 1.0;
    row_scale[i] = s;
    for (int j = 0; j < n; ++j) {
      ar[i * n + j] *= s;
      if constexpr (!kReal) ai[i * n + j] *= s;
    }
  }
  if constexpr (kReal) {
    for (int k = 0; k < n; ++k) {
      int p = k;
      double best = std::fabs(ar[k * n + k]);
      for (int i = k + 1; i < n; ++i) {
        const double m = std::fabs(ar[i * n + k]);
        if (m > best) best = m, p = i;
      }
      if (!(best > 1e-300) || !std::isfinite(best)) return false;
      pivot[k] = p;
      if (p != k)
        for (int j = 0; j < n; ++j) std::swap(ar[k * n + j], ar[p * n + j]);
      const double inv_r = 1.0 / ar[k * n + k];
      inv_diag[k] = inv_r;
      for (int i = k + 1; i < n; ++i) {
        const double xr = ar[i * n + k];
        if (xr == 0) continue;
        const double lr = xr * inv_r;
        ar[i * n + k] = lr;
        for (int j = k + 1; j < n; ++j) ar[i * n + j] -= lr * ar[k * n + j];
      }
    }
    for (int i = 0; i < n; ++i) zr[i] = zi[i] = 0;
    if (output >= 0) zr[output] = row_scale[output];
    for (int k = 0; k < n; ++k)
      if (pivot[k] != k) std::swap(zr[k], zr[pivot[k]]);
    // By columns: the rows below (above) a solved entry update at once, a
    // chain of n steps instead of n^2 / 2.
    for (int j = 0; j < n; ++j)
      for (int i = j + 1; i < n; ++i) zr[i] -= ar[i * n + j] * zr[j];
    for (int j = n - 1; j >= 0; --j) {
      zr[j] *= inv_diag[j];
      for (int i = 0; i < j; ++i) zr[i] -= ar[i * n + j] * zr[j];
    }
    for (int i = 0; i < n; ++i)
      if (!std::isfinite(zr[i])) return false;
    return true;
  }
  // LU with partial pivoting (by |re| + |im|), in place.
  for (int k = 0; k < n; ++k) {
    int p = k;
    double best = std::fabs(ar[k * n + k]) + std::fabs(ai[k * n + k]);
    for (int i = k + 1; i < n; ++i) {
      const double m = std::fabs(ar[i * n + k]) + std::fabs(ai[i * n + k]);
      if (m > best) best = m, p = i;
    }
    if (!(best > 1e-300) || !std::isfinite(best)) return false;
    pivot[k] = p;
    if (p != k)
      for (int j = 0; j < n; ++j) {
        std::swap(ar[k * n + j], ar[p * n + j]);
        std::swap(ai[k * n + j], ai[p * n + j]);
      }
    // 1 / pivot.
    const double pr = ar[k * n + k], pi = ai[k * n + k];
    const double d = pr * pr + pi * pi;
    const double inv_r = pr / d, inv_i = -pi / d;
    for (int i = k + 1; i < n; ++i) {
      const double xr = ar[i * n + k], xi = ai[i * n + k];
      if (xr == 0 && xi == 0) continue;
      const double lr = xr * inv_r - xi * inv_i;
      const double li = xr * inv_i + xi * inv_r;
      ar[i * n + k] = lr;
      ai[i * n + k] = li;
      for (int j = k + 1; j < n; ++j) {
        const double ur = ar[k * n + j], ui = ai[k * n + j];
        ar[i * n + j] -= lr * ur - li * ui;
        ai[i * n + j] -= lr * ui + li * ur;
      }
    }
  }
  // Right-hand side: e_out, row-scaled and permuted.
  for (int i = 0; i < n; ++i) zr[i] = zi[i] = 0;
  if (output >= 0) zr[output] = row_scale[output];
  for (int k = 0; k < n; ++k)
    if (pivot[k] != k) {
      std::swap(zr[k], zr[pivot[k]]);
      std::swap(zi[k], zi[pivot[k]]);
    }
  for (int i = 1; i < n; ++i) {  // L y = b (unit lower)
    double sr = zr[i], si = zi[i];
    for (int j = 0; j < i; ++j) {
      const double lr = ar[i * n + j], li = ai[i * n + j];
      sr -= lr * zr[j] - li * zi[j];
      si -= lr * zi[j] + li * zr[j];
    }
    zr[i] = sr, zi[i] = si;
  }
  for (int i = n - 1; i >= 0; --i) {  // U z = y
    double sr = zr[i], si = zi[i];
    for (int j = i + 1; j < n; ++j) {
      const double ur = ar[i * n + j], ui = ai[i * n + j];
      sr -= ur * zr[j] - ui * zi[j];
      si -= ur * zi[j] + ui * zr[j];
    }
    const double pr = ar[i * n + i], pi = ai[i * n + i];
    const double d = pr * pr + pi * pi;
    zr[i] = (sr * pr + si * pi) / d;
    zi[i] = (si * pr - sr * pi) / d;
  }
  for (int i = 0; i < n; ++i)
    if (!std::isfinite(zr[i]) || !std::isfinite(zi[i])) return false;
  return true;
}

// G^T x = b with a real factorization P D G^T = L U of FactorAndSolve (D
// the row scaling, P the exchanges, 1 / U_kk in inv_diag), b overwritten.
template <int N>
void SolveFactored(int runtime_n, const double* __restrict lu,
                   const double* __restrict scale, const int* __restrict pivot,
                   const double* __restrict inv_diag, double* __restrict b) {
  const int n = N > 0 ? N : runtime_n;
  for (int i = 0; i < n; ++i) b[i] *= scale[i];
  for (int k = 0; k < n; ++k)
    if (pivot[k] != k) std::swap(b[k], b[pivot[k]]);
  for (int j = 0; j < n; ++j)  // by columns, as in FactorAndSolve
    for (int i = j + 1; i < n; ++i) b[i] -= lu[i * n + j] * b[j];
  for (int j = n - 1; j >= 0; --j) {
    b[j] *= inv_diag[j];
    for (int i = 0; i < j; ++i) b[i] -= lu[i * n + j] * b[j];
  }
}

// Calls f(std::integral_constant<int, n>) for the sizes the solver unrolls
// (4 to 10) and f(std::integral_constant<int, 0>) for the others.
template <class F>
auto WithSize(int n, F&& f) {
  switch (n) {
    case 4:
      return f(std::integral_constant<int, 4>{});
    case 5:
      return f(std::integral_constant<int, 5>{});
    case 6:
      return f(std::integral_constant<int, 6>{});
    case 7:
      return f(std::integral_constant<int, 7>{});
    case 8:
      return f(std::integral_constant<int, 8>{});
    case 9:
      return f(std::integral_constant<int, 9>{});
    case 10:
      return f(std::integral_constant<int, 10>{});
    default:
      return f(std::integral_constant<int, 0>{});
  }
}

// (I + j w K) y = y0 by Gaussian elimination with partial pivoting, then
// z = z0 - j w W y (K = kk, r x r row-major; W = wm, n x r column-major),
// for a rank known at compile time (R > 0: the loops unroll) or at run
// time (R = 0, r at most 8). False on a zero pivot.
template <int R>
bool SolveWoodbury(int runtime_r, int n, double w, const double* __restrict kk,
                   const double* __restrict y0, const double* __restrict wm,
                   const double* __restrict z0, double* __restrict zr,
                   double* __restrict zi) {
  const int r = R > 0 ? R : runtime_r;
  // (I + j w K) y = y0, by Gaussian elimination with partial pivoting
  // (r is at most n / 2).
  double mr[64], mi[64], yr[8], yi[8], inv_r[8], inv_i[8];
  for (int i = 0; i < r; ++i) {
    for (int j = 0; j < r; ++j) {
      mr[i * r + j] = i == j ? 1.0 : 0.0;
      mi[i * r + j] = w * kk[i * r + j];
    }
    yr[i] = y0[i];
    yi[i] = 0;
  }
  for (int k = 0; k < r; ++k) {
    int p = k;
    double best = std::fabs(mr[k * r + k]) + std::fabs(mi[k * r + k]);
    for (int i = k + 1; i < r; ++i) {
      const double m = std::fabs(mr[i * r + k]) + std::fabs(mi[i * r + k]);
      if (m > best) best = m, p = i;
    }
    if (!(best > 1e-300)) return false;
    if (p != k) {
      for (int j = 0; j < r; ++j)
        std::swap(mr[k * r + j], mr[p * r + j]),
            std::swap(mi[k * r + j], mi[p * r + j]);
      std::swap(yr[k], yr[p]);
      std::swap(yi[k], yi[p]);
    }
    // 1 / U_kk = conj(U_kk) / |U_kk|^2, kept for the back substitution.
    const double pr = mr[k * r + k], pi = mi[k * r + k];
    const double inv_d = 1.0 / (pr * pr + pi * pi);
    inv_r[k] = pr * inv_d;
    inv_i[k] = -pi * inv_d;
    for (int i = k + 1; i < r; ++i) {
      const double xr = mr[i * r + k], xi = mi[i * r + k];
      const double lr = xr * inv_r[k] - xi * inv_i[k];
      const double li = xr * inv_i[k] + xi * inv_r[k];
      for (int j = k + 1; j < r; ++j) {
        mr[i * r + j] -= lr * mr[k * r + j] - li * mi[k * r + j];
        mi[i * r + j] -= lr * mi[k * r + j] + li * mr[k * r + j];
      }
      yr[i] -= lr * yr[k] - li * yi[k];
      yi[i] -= lr * yi[k] + li * yr[k];
    }
  }
  for (int i = r - 1; i >= 0; --i) {
    double sr = yr[i], si = yi[i];
    for (int j = i + 1; j < r; ++j) {
      sr -= mr[i * r + j] * yr[j] - mi[i * r + j] * yi[j];
      si -= mr[i * r + j] * yi[j] + mi[i * r + j] * yr[j];
    }
    yr[i] = sr * inv_r[i] - si * inv_i[i];
    yi[i] = sr * inv_i[i] + si * inv_r[i];
  }
  // z = z0 - j w W y.
  for (int m = 0; m < n; ++m) {
    double ar = 0, ai = 0;
    for (int c = 0; c < r; ++c)
      ar += wm[c * n + m] * yr[c], ai += wm[c * n + m] * yi[c];
    zr[m] = z0[m] + w * ai;
    zi[m] = -w * ar;
  }
  return true;
}

}  // namespace

RestampSolver::RestampSolver(const RealMatrix& g, const RealMatrix& c,
                             int output)
    : n_(static_cast<int>(g.rows())), output_(output) {
  const int n = n_;
  g_base_t_.assign(n * n, 0.0);
  c_t_.assign(n * n, 0.0);
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      g_base_t_[i * n + j] = g(j, i);
      c_t_[i * n + j] = c(j, i);
    }
  c_base_t_ = c_t_;
  rest_.assign(n * n, 0.0);
  col_.assign(n, 0.0);
  row_.assign(n, 0.0);
  p_.reserve(n * 9);
  q_.reserve(n * 9);
  SplitCapacitance();
  g_t_ = g_base_t_;
  ar_.assign(n * n, 0.0);
  ai_.assign(n * n, 0.0);
  pivot_.assign(n, 0);
  row_scale_.assign(n, 1.0);
  inv_diag_.assign(n, 0.0);
  zr_.assign(n + 1, 0.0);  // [n]: ground, always 0
  zi_.assign(n + 1, 0.0);
}

RestampSolver::RestampSolver(const MnaSystem& system, const Netlist& netlist)
    : RestampSolver(system.g(), system.c(), system.output_index()) {
  // The resistors' and capacitors' stamps taken out of the bases (G^T and
  // C^T as built stay in g_t_ and c_t_ until new values are set).
  const int n = n_;
  std::vector<double> magnitude(n * n, 0.0);
  for (const Resistor& r : netlist.resistors) {
    const int a = system.NodeIndex(r.a), b = system.NodeIndex(r.b);
    nodes_.push_back({a, b});
    Stamp(g_base_t_, n, a, b, -1.0 / r.ohms);
    Stamp(magnitude, n, a, b, 1.0 / r.ohms);
  }
  // Entries that held only resistor stamps are left with rounding residue.
  for (int i = 0; i < n * n; ++i)
    if (std::fabs(g_base_t_[i]) <= 1e-12 * std::fabs(magnitude[i]))
      g_base_t_[i] = 0;
  c_base_t_ = c_t_;
  std::vector<double> c_magnitude(n * n, 0.0);
  for (const Capacitor& c : netlist.capacitors) {
    const int a = system.NodeIndex(c.a), b = system.NodeIndex(c.b);
    cap_nodes_.push_back({a, b});
    Stamp(c_base_t_, n, a, b, -c.farads);
    Stamp(c_magnitude, n, a, b, c.farads);
  }
  for (int i = 0; i < n * n; ++i)
    if (std::fabs(c_base_t_[i]) <= 1e-12 * std::fabs(c_magnitude[i]))
      c_base_t_[i] = 0;
}

double RestampSolver::Residual(double f_hz) const {
  const int n = n_;
  const double w = 2.0 * kPi * f_hz;
  double row_sum_max = 0, z_max = 0, r_max = 0;
  for (int i = 0; i < n; ++i)
    z_max = std::max(z_max, std::fabs(zr_[i]) + std::fabs(zi_[i]));
  for (int i = 0; i < n; ++i) {
    double sr = i == output_ ? -1.0 : 0.0, si = 0, sum = 0;
    for (int j = 0; j < n; ++j) {
      const double gr = g_t_[i * n + j], gi = w * c_t_[i * n + j];
      sr += gr * zr_[j] - gi * zi_[j];
      si += gr * zi_[j] + gi * zr_[j];
      sum += std::fabs(gr) + std::fabs(gi);
    }
    row_sum_max = std::max(row_sum_max, sum);
    r_max = std::max(r_max, std::fabs(sr) + std::fabs(si));
  }
  return r_max / (row_sum_max * z_max + 1.0);
}

bool RestampSolver::SolveAdjointWithinLimit(double f_hz) {
  if (!SolveAdjoint(f_hz).ok) return false;
  for (int i = 0; i < n_; ++i)
    if (!std::isfinite(zr_[i]) || !std::isfinite(zi_[i])) return false;
  return Residual(f_hz) <= kLowRankResidualLimit;
}

void RestampSolver::SplitCapacitance() {
  // Split C^T = P Q^T by elimination with complete pivoting.
  const int n = n_;
  rank_ = 0;
  p_.clear();
  q_.clear();
  rest_ = c_t_;
  double largest = 0;
  for (double v : rest_) largest = std::fmax(largest, std::fabs(v));
  while (largest > 0 && rank_ <= std::min(n / 2, 8)) {
    int bi = 0, bj = 0;
    double best = 0;
    for (int i = 0; i < n; ++i)
      for (int j = 0; j < n; ++j)
        if (std::fabs(rest_[i * n + j]) > best)
          best = std::fabs(rest_[i * n + j]), bi = i, bj = j;
    if (best <= 1e-13 * largest) break;
    const double pivot = rest_[bi * n + bj];
    for (int i = 0; i < n; ++i) col_[i] = rest_[i * n + bj] / pivot;
    for (int j = 0; j < n; ++j) row_[j] = rest_[bi * n + j];
    for (int i = 0; i < n; ++i)
      for (int j = 0; j < n; ++j) rest_[i * n + j] -= col_[i] * row_[j];
    p_.insert(p_.end(), col_.begin(), col_.end());
    q_.insert(q_.end(), row_.begin(), row_.end());
    ++rank_;
  }
  if (rank_ > std::min(n / 2, 8)) {  // not worth it: the dense path
    rank_ = -1;
    p_.clear();
    q_.clear();
  }
}

void RestampSolver::SetCapacitors(const double* farads) {
  prepared_ = false;
  c_t_ = c_base_t_;
  for (std::size_t k = 0; k < cap_nodes_.size(); ++k)
    Stamp(c_t_, n_, cap_nodes_[k].first, cap_nodes_[k].second, farads[k]);
  SplitCapacitance();
}

void RestampSolver::SetResistors(const double* ohms) {
  prepared_ = false;
  g_t_ = g_base_t_;
  for (std::size_t k = 0; k < nodes_.size(); ++k)
    Stamp(g_t_, n_, nodes_[k].first, nodes_[k].second, 1.0 / ohms[k]);
}

void RestampSolver::SolveDc(double* b) const {
  WithSize(n_, [&](auto size) {
    SolveFactored<decltype(size)::value>(n_, dc_lu_.data(), dc_scale_.data(),
                                         dc_pivot_.data(), dc_inv_diag_.data(),
                                         b);
  });
}

Status RestampSolver::Prepare() { return SolveAdjoint(0.0); }

void RestampSolver::KeepDcFactorization() {
  const int n = n_, r = rank_;
  dc_lu_ = ar_;
  dc_inv_diag_ = inv_diag_;
  dc_scale_ = row_scale_;
  dc_pivot_ = pivot_;
  dc_z0_ = zr_;
  w_.assign(p_.begin(), p_.end());
  for (int c = 0; c < r; ++c) SolveDc(&w_[c * n]);
  k_.assign(r * r, 0.0);
  y0_.assign(r, 0.0);
  for (int i = 0; i < r; ++i) {
    for (int j = 0; j < r; ++j) {
      double sum = 0;
      for (int m = 0; m < n; ++m) sum += q_[i * n + m] * w_[j * n + m];
      k_[i * r + j] = sum;
    }
    double sum = 0;
    for (int m = 0; m < n; ++m) sum += q_[i * n + m] * dc_z0_[m];
    y0_[i] = sum;
  }
  if (r <= 2) {
    // K, y0 and W padded to rank 2 with zeros. M = I + j w K has
    //   det M = 1 - w^2 det K + j w tr K,
    //   adj(M) y0 = y0 + j w a,  a = (k11 y0_0 - k01 y0_1,
    //                                 k00 y0_1 - k10 y0_0),
    // so W y = (u + j w v) / det M with u = W y0, v = W a (Cramer's rule,
    // forward stable for two unknowns).
    const auto at = [&](const std::vector<double>& v, int i) {
      return i < static_cast<int>(v.size()) ? v[i] : 0.0;
    };
    const double k00 = at(k_, 0), k01 = r == 2 ? k_[1] : 0.0;
    const double k10 = r == 2 ? k_[2] : 0.0, k11 = r == 2 ? k_[3] : 0.0;
    const double y0 = at(y0_, 0), y1 = at(y0_, 1);
    det_k_ = k00 * k11 - k01 * k10;
    trace_k_ = k00 + k11;
    const double a0 = k11 * y0 - k01 * y1, a1 = k00 * y1 - k10 * y0;
    low_u_.assign(n + 1, 0.0);  // [n]: ground
    low_v_.assign(n + 1, 0.0);
    for (int m = 0; m < n; ++m) {
      const double w0 = r >= 1 ? w_[m] : 0.0;
      const double w1 = r == 2 ? w_[n + m] : 0.0;
      low_u_[m] = w0 * y0 + w1 * y1;
      low_v_[m] = w0 * a0 + w1 * a1;
    }
    const std::size_t ports = norm_ports_.size();
    port_t0_.resize(ports);
    port_u_.resize(ports);
    port_v_.resize(ports);
    for (std::size_t k = 0; k < ports; ++k) {
      const auto [a, b] = norm_ports_[k];
      port_t0_[k] = dc_z0_[a] - dc_z0_[b];
      port_u_[k] = low_u_[a] - low_u_[b];
      port_v_[k] = low_v_[a] - low_v_[b];
    }
  }
  prepared_ = true;
}

Status RestampSolver::SolveAdjoint(double f_hz) {
  const double w = 2.0 * kPi * f_hz;
  if (w != 0 && rank_ >= 0) {
    if (!prepared_) {
      Status s = Prepare();
      if (!s.ok) return s;
    }
    bool ok = false;
    switch (rank_) {
      case 0:
      case 1:
      case 2: {
        // z = z0 - j w W y, W y = (u + j w v) / det M (KeepDcFactorization).
        const double dr = 1.0 - w * w * det_k_, di = w * trace_k_;
        const double d2 = dr * dr + di * di;
        ok = d2 > 1e-300 && std::isfinite(d2);
        const double inv = 1.0 / d2, ir = dr * inv, ii = -di * inv;
        const double* u = low_u_.data();
        const double* v = low_v_.data();
        for (int m = 0; m < n_; ++m) {
          const double wv = w * v[m];
          const double re = u[m] * ir - wv * ii;
          const double im = u[m] * ii + wv * ir;
          zr_[m] = dc_z0_[m] + w * im;
          zi_[m] = -w * re;
        }
        break;
      }
      case 3:
        ok = SolveWoodbury<3>(rank_, n_, w, k_.data(), y0_.data(), w_.data(),
                              dc_z0_.data(), zr_.data(), zi_.data());
        break;
      case 4:
        ok = SolveWoodbury<4>(rank_, n_, w, k_.data(), y0_.data(), w_.data(),
                              dc_z0_.data(), zr_.data(), zi_.data());
        break;
      default:
        ok = SolveWoodbury<0>(rank_, n_, w, k_.data(), y0_.data(), w_.data(),
                              dc_z0_.data(), zr_.data(), zi_.data());
        break;
    }
    if (!ok) return Status::Fail("the network is singular at " + Hz(f_hz));
    return Status::Ok();
  }
  real_only_ = w == 0;
  const bool ok = WithSize(n_, [&](auto size) {
    constexpr int kN = decltype(size)::value;
    return real_only_
               ? FactorAndSolve<kN, true>(
                     n_, w, g_t_.data(), c_t_.data(), output_, ar_.data(),
                     ai_.data(), pivot_.data(), row_scale_.data(),
                     inv_diag_.data(), zr_.data(), zi_.data())
               : FactorAndSolve<kN, false>(
                     n_, w, g_t_.data(), c_t_.data(), output_, ar_.data(),
                     ai_.data(), pivot_.data(), row_scale_.data(),
                     inv_diag_.data(), zr_.data(), zi_.data());
  });
  if (!ok) return Status::Fail("the network is singular at " + Hz(f_hz));
  if (w == 0 && rank_ >= 0) KeepDcFactorization();
  return Status::Ok();
}

void RestampSolver::SetNormPorts(const std::vector<Port>& ports) {
  prepared_ = false;
  norm_ports_.clear();
  for (const Port& p : ports)
    norm_ports_.push_back(
        {p.plus >= 0 ? p.plus : n_, p.minus >= 0 ? p.minus : n_});
}

Status RestampSolver::TransferNorms(double f_hz, double* norms) {
  const double w = 2.0 * kPi * f_hz;
  const std::size_t ports = norm_ports_.size();
  if (w != 0 && rank_ >= 0 && rank_ <= 2) {
    if (!prepared_) {
      Status s = Prepare();
      if (!s.ok) return s;
    }
    // H = t0 - j w (u + j w v) / det M for each port (SolveAdjoint's
    // rank-2 branch, taken port by port).
    const double dr = 1.0 - w * w * det_k_, di = w * trace_k_;
    const double d2 = dr * dr + di * di;
    if (!(d2 > 1e-300 && std::isfinite(d2)))
      return Status::Fail("the network is singular at " + Hz(f_hz));
    const double inv = 1.0 / d2, ir = dr * inv, ii = -di * inv;
    const double* t0 = port_t0_.data();
    const double* u = port_u_.data();
    const double* v = port_v_.data();
    for (std::size_t k = 0; k < ports; ++k) {
      const double wv = w * v[k];
      const double re = u[k] * ir - wv * ii;
      const double im = u[k] * ii + wv * ir;
      const double hr = t0[k] + w * im, hi = -w * re;
      norms[k] = hr * hr + hi * hi;
    }
    return Status::Ok();
  }
  Status s = SolveAdjoint(f_hz);
  if (!s.ok) return s;
  for (std::size_t k = 0; k < ports; ++k) {
    const auto [a, b] = norm_ports_[k];
    const double re = zr_[a] - zr_[b], im = zi_[a] - zi_[b];
    norms[k] = re * re + im * im;
  }
  return Status::Ok();
}

void RestampSolver::SolveDirectDc(double* b) {
  // The factorization is P D G^T = L U (D the row scaling, P the row
  // exchanges), so G = U^T L^T P D^-1 and G x = b is U^T y = b, L^T w = y,
  // x = D P^T w.
  const int n = n_;
  const double* ar = ar_.data();
  for (int i = 0; i < n; ++i) {  // U^T y = b: lower triangular
    double s = b[i];
    for (int j = 0; j < i; ++j) s -= ar[j * n + i] * b[j];
    b[i] = s * inv_diag_[i];
  }
  for (int i = n - 1; i >= 0; --i) {  // L^T w = y: unit upper
    double s = b[i];
    for (int j = i + 1; j < n; ++j) s -= ar[j * n + i] * b[j];
    b[i] = s;
  }
  for (int k = n - 1; k >= 0; --k)  // undo the row exchanges: P^T
    if (pivot_[k] != k) std::swap(b[k], b[pivot_[k]]);
  for (int i = 0; i < n; ++i) b[i] *= row_scale_[i];  // D
}

}  // namespace hushgain
