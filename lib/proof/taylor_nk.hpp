// Newton–Kantorovich (radii-polynomial) proof for Taylor models (lib/model/taylor_model.hpp;
// docs/models.md §2, (V2.7)–(V2.10)). Space X: x = (scalars, u) with ‖x‖ = Σ|scalars| + Σ_n |u_n|,
// u = Σ u_n ξ^n (ℓ¹ of Taylor coefficients about ξ = 0, weight ρ = 1, so sup over [0,1] of any
// series is at most its norm and X is a Banach algebra). A mode u_k reaches modes ≥ k only
// (V2.7), so tail modes couple to the finite block only through the boundary rows; A is block
// upper triangular with the low-rank row correction (V2.8), and
//   Y₀ ≥ ‖A F(x̄)‖, Z₀, Z₁ ≥ column norms of I − A DF(x̄), Z₂ ≥ ‖A‖ sup ‖D²F[b,h]‖;
// p(r) = Z₂ r² − (1 − max(Z₀, Z₁)) r + Y₀ < 0 proves a unique zero in B(x̄, r) (docs/method.md (M3.2)).
// Interval arithmetic over double throughout (Boost interval, outward rounding; products of
// matrices as midpoint–radius enclosures, docs/enclosures.md §5).
#pragma once
#include <string>
#include <vector>

#include "arith/interval.hpp"
#include "model/taylor_model.hpp"
#include "proof/newton_kantorovich.hpp"

namespace porecert::proof {

struct TaylorNKResult {
  bool certified = false;
  std::string failure;            // the inequality that failed and by how much (empty if certified)
  NKBounds bounds;                // Y0, Z0 (finite columns), Z1 (tail columns), Z2, ‖A‖; all rounded up
  double existence_radius = 0;    // r₋ rounded up (ball in X)
  double uniqueness_radius = 0;   // r₊ rounded down
  std::vector<double> lift_norm;  // Λ_d ≥ sup_{‖h‖≤1} ‖D^d h‖, d = 0..p (V2.9)
  std::vector<double> sup_error;  // sup_[0,1] |D^d F − D^d F̄| ≤ Λ_d r, d = 0..p; then sup|u − ū| ≤ r
  int modes = 0;
};

// Encloses everything stated in TaylorNKResult for the model m (coefficients may be intervals:
// the proof then holds for every parameter inside) about the candidate xbar ([scalars, u_0..u_{N−1}],
// exact doubles). certified = false with the failed inequality when the bounds do not close
// (a candidate far from a zero, too few modes, or a Taylor series that does not converge on [0,1]).
// Throws std::invalid_argument on a malformed model, fewer than 8 modes, or a principal part with
// a negative α_j (σ would not be increasing, (V2.4)).
TaylorNKResult taylor_nk_verify(const model::TaylorModel<arith::Id>& m, const std::vector<arith::Id>& xbar);

// Enclosure of the model's reported value k (model::ValueKey) of the true solution: K̄ ± r, a free
// constant ± r, or scale · (D^d F̄(at) ± sup_error[d]). Valid only when r.certified.
arith::Id taylor_value(const model::TaylorModel<arith::Id>& m, const std::vector<arith::Id>& xbar,
                       const TaylorNKResult& r, const model::ValueKey& k);

// The same proof about an MPFR candidate (exact at the working precision): Y₀ is computed in MPFR
// intervals, so it is no longer a double rounding floor; Z₀, Z₁, Z₂ in double intervals about the
// candidate's outward double hull (they enclose DF at the exact candidate, docs/method.md §M4).
TaylorNKResult taylor_nk_verify_mpfr(const model::TaylorModel<arith::Im>& m, const std::vector<arith::Im>& xbar);
// taylor_value with the candidate's values computed in MPFR intervals (rounded outward to doubles).
arith::Id taylor_value_mpfr(const model::TaylorModel<arith::Im>& m, const std::vector<arith::Im>& xbar,
                            const TaylorNKResult& r, const model::ValueKey& k);

}  // namespace porecert::proof
