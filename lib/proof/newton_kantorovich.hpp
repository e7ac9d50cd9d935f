// Newton–Kantorovich (radii-polynomial) verification of one solution of a model (docs/method.md §M3).
// Space X: x = (scalars, u) with ‖x‖ = Σ|scalars| + Σ_k |u_k| (ℓ¹ of the Chebyshev
// coefficients of u = f'''). T(x) = x − A F(x), A = [A_N (approximate inverse of the
// finite part of DF(x̄)) ⊕ identity on modes ≥ N]. With
//   Y₀ ≥ ‖A F(x̄)‖, Z ≥ ‖I − A DF(x̄)‖ = max(Z₀ finite columns, Z₁ tail columns),
//   Z₂ ≥ ‖A‖ sup ‖D²F[b,h]‖ (F is quadratic, so Z₂ is global),                       (M3.1)
// p(r) = Z₂ r² − (1 − Z) r + Y₀ < 0 proves a unique zero of F in the ball B(x̄, r) for every r
// in (r₋, r₊), hence existence within r₋ and uniqueness in the open ball of radius r₊.   (M3.2)
#pragma once
#include <array>
#include <limits>
#include <string>
#include <vector>

#include "arith/interval.hpp"
#include "model/model.hpp"

namespace porecert::proof {

struct NKBounds {
  double Y0 = 0, Z0 = 0, Z1 = 0, Z2 = 0, A_norm = 0;  // all rounded up
  double Z() const { return Z0 > Z1 ? Z0 : Z1; }
};

template <arith::Interval I>
struct NKResult {
  bool certified = false;
  std::string failure;  // the inequality that failed and by how much (empty if certified)
  NKBounds bounds;
  double existence_radius = 0;       // r₋ rounded up (ball in X)
  double uniqueness_radius = 0;      // r₊ rounded down; +inf when Z₂ = 0
  std::array<double, 4> c3_error{};  // sup|f^{(k)} − f̄^{(k)}| ≤ c3_error[k], k = 0..3, rounded up
  // Enclosures of the true solution's values (valid only when certified).
  I fp0, fppp0, fpp1, K;
  int modes = 0;
  std::array<double, 4> sup_lift{};  // sup-norm of D^d of a unit vector of X (for c3_error)
  // The centre the proof is about (docs/method.md (M3.11)): without a predictor x̄ itself and the
  // same radii and errors as above; with one, x̄(R) = x̄ + (R − R0) x1 and, for each R of the box,
  // existence within centre_existence_radius of x̄(R), uniqueness in the open ball of radius
  // centre_uniqueness_radius about x̄(R), sup|f^{(k)} − f̄(R)^{(k)}| ≤ centre_c3_error[k]. Values
  // and structure labels use these (M3.13): tighter than the fixed-centre ones.
  bool moving_centre = false;
  double R0 = 0;              // the point of the predictor (exact double); 0 without one
  std::vector<I> tangent;     // x1 (empty without a predictor)
  I delta = I(0);             // encloses R − R0 over the box
  double centre_existence_radius = 0, centre_uniqueness_radius = 0;
  std::array<double, 4> centre_c3_error{};
};

// Encloses everything stated in NKResult for the model m (coefficients may be intervals:
// the proof then holds for every parameter inside) about the candidate xbar (layout of
// model::Model). Loose when the candidate is poor (Y₀ large) or modes are too few (Z₁
// near 1): then certified = false with the reason. Never throws on mathematical failure;
// throws std::invalid_argument on a malformed model or fewer than 8 modes.
template <arith::Interval I>
NKResult<I> nk_verify(const model::Model<I>& m, const std::vector<I>& xbar);

// First-order predictor for an interval box of R (docs/method.md (M3.11)): the proof is about
// x̄(R) = x̄ + (R − R0) x1 for each R of the box, x1 a (non-rigorous) tangent of the branch, so that
// Y0 is of second order in the box width. Requires every model coefficient to be affine in R
// (docs/models.md §0): ∂F/∂R = F(·; R = 1) − F(·; R = 0).
template <arith::Interval I>
struct RPredictor {
  std::vector<I> tangent;             // x1, points in the unknown layout
  I delta;                            // encloses R − R0 for every R of the box
  model::Model<I> at_R0, at_0, at_1;  // the model at the point R0, at R = 0 and at R = 1
  double R0 = 0;                      // the point of the predictor (exact double)
};

// As above for m over a box of R, with the predictor p. The proof's radii r₋, r₊ are about the
// moving centre x̄(R) (centre_* fields); existence_radius = r₋ + t and uniqueness_radius =
// max(0, r₊ − t) restate them about the fixed point xbar (t ≥ sup|R − R0| ‖x1‖), and c3_error is
// about xbar too (r₋ plus the certified motion of the lifted centre), so consumers of the fixed
// candidate stay valid; a box is not refused because the fixed-centre balls are too small.
template <arith::Interval I>
NKResult<I> nk_verify(const model::Model<I>& m, const std::vector<I>& xbar, const RPredictor<I>& p);

// Upper bound of the tail part of Z₁ that does not depend on A: Σ |c| ‖g‖ ‖J^m T_k‖ for k ≥ N.
// Used to pick N before the expensive steps.
double tail_estimate(const model::Model<arith::Id>& m, const std::vector<arith::Id>& xbar, long N);

}  // namespace porecert::proof
