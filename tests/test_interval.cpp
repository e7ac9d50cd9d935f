// One test per floating-point trap of /work/shared/notes/fp-traps.md (numbered as there and in docs/enclosures.md):
// each fails when its trap bites. Exact checks go through MPFR or GMP rationals.
#include <doctest/doctest.h>
#include <gmp.h>
#include <mpfr.h>

#include <Eigen/Core>
#include <cfenv>
#include <cfloat>
#include <cmath>
#include <limits>
#include <random>
#include <string>

#include "arith/interval.hpp"
#include "arith/midrad.hpp"

using namespace porecert::arith;
namespace bn = boost::numeric;

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
// Reads a volatile: the compiler cannot know the value, so cannot fold the operation (traps 1, 2).
double load(const volatile double& v) { return v; }

// sign(k*d - m), computed exactly (k*d has at most 53 + 64 bits).
int cmp_scaled(double d, long k, long m) {
  mpfr_t t;
  mpfr_init2(t, 192);
  mpfr_set_d(t, d, MPFR_RNDN);
  const int inex = mpfr_mul_si(t, t, k, MPFR_RNDN);
  REQUIRE(inex == 0);
  const int c = mpfr_cmp_si(t, m);
  mpfr_clear(t);
  return c;
}
// Does x contain m/k exactly?  (k > 0)
bool contains_ratio(const Id& x, long m, long k) {
  return cmp_scaled(x.lower(), k, m) <= 0 && cmp_scaled(x.upper(), k, m) >= 0;
}

// Exact rational of a decimal string [-]ddd[.ddd][e[+-]dd] (the test's own parser, independent of MPFR).
struct Q {
  mpq_t v;
  Q() { mpq_init(v); }
  ~Q() { mpq_clear(v); }
  Q(const Q&) = delete;
  Q& operator=(const Q&) = delete;
};
void decimal_to_q(const std::string& s, Q& q) {
  std::string digits;
  long exp10 = 0;
  std::size_t i = 0;
  bool neg = false;
  if (s[i] == '-' || s[i] == '+') neg = s[i++] == '-';
  bool frac = false;
  for (; i < s.size() && s[i] != 'e' && s[i] != 'E'; ++i) {
    if (s[i] == '.') {
      frac = true;
    } else {
      digits += s[i];
      if (frac) --exp10;
    }
  }
  if (i < s.size()) exp10 += std::stol(s.substr(i + 1));
  mpz_t num, den;
  mpz_init_set_str(num, digits.c_str(), 10);
  mpz_init_set_ui(den, 1);
  if (exp10 >= 0) {
    mpz_t p;
    mpz_init(p);
    mpz_ui_pow_ui(p, 10, static_cast<unsigned long>(exp10));
    mpz_mul(num, num, p);
    mpz_clear(p);
  } else {
    mpz_ui_pow_ui(den, 10, static_cast<unsigned long>(-exp10));
  }
  if (neg) mpz_neg(num, num);
  mpq_set_num(q.v, num);
  mpq_set_den(q.v, den);
  mpq_canonicalize(q.v);
  mpz_clears(num, den, static_cast<mpz_ptr>(nullptr));
}
int cmp_double_decimal(double d, const std::string& s) {  // sign(d - s), exact
  Q a, b;
  mpq_set_d(a.v, d);
  decimal_to_q(s, b);
  return mpq_cmp(a.v, b.v);
}

// The trap-10 criterion of midrad_self_test(), applied to a given enclosure of A·Aᵀ.
bool self_test_criterion(const MidRad& C) {
  const double up = rounded_nearest_outward::add_up(C.mid(0, 0), C.rad(0, 0));
  const double lo = rounded_nearest_outward::sub_down(C.mid(0, 0), C.rad(0, 0));
  return up > 1.0 && lo <= 1.0;
}
}  // namespace

TEST_CASE("trap 1/2: 1/3 is a true interval containing 1/3, with volatile (unfoldable) inputs") {
  volatile double one = 1.0, three = 3.0;
  const Id q = Id(load(one)) / Id(load(three));
  CHECK(q.lower() < q.upper());
  CHECK(cmp_scaled(q.lower(), 3, 1) < 0);           // 3*lo < 1 exactly
  CHECK(cmp_scaled(q.upper(), 3, 1) > 0);           // 3*hi > 1 exactly
  CHECK(q.upper() == next_up(next_up(q.lower())));  // one ulp outward on each side of fl(1/3)
  // Repeating the same expression (a CSE candidate) must not change either bound.
  const Id q2 = Id(load(one)) / Id(load(three));
  CHECK(q2.lower() == q.lower());
  CHECK(q2.upper() == q.upper());
}

