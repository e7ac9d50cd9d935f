// Tests of the independent reference solver tests/reference/berman_shooting.hpp (no code from lib/).
#include <doctest/doctest.h>

#include <array>
#include <boost/math/constants/constants.hpp>
#include <cstddef>
#include <string>
#include <vector>

#include "reference/berman_shooting.hpp"

namespace {

using berman_ref::Real;
using berman_ref::ShootSolution;

double err(const Real& x, const Real& y) { return static_cast<double>(abs(x - y)); }
double rel_err(const Real& x, const Real& y) { return static_cast<double>(abs(x - y) / (1 + abs(y))); }
Real pi() { return boost::math::constants::pi<Real>(); }

// Regular perturbation series in R, computed here in 80-digit floats (derived, see method.md for order 1):
// f = sum_k R^k f_k, f_0 = (3 eta - eta^3)/2, f_k'''' = sum_{i+j=k-1} (f_i f_j''' - f_i' f_j''),
// f_k(0) = f_k''(0) = f_k(1) = f_k'(1) = 0 (k >= 1). Each f_k is a polynomial: four integrations from 0
// plus c1 eta + c3 eta^3 fixed by the conditions at eta = 1. Shares nothing with the shooting code.
struct SeriesCoefficients {
  std::vector<Real> fp0, fppp0, fpp1, K;  // coefficient of R^k
};

using Poly = std::vector<Real>;  // coefficient of eta^j

Poly deriv(const Poly& p) {
  Poly d(p.size() > 1 ? p.size() - 1 : 1, Real(0));
  for (std::size_t j = 1; j < p.size(); ++j) d[j - 1] = Real(static_cast<int>(j)) * p[j];
  return d;
}

Poly integ(const Poly& p) {
  Poly q(p.size() + 1, Real(0));
  for (std::size_t j = 0; j < p.size(); ++j) q[j + 1] = p[j] / Real(static_cast<int>(j + 1));
  return q;
}

void add_product(Poly& acc, const Poly& a, const Poly& b, int sign) {
  if (acc.size() < a.size() + b.size() - 1) acc.resize(a.size() + b.size() - 1, Real(0));
  for (std::size_t i = 0; i < a.size(); ++i)
    for (std::size_t j = 0; j < b.size(); ++j) acc[i + j] += Real(sign) * a[i] * b[j];
}

Real at1(const Poly& p) {
  Real s = 0;
  for (const Real& c : p) s += c;
  return s;
}

SeriesCoefficients small_R_series(int order) {
  std::vector<Poly> f{{Real(0), Real(3) / 2, Real(0), Real(-1) / 2}};
  for (int k = 1; k <= order; ++k) {
    Poly rhs{Real(0)};
    for (int i = 0; i < k; ++i) {
      const Poly& fi = f[static_cast<std::size_t>(i)];
      const Poly& fj = f[static_cast<std::size_t>(k - 1 - i)];
      add_product(rhs, fi, deriv(deriv(deriv(fj))), 1);
      add_product(rhs, deriv(fi), deriv(deriv(fj)), -1);
    }
    Poly p = integ(integ(integ(integ(rhs))));
    const Real p1 = at1(p), dp1 = at1(deriv(p));
    const Real c3 = -(dp1 - p1) / 2, c1 = -p1 - c3;
    if (p.size() < 4) p.resize(4, Real(0));
    p[1] += c1;
    p[3] += c3;
    f.push_back(p);
  }
  SeriesCoefficients s;
  for (int k = 0; k <= order; ++k) {
    const Poly& fk = f[static_cast<std::size_t>(k)];
    s.fp0.push_back(fk[1]);
    s.fppp0.push_back(6 * fk[3]);
    s.fpp1.push_back(at1(deriv(deriv(fk))));
    Real K = 6 * fk[3];  // K = f'''(0) + R f'(0)^2
    for (int i = 0; i < k; ++i) K += s.fp0[static_cast<std::size_t>(i)] * s.fp0[static_cast<std::size_t>(k - 1 - i)];
    s.K.push_back(K);
  }
  return s;
}

Real sum_series(const std::vector<Real>& c, const Real& R) {
  Real s = 0;
  for (std::size_t k = c.size(); k-- > 0;) s = s * R + c[k];
  return s;
}

// K(eta) = f''' + R (f'^2 - f f'') is constant along solutions (derivative is the ODE itself).
Real K_at(const berman_ref::State<Real>& y, const Real& R) { return y[3] + R * (y[1] * y[1] - y[0] * y[2]); }

}  // namespace

TEST_CASE("R = 0 is plane Poiseuille: f'(0) = 3/2, f'''(0) = -3, f''(1) = -3, K = -3 (exact)") {
  const BermanReference r = berman_type1_reference("0");
  CHECK(err(Real(r.fp0), Real(3) / 2) <= 1e-35);
  CHECK(err(Real(r.fppp0), Real(-3)) <= 1e-35);
  CHECK(err(Real(r.fpp1), Real(-3)) <= 1e-35);
  CHECK(err(Real(r.K), Real(-3)) <= 1e-35);
  // 40 significant digits, scientific.
  CHECK(r.fp0 == "1.500000000000000000000000000000000000000e+00");
  CHECK(r.K == "-3.000000000000000000000000000000000000000e+00");
  CHECK(r.fp0_d == 1.5);
  CHECK(r.fpp1_d == -3.0);
}

