#include "proof/newton_kantorovich.hpp"

#include <Eigen/LU>
#include <algorithm>
#include <cmath>
#include <sstream>
#include <stdexcept>

#include "arith/fp_env.hpp"
#include "arith/midrad.hpp"
#include "model/operator.hpp"
#include "proof/radii.hpp"
#include "proof/tail_bounds.hpp"

namespace porecert::proof {

using arith::Id;
using arith::Im;
using arith::MatD;
using arith::MidRad;
using R = arith::rounded_nearest_outward;

namespace {

double up_add(double a, double b) { return R::add_up(a, b); }
double up_mul(double a, double b) { return R::mul_up(a, b); }

// One "piece" of DF − I on u-directions: c · g · J^m (docs/method.md (M3.6)).
struct Piece {
  double c_abs;
  std::vector<double> g_abs;  // |g_a| rounded up
  int m;
  cheb::Series<Id> g;
  Id c;
};

std::vector<Piece> pieces_of(const model::Model<Id>& m, const std::array<cheb::Series<Id>, 4>& Dbar) {
  std::vector<Piece> out;
  auto absvec = [](const cheb::Series<Id>& s) {
    std::vector<double> v;
    for (const Id& x : s) v.push_back(arith::mag_up(x));
    return v;
  };
  for (const auto& t : m.lin) {
    const cheb::Series<Id> g = t.weight.empty() ? cheb::Series<Id>{Id(1)} : t.weight;
    out.push_back({arith::mag_up(t.coef), absvec(g), 3 - t.d, g, t.coef});
  }
  for (const auto& t : m.quad) {
    out.push_back({arith::mag_up(t.coef), absvec(Dbar[t.d1]), 3 - t.d2, Dbar[t.d1], t.coef});
    out.push_back({arith::mag_up(t.coef), absvec(Dbar[t.d2]), 3 - t.d1, Dbar[t.d2], t.coef});
  }
  return out;
}

double sum_up(const std::vector<double>& v) {
  double s = 0;
  for (double x : v) s = up_add(s, x);
  return s;
}

// ℓ¹ and sup norms of D^d of unit vectors of X: constants give η^j/j!, u-modes J^{3−d} T_k.
struct LiftNorms {
  std::array<double, 4> l1{}, sup{};
};
LiftNorms lift_norms(const model::Model<Id>& m) {
  LiftNorms r;
  const double inv_fact_up[4] = {1.0, 1.0, 0.5, R::div_up(1.0, 6.0)};
  for (int d = 0; d < 4; ++d) {
    double l1 = 0, sup = 0;
    for (int e = d; e < 3; ++e)
      if (!m.fixed_at_0[e]) {  // constant f^{(e)}(0): D^d = η^{e−d}/(e−d)!, ℓ¹ = sup = 1/(e−d)!
        l1 = std::max(l1, inv_fact_up[e - d]);
        sup = std::max(sup, inv_fact_up[e - d]);
      }
    // u-modes: sup|J^{3−d} T_k| ≤ 1/(3−d)!; ℓ¹ exact for k < 40, (M3.5) beyond.
    sup = std::max(sup, inv_fact_up[3 - d]);
    const JBounds jb = j_tail_bounds(40);
    l1 = std::max(l1, up_add(jb.band[3 - d], jb.low[3 - d]));
    for (int k = 0; k < 40; ++k) {
      cheb::Series<Id> s(k + 1, Id(0));
      s[k] = Id(1);
      for (int i = 0; i < 3 - d; ++i) s = cheb::antiderivative(s, Id(0));
      l1 = std::max(l1, cheb::norm1_up(s));
    }
    r.l1[d] = l1;
    r.sup[d] = sup;
  }
  return r;
}

template <arith::Interval I>
Id to_id(const I& x) {
  return arith::to_id(x);
}

// Functionals of tail modes through which the finite block sees them (docs/method.md (M3.9)):
// kind (m, i ≥ 0): coefficient i of the low part of J^m T_l; kind (m, −1): (J^m T_l)(1).
struct TailFunctionals {
  int N = 0, Lmax = 0;
  std::vector<std::array<int, 2>> kind;
  std::vector<std::vector<Id>> val;  // val[q][l − N], N ≤ l < Lmax
  std::vector<double> sup_up;        // ≥ sup_{l ≥ N} |φ_q(l)|
};

TailFunctionals tail_functionals(int N, int Lmax, const std::vector<std::array<int, 2>>& kinds) {
  TailFunctionals tf;
  tf.N = N;
  tf.Lmax = Lmax;
  tf.kind = kinds;
  tf.val.assign(kinds.size(), std::vector<Id>(Lmax - N, Id(0)));
  tf.sup_up.assign(kinds.size(), 0.0);
  for (int l = N; l < Lmax; ++l) {
    cheb::Series<Id> s(l + 1, Id(0));
    s[l] = Id(1);
    for (int m = 1; m <= 3; ++m) {
      s = cheb::antiderivative(s, Id(0));
      for (std::size_t q = 0; q < kinds.size(); ++q) {
        if (kinds[q][0] != m) continue;
        const Id v = kinds[q][1] >= 0 ? s[kinds[q][1]] : cheb::value_at_1(s);
        tf.val[q][l - N] = v;
        tf.sup_up[q] = std::max(tf.sup_up[q], arith::mag_up(v));
      }
    }
  }
  const JBounds jb = j_tail_bounds(Lmax);  // beyond the table: (M3.5)
  for (std::size_t q = 0; q < kinds.size(); ++q) {
    const int m = kinds[q][0];
    tf.sup_up[q] = std::max(tf.sup_up[q], kinds[q][1] >= 0 ? jb.low[m] : up_add(jb.band[m], jb.low[m]));
  }
  return tf;
}

// Φ_q(y) = Σ_{l ≥ N} φ_q(l) y_l for the tail part of the series y (enclosure; modes beyond the
// table are bounded by sup|φ_q|).
template <arith::Interval I>
I apply_functional(const TailFunctionals& tf, std::size_t q, const cheb::Series<I>& y) {
  I acc(0);
  double rest = 0;
  for (int l = tf.N; l < static_cast<int>(y.size()); ++l) {
    if (l < tf.Lmax)
      acc = acc + arith::from_id<I>(tf.val[q][l - tf.N]) * y[l];
    else
      rest = up_add(rest, arith::mag_up(y[l]));
  }
  if (rest > 0) acc = acc + I(-up_mul(rest, tf.sup_up[q]), up_mul(rest, tf.sup_up[q]));
  return acc;
}

}  // namespace

double tail_estimate(const model::Model<Id>& m, const std::vector<Id>& xbar, long N) {
  const auto Dbar = model::lift(model::constants_of(m, xbar), model::u_of(m, xbar));
  const JBounds jb = j_tail_bounds(N);
  double tail = 0;
  for (const Piece& p : pieces_of(m, Dbar))
    tail = up_add(tail, up_mul(up_mul(p.c_abs, sum_up(p.g_abs)), up_add(jb.band[p.m], jb.low[p.m])));
  return tail;
}

namespace {
template <arith::Interval I>
NKResult<I> nk_verify_unguarded(const model::Model<I>& m, const std::vector<I>& xbar, const RPredictor<I>* pred);
}  // namespace

template <arith::Interval I>
NKResult<I> nk_verify(const model::Model<I>& m, const std::vector<I>& xbar) {
  return nk_verify(m, xbar, static_cast<const RPredictor<I>*>(nullptr));
}
template <arith::Interval I>
NKResult<I> nk_verify(const model::Model<I>& m, const std::vector<I>& xbar, const RPredictor<I>& p) {
  if (p.tangent.size() != xbar.size()) throw std::invalid_argument("predictor tangent and candidate differ in length");
  return nk_verify(m, xbar, &p);
}

template <arith::Interval I>
NKResult<I> nk_verify(const model::Model<I>& m, const std::vector<I>& xbar, const RPredictor<I>* pred) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  try {
    return nk_verify_unguarded(m, xbar, pred);
  } catch (const arith::nan_error& e) {
    // A candidate so large that a bound overflows (found by tests/test_adversarial.cpp): no proof,
    // and no crash either. The enclosures stay unset; certified = false says they mean nothing.
    NKResult<I> res;
    res.modes = static_cast<int>(xbar.size()) - m.n_scalars();
    res.failure = std::string("a bound is not finite in this arithmetic (") + e.what() +
                  "): the candidate is too large or too rough to check";
    return res;
  }
}

