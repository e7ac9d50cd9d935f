// Certified sign structure of a solution: where f^{(d)} is surely positive / negative on [0,1],
// from the candidate's Chebyshev series and the certified sup-norm error (docs/method.md §M7).
// Used for branch labels (type I/II/III) and for flow reversal (f' < 0 somewhere).
#pragma once
#include <array>
#include <string>
#include <utility>
#include <vector>

#include "arith/cheb.hpp"

namespace porecert::proof {

using Span = std::pair<double, double>;

struct SignCover {
  std::vector<Span> positive, negative, unsure;  // merged, sorted; together they cover [a, b]
};

// Covers [a, b] (0 ≤ a < b ≤ 1) by boxes on which g = s + e, |e| ≤ err, is surely > 0, surely
// < 0, or unsure (boxes narrower than tol). Each box's range is enclosed by the value at its
// midpoint ± L·halfwidth, L the smaller of ‖s'‖ (ℓ¹ of the derivative series) and the interval
// Clenshaw range of s' over the box: never by sampling.
SignCover sign_cover(const cheb::Series<arith::Id>& s, double err, double a, double b, double tol = 1e-8);

struct Structure {
  std::string label;                         // "I", "II", "III" or "unclassified"
  std::string reason;                        // which certified properties the label rests on
  arith::Tri reversal = arith::Tri::unsure;  // f' < 0 somewhere on (0,1)?
  std::vector<Span> reversal_where;          // f' surely < 0 on these
  std::vector<Span> f_negative;              // f surely < 0 on these
};

// Labels (docs/branches.md): type I: f' > 0 on [0,1) and f'' < 0 on (0,1] (axial velocity largest
// on the centre plane, falling monotonically to the wall); type II: f'(0) > 0 and f'' > 0 somewhere
// (velocity not largest on the centre plane); type III: f'(0) < 0 (reversed flow on the centre
// plane). D = candidate's f, f', f'', f''' as series; e = their certified sup-norm errors.
Structure classify(const std::array<cheb::Series<arith::Id>, 4>& D, const std::array<double, 4>& e,
                   const arith::Id& fp0);
// The same for a family of profiles affine in a parameter (an interval box of R, docs/method.md
// (M3.13)): D^d f = vertex_a + λ (vertex_b − vertex_a), λ ∈ [0, 1]. A sign certified on a span for
// every vertex holds there for the whole family (an affine function of λ is positive on [0, 1]
// when it is at both ends), so the covers are intersected; fp0 must enclose f'(0) of every member.
Structure classify(const std::vector<std::array<cheb::Series<arith::Id>, 4>>& vertices, const std::array<double, 4>& e,
                   const arith::Id& fp0);

std::string spans_text(const std::vector<Span>& v);

}  // namespace porecert::proof