TEST_CASE("trap 1/2: 1 + 1e-30 is not folded to the point [1, 1]") {
  volatile double tiny = 1e-30;  // some positive double; its exact value does not matter
  for (const Id& s : {Id(1.0) + Id(1e-30), Id(1.0) + Id(load(tiny))}) {
    CHECK(s.lower() == 1.0);  // TwoSum proves fl(1 + t) = 1 lies below the exact sum
    CHECK(s.upper() > 1.0);
    CHECK(s.upper() == next_up(1.0));
  }
  volatile double m = -1e-30;
  const Id d = Id(1.0) + Id(load(m));
  CHECK(d.lower() < 1.0);
  CHECK(d.upper() == 1.0);
}

TEST_CASE("trap 3: 41*0.1 and -(-41*0.1) overlap and both contain 41/10") {
  const Id tenth = from_decimal<Id>("0.1");
  volatile double fortyone = 41.0;
  const Id a = Id(41.0) * tenth;
  const Id b = -(-Id(41.0) * tenth);
  const Id c = -(-Id(load(fortyone)) * tenth);
  for (const Id& x : {a, b, c}) CHECK(contains_ratio(x, 41, 10));
  CHECK(bn::overlap(a, b));
  CHECK(bn::overlap(a, c));
  // The policy is symmetric (negation is exact, both sides step one ulp), so they are even equal.
  CHECK(a.lower() == b.lower());
  CHECK(a.upper() == b.upper());
}

TEST_CASE("trap 4: no contraction across statements, no fast-math in this translation unit") {
#if defined(__FAST_MATH__)
  static_assert(false, "trap 4: fast-math mode is on");
#endif
#if defined(__FINITE_MATH_ONLY__)
  static_assert(__FINITE_MATH_ONLY__ == 0, "trap 4: finite-math-only mode is on");
#endif
  volatile double av = 1.0 + 0x1p-27;
  const double a = av;
  const double c = 1.0 + 0x1p-26;
  // a*a = 1 + 2^-26 + 2^-54 exactly; rounded it is c. A fused a*a - c would give 2^-54.
  const double p = a * a;
  const double r = p - c;
  CHECK(r == 0.0);
  const double r2 = a * a - c;  // the same in one expression
  CHECK(r2 == 0.0);
  CHECK(std::fma(a, a, -c) == 0x1p-54);  // the fused value really differs (the check has teeth)
  // NaN tests must survive (they would be folded away in finite-math-only mode).
  volatile double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK(std::isnan(nan));
  CHECK(nan != nan);
}

TEST_CASE("trap 5: Eigen runs single-threaded") {
#if !defined(EIGEN_DONT_PARALLELIZE)
  static_assert(false, "trap 5: EIGEN_DONT_PARALLELIZE is not defined");
#endif
  CHECK(Eigen::nbThreads() == 1);
}

TEST_CASE("trap 6: NaN is caught, never stored as a bound") {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  volatile double vn = nan;
  CHECK_THROWS_AS((void)Id(nan), nan_error);  // (void): else "Id(nan)" declares a variable
  CHECK_THROWS_AS((void)Id(load(vn)), nan_error);
  CHECK_THROWS_AS((void)Id(nan, 1.0), nan_error);
  CHECK_THROWS_AS((void)Id(0.0, nan), nan_error);
  CHECK_THROWS_AS((void)Id(2.0, 1.0), nan_error);  // empty input
  CHECK_THROWS_AS(Id(kInf) - Id(kInf), nan_error);
  CHECK_THROWS_AS(Id(kInf) + Id(-kInf), nan_error);
  CHECK_THROWS_AS(Id(kInf) / Id(kInf), nan_error);
  CHECK_THROWS_AS(Id(1.0) / Id(0.0), nan_error);
  CHECK_THROWS_AS(Id(0.0) / Id(0.0), nan_error);
  CHECK_THROWS_AS(bn::sqrt(Id(-1.0)), nan_error);
  CHECK_THROWS_AS(bn::log(Id(-1.0)), nan_error);
  CHECK_THROWS_AS(bn::cos(Id(kInf)), nan_error);
  CHECK_THROWS_AS(rounded_nearest_outward::mul_down(0.0, kInf), nan_error);  // the policy itself
  CHECK_THROWS_AS(rounded_nearest_outward::mul_up(kInf, 0.0), nan_error);
  CHECK_THROWS_AS(rounded_nearest_outward::exp_down(nan), nan_error);
  // Boost's sign analysis never forms 0*inf for [0,0]*[inf,inf]: the answer has no NaN bound.
  const Id z = Id(0.0) * Id(kInf);
  CHECK(z.lower() == 0.0);
  CHECK(z.upper() == 0.0);
  const Id w = Id(0.0, 1.0) * Id(1.0, kInf);
  CHECK(w.lower() == 0.0);
  CHECK(w.upper() == kInf);
  {
    PrecisionScope ps(128);
    CHECK_THROWS_AS((void)Im(nan), nan_error);
    CHECK_THROWS_AS(Im(Mpfr(1)) / Im(Mpfr(0)), nan_error);
    CHECK_THROWS_AS(bn::sqrt(Im(-1.0)), nan_error);
    Mpfr pinf;
    mpfr_set_inf(pinf.get(), 1);
    CHECK_THROWS_AS(Im(pinf) - Im(pinf), nan_error);
  }
  // The trap itself: Boost's checking_strict stores NaN bounds silently.
  using Strict =
      bn::interval<double,
                   bn::interval_lib::policies<rounded_nearest_outward, bn::interval_lib::checking_strict<double>>>;
  const Strict s(load(vn));
  CHECK(std::isnan(s.lower()));
}

