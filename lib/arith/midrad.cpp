#include "arith/midrad.hpp"

#include <cfloat>
#include <stdexcept>

namespace porecert::arith {

namespace {
constexpr double kUnit = 0x1p-53;   // unit roundoff of binary64
constexpr double kEta = 0x1p-1074;  // smallest subnormal: underflow error per product ≤ η/2
using R = rounded_nearest_outward;

// γ_k = k u / (1 − k u), rounded up.
double gamma_up(Eigen::Index k) {
  const double ku = R::mul_up(static_cast<double>(k), kUnit);
  return R::div_up(ku, R::sub_down(1.0, ku));
}
}  // namespace

MatD abs_product_up(const MatD& A, const MatD& M) {
  // Every computed entry T̃ of fl(|A| M) satisfies T ≤ (T̃ + k η)/(1 − γ_k): all terms are ≥ 0.
  const Eigen::Index k = A.cols();
  MatD T = A.cwiseAbs() * M;
  const double g = gamma_up(k);
  const double inv = R::div_up(1.0, R::sub_down(1.0, g));
  const double und = R::mul_up(static_cast<double>(k), kEta);
  for (Eigen::Index j = 0; j < T.cols(); ++j)
    for (Eigen::Index i = 0; i < T.rows(); ++i) T(i, j) = R::mul_up(R::add_up(T(i, j), und), inv);
  return T;
}

MidRad product(const MatD& A, const MidRad& B) {
  assert(A.cols() == B.rows());
  const Eigen::Index k = A.cols();
  MidRad C;
  C.mid = A * B.mid;
  // |fl(A Bm) − A Bm| ≤ γ_k |A||Bm| + k η; add |A| Br. Fold both into one |A|·M product.
  const double g = gamma_up(k);
  MatD M(B.rows(), B.cols());
  for (Eigen::Index j = 0; j < M.cols(); ++j)
    for (Eigen::Index i = 0; i < M.rows(); ++i) M(i, j) = R::add_up(R::mul_up(g, std::fabs(B.mid(i, j))), B.rad(i, j));
  C.rad = abs_product_up(A, M);
  const double und = R::mul_up(static_cast<double>(k), kEta);
  for (Eigen::Index j = 0; j < C.rad.cols(); ++j)
    for (Eigen::Index i = 0; i < C.rad.rows(); ++i) C.rad(i, j) = R::add_up(C.rad(i, j), und);
  return C;
}

Eigen::VectorXd column_norms_up(const MidRad& M) {
  Eigen::VectorXd s = Eigen::VectorXd::Zero(M.cols());
  for (Eigen::Index j = 0; j < M.cols(); ++j)
    for (Eigen::Index i = 0; i < M.rows(); ++i) s(j) = R::add_up(s(j), R::add_up(std::fabs(M.mid(i, j)), M.rad(i, j)));
  return s;
}

Eigen::VectorXd identity_defect_column_norms_up(const MidRad& C) {
  assert(C.rows() == C.cols());
  Eigen::VectorXd s = Eigen::VectorXd::Zero(C.cols());
  for (Eigen::Index j = 0; j < C.cols(); ++j)
    for (Eigen::Index i = 0; i < C.rows(); ++i) {
      const double d = (i == j)
                           ? std::max(std::fabs(R::sub_up(1.0, C.mid(i, j))), std::fabs(R::sub_down(1.0, C.mid(i, j))))
                           : std::fabs(C.mid(i, j));
      s(j) = R::add_up(s(j), R::add_up(d, C.rad(i, j)));
    }
  return s;
}

double operator_norm1_up(const MatD& A) {
  double best = 0;
  for (Eigen::Index j = 0; j < A.cols(); ++j) {
    double s = 0;
    for (Eigen::Index i = 0; i < A.rows(); ++i) s = R::add_up(s, std::fabs(A(i, j)));
    best = std::max(best, s);
  }
  return best;
}

void midrad_self_test() {
  MatD A(2, 2);
  A << 1.0, 0x1p-53, 0.0, 0x1p-53;
  MidRad At{A.transpose(), MatD::Zero(2, 2)};
  const MidRad C = product(A, At);
  const double upper00 = R::add_up(C.mid(0, 0), C.rad(0, 0));
  const double lower00 = R::sub_down(C.mid(0, 0), C.rad(0, 0));
  // Exact (0,0) entry is 1 + 2⁻¹⁰⁶: the enclosure must contain it.
  if (!(upper00 > 1.0) || !(lower00 <= 1.0))
    throw std::logic_error("porecert: matrix-product self-test failed (trap 10): the kernel's error term is missing");
}

}  // namespace porecert::arith
