// Rigorous sup-norm enclosure of a Chebyshev series (or its k-th derivative) on a subinterval
// [a, b] ⊂ [0, 1], by branch and bound — never by sampling (docs/enclosures.md §3).
// On a box X with midpoint m and half-width h, Taylor with remainder gives
// |f| ≤ |f(m)| + |f'(m)| h + L₂ h²/2 with L₂ ≥ ‖f''‖ (ℓ¹ of the second-derivative series); the
// point values are enclosed, and |f(m)| is a lower bound of the sup.
#pragma once
#include <algorithm>
#include <queue>

#include "arith/cheb.hpp"

namespace porecert::arith {

struct SupNorm {
  double lower = 0;  // ≤ sup_{[a,b]} |f|, rounded down
  double upper = 0;  // ≥ sup_{[a,b]} |f|, rounded up
  int boxes = 0;     // boxes examined
};

// Encloses sup_{η∈[a,b]} |f^{(k)}(η)| for f = Σ c_j T_j(2η−1) with interval coefficients (the bound
// holds for every choice of coefficients inside). Stops when upper − lower ≤ rel_tol·upper or after
// max_boxes boxes (then the enclosure is valid but looser). Requires 0 ≤ a ≤ b ≤ 1.
template <Interval I>
SupNorm sup_norm(const cheb::Series<I>& c, double a, double b, int k = 0, double rel_tol = 1e-6,
                 int max_boxes = 200000) {
  cheb::Series<I> f = c;
  for (int i = 0; i < k; ++i) f = cheb::derivative(f);
  const cheb::Series<I> fp = cheb::derivative(f);
  const double L2 = cheb::norm1_up(cheb::derivative(fp));
  using R = rounded_nearest_outward;
  struct Box {
    double lo, hi, ub;
    bool operator<(const Box& o) const { return ub < o.ub; }
  };
  SupNorm out;
  std::priority_queue<Box> q;
  auto bound = [&](double lo, double hi) {
    const double m = lo + (hi - lo) / 2;
    const double h = std::max(R::sub_up(m, lo), R::sub_up(hi, m));
    const I v = cheb::eval(f, I(m));
    const I d = cheb::eval(fp, I(m));
    out.lower = std::max(out.lower, std::max(0.0, std::max(lower_down(v), -upper_up(v))));
    ++out.boxes;
    const double rem = R::mul_up(R::mul_up(L2, R::mul_up(h, h)), 0.5);
    q.push({lo, hi, R::add_up(R::add_up(mag_up(v), R::mul_up(mag_up(d), h)), rem)});
  };
  bound(a, b);
  if (a == b) {
    out.upper = q.top().ub;
    return out;
  }
  while (!q.empty()) {
    const Box top = q.top();
    out.upper = top.ub;  // the largest box bound bounds the sup
    if (R::sub_up(out.upper, out.lower) <= rel_tol * out.upper || out.boxes >= max_boxes || top.hi - top.lo < 1e-15)
      break;
    q.pop();
    const double m = top.lo + (top.hi - top.lo) / 2;
    bound(top.lo, m);
    bound(m, top.hi);
  }
  return out;
}

}  // namespace porecert::arith
