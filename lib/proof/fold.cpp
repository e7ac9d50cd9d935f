#include "proof/fold.hpp"

#include <Eigen/LU>
#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>
#include <sstream>

#include "arith/fp_env.hpp"
#include "arith/midrad.hpp"
#include "candidate/fold_candidate.hpp"
#include "proof/radii.hpp"
#include "proof/tail_bounds.hpp"

namespace porecert::proof {

using arith::Id;
using arith::Im;
using arith::MatD;
using arith::MidRad;
using Rnd = arith::rounded_nearest_outward;
namespace fs = fold;

namespace {

double up_add(double a, double b) { return Rnd::add_up(a, b); }
double up_mul(double a, double b) { return Rnd::mul_up(a, b); }

void put(MidRad& M, int i, int j, const Id& v) { put_entry(M, i, j, v); }

// One piece c · g · J^m T_k of (DF − I) T_k in equation block `block` (0: (F1), 1: (F4)); docs/fold.md (F10).
struct Piece {
  int block;
  double c_abs;
  const cheb::Series<Id>* g;
  int m;
};

std::string fmt(double v) { return short_number(v); }

// λ_d ≥ sup over unit vectors of one function part (g: a or a u_g mode; v: a u_v mode) of ‖D^d‖, d = 0..2.
std::array<double, 3> lambdas(const fs::NullSpace& ns) {
  std::array<double, 3> lam = {1.0, 1.0, 0.0};  // a-direction: D⁰ = η (ℓ¹ norm 1), D¹ = 1, D² = 0
  // v^{(d)}(0)-direction (free_d = d): D^e = η^{d−e}/(d−e)!, ℓ¹ norm ≤ 1 on [0,1] (ℓ¹ of η^j is 1).
  if (ns.free_d >= 0)
    for (int e = 0; e <= ns.free_d; ++e) lam[e] = std::max(lam[e], 1.0);
  const JBounds jb = j_tail_bounds(40);
  for (int d = 0; d < 3; ++d) {
    lam[d] = std::max(lam[d], up_add(jb.band[3 - d], jb.low[3 - d]));  // modes k ≥ 40, (M3.5)
    for (int k = 0; k < 40; ++k) {
      cheb::Series<Id> s(k + 1, Id(0));
      s[k] = Id(1);
      for (int i = 0; i < 3 - d; ++i) s = cheb::antiderivative(s, Id(0));
      lam[d] = std::max(lam[d], cheb::norm1_up(s));
    }
  }
  return lam;
}

}  // namespace

template <arith::Interval I>
FoldResult<I> fold_verify(const std::vector<I>& xbar, const fs::NullSpace& nsp) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const int N = fs::modes_of(xbar);
  if (N < 8 || static_cast<int>(xbar.size()) != fs::kScalars + 2 * N)
    throw std::invalid_argument("fold candidate needs 4 scalars and two series of at least 8 modes");
  const int ns = fs::kScalars, n = ns + 2 * N;
  const int off[2] = {ns, ns + N};  // first row of the (F1) and (F4) blocks
  arith::require_round_to_nearest();
  arith::midrad_self_test();
  FoldResult<I> res;
  res.modes = N;

  std::vector<Id> xd;
  for (const I& v : xbar) xd.push_back(arith::to_id(v));
  const fs::Lifted<Id> bar = fs::lift_x(xd, nsp);

  // Puts a column (rows and both function blocks) into M(:, c); returns the ℓ¹ norm of what
  // falls at modes ≥ N, after removing the identity at mode `ident` of block `iblock`.
  auto load = [&](MidRad& M, int c, const fs::Value<Id>& col, int iblock, int ident) {
    double spill = 0;
    for (int i = 0; i < 4; ++i) put(M, i, c, col.rows[i]);
    const cheb::Series<Id>* e[2] = {&col.e1, &col.e4};
    for (int b = 0; b < 2; ++b)
      for (int q = 0; q < static_cast<int>(e[b]->size()); ++q) {
        if (q < N)
          put(M, off[b] + q, c, (*e[b])[q]);
        else
          spill = up_add(spill, arith::mag_up(b == iblock && q == ident ? (*e[b])[q] - Id(1) : (*e[b])[q]));
      }
    return spill;
  };

