// Containment of the Chebyshev-series operations (docs/enclosures.md §3) for Id and Im (128 bits). Reference: exact
// rational arithmetic (GMP mpq) on exact coefficients drawn from the interval inputs, stronger than any finite MPFR
// precision; the reference itself is cross-checked by identities (product of evaluations, F' = f, F(0) = value0)
// computed by independent formulas.
#include <doctest/doctest.h>
#include <gmp.h>
#include <mpfr.h>

#include <algorithm>
#include <cstdlib>
#include <functional>
#include <random>
#include <string>
#include <vector>

#include "arith/cheb.hpp"

using namespace porecert;
using arith::Id;
using arith::Im;
using arith::Mpfr;
namespace bn = boost::numeric;

namespace {
long scaled(long n) {
  const char* s = std::getenv("PORECERT_TEST_SCALE");
  const double f = s ? std::atof(s) : 1.0;
  return std::max(1L, static_cast<long>(static_cast<double>(n) * (f > 0 ? f : 1.0)));
}

// Exact rational.
class Q {
 public:
  Q() { mpq_init(v_); }
  Q(long p, long q = 1) {
    mpq_init(v_);
    mpq_set_si(v_, p, static_cast<unsigned long>(q));
    mpq_canonicalize(v_);
  }
  static Q of(double d) {
    Q r;
    mpq_set_d(r.v_, d);  // exact for finite d
    return r;
  }
  static Q of(const Mpfr& m) {
    Q r;
    mpfr_get_q(r.v_, m.get());
    return r;
  }
  Q(const Q& o) {
    mpq_init(v_);
    mpq_set(v_, o.v_);
  }
  Q& operator=(const Q& o) {
    mpq_set(v_, o.v_);
    return *this;
  }
  ~Q() { mpq_clear(v_); }
  friend Q operator+(const Q& a, const Q& b) {
    Q r;
    mpq_add(r.v_, a.v_, b.v_);
    return r;
  }
  friend Q operator-(const Q& a, const Q& b) {
    Q r;
    mpq_sub(r.v_, a.v_, b.v_);
    return r;
  }
  friend Q operator*(const Q& a, const Q& b) {
    Q r;
    mpq_mul(r.v_, a.v_, b.v_);
    return r;
  }
  friend Q operator/(const Q& a, const Q& b) {
    Q r;
    mpq_div(r.v_, a.v_, b.v_);
    return r;
  }
  friend bool operator<=(const Q& a, const Q& b) { return mpq_cmp(a.v_, b.v_) <= 0; }
  friend bool operator==(const Q& a, const Q& b) { return mpq_equal(a.v_, b.v_) != 0; }
  Q abs() const {
    Q r;
    mpq_abs(r.v_, v_);
    return r;
  }
  std::string str() const { return std::to_string(mpq_get_d(v_)); }

