// NON-RIGOROUS candidate solver for Taylor models (lib/model/taylor_model.hpp, docs/models.md §2):
// Newton in double on the truncation of (V2.5) to the boundary rows and modes 0..N−1, and
// continuation in R from R = 0. Its output is a point that lib/proof/taylor_nk.hpp checks;
// nothing here is on the proof path. Because mode n of (V2.5) involves u_0..u_n only (V2.7), the
// truncated system is exact series shooting from ξ = 0 with the rows imposed on the polynomial.
#pragma once
#include <functional>
#include <string>
#include <vector>

#include "arith/mpfr_real.hpp"
#include "model/taylor_model.hpp"

namespace porecert::candidate {

struct TaylorCandidate {
  std::vector<double> x;  // [scalars, u_0..u_{N-1}]
  bool converged = false;
  int iterations = 0;
  std::string note;           // why not, when not converged
  bool decay_failed = false;  // Newton converged but the coefficients had not decayed at the mode limit
};

// Newton on the truncated system at the modes of x.
TaylorCandidate taylor_newton(const model::TaylorModel<double>& m, std::vector<double> x, int max_iterations = 30);

// x with its u part re-sized to n modes (zero padding or truncation).
std::vector<double> taylor_with_modes(const model::TaylorModel<double>& m, std::vector<double> x, int n);

// True when the last eight u-coefficients are below rel · max|u_k| (and N ≥ 16).
bool taylor_decayed(const model::TaylorModel<double>& m, const std::vector<double>& x, double rel = 1e-16);

// Newton, raising N by half (up to n_max) until the coefficients have decayed.
TaylorCandidate taylor_solve_with_decay(const model::TaylorModel<double>& m, std::vector<double> x, int n_max);

// Continuation in R from the solution of the (linear) problem at R = 0 to R_target; make(R)
// builds the model. Adaptive steps; modes raised by decay. log (optional) gets one line per stage.
TaylorCandidate taylor_continuation(const std::function<model::TaylorModel<double>(double)>& make, double R_target,
                                    int n_max, std::vector<std::string>* log = nullptr);

// MPFR refinement at the working precision: x ← x − J⁻¹ F(x) with F (rows, modes < N) in MPFR and
// J the double Jacobian of md at the double candidate x0 (iterative refinement; steps iterations).
std::vector<arith::Mpfr> taylor_refine_mpfr(const model::TaylorModel<arith::Mpfr>& m,
                                            const model::TaylorModel<double>& md, const std::vector<double>& x0,
                                            int steps);

}  // namespace porecert::candidate
