// Randomized containment of the interval operations (docs/enclosures.md §1, §2, §7): exact points drawn from random
// inputs, reference by MPFR rounded down and up at >= 128 bits more than the type under test. [RD(v), RU(v)] ⊂ [lo, hi]
// holds iff the exact v lies in [lo, hi] (the bounds lie on the finer grid), so the check is exact. Iterations scale
// with PORECERT_TEST_SCALE (default 1).
#include <doctest/doctest.h>
#include <gmp.h>
#include <mpfr.h>

#include <algorithm>
#include <cfloat>
#include <cmath>
#include <cstdlib>
#include <functional>
#include <limits>
#include <random>
#include <string>

#include "arith/interval.hpp"

using namespace porecert::arith;
namespace bn = boost::numeric;

namespace {
constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kDmin = std::numeric_limits<double>::denorm_min();
constexpr mpfr_prec_t kRefPrecD = 256;  // reference for Id: 53 + 203 bits

long scaled(long n) {
  const char* s = std::getenv("PORECERT_TEST_SCALE");
  const double f = s ? std::atof(s) : 1.0;
  return std::max(1L, static_cast<long>(static_cast<double>(n) * (f > 0 ? f : 1.0)));
}

// Counts failures; prints the first few (with hex inputs) and asserts none at the end.
struct Failures {
  long count = 0, checks = 0;
  void add(bool ok, const std::function<std::string()>& what) {
    ++checks;
    if (ok) return;
    if (++count <= 8) FAIL_CHECK(what());
  }
};

std::string hx(const Id& x) { return "[" + hex_exact(x.lower()) + ", " + hex_exact(x.upper()) + "]"; }
std::string hx(const Im& x) { return "[" + hex_exact(x.lower()) + ", " + hex_exact(x.upper()) + "]"; }
std::string hexm(mpfr_srcptr m) {
  char* buf = nullptr;
  mpfr_asprintf(&buf, "%Ra", m);
  std::string out(buf);
  mpfr_free_str(buf);
  return out;
}

// Doubles of assorted magnitudes: normal over the whole range, near 1, subnormal, around DBL_MIN, huge, special.
double rand_double(std::mt19937_64& g) {
  std::uniform_int_distribution<int> kind(0, 7);
  std::uniform_real_distribution<double> m(1.0, 2.0);
  const double sign = (g() & 1) ? -1.0 : 1.0;
  switch (kind(g)) {
    case 0:
      return sign * std::ldexp(m(g), std::uniform_int_distribution<int>(-1074, 1023)(g));
    case 1:
    case 2:
      return sign * std::ldexp(m(g), std::uniform_int_distribution<int>(-30, 30)(g));
    case 3:
      return sign * std::bit_cast<double>(g() & 0x000FFFFFFFFFFFFFull);  // subnormal (or 0)
    case 4:
      return sign * std::ldexp(m(g), std::uniform_int_distribution<int>(-1030, -1015)(g));
    case 5:
      return sign * std::ldexp(m(g), std::uniform_int_distribution<int>(1000, 1023)(g));
    case 6: {
      static const double sp[] = {0.0,       1.0,     2.0,     3.0,    0.5,    1 + 0x1p-52, 1 - 0x1p-53, 0x1p-53, kDmin,
                                  2 * kDmin, DBL_MIN, DBL_MAX, 0x1p52, 0x1p53, 0x1p53 + 2,  10.0,        0.1};
      return sign * sp[std::uniform_int_distribution<std::size_t>(0, std::size(sp) - 1)(g)];
    }
    default: {  // random integer-valued or short-mantissa: exercises exact (TwoSum / power-of-two) paths
      const double v = static_cast<double>(std::uniform_int_distribution<int>(1, 1 << 20)(g));
      return sign * std::ldexp(v, std::uniform_int_distribution<int>(-60, 60)(g));
    }
  }
}

Id rand_interval(std::mt19937_64& g) {
  double a = rand_double(g);
  double b = a;
  switch (std::uniform_int_distribution<int>(0, 5)(g)) {
    case 0:
    case 1:
      break;  // point
    case 2:
      for (int k = std::uniform_int_distribution<int>(1, 4)(g); k > 0; --k) b = next_up(b);
      break;
    case 3:
      b = rounded_nearest_outward::add_up(a, std::ldexp(std::fabs(a), -std::uniform_int_distribution<int>(1, 50)(g)));
      break;
    case 4:
      b = rand_double(g);
      break;
    default:
      a = -std::fabs(a);
      b = std::fabs(rand_double(g));
      break;  // straddles 0
  }
  if (a > b) std::swap(a, b);
  if (b == kInf) b = DBL_MAX;
  return Id(a, b);
}

// An exact double in x: an end point, or uniform in the bit patterns (so all magnitudes inside occur).
double point_in(const Id& x, std::mt19937_64& g) {
  const double lo = x.lower(), hi = x.upper();
  switch (std::uniform_int_distribution<int>(0, 3)(g)) {
    case 0:
      return lo;
    case 1:
      return hi;
    default:
      break;
  }
  auto key = [](double d) {  // monotone map double -> signed integer
    const auto b = std::bit_cast<std::int64_t>(d);
    return b < 0 ? -(b & 0x7FFFFFFFFFFFFFFFll) : b;
  };
  const std::int64_t kl = key(lo), kh = key(hi);
  const std::int64_t k = std::uniform_int_distribution<std::int64_t>(kl, kh)(g);
  const double d = k < 0 ? -std::bit_cast<double>(-k) : std::bit_cast<double>(k);
  return std::clamp(d, lo, hi);
}

// Reference pair [RD(v), RU(v)].
struct Ref {
  mpfr_t lo, hi, a, b;
  explicit Ref(mpfr_prec_t p) { mpfr_inits2(p, lo, hi, a, b, static_cast<mpfr_ptr>(nullptr)); }
  ~Ref() { mpfr_clears(lo, hi, a, b, static_cast<mpfr_ptr>(nullptr)); }
  Ref(const Ref&) = delete;
  Ref& operator=(const Ref&) = delete;
};
enum Op { op_add, op_sub, op_mul, op_div, op_sqrt, op_exp, op_log, op_cos };
const char* op_name(Op o) {
  static const char* n[] = {"+", "-", "*", "/", "sqrt", "exp", "log", "cos"};
  return n[o];
}
void ref_eval(Op o, Ref& r) {  // inputs in r.a, r.b
  for (int side = 0; side < 2; ++side) {
    mpfr_ptr out = side ? r.hi : r.lo;
    const mpfr_rnd_t rnd = side ? MPFR_RNDU : MPFR_RNDD;
    switch (o) {
      case op_add:
        mpfr_add(out, r.a, r.b, rnd);
        break;
      case op_sub:
        mpfr_sub(out, r.a, r.b, rnd);
        break;
      case op_mul:
        mpfr_mul(out, r.a, r.b, rnd);
        break;
      case op_div:
        mpfr_div(out, r.a, r.b, rnd);
        break;
      case op_sqrt:
        mpfr_sqrt(out, r.a, rnd);
        break;
      case op_exp:
        mpfr_exp(out, r.a, rnd);
        break;
      case op_log:
        mpfr_log(out, r.a, rnd);
        break;
      case op_cos:
        mpfr_cos(out, r.a, rnd);
        break;
    }
  }
}
bool inside(const Ref& r, const Id& x) { return mpfr_cmp_d(r.lo, x.lower()) >= 0 && mpfr_cmp_d(r.hi, x.upper()) <= 0; }
bool inside(const Ref& r, const Im& x) {
  return mpfr_lessequal_p(x.lower().get(), r.lo) && mpfr_lessequal_p(r.hi, x.upper().get());
}

Id apply(Op o, const Id& x, const Id& y) {
  switch (o) {
    case op_add:
      return x + y;
    case op_sub:
      return x - y;
    case op_mul:
      return x * y;
    case op_div:
      return x / y;
    case op_sqrt:
      return bn::sqrt(x);
    case op_exp:
      return bn::exp(x);
    case op_log:
      return bn::log(x);
    default:
      return bn::cos(x);
  }
}
Im apply(Op o, const Im& x, const Im& y) {
  switch (o) {
    case op_add:
      return x + y;
    case op_sub:
      return x - y;
    case op_mul:
      return x * y;
    case op_div:
      return x / y;
    case op_sqrt:
      return bn::sqrt(x);
    case op_exp:
      return bn::exp(x);
    case op_log:
      return bn::log(x);
    default:
      return bn::cos(x);
  }
}

// Upper bound of max |op| over the corners of the inputs (ops monotone in each argument on the boxes used).
double corner_mag(Op o, const Id& x, const Id& y) {
  Ref r(kRefPrecD);
  double m = 0;
  for (double a : {x.lower(), x.upper()})
    for (double b : {y.lower(), y.upper()}) {
      mpfr_set_d(r.a, a, MPFR_RNDN);
      mpfr_set_d(r.b, b, MPFR_RNDN);
      if (o == op_sqrt && a < 0) mpfr_set_zero(r.a, 1);
      ref_eval(o, r);
      m = std::max({m, std::fabs(mpfr_get_d(r.lo, MPFR_RNDA)), std::fabs(mpfr_get_d(r.hi, MPFR_RNDA))});
    }
  return m;
}

// Checks one operation on doubles: containment of exact points, no NaN, finite when the range is, and for point inputs
// at most one ulp outward on each side of the nearest result.
void check_id(Op o, const Id& x, const Id& y, std::mt19937_64& g, Failures& f, int npoints = 4) {
  const auto desc = [&](const std::string& what) {
    return [&, what] { return std::string("Id ") + op_name(o) + " " + what + ": x = " + hx(x) + ", y = " + hx(y); };
  };
  Id r(0.0);
  try {
    r = apply(o, x, y);
  } catch (const std::exception& e) {
    f.add(false, [&, msg = std::string(e.what())] { return desc("threw " + msg)(); });
    return;
  }
  f.add(!std::isnan(r.lower()) && !std::isnan(r.upper()), desc("NaN bound"));
  const bool unary = o == op_sqrt || o == op_exp || o == op_log || o == op_cos;
  const Id yy = unary ? Id(0.0) : y;
  const bool finite_range = o == op_cos || o == op_exp ? true : corner_mag(o, x, yy) <= 0x1p1020;
  if (o == op_exp) {
    if (x.upper() < 709.0) f.add(std::isfinite(r.upper()) && std::isfinite(r.lower()), desc("infinite bound"));
  } else if (o == op_log) {
    if (x.lower() > 0) f.add(std::isfinite(r.upper()) && std::isfinite(r.lower()), desc("infinite bound"));
  } else if (finite_range) {
    f.add(std::isfinite(r.lower()) && std::isfinite(r.upper()), desc("infinite bound"));
  }
  Ref ref(kRefPrecD);
  for (int k = 0; k < npoints; ++k) {
    const double a = point_in(x, g), b = point_in(yy, g);
    if (o == op_sqrt && a < 0) continue;  // sqrt is taken on the nonnegative part of x
    if (o == op_log && a <= 0) continue;
    mpfr_set_d(ref.a, a, MPFR_RNDN);
    mpfr_set_d(ref.b, b, MPFR_RNDN);
    ref_eval(o, ref);
    f.add(inside(ref, r), [&, a, b] {
      return desc("misses the exact value")() + ", at a = " + hex_exact(a) + ", b = " + hex_exact(b) + " -> " + hx(r);
    });
  }
  const bool points = bn::singleton(x) && (unary || bn::singleton(y));
  if (points && std::isfinite(r.lower()) && std::isfinite(r.upper()) && o != op_cos) {
    const double allowed = (o == op_exp || o == op_log) ? next_up(r.lower()) : next_up(next_up(r.lower()));
    f.add(r.upper() <= allowed, desc("wider than the policy allows"));
  }
}

// Random MPFR number with p random bits, exponent in [-e, e] (some far beyond the double range).
Mpfr rand_mpfr(std::mt19937_64& g, gmp_randstate_t st, long e) {
  Mpfr v;
  mpfr_urandomb(v.get(), st);
  if (mpfr_zero_p(v.get())) mpfr_set_ui(v.get(), 1, MPFR_RNDN);
  mpfr_mul_2si(v.get(), v.get(), std::uniform_int_distribution<long>(-e, e)(g), MPFR_RNDN);
  if (g() & 1) mpfr_neg(v.get(), v.get(), MPFR_RNDN);
  return v;
}
Im rand_im(std::mt19937_64& g, gmp_randstate_t st) {
  const long e = (g() % 8 == 0) ? 100000 : 1100;
  Mpfr a = rand_mpfr(g, st, e), b = a;
  switch (std::uniform_int_distribution<int>(0, 5)(g)) {
    case 0:
    case 1:
      break;
    case 2:
      for (int k = std::uniform_int_distribution<int>(1, 4)(g); k > 0; --k) mpfr_nextabove(b.get());
      break;
    case 3: {
      Mpfr w;
      mpfr_mul_2si(w.get(), a.get(), -std::uniform_int_distribution<long>(1, 200)(g), MPFR_RNDN);
      mpfr_abs(w.get(), w.get(), MPFR_RNDN);
      mpfr_add(b.get(), a.get(), w.get(), MPFR_RNDU);
      break;
    }
    case 4:
      b = rand_mpfr(g, st, e);
      break;
    default:
      mpfr_abs(a.get(), a.get(), MPFR_RNDN);
      mpfr_neg(a.get(), a.get(), MPFR_RNDN);
      b = rand_mpfr(g, st, e);
      mpfr_abs(b.get(), b.get(), MPFR_RNDN);
  }
  if (b < a) std::swap(a, b);
  return Im(a, b);
}
// Exact point of x at precision P: an end point or lo + t (hi − lo), kept inside.
void point_in(const Im& x, mpfr_ptr out, std::mt19937_64& g) {
  switch (std::uniform_int_distribution<int>(0, 3)(g)) {
    case 0:
      mpfr_set(out, x.lower().get(), MPFR_RNDN);
      return;
    case 1:
      mpfr_set(out, x.upper().get(), MPFR_RNDN);
      return;
    default:
      break;
  }
  mpfr_t w;
  mpfr_init2(w, mpfr_get_prec(out));
  mpfr_sub(w, x.upper().get(), x.lower().get(), MPFR_RNDN);
  mpfr_mul_d(w, w, std::uniform_real_distribution<double>(0, 1)(g), MPFR_RNDN);
  mpfr_add(out, x.lower().get(), w, MPFR_RNDN);
  mpfr_clear(w);
  if (mpfr_less_p(out, x.lower().get())) mpfr_set(out, x.lower().get(), MPFR_RNDN);
  if (mpfr_greater_p(out, x.upper().get())) mpfr_set(out, x.upper().get(), MPFR_RNDN);
}

void check_im(Op o, const Im& x, const Im& y, mpfr_prec_t p, std::mt19937_64& g, Failures& f) {
  const auto desc = [&](const std::string& what) {
    return [&, what] {
      return std::string("Im(p=") + std::to_string(p) + ") " + op_name(o) + " " + what + ": x = " + hx(x) +
             ", y = " + hx(y);
    };
  };
  Im r(0);
  try {
    r = apply(o, x, y);
  } catch (const std::exception& e) {
    f.add(false, [&, msg = std::string(e.what())] { return desc("threw " + msg)(); });
    return;
  }
  f.add(!isnan(r.lower()) && !isnan(r.upper()), desc("NaN bound"));
  const bool unary = o == op_sqrt || o == op_exp || o == op_log || o == op_cos;
  if (o != op_exp && !(o == op_log && !(x.lower() > Mpfr(0))))
    f.add(mpfr_number_p(r.lower().get()) && mpfr_number_p(r.upper().get()), desc("infinite bound"));
  Ref ref(p + 128);
  for (int k = 0; k < 4; ++k) {
    point_in(x, ref.a, g);
    if (!unary) point_in(y, ref.b, g);
    if ((o == op_sqrt && mpfr_sgn(ref.a) < 0) || (o == op_log && mpfr_sgn(ref.a) <= 0)) continue;
    ref_eval(o, ref);
    f.add(inside(ref, r), [&, a = hexm(ref.a), b = hexm(ref.b)] {
      return desc("misses the exact value")() + " at a = " + a + ", b = " + b + " -> " + hx(r);
    });
  }
  // Point inputs: each bound is the directed rounding, so the result is at most one ulp (at p) wide.
  if (bn::singleton(x) && (unary || bn::singleton(y)) && o != op_cos && mpfr_number_p(r.lower().get())) {
    mpfr_t nx;
    mpfr_init2(nx, p);
    mpfr_set(nx, r.lower().get(), MPFR_RNDN);
    mpfr_nextabove(nx);
    f.add(mpfr_lessequal_p(r.upper().get(), nx), desc("wider than one ulp"));
    mpfr_clear(nx);
  }
}
}  // namespace

