// Independent reference solver for the porous-pipe problem, used only by the tests. Shares no code
// with lib/ on purpose (its own series, its own integrator): it checks the certified enclosures
// from outside. NOT rigorous.
//
//   xi F'''' + 2F''' + (R/2)(F'F'' - F F''') = 0 on [0,1],  F(0) = 0, F'' bounded, F(1) = 1, F'(1) = 0.
//
// Unknowns a = F'(0), b = F''(0). Near the regular singular point xi = 0 the solution bounded there is
// the power series F = sum c_n xi^n, c_0 = 0, c_1 = a, c_2 = b/2 and, from the xi^n coefficient,
//   (n+1)(n+2)^2(n+3) c_{n+3} = -(R/2) [F'F'' - F F''']_n   (the right side uses c_1..c_{n+2} only).
// The series gives (F, F', F'', F''') at xi0 = 1/16; from there Boost.Odeint's controlled
// Runge-Kutta-Fehlberg 7(8) integrates F'''' = -(2F''' + (R/2)(F'F'' - F F'''))/xi to xi = 1 in long
// double (tolerance 1e-19). 2-D Newton on (F(1) - 1, F'(1)) with a finite-difference Jacobian (step
// 1e-8; the Jacobian's error slows Newton but does not move its fixed point), continuation in R.
#pragma once

#include <array>
#include <boost/numeric/odeint.hpp>
#include <cmath>
#include <stdexcept>
#include <vector>

namespace pipe_ref {

namespace odeint = boost::numeric::odeint;
using Real = long double;
using std::abs;
using State = std::array<Real, 4>;  // F, F', F'', F'''

struct Rhs {
  Real R;
  void operator()(const State& y, State& d, const Real& xi) const {
    d[0] = y[1];
    d[1] = y[2];
    d[2] = y[3];
    d[3] = -(2 * y[3] + R / 2 * (y[1] * y[2] - y[0] * y[3])) / xi;
  }
};

// (F, F', F'', F''') at xi0 from the series with F'(0) = a, F''(0) = b.
inline State series_at(const Real& R, const Real& a, const Real& b, const Real& xi0, int terms = 60) {
  std::vector<Real> c(terms + 4, Real(0));
  c[1] = a;
  c[2] = b / 2;
  for (int n = 0; n + 3 < terms; ++n) {
    Real s = 0;
    for (int i = 0; i <= n; ++i) {
      const int j = n - i;
      s += Real(i + 1) * c[i + 1] * Real((j + 1) * (j + 2)) * c[j + 2];  // F'F''
      s -= c[i] * Real((j + 1) * (j + 2) * (j + 3)) * c[j + 3];          // F F''' (c_0 = 0, so j + 3 <= n + 2)
    }
    c[n + 3] = -(R / 2) * s / Real((n + 1) * (n + 2) * (n + 2) * (n + 3));
  }
  State y{Real(0), Real(0), Real(0), Real(0)};
  for (int k = 0; k < 4; ++k) {
    Real p = 1;
    for (int n = k; n < terms; ++n) {
      Real f = 1;
      for (int q = 0; q < k; ++q) f *= Real(n - q);
      y[k] += f * c[n] * p;
      p *= xi0;
    }
  }
  return y;
}

inline State shoot(const Real& R, const Real& a, const Real& b) {
  const Real xi0 = Real(1) / 16;
  State y = series_at(R, a, b, xi0);
  auto stepper = odeint::make_controlled<odeint::runge_kutta_fehlberg78<State, Real>>(Real(1e-19L), Real(1e-19L));
  odeint::integrate_adaptive(stepper, Rhs{R}, y, xi0, Real(1), Real(1) / 256);
  return y;
}

struct Solution {
  double R = 0, fp0 = 0, fpp0 = 0, fpp1 = 0, K = 0;
  double residual = 0;  // |F(1) - 1| + |F'(1)| at the end
};

// The branch continued from R = 0 (F = 2 xi - xi^2) in `steps` equal steps.
inline Solution solve(double R_target, int steps = 8) {
  Real a = 2, b = -2;
  State y{};
  for (int s = 1; s <= steps; ++s) {
    const Real R = Real(R_target) * s / steps;
    for (int it = 0;; ++it) {
      y = shoot(R, a, b);
      const Real g0 = y[0] - 1, g1 = y[1];
      const Real h = Real(1e-8L);
      const State ya = shoot(R, a + h, b), yb = shoot(R, a, b + h);
      const Real j00 = (ya[0] - y[0]) / h, j01 = (yb[0] - y[0]) / h, j10 = (ya[1] - y[1]) / h, j11 = (yb[1] - y[1]) / h;
      const Real det = j00 * j11 - j01 * j10;
      const Real da = -(j11 * g0 - j01 * g1) / det, db = -(-j10 * g0 + j00 * g1) / det;
      a += da;
      b += db;
      const Real step = abs(da) + abs(db);
      if (step < Real(1e-17L)) break;
      if (it >= 30) {  // stagnation at rounding level is accepted, anything larger is not
        if (step < Real(1e-14L)) break;
        throw std::runtime_error("pipe_ref: Newton did not converge");
      }
    }
  }
  y = shoot(Real(R_target), a, b);
  Solution out;
  out.R = R_target;
  out.fp0 = static_cast<double>(a);
  out.fpp0 = static_cast<double>(b);
  out.fpp1 = static_cast<double>(y[2]);
  out.K = static_cast<double>(b + Real(R_target) / 2 * a * a);
  out.residual = static_cast<double>(abs(y[0] - 1) + abs(y[1]));
  return out;
}

}  // namespace pipe_ref
