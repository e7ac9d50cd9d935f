// Variants of Berman's problem as model data (../shared/notes/method.md §1, derived there; the
// proof layer is unchanged for them). Same [0,1] scaling and symmetry conditions f(0) = f''(0) = 0.
#pragma once
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

}  // namespace porecert::model