TEST_CASE("small R: Berman's first-order series, with a nonzero O(R^2) remainder") {
  // Berman 1953, J. Appl. Phys. 24:1232 (series re-derived in method.md): K = -3 + (81/35) R,
  // f''(1) = -3 - (3/35) R, f'(0) = 3/2 - R/140, f'''(0) = -3 + (9/140) R, each + O(R^2).
  // Our own R^2 coefficients (below, exact) are at most 0.0174 and at least 0.00054 in size, so
  // 4e-4 R^2 <= |remainder| <= 0.025 R^2 holds with margin at these R.
  for (const char* Rs : {"0.001", "0.01"}) {
    CAPTURE(Rs);
    const Real R(Rs);
    const BermanReference r = berman_type1_reference(Rs);
    const Real d[4] = {Real(r.K) - (-3 + Real(81) / 35 * R), Real(r.fpp1) - (-3 - Real(3) / 35 * R),
                       Real(r.fp0) - (Real(3) / 2 - R / 140), Real(r.fppp0) - (-3 + Real(9) / 140 * R)};
    for (const Real& x : d) {
      CHECK(static_cast<double>(abs(x) / (R * R)) <= 0.025);
      CHECK(static_cast<double>(abs(x) / (R * R)) >= 4e-4);  // the series is not the solution
    }
  }
}

TEST_CASE("small R: 40 digits against the perturbation series to order 16") {
  const SeriesCoefficients s = small_R_series(16);
  // Order 1 is Berman's (1953, see above); order 2 derived here with exact rationals (sympy, same recursion).
  CHECK(err(s.fp0[1], Real(-1) / 140) <= 1e-70);
  CHECK(err(s.fppp0[1], Real(9) / 140) <= 1e-70);
  CHECK(err(s.fpp1[1], Real(-3) / 35) <= 1e-70);
  CHECK(err(s.K[1], Real(81) / 35) <= 1e-70);
  CHECK(err(s.fp0[2], Real(-703) / 1293600) <= 1e-70);
  CHECK(err(s.fppp0[2], Real(219) / 53900) <= 1e-70);
  CHECK(err(s.fpp1[2], Real(-394) / 40425) <= 1e-70);
  CHECK(err(s.K[2], Real(-234) / 13475) <= 1e-70);
  // Terms decay at least 10x per order here, so at |R| <= 0.01 the tail past order 16 is < 1e-50.
  for (const char* Rs : {"0.001", "0.01", "-0.01"}) {
    CAPTURE(Rs);
    const Real R(Rs);
    const BermanReference r = berman_type1_reference(Rs);
    CHECK(err(Real(r.fp0), sum_series(s.fp0, R)) <= 1e-39);
    CHECK(err(Real(r.fppp0), sum_series(s.fppp0, R)) <= 1e-39);
    CHECK(err(Real(r.fpp1), sum_series(s.fpp1, R)) <= 1e-39);
    CHECK(err(Real(r.K), sum_series(s.K, R)) <= 1e-39);
  }
}

TEST_CASE("self-consistency at R = -50, -10, 10, 30: step halving, boundary residuals, K invariant") {
  for (const char* Rs : {"-50", "-10", "10", "30"}) {
    CAPTURE(Rs);
    const Real R(Rs);
    const ShootSolution<Real> s = berman_ref::solve_type1(Rs);
    CHECK(s.error_estimate <= 1e-42);
    // Step halving: a separate solve at half the steps (no self-check) agrees to > 38 digits.
    berman_ref::ShootOptions coarse;
    coarse.steps = s.steps / 2;
    coarse.self_check = false;
    const ShootSolution<Real> c = berman_ref::solve_type1(Rs, coarse);
    CHECK(rel_err(c.a, s.a) <= 1e-38);
    CHECK(rel_err(c.b, s.b) <= 1e-38);
    CHECK(rel_err(c.fpp1, s.fpp1) <= 1e-38);
    CHECK(rel_err(c.K, s.K) <= 1e-38);
    // Residuals on a different grid (96 steps): boundary conditions at eta = 1, f''(1), and K.
    const auto y1 = berman_ref::integrate_berman<Real>(R, s.a, s.b, 96);
    CHECK(err(y1[0], Real(1)) <= 1e-40);
    CHECK(err(y1[1], Real(0)) <= 1e-40);
    CHECK(rel_err(y1[2], s.fpp1) <= 1e-40);
    CHECK(rel_err(K_at(y1, R), s.K) <= 1e-40);
    const auto yh = berman_ref::integrate_berman<Real>(R, s.a, s.b, 48, Real("0.5"));
    CHECK(rel_err(K_at(yh, R), s.K) <= 1e-40);
    // The published strings carry the same numbers to 40 digits.
    const BermanReference r = berman_ref::make_reference(s);
    CHECK(static_cast<double>(abs(Real(r.fpp1) - s.fpp1) / abs(s.fpp1)) <= 1e-39);
    CHECK(static_cast<double>(abs(Real(r.K) - s.K) / abs(s.K)) <= 1e-39);
  }
}

