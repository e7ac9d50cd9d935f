// Independent reference solver for Berman's porous-channel problem, used only by the tests.
// Shares no code with lib/ on purpose: it checks the certified enclosures from outside.
//
//   f'''' + R (f' f'' - f f''') = 0 on [0,1],  f(0) = 0, f''(0) = 0, f(1) = 1, f'(1) = 0.
//
// Shooting from eta = 0 with y = (f, f', f'', f''') = (0, a, 0, b); (a, b) solve f(1) = 1, f'(1) = 0 by
// 2-D Newton, Jacobian from the variational equations integrated alongside. Integrator: Boost.Odeint's
// fixed-order (40) Richardson extrapolation of the modified midpoint rule at constant step, in 80-digit
// Boost.Multiprecision binary floats (forward shooting for suction amplifies rounding like e^R).
// Every solve checks itself: one Newton correction at half the step must be below 1e-42, else the
// step is halved again. The same Newton can run on any other odeint stepper (tests cross-check RK78).
#pragma once

#include <algorithm>
#include <array>
#include <boost/multiprecision/cpp_bin_float.hpp>
#include <boost/numeric/odeint.hpp>
#include <cmath>
#include <cstddef>
#include <ios>
#include <stdexcept>
#include <string>
#include <utility>

namespace berman_ref {

namespace mp = boost::multiprecision;
namespace odeint = boost::numeric::odeint;

// Expression templates off: odeint's algebra stores intermediate results by value.
using Real = mp::number<mp::cpp_bin_float<80>, mp::et_off>;

// y[0..3] = (f, f', f'', f'''), y[4..7] = dy/da, y[8..11] = dy/db.
template <class T>
using State = std::array<T, 12>;

template <class T>
struct BermanRhs {
  T R;
  void operator()(const State<T>& y, State<T>& d, const T& /*eta*/) const {
    d[0] = y[1];
    d[1] = y[2];
    d[2] = y[3];
    d[3] = R * (y[0] * y[3] - y[1] * y[2]);
    for (std::size_t o : {std::size_t{4}, std::size_t{8}}) {
      d[o] = y[o + 1];
      d[o + 1] = y[o + 2];
      d[o + 2] = y[o + 3];
      d[o + 3] = R * (y[o] * y[3] + y[0] * y[o + 3] - y[o + 1] * y[2] - y[1] * y[o + 2]);
    }
  }
};

template <class T>
State<T> initial_state(const T& a, const T& b) {
  State<T> y;
  y.fill(T(0));
  y[1] = a;
  y[3] = b;
  y[5] = T(1);   // d f'(0) / da
  y[11] = T(1);  // d f'''(0) / db
  return y;
}

// n constant steps of any odeint stepper from eta = 0 to eta_end.
template <class T, class Stepper>
State<T> integrate_with(Stepper& stepper, const T& R, const T& a, const T& b, int n, const T& eta_end) {
  State<T> y = initial_state(a, b), next = y;
  const BermanRhs<T> rhs{R};
  const T h = eta_end / T(n);
  // Out-of-place steps: extrapolation_stepper's in-place do_step aliases input and output (Boost 1.74).
  for (int i = 0; i < n; ++i) {
    stepper.do_step(rhs, y, T(i) * h, next, h);
    std::swap(y, next);
  }
  return y;
}

// The workhorse: extrapolation order 40 (Order even; order 24 needs about 4x the steps for 40 digits).
template <class T, unsigned short Order = 40>
State<T> integrate_berman(const T& R, const T& a, const T& b, int n, const T& eta_end = T(1)) {
  odeint::extrapolation_stepper<Order, State<T>, T, State<T>, T> stepper;
  return integrate_with(stepper, R, a, b, n, eta_end);
}

// Classical 8th-order Runge-Kutta-Fehlberg at constant step: an independent integrator for cross-checks.
template <class T>
State<T> integrate_berman_rk78(const T& R, const T& a, const T& b, int n, const T& eta_end = T(1)) {
  odeint::runge_kutta_fehlberg78<State<T>, T, State<T>, T> stepper;
  return integrate_with(stepper, R, a, b, n, eta_end);
}

template <class T>
struct NewtonStep {
  T da, db;
};

// Newton correction for F(a, b) = (f(1) - 1, f'(1)) from the end state and its variations.
template <class T>
NewtonStep<T> newton_step(const State<T>& y1) {
  const T F0 = y1[0] - T(1), F1 = y1[1];
  const T J00 = y1[4], J01 = y1[8], J10 = y1[5], J11 = y1[9];
  const T det = J00 * J11 - J01 * J10;
  if (!(det != 0)) throw std::runtime_error("berman_ref: singular shooting Jacobian");
  return {-(J11 * F0 - J01 * F1) / det, -(J00 * F1 - J10 * F0) / det};
}

template <class T>
struct ShootSolution {
  T R, a, b;                  // a = f'(0), b = f'''(0)
  T fpp1;                     // f''(1), linearly corrected to the final (a, b)
  T K;                        // f'''(0) + R f'(0)^2
  int steps = 0;              // steps of the accepted integration
  int newton_iterations = 0;  // integrations used by Newton in total
  double error_estimate = 0;  // |da| + |db| of the half-step check (0 when not checked)
};

// Newton at fixed R with integrator(a, b) -> state at eta = 1; stops when |da| + |db| <= tol (1 + |a| + |b|).
// f''(1) is taken from the last integration plus its first-order change: no extra integration.
template <class T, class Integrator>
ShootSolution<T> newton_shoot(const T& R, T a, T b, Integrator&& integrator, const T& tol, int max_iter) {
  using std::abs;
  for (int it = 1; it <= max_iter; ++it) {
    const State<T> y1 = integrator(a, b);
    const NewtonStep<T> s = newton_step(y1);
    a += s.da;
    b += s.db;
    if (!(abs(a) < T(1e6) && abs(b) < T(1e12))) throw std::runtime_error("berman_ref: Newton diverged");
    if (abs(s.da) + abs(s.db) <= tol * (T(1) + abs(a) + abs(b))) {
      const T fpp1 = y1[2] + y1[6] * s.da + y1[10] * s.db;
      return {R, a, b, fpp1, b + R * a * a, 0, it, 0.0};
    }
  }
  throw std::runtime_error("berman_ref: Newton did not converge");
}

struct ShootOptions {
  int steps = 32;            // initial constant steps on [0, 1] (enough for |R| <= 50)
  int max_steps = 4096;      // give up beyond this
  bool self_check = true;    // verify with one Newton correction at half the step
  double check_tol = 1e-42;  // accepted size of that correction (relative to 1 + |a| + |b|)
};

// High-precision Newton from (a, b), with the half-step self-check of the header comment.
inline ShootSolution<Real> shoot_real(const Real& R, Real a, Real b, const ShootOptions& opt = {}) {
  using std::abs;
  int n = opt.steps, iterations = 0;
  for (;;) {
    auto at_n = [&](const Real& x, const Real& y) { return integrate_berman<Real>(R, x, y, n); };
    // With the check, Newton may stop early: the check's own correction finishes the job.
    ShootSolution<Real> s = newton_shoot<Real>(R, a, b, at_n, Real(opt.self_check ? 1e-22 : 1e-45), 20);
    iterations += s.newton_iterations;
    s.steps = n;
    s.newton_iterations = iterations;
    if (!opt.self_check) return s;
    // The correction at 2n measures the discretisation error at n; keep the (better) 2n values.
    const State<Real> y1 = integrate_berman<Real>(R, s.a, s.b, 2 * n);
    const NewtonStep<Real> c = newton_step(y1);
    ++iterations;
    const Real size = (abs(c.da) + abs(c.db)) / (Real(1) + abs(s.a) + abs(s.b));
    a = s.a + c.da;
    b = s.b + c.db;
    if (size <= Real(opt.check_tol)) {
      const Real fpp1 = y1[2] + y1[6] * c.da + y1[10] * c.db;
      return {R, a, b, fpp1, b + R * a * a, 2 * n, iterations, static_cast<double>(size)};
    }
    n *= 2;
    if (n > opt.max_steps) throw std::runtime_error("berman_ref: step-halving check failed");
  }
}

// Damped Newton in double (order-12 extrapolation, 64 steps): cheap start for the high-precision Newton.
inline std::array<double, 2> newton_double(double R, double a, double b) {
  auto residual = [&](double x, double y, State<double>& y1) {
    y1 = integrate_berman<double, 12>(R, x, y, 64);
    return std::abs(y1[0] - 1.0) + std::abs(y1[1]);
  };
  State<double> y1;
  double res = residual(a, b, y1);
  for (int it = 0; it < 60; ++it) {
    const NewtonStep<double> s = newton_step(y1);
    if (std::abs(s.da) + std::abs(s.db) <= 1e-12 * (1.0 + std::abs(a) + std::abs(b))) return {a + s.da, b + s.db};
    double lambda = 1.0, na = a, nb = b, nres = res;
    State<double> ny1;
    for (int k = 0; k < 30; ++k, lambda *= 0.5) {
      na = a + lambda * s.da;
      nb = b + lambda * s.db;
      nres = residual(na, nb, ny1);
      if (std::isfinite(nres) && nres < res) break;
    }
    if (!(std::isfinite(nres) && nres < res)) break;  // stalled at rounding level: hand over as is
    a = na;
    b = nb;
    res = nres;
    y1 = ny1;
  }
  return {a, b};
}

// Type I start: continuation in double from R = 0 (f = (3 eta - eta^3)/2), unit R steps, secant predictor.
inline std::array<double, 2> type1_guess_double(double R) {
  double a = 1.5, b = -3.0, a_prev = a, b_prev = b, r_prev = 0.0, r = 0.0;
  while (r != R) {
    const double r_next = (R > r) ? std::min(R, r + 1.0) : std::max(R, r - 1.0);
    double ga = a, gb = b;
    if (r != r_prev) {
      const double t = (r_next - r) / (r - r_prev);
      ga = a + t * (a - a_prev);
      gb = b + t * (b - b_prev);
    }
    const auto g = newton_double(r_next, ga, gb);
    a_prev = a;
    b_prev = b;
    r_prev = r;
    a = g[0];
    b = g[1];
    r = r_next;
  }
  return {a, b};
}

// R as a decimal string, correctly rounded to 80 digits (1e-3 is not a binary number; the
// rounding, ~1e-80 relative, is far below the 40 digits reported).
inline ShootSolution<Real> solve_type1(const std::string& R, const ShootOptions& opt = {}) {
  const Real r(R);
  const auto g = type1_guess_double(static_cast<double>(r));
  return shoot_real(r, Real(g[0]), Real(g[1]), opt);
}

inline ShootSolution<Real> solve_from(const std::string& R, double a_guess, double b_guess,
                                      const ShootOptions& opt = {}) {
  const Real r(R);
  const auto g = newton_double(static_cast<double>(r), a_guess, b_guess);
  return shoot_real(r, Real(g[0]), Real(g[1]), opt);
}

inline std::string to_digits(const Real& x, int digits = 40) {
  return x.str(digits - 1, std::ios_base::scientific);  // scientific: digits after the point
}

struct BermanReference {
  std::string fp0, fppp0, fpp1, K;  // decimal strings, 40 significant digits
  double fp0_d, fppp0_d, fpp1_d, K_d;
};

inline BermanReference make_reference(const ShootSolution<Real>& s) {
  return {to_digits(s.a),           to_digits(s.b),           to_digits(s.fpp1),           to_digits(s.K),
          static_cast<double>(s.a), static_cast<double>(s.b), static_cast<double>(s.fpp1), static_cast<double>(s.K)};
}

}  // namespace berman_ref

using berman_ref::BermanReference;

// Type I branch, reached by continuation in R from R = 0 (plane Poiseuille).
inline BermanReference berman_type1_reference(const std::string& R) {
  return berman_ref::make_reference(berman_ref::solve_type1(R));
}

// Any branch: Newton from the guess (a, b) = (f'(0), f'''(0)); throws if it does not converge.
inline BermanReference berman_reference_from(const std::string& R, double a_guess, double b_guess) {
  return berman_ref::make_reference(berman_ref::solve_from(R, a_guess, b_guess));
}
