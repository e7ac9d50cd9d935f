// Midpoint-radius interval matrices on double kernels (Rump 1999; round-to-nearest variant
// with an a-priori error term, Rump 2012). Products run through Eigen's ordinary double
// kernels in round-to-nearest, so no rounding mode is involved (traps 5, 10); the radius
// carries the γ_k |A||B| term of every possible summation order plus an underflow term.
// Enclosure contract: the exact product of any matrices inside the inputs lies inside
// [mid − rad, mid + rad] entrywise (docs/enclosures.md §5).
#pragma once
#include <Eigen/Dense>

#include "arith/interval.hpp"

#ifndef EIGEN_DONT_PARALLELIZE
#error "porecert: EIGEN_DONT_PARALLELIZE must be defined (trap 5: threads lose the rounding state)"
#endif

namespace porecert::arith {

using MatD = Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, Eigen::ColMajor>;

struct MidRad {
  MatD mid;  // point matrix
  MatD rad;  // nonnegative radii; entry (i,j) encloses [mid − rad, mid + rad]
  Eigen::Index rows() const { return mid.rows(); }
  Eigen::Index cols() const { return mid.cols(); }
};

// Enclosure of A·B for a point matrix A and an interval matrix B.
MidRad product(const MatD& A, const MidRad& B);
// Upper bound, entrywise, of |A|·M for a point matrix A and a nonnegative matrix M.
MatD abs_product_up(const MatD& A, const MatD& M);
// Upper bounds of the column sums Σ_i (|mid_ij| + rad_ij) of an interval matrix.
Eigen::VectorXd column_norms_up(const MidRad& M);
// Upper bound of ‖I − C‖ column sums for an enclosure C of a square product.
Eigen::VectorXd identity_defect_column_norms_up(const MidRad& C);
// Upper bound of the ℓ¹ operator norm (max column sum) of a point matrix.
double operator_norm1_up(const MatD& A);

// Start-up self-test of the product kernel (trap 10): with A = [[1, 2⁻⁵³], [0, 2⁻⁵³]] the
// enclosure of A·Aᵀ must have upper (0,0) bound > 1. Throws std::logic_error on failure.
void midrad_self_test();

}  // namespace porecert::arith