TEST_CASE("a different integrator (RK78, constant step) converges at order 8 to the reference") {
  for (const char* Rs : {"-50", "30"}) {
    CAPTURE(Rs);
    const Real R(Rs);
    const ShootSolution<Real> s = berman_ref::solve_type1(Rs);
    Real e[2];
    int i = 0;
    for (int n : {250, 500}) {
      auto rk78 = [&](const Real& a, const Real& b) { return berman_ref::integrate_berman_rk78<Real>(R, a, b, n); };
      const ShootSolution<Real> k = berman_ref::newton_shoot<Real>(R, s.a, s.b, rk78, Real(1e-30), 10);
      e[i++] = abs(k.a - s.a) + abs(k.b - s.b) + abs(k.fpp1 - s.fpp1) + abs(k.K - s.K);
    }
    CHECK(static_cast<double>(e[1]) <= 1e-15);
    // Halving the step must cut the gap by ~2^8 = 256 (seen: 250-260); a wrong limit would not.
    CHECK(static_cast<double>(e[0] / e[1]) >= 200);
    CHECK(static_cast<double>(e[0] / e[1]) <= 300);
  }
}

TEST_CASE("large injection trend towards sin(pi eta / 2) (loose, trend only)") {
  // Taylor 1956, Proc. R. Soc. A 234:456 (from memory): as R -> -inf, f -> sin(pi eta/2), so
  // f'(0) -> pi/2, f''(1) -> -pi^2/4, K ~ (pi^2/4) R. Seen here: gaps 0.0099, 0.040, 0.042 at R = -50.
  const BermanReference r50 = berman_type1_reference("-50");
  const BermanReference r10 = berman_type1_reference("-10");
  const Real half_pi = pi() / 2, quarter_pi2 = pi() * pi() / 4;
  CHECK(err(Real(r50.fp0), half_pi) <= 0.02);
  CHECK(err(Real(r50.fpp1), -quarter_pi2) <= 0.08);
  CHECK(err(Real(r50.K) / Real(-50), quarter_pi2) <= 0.08);
  // ... and closer at R = -50 than at R = -10.
  CHECK(err(Real(r50.fp0), half_pi) < err(Real(r10.fp0), half_pi));
  CHECK(err(Real(r50.fpp1), -quarter_pi2) < err(Real(r10.fpp1), -quarter_pi2));
}

TEST_CASE("large suction trend: f''(1) = -R + O(1), K ~ R (loose, trend only)") {
  // Terrill 1964, Aeronaut. Q. 15:299 (from memory, via method.md). Seen here at R = 30:
  // f''(1) + R = 2.34, K - R = 3.54.
  const BermanReference r = berman_type1_reference("30");
  CHECK(r.fpp1_d / 30 + 1 >= 0);
  CHECK(r.fpp1_d / 30 + 1 <= 0.15);
  CHECK(r.K_d / 30 - 1 >= 0);
  CHECK(r.K_d / 30 - 1 <= 0.2);
}

TEST_CASE("berman_reference_from: same type I solution from a rough guess, other branches at R = 20") {
  const BermanReference t1 = berman_type1_reference("10");
  const BermanReference g = berman_reference_from("10", 1.2, -1.5);
  CHECK(err(Real(g.fp0), Real(t1.fp0)) <= 1e-39);
  CHECK(err(Real(g.fpp1), Real(t1.fpp1)) <= 1e-39);

  // Guesses from a coarse double scan done for this test. Expected only qualitatively (Robinson 1976,
  // J. Eng. Math. 10:23, from memory, via method.md): beyond R ~ 12.165 two more solutions exist, type III
  // with f'(0) < 0; the other one (type II) is checked here only as a distinct solution.
  const Real R("20");
  const ShootSolution<Real> s1 = berman_ref::solve_type1("20");
  std::vector<ShootSolution<Real>> found;
  for (auto guess : {std::array<double, 2>{-4.0, 59.0}, std::array<double, 2>{0.9, 1.3}}) {
    const ShootSolution<Real> s = found.emplace_back(berman_ref::solve_from("20", guess[0], guess[1]));
    CHECK(s.error_estimate <= 1e-42);
    CHECK(abs(s.a - s1.a) + abs(s.b - s1.b) > 0.1);  // not type I again
    const auto y1 = berman_ref::integrate_berman<Real>(R, s.a, s.b, 96);
    CHECK(err(y1[0], Real(1)) <= 1e-40);
    CHECK(err(y1[1], Real(0)) <= 1e-40);
    CHECK(rel_err(K_at(y1, R), s.K) <= 1e-40);
  }
  CHECK(found[0].a < 0);                                                     // type III: reversed flow at the centre
  CHECK(abs(found[0].a - found[1].a) + abs(found[0].b - found[1].b) > 0.1);  // three distinct solutions
}
