// Bounds on the integration operator J = ∫₀^η on Chebyshev modes k ≥ N (docs/method.md §M3.3):
// J^m T_k = band part (modes k−m..k+m) + low part (degree < m), with
//     ‖band‖ ≤ b_m(N),  ‖low‖ ≤ l_m(N),  b_{s+1} = b_s / (2(N−s−1)),
//     l_{s+1} = l_s + b_s / (2((N−s)² − 1)),  b_0 = 1, l_0 = 0,                        (M3.5)
// valid for every k ≥ N ≥ m + 3 (both bounds decrease in k). Uses ‖J‖ = 1 on ℓ¹ (M3.4).
#pragma once
#include <array>
#include <cassert>

#include "arith/interval.hpp"

namespace porecert::proof {

struct JBounds {
  std::array<double, 4> band{};  // b_0..b_3, rounded up
  std::array<double, 4> low{};   // l_0..l_3, rounded up
};

// Upper bounds (M3.5) for tail modes k ≥ N; requires N ≥ 6.
inline JBounds j_tail_bounds(long N) {
  assert(N >= 6);
  using arith::Id;
  JBounds r;
  Id b(1.0), l(0.0);
  r.band[0] = 1;
  r.low[0] = 0;
  for (int s = 0; s < 3; ++s) {
    const Id ks(static_cast<double>(N - s));
    l = l + b / (Id(2) * (ks * ks - Id(1)));
    b = b / (Id(2) * (ks - Id(1)));
    r.band[s + 1] = b.upper();
    r.low[s + 1] = l.upper();
  }
  return r;
}

}  // namespace porecert::proof