  // ---- finite block DF(x̄) and its approximate inverse ----
  MidRad D{MatD::Zero(n, n), MatD::Zero(n, n)};
  Eigen::VectorXd spill = Eigen::VectorXd::Zero(n);
  for (int j = 0; j < n; ++j) spill(j) = load(D, j, fs::column_j(bar, N, j, nsp), -1, -1);
  const Eigen::PartialPivLU<MatD> lu(D.mid);
  const MatD A = lu.inverse();
  if (!A.allFinite()) {
    res.failure = "the finite part of DF(candidate) is numerically singular (no approximate inverse)";
    return res;
  }
  res.bounds.A_norm = std::max(1.0, arith::operator_norm1_up(A));

  // ---- Z0 (finite columns with spill) ----
  {
    const Eigen::VectorXd cols = arith::identity_defect_column_norms_up(arith::product(A, D));
    double z0 = 0;
    for (int j = 0; j < n; ++j) z0 = std::max(z0, up_add(cols(j), spill(j)));
    res.bounds.Z0 = z0;
  }

  // ---- Z1 (tail columns u_g = T_k or u_v = T_k, k ≥ N), docs/fold.md (F10)-(F11) ----
  {
    const auto &G = bar.G, &V = bar.V;
    int glen = 1;
    for (int d = 0; d < 3; ++d) glen = std::max({glen, static_cast<int>(G[d].size()), static_cast<int>(V[d].size())});
    const int Kx = N + glen + 4, nt = Kx - N;
    const JBounds jb = j_tail_bounds(Kx);
    double z1 = 0;
    for (int t = 0; t < 2; ++t) {
      MidRad E{MatD::Zero(n, nt), MatD::Zero(n, nt)};
      Eigen::VectorXd sp = Eigen::VectorXd::Zero(nt);
      for (int k = N; k < Kx; ++k) sp(k - N) = load(E, k - N, fs::column(bar, -1, t, k, nsp), t, k);
      const Eigen::VectorXd cn = arith::column_norms_up(arith::product(A, E));
      for (int c = 0; c < nt; ++c) z1 = std::max(z1, up_add(cn(c), sp(c)));
      // k ≥ Kx: boundary rows, tail norms, and the low part of J^m T_k seen by A.
      MatD w = MatD::Zero(n, 1);
      w(2 * t, 0) = up_add(jb.band[3], jb.low[3]);      // g(1) or v(1): J³ T_k (1)
      w(2 * t + 1, 0) = up_add(jb.band[2], jb.low[2]);  // g'(1) or v'(1): J² T_k (1)
      double zb = 0;
      const MatD Aw = arith::abs_product_up(A, w);
      for (int i = 0; i < n; ++i) zb = up_add(zb, Aw(i, 0));
      std::vector<Piece> ps;
      if (t == 0) {
        ps = {{0, 2, &G[1], 2}, {0, 1, &G[0], 1}, {0, 1, &G[2], 3},
              {1, 2, &V[1], 2}, {1, 1, &V[0], 1}, {1, 1, &V[2], 3}};
      } else {
        ps = {{1, 2, &G[1], 2}, {1, 1, &G[0], 1}, {1, 1, &G[2], 3}};
      }
      for (const Piece& p : ps) {
        zb = up_add(zb, up_mul(up_mul(p.c_abs, cheb::norm1_up(*p.g)), up_add(jb.band[p.m], jb.low[p.m])));
        double worst = 0;
        for (int i = 0; i < p.m; ++i) {
          cheb::Series<Id> ti(i + 1, Id(0));
          ti[i] = Id(1);
          const auto gt = model::product_sparse(*p.g, ti);
          MidRad v{MatD::Zero(n, 1), MatD::Zero(n, 1)};
          for (int q = 0; q < N && q < static_cast<int>(gt.size()); ++q) put(v, off[p.block] + q, 0, gt[q]);
          worst = std::max(worst, arith::column_norms_up(arith::product(A, v))(0));
        }
        zb = up_add(zb, up_mul(up_mul(p.c_abs, jb.low[p.m]), worst));
      }
      z1 = std::max(z1, zb);
    }
    res.bounds.Z1 = z1;
  }

