// The map F of (M1.2)-(M1.3) and its derivative, for any scalar S (docs/method.md §M1).
// On interval types the results enclose the exact values for all data inside the inputs.
#pragma once
#include <array>
#include <cassert>

#include "model/model.hpp"

namespace porecert::model {

// D^0 f .. D^3 f as Chebyshev series, from the constants f^{(d)}(0) and u = f''' (M1.1).
template <class S>
std::array<cheb::Series<S>, 4> lift(const std::array<S, 3>& at0, const cheb::Series<S>& u) {
  std::array<cheb::Series<S>, 4> D;
  D[3] = u.empty() ? cheb::Series<S>{S(0)} : u;
  for (int d = 2; d >= 0; --d) D[d] = cheb::antiderivative(D[d + 1], at0[d]);
  return D;
}

// Constants f^{(d)}(0) of the unknown x (fixed ones from the model) and its u part.
template <class S>
std::array<S, 3> constants_of(const Model<S>& m, const std::vector<S>& x) {
  std::array<S, 3> c{S(0), S(0), S(0)};
  for (int d = 0; d < 3; ++d) c[d] = m.fixed_at_0[d] ? *m.fixed_at_0[d] : x[m.free_index(d)];
  return c;
}
template <class S>
cheb::Series<S> u_of(const Model<S>& m, const std::vector<S>& x) {
  return cheb::Series<S>(x.begin() + m.n_scalars(), x.end());
}

// Product that skips exact zeros of b (the direction series are sparse).
template <class S>
cheb::Series<S> product_sparse(const cheb::Series<S>& a, const cheb::Series<S>& b) {
  if (a.empty() || b.empty()) return {};
  cheb::Series<S> p(a.size() + b.size() - 1, S(0));
  for (std::size_t j = 0; j < b.size(); ++j) {
    if constexpr (arith::Interval<S>) {
      if (b[j].lower() == 0 && b[j].upper() == 0) continue;
    } else {
      if (b[j] == S(0)) continue;
    }
    const S bj = b[j] / S(2);
    for (std::size_t i = 0; i < a.size(); ++i) {
      const S h = a[i] * bj;
      p[i + j] = p[i + j] + h;
      const std::size_t k = i > j ? i - j : j - i;
      p[k] = p[k] + h;
    }
  }
  return p;
}

template <class S>
struct Value {
  std::vector<S> rows;  // boundary rows (M1.3), residual form Σ a_d D^d f(1) − value
  cheb::Series<S> fun;  // (M1.2), all coefficients (no truncation)
};

// F(x): exact enclosure of the residual (no truncation; length ≈ 2·len(u) + 8).
template <class S>
Value<S> residual(const Model<S>& m, const std::vector<S>& x) {
  assert(m.well_formed());
  const auto D = lift(constants_of(m, x), u_of(m, x));
  Value<S> v;
  for (const auto& r : m.rows) {
    S s = S(0) - r.value;
    for (int d = 0; d < 3; ++d) s = s + r.coef[d] * cheb::value_at_1(D[d]);
    v.rows.push_back(s);
  }
  cheb::Series<S> f = D[3];
  f[0] = f[0] - x[m.k_index()];
  for (const auto& t : m.lin)
    f = cheb::add(f, cheb::scale(t.weight.empty() ? D[t.d] : product_sparse(D[t.d], t.weight), t.coef));
  for (const auto& t : m.quad) f = cheb::add(f, cheb::scale(cheb::product(D[t.d1], D[t.d2]), t.coef));
  v.fun = std::move(f);
  return v;
}

// DF(x̄) h for the direction h with constants c = h^{(d)}(0), u-part u and K-part dK; Dbar = lift
// of x̄. On interval types it encloses the exact value for all data inside the inputs.
template <class S>
Value<S> directional(const Model<S>& m, const std::array<cheb::Series<S>, 4>& Dbar, const std::array<S, 3>& c,
                     const cheb::Series<S>& u, const S& dK) {
  const auto D = lift(c, u);
  Value<S> v;
  for (const auto& r : m.rows) {
    S s(0);
    for (int d = 0; d < 3; ++d) s = s + r.coef[d] * cheb::value_at_1(D[d]);
    v.rows.push_back(s);
  }
  cheb::Series<S> f = D[3];
  f[0] = f[0] - dK;
  for (const auto& t : m.lin)
    f = cheb::add(f, cheb::scale(t.weight.empty() ? D[t.d] : product_sparse(t.weight, D[t.d]), t.coef));
  for (const auto& t : m.quad) {
    f = cheb::add(f, cheb::scale(product_sparse(Dbar[t.d1], D[t.d2]), t.coef));
    f = cheb::add(f, cheb::scale(product_sparse(Dbar[t.d2], D[t.d1]), t.coef));
  }
  v.fun = std::move(f);
  return v;
}

// The constants h^{(d)}(0) of a direction v in the unknown layout: free ones from v, fixed ones 0.
template <class S>
std::array<S, 3> direction_constants(const Model<S>& m, const std::vector<S>& v) {
  std::array<S, 3> c{S(0), S(0), S(0)};
  for (int d = 0; d < 3; ++d)
    if (!m.fixed_at_0[d]) c[d] = v[m.free_index(d)];
  return c;
}

// DF(x̄) applied to the unit direction e_j of the unknown layout; Dbar = lift of x̄.
// The unit direction e_j of the unknown layout as (constants at 0, u-part, K-part).
template <class S>
struct UnitDirection {
  std::array<S, 3> c{S(0), S(0), S(0)};
  cheb::Series<S> u;
  S dK = S(0);
};
template <class S>
UnitDirection<S> unit_direction(const Model<S>& m, std::size_t j) {
  const int ns = m.n_scalars();
  UnitDirection<S> e;
  if (static_cast<int>(j) < ns) {
    if (static_cast<int>(j) == m.k_index()) {
      e.dK = S(1);
    } else {
      for (int d = 0; d < 3; ++d)
        if (m.free_index(d) == static_cast<int>(j)) e.c[d] = S(1);
    }
  } else {
    e.u.assign(j - ns + 1, S(0));
    e.u.back() = S(1);
  }
  return e;
}

template <class S>
Value<S> derivative_column(const Model<S>& m, const std::array<cheb::Series<S>, 4>& Dbar, std::size_t j) {
  const UnitDirection<S> e = unit_direction(m, j);
  return directional(m, Dbar, e.c, e.u, e.dK);
}

// D²F[v, e_j]: the quadratic terms of (M1.2) with one factor the lift Dv of a direction v and the
// other the unit direction e_j (rows and linear terms are zero). DF(x̄ + s v) e_j =
// DF(x̄) e_j + s D²F[v, e_j] exactly. Used for Z₀ over a box (docs/method.md (M3.14)).
template <class S>
Value<S> second_derivative_column(const Model<S>& m, const std::array<cheb::Series<S>, 4>& Dv, std::size_t j) {
  const UnitDirection<S> e = unit_direction(m, j);  // the K-part does not enter D²F
  const auto D = lift(e.c, e.u);
  Value<S> v;
  v.rows.assign(m.rows.size(), S(0));
  v.fun = cheb::Series<S>{S(0)};
  for (const auto& t : m.quad) {
    v.fun = cheb::add(v.fun, cheb::scale(product_sparse(Dv[t.d1], D[t.d2]), t.coef));
    v.fun = cheb::add(v.fun, cheb::scale(product_sparse(Dv[t.d2], D[t.d1]), t.coef));
  }
  return v;
}

// DF(x̄) v for a direction v in the unknown layout (Dbar = lift of x̄), in one pass. On interval
// types it encloses the exact product for all data inside the inputs. Used by the R-predictor of
// interval boxes (docs/method.md (M3.11)).
template <class S>
Value<S> derivative_apply(const Model<S>& m, const std::array<cheb::Series<S>, 4>& Dbar, const std::vector<S>& v) {
  return directional(m, Dbar, direction_constants(m, v), u_of(m, v), v[m.k_index()]);
}

// D^d of the direction v (d = 0..3): the lift with the fixed constants at 0 taken as zero, so
// lift(x̄ + s v) = lift(x̄) + s · lift_direction(v) exactly.
template <class S>
std::array<cheb::Series<S>, 4> lift_direction(const Model<S>& m, const std::vector<S>& v) {
  return lift(direction_constants(m, v), u_of(m, v));
}

// Q(v) = ½ D²F[v, v]: the quadratic terms of (M1.2) on the lift of the direction v (fixed
// constants taken as zero; the rows are linear, so their part is zero). F(x̄ + v) = F(x̄) +
// DF(x̄) v + Q(v) exactly. Used by the R-predictor (docs/method.md (M3.11)).
template <class S>
Value<S> quadratic_part(const Model<S>& m, const std::vector<S>& v) {
  const auto D = lift_direction(m, v);
  Value<S> out;
  out.rows.assign(m.rows.size(), S(0));
  out.fun = cheb::Series<S>{S(0)};
  for (const auto& t : m.quad) out.fun = cheb::add(out.fun, cheb::scale(cheb::product(D[t.d1], D[t.d2]), t.coef));
  return out;
}

// a + s·b, rows and function coefficients (the shorter series padded with zeros).
template <class S>
Value<S> add_scaled(Value<S> a, const Value<S>& b, const S& s) {
  assert(a.rows.size() == b.rows.size());
  for (std::size_t i = 0; i < a.rows.size(); ++i) a.rows[i] = a.rows[i] + s * b.rows[i];
  a.fun = cheb::add(a.fun, cheb::scale(b.fun, s));
  return a;
}

}  // namespace porecert::model
