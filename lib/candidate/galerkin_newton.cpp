#include "candidate/galerkin_newton.hpp"

#include <algorithm>
#include <cmath>

#include "model/operator.hpp"

namespace porecert::candidate {

int modes_of(const Model<double>& m, const Vec& x) { return static_cast<int>(x.size()) - m.n_scalars(); }

Eigen::VectorXd truncated_residual(const Model<double>& m, const Vec& x) {
  // Equations: the boundary rows, then function modes 0..N−1 (same count as the unknowns).
  const int ns = m.n_scalars(), N = modes_of(m, x);
  const auto v = model::residual(m, x);
  Eigen::VectorXd r = Eigen::VectorXd::Zero(ns + N);
  for (int i = 0; i < ns; ++i) r(i) = v.rows[i];
  for (int k = 0; k < N && k < static_cast<int>(v.fun.size()); ++k) r(ns + k) = v.fun[k];
  return r;
}

arith::MatD truncated_jacobian(const Model<double>& m, const Vec& x) {
  const int ns = m.n_scalars(), N = modes_of(m, x), n = ns + N;
  const int nr = ns;
  const auto Dbar = model::lift(model::constants_of(m, x), model::u_of(m, x));
  arith::MatD J = arith::MatD::Zero(n, n);
  for (int j = 0; j < n; ++j) {
    const auto c = model::derivative_column(m, Dbar, j);
    for (int i = 0; i < nr; ++i) J(i, j) = c.rows[i];
    for (int k = 0; k + nr < n && k < static_cast<int>(c.fun.size()); ++k) J(nr + k, j) = c.fun[k];
  }
  return J;
}

Vec tangent_in_R(const Model<double>& at_R, const Model<double>& at_0, const Model<double>& at_1, const Vec& x) {
  const Eigen::VectorXd rhs = truncated_residual(at_1, x) - truncated_residual(at_0, x);
  const Eigen::VectorXd t = -Eigen::PartialPivLU<arith::MatD>(truncated_jacobian(at_R, x)).solve(rhs);
  Vec out(x.size(), 0.0);
  for (std::size_t i = 0; i < x.size(); ++i) out[i] = std::isfinite(t(i)) ? t(i) : 0.0;
  return out;
}

NewtonReport newton(const Model<double>& m, Vec x, int max_iterations, double tol) {
  NewtonReport rep;
  double prev_step = HUGE_VAL;
  for (int it = 0; it < max_iterations; ++it) {
    const Eigen::VectorXd r = truncated_residual(m, x);
    rep.residual = r.lpNorm<Eigen::Infinity>();
    if (!std::isfinite(rep.residual)) {
      rep.note = "residual is not finite";
      break;
    }
    const arith::MatD J = truncated_jacobian(m, x);
    const Eigen::VectorXd dx = J.partialPivLu().solve(r);
    if (!dx.allFinite()) {
      rep.note = "Newton step is not finite";
      break;
    }
    for (int i = 0; i < static_cast<int>(x.size()); ++i) x[i] -= dx(i);
    rep.iterations = it + 1;
    double scale = 1;
    for (double v : x) scale = std::max(scale, std::fabs(v));
    const double step = dx.lpNorm<Eigen::Infinity>();
    // Converged: a tiny step, or steps that stopped shrinking at the rounding-noise floor.
    const bool noise_floor =
        it >= 2 && step > 0.5 * prev_step && (step <= 1e-9 * scale || rep.residual <= 1e-11 * scale);
    if (step <= tol * scale || noise_floor) {
      rep.residual = truncated_residual(m, x).lpNorm<Eigen::Infinity>();
      rep.converged = std::isfinite(rep.residual);
      break;
    }
    prev_step = step;
  }
  rep.x = std::move(x);
  if (!rep.converged && rep.note.empty()) rep.note = "Newton did not converge";
  return rep;
}

Vec with_modes(const Model<double>& m, Vec x, int n) {
  x.resize(m.n_scalars() + n, 0.0);
  return x;
}

bool decayed(const Model<double>& m, const Vec& x, double rel) {
  const int ns = m.n_scalars(), N = modes_of(m, x);
  if (N < 16) return false;
  double big = 0, tail = 0;
  for (int k = 0; k < N; ++k) big = std::max(big, std::fabs(x[ns + k]));
  for (int k = N - 8; k < N; ++k) tail = std::max(tail, std::fabs(x[ns + k]));
  return tail <= rel * big;
}

NewtonReport solve_with_decay(const Model<double>& m, Vec x0, int n0, int n_max) {
  int n = std::max(n0, modes_of(m, x0));
  Vec x = with_modes(m, std::move(x0), n);
  NewtonReport rep;
  for (;;) {
    rep = newton(m, x, 25);
    if (!rep.converged) return rep;
    if (decayed(m, rep.x) || n >= n_max) return rep;
    n = std::min(n_max, n * 3 / 2 + 8);
    x = with_modes(m, rep.x, n);
  }
}

Vec poiseuille(const Model<double>& m, int n) {
  // f = (3η − η³)/2: f' (0) = 3/2, f''' = −3, K = −3.
  Vec x(m.n_scalars() + n, 0.0);
  const int i1 = m.free_index(1);
  if (i1 >= 0) x[i1] = 1.5;
  x[m.k_index()] = -3.0;
  x[m.n_scalars()] = -3.0;
  return x;
}

Vec guess_from_shooting(const Model<double>& m, double a, double b, int n) {
  // State y = (f, f', f''); f''' from (M1.2) with K fixed by the data at η = 0. `a` is the
  // lowest free constant at 0 (f'(0) for Berman, f''(0) when f'(0) is fixed).
  int first_free = -1;
  for (int d = 2; d >= 0; --d)
    if (!m.fixed_at_0[d]) first_free = d;
  std::array<double, 3> c0{};
  for (int d = 0; d < 3; ++d) c0[d] = m.fixed_at_0[d] ? *m.fixed_at_0[d] : (d == first_free ? a : 0.0);
  auto rest = [&](const std::array<double, 3>& y, double eta) {  // Σ lin + Σ quad at η
    std::array<double, 4> D = {y[0], y[1], y[2], 0.0};
    double s = 0;
    for (const auto& t : m.lin) s += t.coef * (t.weight.empty() ? 1.0 : cheb::eval(t.weight, eta)) * D[t.d];
    for (const auto& t : m.quad) s += t.coef * D[t.d1] * D[t.d2];
    return s;
  };
  const double K = b + rest(c0, 0.0);
  auto rhs = [&](const std::array<double, 3>& y, double eta) {
    return std::array<double, 3>{y[1], y[2], K - rest(y, eta)};
  };
  const auto pts = cheb::chebyshev_points<double>(n);
  std::vector<double> vals(n);
  // Integrate once on a fine grid, record f''' at the Chebyshev points by sorting them.
  std::vector<int> order(n);
  for (int i = 0; i < n; ++i) order[i] = i;
  std::sort(order.begin(), order.end(), [&](int p, int q) { return pts[p] < pts[q]; });
  std::array<double, 3> y = c0;
  double eta = 0;
  const int steps_per = 8;
  for (int idx : order) {
    const double target = pts[idx];
    const double h = (target - eta) / steps_per;
    for (int s = 0; s < steps_per && h > 0; ++s) {
      auto k1 = rhs(y, eta);
      std::array<double, 3> t;
      for (int i = 0; i < 3; ++i) t[i] = y[i] + 0.5 * h * k1[i];
      auto k2 = rhs(t, eta + 0.5 * h);
      for (int i = 0; i < 3; ++i) t[i] = y[i] + 0.5 * h * k2[i];
      auto k3 = rhs(t, eta + 0.5 * h);
      for (int i = 0; i < 3; ++i) t[i] = y[i] + h * k3[i];
      auto k4 = rhs(t, eta + h);
      for (int i = 0; i < 3; ++i) y[i] += h / 6 * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
      eta += h;
    }
    eta = target;
    vals[idx] = K - rest(y, eta);
  }
  const auto u = cheb::coeffs_from_values(vals);
  Vec x(m.n_scalars() + n, 0.0);
  for (int d = 0; d < 3; ++d)
    if (m.free_index(d) >= 0) x[m.free_index(d)] = c0[d];
  x[m.k_index()] = K;
  for (int k = 0; k < n; ++k) x[m.n_scalars() + k] = u[k];
  return x;
}

NewtonReport continuation(const std::function<Model<double>(double)>& make, Vec x_start, double R_start,
                          double R_target, int n_max, std::vector<std::string>* log) {
  double R = R_start, step = std::copysign(std::min(1.0, std::fabs(R_target - R_start)), R_target - R_start);
  Vec x = x_start, x_prev;
  double R_prev = R;
  NewtonReport rep;
  rep.x = x;
  rep.converged = true;
  if (R_target == R_start) return solve_with_decay(make(R), x, modes_of(make(R), x), n_max);
  int guard = 0;
  while (R != R_target && guard++ < 400) {
    double R_next = R + step;
    if ((step > 0 && R_next > R_target) || (step < 0 && R_next < R_target)) R_next = R_target;
    const Model<double> m = make(R_next);
    Vec guess = x;
    if (!x_prev.empty() && x_prev.size() == x.size() && R != R_prev) {  // secant predictor
      const double t = (R_next - R) / (R - R_prev);
      for (std::size_t i = 0; i < x.size(); ++i) guess[i] = x[i] + t * (x[i] - x_prev[i]);
    }
    NewtonReport r = newton(m, guess, 12);
    bool jumped = false;
    if (r.converged && !x_prev.empty() && r.x.size() == guess.size()) {
      // Branch guard: the corrector must stay small against the predicted step, else Newton may
      // have jumped to a nearby branch (types I and II crowd together for large suction).
      double pred = 0, corr = 0;
      for (std::size_t i = 0; i < guess.size(); ++i) {
        pred = std::max(pred, std::fabs(guess[i] - x[i]));
        corr = std::max(corr, std::fabs(r.x[i] - guess[i]));
      }
      if (corr > 0.3 * pred + 1e-12) {
        r.converged = false;
        r.note = "corrector too large against the predictor (possible branch jump)";
        jumped = true;
      }
    }
    if (r.converged && !decayed(m, r.x) && modes_of(m, r.x) < n_max)
      r = solve_with_decay(m, r.x, modes_of(m, r.x), n_max);
    if (!r.converged && !jumped && modes_of(m, x) < n_max) {  // under-resolved? retry with more modes
      const int n_more = std::min(n_max, modes_of(m, x) * 3 / 2 + 8);
      Vec padded = with_modes(m, guess, n_more);
      NewtonReport r2 = newton(m, padded, 12);
      if (r2.converged) {
        r = r2;
        x = with_modes(m, x, n_more);
        x_prev.clear();
      }
    }
    if (!r.converged) {
      step /= 2;
      if (std::fabs(step) < 1e-6 * std::max(1.0, std::fabs(R))) {
        rep = r;
        rep.note = "continuation stalled at R = " + std::to_string(R) + ": " + r.note;
        rep.converged = false;
        return rep;
      }
      continue;
    }
    if (log)
      log->push_back("R = " + std::to_string(R_next) + ": " + std::to_string(r.iterations) + " Newton steps, " +
                     std::to_string(modes_of(m, r.x)) + " modes");
    x_prev = (r.x.size() == x.size()) ? x : Vec{};
    R_prev = R;
    x = r.x;
    R = R_next;
    rep = r;
    if (r.iterations <= 5) step *= 1.6;
    const double cap = std::max(1.0, 0.15 * std::fabs(R));  // keep relative steps moderate
    if (std::fabs(step) > cap) step = std::copysign(cap, step);
  }
  rep.x = x;
  return rep;
}

std::vector<arith::Mpfr> refine_mpfr(const Model<arith::Mpfr>& m, const Vec& x_double,
                                     const Eigen::PartialPivLU<arith::MatD>& lu, int steps, double* last_residual) {
  using arith::Mpfr;
  std::vector<Mpfr> x(x_double.begin(), x_double.end());
  const int nr = static_cast<int>(m.rows.size());
  const int n = static_cast<int>(x.size());
  double res = 0;
  for (int s = 0; s < steps; ++s) {
    const auto v = model::residual(m, x);
    Eigen::VectorXd r(n);
    for (int i = 0; i < nr; ++i) r(i) = v.rows[i].to_double();
    for (int k = 0; k + nr < n; ++k) r(nr + k) = k < static_cast<int>(v.fun.size()) ? v.fun[k].to_double() : 0.0;
    res = r.lpNorm<Eigen::Infinity>();
    const Eigen::VectorXd dx = lu.solve(r);
    for (int i = 0; i < n; ++i) x[i] -= Mpfr(dx(i));
  }
  if (last_residual) *last_residual = res;
  return x;
}

}  // namespace porecert::candidate
