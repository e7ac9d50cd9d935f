// Lohner's QR representation of an enclosure (docs/method.md (S13)–(S15)): a set of states is kept as
//     X ∈ x̂ + A r,   x̂ a point vector, A a point matrix (nearly orthogonal), r an interval box,
// so that a linear map that shears or contracts the set (the decaying fast mode of the reduced equation
// for ε = −1) does not wrap it into an ever larger axis-parallel box. Also the forward-mode dual
// numbers that give the Jacobian of the Taylor step map over a box.
// Enclosure contract (docs/enclosures.md §1): every set returned contains every point of the set
// described by the inputs; loose when the map is far from linear over the box (the Jacobian is an
// interval matrix over the whole hull). Out of domain (a non-invertible basis): std::runtime_error.
#pragma once
#include <Eigen/Dense>
#include <algorithm>
#include <array>
#include <cassert>
#include <cmath>
#include <numeric>
#include <stdexcept>
#include <vector>

#include "arith/interval.hpp"

namespace porecert::proof::lohner {

// Value and gradient (N components) over intervals; `konst` marks a value with zero gradient, so
// constants cost no gradient arithmetic. Each operation encloses the exact value and gradient of
// the exact operation for every point of the inputs (chain rule in interval arithmetic).
template <arith::Interval I, int N>
struct Dual {
  I v;
  std::array<I, N> d{};
  bool konst = true;
  Dual() : v(0) {}
  Dual(int x) : v(x) {}       // NOLINT: the Taylor recursion builds constants as S(int)
  Dual(long x) : v(x) {}      // NOLINT
  Dual(const I& x) : v(x) {}  // NOLINT
  static Dual variable(const I& x, int j) {
    Dual r(x);
    r.konst = false;
    for (auto& e : r.d) e = I(0);
    r.d[j] = I(1);
    return r;
  }
  const I& grad(int j) const {
    static const I zero(0);
    return konst ? zero : d[j];
  }
};
template <arith::Interval I, int N>
Dual<I, N> operator+(const Dual<I, N>& a, const Dual<I, N>& b) {
  Dual<I, N> r(a.v + b.v);
  if (a.konst && b.konst) return r;
  r.konst = false;
  for (int j = 0; j < N; ++j) r.d[j] = a.konst ? b.d[j] : b.konst ? a.d[j] : a.d[j] + b.d[j];
  return r;
}
template <arith::Interval I, int N>
Dual<I, N> operator-(const Dual<I, N>& a, const Dual<I, N>& b) {
  Dual<I, N> r(a.v - b.v);
  if (a.konst && b.konst) return r;
  r.konst = false;
  for (int j = 0; j < N; ++j) r.d[j] = a.konst ? I(0) - b.d[j] : b.konst ? a.d[j] : a.d[j] - b.d[j];
  return r;
}
template <arith::Interval I, int N>
Dual<I, N> operator*(const Dual<I, N>& a, const Dual<I, N>& b) {
  Dual<I, N> r(a.v * b.v);
  if (a.konst && b.konst) return r;
  r.konst = false;
  for (int j = 0; j < N; ++j) r.d[j] = a.konst ? a.v * b.d[j] : b.konst ? a.d[j] * b.v : a.d[j] * b.v + a.v * b.d[j];
  return r;
}
template <arith::Interval I, int N>
Dual<I, N> operator/(const Dual<I, N>& a, const Dual<I, N>& b) {
  Dual<I, N> r(a.v / b.v);
  if (a.konst && b.konst) return r;
  r.konst = false;
  if (b.konst) {
    for (int j = 0; j < N; ++j) r.d[j] = a.d[j] / b.v;
    return r;
  }
  const I b2 = b.v * b.v;
  for (int j = 0; j < N; ++j) r.d[j] = (a.grad(j) * b.v - a.v * b.d[j]) / b2;
  return r;
}

// The set x̂ + A r (S13); n × n, A row-major in doubles (exact in either interval type).
template <arith::Interval I>
struct Set {
  int n = 0;
  std::vector<I> x;       // centre, thin intervals
  std::vector<double> A;  // basis
  std::vector<I> r;       // box in the basis
};

// The box {x0} (widths of x0 kept in r) in the coordinate basis.
template <arith::Interval I>
Set<I> from_box(const std::vector<I>& x0) {
  Set<I> s;
  s.n = static_cast<int>(x0.size());
  s.A.assign(s.n * s.n, 0.0);
  for (int i = 0; i < s.n; ++i) {
    s.A[i * s.n + i] = 1.0;
    const I m(boost::numeric::median(x0[i]));
    s.x.push_back(m);
    s.r.push_back(x0[i] - m);
  }
  return s;
}

// Interval hull of x̂ + A r: contains every point of the set.
template <arith::Interval I>
std::vector<I> hull(const Set<I>& s) {
  std::vector<I> h(s.n);
  for (int i = 0; i < s.n; ++i) {
    I acc = s.x[i];
    for (int j = 0; j < s.n; ++j)
      if (s.A[i * s.n + j] != 0.0) acc = acc + I(s.A[i * s.n + j]) * s.r[j];
    h[i] = acc;
  }
  return h;
}

// Enclosure of Q⁻¹ for a double matrix Q (S15): with G = QᵀQ − I in interval arithmetic and
// δ ≥ ‖G‖∞, Q⁻¹ = (I + G)⁻¹ Qᵀ = Qᵀ + F Qᵀ with ‖F‖∞ ≤ δ/(1 − δ), so every entry of Q⁻¹ lies in
// Qᵀ ± δ ‖Qᵀ‖∞ / (1 − δ). Throws when δ ≥ 1/2 (Q not near orthogonal: no enclosure claimed).
template <arith::Interval I>
std::vector<I> inverse_of_orthogonal(const std::vector<double>& Q, int n) {
  I delta(0), qn(0);
  for (int i = 0; i < n; ++i) {
    I row(0), qrow(0);
    for (int j = 0; j < n; ++j) {
      I g = i == j ? I(-1) : I(0);
      for (int k = 0; k < n; ++k) g = g + I(Q[k * n + i]) * I(Q[k * n + j]);
      row = row + I(boost::numeric::norm(g));
      qrow = qrow + I(std::fabs(Q[j * n + i]));
    }
    delta = I(boost::numeric::max(delta, row).upper());
    qn = I(boost::numeric::max(qn, qrow).upper());
  }
  if (!(arith::upper_up(delta) < 0.5)) throw std::runtime_error("lohner: basis not near orthogonal");
  const I d = delta * qn / (I(1) - delta);
  const I pm = arith::make_unchecked<I>(arith::unchecked, -d.upper(), d.upper());
  std::vector<I> inv(n * n);
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) inv[i * n + j] = I(Q[j * n + i]) + pm;
  return inv;
}

