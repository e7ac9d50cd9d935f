// The symmetry-breaking point of type I in the full channel (a = 1): the extended system of
// docs/fold.md with the even null space (F14), proved by the same fold verifier.
#include <doctest/doctest.h>

#include <array>
#include <boost/numeric/odeint.hpp>
#include <cmath>

#include "model/model_spec.hpp"
#include "proof/branches.hpp"
#include "proof/certify.hpp"
#include "proof/fold.hpp"

using namespace porecert;
using arith::Id;

TEST_CASE("symmetry-breaking point: enclosed to width <= 1e-8 near R = 6, re-checkable, not a turning point") {
  const proof::FoldOutcome f = proof::certify_symmetry_breaking();
  REQUIRE(f.certified);
  CHECK(arith::width_up(f.R) <= 1e-8);
  // Reported near R ~ 6 (Zaturska, Drazin & Banks 1988, Fluid Dyn. Res. 4:151, from memory).
  CHECK(f.R.lower() > 5.9);
  CHECK(f.R.upper() < 6.1);

  // Cross-check with a different verifier: Berman's half channel certified on the R* interval
  // itself must give values overlapping the extended system's f'(0), f''(1), K at R*.
  proof::CertifyRequest req;
  req.R_lo = f.R_lo;
  req.R_hi = f.R_hi;
  const auto b = proof::certify_berman(req);
  REQUIRE(b.certified);
  CHECK(boost::numeric::overlap(b.fp0_id, f.fp0));
  CHECK(boost::numeric::overlap(b.fpp1_id, f.fpp1));
  CHECK(boost::numeric::overlap(b.K_id, f.K));

  // The stored candidate re-proves with the even null space, and fails as a turning point (odd v'(0) = 1).
  const auto again = proof::recheck_fold(f.candidate_hex, f.precision_bits, proof::fold::kEvenPerturbation);
  CHECK(again.certified);
  CHECK(boost::numeric::overlap(again.R, f.R));
  const auto wrong = proof::recheck_fold(f.candidate_hex, f.precision_bits, proof::fold::kTurningPoint);
  CHECK_FALSE(wrong.certified);
}

namespace {
// Independent reference (shares no code with lib/): shooting from eta = 0 for the odd base flow
// f = (0, a, 0, b) and the even perturbation h = (1, 0, c, 0) with
// h'''' = R (f h''' + h f''' - f' h'' - h' f''), by Boost.Odeint's Runge-Kutta-Fehlberg 7(8) at
// 400 constant steps in long double; 4-D Newton (finite differences) on (a, b, c, R) for
// f(1) = 1, f'(1) = 0, h(1) = 0, h'(1) = 0.
using LD = long double;
using St8 = std::array<LD, 8>;
std::array<LD, 4> shoot4(const std::array<LD, 4>& p) {
  const LD R = p[3];
  St8 y = {0, p[0], 0, p[1], 1, 0, p[2], 0};
  auto rhs = [R](const St8& s, St8& d, LD) {
    d[0] = s[1], d[1] = s[2], d[2] = s[3], d[3] = R * (s[0] * s[3] - s[1] * s[2]);
    d[4] = s[5], d[5] = s[6], d[6] = s[7];
    d[7] = R * (s[0] * s[7] + s[4] * s[3] - s[1] * s[6] - s[5] * s[2]);
  };
  boost::numeric::odeint::runge_kutta_fehlberg78<St8, LD> st;
  const LD h = LD(1) / 400;
  for (int i = 0; i < 400; ++i) st.do_step(rhs, y, i * h, h);
  return {y[0] - 1, y[1], y[4], y[5]};
}
}  // namespace

TEST_CASE("symmetry-breaking point agrees with an independent shooting reference (Boost.Odeint RKF78)") {
  const proof::FoldOutcome f = proof::certify_symmetry_breaking();
  REQUIRE(f.certified);
  // Start: the R = 6 type I shooting data rounded to 2 digits and c from nothing (c = -3).
  std::array<LD, 4> p = {1.43L, -2.4L, -3.0L, 6.0L};
  for (int it = 0; it < 30; ++it) {
    const auto r = shoot4(p);
    LD J[4][5];
    for (int j = 0; j < 4; ++j) {
      auto q = p;
      const LD h = 1e-8L * (1 + std::fabs(p[j]));
      q[j] += h;
      const auto rq = shoot4(q);
      for (int i = 0; i < 4; ++i) J[i][j] = (rq[i] - r[i]) / h;
    }
    for (int i = 0; i < 4; ++i) J[i][4] = -r[i];
    for (int c = 0; c < 4; ++c) {  // Gaussian elimination with partial pivoting
      int piv = c;
      for (int i = c + 1; i < 4; ++i)
        if (std::fabs(J[i][c]) > std::fabs(J[piv][c])) piv = i;
      for (int k = 0; k < 5; ++k) std::swap(J[c][k], J[piv][k]);
      for (int i = c + 1; i < 4; ++i) {
        const LD m = J[i][c] / J[c][c];
        for (int k = c; k < 5; ++k) J[i][k] -= m * J[c][k];
      }
    }
    std::array<LD, 4> dx{};
    for (int i = 3; i >= 0; --i) {
      LD s = J[i][4];
      for (int k = i + 1; k < 4; ++k) s -= J[i][k] * dx[k];
      dx[i] = s / J[i][i];
    }
    for (int i = 0; i < 4; ++i) p[i] += dx[i];
    if (std::fabs(dx[3]) < 1e-14L) break;
  }
  CAPTURE(static_cast<double>(p[3]));
  // Finite-difference Newton in long double: agreement to 1e-9 is far above its error.
  CHECK(std::fabs(static_cast<double>(p[3]) - arith::mid_double(f.R)) < 1e-9);
  CHECK(std::fabs(static_cast<double>(p[0]) - arith::mid_double(f.fp0)) < 1e-9);
  CHECK(std::fabs(static_cast<double>(p[2]) - arith::mid_double(f.kappa)) < 1e-8);  // v''(0)
}

TEST_CASE("on either side of the symmetry-breaking point: one symmetric solution found below, three certified above") {
  // R = 5.9 and 6.1 (R* ~ 6.0014): the search finds the symmetric solution only below and the
  // asymmetric pair above, all certified and pairwise distinct (a search, not a count proof).
  proof::CertifyRequest req;
  req.model = model::checked({"full-channel", {}});
  req.R_lo = req.R_hi = "5.9";
  const auto below = proof::certify_branches(req);
  CHECK(below.solutions.size() == 1);
  req.R_lo = req.R_hi = "6.1";
  const auto above = proof::certify_branches(req);
  REQUIRE(above.solutions.size() == 3);
  CHECK(above.pairwise_disjoint);
}
