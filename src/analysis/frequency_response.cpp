#include "analysis/frequency_response.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include "analysis/bracketed_root.h"
#include "analysis/phase.h"

namespace hushgain {
namespace {

// The -3 dB corners and the -90 degree point are found to this, in ln f:
// far below the printed digits, a few solves more than 1e-8 would cost.
constexpr double kCrossingTolerance = 1e-10;
constexpr double kQuarterTurnTolerance = 1e-12;

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

// The crossing of |H| through `threshold` between `inside` (|H| =
// m_inside >= threshold) and `outside` (|H| = m_outside < threshold), either
// order: Brent's method on ln |H| - ln threshold in ln f, to
// kCrossingTolerance.
Status RefineCrossing(const GainFunction& gain, double threshold, double inside,
                      double m_inside, double outside, double m_outside,
                      double* f_hz) {
  std::complex<double> h;
  const double log_threshold = std::log(threshold);
  double x = 0;
  Status status = FindBracketedRoot(
      [&](double u, double* value) {
        Status st = gain(std::exp(u), &h);
        *value = std::log(std::abs(h)) - log_threshold;
        return st;
      },
      std::log(inside), std::log(m_inside) - log_threshold, std::log(outside),
      std::log(m_outside) - log_threshold, kCrossingTolerance, &x);
  if (!status.ok) return status;
  *f_hz = std::exp(x);
  return Status::Ok();
}

}  // namespace

ResponseMaximum LargestSampledMagnitude(const GainFunction& gain,
                                        const std::vector<double>& f_hz,
                                        const std::vector<double>& magnitude) {
  ResponseMaximum out;
  const int n = static_cast<int>(f_hz.size()) - 1;
  int best = 0;
  for (int i = 1; i <= n; ++i)
    if (magnitude[i] > magnitude[best]) best = i;
  out.magnitude = magnitude[best];
  out.f_hz = f_hz[best];
  out.at_low_end = best == 0;
  if (best > 0 && best < n)
    out.status =
        RefineMaximum(gain, std::log(f_hz[best - 1]), std::log(f_hz[best + 1]),
                      &out.magnitude, &out.f_hz);
  return out;
}

ResponseMaximum LargestMagnitude(const GainFunction& gain, double f_lo_hz,
                                 double f_hi_hz, int points_per_decade) {
  const double decades = std::log10(f_hi_hz / f_lo_hz);
  const int n =
      std::max(1, static_cast<int>(std::ceil(decades * points_per_decade)));
  std::vector<double> f(n + 1), m(n + 1);
  std::complex<double> h;
  for (int i = 0; i <= n; ++i) {
    f[i] = f_lo_hz * std::pow(f_hi_hz / f_lo_hz, static_cast<double>(i) / n);
    Status status = gain(f[i], &h);
    if (!status.ok) {
      ResponseMaximum out;
      out.status = status;
      return out;
    }
    m[i] = std::abs(h);
  }
  return LargestSampledMagnitude(gain, f, m);
}

PassbandResponse SummarizePassband(const GainFunction& gain, double band_low_hz,
                                   double band_high_hz, double f_lo_hz,
                                   double f_max_hz, int points_per_decade) {
  PassbandResponse out;
  std::complex<double> h;
  out.status = gain(0.0, &h);
  if (!out.status.ok) return out;
  out.dc_gain = std::abs(h);
  const ResponseMaximum in_band =
      LargestMagnitude(gain, band_low_hz, band_high_hz, points_per_decade);
  if (!in_band.status.ok) {
    out.status = in_band.status;
    return out;
  }
  out.blocks_dc = out.dc_gain < in_band.magnitude / std::sqrt(2.0);
  out.passband_gain = out.blocks_dc ? in_band.magnitude : out.dc_gain;
  out.passband_hz = out.blocks_dc ? in_band.f_hz : 0.0;
  const double threshold = out.passband_gain / std::sqrt(2.0);

  // The scan, from where the response is still in its passband.
  double f_start = out.blocks_dc ? out.passband_hz : f_lo_hz;
  out.status = gain(f_start, &h);
  if (!out.status.ok) return out;
  for (int i = 0; i < 12 && !out.blocks_dc && std::abs(h) < threshold; ++i) {
    f_start /= 1e3;
    out.status = gain(f_start, &h);
    if (!out.status.ok) return out;
  }
  const double step = std::pow(10.0, 1.0 / points_per_decade);
  double peak = out.passband_gain;
  double f_prev = f_start;
  double m_prev = std::abs(h);
  for (double f = f_start * step; f <= f_max_hz * step; f *= step) {
    out.status = gain(f, &h);
    if (!out.status.ok) return out;
    const double m = std::abs(h);
    if (m > peak) {
      peak = m;
      out.peak_hz = f;
    }
    if (!out.high_corner_found && m < threshold) {
      out.status = RefineCrossing(gain, threshold, f_prev, m_prev, f, m,
                                  &out.high_corner_hz);
      if (!out.status.ok) return out;
      out.high_corner_found = true;
    }
    f_prev = f;
    m_prev = m;
  }
  if (out.blocks_dc) {
    // Down from the in-band maximum to the first fall through -3 dB.
    f_prev = out.passband_hz;
    m_prev = out.passband_gain;
    for (double f = out.passband_hz / step; f >= f_lo_hz / step; f /= step) {
      out.status = gain(f, &h);
      if (!out.status.ok) return out;
      const double m = std::abs(h);
      if (m > peak) {
        peak = m;
        out.peak_hz = f;
      }
      if (m < threshold) {
        out.status = RefineCrossing(gain, threshold, f_prev, m_prev, f, m,
                                    &out.low_corner_hz);
        if (!out.status.ok) return out;
        out.low_corner_found = true;
        break;
      }
      f_prev = f;
      m_prev = m;
    }
  }
  if (out.peak_hz > 0) {
    // Refine around the best sample (one scan step either side).
    out.status =
        RefineMaximum(gain, std::log(out.peak_hz / step),
                      std::log(out.peak_hz * step), &peak, &out.peak_hz);
    if (!out.status.ok) return out;
  }
  out.peaking_db = 20.0 * std::log10(peak / out.passband_gain);
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
      // Brent's method in ln f on the phase turned, unwrapped from the
      // bracket's low end (one scan step turns it by less than pi); the
      // response at each point is kept for the one the search ends on.
      const double turned_lo = turned, arg_lo = prev_arg;
      std::complex<double> h_root = h;
      double u_root = std::log(f);
      double x = 0;
      out.status = FindBracketedRoot(
          [&](double u, double* value) {
            double a = 0;
            Status st = relative_arg(std::exp(u), &a);
            *value = turned_lo + WrapPi(a - arg_lo) - quarter;
            h_root = h;
            u_root = u;
            return st;
          },
          std::log(f_prev), turned_lo - quarter, std::log(f),
          turned_here - quarter, kQuarterTurnTolerance, &x);
      if (!out.status.ok) return out;
      out.f90_hz = std::exp(x);
      if (x != u_root) {
        out.status = gain(out.f90_hz, &h_root);
        if (!out.status.ok) return out;
      }
      out.q = std::abs(h_root) / std::abs(h_ref);
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