TEST_CASE("Id: + − × ÷ sqrt contain the exact result for random inputs of every magnitude") {
  std::mt19937_64 g(0x5eed0001);
  Failures f;
  const long n = scaled(40000);
  for (Op o : {op_add, op_sub, op_mul, op_div, op_sqrt}) {
    for (long it = 0; it < n; ++it) {
      const Id x = rand_interval(g);
      Id y = rand_interval(g);
      while (o == op_div && y.lower() <= 0 && y.upper() >= 0) y = rand_interval(g);  // divisor without 0
      if (o == op_sqrt && x.upper() < 0) {
        check_id(o, -x, y, g, f);
        continue;
      }
      check_id(o, x, y, g, f);
    }
  }
  CHECK(f.count == 0);
  CHECK(f.checks > 5 * n * 4);
}

TEST_CASE("Id: exp, log, cos contain the exact result (MPFR bounds) and stay tight") {
  std::mt19937_64 g(0x5eed0002);
  Failures f;
  const long n = scaled(6000);  // MPFR transcendentals cost ~10 µs each
  std::uniform_real_distribution<double> u(0, 1);
  const auto widen = [&](double a) {
    double b = a;
    const int k = std::uniform_int_distribution<int>(0, 3)(g);
    if (k == 1) b = next_up(a);
    if (k == 2) b = std::min(a + std::fabs(a) * 1e-9 + 1e-300, DBL_MAX);
    return Id(std::min(a, b), std::min(std::max(a, b), DBL_MAX));
  };
  for (long it = 0; it < n; ++it) {
    // exp: ordinary range, tiny and subnormal arguments, both overflow and underflow edges.
    double e;
    switch (it % 4) {
      case 0:
        e = -750 + 1470 * u(g);
        break;
      case 1:
        e = std::ldexp(u(g) - 0.5, -std::uniform_int_distribution<int>(0, 1074)(g));
        break;  // tiny, subnormal
      case 2:
        e = 709.78 + (u(g) - 0.5) * 0.01;
        break;
      default:
        e = -745.13 + (u(g) - 0.5) * 0.1;
        break;
    }
    check_id(op_exp, widen(e), Id(0.0), g, f, 3);
    // log: any positive double, subnormal included.
    double l = std::fabs(rand_double(g));
    if (l == 0) l = kDmin;
    check_id(op_log, widen(l), Id(0.0), g, f, 3);
    // cos: small, medium, large arguments, and doubles next to multiples of π/2.
    double c;
    switch (it % 5) {
      case 0:
        c = (u(g) - 0.5) * 8;
        break;
      case 1:
        c = (u(g) - 0.5) * 2e6;
        break;
      case 2: {  // large: 2^20..2^24, and beyond 2^56 where Boost returns [-1, 1] (between: known bug below)
        const int e = std::uniform_int_distribution<int>(20, 968)(g);
        c = std::ldexp(u(g) + 1, e <= 24 ? e : e + 32);
        break;
      }
      case 3: {
        c = std::uniform_int_distribution<int>(-100000, 100000)(g) * 1.5707963267948966;
        for (int k = std::uniform_int_distribution<int>(-3, 3)(g); k != 0; k += k > 0 ? -1 : 1)
          c = k > 0 ? next_up(c) : next_down(c);
        break;
      }
      default:
        c = std::ldexp(u(g), -std::uniform_int_distribution<int>(0, 1070)(g));
        break;
    }
    const Id cx = widen(c);
    check_id(op_cos, cx, Id(0.0), g, f, 3);
    const Id cr = bn::cos(cx);
    // Not the trivial answer: tight near 0, narrow up to |x| = 1e6 (the reduction by 2π costs ~|x| ulps).
    if (bn::singleton(cx) && c >= 0 && c <= 3.0)  // no reduction needed there
      f.add(cr.upper() <= next_up(cr.lower()), [&] { return "cos not tight at " + hex_exact(c) + " -> " + hx(cr); });
    if (bn::singleton(cx) && std::fabs(c) <= 1e6)
      f.add(bn::width(cr) <= 1e-6, [&] { return "cos too wide at " + hex_exact(c) + " -> " + hx(cr); });
  }
  CHECK(f.count == 0);
  CHECK(f.checks > 3 * n * 3);
}

