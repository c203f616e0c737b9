// LU with partial pivoting of the small dense complex matrices of a stage's
// network (Y = G + j w C, a few to a few dozen unknowns), in preallocated
// split real and imaginary storage:
//   P A = L U,  L unit lower triangular, U upper triangular.
// The pivot of column k is the entry of largest |re| + |im| at or below the
// diagonal. That norm lies within a factor sqrt 2 of the modulus, so the
// growth bound of partial pivoting holds up to that factor, and it costs two
// fabs instead of a hypot: the modulus (a libm call with overflow care) cost
// more than the elimination itself on these sizes. Nothing allocates after
// construction; the arithmetic is written out in real and imaginary parts.
//
// Used by AdjointSolver, DirectSolve and LoopGainSolver. The condition
// estimate (Eigen's, from ComplexLu) is left to the caller, for the rare
// system whose pivots spread widely.
#ifndef HUSHGAIN_ANALYSIS_SMALL_COMPLEX_LU_H_
#define HUSHGAIN_ANALYSIS_SMALL_COMPLEX_LU_H_

#include <vector>

#include "analysis/linear_algebra.h"

namespace hushgain {

class SmallComplexLu {
 public:
  explicit SmallComplexLu(int n);

  // Factors `a` (n x n). Returns false when a column has no nonzero pivot
  // or an entry is not finite; the factors are then unusable.
  bool Factor(const ComplexMatrix& a);
  // The same for a matrix given row-major as real and imaginary parts
  // (n x n each), read and not changed.
  bool Factor(const double* re, const double* im);

  // Solves A x = b with the last factors (x may not alias b).
  void Solve(const ComplexVector& b, ComplexVector* x) const;

  // The smallest and largest modulus of U's diagonal.
  double SmallestPivot() const;
  double LargestPivot() const;

 private:
  double PivotModulus(int k) const;

  int n_;
  std::vector<double> re_;  // row-major, L below the diagonal, U on and above
  std::vector<double> im_;
  std::vector<int> pivot_;          // row swapped with row k at step k
  std::vector<double> inverse_re_;  // 1 / U(k, k), for the solves
  std::vector<double> inverse_im_;
  std::vector<double> work_matrix_re_;  // a ComplexMatrix split, row-major
  std::vector<double> work_matrix_im_;
  mutable std::vector<double> work_re_;
  mutable std::vector<double> work_im_;
};

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_SMALL_COMPLEX_LU_H_
