// Green's function of d⁴/dη⁴ with u(0) = u''(0) = u(1) = u'(1) = 0 and the bounds β_k
// (docs/method.md G1–G11). Independent checks: exact polynomial identities, and Arb's rigorous
// integrator (acb_calc_integrate, Johansson 2018) on |∂ᵏG/∂ηᵏ(η,·)|.
#include <acb.h>
#include <acb_calc.h>
#include <arb.h>
#include <doctest/doctest.h>

#include <cmath>
#include <stdexcept>

#include "arith/interval.hpp"
#include "proof/greens.hpp"

using porecert::arith::Id;
using porecert::arith::Im;
namespace bn = boost::numeric;
namespace pp = porecert::proof;

namespace {

bool contains_zero_tightly(const Id& x) { return bn::zero_in(x) && bn::width(x) < 1e-14; }

Id ipow(const Id& x, int n) {  // bn::pow(0, 0) is empty
  Id r(1);
  for (int i = 0; i < n; ++i) r = r * x;
  return r;
}

// ∫_a^b Σ c[i][j] ηⁱ sʲ ds (exact table, interval arithmetic).
Id integrate_table(const std::array<std::array<long, 4>, 4>& c, const Id& eta, const Id& a, const Id& b) {
  Id r(0);
  for (int i = 0; i < 4; ++i)
    for (int j = 0; j < 4; ++j)
      if (c[i][j] != 0)
        r += Id(static_cast<double>(c[i][j])) * ipow(eta, i) * (ipow(b, j + 1) - ipow(a, j + 1)) / Id(j + 1);
  return r / Id(12);
}

// Outward double bounds of an Arb ball.
Id to_id(const arb_t x) {
  arf_t lo, hi;
  arf_init(lo);
  arf_init(hi);
  arb_get_lbound_arf(lo, x, 128);
  arb_get_ubound_arf(hi, x, 128);
  const Id r(arf_get_d(lo, ARF_RND_FLOOR), arf_get_d(hi, ARF_RND_CEIL));
  arf_clear(lo);
  arf_clear(hi);
  return r;
}

struct ArbPiece {
  acb_struct a[4];  // coefficients in s of the reduced piece (eq. G4') for the η given
  bool left;        // factor s (left) or (1 − s)² (right), ≥ 0 on [0,1]
};

// m(z)·|Σ a_j z^j| = |∂ᵏG|. With order != 0 Arb asks for holomorphy, which acb_real_abs refuses
// where the real part of its argument touches 0; Arb then bisects (only the simple zeros of the
// reduced piece are kinks; the factor's zeros are not, so it is kept outside the absolute value).
int abs_poly(acb_ptr out, const acb_t z, void* param, slong order, slong prec) {
  const auto* P = static_cast<const ArbPiece*>(param);
  acb_t r;
  acb_init(r);
  acb_set(r, P->a + 3);
  for (int j = 2; j >= 0; --j) {
    acb_mul(r, r, z, prec);
    acb_add(r, r, P->a + j, prec);
  }
  acb_real_abs(out, r, order != 0, prec);
  if (P->left) {
    acb_mul(out, out, z, prec);
  } else {
    acb_sub_ui(r, z, 1, prec);
    acb_mul(r, r, r, prec);
    acb_mul(out, out, r, prec);
  }
  acb_clear(r);
  return 0;
}

// Arb enclosure of F_k(η) = ∫₀^η |left| + ∫_η^1 |right| for η given as an Arb ball.
Id arb_F(int k, const arb_t eta) {
  const slong prec = 128;
  const pp::GreensTable t = pp::greens_table(k);
  Id total(0);
  for (int side = 0; side < 2; ++side) {
    const auto& c = side == 0 ? t.left_reduced : t.right_reduced;
    ArbPiece P;
    P.left = side == 0;
    for (int j = 0; j < 4; ++j) {
      acb_init(P.a + j);
      arb_t s, pw;
      arb_init(s);
      arb_init(pw);
      arb_one(pw);
      for (int i = 0; i < 4; ++i) {
        arb_t term;
        arb_init(term);
        arb_mul_si(term, pw, c[i][j], prec);
        arb_add(s, s, term, prec);
        arb_mul(pw, pw, eta, prec);
        arb_clear(term);
      }
      arb_div_ui(s, s, 12, prec);
      acb_set_arb(P.a + j, s);
      arb_clear(s);
      arb_clear(pw);
    }
    acb_t lo, hi, res;
    acb_init(lo);
    acb_init(hi);
    acb_init(res);
    if (side == 0) {
      acb_zero(lo);
      acb_set_arb(hi, eta);
    } else {
      acb_set_arb(lo, eta);
      acb_one(hi);
    }
    mag_t tol;
    mag_init(tol);
    mag_set_ui_2exp_si(tol, 1, -90);
    const int status = acb_calc_integrate(res, abs_poly, &P, lo, hi, 70, tol, nullptr, prec);
    REQUIRE(status == ARB_CALC_SUCCESS);
    total += to_id(acb_realref(res));
    mag_clear(tol);
    acb_clear(lo);
    acb_clear(hi);
    acb_clear(res);
    for (int j = 0; j < 4; ++j) acb_clear(P.a + j);
  }
  return total;
}

bool overlap(const Id& a, const Id& b) { return !(a.upper() < b.lower() || b.upper() < a.lower()); }

}  // namespace

