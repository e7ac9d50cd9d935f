// Berman's equation reduced by its two symmetries (docs/method.md §S, equations (S1)–(S8)).
// g = R f solves the R-free equation g'''' = g g''' − g' g'' (S1), and t ↦ σ g(σ t) maps solutions
// to solutions (S2). Every solution with f'(0) ≠ 0 is therefore h(η) = σ g(σ η) for the solution g
// of the initial-value problem g(0) = g''(0) = 0, g'(0) = ε = ±1, g'''(0) = s, with σ the n-th zero
// of g' and R = σ g(σ) (S3). Since ε t + s t³/6 solves (S1) up to O(s²), we write
//     g = ε t + s t³/6 + s u,                                                               (S4)
// and u, which carries the fast mode with relative size O(1) even when s is exponentially small
// (u = O(s) at first, O(1/s) where g' vanishes), solves, with u(0) = u'(0) = u''(0) = u'''(0) = 0,
//     u'''' = ε(t u''' − u'') − s t³/3 + s L(u) + s (u u''' − u' u''),                         (S5)
//     L(u) = t³/6 u''' + u − t²/2 u'' − t u'.
// Its scaled s-derivative r = s ∂u/∂s (the same size as u) solves, with r(0..3) = 0,
//     r'''' = ε(t r''' − r'') − s t³/3 + s L(u) + s L(r) + s (u u''' − u' u'')
//             + s (r u''' + u r''' − r' u'' − u' r'').                                       (S6)
// This file holds the Taylor-coefficient recursion of (S5)/(S6) as model data; the non-rigorous
// shooting (lib/candidate/reduced_shooting) runs it on long double, the proof (lib/proof/reduced_ivp)
// on intervals. Templated over the scalar S.
#pragma once
#include <array>
#include <vector>