TEST_CASE("Im: + − × ÷ sqrt contain the exact result at several working precisions (reference p + 128)") {
  std::mt19937_64 g(0x5eed0003);
  gmp_randstate_t st;
  gmp_randinit_default(st);
  gmp_randseed_ui(st, 0x5eed0003);
  Failures f;
  const long n = scaled(1500);
  for (mpfr_prec_t p : {53, 64, 113, 128, 300}) {
    PrecisionScope ps(p);
    for (Op o : {op_add, op_sub, op_mul, op_div, op_sqrt}) {
      for (long it = 0; it < n; ++it) {
        Im x = rand_im(g, st), y = rand_im(g, st);
        while (o == op_div && !(y.lower() > Mpfr(0)) && !(y.upper() < Mpfr(0))) y = rand_im(g, st);
        if (o == op_sqrt && x.upper() < Mpfr(0)) x = -x;
        check_im(o, x, y, p, g, f);
      }
    }
  }
  gmp_randclear(st);
  CHECK(f.count == 0);
  CHECK(f.checks > 5 * 5 * n * 4);
}

TEST_CASE("Im: exp, log, cos contain the exact result") {
  std::mt19937_64 g(0x5eed0004);
  Failures f;
  const long n = scaled(2000);
  std::uniform_real_distribution<double> u(0, 1);
  PrecisionScope ps(128);
  for (long it = 0; it < n; ++it) {
    const double e = (u(g) - 0.5) * 2000, l = std::fabs(rand_double(g)) + kDmin, c = (u(g) - 0.5) * 1e4;
    check_im(op_exp, Im(e), Im(0), 128, g, f);
    check_im(op_log, Im(l), Im(0), 128, g, f);
    check_im(op_cos, Im(c), Im(0), 128, g, f);
    check_im(op_cos, Im(c) + Im(Mpfr(0), Mpfr(u(g))), Im(0), 128, g, f);
  }
  CHECK(f.count == 0);
}