  // ---- Z2 = ‖A‖ (2 λ₁² + 2 λ₀ λ₂), docs/fold.md (F12) ----
  {
    const auto lam = lambdas(nsp);
    const double c = up_add(up_mul(2.0, up_mul(lam[1], lam[1])), up_mul(2.0, up_mul(lam[0], lam[2])));
    res.bounds.Z2 = up_mul(res.bounds.A_norm, c);
  }

  // ---- Y0 = ‖A_N Π F(x̄)‖ + ‖(I − Π) F(x̄)‖ in the candidate's arithmetic ----
  {
    const auto F = fs::residual(xbar, nsp);
    std::vector<I> top(n, I(0));
    for (int i = 0; i < 4; ++i) top[i] = F.rows[i];
    double bottom = 0;
    const cheb::Series<I>* e[2] = {&F.e1, &F.e4};
    for (int b = 0; b < 2; ++b)
      for (int q = 0; q < static_cast<int>(e[b]->size()); ++q) {
        if (q < N)
          top[off[b] + q] = (*e[b])[q];
        else
          bottom = up_add(bottom, arith::mag_up((*e[b])[q]));
      }
    res.bounds.Y0 = up_add(apply_norm_up(A, top), bottom);
  }

  // ---- radii polynomial p(r) = Z2 r² − (1 − Z) r + Y0 (docs/method.md (M3.2)) ----
  const RadiiVerdict verdict = radii_polynomial(res.bounds.Y0, res.bounds.Z0, res.bounds.Z1, res.bounds.Z2);
  if (!verdict.certified) {
    res.failure = verdict.failure;
    return res;
  }
  const double r = verdict.existence_radius;
  res.existence_radius = r;
  res.uniqueness_radius = verdict.uniqueness_radius;
  res.certified = true;

  // ---- components of the zero: each within r (ℓ¹ ball); sup|δg^(d)| ≤ r for d ≤ 3 (docs/fold.md (F13)) ----
  const I ball(-r, r);
  res.R = xbar[fs::kR] + ball;
  res.kappa = xbar[fs::kKappa] + ball;
  const fs::Lifted<I> Lt = fs::lift_x(xbar, nsp);
  res.fp0 = (xbar[fs::kA] + ball) / res.R;
  res.K = (xbar[fs::kK] + ball) / res.R;
  res.fpp1 = (cheb::value_at_1(Lt.G[2]) + ball) / res.R;
  res.fppp0 = (cheb::value_at_0(Lt.G[3]) + ball) / res.R;
  return res;
}

template FoldResult<Id> fold_verify<Id>(const std::vector<Id>&, const fs::NullSpace&);
template FoldResult<Im> fold_verify<Im>(const std::vector<Im>&, const fs::NullSpace&);

namespace {
template <arith::Interval I>
void take(FoldOutcome& o, const FoldResult<I>& r) {
  o.certified = r.certified;
  o.failure = r.failure;
  o.bounds = r.bounds;
  o.existence_radius = r.existence_radius;
  o.uniqueness_radius = r.uniqueness_radius;
  o.modes = r.modes;
  if (!r.certified) return;
  o.R = arith::to_id(r.R);
  o.fp0 = arith::to_id(r.fp0);
  o.fppp0 = arith::to_id(r.fppp0);
  o.fpp1 = arith::to_id(r.fpp1);
  o.K = arith::to_id(r.K);
  o.kappa = arith::to_id(r.kappa);
  o.R_lo = arith::decimal_lower(o.R);
  o.R_hi = arith::decimal_upper(o.R);
  const Id v[4] = {o.fp0, o.fppp0, o.fpp1, o.K};
  for (int i = 0; i < 4; ++i) o.values[i] = {arith::decimal_lower(v[i]), arith::decimal_upper(v[i])};
}
}  // namespace