 private:
  mpq_t v_;
};
using QS = std::vector<Q>;

// ---- reference formulas, written independently of cheb.hpp -----------------------------------
Q eval_q(const QS& c, const Q& eta) {  // Σ c_k T_k(2η − 1), T by its three-term recurrence
  const Q x = Q(2) * eta - Q(1);
  Q s(0), t0(1), t1 = x;
  for (std::size_t k = 0; k < c.size(); ++k) {
    if (k == 0) {
      s = s + c[0] * t0;
    } else {
      s = s + c[k] * t1;
      const Q t2 = Q(2) * x * t1 - t0;
      t0 = t1;
      t1 = t2;
    }
  }
  return s;
}
Q deriv_eval_q(const QS& c, const Q& eta) {  // d/dη = 2 d/dx, T_k' = k U_{k−1}
  const Q x = Q(2) * eta - Q(1);
  Q s(0), u0(1), u1 = Q(2) * x;  // U_0, U_1
  for (std::size_t k = 1; k < c.size(); ++k) {
    s = s + c[k] * Q(static_cast<long>(k)) * u0;
    const Q u2 = Q(2) * x * u1 - u0;
    u0 = u1;
    u1 = u2;
  }
  return Q(2) * s;
}
QS product_q(const QS& a, const QS& b) {
  if (a.empty() || b.empty()) return {};
  QS p(a.size() + b.size() - 1, Q(0));
  for (std::size_t i = 0; i < a.size(); ++i)
    for (std::size_t j = 0; j < b.size(); ++j) {
      const Q h = a[i] * b[j] / Q(2);
      p[i + j] = p[i + j] + h;
      p[i > j ? i - j : j - i] = p[i > j ? i - j : j - i] + h;
    }
  return p;
}
QS antideriv_q(const QS& c, const Q& v0) {  // ∫ in x, then dη = dx/2, then fix F(0)
  const std::size_t n = c.size();
  auto at = [&](std::size_t k) { return k < n ? c[k] : Q(0); };
  QS b(n + 1, Q(0));
  if (n >= 1) b[1] = (at(0) - at(2) / Q(2)) / Q(2);
  for (std::size_t k = 2; k <= n; ++k) b[k] = (at(k - 1) - at(k + 1)) / Q(4 * static_cast<long>(k));
  Q at0(0);
  for (std::size_t k = 1; k <= n; ++k) at0 = (k % 2) ? at0 - b[k] : at0 + b[k];
  b[0] = v0 - at0;
  return b;
}

// ---- interval helpers for both implementations ------------------------------------------------
Q lo_q(const Id& x) { return Q::of(x.lower()); }
Q hi_q(const Id& x) { return Q::of(x.upper()); }
Q lo_q(const Im& x) { return Q::of(x.lower()); }
Q hi_q(const Im& x) { return Q::of(x.upper()); }
bool finite(const Id& x) { return std::isfinite(x.lower()) && std::isfinite(x.upper()); }
bool finite(const Im& x) { return mpfr_number_p(x.lower().get()) && mpfr_number_p(x.upper().get()); }
template <class I>
bool contains(const I& x, const Q& q) {
  return finite(x) && lo_q(x) <= q && q <= hi_q(x);
}
std::string hx(const Id& x) { return "[" + arith::hex_exact(x.lower()) + ", " + arith::hex_exact(x.upper()) + "]"; }
std::string hx(const Im& x) { return "[" + arith::hex_exact(x.lower()) + ", " + arith::hex_exact(x.upper()) + "]"; }
template <class I>
std::string hx(const std::vector<I>& c) {
  std::string s = "{";
  for (const I& v : c) s += hx(v) + " ";
  return s + "}";
}

// Random coefficient of magnitude about 2^e: a point, a few ulps wide, or relatively 2^-40 wide.
template <class I>
I rand_coeff(std::mt19937_64& g, gmp_randstate_t st, int e) {
  std::uniform_real_distribution<double> m(-1, 1);
  const int kind = std::uniform_int_distribution<int>(0, 3)(g);
  if constexpr (std::is_same_v<I, Id>) {
    const double a = std::ldexp(m(g), e);
    double b = a;
    if (kind == 1) b = arith::next_up(arith::next_up(a));
    if (kind == 2) b = arith::rounded_nearest_outward::add_up(a, std::ldexp(std::fabs(a), -40));
    return (kind == 3) ? Id(0.0) : Id(a, b);
  } else {
    Mpfr a;
    mpfr_urandomb(a.get(), st);
    mpfr_mul_2si(a.get(), a.get(), e, MPFR_RNDN);
    if (g() & 1) mpfr_neg(a.get(), a.get(), MPFR_RNDN);
    Mpfr b = a;
    if (kind == 1) mpfr_nextabove(b.get());
    if (kind == 2) {
      Mpfr w;
      mpfr_mul_2si(w.get(), a.get(), -100, MPFR_RNDN);
      mpfr_abs(w.get(), w.get(), MPFR_RNDN);
      mpfr_add(b.get(), a.get(), w.get(), MPFR_RNDU);
    }
    return (kind == 3) ? Im(0) : Im(a, b);
  }
}
template <class I>
std::vector<I> rand_series(std::mt19937_64& g, gmp_randstate_t st, std::size_t n) {
  std::vector<I> c;
  const int e0 = std::uniform_int_distribution<int>(-8, 8)(g);
  for (std::size_t k = 0; k < n; ++k) c.push_back(rand_coeff<I>(g, st, e0 - static_cast<int>(k) / 2));
  return c;
}
// Exact value inside x: lower, upper, or the (nearest) midpoint, which lies between them.
template <class I>
Q pick(const I& x, std::mt19937_64& g) {
  switch (g() % 3) {
    case 0:
      return lo_q(x);
    case 1:
      return hi_q(x);
    default:
      if constexpr (std::is_same_v<I, Id>) {
        return Q::of(std::clamp(bn::median(x), x.lower(), x.upper()));
      } else {
        return Q::of(bn::median(x));
      }
  }
}
template <class I>
QS pick_all(const std::vector<I>& c, std::mt19937_64& g) {
  QS q;
  for (const I& v : c) q.push_back(pick(v, g));
  return q;
}
// Evaluation points: ends, middle, random doubles; as exact rationals and as point intervals.
double rand_eta(std::mt19937_64& g) {
  switch (g() % 5) {
    case 0:
      return 0.0;
    case 1:
      return 1.0;
    case 2:
      return 0.5;
    default:
      return std::uniform_real_distribution<double>(0, 1)(g);
  }
}

struct Failures {
  long count = 0, checks = 0;
  void add(bool ok, const std::function<std::string()>& what) {
    ++checks;
    if (!ok && ++count <= 8) FAIL_CHECK(what());
  }
};

template <class I>
void run_all(std::uint64_t seed, long iters, Failures& f) {
  std::mt19937_64 g(seed);
  gmp_randstate_t st;
  gmp_randinit_default(st);
  gmp_randseed_ui(st, static_cast<unsigned long>(seed));
  const std::string tag = std::is_same_v<I, Id> ? "Id" : "Im";
  for (long it = 0; it < iters; ++it) {
    const std::size_t n = std::uniform_int_distribution<std::size_t>(1, 24)(g);
    const auto a = rand_series<I>(g, st, n);
    const auto b = rand_series<I>(g, st, std::uniform_int_distribution<std::size_t>(1, 24)(g));
    const QS aq = pick_all(a, g), bq = pick_all(b, g);
    const double eta = rand_eta(g);
    const Q eq = Q::of(eta);
    const I ei(eta);
    const auto ctx = [&](const std::string& what) {
      return [&, what] { return tag + " " + what + ": a = " + hx(a) + ", eta = " + arith::hex_exact(eta); };
    };

    // eval at a point and over a small interval of η.
    f.add(contains(cheb::eval(a, ei), eval_q(aq, eq)), ctx("eval"));
    const double e2 = std::min(1.0, eta + 0x1p-20);
    const I box(eta, e2);
    const Q inner = Q::of(eta) + (Q::of(e2) - Q::of(eta)) * Q(1, 3);
    f.add(contains(cheb::eval(a, box), eval_q(aq, inner)), ctx("eval over an interval of eta"));
    // ends
    f.add(contains(cheb::value_at_0(a), eval_q(aq, Q(0))), ctx("value_at_0"));
    f.add(contains(cheb::value_at_1(a), eval_q(aq, Q(1))), ctx("value_at_1"));
    f.add(contains(cheb::eval(a, I(0)), eval_q(aq, Q(0))), ctx("eval at 0"));
    f.add(contains(cheb::eval(a, I(1)), eval_q(aq, Q(1))), ctx("eval at 1"));
    // derivative
    const auto da = cheb::derivative(a);
    f.add(da.size() == std::max<std::size_t>(1, n - 1), ctx("derivative length"));
    f.add(contains(cheb::eval(da, ei), deriv_eval_q(aq, eq)), ctx("derivative then eval"));
    // antiderivative: reference checked by F' = f and F(0) = value0, exactly
    const I v0 = rand_coeff<I>(g, st, 0);
    const Q v0q = pick(v0, g);
    const QS Fq = antideriv_q(aq, v0q);
    const Q r1 = Q::of(std::uniform_real_distribution<double>(0, 1)(g));
    f.add(deriv_eval_q(Fq, r1) == eval_q(aq, r1) && deriv_eval_q(Fq, eq) == eval_q(aq, eq), ctx("reference F' != f"));
    f.add(eval_q(Fq, Q(0)) == v0q, ctx("reference F(0) != value0"));
    const auto F = cheb::antiderivative(a, v0);
    bool coeffs_in = F.size() == Fq.size();
    for (std::size_t k = 0; coeffs_in && k < F.size(); ++k) coeffs_in = contains(F[k], Fq[k]);
    f.add(coeffs_in, ctx("antiderivative coefficients"));
    f.add(contains(cheb::eval(F, ei), eval_q(Fq, eq)), ctx("antiderivative then eval"));
    f.add(contains(cheb::value_at_0(F), v0q), ctx("antiderivative value_at_0"));
    // product: reference checked by P(η) = a(η) b(η), exactly
    const QS Pq = product_q(aq, bq);
    f.add(eval_q(Pq, eq) == eval_q(aq, eq) * eval_q(bq, eq) && eval_q(Pq, r1) == eval_q(aq, r1) * eval_q(bq, r1),
          ctx("reference product identity"));
    const auto P = cheb::product(a, b);
    bool pin = P.size() == Pq.size();
    for (std::size_t k = 0; pin && k < P.size(); ++k) pin = contains(P[k], Pq[k]);
    f.add(pin, ctx("product coefficients"));
    f.add(contains(cheb::eval(P, ei), eval_q(aq, eq) * eval_q(bq, eq)), ctx("eval of product vs product of evals"));
    // truncated product: kept part contains, dropped part is bounded in ℓ¹ for several choices inside
    const std::size_t m = std::uniform_int_distribution<std::size_t>(1, P.size() + 2)(g);
    double tail = -1;
    const auto T = cheb::product_truncated(a, b, m, tail);
    f.add(T.size() == std::min(m, P.size()), ctx("truncated length"));
    bool tin = true;
    for (std::size_t k = 0; k < T.size(); ++k) tin = tin && contains(T[k], Pq[k]);
    f.add(tin, ctx("truncated coefficients"));
    if (m >= P.size()) f.add(tail == 0, ctx("nothing dropped but tail != 0"));
    for (int rep = 0; rep < 3; ++rep) {
      const QS Pr = rep == 0 ? Pq : product_q(pick_all(a, g), pick_all(b, g));
      Q dropped(0);
      for (std::size_t k = m; k < Pr.size(); ++k) dropped = dropped + Pr[k].abs();
      f.add(tail >= 0 && dropped <= Q::of(tail), ctx("tail bound below the true tail"));
    }
    // norm1_up: above the largest Σ ν^k |c_k| over the inputs, and not grossly above it
    for (double nu : {1.0, 1.25, 1.0 + std::uniform_real_distribution<double>(0, 1)(g)}) {
      Q exact(0), w(1);
      for (const I& v : a) {
        const Q m1 = lo_q(v).abs(), m2 = hi_q(v).abs();
        exact = exact + w * (m1 <= m2 ? m2 : m1);
        w = w * Q::of(nu);
      }
      const double up = cheb::norm1_up(a, nu);
      f.add(exact <= Q::of(up), ctx("norm1_up below the exact norm"));
      f.add(Q::of(up) <= exact * Q::of(1 + 0x1p-40) + Q::of(0x1p-1000), ctx("norm1_up grossly loose"));
    }
  }
  gmp_randclear(st);
}
}  // namespace