TEST_CASE("trap 7: tri_less on overlapping intervals is unsure and does not throw") {
  const Id a(1.0, 3.0), b(2.0, 4.0);
  CHECK_THROWS_AS((void)(a < b), bn::interval_lib::comparison_error);  // Boost's default: the trap
  Tri t = Tri::no;
  CHECK_NOTHROW(t = tri_less(a, b));
  CHECK(t == Tri::unsure);
  CHECK(tri_less(b, a) == Tri::unsure);
  CHECK(tri_less(Id(1.0, 2.0), Id(next_up(2.0), 3.0)) == Tri::yes);
  CHECK(tri_less(Id(1.0, 2.0), Id(2.0, 3.0)) == Tri::unsure);  // touching: 2 < 2 is possible-no
  CHECK(tri_less(Id(3.0, 4.0), Id(1.0, 3.0)) == Tri::no);
  CHECK(tri_less(Id(2.0), Id(2.0)) == Tri::no);
  CHECK(tri_positive(Id(-1.0, 1.0)) == Tri::unsure);
  CHECK(tri_positive(Id(0.0, 1.0)) == Tri::unsure);
  CHECK(tri_positive(Id(-1.0, 0.0)) == Tri::no);
  CHECK(tri_positive(Id(std::numeric_limits<double>::denorm_min(), 1.0)) == Tri::yes);
  CHECK(tri_negative(Id(-1.0, 1.0)) == Tri::unsure);
  CHECK(tri_disjoint(a, b) == Tri::unsure);
  CHECK(tri_disjoint(Id(2.0), Id(2.0)) == Tri::no);
  CHECK(tri_disjoint(Id(1.0), Id(2.0)) == Tri::yes);
  PrecisionScope ps(128);
  const Im ma(Mpfr(1), Mpfr(3)), mb(Mpfr(2), Mpfr(4));
  CHECK_NOTHROW(t = tri_less(ma, mb));
  CHECK(t == Tri::unsure);
}