namespace {
template <arith::Interval I>
NKResult<I> nk_verify_unguarded(const model::Model<I>& m, const std::vector<I>& xbar, const RPredictor<I>* pred) {
  if (!m.well_formed()) throw std::invalid_argument("model is not square (rows != scalar unknowns)");
  const int ns = m.n_scalars();
  const int N = static_cast<int>(xbar.size()) - ns;
  if (N < 8) throw std::invalid_argument("candidate needs at least 8 Chebyshev modes");
  const int n = ns + N;
  arith::require_round_to_nearest();
  arith::midrad_self_test();

  NKResult<I> res;
  res.modes = N;
  // ---- double-interval copies for the Z bounds (docs/method.md §M3, mixed precision §M4) ----
  const model::Model<Id> md = model::convert<Id>(m, [](const I& v) { return to_id(v); });
  // With a predictor the Z bounds are taken over the hull of x̄(R), R in the box (M3.11).
  std::vector<I> xhull = xbar;
  if (pred)
    for (std::size_t i = 0; i < xbar.size(); ++i) xhull[i] = xbar[i] + pred->delta * pred->tangent[i];
  std::vector<Id> xd;
  for (const I& v : xhull) xd.push_back(to_id(v));
  const auto Dbar = model::lift(model::constants_of(md, xd), model::u_of(md, xd));

  // ---- How tail modes reach the finite block: functionals Φ_q and directions W_q (M3.9) ----
  const auto pieces = pieces_of(md, Dbar);
  int glen = 1;
  for (const Piece& p : pieces) glen = std::max(glen, static_cast<int>(p.g.size()));
  const int Kx = N + glen + 4;  // from Kx on, band parts of tail columns miss the finite block
  std::vector<std::array<int, 2>> kinds;
  {
    bool low[4] = {false, false, false, false}, row[4] = {false, false, false, false};
    for (const Piece& p : pieces) low[p.m] = true;
    for (const auto& r : md.rows)
      for (int d = 0; d < 3; ++d)
        if (!(r.coef[d].lower() == 0 && r.coef[d].upper() == 0)) row[3 - d] = true;
    for (int m = 1; m <= 3; ++m)
      if (low[m])
        for (int i = 0; i < m; ++i) kinds.push_back({m, i});
    for (int m = 1; m <= 3; ++m)
      if (row[m]) kinds.push_back({m, -1});
  }
  const TailFunctionals tf = tail_functionals(N, Kx + glen + 8, kinds);
  const std::size_t nq = kinds.size();
  std::vector<std::vector<Id>> W(nq, std::vector<Id>(n, Id(0)));
  for (std::size_t q = 0; q < nq; ++q) {
    const int m = kinds[q][0], i = kinds[q][1];
    if (i < 0) {
      for (int r = 0; r < ns; ++r) W[q][r] = md.rows[r].coef[3 - m];
      continue;
    }
    cheb::Series<Id> t(i + 1, Id(0));
    t[i] = Id(1);
    for (const Piece& p : pieces) {
      if (p.m != m) continue;
      const auto gt = model::product_sparse(p.g, t);
      for (int j = 0; j < N && j < static_cast<int>(gt.size()); ++j) W[q][ns + j] = W[q][ns + j] + p.c * gt[j];
    }
  }
  // Corrected top part of a column: Π_top col − Σ_q W_q Φ_q(Π_tail col) (the A₁₂ block of (M3.9)).
  auto corrected_top = [&](const model::Value<Id>& col, std::vector<Id>& top) {
    top.assign(n, Id(0));
    for (int i = 0; i < ns; ++i) top[i] = col.rows[i];
    for (int k = 0; k < N && k < static_cast<int>(col.fun.size()); ++k) top[ns + k] = col.fun[k];
    for (std::size_t q = 0; q < nq; ++q) {
      const Id phi = apply_functional(tf, q, col.fun);
      if (phi.lower() == 0 && phi.upper() == 0) continue;
      for (int i = 0; i < n; ++i)
        if (!(W[q][i].lower() == 0 && W[q][i].upper() == 0)) top[i] = top[i] - W[q][i] * phi;
    }
  };

  // ---- DF(x̄) with the correction: finite block as midpoint-radius, spill below as norms ----
  // With a predictor, DF along the centre is a quadratic in δ (M3.14): DF(x̄(R), R) = D + δ M1 + δ² M2,
  // D = DF(x̄; R0), M1 = D²F_{R0}[x1, ·] + DF_R(x̄), M2 = D²F_R[x1, ·]; each column of each is kept.
  MidRad D{MatD::Zero(n, n), MatD::Zero(n, n)};
  MidRad M1{MatD::Zero(n, n), MatD::Zero(n, n)}, M2{MatD::Zero(n, n), MatD::Zero(n, n)};
  Eigen::VectorXd spill = Eigen::VectorXd::Zero(n), spill1 = Eigen::VectorXd::Zero(n),
                  spill2 = Eigen::VectorXd::Zero(n);
  {
    std::vector<Id> top;
    auto store = [&](const model::Value<Id>& col, int j, MidRad& M, Eigen::VectorXd& sp) {
      corrected_top(col, top);
      for (int i = 0; i < n; ++i) put_entry(M, i, j, top[i]);
      for (int k = N; k < static_cast<int>(col.fun.size()); ++k) sp(j) = up_add(sp(j), arith::mag_up(col.fun[k]));
    };
    if (!pred) {
      for (int j = 0; j < n; ++j) store(model::derivative_column(md, Dbar, j), j, D, spill);
    } else {
      const auto conv = [](const model::Model<I>& mm) {
        return model::convert<Id>(mm, [](const I& v) { return to_id(v); });
      };
      const model::Model<Id> m0 = conv(pred->at_R0), mz = conv(pred->at_0), mo = conv(pred->at_1);
      std::vector<Id> xb, x1;
      for (const I& v : xbar) xb.push_back(to_id(v));
      for (const I& v : pred->tangent) x1.push_back(to_id(v));
      const auto D0 = model::lift(model::constants_of(m0, xb), model::u_of(m0, xb));
      const auto D1 = model::lift_direction(m0, x1);
      for (int j = 0; j < n; ++j) {
        store(model::derivative_column(m0, D0, j), j, D, spill);
        model::Value<Id> c1 = model::second_derivative_column(m0, D1, j);
        c1 = model::add_scaled(c1, model::derivative_column(mo, D0, j), Id(1));
        c1 = model::add_scaled(c1, model::derivative_column(mz, D0, j), Id(-1));
        store(c1, j, M1, spill1);
        const model::Value<Id> c2 = model::add_scaled(model::second_derivative_column(mo, D1, j),
                                                      model::second_derivative_column(mz, D1, j), Id(-1));
        store(c2, j, M2, spill2);
      }
    }
  }
  const Eigen::PartialPivLU<MatD> lu(D.mid);
  const MatD A = lu.inverse();
  if (!A.allFinite()) {
    res.failure = "the finite part of DF(candidate) is numerically singular (no approximate inverse)";
    return res;
  }
  // ‖A_N W_q‖, used for the tail columns beyond Kx and for ‖A‖.
  std::vector<double> AW(nq, 0.0);
  for (std::size_t q = 0; q < nq; ++q) AW[q] = apply_norm_up(A, W[q]);
  {
    double tail_col = 1;  // tail columns of A = [A_N, −A_N W Φ; 0, I]
    for (std::size_t q = 0; q < nq; ++q) tail_col = up_add(tail_col, up_mul(AW[q], tf.sup_up[q]));
    res.bounds.A_norm = std::max(tail_col, arith::operator_norm1_up(A));
  }

  // ---- Z0: columns of I − A DF on the finite directions, plus their spill ----
  {
    const MidRad C = arith::product(A, D);
    const Eigen::VectorXd cols = arith::identity_defect_column_norms_up(C);
    double z0 = 0;
    if (!pred) {
      for (int j = 0; j < n; ++j) z0 = std::max(z0, up_add(cols(j), spill(j)));
    } else {  // (M3.14): ‖(I − A DF) e_j‖ ≤ ‖(I − A D) e_j‖ + h ‖A M1 e_j‖ + h² ‖A M2 e_j‖, spills alike
      const double h = arith::mag_up(pred->delta), h2 = up_mul(h, h);
      const Eigen::VectorXd c1 = arith::column_norms_up(arith::product(A, M1));
      const Eigen::VectorXd c2 = arith::column_norms_up(arith::product(A, M2));
      for (int j = 0; j < n; ++j) {
        double z = up_add(cols(j), spill(j));
        z = up_add(z, up_mul(h, up_add(c1(j), spill1(j))));
        z = up_add(z, up_mul(h2, up_add(c2(j), spill2(j))));
        z0 = std::max(z0, z);
      }
    }
    res.bounds.Z0 = z0;
  }

  // ---- Z1: tail directions u = T_k, k ≥ N (docs/method.md (M3.6)-(M3.9)) ----
  {
    MidRad E{MatD::Zero(n, Kx - N), MatD::Zero(n, Kx - N)};
    Eigen::VectorXd spillE = Eigen::VectorXd::Zero(Kx - N);
    std::vector<Id> top;
    for (int k = N; k < Kx; ++k) {
      const int c = k - N;
      const auto col = model::derivative_column(md, Dbar, ns + k);
      corrected_top(col, top);
      for (int i = 0; i < n; ++i) put_entry(E, i, c, top[i]);
      for (int q = N; q < static_cast<int>(col.fun.size()); ++q)
        spillE(c) = up_add(spillE(c), arith::mag_up(q == k ? col.fun[q] - Id(1) : col.fun[q]));
    }
    double z1a = 0;
    {
      const Eigen::VectorXd cn = arith::column_norms_up(arith::product(A, E));
      for (int c = 0; c < Kx - N; ++c) z1a = std::max(z1a, up_add(cn(c), spillE(c)));
    }
    // k ≥ Kx: top part A_N W Φ(E T_k), ‖E T_k‖ ≤ Σ |c| ‖g‖ (b_m + l_m) at Kx.
    const JBounds jb = j_tail_bounds(Kx);
    double et = 0;
    for (const Piece& p : pieces)
      et = up_add(et, up_mul(up_mul(p.c_abs, sum_up(p.g_abs)), up_add(jb.band[p.m], jb.low[p.m])));
    double z1b = et;
    for (std::size_t q = 0; q < nq; ++q) z1b = up_add(z1b, up_mul(up_mul(AW[q], tf.sup_up[q]), et));
    res.bounds.Z1 = std::max(z1a, z1b);
  }

  // ---- Z2: ‖A‖ Σ_quad 2|c| λ_{d1} λ_{d2} ----
  const LiftNorms ln = lift_norms(md);
  {
    double z2 = 0;
    for (const auto& t : md.quad)
      z2 = up_add(z2, up_mul(up_mul(2.0, arith::mag_up(t.coef)), up_mul(ln.l1[t.d1], ln.l1[t.d2])));
    // D²F[b,h] has no boundary-row part (the rows are linear), so only the function columns of A
    // act on it (docs/method.md (M3.10)): the row columns, which dominate ‖A‖, drop out.
    double a_fun = 1;  // tail columns of A, as in A_norm
    for (std::size_t q = 0; q < nq; ++q) a_fun = up_add(a_fun, up_mul(AW[q], tf.sup_up[q]));
    a_fun = std::max(a_fun, arith::operator_norm1_up(MatD(A.rightCols(n - ns))));
    res.bounds.Z2 = up_mul(a_fun, z2);
  }
  res.sup_lift = ln.sup;

  // ---- Y0: ‖A F(x̄)‖ in the candidate's own arithmetic (MPFR when the candidate is) ----
  {
    // Without a predictor F(x̄) over the box; with one, the exact expansion (M3.11b) in δ = R − R0
    // (F is quadratic in x and affine in R): F(x̄ + δ x1, R0 + δ) = P0 + δ P1 + δ² P2 + δ³ P3.
    model::Value<I> F;
    if (!pred) {
      F = model::residual(m, xbar);
    } else {
      const auto& p = *pred;
      const auto Dx = model::lift(model::constants_of(p.at_R0, xbar), model::u_of(p.at_R0, xbar));
      model::Value<I> P1 = model::derivative_apply(p.at_R0, Dx, p.tangent);
      P1 = model::add_scaled(P1, model::residual(p.at_1, xbar), I(1));
      P1 = model::add_scaled(P1, model::residual(p.at_0, xbar), I(-1));
      model::Value<I> P2 = model::quadratic_part(p.at_R0, p.tangent);
      P2 = model::add_scaled(P2, model::derivative_apply(p.at_1, Dx, p.tangent), I(1));
      P2 = model::add_scaled(P2, model::derivative_apply(p.at_0, Dx, p.tangent), I(-1));
      model::Value<I> P3 = model::quadratic_part(p.at_1, p.tangent);
      P3 = model::add_scaled(P3, model::quadratic_part(p.at_0, p.tangent), I(-1));
      // Powers of δ as sets: δ² ∈ [0, h²] when δ straddles 0 (not δ·δ, which would be [−h², h²]).
      const double h = arith::mag_up(p.delta);
      const double h2 = up_mul(h, h), h3 = up_mul(h2, h);
      const bool straddles = p.delta.lower() <= 0 && p.delta.upper() >= 0;
      const I d2 = straddles ? I(0.0, h2) : p.delta * p.delta;
      const I d3 = straddles ? I(-h3, h3) : p.delta * p.delta * p.delta;
      F = model::add_scaled(model::residual(p.at_R0, xbar), P1, p.delta);
      F = model::add_scaled(F, P2, d2);
      F = model::add_scaled(F, P3, d3);
    }
    std::vector<I> top(n, I(0));
    for (int i = 0; i < ns; ++i) top[i] = F.rows[i];
    double bottom = 0;
    for (int k = 0; k < static_cast<int>(F.fun.size()); ++k) {
      if (k < N)
        top[ns + k] = F.fun[k];
      else
        bottom = up_add(bottom, arith::mag_up(F.fun[k]));
    }
    for (std::size_t q = 0; q < nq; ++q) {  // the A₁₂ block acting on the tail of F (M3.9)
      const I phi = apply_functional(tf, q, F.fun);
      for (int i = 0; i < n; ++i)
        if (!(W[q][i].lower() == 0 && W[q][i].upper() == 0)) top[i] = top[i] - arith::from_id<I>(W[q][i]) * phi;
    }
    res.bounds.Y0 = up_add(apply_norm_up(A, top), bottom);
  }

  // ---- radii polynomial (M3.2) ----
  const RadiiVerdict verdict = radii_polynomial(res.bounds.Y0, res.bounds.Z0, res.bounds.Z1, res.bounds.Z2);
  if (!verdict.certified) {
    res.failure = verdict.failure;
    return res;
  }
  // The proof is about the centre: x̄, or x̄(R) = x̄ + δ x1 for each R of the box (M3.11).
  const double r_exist = verdict.existence_radius;
  res.certified = true;
  res.moving_centre = pred != nullptr;
  if (pred) {
    res.R0 = pred->R0;
    res.tangent = pred->tangent;
    res.delta = pred->delta;
  }
  res.centre_existence_radius = r_exist;
  res.centre_uniqueness_radius = verdict.uniqueness_radius;
  for (int d = 0; d < 4; ++d) res.centre_c3_error[d] = up_mul(ln.sup[d], r_exist);
  res.existence_radius = r_exist;
  res.uniqueness_radius = verdict.uniqueness_radius;
  res.c3_error = res.centre_c3_error;
  const auto Dt = model::lift(model::constants_of(m, xbar), model::u_of(m, xbar));
  std::array<cheb::Series<I>, 4> D1;  // lift of x1 (zero without a predictor)
  if (pred) {
    // Restated about the fixed x̄ (M3.12): ‖x̄(R) − x̄‖ ≤ t = sup|δ| ‖x1‖, and D^d f̄(R) − D^d f̄ =
    // δ D^d f1 moves by at most sup|δ| times the ℓ¹ norm of its coefficients (|T_k| ≤ 1).
    D1 = model::lift_direction(m, pred->tangent);
    double t = 0;
    for (const I& v : pred->tangent) t = up_add(t, arith::mag_up(v));
    const double h = arith::mag_up(pred->delta);
    t = up_mul(t, h);
    res.existence_radius = up_add(r_exist, t);
    if (std::isfinite(res.uniqueness_radius))
      res.uniqueness_radius = std::max(0.0, R::sub_down(res.uniqueness_radius, t));
    for (int d = 0; d < 4; ++d) {
      double l1 = 0;
      for (const I& c : D1[d]) l1 = up_add(l1, arith::mag_up(c));
      res.c3_error[d] = up_add(res.centre_c3_error[d], up_mul(h, l1));
    }
  }

  // ---- values of the true solution, from the centre for every R of the box (M3.13) ----
  const I r_ball = I(-r_exist, r_exist);
  auto along = [&](const I& at_bar, const I& at_tangent) { return pred ? at_bar + pred->delta * at_tangent : at_bar; };
  auto widen = [&](const I& v, int d) { return v + I(-res.centre_c3_error[d], res.centre_c3_error[d]); };
  auto comp = [&](int i) { return along(xbar[i], pred ? pred->tangent[i] : I(0)); };
  res.fp0 = m.fixed_at_0[1] ? *m.fixed_at_0[1] : comp(m.free_index(1)) + r_ball;
  res.fppp0 = widen(along(cheb::value_at_0(Dt[3]), pred ? cheb::value_at_0(D1[3]) : I(0)), 3);
  res.fpp1 = widen(along(cheb::value_at_1(Dt[2]), pred ? cheb::value_at_1(D1[2]) : I(0)), 2);
  res.K = comp(m.k_index()) + r_ball;
  return res;
}
}  // namespace

template NKResult<Id> nk_verify<Id>(const model::Model<Id>&, const std::vector<Id>&);
template NKResult<Im> nk_verify<Im>(const model::Model<Im>&, const std::vector<Im>&);
template NKResult<Id> nk_verify<Id>(const model::Model<Id>&, const std::vector<Id>&, const RPredictor<Id>&);
template NKResult<Im> nk_verify<Im>(const model::Model<Im>&, const std::vector<Im>&, const RPredictor<Im>&);

}  // namespace porecert::proof
