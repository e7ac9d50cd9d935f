// Models whose unknown is a Taylor series about ξ = 0 (docs/models.md §2, (V2.4)–(V2.6)): an ODE
// with polynomial coefficients whose principal part is of Euler type,
//     P[F] = Σ_j α_j ξ^j D^{p+j} F,  α_j ≥ 0, α_0 > 0,                                  (V2.4)
// so that P maps D^p F = ξ^n to σ(n) ξ^n with σ(n) = Σ_j α_j n(n−1)…(n−j+1) > 0. The unknown
// is u = P[F] = Σ u_n ξ^n; D^p F = Σ u_n ξ^n / σ(n) (regular at ξ = 0 by construction) and the
// lower derivatives follow by integration from ξ = 0 with constants F^{(d)}(0), d < p, each
// fixed or unknown. The equation (once integrated when K is used) reads
//     u + Σ_lin c ξ^e D^d F + Σ_quad c D^{d1}F D^{d2}F − K = 0,   d, d1, d2 ≤ p,       (V2.5)
// with one boundary row Σ_{d≤p} a_d D^d F(1) = value per scalar unknown (free constants, K).
// A model is data here; the proof (lib/proof/taylor_nk.hpp) is the same for every one.
#pragma once
#include <optional>
#include <string>
#include <vector>

#include "model/model.hpp"

namespace porecert::model {

template <class S>
struct TaylorLin {
  S coef;
  int e;  // power of ξ
  int d;  // derivative order, 0..p
};

template <class S>
struct TaylorRow {
  std::vector<S> coef;  // on F(1), F'(1), ..., F^{(p)}(1)
  S value;
  std::string text;
};

template <class S>
struct TaylorModel {
  std::string id;
  std::string equation_text;
  int p = 2;                                 // D^p F = Σ u_n ξ^n / σ(n)
  std::vector<S> alpha;                      // principal part (V2.4); exact small integers in practice
  std::vector<std::optional<S>> fixed_at_0;  // F^{(d)}(0), d = 0..p−1; nullopt = unknown
  bool has_K = true;                         // the constant of integration K is an unknown
  std::vector<TaylorLin<S>> lin;
  std::vector<QuadTerm<S>> quad;
  std::vector<TaylorRow<S>> rows;
  std::vector<Parameter<S>> params;
  std::vector<ValueKey> values;  // d = −1: K; else scale · D^d F(at), 0 ≤ d ≤ p

  // Unknown layout x = [free F^{(d)}(0) in increasing d..., K (if has_K), u_0, u_1, ...].
  int n_free() const {
    int n = 0;
    for (const auto& f : fixed_at_0) n += f ? 0 : 1;
    return n;
  }
  int n_scalars() const { return n_free() + (has_K ? 1 : 0); }
  int k_index() const { return has_K ? n_free() : -1; }
  int free_index(int d) const {
    int n = 0;
    for (int e = 0; e < static_cast<int>(fixed_at_0.size()); ++e)
      if (!fixed_at_0[e]) {
        if (e == d) return n;
        ++n;
      }
    return -1;
  }
  bool well_formed() const {
    if (p < 1 || static_cast<int>(fixed_at_0.size()) != p || alpha.empty()) return false;
    if (static_cast<int>(rows.size()) != n_scalars()) return false;
    for (const auto& r : rows)
      if (static_cast<int>(r.coef.size()) != p + 1) return false;
    for (const auto& t : lin)
      if (t.d < 0 || t.d > p || t.e < 0) return false;
    for (const auto& t : quad)
      if (t.d1 < 0 || t.d1 > p || t.d2 < 0 || t.d2 > p) return false;
    return true;
  }
};

}  // namespace porecert::model