TEST_CASE("regressions: TwoSum ties, signed zeros, subnormal products and square roots, overflow edges") {
  std::mt19937_64 g(7);
  Failures f;
  struct Case {
    Op o;
    double a, b;
  };
  const Case cases[] = {
      {op_add, 1.0, 0x1p-53},      // tie: fl = 1, error +2^-53 (TwoSum must see it)
      {op_add, 1.0, -0x1p-54},     // fl = 1, error negative
      {op_add, 0x1p53, 1.0},       // tie to even at 2^53
      {op_sub, 1.0, 1 - 0x1p-53},  // Sterbenz: exact
      {op_add, -0.0, 0.0},
      {op_mul, -0.0, 5.0},
      {op_mul, 0.0, -3.0},
      {op_div, -0.0, 2.0},
      {op_sqrt, -0.0, 0.0},
      {op_mul, kDmin, kDmin},  // underflows to 0
      {op_mul, kDmin, 0.5},    // 2^-1075 rounds to 0 by ties-to-even
      {op_mul, kDmin, 3.0},    // exact subnormal, not proven exact by the policy
      {op_div, kDmin, 2.0},
      {op_mul, DBL_MIN, 0.5},  // power of two, but the result is subnormal
      {op_div, DBL_MIN, 3.0},
      {op_mul, 0x1p-537, 0x1p-537},  // exact 2^-1074
      {op_sqrt, 0x3p-1074, 0.0},     // r*r − x underflowed in the fma exactness test (fixed)
      {op_sqrt, 0x5p-1074, 0.0},
      {op_sqrt, 0x1.23456789p-1030, 0.0},
      {op_sqrt, kDmin, 0.0},
      {op_sqrt, 0x1.8p-1022, 0.0},
      {op_sqrt, 0x1.0000000000001p-970, 0.0},
      {op_sqrt, 0x1.fffffffffffffp-971, 0.0},
      {op_add, DBL_MAX, DBL_MAX},  // overflow: [max, inf]
      {op_sub, -DBL_MAX, DBL_MAX},
      {op_mul, DBL_MAX, 2.0},
      {op_mul, DBL_MAX, -1.5},
      {op_add, DBL_MAX, -DBL_MAX / 2},
      {op_add, 0x1p970, -DBL_MAX},                  // TwoSum with ties at the top of the range
      {op_add, -0x1.f68b2af800ffep+1021, DBL_MAX},  // TwoSum's s − a overflowed to inf, e = NaN (fixed)
      {op_add, DBL_MAX, -0x1.f68b2af800ffep+1021},
      {op_sub, -DBL_MAX, -0x1.f68b2af800ffep+1021},
      {op_div, 1.0, DBL_MAX},  // subnormal quotient
      {op_div, DBL_MAX, 0.5},
      {op_div, 3.0, 0x1p-1074},
      {op_mul, DBL_MIN, 1 - 0x1p-53},  // exact product just below DBL_MIN rounds up to it: not exact (fixed)
      {op_mul, -(1 - 0x1p-53), -DBL_MIN},
      {op_div, 0x1.fffffffffffffp-1022, 2.0},  // the same for a quotient by a power of two (fixed)
      {op_div, -0x1.fffffffffffffp-1022, 2.0},
  };
  for (const Case& c : cases) check_id(c.o, Id(c.a), Id(c.b), g, f, 1);
  CHECK(f.count == 0);
  // The sqrt regression, pinned on its bounds: the result was the point fl(√3)·2^-537, below √(3·2^-1074).
  const Id s = bn::sqrt(Id(0x3p-1074));
  CHECK(s.lower() < s.upper());
  // Overflow gives an infinite bound on the right side only.
  const Id big = Id(DBL_MAX) + Id(DBL_MAX);
  CHECK(big.lower() == DBL_MAX);
  CHECK(big.upper() == kInf);
  // One-ulp steps at the edges.
  CHECK(std::signbit(next_up(-kDmin)));
  CHECK(next_up(-kDmin) == 0.0);
  CHECK(next_up(-0.0) == kDmin);
  CHECK(next_down(0.0) == -kDmin);
  CHECK(next_up(DBL_MAX) == kInf);
  CHECK(next_down(-DBL_MAX) == -kInf);
  CHECK(next_up(kInf) == kInf);
  CHECK(std::isnan(next_up(std::numeric_limits<double>::quiet_NaN())));
  // TwoSum is exact for every finite sum (checked exactly), also where s − a once overflowed.
  std::mt19937_64 h(11);
  long bad = 0;
  mpfr_t t;
  mpfr_init2(t, 2200);
  for (int it = 0; it < 20000; ++it) {
    double a = rand_double(h), b = rand_double(h);
    if (it < 4) {
      a = (it % 2 ? 1 : -1) * 0x1.f68b2af800ffep+1021;
      b = (it % 2 ? -1 : 1) * DBL_MAX;
      if (it >= 2) std::swap(a, b);
    }
    const double s2 = a + b;
    if (!std::isfinite(s2)) continue;
    const double e = two_sum_error(a, b, s2);
    mpfr_set_d(t, a, MPFR_RNDN);
    mpfr_add_d(t, t, b, MPFR_RNDN);
    mpfr_sub_d(t, t, s2, MPFR_RNDN);
    mpfr_sub_d(t, t, e, MPFR_RNDN);
    if (!mpfr_zero_p(t)) ++bad;
  }
  mpfr_clear(t);
  CHECK(bad == 0);
}

// Known bug in Boost.Interval's cos (transc.hpp): the reduction x − n·2π rounds n·2π up by an ulp of x, so for 2^25 ≲
// |x| ≲ 2^56 the reduced lower bound can be negative while the code assumes it is >= 0, and the upper bound cos(l) < 1
// misses values near a maximum. The project does not use cos there (only cos_of on [0, π]); should_fail keeps the suite
// green and flags the day it gets fixed.
TEST_CASE("known bug: Boost cos reduction for huge arguments misses the exact value" * doctest::should_fail()) {
  const double x = 0x1.05e5e58cb21ecp+49;
  const Id r = bn::cos(Id(x));
  Ref ref(kRefPrecD);
  mpfr_set_d(ref.a, x, MPFR_RNDN);
  ref_eval(op_cos, ref);
  CAPTURE(hx(r));
  CHECK(inside(ref, r));
}
