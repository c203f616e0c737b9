#include "analysis/small_complex_lu.h"

#include <doctest/doctest.h>

#include <cmath>

#include "test_support.h"

namespace hushgain {
namespace {

using test::kRelTight;

// The largest |x_i - expected_i| over the largest |expected_i|.
double Distance(const ComplexVector& x, const ComplexVector& expected) {
  return (x - expected).cwiseAbs().maxCoeff() / expected.cwiseAbs().maxCoeff();
}

TEST_CASE("small complex lu recovers a solution built first") {
  // The solution is chosen, b = A x0 formed, and A x = b solved: x = x0 up
  // to rounding (common practice, no source). A's (0, 0) entry is zero, so
  // the factorization must pivot.
  ComplexMatrix a(4, 4);
  a << Complex(0, 0), Complex(2, 1), Complex(0, -3), Complex(1, 0),  //
      Complex(4, -1), Complex(0, 2), Complex(1, 1), Complex(0, 0),   //
      Complex(1, 0), Complex(-2, 0), Complex(5, 5), Complex(0, 1),   //
      Complex(0, 1), Complex(1, 0), Complex(-1, 2), Complex(6, 0);
  ComplexVector x0(4);
  x0 << Complex(1, -2), Complex(0.5, 0), Complex(-3, 1), Complex(0, 4);
  const ComplexVector b = a * x0;
  SmallComplexLu lu(4);
  REQUIRE(lu.Factor(a));
  ComplexVector x;
  lu.Solve(b, &x);
  CHECK(Distance(x, x0) < kRelTight);
}

TEST_CASE("small complex lu agrees with the inverse of a 2x2 matrix") {
  // [[a, b], [c, d]]^-1 = [[d, -b], [-c, a]] / (ad - bc) (Cramer's rule).
  const Complex p(1e-3, 2), q(3, -1), r(-2, 0.5), s(1e4, 1e-2);
  ComplexMatrix a(2, 2);
  a << p, q, r, s;
  ComplexVector e0(2);
  e0 << 1, 0;
  const Complex det = p * s - q * r;
  ComplexVector expected(2);
  expected << s / det, -r / det;
  SmallComplexLu lu(2);
  REQUIRE(lu.Factor(a));
  ComplexVector x;
  lu.Solve(e0, &x);
  CHECK(Distance(x, expected) < kRelTight);
  // The pivots of U: |r| (the larger first column entry by |re| + |im|),
  // then |det| / |r|.
  CHECK(std::fabs(lu.LargestPivot() -
                  std::max(std::abs(r), std::abs(det) / std::abs(r))) <
        kRelTight * lu.LargestPivot());
  CHECK(std::fabs(lu.SmallestPivot() -
                  std::min(std::abs(r), std::abs(det) / std::abs(r))) <
        kRelTight * lu.SmallestPivot());
}

TEST_CASE("small complex lu factors a matrix given as split parts") {
  // Row-major real and imaginary parts of A = [[0, 1 + 2j], [3 - 1j, 4]]
  // (a zero leading entry: it must pivot) and b = A x0 for a chosen x0.
  const double re[4] = {0, 1, 3, 4};
  const double im[4] = {0, 2, -1, 0};
  ComplexVector x0(2);
  x0 << Complex(2, -1), Complex(-0.5, 3);
  ComplexMatrix a(2, 2);
  for (int i = 0; i < 2; ++i)
    for (int j = 0; j < 2; ++j) a(i, j) = Complex(re[i * 2 + j], im[i * 2 + j]);
  const ComplexVector b = a * x0;
  SmallComplexLu lu(2);
  REQUIRE(lu.Factor(re, im));
  ComplexVector x;
  lu.Solve(b, &x);
  CHECK(Distance(x, x0) < kRelTight);
  CHECK(re[0] == 0);  // the input is read, not changed
  CHECK(im[1] == 2);
}

TEST_CASE("small complex lu refuses a matrix with a zero column") {
  ComplexMatrix a = ComplexMatrix::Zero(3, 3);
  a(0, 0) = Complex(1, 1);
  a(2, 2) = Complex(0, 2);  // column 1 is zero
  SmallComplexLu lu(3);
  CHECK_FALSE(lu.Factor(a));
}

TEST_CASE("small complex lu refuses an entry that is not finite") {
  ComplexMatrix a = ComplexMatrix::Identity(2, 2);
  a(1, 0) = Complex(NAN, 0);
  SmallComplexLu lu(2);
  CHECK_FALSE(lu.Factor(a));
}

}  // namespace
}  // namespace hushgain
