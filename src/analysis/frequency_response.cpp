#include "analysis/frequency_response.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include "analysis/phase.h"

namespace hushgain {
namespace {

// Golden-section search for the maximum of |H| in log f over [a, b] (natural
// logs of frequencies) that holds a maximum inside; updates *best and
// *best_hz when it finds more than *best.
Status RefineMaximum(const GainFunction& gain, double a, double b, double* best,
                     double* best_hz) {
  std::complex<double> h;
  const double g = (std::sqrt(5.0) - 1) / 2;
  double x1 = b - g * (b - a), x2 = a + g * (b - a);
  auto mag = [&](double x, double* m) {
    Status st = gain(std::exp(x), &h);
    *m = std::abs(h);
    return st;
  };
  double m1 = 0, m2 = 0;
  Status status = mag(x1, &m1);
  if (status.ok) status = mag(x2, &m2);
  for (int i = 0; i < 60 && status.ok && b - a > 1e-6; ++i) {
    if (m1 < m2) {
      a = x1;
      x1 = x2;
      m1 = m2;
      x2 = a + g * (b - a);
      status = mag(x2, &m2);
    } else {
      b = x2;
      x2 = x1;
      m2 = m1;
      x1 = b - g * (b - a);
      status = mag(x1, &m1);
    }
  }
  if (!status.ok) return status;
  if (std::max(m1, m2) > *best) {
    *best = std::max(m1, m2);
    *best_hz = std::exp(m1 > m2 ? x1 : x2);
  }
  return Status::Ok();
}

}  // namespace

ResponseMaximum LargestMagnitude(const GainFunction& gain, double f_lo_hz,
                                 double f_hi_hz, int points_per_decade) {
  ResponseMaximum out;
  const double decades = std::log10(f_hi_hz / f_lo_hz);
  const int n =
      std::max(1, static_cast<int>(std::ceil(decades * points_per_decade)));
  std::vector<double> f(n + 1), m(n + 1);
  std::complex<double> h;
  int best = 0;
  for (int i = 0; i <= n; ++i) {
    f[i] = f_lo_hz * std::pow(f_hi_hz / f_lo_hz, static_cast<double>(i) / n);
    out.status = gain(f[i], &h);
    if (!out.status.ok) return out;
    m[i] = std::abs(h);
    if (m[i] > m[best]) best = i;
  }
  out.magnitude = m[best];
  out.f_hz = f[best];
  out.at_low_end = best == 0;
  if (best > 0 && best < n)
    out.status =
        RefineMaximum(gain, std::log(f[best - 1]), std::log(f[best + 1]),
                      &out.magnitude, &out.f_hz);
  return out;
}

ResponseSummary SummarizeResponse(const GainFunction& gain, double f_ref_hz,
                                  double f_max_hz, int points_per_decade) {
  ResponseSummary out;
  std::complex<double> h;
  out.status = gain(f_ref_hz, &h);
  if (!out.status.ok) return out;
  const double reference = std::abs(h);
  const double threshold = reference / std::sqrt(2.0);
  double peak = reference;
  out.peak_hz = f_ref_hz;

  const double step = std::pow(10.0, 1.0 / points_per_decade);
  double f_prev = f_ref_hz;
  // After the -3 dB point the scan goes on for one more decade, so a caller
  // that watches other transfers in `gain` (the noise gain) sees past it.
  double f_stop = f_max_hz * step;
  for (double f = f_ref_hz * step; f <= f_stop; f *= step) {
    out.status = gain(f, &h);
    if (!out.status.ok) return out;
    const double magnitude = std::abs(h);
    if (magnitude > peak) {
      peak = magnitude;
      out.peak_hz = f;
    }
    if (!out.bandwidth_found && magnitude < threshold) {
      // Bisect in log f between f_prev (above threshold) and f (below).
      double lo = f_prev, hi = f;
      for (int i = 0; i < 60 && hi / lo > 1 + 1e-8; ++i) {
        double mid = std::sqrt(lo * hi);
        out.status = gain(mid, &h);
        if (!out.status.ok) return out;
        (std::abs(h) < threshold ? hi : lo) = mid;
      }
      out.bandwidth_3db_hz = std::sqrt(lo * hi);
      out.bandwidth_found = true;
      f_stop = std::min(f_stop, 10.0 * f);
    }
    f_prev = f;
  }
  if (out.peak_hz > f_ref_hz) {
    // Refine around the best sample (one scan step either side).
    out.status =
        RefineMaximum(gain, std::log(out.peak_hz / step),
                      std::log(out.peak_hz * step), &peak, &out.peak_hz);
    if (!out.status.ok) return out;
  }
  out.peaking_db = 20.0 * std::log10(peak / reference);
  return out;
}

QualityFactor SecondOrderQ(const GainFunction& gain, double f_ref_hz,
                           double f_max_hz, int points_per_decade) {
  QualityFactor out;
  std::complex<double> h;
  out.status = gain(f_ref_hz, &h);
  if (!out.status.ok) return out;
  const std::complex<double> h_ref = h;
  // The phase turned, relative to f_ref, unwrapped along the scan.
  double turned = 0, prev_arg = 0, f_prev = f_ref_hz;
  const double step = std::pow(10.0, 1.0 / points_per_decade);
  auto relative_arg = [&](double f, double* arg) {
    Status st = gain(f, &h);
    *arg = std::arg(h / h_ref);
    return st;
  };
  for (double f = f_ref_hz * step; f <= f_max_hz * step; f *= step) {
    double arg = 0;
    out.status = relative_arg(f, &arg);
    if (!out.status.ok) return out;
    const double d = WrapPi(arg - prev_arg);
    const double turned_here = turned + d;
    const double quarter = -kPi / 2;
    if (turned_here <= quarter) {
      double lo = f_prev, hi = f, turned_lo = turned, arg_lo = prev_arg;
      for (int i = 0; i < 80 && hi / lo > 1 + 1e-12; ++i) {
        const double mid = std::sqrt(lo * hi);
        double a = 0;
        out.status = relative_arg(mid, &a);
        if (!out.status.ok) return out;
        const double dm = WrapPi(a - arg_lo);
        if (turned_lo + dm > quarter) {
          lo = mid;
          turned_lo += dm;
          arg_lo = a;
        } else {
          hi = mid;
        }
      }
      out.f90_hz = std::sqrt(lo * hi);
      out.status = gain(out.f90_hz, &h);
      if (!out.status.ok) return out;
      out.q = std::abs(h) / std::abs(h_ref);
      out.found = true;
      return out;
    }
    turned = turned_here;
    prev_arg = arg;
    f_prev = f;
  }
  return out;
}

}  // namespace hushgain