TEST_CASE("Chebyshev operations on Id contain the exact results") {
  Failures f;
  const long n = scaled(800);
  run_all<Id>(0xc4eb0001, n, f);
  CHECK(f.count == 0);
  CHECK(f.checks > 20 * n);
}

TEST_CASE("Chebyshev operations on Im (128 bits) contain the exact results") {
  arith::PrecisionScope ps(128);
  Failures f;
  const long n = scaled(300);
  run_all<Im>(0xc4eb0002, n, f);
  CHECK(f.count == 0);
  CHECK(f.checks > 20 * n);
}

TEST_CASE("Chebyshev edge cases: empty and one-term series, identity, c_0 not halved") {
  const cheb::Series<Id> empty;
  CHECK(cheb::eval(empty, Id(0.3)).lower() == 0.0);
  CHECK(cheb::value_at_0(empty).upper() == 0.0);
  CHECK(cheb::derivative(empty).size() == 1);
  CHECK(cheb::derivative(empty)[0].upper() == 0.0);
  CHECK(cheb::product(empty, cheb::Series<Id>{Id(1.0)}).empty());
  const auto F0 = cheb::antiderivative(empty, Id(2.0));
  REQUIRE(F0.size() == 1);
  CHECK(F0[0].lower() == 2.0);
  const cheb::Series<Id> one{Id(3.0)};
  CHECK(cheb::eval(one, Id(0.7)).lower() == 3.0);  // c_0 is the value, not c_0 / 2
  CHECK(cheb::eval(one, Id(0.7)).upper() == 3.0);
  CHECK(cheb::derivative(one)[0].upper() == 0.0);
  // η itself: eval at η contains η; its derivative is exactly 1.
  const auto id = cheb::identity_series<Id>();
  const Id v = cheb::eval(id, Id(0.375));
  CHECK(bn::in(0.375, v));
  const auto did = cheb::derivative(id);
  CHECK(did[0].lower() == 1.0);
  CHECK(did[0].upper() == 1.0);
  // T_1(2η − 1) squared: (2η−1)² = (T_0 + T_2)/2.
  const cheb::Series<Id> t1{Id(0.0), Id(1.0)};
  const auto sq = cheb::product(t1, t1);
  REQUIRE(sq.size() == 3);
  CHECK(bn::in(0.5, sq[0]));
  CHECK(bn::in(0.0, sq[1]));
  CHECK(bn::in(0.5, sq[2]));
  double tail = -1;
  const auto tr = cheb::product_truncated(t1, t1, 2, tail);
  CHECK(tr.size() == 2);
  CHECK(tail >= 0.5);
  CHECK(tail <= 0.5 * (1 + 0x1p-50));
  CHECK(cheb::norm1_up(t1, 2.0) == 2.0);  // Σ ν^k |c_k| = 2^1
}