TEST_CASE("greens: tables factor as s*reduced (left) and (1-s)^2*reduced (right) (eq. G4')") {
  for (int k = 0; k <= 3; ++k) {
    const pp::GreensTable t = pp::greens_table(k);
    for (int i = 0; i < 4; ++i) {
      // s·(r0 + r1 s + r2 s²)  and  (1 − 2s + s²)·(r0 + r1 s)
      const auto& L = t.left_reduced[i];
      const auto& R = t.right_reduced[i];
      const std::array<long, 4> left{0, L[0], L[1], L[2]};
      const std::array<long, 4> right{R[0], R[1] - 2 * R[0], R[0] - 2 * R[1], R[1]};
      CHECK(L[3] == 0);
      CHECK(R[2] == 0);
      CHECK(R[3] == 0);
      for (int j = 0; j < 4; ++j) {
        CHECK(t.left[i][j] == left[j]);
        CHECK(t.right[i][j] == right[j]);
      }
    }
  }
}

TEST_CASE("greens: boundary conditions, symmetry and jump conditions, exactly in intervals (eq. G3)") {
  for (const char* sd : {"0.1", "0.25", "0.5", "0.7", "0.9"}) {
    const Id s = porecert::arith::from_decimal<Id>(sd);
    // η = 0 < s: right piece; η = 1 > s: left piece.
    CHECK(contains_zero_tightly(pp::greens_piece<Id>(0, false, Id(0), s)));  // u(0) = 0
    CHECK(contains_zero_tightly(pp::greens_piece<Id>(2, false, Id(0), s)));  // u''(0) = 0
    CHECK(contains_zero_tightly(pp::greens_piece<Id>(0, true, Id(1), s)));   // u(1) = 0
    CHECK(contains_zero_tightly(pp::greens_piece<Id>(1, true, Id(1), s)));   // u'(1) = 0
    // G, G_η, G_ηη continuous at η = s; G_ηηη jumps by +1 (G_ηηη(s+) − G_ηηη(s−) = 1).
    for (int k = 0; k < 3; ++k)
      CHECK(contains_zero_tightly(pp::greens_piece<Id>(k, true, s, s) - pp::greens_piece<Id>(k, false, s, s)));
    const Id jump = pp::greens_piece<Id>(3, true, s, s) - pp::greens_piece<Id>(3, false, s, s);
    CHECK(contains_zero_tightly(jump - Id(1)));
    // Self-adjointness: G(η,s) = G(s,η).
    const Id eta = porecert::arith::from_decimal<Id>("0.6");
    const bool left = s.upper() <= eta.lower();
    CHECK(contains_zero_tightly(pp::greens_piece<Id>(0, left, eta, s) - pp::greens_piece<Id>(0, !left, s, eta)));
  }
  // Closed form (G3): G(η,s) = s(1−η)²(3η − (η+2)s²)/12 for s ≤ η.
  const Id eta(0.75), s(0.25);
  const Id closed = s * bn::square(Id(1) - eta) * (Id(3) * eta - (eta + Id(2)) * bn::square(s)) / Id(12);
  CHECK(contains_zero_tightly(pp::greens_eval<Id>(0, eta, s) - closed));
  CHECK(pp::greens_table(4).left[0][0] == 0);  // G is cubic in η on each side: ∂⁴G = 0
}

TEST_CASE("greens: u = ∫G·1 ds reproduces u = (2η⁴ − 3η³ + η)/48 and its derivatives (eq. G2)") {
  // u'''' = 1, u(0) = u''(0) = u(1) = u'(1) = 0: u = η⁴/24 + aη + cη³ with a = 1/48, c = −1/16.
  for (const char* ed : {"0", "0.2", "0.5", "0.8125", "1"}) {
    const Id eta = porecert::arith::from_decimal<Id>(ed);
    const Id u[4] = {(Id(2) * bn::pow(eta, 4) - Id(3) * bn::pow(eta, 3) + eta) / Id(48),
                     (Id(8) * bn::pow(eta, 3) - Id(9) * bn::square(eta) + Id(1)) / Id(48),
                     (Id(24) * bn::square(eta) - Id(18) * eta) / Id(48), (Id(48) * eta - Id(18)) / Id(48)};
    for (int k = 0; k < 4; ++k) {
      const pp::GreensTable t = pp::greens_table(k);
      const Id integral = integrate_table(t.left, eta, Id(0), eta) + integrate_table(t.right, eta, eta, Id(1));
      CHECK(contains_zero_tightly(integral - u[k]));
    }
  }
}

