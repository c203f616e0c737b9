// A root of a function known to change sign on an interval, by Brent's
// method (Brent, Algorithms for Minimization without Derivatives, 1973,
// chapter 4, the procedure "zero"): inverse quadratic interpolation or
// secant steps while they shrink the bracket fast enough, bisection
// otherwise. It keeps a bracket at every step, so it never does worse than
// about one bisection step per evaluation, and on a smooth function it
// converges superlinearly: the scans of the response, the loop and the
// capacitor choice reach 1e-10 in a handful of solves where bisection took
// thirty.
#ifndef HUSHGAIN_ANALYSIS_BRACKETED_ROOT_H_
#define HUSHGAIN_ANALYSIS_BRACKETED_ROOT_H_

#include <cmath>
#include <limits>

#include "base/status.h"

namespace hushgain {

// Finds x in [a, b] with g(x) = 0, given ga = g(a) and gb = g(b) of opposite
// signs (or one of them zero). `g` is called as Status g(double x, double*
// value); a failing call stops the search and its status is returned. The
// root is written into *root, to within `tolerance` (absolute, in x) plus
// rounding; *root is always a point where g was evaluated (or a or b), so a
// caller can keep what it computed there. At most 200 evaluations.
template <typename Function>
Status FindBracketedRoot(Function&& g, double a, double ga, double b, double gb,
                         double tolerance, double* root) {
  constexpr double kEps = std::numeric_limits<double>::epsilon();
  double c = b, gc = gb, d = b - a, e = d;
  for (int iteration = 0; iteration < 200; ++iteration) {
    if ((gb > 0 && gc > 0) || (gb < 0 && gc < 0)) {
      c = a;
      gc = ga;
      d = e = b - a;
    }
    if (std::fabs(gc) < std::fabs(gb)) {
      a = b;
      b = c;
      c = a;
      ga = gb;
      gb = gc;
      gc = ga;
    }
    const double tol1 = 2 * kEps * std::fabs(b) + 0.5 * tolerance;
    const double xm = 0.5 * (c - b);
    if (std::fabs(xm) <= tol1 || gb == 0) break;
    if (std::fabs(e) >= tol1 && std::fabs(ga) > std::fabs(gb)) {
      // Interpolate: secant when only two points are distinct, inverse
      // quadratic otherwise.
      const double s = gb / ga;
      double p, q;
      if (a == c) {
        p = 2 * xm * s;
        q = 1 - s;
      } else {
        const double qa = ga / gc, r = gb / gc;
        p = s * (2 * xm * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0)
        q = -q;
      else
        p = -p;
      // Accept the step only when it stays well inside the bracket and
      // shrinks faster than the step before last; otherwise bisect.
      if (2 * p <
          std::fmin(3 * xm * q - std::fabs(tol1 * q), std::fabs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = xm;
        e = d;
      }
    } else {
      d = xm;
      e = d;
    }
    a = b;
    ga = gb;
    b += std::fabs(d) > tol1 ? d : (xm > 0 ? tol1 : -tol1);
    Status s = g(b, &gb);
    if (!s.ok) return s;
  }
  *root = b;
  return Status::Ok();
}

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_BRACKETED_ROOT_H_
