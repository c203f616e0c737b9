#include "analysis/small_complex_lu.h"

#include <algorithm>
#include <cmath>
#include <utility>

namespace hushgain {

SmallComplexLu::SmallComplexLu(int n)
    : n_(n),
      re_(static_cast<std::size_t>(n) * n),
      im_(static_cast<std::size_t>(n) * n),
      pivot_(n),
      inverse_re_(n),
      inverse_im_(n),
      work_matrix_re_(static_cast<std::size_t>(n) * n),
      work_matrix_im_(static_cast<std::size_t>(n) * n),
      work_re_(n),
      work_im_(n) {}

bool SmallComplexLu::Factor(const ComplexMatrix& a) {
  const int n = n_;
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      work_matrix_re_[i * n + j] = a(i, j).real();
      work_matrix_im_[i * n + j] = a(i, j).imag();
    }
  return Factor(work_matrix_re_.data(), work_matrix_im_.data());
}

bool SmallComplexLu::Factor(const double* re, const double* im) {
  const int n = n_;
  double* ar = re_.data();
  double* ai = im_.data();
  std::copy(re, re + n * n, ar);
  std::copy(im, im + n * n, ai);
  for (int k = 0; k < n; ++k) {
    int p = k;
    double best = std::fabs(ar[k * n + k]) + std::fabs(ai[k * n + k]);
    for (int i = k + 1; i < n; ++i) {
      const double m = std::fabs(ar[i * n + k]) + std::fabs(ai[i * n + k]);
      if (m > best) best = m, p = i;
    }
    if (!(best > 0) || !std::isfinite(best)) return false;
    pivot_[k] = p;
    if (p != k)
      for (int j = 0; j < n; ++j) {
        std::swap(ar[k * n + j], ar[p * n + j]);
        std::swap(ai[k * n + j], ai[p * n + j]);
      }
    // 1 / pivot, scaled by the larger part so that neither square
    // overflows nor underflows (Smith's division).
    const double pr = ar[k * n + k], pi = ai[k * n + k];
    double inv_r, inv_i;
    if (std::fabs(pr) >= std::fabs(pi)) {
      const double r = pi / pr, d = pr + pi * r;
      inv_r = 1 / d;
      inv_i = -r / d;
    } else {
      const double r = pr / pi, d = pr * r + pi;
      inv_r = r / d;
      inv_i = -1 / d;
    }
    inverse_re_[k] = inv_r;
    inverse_im_[k] = inv_i;
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
  return true;
}

void SmallComplexLu::Solve(const ComplexVector& b, ComplexVector* x) const {
  const int n = n_;
  const double* ar = re_.data();
  const double* ai = im_.data();
  double* zr = work_re_.data();
  double* zi = work_im_.data();
  for (int i = 0; i < n; ++i) {
    zr[i] = b[i].real();
    zi[i] = b[i].imag();
  }
  for (int k = 0; k < n; ++k)
    if (pivot_[k] != k) {
      std::swap(zr[k], zr[pivot_[k]]);
      std::swap(zi[k], zi[pivot_[k]]);
    }
  for (int i = 1; i < n; ++i) {  // L y = P b (unit lower)
    double sr = zr[i], si = zi[i];
    for (int j = 0; j < i; ++j) {
      const double lr = ar[i * n + j], li = ai[i * n + j];
      sr -= lr * zr[j] - li * zi[j];
      si -= lr * zi[j] + li * zr[j];
    }
    zr[i] = sr, zi[i] = si;
  }
  for (int i = n - 1; i >= 0; --i) {  // U x = y
    double sr = zr[i], si = zi[i];
    for (int j = i + 1; j < n; ++j) {
      const double ur = ar[i * n + j], ui = ai[i * n + j];
      sr -= ur * zr[j] - ui * zi[j];
      si -= ur * zi[j] + ui * zr[j];
    }
    // Times 1 / U(i, i), kept from the factorization: a division costs
    // more than the whole row's products.
    const double ir = inverse_re_[i], ii = inverse_im_[i];
    zr[i] = sr * ir - si * ii;
    zi[i] = sr * ii + si * ir;
  }
  x->resize(n);
  for (int i = 0; i < n; ++i) (*x)[i] = Complex(zr[i], zi[i]);
}

// The pivots' moduli without hypot: sqrt(re^2 + im^2) is exact to rounding
// unless the squares overflow or underflow, for moduli beyond 1e+-150, far
// outside any threshold the solvers compare them with (such a pivot reads
// as infinity or 0).
double SmallComplexLu::PivotModulus(int k) const {
  const double re = re_[k * n_ + k], im = im_[k * n_ + k];
  return std::sqrt(re * re + im * im);
}

double SmallComplexLu::SmallestPivot() const {
  double m = INFINITY;
  for (int k = 0; k < n_; ++k) m = std::min(m, PivotModulus(k));
  return m;
}

double SmallComplexLu::LargestPivot() const {
  double m = 0;
  for (int k = 0; k < n_; ++k) m = std::max(m, PivotModulus(k));
  return m;
}

}  // namespace hushgain
