// NON-RIGOROUS candidate for the fold of branches II/III (docs/fold.md §3). Nothing here is on
// the proof path: lib/proof/fold.cpp checks the point it returns. Start: the two negative-f'(0)
// solutions at R = 13 (find_branches), continuation in s = f'(0) between them (R is an unknown),
// the smallest R on that path, the null vector from the SVD of the fixed-R Jacobian, then Newton
// on the truncated extended system (F1)-(F6) in double.
#pragma once
#include <Eigen/Dense>
#include <string>
#include <vector>

#include "arith/midrad.hpp"
#include "proof/fold.hpp"

namespace porecert::candidate {

struct FoldCandidate {
  std::vector<double> x;  // layout of lib/proof/fold.hpp
  bool converged = false;
  int modes = 0;
  double residual = 0;  // max-norm of the truncated residual
  std::vector<std::string> log;
};

// Truncated residual (equations (F2),(F3),(F5),(F6), then N modes of (F1), N of (F4)) and Jacobian.
// ns: the null space of the extended system (proof::fold::NullSpace; default the turning point).
Eigen::VectorXd fold_truncated_residual(const std::vector<double>& x,
                                        const proof::fold::NullSpace& ns = proof::fold::kTurningPoint);
arith::MatD fold_truncated_jacobian(const std::vector<double>& x,
                                    const proof::fold::NullSpace& ns = proof::fold::kTurningPoint);

// modes: Chebyshev modes per function; 0 = raised until the last 8 coefficients of u_g and u_v
// fall below 1e-16 of the largest (at most 160).
FoldCandidate fold_candidate(int modes = 0);

// MPFR refinement x ← x − LU⁻¹ Π_N F(x), F in MPFR at the working precision.
std::vector<arith::Mpfr> refine_fold_mpfr(const std::vector<double>& x, const Eigen::PartialPivLU<arith::MatD>& lu,
                                          int steps, double* last_residual,
                                          const proof::fold::NullSpace& ns = proof::fold::kTurningPoint);

// NON-RIGOROUS candidate for the symmetry-breaking point of type I (docs/fold.md §7), layout of
// lib/proof/fold.hpp with the null space kEvenPerturbation: type I by continuation, the even
// perturbation problem about it solved for κ(R) (v(0) = 1, v'(0) = 0), the secant method for
// κ(R) = 0, then Newton on the truncated extended system. modes as for fold_candidate.
FoldCandidate symmetry_breaking_candidate(int modes = 0);

}  // namespace porecert::candidate