// One Lohner update (S14): given that the new set lies in v + M r (v an interval vector, M an
// interval n × n matrix, r the old box), returns x̂' = mid v, A' = Q from the QR factorisation of
// mid(M) with its columns sorted by |mid M_j| · width(r_j) (longest first), and
//     r' = ([Q⁻¹] M) r + [Q⁻¹] (v − x̂'),
// so that v + M r ⊆ x̂' + A' r'.
template <arith::Interval I>
Set<I> update(const std::vector<I>& v, const std::vector<I>& M, const std::vector<I>& r) {
  const int n = static_cast<int>(v.size());
  for (const I& e : v)
    if (!std::isfinite(arith::mag_up(e))) throw std::runtime_error("lohner: unbounded image of the set");
  for (const I& e : M)
    if (!std::isfinite(arith::mag_up(e))) throw std::runtime_error("lohner: unbounded Jacobian");
  Set<I> s;
  s.n = n;
  for (int i = 0; i < n; ++i) s.x.push_back(I(boost::numeric::median(v[i])));
  Eigen::MatrixXd B(n, n);
  std::vector<double> len(n, 0.0);
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      B(i, j) = arith::mid_double(M[i * n + j]);
      len[j] = std::max(len[j], std::fabs(B(i, j)));  // max norm: no overflow in the ordering either
    }
  for (int j = 0; j < n; ++j) len[j] *= arith::width_up(r[j]);
  std::vector<int> perm(n);
  std::iota(perm.begin(), perm.end(), 0);
  std::stable_sort(perm.begin(), perm.end(), [&](int a, int b) { return len[a] > len[b]; });
  // Columns scaled to unit size before the QR: the spans (hence Q) do not change, and huge
  // entries (fast modes over a wide s) no longer overflow the Householder norms.
  Eigen::MatrixXd BP(n, n);
  for (int j = 0; j < n; ++j) {
    const double c = B.col(perm[j]).cwiseAbs().maxCoeff();
    BP.col(j) = c > 0 && std::isfinite(c) ? Eigen::VectorXd(B.col(perm[j]) / c) : Eigen::VectorXd(B.col(perm[j]));
  }
  // A column of zeros (a direction the box does not occupy) still gets a basis vector from QR.
  const Eigen::HouseholderQR<Eigen::MatrixXd> qr(BP);
  const Eigen::MatrixXd Q = qr.householderQ();
  s.A.resize(n * n);
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) s.A[i * n + j] = Q(i, j);
  if (!std::all_of(s.A.begin(), s.A.end(), [](double a) { return std::isfinite(a); }))
    throw std::runtime_error("lohner: non-finite basis");
  const std::vector<I> Qi = inverse_of_orthogonal<I>(s.A, n);
  s.r.assign(n, I(0));
  for (int i = 0; i < n; ++i) {
    I acc(0);
    for (int k = 0; k < n; ++k) {
      I qm(0);  // ([Q⁻¹] M)_{ik}
      for (int l = 0; l < n; ++l) qm = qm + Qi[i * n + l] * M[l * n + k];
      acc = acc + qm * r[k];
      acc = acc + Qi[i * n + k] * (v[k] - s.x[k]);
    }
    s.r[i] = acc;
  }
  return s;
}

}  // namespace porecert::proof::lohner
