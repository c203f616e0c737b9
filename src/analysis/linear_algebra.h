// The one place Eigen enters hushgain: the matrix aliases and the one
// decomposition used (LU with partial pivoting, complex, and real for DC). Only
// analysis includes this header; io and report never see an Eigen type. The
// per-frequency solves factor with SmallComplexLu (analysis/small_complex_lu.h,
// the same LU pivoting by |re| + |im|); ComplexLu stays for its condition
// estimate.
#ifndef HUSHGAIN_ANALYSIS_LINEAR_ALGEBRA_H_
#define HUSHGAIN_ANALYSIS_LINEAR_ALGEBRA_H_

#include <Eigen/Dense>
#include <complex>

namespace hushgain {

using Complex = std::complex<double>;
using RealMatrix = Eigen::MatrixXd;
using ComplexMatrix = Eigen::MatrixXcd;
using ComplexVector = Eigen::VectorXcd;
using ComplexLu = Eigen::PartialPivLU<ComplexMatrix>;
using RealVector = Eigen::VectorXd;
using RealLu = Eigen::PartialPivLU<RealMatrix>;

}  // namespace hushgain

#endif  // HUSHGAIN_ANALYSIS_LINEAR_ALGEBRA_H_