namespace {
FoldOutcome certify_extended(const candidate::FoldCandidate& cand, const fs::NullSpace& ns, double target_width,
                             int precision_bits, std::chrono::steady_clock::time_point t0) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  FoldOutcome out;
  out.log = cand.log;
  auto finish = [&] {
    out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    return out;
  };
  if (!cand.converged) {
    out.failure = "no fold candidate (non-rigorous search failed; see log)";
    return finish();
  }
  if (precision_bits == 0 || precision_bits == 53) {
    std::vector<Id> xi(cand.x.begin(), cand.x.end());
    take(out, fold_verify<Id>(xi, ns));
    out.precision_bits = 53;
    out.candidate_hex.clear();
    for (double v : cand.x) out.candidate_hex.push_back(arith::hex_exact(v));
    out.log.push_back("double intervals, " + std::to_string(cand.modes) + " modes: " +
                      (out.certified ? "certified, R* width " + fmt(arith::width_up(out.R)) : out.failure));
    if (precision_bits == 53 || (out.certified && arith::width_up(out.R) <= target_width)) return finish();
  }
  const int bits = precision_bits > 53 ? precision_bits : 128;
  arith::PrecisionScope scope(bits);
  const Eigen::PartialPivLU<MatD> lu(candidate::fold_truncated_jacobian(cand.x, ns));
  double last = 0;
  const auto xm = candidate::refine_fold_mpfr(cand.x, lu, 6, &last, ns);
  std::vector<Im> xi;
  for (const auto& v : xm) xi.push_back(Im(v));
  take(out, fold_verify<Im>(xi, ns));
  out.precision_bits = bits;
  out.candidate_hex.clear();
  for (const auto& v : xm) out.candidate_hex.push_back(arith::hex_exact(v));
  out.log.push_back("MPFR " + std::to_string(bits) + " bits (refined, last correction residual " + fmt(last) +
                    "): " + (out.certified ? "certified, R* width " + fmt(arith::width_up(out.R)) : out.failure));
  return finish();
}
}  // namespace

FoldOutcome certify_fold(double target_width, int precision_bits, int modes) {
  const auto t0 = std::chrono::steady_clock::now();
  return certify_extended(candidate::fold_candidate(modes), fs::kTurningPoint, target_width, precision_bits, t0);
}

FoldOutcome certify_symmetry_breaking(double target_width, int precision_bits, int modes) {
  const auto t0 = std::chrono::steady_clock::now();
  return certify_extended(candidate::symmetry_breaking_candidate(modes), fs::kEvenPerturbation, target_width,
                          precision_bits, t0);
}

FoldOutcome recheck_fold(const std::vector<std::string>& hex, int precision_bits, const fs::NullSpace& ns) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  FoldOutcome out;
  if (hex.size() < static_cast<std::size_t>(fs::kScalars) + 16 || (hex.size() - fs::kScalars) % 2 != 0)
    throw std::invalid_argument("fold candidate has " + std::to_string(hex.size()) +
                                " coefficients; must be 4 scalars plus two equal-length mode lists");
  if (precision_bits <= 53) {
    std::vector<Id> xi;
    for (const auto& h : hex) {
      const Id v = arith::from_decimal<Id>(h);
      if (v.lower() != v.upper()) throw std::invalid_argument("fold candidate coefficient '" + h + "' is not a double");
      xi.push_back(v);
    }
    take(out, fold_verify<Id>(xi, ns));
    out.precision_bits = 53;
  } else {
    arith::PrecisionScope scope(precision_bits);
    std::vector<Im> xi;
    for (const auto& h : hex) {
      const Im v = arith::from_decimal<Im>(h);
      if (v.lower() != v.upper()) throw std::invalid_argument("fold candidate coefficient '" + h + "' is not exact");
      xi.push_back(v);
    }
    take(out, fold_verify<Im>(xi, ns));
    out.precision_bits = precision_bits;
  }
  out.candidate_hex = hex;
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

}  // namespace porecert::proof
