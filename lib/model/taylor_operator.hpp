// The map of a Taylor model (V2.5) and the columns of its derivative, for any scalar S
// (docs/models.md §2). Coefficient vectors are in the monomial basis ξ^n on [0,1]. On interval
// types every result encloses the exact value for all data inside the inputs.
#pragma once
#include <cassert>
#include <vector>

#include "model/taylor_model.hpp"

namespace porecert::model {

template <class S>
using Poly = std::vector<S>;  // Σ c_n ξ^n

// σ(n) = Σ_j α_j n(n−1)…(n−j+1) of (V2.4): P maps D^p F = ξ^n to σ(n) ξ^n. Exact for small
// integer α; an enclosure otherwise.
template <class S>
S taylor_sigma(const TaylorModel<S>& m, long n) {
  S s(0);
  S fall(1);
  for (std::size_t j = 0; j < m.alpha.size(); ++j) {
    s = s + m.alpha[j] * fall;
    fall = fall * S(static_cast<double>(n - static_cast<long>(j)));
  }
  return s;
}

// λ_d(k) = 1 / (σ(k) (k+1)(k+2)…(k+p−d)): the mode u = ξ^k lifts to D^d F = λ_d(k) ξ^{k+p−d}
// (V2.6). An enclosure on interval types (outward division). Needs 0 ≤ d ≤ p and σ(k) > 0.
template <class S>
S taylor_lift(const TaylorModel<S>& m, int d, long k) {
  assert(d >= 0 && d <= m.p);
  S q = taylor_sigma(m, k);
  for (int i = 1; i <= m.p - d; ++i) q = q * S(static_cast<double>(k + i));
  return S(1) / q;
}

template <class S>
S taylor_inv_factorial(int n) {
  S f(1);
  for (int i = 2; i <= n; ++i) f = f * S(i);
  return S(1) / f;
}

// The constants F^{(d)}(0), d < p, of x (fixed ones from the model).
template <class S>
std::vector<S> taylor_constants(const TaylorModel<S>& m, const std::vector<S>& x) {
  std::vector<S> c(m.p, S(0));
  for (int d = 0; d < m.p; ++d) c[d] = m.fixed_at_0[d] ? *m.fixed_at_0[d] : x[m.free_index(d)];
  return c;
}

// D^d F, d = 0..p, as coefficient vectors (length N + p), from x = [scalars, u_0..u_{N−1}] (V2.6).
template <class S>
std::vector<Poly<S>> taylor_derivatives(const TaylorModel<S>& m, const std::vector<S>& x) {
  const int ns = m.n_scalars();
  const long N = static_cast<long>(x.size()) - ns;
  assert(N >= 0);
  const std::vector<S> c = taylor_constants(m, x);
  std::vector<Poly<S>> G(m.p + 1, Poly<S>(N + m.p, S(0)));
  for (int d = 0; d <= m.p; ++d) {
    for (int e = d; e < m.p; ++e) G[d][e - d] = G[d][e - d] + c[e] * taylor_inv_factorial<S>(e - d);
    for (long k = 0; k < N; ++k) G[d][k + m.p - d] = G[d][k + m.p - d] + x[ns + k] * taylor_lift(m, d, k);
  }
  return G;
}

template <class S>
Poly<S> taylor_mul(const Poly<S>& a, const Poly<S>& b) {
  if (a.empty() || b.empty()) return {};
  Poly<S> r(a.size() + b.size() - 1, S(0));
  for (std::size_t i = 0; i < a.size(); ++i)
    for (std::size_t j = 0; j < b.size(); ++j) r[i + j] = r[i + j] + a[i] * b[j];
  return r;
}

template <class S>
void taylor_add_into(Poly<S>& r, const Poly<S>& a, const S& c, long shift = 0) {
  if (r.size() < a.size() + shift) r.resize(a.size() + shift, S(0));
  for (std::size_t i = 0; i < a.size(); ++i) r[i + shift] = r[i + shift] + c * a[i];
}

// Value at ξ = 1 (sum of coefficients).
template <class S>
S taylor_at_1(const Poly<S>& a) {
  S s(0);
  for (const S& v : a) s = s + v;
  return s;
}

// Value at ξ ∈ [0,1] (Horner; an enclosure for interval ξ too).
template <class S>
S taylor_eval(const Poly<S>& a, const S& xi) {
  S s(0);
  for (std::size_t i = a.size(); i-- > 0;) s = s * xi + a[i];
  return s;
}

// The residual of (V2.5) at x: the function part as a full coefficient vector (every mode, no
// truncation: the candidate is a polynomial) and the boundary rows.
template <class S>
struct TaylorResidual {
  Poly<S> modes;
  std::vector<S> rows;
};

template <class S>
TaylorResidual<S> taylor_residual(const TaylorModel<S>& m, const std::vector<S>& x) {
  const int ns = m.n_scalars();
  const auto G = taylor_derivatives(m, x);
  TaylorResidual<S> r;
  r.modes.assign(x.begin() + ns, x.end());
  if (r.modes.empty()) r.modes.push_back(S(0));
  for (const auto& t : m.lin) taylor_add_into(r.modes, G[t.d], t.coef, t.e);
  for (const auto& t : m.quad) taylor_add_into(r.modes, taylor_mul(G[t.d1], G[t.d2]), t.coef);
  if (m.has_K) r.modes[0] = r.modes[0] - x[m.k_index()];
  for (const auto& row : m.rows) {
    S v = S(0) - row.value;
    for (int d = 0; d <= m.p; ++d) v = v + row.coef[d] * taylor_at_1(G[d]);
    r.rows.push_back(v);
  }
  return r;
}

// Column j of DF(x̄) (x̄ given through its derivatives G = taylor_derivatives), in full: the
// function part for every mode it reaches (V2.7: a mode u_k reaches modes ≥ k only) and the rows.
template <class S>
TaylorResidual<S> taylor_column(const TaylorModel<S>& m, const std::vector<Poly<S>>& G, int j) {
  const int ns = m.n_scalars();
  // The direction's derivatives: D^d h = hc[d] ξ^{hs[d]} (or absent).
  std::vector<S> hc(m.p + 1, S(0));
  std::vector<long> hs(m.p + 1, -1);
  TaylorResidual<S> col;
  if (j >= ns) {
    const long k = j - ns;
    for (int d = 0; d <= m.p; ++d) {
      hc[d] = taylor_lift(m, d, k);
      hs[d] = k + m.p - d;
    }
    col.modes.assign(k + 1, S(0));
    col.modes[k] = S(1);
  } else if (j == m.k_index()) {
    col.modes = {S(-1)};
    col.rows.assign(m.rows.size(), S(0));
    return col;
  } else {
    int e = -1;
    for (int d = 0; d < m.p; ++d)
      if (m.free_index(d) == j) e = d;
    assert(e >= 0);
    for (int d = 0; d <= e; ++d) {
      hc[d] = taylor_inv_factorial<S>(e - d);
      hs[d] = e - d;
    }
    col.modes = {S(0)};
  }
  for (const auto& t : m.lin)
    if (hs[t.d] >= 0) taylor_add_into(col.modes, Poly<S>{hc[t.d]}, t.coef, hs[t.d] + t.e);
  for (const auto& t : m.quad) {
    if (hs[t.d2] >= 0) taylor_add_into(col.modes, G[t.d1], t.coef * hc[t.d2], hs[t.d2]);
    if (hs[t.d1] >= 0) taylor_add_into(col.modes, G[t.d2], t.coef * hc[t.d1], hs[t.d1]);
  }
  for (const auto& row : m.rows) {
    S v(0);
    for (int d = 0; d <= m.p; ++d)
      if (hs[d] >= 0) v = v + row.coef[d] * hc[d];
    col.rows.push_back(v);
  }
  return col;
}

// Maps every scalar of a model through fn.
template <class T, class S, class Fn>
TaylorModel<T> convert_taylor(const TaylorModel<S>& m, Fn fn) {
  TaylorModel<T> r;
  r.id = m.id;
  r.equation_text = m.equation_text;
  r.p = m.p;
  for (const S& a : m.alpha) r.alpha.push_back(fn(a));
  for (const auto& f : m.fixed_at_0) r.fixed_at_0.push_back(f ? std::optional<T>(fn(*f)) : std::nullopt);
  r.has_K = m.has_K;
  for (const auto& t : m.lin) r.lin.push_back({fn(t.coef), t.e, t.d});
  for (const auto& t : m.quad) r.quad.push_back({fn(t.coef), t.d1, t.d2});
  for (const auto& row : m.rows) {
    TaylorRow<T> o;
    for (const S& c : row.coef) o.coef.push_back(fn(c));
    o.value = fn(row.value);
    o.text = row.text;
    r.rows.push_back(o);
  }
  for (const auto& p : m.params) r.params.push_back({p.name, fn(p.value)});
  r.values = m.values;
  return r;
}

}  // namespace porecert::model
