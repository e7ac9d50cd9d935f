#include "candidate/fold_candidate.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "candidate/branch_search.hpp"
#include "model/berman.hpp"
#include "model/operator.hpp"
#include "proof/fold.hpp"

namespace porecert::candidate {

namespace fs = proof::fold;
using V = std::vector<double>;

namespace {

std::string fmt(const char* f, double a, double b = 0, double c = 0) {
  char buf[200];
  std::snprintf(buf, sizeof buf, f, a, b, c);
  return buf;
}

// Branch system at fixed s = f'(0) = a/R: unknowns y = [a, K̃, R, u_g], equations
// [g(1) − R, g'(1), a − s R, (F1) modes < N]. Evaluated through the extended operator with v = 0.
V as_extended(const V& y, int N) {
  V x(fs::kScalars + 2 * N, 0.0);
  for (int i = 0; i < 3; ++i) x[i] = y[i];
  for (int k = 0; k < N; ++k) x[fs::kScalars + k] = y[3 + k];
  return x;
}
Eigen::VectorXd branch_residual(const V& y, int N, double s) {
  const auto v = fs::residual(as_extended(y, N));
  Eigen::VectorXd r(3 + N);
  r(0) = v.rows[0];
  r(1) = v.rows[1];
  r(2) = y[0] - s * y[2];
  for (int k = 0; k < N; ++k) r(3 + k) = k < static_cast<int>(v.e1.size()) ? v.e1[k] : 0.0;
  return r;
}
arith::MatD branch_jacobian(const V& y, int N, double s) {
  const auto bar = fs::lift_x(as_extended(y, N));
  arith::MatD J = arith::MatD::Zero(3 + N, 3 + N);
  for (int j = 0; j < 3 + N; ++j) {
    const auto c = j < 3 ? fs::column(bar, j, -1, 0) : fs::column(bar, -1, 0, j - 3);
    J(0, j) = c.rows[0];
    J(1, j) = c.rows[1];
    for (int k = 0; k < N && k < static_cast<int>(c.e1.size()); ++k) J(3 + k, j) = c.e1[k];
  }
  J(2, 0) = 1;
  J(2, 2) = -s;
  return J;
}

template <class Res, class Jac>
bool newton_generic(V& x, Res res, Jac jac, int iters, double* last) {
  for (int it = 0; it < iters; ++it) {
    const Eigen::VectorXd r = res(x);
    if (!r.allFinite()) return false;
    const Eigen::VectorXd dx = jac(x).partialPivLu().solve(r);
    if (!dx.allFinite()) return false;
    for (std::size_t i = 0; i < x.size(); ++i) x[i] -= dx(static_cast<Eigen::Index>(i));
    double scale = 1;
    for (double v : x) scale = std::max(scale, std::fabs(v));
    if (dx.lpNorm<Eigen::Infinity>() <= 1e-14 * scale) {
      {
        const Eigen::VectorXd rr = res(x);
        *last = rr.lpNorm<Eigen::Infinity>();
      }
      return std::isfinite(*last);
    }
  }
  {
    const Eigen::VectorXd rr = res(x);
    *last = rr.lpNorm<Eigen::Infinity>();
  }
  return *last < 1e-10;
}

bool decayed_block(const V& x, int start, int N) {
  double big = 0, tail = 0;
  for (int k = 0; k < N; ++k) big = std::max(big, std::fabs(x[start + k]));
  for (int k = N - 8; k < N; ++k) tail = std::max(tail, std::fabs(x[start + k]));
  return tail <= 1e-16 * big;
}

V pad_extended(const V& x, int N_old, int N_new) {
  V y(fs::kScalars + 2 * N_new, 0.0);
  for (int i = 0; i < fs::kScalars; ++i) y[i] = x[i];
  for (int k = 0; k < std::min(N_old, N_new); ++k) {
    y[fs::kScalars + k] = x[fs::kScalars + k];
    y[fs::kScalars + N_new + k] = x[fs::kScalars + N_old + k];
  }
  return y;
}

}  // namespace

Eigen::VectorXd fold_truncated_residual(const V& x, const fs::NullSpace& ns) {
  const int N = fs::modes_of(x);
  const auto v = fs::residual(x, ns);
  Eigen::VectorXd r = Eigen::VectorXd::Zero(fs::kScalars + 2 * N);
  for (int i = 0; i < 4; ++i) r(i) = v.rows[i];
  for (int k = 0; k < N; ++k) {
    if (k < static_cast<int>(v.e1.size())) r(fs::kScalars + k) = v.e1[k];
    if (k < static_cast<int>(v.e4.size())) r(fs::kScalars + N + k) = v.e4[k];
  }
  return r;
}

arith::MatD fold_truncated_jacobian(const V& x, const fs::NullSpace& ns) {
  const int N = fs::modes_of(x), n = fs::kScalars + 2 * N;
  const auto bar = fs::lift_x(x, ns);
  arith::MatD J = arith::MatD::Zero(n, n);
  for (int j = 0; j < n; ++j) {
    const auto c = fs::column_j(bar, N, j, ns);
    for (int i = 0; i < 4; ++i) J(i, j) = c.rows[i];
    for (int k = 0; k < N; ++k) {
      if (k < static_cast<int>(c.e1.size())) J(fs::kScalars + k, j) = c.e1[k];
      if (k < static_cast<int>(c.e4.size())) J(fs::kScalars + N + k, j) = c.e4[k];
    }
  }
  return J;
}

FoldCandidate fold_candidate(int modes) {
  FoldCandidate out;
  const SearchReport sr = find_branches(13.0);
  std::vector<const Found*> neg;
  for (const Found& f : sr.found)
    if (f.a < 0) neg.push_back(&f);
  if (neg.size() != 2) {
    out.log.push_back("expected two solutions with f'(0) < 0 at R = 13, found " + std::to_string(neg.size()));
    return out;
  }
  std::sort(neg.begin(), neg.end(), [](const Found* p, const Found* q) { return p->a < q->a; });
  // f-layout [f'(0), K, u...] at R = 13 → g-layout [a, K̃, R, u_g] with g = 13 f.
  const double R0 = 13;
  const int N0 = static_cast<int>(neg[1]->x.size()) - 2;
  int N = modes > 0 ? modes : std::max(N0, 96);
  V y(3 + N, 0.0);
  y[0] = R0 * neg[1]->x[0];
  y[1] = R0 * neg[1]->x[1];
  y[2] = R0;
  for (int k = 0; k < std::min(N0, N); ++k) y[3 + k] = R0 * neg[1]->x[2 + k];
  const double s_hi = neg[1]->a, s_lo = neg[0]->a;
  out.log.push_back(fmt("continuation in s = f'(0) from %.6g to %.6g (R free), %g modes", s_hi, s_lo, N));
  // Scan s, keep the smallest R.
  const int steps = 60;
  std::vector<double> ss, Rs;
  std::vector<V> ys;
  V prev = y, prev2;
  for (int i = 0; i <= steps; ++i) {
    const double s = s_hi + (s_lo - s_hi) * i / steps;
    V guess = prev;
    if (!prev2.empty())
      for (std::size_t q = 0; q < guess.size(); ++q) guess[q] = 2 * prev[q] - prev2[q];
    double res = 0;
    const bool ok = newton_generic(
        guess, [&](const V& z) { return branch_residual(z, N, s); },
        [&](const V& z) { return branch_jacobian(z, N, s); }, 30, &res);
    if (!ok) {
      out.log.push_back(fmt("continuation lost at s = %.6g (residual %.3g)", s, res));
      break;
    }
    ss.push_back(s);
    Rs.push_back(guess[2]);
    ys.push_back(guess);
    prev2 = prev;
    prev = guess;
  }
  if (Rs.size() < 3) return out;
  const auto it = std::min_element(Rs.begin(), Rs.end());
  const std::size_t i0 = static_cast<std::size_t>(it - Rs.begin());
  if (i0 == 0 || i0 + 1 >= Rs.size()) {
    out.log.push_back("smallest R of the scan is at an end of the path: no turning point bracketed");
    return out;
  }
  out.log.push_back(fmt("smallest R on the scan: %.8g at s = %.6g", Rs[i0], ss[i0]));
  // Parabola through the three points for s*, then solve there.
  const double s1 = ss[i0 - 1], s2 = ss[i0], s3 = ss[i0 + 1], r1 = Rs[i0 - 1], r2 = Rs[i0], r3 = Rs[i0 + 1];
  const double num = (s2 - s1) * (s2 - s1) * (r2 - r3) - (s2 - s3) * (s2 - s3) * (r2 - r1);
  const double den = (s2 - s1) * (r2 - r3) - (s2 - s3) * (r2 - r1);
  const double s_star = den != 0 ? s2 - 0.5 * num / den : s2;
  V yf = ys[i0];
  double res = 0;
  newton_generic(
      yf, [&](const V& z) { return branch_residual(z, N, s_star); },
      [&](const V& z) { return branch_jacobian(z, N, s_star); }, 30, &res);
  // Null vector of the fixed-R Jacobian: drop the R column and the s-row.
  const arith::MatD Jb = branch_jacobian(yf, N, s_star);
  arith::MatD Jr(2 + N, 2 + N);
  {
    std::vector<int> keep_r, keep_c;
    for (int i = 0; i < 3 + N; ++i) {
      if (i != 2) keep_r.push_back(i);
      if (i != 2) keep_c.push_back(i);
    }
    for (int i = 0; i < 2 + N; ++i)
      for (int j = 0; j < 2 + N; ++j) Jr(i, j) = Jb(keep_r[i], keep_c[j]);
  }
  const Eigen::JacobiSVD<arith::MatD> svd(Jr, Eigen::ComputeFullV);
  const Eigen::VectorXd w = svd.matrixV().col(2 + N - 1);
  out.log.push_back(fmt("smallest singular value of the fixed-R Jacobian at s* = %.6g: %.3g (largest %.3g)", s_star,
                        svd.singularValues()(2 + N - 1), svd.singularValues()(0)));
  if (std::fabs(w(0)) < 1e-8) {
    out.log.push_back("null vector has v'(0) = 0: normalisation v'(0) = 1 fails");
    return out;
  }
  V x(fs::kScalars + 2 * N, 0.0);
  x[fs::kA] = yf[0];
  x[fs::kK] = yf[1];
  x[fs::kR] = yf[2];
  x[fs::kKappa] = w(1) / w(0);
  for (int k = 0; k < N; ++k) {
    x[fs::kScalars + k] = yf[3 + k];
    x[fs::kScalars + N + k] = w(2 + k) / w(0);
  }
  // Newton on the extended system, modes raised until both series decay.
  for (int round = 0; round < 6; ++round) {
    double r = 0;
    const bool ok = newton_generic(
        x, [](const V& z) { return fold_truncated_residual(z); }, [](const V& z) { return fold_truncated_jacobian(z); },
        40, &r);
    out.residual = r;
    out.log.push_back(fmt("extended Newton, %g modes: residual %.3g", N, r) + (ok ? "" : " (not converged)"));
    if (!ok) return out;
    out.converged = true;
    if (modes > 0 || N >= 160 || (decayed_block(x, fs::kScalars, N) && decayed_block(x, fs::kScalars + N, N))) break;
    const int N2 = std::min(160, N * 3 / 2);
    x = pad_extended(x, N, N2);
    N = N2;
  }
  out.x = x;
  out.modes = N;
  out.log.push_back(
      fmt("candidate fold: R = %.15g, f'(0) = %.12g, kappa = %.6g", x[fs::kR], x[fs::kA] / x[fs::kR], x[fs::kKappa]));
  return out;
}

std::vector<arith::Mpfr> refine_fold_mpfr(const V& x_double, const Eigen::PartialPivLU<arith::MatD>& lu, int steps,
                                          double* last_residual, const fs::NullSpace& ns) {
  using arith::Mpfr;
  std::vector<Mpfr> x(x_double.begin(), x_double.end());
  const int N = fs::modes_of(x_double), n = static_cast<int>(x.size());
  double res = 0;
  for (int s = 0; s < steps; ++s) {
    const auto v = fs::residual(x, ns);
    Eigen::VectorXd r = Eigen::VectorXd::Zero(n);
    for (int i = 0; i < 4; ++i) r(i) = v.rows[i].to_double();
    for (int k = 0; k < N; ++k) {
      if (k < static_cast<int>(v.e1.size())) r(fs::kScalars + k) = v.e1[k].to_double();
      if (k < static_cast<int>(v.e4.size())) r(fs::kScalars + N + k) = v.e4[k].to_double();
    }
    res = r.lpNorm<Eigen::Infinity>();
    const Eigen::VectorXd dx = lu.solve(r);
    for (int i = 0; i < n; ++i) x[i] -= Mpfr(dx(i));
  }
  if (last_residual) *last_residual = res;
  return x;
}

}  // namespace porecert::candidate

