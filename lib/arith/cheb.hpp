// Chebyshev series on [0,1]: f(η) = Σ_k c_k T_k(2η − 1), c_0 not halved (docs/enclosures.md §3).
// Templated over the scalar S: on interval types every function returns an enclosure of the
// exact result for every choice of coefficients inside the inputs; on double / Mpfr the same
// code is a plain (non-rigorous) computation for candidate solvers.
// Norm: ‖c‖ = Σ |c_k| (ℓ¹); sup|f| ≤ ‖c‖ and ‖ab‖ ≤ ‖a‖‖b‖.
#pragma once
#include <algorithm>
#include <cassert>
#include <vector>

#include "arith/scalar.hpp"

namespace porecert::cheb {

template <class S>
using Series = std::vector<S>;

// Value at η (Clenshaw). For an interval η the result encloses the range over η (loose:
// the wrapping effect grows with the degree; use sup_norm.hpp for tight ranges).
template <class S>
S eval(const Series<S>& c, const S& eta) {
  if (c.empty()) return S(0);
  const S x = S(2) * eta - S(1);
  const S x2 = S(2) * x;
  S b1(0), b2(0);
  for (std::size_t k = c.size() - 1; k >= 1; --k) {
    S b0 = c[k] + x2 * b1 - b2;
    b2 = b1;
    b1 = b0;
  }
  return c[0] + x * b1 - b2;
}

// Value at η = 1 and at η = 0 (exact sums, tighter than eval).
template <class S>
S value_at_1(const Series<S>& c) {
  S s(0);
  for (const S& v : c) s = s + v;
  return s;
}
template <class S>
S value_at_0(const Series<S>& c) {
  S s(0);
  for (std::size_t k = 0; k < c.size(); ++k) s = (k % 2 == 0) ? s + c[k] : s - c[k];
  return s;
}

// d/dη (encloses the derivative exactly; one coefficient shorter).
template <class S>
Series<S> derivative(const Series<S>& c) {
  const std::size_t n = c.size();
  if (n <= 1) return Series<S>(1, S(0));
  Series<S> d(n - 1, S(0));
  S dk1(0), dk2(0);  // d_{k+1}, d_{k+2} in the x-variable recurrence
  for (std::size_t k = n - 1; k >= 1; --k) {
    S dk = dk2 + S(2 * static_cast<long>(k)) * c[k];  // d_{k-1} = d_{k+1} + 2k c_k
    d[k - 1] = dk;
    dk2 = dk1;
    dk1 = dk;
  }
  d[0] = d[0] / S(2);
  for (S& v : d) v = v * S(2);  // dx/dη = 2
  return d;
}

// Antiderivative F with F(0) = value0 (exact up to enclosure; one coefficient longer).
template <class S>
Series<S> antiderivative(const Series<S>& c, const S& value0) {
  const std::size_t n = c.size();
  Series<S> b(n + 1, S(0));
  auto at = [&](std::size_t k) { return k < n ? c[k] : S(0); };
  if (n >= 1) b[1] = at(0) - at(2) / S(2);
  for (std::size_t k = 2; k <= n; ++k) b[k] = (at(k - 1) - at(k + 1)) / S(2 * static_cast<long>(k));
  for (std::size_t k = 1; k <= n; ++k) b[k] = b[k] / S(2);  // dη = dx/2
  S alt(0);
  for (std::size_t k = 1; k <= n; ++k) alt = (k % 2 == 0) ? alt + b[k] : alt - b[k];
  b[0] = value0 - alt;
  return b;
}

// Full product (no truncation): T_i T_j = (T_{i+j} + T_{|i−j|}) / 2.
template <class S>
Series<S> product(const Series<S>& a, const Series<S>& b) {
  if (a.empty() || b.empty()) return {};
  Series<S> p(a.size() + b.size() - 1, S(0));
  for (std::size_t i = 0; i < a.size(); ++i) {
    for (std::size_t j = 0; j < b.size(); ++j) {
      const S h = a[i] * b[j] / S(2);
      p[i + j] = p[i + j] + h;
      p[i > j ? i - j : j - i] = p[i > j ? i - j : j - i] + h;
    }
  }
  return p;
}

// ℓ¹ norm Σ ν^k |c_k|, rounded up (rigorous for intervals; ν ≥ 1 is a double, exact).
template <class S>
double norm1_up(const Series<S>& c, double nu = 1.0) {
  double s = 0, w = 1;
  for (const S& v : c) {
    s = arith::add_up(s, arith::mul_up(w, arith::abs_up(v)));
    if (nu != 1.0) w = arith::mul_up(w, nu);
  }
  return s;
}

// Product truncated to n coefficients; tail_norm_up receives an upper bound of the ℓ¹ norm
// of what was dropped, so ‖ab − result‖ ≤ tail_norm_up.
template <class S>
Series<S> product_truncated(const Series<S>& a, const Series<S>& b, std::size_t n, double& tail_norm_up) {
  Series<S> p = product(a, b);
  tail_norm_up = 0;
  if (p.size() > n) {
    Series<S> tail(p.begin() + static_cast<long>(n), p.end());
    tail_norm_up = norm1_up(tail);
    p.resize(n);
  }
  return p;
}

template <class S>
Series<S> add(Series<S> a, const Series<S>& b) {
  if (a.size() < b.size()) a.resize(b.size(), S(0));
  for (std::size_t k = 0; k < b.size(); ++k) a[k] = a[k] + b[k];
  return a;
}
template <class S>
Series<S> scale(Series<S> a, const S& s) {
  for (S& v : a) v = v * s;
  return a;
}
template <class S>
Series<S> axpy(Series<S> y, const S& a, const Series<S>& x) {  // y + a x
  if (y.size() < x.size()) y.resize(x.size(), S(0));
  for (std::size_t k = 0; k < x.size(); ++k) y[k] = y[k] + a * x[k];
  return y;
}

// Chebyshev series of η itself and of a constant.
template <class S>
Series<S> identity_series() {
  return {S(1) / S(2), S(1) / S(2)};
}

// Coefficients of the degree-(n−1) interpolant through values at the Chebyshev points
// η_j = (1 + cos(π (j + ½)/n))/2, j = 0..n−1. Plain (non-rigorous) for double / Mpfr: for
// candidates only. O(n²).
template <class S>
Series<S> coeffs_from_values(const std::vector<S>& v);

// The points used by coeffs_from_values.
template <class S>
std::vector<S> chebyshev_points(std::size_t n);

}  // namespace porecert::cheb
