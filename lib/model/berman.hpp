// Berman's half-channel problem (Berman 1953): f'''' + R (f' f'' − f f''') = 0 on [0,1],
// f(0) = 0, f''(0) = 0, f(1) = 1, f'(1) = 0. Integrated once (docs/method.md §M2):
//     f''' + R (f'² − f f'') = K.                                                     (M2.1)
// R > 0 suction, R < 0 injection; R may be an interval (the certificate then holds for every R in it).
#pragma once
#include "model/model.hpp"

namespace porecert::model {

inline constexpr const char* kBermanId = "berman-half-channel";

template <class S>
Model<S> berman(const S& R) {
  Model<S> m;
  m.id = kBermanId;
  m.equation_text = "f'''' + R (f' f'' - f f''') = 0 on [0,1]; integrated: f''' + R (f'^2 - f f'') = K";
  m.fixed_at_0 = {S(0), std::nullopt, S(0)};
  m.quad.push_back({R, 1, 1});
  m.quad.push_back({S(0) - R, 0, 2});
  m.rows.push_back({{S(1), S(0), S(0)}, S(1), "f(1) = 1"});
  m.rows.push_back({{S(0), S(1), S(0)}, S(0), "f'(1) = 0"});
  m.params.push_back({"R", R});
  m.values = {{"f'(0)", 1, 0.0, 1.0, "centre-plane axial speed ratio"},
              {"f'''(0)", 3, 0.0, 1.0, "third derivative on the centre plane"},
              {"f''(1)", 2, 1.0, 1.0, "wall shear"},
              {"K", -1, 0.0, 1.0, "axial pressure constant"}};
  return m;
}

}  // namespace porecert::model
