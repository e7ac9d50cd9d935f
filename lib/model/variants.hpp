// Variants of Berman's problem as model data (../shared/notes/method.md §1, derived there; the
// proof layer is unchanged for them). Same [0,1] scaling and symmetry conditions f(0) = f''(0) = 0.
#pragma once
#include <optional>

#include "model/berman.hpp"

namespace porecert::model {

// Transverse magnetic field, Hartmann number M (M2 = M²): f'''' + R(f'f'' − f f''') − M² f'' = 0;
// integrated: f''' + R(f'² − f f'') − M² f' = K.                                         (M2.2)
template <class S>
Model<S> berman_mhd(const S& R, const S& M2) {
  Model<S> m = berman(R);
  m.id = "berman-half-channel-mhd";
  m.equation_text = "f'''' + R (f' f'' - f f''') - M^2 f'' = 0; integrated: f''' + R (f'^2 - f f'') - M^2 f' = K";
  m.lin.push_back({S(0) - M2, 1, {}});
  m.params.push_back({"M^2", M2});
  return m;
}

// Slip wall with slip length β h: the row f'(1) = 0 becomes f'(1) + β f''(1) = 0.           (M2.3)
template <class S>
Model<S> berman_slip(const S& R, const S& beta) {
  Model<S> m = berman(R);
  m.id = "berman-half-channel-slip";
  m.rows[1] = {{S(0), S(1), beta}, S(0), "f'(1) + beta f''(1) = 0"};
  m.params.push_back({"beta", beta});
  return m;
}

// Expanding / contracting walls, expansion ratio α (docs/models.md §3):
// f'''' + α(η f''' + 3 f'') + R(f'f'' − f f''') = 0; integrated, using (η f'')' = η f''' + f'',
// f''' + α(η f'' + 2 f') + R(f'² − f f'') = K.                                         (V3.2)
template <class S>
Model<S> berman_moving_walls(const S& R, const S& alpha) {
  Model<S> m = berman(R);
  m.id = "berman-half-channel-moving-walls";
  m.equation_text =
      "f'''' + alpha (eta f''' + 3 f'') + R (f' f'' - f f''') = 0; integrated: f''' + alpha (eta f'' + 2 f') + R (f'^2 "
      "- f f'') = K";
  m.lin.push_back({alpha, 2, cheb::identity_series<S>()});
  m.lin.push_back({S(2) * alpha, 1, {}});
  m.params.push_back({"alpha", alpha});
  return m;
}

// Full channel η ∈ [−1,1] with unequal walls f(1) = 1, f(−1) = −a, f'(±1) = 0, mapped to
// x = (η + 1)/2 ∈ [0,1], g(x) = f(η), d/dx = 2 d/dη, g^{(k)} = 2^k f^{(k)} (docs/models.md §1):
// g'''' + 2R(g'g'' − g g''') = 0; integrated g''' + 2R(g'² − g g'') = K_x, K = K_x / 8;
// g(0) = −a, g'(0) = 0 (fixed at x = 0), g(1) = 1, g'(1) = 0 (rows at x = 1).      (V1.2)
template <class S>
Model<S> full_channel(const S& R, const S& a) {
  Model<S> m;
  m.id = "full-channel";
  m.equation_text =
      "f'''' + R (f' f'' - f f''') = 0 on eta in [-1,1]; x = (eta + 1)/2, g(x) = f(eta): g''' + 2 R (g'^2 - g g'') "
      "= K_x on [0,1], K = K_x / 8";
  m.fixed_at_0 = {S(0) - a, S(0), std::nullopt};
  const S h = S(2) * R;
  m.quad.push_back({h, 1, 1});
  m.quad.push_back({S(0) - h, 0, 2});
  m.rows.push_back({{S(1), S(0), S(0)}, S(1), "f(1) = 1"});
  m.rows.push_back({{S(0), S(1), S(0)}, S(0), "f'(1) = 0"});
  m.params.push_back({"R", R});
  m.params.push_back({"a", a});
  m.values = {{"f'(0)", 1, 0.5, 0.5, "axial speed ratio on the mid-plane eta = 0"},
              {"f'''(0)", 3, 0.5, 0.125, "third derivative on the mid-plane eta = 0"},
              {"f''(1)", 2, 1.0, 0.25, "shear at the upper wall eta = 1"},
              {"f''(-1)", 2, 0.0, 0.25, "shear at the lower wall eta = -1"},
              {"K", -1, 0.0, 0.125, "axial pressure constant (eta scaling)"}};
  return m;
}

}  // namespace porecert::model