namespace porecert::model {

// State at a point t: u, u', u'', u''' and (when `variational`) r, r', r'', r''' with r = s ∂u/∂s.
template <class S>
using ReducedState = std::array<S, 8>;

namespace detail {
// Coefficient of τ^k in the product t^n · X(τ) about t0 (t = t0 + τ), from the coefficients X and
// the powers t0^0..t0^3 in pw. Binomial expansion of (t0 + τ)^n, n <= 3.
template <class S>
S tpow_times(int n, const std::array<S, 4>& pw, const std::vector<S>& X, int k) {
  static constexpr int binom[4][4] = {{1, 0, 0, 0}, {1, 1, 0, 0}, {1, 2, 1, 0}, {1, 3, 3, 1}};
  S r(0);
  for (int m = 0; m <= n && m <= k; ++m) r = r + S(binom[n][m]) * pw[n - m] * X[k - m];
  return r;
}
// Coefficient of τ^k of t^n itself.
template <class S>
S tpow(int n, const std::array<S, 4>& pw, int k) {
  static constexpr int binom[4][4] = {{1, 0, 0, 0}, {1, 1, 0, 0}, {1, 2, 1, 0}, {1, 3, 3, 1}};
  return k <= n ? S(binom[n][k]) * pw[n - k] : S(0);
}
}  // namespace detail

// Normalised Taylor coefficients of u (and r) about the point t0: u(t0 + τ) = Σ_k Z[k] τ^k, from
// the state y at t0, by matching coefficients of τ^k in (S5) / (S6) (equation (S7) in docs):
//     Z[k+4] = (τ^k-coefficient of the right side of (S5)) / ((k+1)(k+2)(k+3)(k+4)),
// with (D^j u)_k = (k+1)…(k+j) Z[k+j]. For interval S every output encloses the exact coefficient
// for every state in y, every s in s and every expansion point in t0 (t0 may be an interval: that is
// how the a-priori enclosure over a step is evaluated). Fills Z[0..kmax], V[0..kmax]; kmax >= 3.
template <class S>
void reduced_taylor(const ReducedState<S>& y, const S& t0, const S& s, int eps, bool variational, int kmax,
                    std::vector<S>& Z, std::vector<S>& V) {
  Z.assign(kmax + 1, S(0));
  V.assign(variational ? kmax + 1 : 0, S(0));
  const std::array<S, 4> pw{S(1), t0, t0 * t0, t0 * t0 * t0};
  // D0..D3[i] = (D^j u)_i; E0..E3 the same for r. Filled as Z, V grow.
  std::vector<S> D0(kmax + 1, S(0)), D1(kmax + 1, S(0)), D2(kmax + 1, S(0)), D3(kmax + 1, S(0));
  std::vector<S> E0, E1, E2, E3;
  if (variational) {
    E0.assign(kmax + 1, S(0));
    E1.assign(kmax + 1, S(0));
    E2.assign(kmax + 1, S(0));
    E3.assign(kmax + 1, S(0));
  }
  auto fill = [&](int i) {
    D0[i] = Z[i];
    if (i >= 1) D1[i - 1] = Z[i] * S(i);
    if (i >= 2) D2[i - 2] = Z[i] * S(static_cast<long>(i) * (i - 1));
    if (i >= 3) D3[i - 3] = Z[i] * S(static_cast<long>(i) * (i - 1) * (i - 2));
    if (variational) {
      E0[i] = V[i];
      if (i >= 1) E1[i - 1] = V[i] * S(i);
      if (i >= 2) E2[i - 2] = V[i] * S(static_cast<long>(i) * (i - 1));
      if (i >= 3) E3[i - 3] = V[i] * S(static_cast<long>(i) * (i - 1) * (i - 2));
    }
  };
  Z[0] = y[0];
  Z[1] = y[1];
  Z[2] = y[2] / S(2);
  Z[3] = y[3] / S(6);
  if (variational) {
    V[0] = y[4];
    V[1] = y[5];
    V[2] = y[6] / S(2);
    V[3] = y[7] / S(6);
  }
  for (int i = 0; i <= 3 && i <= kmax; ++i) fill(i);
  if (eps > 0) {  // types I/II: the term-by-term form (S5)/(S6), measured tighter there
    using detail::tpow;
    using detail::tpow_times;
    const S e(eps);
    // L(X)_k = (t³/6 X''' + X − t²/2 X'' − t X')_k for X with derivative coefficients (X0..X3).
    auto lin_s = [&](const std::vector<S>& X0, const std::vector<S>& X1, const std::vector<S>& X2,
                     const std::vector<S>& X3, int k) {
      return tpow_times(3, pw, X3, k) / S(6) + X0[k] - tpow_times(2, pw, X2, k) / S(2) - tpow_times(1, pw, X1, k);
    };
    for (int k = 0; k + 4 <= kmax; ++k) {
      const S lin = e * (tpow_times(1, pw, D3, k) - D2[k]);
      const S ls = lin_s(D0, D1, D2, D3, k);
      S zz(0);  // (u u''' − u' u'')_k
      for (int i = 0; i <= k; ++i) zz = zz + D0[i] * D3[k - i] - D1[i] * D2[k - i];
      const S rhs = lin - s * tpow(3, pw, k) / S(3) + s * ls + s * zz;
      const long denom = static_cast<long>(k + 1) * (k + 2) * (k + 3) * (k + 4);
      Z[k + 4] = rhs / S(denom);
      if (variational) {
        const S vlin = e * (tpow_times(1, pw, E3, k) - E2[k]);
        const S vls = lin_s(E0, E1, E2, E3, k);
        S mix(0);  // (r u''' + u r''' − r' u'' − u' r'')_k
        for (int i = 0; i <= k; ++i)
          mix = mix + E0[i] * D3[k - i] + D0[i] * E3[k - i] - E1[i] * D2[k - i] - D1[i] * E2[k - i];
        V[k + 4] = (vlin - s * tpow(3, pw, k) / S(3) + s * ls + s * vls + s * zz + s * mix) / S(denom);
      }
      fill(k + 4);
    }
    return;
  }
  // (S5) and (S6) are evaluated in the grouped form (S7'), exactly equal to them:
  //     u'''' = g (1 + u''') − g' (t + u''),
  //     r'''' = (g − ε t + s r)(1 + u''') + g r''' − (g' − ε + s r')(t + u'') − g' r'',
  // with g = ε t + s t³/6 + s u, g' = ε + s t²/2 + s u'. On intervals the grouping keeps the
  // cancellation inside g (its parts ε t, s t³/6 and s u are each much larger than g where the fast
  // mode decays, ε = −1), so the coefficients grow like |g|^k/k!, not like (|t| + |s| t³/6 + |s u|)^k/k!.
  const S e(eps);
  // Taylor coefficients of ε t + s t³/6 about t0 (cubic in τ).
  const std::array<S, 4> g0{t0 * (e + s * pw[2] / S(6)), e + s * pw[2] / S(2), s * t0 / S(2), s / S(6)};
  std::vector<S> G(kmax + 1, S(0));  // coefficients of g, filled with Z
  auto set_g = [&](int i) { G[i] = (i <= 3 ? g0[i] : S(0)) + s * Z[i]; };
  for (int i = 0; i <= 3 && i <= kmax; ++i) set_g(i);
  auto gp = [&](int i) { return G[i + 1] * S(i + 1); };                                  // coefficient of g'
  auto p3 = [&](int i) { return i == 0 ? S(1) + D3[0] : D3[i]; };                        // 1 + u'''
  auto p2 = [&](int i) { return i == 0 ? t0 + D2[0] : i == 1 ? S(1) + D2[1] : D2[i]; };  // t + u''
  // g − ε t + s r and g' − ε + s r' (variational part).
  auto h0 = [&](int i) {
    const S a = G[i] + s * V[i];
    return i == 0 ? a - e * t0 : i == 1 ? a - e : a;
  };
  auto h1 = [&](int i) {
    const S a = gp(i) + s * V[i + 1] * S(i + 1);
    return i == 0 ? a - e : a;
  };
  for (int k = 0; k + 4 <= kmax; ++k) {
    S rhs(0);
    for (int i = 0; i <= k; ++i) rhs = rhs + G[i] * p3(k - i) - gp(i) * p2(k - i);
    const long denom = static_cast<long>(k + 1) * (k + 2) * (k + 3) * (k + 4);
    Z[k + 4] = rhs / S(denom);
    if (variational) {
      S v(0);
      for (int i = 0; i <= k; ++i) v = v + h0(i) * p3(k - i) + G[i] * E3[k - i] - h1(i) * p2(k - i) - gp(i) * E2[k - i];
      V[k + 4] = v / S(denom);
    }
    fill(k + 4);
    set_g(k + 4);
  }
}

// Coefficient of τ^k in the Taylor series of D^j u (j = 0..3) from the coefficients Z.
template <class S>
S derivative_coefficient(const std::vector<S>& Z, int j, int k) {
  long f = 1;
  for (int i = 1; i <= j; ++i) f *= (k + i);
  return Z[k + j] * S(f);
}

// g and its derivatives (S4) from t, s and D^j u (and D^j r) at t:
//   g = ε t + s t³/6 + s u, g' = ε + s t²/2 + s u', g'' = s t + s u'', g''' = s + s u''',
//   ∂g/∂s = t³/6 + u + r, ∂g'/∂s = t²/2 + u' + r', ∂g''/∂s = t + u'' + r'', ∂g'''/∂s = 1 + u''' + r'''.
template <class S>
S reduced_g(int j, const S& t, const S& s, int eps, const S& uj) {
  switch (j) {
    case 0:
      return S(eps) * t + s * (t * t * t / S(6) + uj);
    case 1:
      return S(eps) + s * (t * t / S(2) + uj);
    case 2:
      return s * (t + uj);
    default:
      return s * (S(1) + uj);
  }
}
template <class S>
S reduced_g_ds(int j, const S& t, const S& uj, const S& rj) {
  const S p = j == 0 ? t * t * t / S(6) : j == 1 ? t * t / S(2) : j == 2 ? t : S(1);
  return p + uj + rj;
}

}  // namespace porecert::model
