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
      work_re_(n),
      work_im_(n) {}

bool SmallComplexLu::Factor(const ComplexMatrix& a) {
  const int n = n_;
  double* ar = re_.data();
  double* ai = im_.data();
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      ar[i * n + j] = a(i, j).real();
      ai[i * n + j] = a(i, j).imag();
    }
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
    // (sr + j si) / (pr + j pi), Smith's division.
    const double pr = ar[i * n + i], pi = ai[i * n + i];
    if (std::fabs(pr) >= std::fabs(pi)) {
      const double r = pi / pr, d = pr + pi * r;
      zr[i] = (sr + si * r) / d;
      zi[i] = (si - sr * r) / d;
    } else {
      const double r = pr / pi, d = pr * r + pi;
      zr[i] = (sr * r + si) / d;
      zi[i] = (si * r - sr) / d;
    }
  }
  x->resize(n);
  for (int i = 0; i < n; ++i) (*x)[i] = Complex(zr[i], zi[i]);
}

double SmallComplexLu::SmallestPivot() const {
  double m = INFINITY;
  for (int k = 0; k < n_; ++k)
    m = std::min(m, std::hypot(re_[k * n_ + k], im_[k * n_ + k]));
  return m;
}

double SmallComplexLu::LargestPivot() const {
  double m = 0;
  for (int k = 0; k < n_; ++k)
    m = std::max(m, std::hypot(re_[k * n_ + k], im_[k * n_ + k]));
  return m;
}

}  // namespace hushgain
