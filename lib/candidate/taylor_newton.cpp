#include "candidate/taylor_newton.hpp"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <limits>

#include "model/taylor_operator.hpp"

namespace porecert::candidate {

using model::TaylorModel;

namespace {
// Truncated residual (rows, modes < N) and Jacobian, in double.
void system_of(const TaylorModel<double>& m, const std::vector<double>& x, Eigen::VectorXd* F, Eigen::MatrixXd* J) {
  const int ns = m.n_scalars();
  const int n = static_cast<int>(x.size());
  const int N = n - ns;
  const auto r = model::taylor_residual(m, x);
  F->resize(n);
  for (int i = 0; i < ns; ++i) (*F)(i) = r.rows[i];
  for (int k = 0; k < N; ++k) (*F)(ns + k) = k < static_cast<int>(r.modes.size()) ? r.modes[k] : 0.0;
  if (!J) return;
  const auto G = model::taylor_derivatives(m, x);
  J->setZero(n, n);
  for (int j = 0; j < n; ++j) {
    const auto c = model::taylor_column(m, G, j);
    for (int i = 0; i < ns; ++i) (*J)(i, j) = c.rows[i];
    for (int k = 0; k < N && k < static_cast<int>(c.modes.size()); ++k) (*J)(ns + k, j) = c.modes[k];
  }
}
}  // namespace

TaylorCandidate taylor_newton(const TaylorModel<double>& m, std::vector<double> x, int max_iterations) {
  TaylorCandidate out;
  const int n = static_cast<int>(x.size());
  Eigen::VectorXd F;
  Eigen::MatrixXd J;
  double last_step = std::numeric_limits<double>::infinity();
  for (int it = 0; it < max_iterations; ++it) {
    system_of(m, x, &F, &J);
    if (!F.allFinite() || !J.allFinite()) {
      out.note = "non-finite residual";
      break;
    }
    const Eigen::VectorXd dx = J.partialPivLu().solve(-F);
    if (!dx.allFinite()) {
      out.note = "singular Jacobian";
      break;
    }
    double xn = 0;
    for (int i = 0; i < n; ++i) {
      x[i] += dx(i);
      xn += std::fabs(x[i]);
    }
    out.iterations = it + 1;
    const double step = dx.lpNorm<1>();
    // Converged: a correction at rounding level, or one that stopped shrinking once small
    // (cancellation in the rows limits the attainable accuracy when coefficients are large).
    if (step <= 1e-15 * (1 + xn) || (step <= 1e-9 * (1 + xn) && step >= 0.5 * last_step)) {
      out.converged = true;
      break;
    }
    last_step = step;
    if (dx.lpNorm<1>() > 1e6 * (1 + xn)) {
      out.note = "Newton diverged";
      break;
    }
  }
  if (!out.converged && out.note.empty()) out.note = "Newton did not converge";
  if (out.converged) {  // one more step: the last correction was tiny, this one is below rounding
    system_of(m, x, &F, &J);
    const Eigen::VectorXd dx = J.partialPivLu().solve(-F);
    if (dx.allFinite())
      for (int i = 0; i < n; ++i) x[i] += dx(i);
  }
  out.x = std::move(x);
  return out;
}

std::vector<double> taylor_with_modes(const TaylorModel<double>& m, std::vector<double> x, int n) {
  x.resize(m.n_scalars() + n, 0.0);
  return x;
}

bool taylor_decayed(const TaylorModel<double>& m, const std::vector<double>& x, double rel) {
  const int ns = m.n_scalars();
  const int N = static_cast<int>(x.size()) - ns;
  if (N < 16) return false;
  double mx = 0, last = 0;
  for (int k = 0; k < N; ++k) mx = std::max(mx, std::fabs(x[ns + k]));
  for (int k = N - 8; k < N; ++k) last = std::max(last, std::fabs(x[ns + k]));
  return last <= rel * mx;
}

TaylorCandidate taylor_solve_with_decay(const TaylorModel<double>& m, std::vector<double> x, int n_max) {
  TaylorCandidate c;
  for (;;) {
    c = taylor_newton(m, x);
    const int N = static_cast<int>(c.x.size()) - m.n_scalars();
    if (!c.converged) return c;
    if (taylor_decayed(m, c.x)) return c;
    if (N >= n_max) {
      c.converged = false;
      c.decay_failed = true;
      c.note = "Taylor coefficients have not decayed at " + std::to_string(N) +
               " modes (the series about xi = 0 may not converge on [0,1])";
      return c;
    }
    x = taylor_with_modes(m, c.x, std::min(n_max, N * 3 / 2));
  }
}

TaylorCandidate taylor_continuation(const std::function<TaylorModel<double>(double)>& make, double R_target, int n_max,
                                    std::vector<std::string>* log) {
  const auto m0 = make(0.0);
  TaylorCandidate c = taylor_solve_with_decay(m0, std::vector<double>(m0.n_scalars() + 16, 0.0), n_max);
  if (!c.converged) return c;
  double R = 0, step = std::min(2.0, std::fabs(R_target));
  const double dir = R_target >= 0 ? 1 : -1;
  int stages = 0;
  while (R != R_target) {
    const double Rn = std::fabs(R_target - R) <= step ? R_target : R + dir * step;
    const auto mn = make(Rn);
    TaylorCandidate t = taylor_solve_with_decay(mn, c.x, n_max);
    if (!t.converged && t.decay_failed) {  // smaller steps cannot make the series at Rn converge faster
      t.note = "at R = " + std::to_string(Rn) + ": " + t.note;
      return t;
    }
    if (t.converged) {
      c = t;
      R = Rn;
      ++stages;
      if (t.iterations <= 5) step *= 1.5;
    } else {
      step /= 2;
      if (step < 1e-6 * (1 + std::fabs(R_target))) {
        c.converged = false;
        c.note = "continuation stalled near R = " + std::to_string(R) + ": " + t.note;
        return c;
      }
    }
  }
  if (log)
    log->push_back("Taylor candidate by continuation from R = 0 in " + std::to_string(stages) + " steps, " +
                   std::to_string(static_cast<int>(c.x.size()) - m0.n_scalars()) + " modes");
  return c;
}

std::vector<arith::Mpfr> taylor_refine_mpfr(const TaylorModel<arith::Mpfr>& m, const TaylorModel<double>& md,
                                            const std::vector<double>& x0, int steps) {
  using arith::Mpfr;
  Eigen::VectorXd F;
  Eigen::MatrixXd J;
  system_of(md, x0, &F, &J);
  const Eigen::PartialPivLU<Eigen::MatrixXd> lu(J);
  std::vector<Mpfr> x(x0.begin(), x0.end());
  const int ns = m.n_scalars();
  const int n = static_cast<int>(x.size());
  for (int s = 0; s < steps; ++s) {
    const auto r = model::taylor_residual(m, x);
    Eigen::VectorXd v(n);
    for (int i = 0; i < ns; ++i) v(i) = r.rows[i].to_double();
    for (int k = 0; k + ns < n; ++k) v(ns + k) = k < static_cast<int>(r.modes.size()) ? r.modes[k].to_double() : 0.0;
    const Eigen::VectorXd dx = lu.solve(v);
    if (!dx.allFinite()) break;
    for (int i = 0; i < n; ++i) x[i] -= Mpfr(dx(i));
  }
  return x;
}

}  // namespace porecert::candidate
