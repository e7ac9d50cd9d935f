// NON-RIGOROUS candidate solvers. Nothing here is on the proof path: the output is a point
// that lib/proof checks. Chebyshev–Galerkin truncation of (M1.2)-(M1.3) at N modes, solved by
// Newton in double, refined in MPFR (residual in MPFR, corrections from the double LU;
// docs/method.md §M4). The truncated system is the finite part of the proof's map, so the
// candidate minimises the proof's residual bound Y₀.
#pragma once
#include <Eigen/Dense>
#include <functional>
#include <string>
#include <vector>

#include "arith/midrad.hpp"
#include "model/model.hpp"

namespace porecert::candidate {

using Vec = std::vector<double>;
using model::Model;

// Truncated residual Π_N F(x) (rows first) and its Jacobian, in plain double.
Eigen::VectorXd truncated_residual(const Model<double>& m, const Vec& x);
arith::MatD truncated_jacobian(const Model<double>& m, const Vec& x);
// Tangent dx/dR of the Galerkin branch through x at_R (non-rigorous): J x1 = −∂F_N/∂R with
// ∂F/∂R = F(·; R = 1) − F(·; R = 0) (the model family is affine in R, docs/models.md §0).
Vec tangent_in_R(const Model<double>& at_R, const Model<double>& at_0, const Model<double>& at_1, const Vec& x);

struct NewtonReport {
  Vec x;
  bool converged = false;
  int iterations = 0;
  double residual = 0;  // max-norm of the truncated residual at the end
  std::string note;
};
NewtonReport newton(const Model<double>& m, Vec x, int max_iterations = 25, double tol = 1e-13);

// x with u re-sized to n modes (zero padding or truncation).
Vec with_modes(const Model<double>& m, Vec x, int n);
int modes_of(const Model<double>& m, const Vec& x);
// True when the last eight u-coefficients are below rel · max|u_k| (coefficient decay).
bool decayed(const Model<double>& m, const Vec& x, double rel = 1e-15);

// Newton from a guess, raising N (×1.5) until the coefficients decay; n0 initial modes.
NewtonReport solve_with_decay(const Model<double>& m, Vec x0, int n0, int n_max);

// Initial guess from shooting data a = the lowest free constant at 0 (f'(0) for Berman),
// b = f'''(0) (RK4 from η = 0, then interpolation).
Vec guess_from_shooting(const Model<double>& m, double a, double b, int n);

// Continuation in R from a start solution at R_start (type I: the R = 0 profile) to R_target.
// make(R) builds the model at R. Secant predictor, adaptive steps, modes raised by decay.
NewtonReport continuation(const std::function<Model<double>(double)>& make, Vec x_start, double R_start,
                          double R_target, int n_max, std::vector<std::string>* log = nullptr);

// The R = 0 Berman profile f = (3η − η³)/2 in the unknown layout (exact in double).
Vec poiseuille(const Model<double>& m, int n);

// MPFR refinement: x ← x − LU⁻¹ Π_N F(x) with F in MPFR at the working precision.
std::vector<arith::Mpfr> refine_mpfr(const Model<arith::Mpfr>& m, const Vec& x_double,
                                     const Eigen::PartialPivLU<arith::MatD>& lu, int steps, double* last_residual);

}  // namespace porecert::candidate