TEST_CASE("trap 8: from_decimal contains the decimal, is tightest, and a double literal is not exact") {
  const Id t = from_decimal<Id>("0.1");
  CHECK(cmp_scaled(t.lower(), 10, 1) < 0);  // 10*lo < 1 < 10*hi exactly
  CHECK(cmp_scaled(t.upper(), 10, 1) > 0);
  // The trap: the literal 0.1 is a double above 1/10, so Id(0.1) misses 1/10 on its lower side.
  volatile double lit = 0.1;
  const Id bad(load(lit));
  CHECK_FALSE(contains_ratio(bad, 1, 10));
  CHECK(cmp_scaled(bad.lower(), 10, 1) > 0);
  // Tightest: one ulp wide around a non-representable decimal, containing it exactly.
  for (const std::string s : {"0.1", "-0.1", "3.14159", "-2.7", "1e-300", "1e300", "123456789.123456789", "1e-310",
                              "-4.9e-324", "2.5e-324", "0.3", "1.7976931348623157e308", "6.02214076e23"}) {
    const Id x = from_decimal<Id>(s);
    CAPTURE(s);
    CHECK(x.upper() == next_up(x.lower()));
    CHECK(cmp_double_decimal(x.lower(), s) < 0);
    CHECK(cmp_double_decimal(x.upper(), s) > 0);
  }
  // Exact decimals give points.
  for (const std::string s : {"0.5", "-0.25", "3", "1e22", "0.0", "-0", "1.25e-1"}) {
    const Id x = from_decimal<Id>(s);
    CAPTURE(s);
    CHECK(x.lower() == x.upper());
    CHECK(cmp_double_decimal(x.lower(), s) == 0);
  }
  CHECK(from_decimal<Id>("0.5").lower() == 0.5);
  CHECK(from_decimal<Id>("0x1.8p-3").lower() == 0x1.8p-3);
  CHECK(from_decimal<Id>("0x1.8p-3").upper() == 0x1.8p-3);
  // Below the smallest subnormal: [0, denorm_min].
  const Id sub = from_decimal<Id>("1e-400");
  CHECK(sub.lower() == 0.0);
  CHECK(sub.upper() == std::numeric_limits<double>::denorm_min());
  for (const char* s : {"", "nan", "inf", "-inf", "1.0.0x", "1e400", "0.1 ", "abc", "1,5"})
    CHECK_THROWS_AS(from_decimal<Id>(s), std::invalid_argument);
  PrecisionScope ps(128);
  const Im m = from_decimal<Im>("0.1");
  CHECK(mpfr_cmp(m.lower().get(), m.upper().get()) < 0);
  Mpfr ten_lo, ten_hi;  // 10*bound exactly at 128 + 4 bits
  mpfr_set_prec(ten_lo.get(), 140);
  mpfr_set_prec(ten_hi.get(), 140);
  CHECK(mpfr_mul_ui(ten_lo.get(), m.lower().get(), 10, MPFR_RNDN) == 0);
  CHECK(mpfr_mul_ui(ten_hi.get(), m.upper().get(), 10, MPFR_RNDN) == 0);
  CHECK(mpfr_cmp_ui(ten_lo.get(), 1) < 0);
  CHECK(mpfr_cmp_ui(ten_hi.get(), 1) > 0);
}

TEST_CASE("trap 9: containment with compile-time-visible inputs; exact results stay points") {
  constexpr double one = 1.0, three = 3.0, ten = 10.0, two = 2.0;
  const Id q = Id(load(one)) / Id(load(three));
  CHECK(contains_ratio(q, 1, 3));
  CHECK(q.lower() < q.upper());
  CHECK(contains_ratio(Id(one) / Id(ten), 1, 10));
  CHECK(contains_ratio(Id(two) / Id(three) * Id(three), 2, 1));
  const Id r = bn::sqrt(Id(two));
  {  // lo² < 2 < hi² exactly
    mpfr_t t;
    mpfr_init2(t, 128);
    mpfr_set_d(t, r.lower(), MPFR_RNDN);
    mpfr_sqr(t, t, MPFR_RNDN);
    CHECK(mpfr_cmp_ui(t, 2) < 0);
    mpfr_set_d(t, r.upper(), MPFR_RNDN);
    mpfr_sqr(t, t, MPFR_RNDN);
    CHECK(mpfr_cmp_ui(t, 2) > 0);
    mpfr_clear(t);
  }
  // Exact operations are tight (TwoSum for sums, powers of two for products and quotients).
  const auto is_point = [](const Id& x, double v) { return x.lower() == v && x.upper() == v; };
  CHECK(is_point(Id(1.0) + Id(2.0), 3.0));
  CHECK(is_point(Id(0.5) - Id(0.25), 0.25));
  CHECK(is_point(Id(3.0) * Id(0.5), 1.5));
  CHECK(is_point(Id(1.0) / Id(4.0), 0.25));
  CHECK(is_point(Id(7.0) * Id(0.0), 0.0));
  CHECK(is_point(bn::sqrt(Id(4.0)), 2.0));
  CHECK(is_point(bn::sqrt(Id(0.0)), 0.0));
  CHECK(is_point(Id(0x1p52) + Id(1.0), 0x1p52 + 1.0));
  CHECK_FALSE(is_point(Id(3.0) * Id(3.0 / 7.0), 3.0 * (3.0 / 7.0)));
  // The one assumption of the policy: round-to-nearest. It is checked, not presumed.
  CHECK_NOTHROW(require_round_to_nearest());
  REQUIRE(std::fesetround(FE_UPWARD) == 0);
  bool threw = false;
  try {
    require_round_to_nearest();
  } catch (const std::logic_error&) {
    threw = true;
  }
  std::fesetround(FE_TONEAREST);
  CHECK(threw);
}

