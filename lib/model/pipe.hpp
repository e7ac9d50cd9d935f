// Porous pipe (docs/models.md §2; Yuan & Finkelstein 1956, from memory): with ξ = r²/a² ∈ [0,1],
//     ξ F'''' + 2F''' + (R/2)(F'F'' − F F''') = 0,  F(0) = 0, F'' bounded at 0, F(1) = 1, F'(1) = 0,   (V2.1)
// integrated once (ξF''' + F'')' = ξF'''' + 2F''', (F'² − F F'')' = F'F'' − F F''':
//     ξF''' + F'' + (R/2)(F'² − F F'') = K.
// As a Taylor model (V2.4)–(V2.5): p = 2, u = ξF''' + F'' = (ξF'')', α = (1, 1), σ(n) = n + 1;
// F(0) = 0 fixed, F'(0) free, K unknown; rows F(1) = 1, F'(1) = 0. Regularity at ξ = 0 is built
// in: F'' = Σ u_n ξ^n / (n + 1) is a power series. R may be an interval.
#pragma once
#include "model/taylor_model.hpp"

namespace porecert::model {

inline constexpr const char* kPipeId = "porous-pipe";

template <class S>
TaylorModel<S> pipe(const S& R) {
  TaylorModel<S> m;
  m.id = kPipeId;
  m.equation_text =
      "xi F'''' + 2 F''' + (R/2) (F' F'' - F F''') = 0 on xi = r^2/a^2 in [0,1]; integrated: xi F''' + F'' + "
      "(R/2) (F'^2 - F F'') = K";
  m.p = 2;
  m.alpha = {S(1), S(1)};
  m.fixed_at_0 = {S(0), std::nullopt};
  m.has_K = true;
  const S h = R / S(2);  // exact: division by 2
  m.quad.push_back({h, 1, 1});
  m.quad.push_back({S(0) - h, 0, 2});
  m.rows.push_back({{S(1), S(0), S(0)}, S(1), "F(1) = 1"});
  m.rows.push_back({{S(0), S(1), S(0)}, S(0), "F'(1) = 0"});
  m.params.push_back({"R", R});
  m.values = {{"F'(0)", 1, 0.0, 1.0, "centre-line axial speed ratio (axial velocity is proportional to F'(xi))"},
              {"F''(0)", 2, 0.0, 1.0, "F''(0); K = F''(0) + (R/2) F'(0)^2"},
              {"F''(1)", 2, 1.0, 1.0, "wall shear (proportional to F''(1))"},
              {"K", -1, 0.0, 1.0, "axial pressure constant"}};
  return m;
}

}  // namespace porecert::model