TEST_CASE("greens: point values of F_k agree with Arb's rigorous integration") {
  for (double e : {0.1, 0.3, 0.5, 0.7, 0.9, 1.0}) {
    arb_t eta;
    arb_init(eta);
    arb_set_d(eta, e);
    for (int k = 0; k < 4; ++k) {
      const Id ours = pp::greens_abs_integral<Id>(k, e);
      const Id arb = arb_F(k, eta);
      CAPTURE(k);
      CAPTURE(e);
      CHECK(overlap(ours, arb));
      CHECK(bn::width(arb) < 1e-15);
      CHECK(bn::width(ours) <= 1e-14);
    }
    arb_clear(eta);
  }
  // G ≥ 0 (G10): F_0 = u for g = 1.
  const Id e = porecert::arith::from_decimal<Id>("0.3");
  CHECK(overlap(pp::greens_abs_integral<Id>(0, 0.3), (Id(2) * bn::pow(e, 4) - Id(3) * bn::pow(e, 3) + e) / Id(48)));
}

TEST_CASE("greens: the derivative enclosure contains difference quotients (eq. G8)") {
  for (int k = 0; k < 4; ++k)
    for (double a : {0.05, 0.4, 0.66, 0.95}) {
      const double b = a + 1e-3;
      const Id D = pp::greens_abs_integral_derivative<Id>(k, a, b);
      const Id q = (pp::greens_abs_integral<Id>(k, b) - pp::greens_abs_integral<Id>(k, a)) / (Id(b) - Id(a));
      CAPTURE(k);
      CAPTURE(a);
      CHECK(overlap(D, q));
      CHECK(bn::width(D) < 0.1);  // O(b − a), not O(1)
    }
}

TEST_CASE("greens: beta_k enclosures (eq. G5) contain the closed forms, width <= 1e-12 relative") {
  const auto b = pp::greens_beta_detailed<Id>(1e-12);
  const auto closed = pp::greens_beta_closed_form<Id>();
  for (int k = 0; k < 4; ++k) {
    CAPTURE(k);
    CHECK(b[k].tolerance_met);
    CHECK(bn::subset(closed[k], b[k].value));
    CHECK(bn::width(b[k].value) <= 1e-12 * b[k].value.lower());
  }
  // Where the sup is attained (docs/method.md "Values of β_k").
  const Id etastar = pp::greens_beta0_argmax<Id>();
  CHECK(std::fabs(b[0].argmax - bn::median(etastar)) < 1e-5);
  CHECK(b[1].argmax == 0.0);
  CHECK(b[2].argmax == 1.0);
  CHECK(b[3].argmax == 1.0);

  // Arb at the maximiser η* = (1 + √33)/16: ∫|G(η*,s)| ds and the closed form of β_0.
  arb_t eta, r;
  arb_init(eta);
  arb_init(r);
  arb_sqrt_ui(r, 33, 128);
  arb_add_ui(eta, r, 1, 128);
  arb_div_ui(eta, eta, 16, 128);
  CHECK(overlap(arb_F(0, eta), b[0].value));
  arb_mul_ui(r, r, 55, 128);
  arb_add_ui(r, r, 39, 128);
  arb_div_ui(r, r, 65536, 128);
  CHECK(bn::subset(to_id(r), b[0].value));
  arb_clear(eta);
  arb_clear(r);
}

TEST_CASE("greens: MPFR enclosures are tighter and nest with the double ones") {
  porecert::arith::PrecisionScope scope(128);
  const auto bm = pp::greens_beta_detailed<Im>(1e-25);
  const auto bd = pp::greens_beta<Id>(1e-12);
  const auto closed = pp::greens_beta_closed_form<Im>();
  for (int k = 0; k < 4; ++k) {
    CAPTURE(k);
    CHECK(bm[k].tolerance_met);
    CHECK(bn::subset(closed[k], bm[k].value));
    const Id asd = porecert::arith::to_id(bm[k].value);
    CHECK(overlap(asd, bd[k]));
    CHECK(bn::width(bm[k].value).to_double() <= 1e-25 * bm[k].value.lower().to_double());
  }
}

TEST_CASE("greens: sup_by_subdivision on a known function, and domain errors") {
  // F(x) = x(1 − x): sup 1/4 at 1/2, F' = 1 − 2x.
  const auto s =
      pp::sup_by_subdivision<Id>([](double x) { return Id(x) * (Id(1) - Id(x)); },
                                 [](double a, double b) { return Id(1) - Id(2) * Id(a, b); }, 0.0, 1.0, 1e-12);
  CHECK(s.tolerance_met);
  CHECK(bn::in(0.25, s.value));
  CHECK(bn::width(s.value) <= 1e-12 * 0.25);
  CHECK_THROWS_AS(pp::greens_abs_integral<Id>(0, 1.5), std::domain_error);
  CHECK_THROWS_AS(pp::greens_abs_integral<Id>(4, 0.5), std::domain_error);
  CHECK_THROWS_AS(pp::greens_eval<Id>(0, Id(-0.5), Id(0.5)), std::domain_error);
}