namespace porecert::candidate {

namespace {
// κ(R) of the even-perturbation problem about Berman's solution xf at R (layout of model::berman):
// v''' + R(2 f'v' − f v'' − f''v) = κ, v(0) = 1, v'(0) = 0, v(1) = v'(1) = 0 (linear in (v''(0), κ, u_v)).
// Returns the solution [v''(0), κ, u_v] with as many modes as xf.
V even_perturbation(double R, const V& xf) {
  const Model<double> mf = model::berman<double>(R);
  const auto D = model::lift(model::constants_of(mf, xf), model::u_of(mf, xf));
  Model<double> lm;
  lm.id = "even-perturbation";
  lm.fixed_at_0 = {1.0, 0.0, std::nullopt};
  lm.lin = {{2 * R, 1, D[1]}, {-R, 2, D[0]}, {-R, 0, D[2]}};
  lm.rows = {{{1.0, 0.0, 0.0}, 0.0, "v(1) = 0"}, {{0.0, 1.0, 0.0}, 0.0, "v'(1) = 0"}};
  const NewtonReport r = newton(lm, V(2 + modes_of(mf, xf), 0.0), 4);
  return r.x;
}
}  // namespace

FoldCandidate symmetry_breaking_candidate(int modes) {
  FoldCandidate out;
  const fs::NullSpace& ns = fs::kEvenPerturbation;
  auto make = [](double R) { return model::berman<double>(R); };
  const int n0 = modes > 0 ? modes : 48;
  // Type I at the two starting values of the secant (the reported R ≈ 6 from memory, bracketed).
  double Ra = 5.5, Rb = 6.5;
  NewtonReport ca = continuation(make, poiseuille(make(0.0), 24), 0.0, Ra, n0);
  if (!ca.converged) {
    out.log.push_back("type I continuation to R = 5.5 failed: " + ca.note);
    return out;
  }
  V xa = with_modes(make(Ra), ca.x, n0);
  xa = newton(make(Ra), xa).x;
  auto kappa = [&](double R, V& xf) {
    xf = newton(make(R), xf).x;
    return even_perturbation(R, xf)[1];
  };
  V xb = xa;
  double ka = kappa(Ra, xa), kb = kappa(Rb, xb);
  out.log.push_back(fmt("even perturbation: kappa(%.3g) = %.6g, kappa(%.3g) = ", Ra, ka, Rb) + fmt("%.6g", kb));
  if (!(ka * kb < 0)) {
    out.log.push_back("kappa does not change sign on [5.5, 6.5]: no symmetry-breaking candidate there");
    return out;
  }
  // Regula falsi (Illinois) on κ(R) = 0.
  V xm = xa;
  double Rm = Ra;
  for (int it = 0; it < 60 && std::fabs(Rb - Ra) > 1e-13; ++it) {
    Rm = Rb - kb * (Rb - Ra) / (kb - ka);
    xm = xa;
    const double km = kappa(Rm, xm);
    if (km * kb < 0) {
      Ra = Rb, ka = kb, xa = xb;
    } else {
      ka /= 2;
    }
    Rb = Rm, kb = km, xb = xm;
    if (km == 0) break;
  }
  out.log.push_back(fmt("kappa(R) = 0 near R = %.15g", Rm));
  const V v = even_perturbation(Rm, xm);
  int N = n0;
  V x(fs::kScalars + 2 * N, 0.0);
  x[fs::kA] = Rm * xm[0];
  x[fs::kK] = Rm * xm[1];
  x[fs::kR] = Rm;
  x[fs::kKappa] = v[0];  // v''(0)
  for (int k = 0; k < N; ++k) {
    x[fs::kScalars + k] = Rm * xm[2 + k];
    x[fs::kScalars + N + k] = v[2 + k];
  }
  for (int round = 0; round < 6; ++round) {
    double r = 0;
    const bool ok = newton_generic(
        x, [&](const V& z) { return fold_truncated_residual(z, ns); },
        [&](const V& z) { return fold_truncated_jacobian(z, ns); }, 40, &r);
    out.residual = r;
    out.log.push_back(fmt("extended Newton (even null space), %g modes: residual %.3g", N, r) +
                      (ok ? "" : " (not converged)"));
    if (!ok) return out;
    out.converged = true;
    if (modes > 0 || N >= 160 || (decayed_block(x, fs::kScalars, N) && decayed_block(x, fs::kScalars + N, N))) break;
    const int N2 = std::min(160, N * 3 / 2);
    x = pad_extended(x, N, N2);
    N = N2;
  }
  out.x = x;
  out.modes = N;
  out.log.push_back(fmt("candidate symmetry-breaking point: R = %.15g, f'(0) = %.12g, v''(0) = %.6g", x[fs::kR],
                        x[fs::kA] / x[fs::kR], x[fs::kKappa]));
  return out;
}

}  // namespace porecert::candidate