TEST_CASE("trap 10: the midrad self-test passes, and its criterion rejects a radius-free product") {
  CHECK_NOTHROW(midrad_self_test());
  MatD A(2, 2);
  A << 1.0, 0x1p-53, 0.0, 0x1p-53;
  const MidRad At{A.transpose(), MatD::Zero(2, 2)};
  MidRad C = product(A, At);
  CHECK(self_test_criterion(C));
  CHECK(C.mid(0, 0) == 1.0);  // round-to-nearest lost the 2^-106
  MidRad broken = C;
  broken.rad.setZero();  // a kernel that drops the γ_k|A||B| term
  CHECK_FALSE(self_test_criterion(broken));
}

TEST_CASE("decimal output read back contains the interval; hex output is exact") {
  std::mt19937_64 rng(20240611);
  std::uniform_int_distribution<std::uint64_t> bits;
  int checked = 0;
  for (int it = 0; it < 3000; ++it) {
    double a = std::bit_cast<double>(bits(rng)), b = std::bit_cast<double>(bits(rng));
    if (!std::isfinite(a) || !std::isfinite(b)) continue;
    if (it % 3 == 0) b = next_up(a);
    if (a > b) std::swap(a, b);
    const Id x(a, b);
    for (int digits : {17, 10, 3, 1}) {
      const std::string sl = decimal_lower(x, digits), su = decimal_upper(x, digits);
      CAPTURE(hex_exact(a));
      CAPTURE(hex_exact(b));
      CAPTURE(sl);
      CAPTURE(su);
      if (std::fabs(a) > 1e308 || std::fabs(b) > 1e308) continue;  // outward decimal may leave the double range
      CHECK(cmp_double_decimal(a, sl) >= 0);                       // the string itself is outward
      CHECK(cmp_double_decimal(b, su) <= 0);
      const Id lo = from_decimal<Id>(sl), hi = from_decimal<Id>(su);
      CHECK(lo.lower() <= a);
      CHECK(hi.upper() >= b);
      if (digits == 17) {  // 17 digits resolve doubles: at most one ulp lost
        CHECK(lo.lower() >= next_down(a));
        CHECK(hi.upper() <= next_up(b));
      }
      ++checked;
    }
    CHECK(from_decimal<Id>(hex_exact(a)).lower() == a);
    CHECK(from_decimal<Id>(hex_exact(a)).upper() == a);
  }
  CHECK(checked > 5000);
  // MPFR intervals at 128 bits, 40 digits.
  PrecisionScope ps(128);
  gmp_randstate_t st;
  gmp_randinit_default(st);
  gmp_randseed_ui(st, 99);
  for (int it = 0; it < 300; ++it) {
    Mpfr lo, hi;
    mpfr_urandomb(lo.get(), st);
    mpfr_mul_2si(lo.get(), lo.get(), static_cast<long>(it) - 150, MPFR_RNDN);
    if (it % 2) mpfr_neg(lo.get(), lo.get(), MPFR_RNDN);
    mpfr_set(hi.get(), lo.get(), MPFR_RNDN);
    mpfr_nextabove(hi.get());
    const Im x(lo, hi);
    const Im rl = from_decimal<Im>(decimal_lower(x)), ru = from_decimal<Im>(decimal_upper(x));
    CHECK(mpfr_lessequal_p(rl.lower().get(), lo.get()));
    CHECK(mpfr_greaterequal_p(ru.upper().get(), hi.get()));
    const Im back = from_decimal<Im>(hex_exact(lo));
    CHECK(mpfr_equal_p(back.lower().get(), lo.get()));
  }
  gmp_randclear(st);
}

TEST_CASE("conversions: to_id and from_id are outward at every working precision") {
  const Id tenth = from_decimal<Id>("0.1");
  for (mpfr_prec_t p : {24, 53, 128}) {
    PrecisionScope ps(p);
    const Im m = from_id<Im>(tenth);
    CAPTURE(p);
    CHECK(mpfr_cmp_d(m.lower().get(), tenth.lower()) <= 0);
    CHECK(mpfr_cmp_d(m.upper().get(), tenth.upper()) >= 0);
    const Im d = from_decimal<Im>("0.1");
    const Id back = to_id(d);
    CHECK(contains_ratio(back, 1, 10));
  }
}
