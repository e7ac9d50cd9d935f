// Each floating-point trap of ../shared/notes/fp-traps.md pinned by a check that fails when it bites.
#include <doctest/doctest.h>

#include <Eigen/Core>
#include <cmath>

#include "arith/interval.hpp"
#include "arith/midrad.hpp"

using namespace porecert::arith;

namespace {
// Exact test of a·lo < b < a·hi style relations at 300 bits.
bool lt_exact(double a, double x, double b) {  // a*x < b ?
  mpfr_t t;
  mpfr_init2(t, 300);
  mpfr_set_d(t, a, MPFR_RNDN);
  mpfr_mul_d(t, t, x, MPFR_RNDN);  // exact at 300 bits
  const bool r = mpfr_cmp_d(t, b) < 0;
  mpfr_clear(t);
  return r;
}
}  // namespace

TEST_CASE("traps 1-2: 1/3 is a proper interval containing 1/3; 1 + 1e-30 is not [1,1]") {
  volatile double one = 1.0, three = 3.0, tiny = 1e-30;
  const Id q = Id(double(one)) / Id(double(three));
  CHECK(q.lower() < q.upper());
  CHECK(lt_exact(3.0, q.lower(), 1.0));
  CHECK(!lt_exact(3.0, q.upper(), 1.0));
  const Id s = Id(double(one)) + Id(double(tiny));
  CHECK(s.upper() > 1.0);
  CHECK(s.lower() == 1.0);
}

TEST_CASE("trap 3: negation keeps 41*0.1 and -(-41*0.1) overlapping, both containing 41/10") {
  const Id tenth = from_decimal<Id>("0.1");
  const Id a = Id(41) * tenth, b = -(-Id(41) * tenth);
  CHECK(boost::numeric::overlap(a, b));
  CHECK(lt_exact(10.0, a.lower(), 41.0));
  CHECK(!lt_exact(10.0, a.upper(), 41.0));
}

TEST_CASE("trap 4: no contraction across statements (-ffp-contract=off)") {
  volatile double a = 1.0 + 0x1p-27;
  const double p = a * a;
  const double d = p - (1.0 + 0x1p-26);
  CHECK(d == 0.0);  // a fused multiply-add would give 2^-54
#ifdef __FAST_MATH__
  FAIL("built in fast-math mode");
#endif
}

TEST_CASE("trap 5: Eigen never threads") {
#ifndef EIGEN_DONT_PARALLELIZE
  FAIL("EIGEN_DONT_PARALLELIZE not defined");
#endif
  CHECK(Eigen::nbThreads() == 1);
}

TEST_CASE("trap 6: NaN is caught, not propagated") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  CHECK_THROWS(Id(nan));
  CHECK_THROWS(rounded_nearest_outward::mul_down(0.0, inf));  // 0·inf in a bound
  CHECK_THROWS(Id(inf) - Id(inf));
  CHECK_THROWS(from_decimal<Id>("nan"));
}

TEST_CASE("trap 7: comparisons are three-valued and never throw") {
  const Id a(1, 2), b(1.5, 3);
  CHECK_NOTHROW(tri_less(a, b));
  CHECK(tri_less(a, b) == Tri::unsure);
  CHECK(tri_less(Id(1, 2), Id(3, 4)) == Tri::yes);
  CHECK(tri_less(Id(3, 4), Id(1, 2)) == Tri::no);
}

TEST_CASE("trap 8: decimals are read as strings and rounded outward") {
  const Id t = from_decimal<Id>("0.1");
  CHECK(lt_exact(10.0, t.lower(), 1.0));
  CHECK(!lt_exact(10.0, t.upper(), 1.0));
  CHECK(t.upper() == next_up(t.lower()));  // tightest
  const Id lit(0.1);                       // the trap: the literal is one double, not 1/10
  CHECK(lit.lower() == lit.upper());
  CHECK(from_decimal<Id>("0.5").lower() == 0.5);
  CHECK(from_decimal<Id>("0.5").upper() == 0.5);
  // Output is outward too: reading the printed bounds back contains the interval.
  const Id q = Id(1) / Id(3);
  CHECK(from_decimal<Id>(decimal_lower(q, 5)).lower() <= q.lower());
  CHECK(from_decimal<Id>(decimal_upper(q, 5)).upper() >= q.upper());
}

TEST_CASE("trap 9: the policy needs round-to-nearest only, and exact sums stay exact") {
  CHECK_NOTHROW(require_round_to_nearest());
  const Id s = Id(1) + Id(2);
  CHECK(s.lower() == 3.0);
  CHECK(s.upper() == 3.0);
  const Id e = Id(1.0) + Id(0x1p-53);  // inexact: must widen upward only
  CHECK(e.lower() == 1.0);
  CHECK(e.upper() == next_up(1.0));
}

TEST_CASE("trap 10: the product kernel's a-priori error term is present") {
  CHECK_NOTHROW(midrad_self_test());
  MatD A(2, 2);
  A << 1.0, 0x1p-53, 0.0, 0x1p-53;
  const MidRad C = product(A, MidRad{A.transpose(), MatD::Zero(2, 2)});
  CHECK(C.mid(0, 0) == 1.0);               // round-to-nearest loses 2^-106 ...
  CHECK(C.mid(0, 0) + C.rad(0, 0) > 1.0);  // ... the radius must cover it
}

TEST_CASE("past hard case: integers near 2^63 and large ratios convert outward") {
  const Id big(std::numeric_limits<long>::max());
  CHECK(static_cast<long double>(big.lower()) <= static_cast<long double>(std::numeric_limits<long>::max()));
  CHECK(static_cast<long double>(big.upper()) >= static_cast<long double>(std::numeric_limits<long>::max()));
  const long p = (1L << 53) + 1;  // not a double
  const Id r = ratio<Id>(p, 1);
  CHECK(r.lower() <= 9007199254740992.0);
  CHECK(r.upper() >= 9007199254740994.0);
}

TEST_CASE("past hard case: cos_of contains cos where Boost's reduction fails (2^25 < |x| < 2^56)") {
  const double x = 0x1.05e5e58cb21ecp+49;
  const Id c = cos_of(Id(x));
  mpfr_t t;
  mpfr_init2(t, 400);
  mpfr_set_d(t, x, MPFR_RNDN);
  mpfr_cos(t, t, MPFR_RNDN);
  CHECK(mpfr_cmp_d(t, c.lower()) >= 0);
  CHECK(mpfr_cmp_d(t, c.upper()) <= 0);
  CHECK(c.upper() - c.lower() < 1e-15);
  mpfr_clear(t);
  // Extrema inside the interval: cos over [3, 3.3] reaches -1 at π; over [-0.1, 0.2] reaches 1.
  CHECK(cos_of(Id(3.0, 3.3)).lower() == -1.0);
  CHECK(cos_of(Id(-0.1, 0.2)).upper() == 1.0);
  CHECK(cos_of(Id(0.0, 7.0)).lower() == -1.0);
  PrecisionScope p(200);
  const Im ci = cos_of(Im(Mpfr(3.0), Mpfr(3.3)));
  CHECK(ci.lower() == Mpfr(-1));
  CHECK(cos_of(Im(Mpfr(10.0), Mpfr(10.0))).upper() < Mpfr(-0.83));  // cos 10 ≈ -0.839: tight, not [-1, cos 2]
}
