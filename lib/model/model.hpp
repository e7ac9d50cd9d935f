// The model layer: an ODE boundary-value problem on [0,1] of the shape all porecert variants
// share (docs/method.md §M1). Unknown u = f''' as a Chebyshev series; the lower derivatives
// follow by integration from η = 0 with constants f(0), f'(0), f''(0), each fixed or unknown:
//     D³f = u,  D^d f = f^{(d)}(0) + ∫₀^η D^{d+1} f,                               (M1.1)
// the equation integrated once (K the axial-pressure constant, an unknown),
//     u + Σ_lin c·w(η)·D^d f + Σ_quad c·D^{d1} f·D^{d2} f − K = 0,                    (M1.2)
// and boundary rows at η = 1,  Σ_{d≤2} a_d D^d f(1) = value.                            (M1.3)
// A variant is new data here; the proof layer never changes for it.
// Templated over the scalar S: interval types for proofs, double / Mpfr for candidates.
#pragma once
#include <array>
#include <optional>
#include <string>
#include <vector>

#include "arith/cheb.hpp"

namespace porecert::model {

template <class S>
struct LinTerm {
  S coef;
  int d;                   // derivative order 0..3
  cheb::Series<S> weight;  // w(η); empty means w = 1
};

template <class S>
struct QuadTerm {
  S coef;
  int d1, d2;  // coef · D^{d1} f · D^{d2} f
};

template <class S>
struct BoundaryRow {
  std::array<S, 3> coef;  // on f(1), f'(1), f''(1)
  S value;
  std::string text;  // e.g. "f(1) = 1"
};

template <class S>
struct Parameter {
  std::string name;  // e.g. "R"
  S value;
};

// A reported value of the solution (docs/models.md): scale · D^d f(at), or scale · K when d = −1.
// `at` and `scale` are exact binary numbers (0, 1/2, 1; powers of two), so no rounding enters.
struct ValueKey {
  std::string key;      // e.g. "f''(1)"; the certificate's `values` key
  int d = 0;            // derivative order 0..3, or −1 for K
  double at = 0;        // point in the model variable on [0,1]
  double scale = 1;     // the physical value is scale · (model value)
  std::string meaning;  // in words
};

template <class S>
struct Model {
  std::string id;                              // stable identifier used in certificates, e.g. "berman-half-channel"
  std::string equation_text;                   // human-readable equation
  std::array<std::optional<S>, 3> fixed_at_0;  // f(0), f'(0), f''(0); nullopt = unknown
  std::vector<LinTerm<S>> lin;
  std::vector<QuadTerm<S>> quad;
  std::vector<BoundaryRow<S>> rows;
  std::vector<Parameter<S>> params;
  std::vector<ValueKey> values;  // reported values (empty: none beyond the proof's own)

  // Unknown layout x = [free f^{(d)}(0) in increasing d..., K, u_0, u_1, ...].
  int n_free() const {
    int n = 0;
    for (const auto& f : fixed_at_0) n += f ? 0 : 1;
    return n;
  }
  int n_scalars() const { return n_free() + 1; }
  int k_index() const { return n_free(); }
  // Index in x of f^{(d)}(0), or −1 if it is fixed.
  int free_index(int d) const {
    int n = 0;
    for (int e = 0; e < 3; ++e) {
      if (!fixed_at_0[e]) {
        if (e == d) return n;
        ++n;
      }
    }
    return -1;
  }
  // Structural invariant: one boundary row per scalar unknown (free constants and K), so the
  // system is square: rows ↔ scalars, function mode k ↔ u_k (docs/method.md §M3).
  bool well_formed() const { return static_cast<int>(rows.size()) == n_scalars(); }
};

// Maps every scalar of a model through fn (e.g. interval → midpoint double, Im → Id hull).
template <class T, class S, class Fn>
Model<T> convert(const Model<S>& m, Fn fn) {
  Model<T> r;
  r.id = m.id;
  r.equation_text = m.equation_text;
  for (int d = 0; d < 3; ++d)
    if (m.fixed_at_0[d]) r.fixed_at_0[d] = fn(*m.fixed_at_0[d]);
  auto series = [&](const cheb::Series<S>& s) {
    cheb::Series<T> o;
    for (const S& v : s) o.push_back(fn(v));
    return o;
  };
  for (const auto& t : m.lin) r.lin.push_back({fn(t.coef), t.d, series(t.weight)});
  for (const auto& t : m.quad) r.quad.push_back({fn(t.coef), t.d1, t.d2});
  for (const auto& b : m.rows) r.rows.push_back({{fn(b.coef[0]), fn(b.coef[1]), fn(b.coef[2])}, fn(b.value), b.text});
  for (const auto& p : m.params) r.params.push_back({p.name, fn(p.value)});
  r.values = m.values;
  return r;
}

}  // namespace porecert::model
