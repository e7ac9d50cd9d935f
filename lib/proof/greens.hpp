// Green's function of d⁴/dη⁴ with u(0) = u''(0) = u(1) = u'(1) = 0 and rigorous enclosures of
//   β_k = sup_{η∈[0,1]} ∫₀¹ |∂ᵏG/∂ηᵏ(η,s)| ds,   k = 0..3            (docs/method.md, eq. G5)
// Closed form (eq. G3): G(η,s) = s(1−η)²(3η − (η+2)s²)/12 for s ≤ η, G(η,s) = G(s,η) for s ≥ η.
// Method (eqs. G6–G9): for fixed η the integrand is a cubic in s on [0,η] and on [η,1]; ∫|·| is
// integrated exactly between rigorously enclosed sign changes; the sup over η is a rigorous
// branch and bound over η-boxes with a mean-value bound built from an enclosure of F_k'.
// Values (docs/method.md, "Values of β_k"):
//   β_0 = (39 + 55√33)/65536 ≈ 5.4161e-3, attained at the interior point η* = (1+√33)/16 (G ≥ 0);
//   β_1 = 1/48 attained at η = 0;  β_2 = 1/8 and β_3 = 5/8 attained at η = 1.
// β_0 and β_3 are proved by hand (eqs. G10, G11); for β_1, β_2 the value at the end point is exact
// and the branch and bound certifies that nothing in (0,1] / [0,1) exceeds it by more than the
// tolerance. The routines below do not assume any of this: they compute the enclosures.
#pragma once
#include <array>
#include <cstddef>
#include <functional>

#include "arith/interval.hpp"

namespace porecert::proof {

// 12·∂ᵏG/∂ηᵏ on one side of the diagonal as Σ c[i][j] ηⁱ sʲ (exact integers; eq. G4).
// left: s ≤ η, right: s ≥ η. The known factors are split off (eq. G4'):
//   left = s · left_reduced,   right = (1−s)² · right_reduced,
// so the sign of a piece inside (0,1) is the sign of its reduced table. k in 0..4 (k = 4 gives
// zero tables); asserts otherwise.
struct GreensTable {
  std::array<std::array<long, 4>, 4> left{}, right{}, left_reduced{}, right_reduced{};
};
GreensTable greens_table(int k);

// Enclosure of ∂ᵏG/∂ηᵏ(η,s) from the piece on side `left` (s ≤ η) or right (s ≥ η), for all
// η ∈ eta, s ∈ s (the piece polynomial is evaluated outside its side too: it is a polynomial).
// Loose by the usual interval dependency for wide arguments; exact-width for points up to rounding.
template <arith::Interval I>
I greens_piece(int k, bool left, const I& eta, const I& s);

// Enclosure of ∂ᵏG/∂ηᵏ(η,s) for all η ∈ eta, s ∈ s in [0,1]²: the hull of both pieces where
// s and η may be ordered either way (for k = 3 this covers the jump at s = η).
// Throws std::domain_error if eta or s is not inside [0,1].
template <arith::Interval I>
I greens_eval(int k, const I& eta, const I& s);

// Enclosure of F_k(η) = ∫₀¹ |∂ᵏG/∂ηᵏ(η,s)| ds at a point η (eq. G6). Width: a few ulps of
// the terms (double) or of the working precision (MPFR). Throws std::domain_error if η ∉ [0,1]
// or k ∉ 0..3.
template <arith::Interval I>
I greens_abs_integral(int k, double eta);

// Enclosure of { F_k'(η) : η ∈ [lo, hi] } where F_k' exists (a.e.; eq. G8); F_k is Lipschitz,
// so F_k(x) − F_k(y) ∈ (x − y)·result for x, y in the box. Width O(hi − lo).
// Requires 0 ≤ lo ≤ hi ≤ 1 (asserted).
template <arith::Interval I>
I greens_abs_integral_derivative(int k, double lo, double hi);

// Result of a rigorous supremum over an interval of η.
template <arith::Interval I>
struct SupEnclosure {
  I value;                     // contains sup F: lower end = a computed value, upper end = max box bound
  double argmax = 0;           // the point whose value gave the lower end
  std::size_t boxes = 0;       // boxes whose bound was computed
  bool tolerance_met = false;  // width(value) ≤ rel_tol·|lower| reached before max_boxes
};

// Rigorous branch and bound for sup_{x∈[lo,hi]} F(x) of a Lipschitz F (eq. G9).
//   point(x): enclosure of F(x);  deriv(a,b): enclosure of F' on [a,b] (a.e. derivative).
// Each box [a,b] gets the upper bound min over c ∈ {a, mid, b} of F(c) + D·([a,b] − c), or F at
// the larger end when D has a sign. The result always contains the sup; tolerance_met says whether
// the width target was reached (else the enclosure is wider, never wrong).
template <arith::Interval I>
SupEnclosure<I> sup_by_subdivision(const std::function<I(double)>& point, const std::function<I(double, double)>& deriv,
                                   double lo, double hi, double rel_tol, std::size_t max_boxes = 200000,
                                   int initial_boxes = 16);

// β_k enclosures (eq. G5) with target relative width rel_tol (≥ 1e-15 is reachable in double; the
// MPFR version reaches smaller). Each entry contains β_k even if the target was not met.
template <arith::Interval I>
std::array<SupEnclosure<I>, 4> greens_beta_detailed(double rel_tol = 1e-12);
template <arith::Interval I>
std::array<I, 4> greens_beta(double rel_tol = 1e-12);

// Closed forms of docs/method.md "Values of β_k": enclosures of (39+55√33)/65536, 1/48, 1/8, 5/8,
// and of η* = (1+√33)/16. For tests and reports; the proof path uses greens_beta.
template <arith::Interval I>
std::array<I, 4> greens_beta_closed_form();
template <arith::Interval I>
I greens_beta0_argmax();

// All templates above are defined in greens.cpp and instantiated for arith::Id and arith::Im.

}  // namespace porecert::proof
