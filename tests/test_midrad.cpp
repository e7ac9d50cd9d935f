// Containment of the midpoint-radius products (docs/enclosures.md §5): for random point A and interval B, the exact
// product of A with point matrices inside B, computed exactly in MPFR (the inexact flag proves it), lies inside [mid −
// rad, mid + rad]. Sizes n = 3, 17, 60 and rectangular; magnitudes include cancellation and underflow. Iterations scale
// with PORECERT_TEST_SCALE (default 1).
#include <doctest/doctest.h>
#include <mpfr.h>

#include <algorithm>
#include <cfloat>
#include <cstdlib>
#include <functional>
#include <random>
#include <string>

#include "arith/midrad.hpp"

using namespace porecert::arith;
using R = rounded_nearest_outward;

namespace {
constexpr double kDmin = std::numeric_limits<double>::denorm_min();

long scaled(long n) {
  const char* s = std::getenv("PORECERT_TEST_SCALE");
  const double f = s ? std::atof(s) : 1.0;
  return std::max(1L, static_cast<long>(static_cast<double>(n) * (f > 0 ? f : 1.0)));
}

struct Failures {
  long count = 0, checks = 0;
  void add(bool ok, const std::function<std::string()>& what) {
    ++checks;
    if (!ok && ++count <= 8) FAIL_CHECK(what());
  }
};

// Exact Σ_k x_k y_k: MPFR at a precision that holds it; the inexact flag proves exactness.
class ExactDot {
 public:
  ExactDot() {
    mpfr_init2(acc_, 64);
    mpfr_inits2(53, a_, b_, static_cast<mpfr_ptr>(nullptr));
  }
  ~ExactDot() { mpfr_clears(acc_, a_, b_, static_cast<mpfr_ptr>(nullptr)); }
  ExactDot(const ExactDot&) = delete;
  ExactDot& operator=(const ExactDot&) = delete;
  // Sets acc to Σ_k x(k) y(k) for k < n.
  template <class X, class Y>
  mpfr_srcptr dot(Eigen::Index n, X x, Y y) {
    // Enough bits for the spread of the products' exponents (each product has <= 106 bits).
    int emax = -100000, emin = 100000;
    for (Eigen::Index k = 0; k < n; ++k) {
      if (x(k) == 0 || y(k) == 0) continue;
      const int e = std::ilogb(x(k)) + std::ilogb(y(k));
      emax = std::max(emax, e);
      emin = std::min(emin, e);
    }
    const mpfr_prec_t p = emax >= emin ? emax - emin + 128 + 64 : 64;
    mpfr_set_prec(acc_, p);
    mpfr_set_zero(acc_, 1);
    mpfr_clear_inexflag();
    for (Eigen::Index k = 0; k < n; ++k) {
      mpfr_set_d(a_, x(k), MPFR_RNDN);
      mpfr_set_d(b_, y(k), MPFR_RNDN);
      mpfr_fma(acc_, a_, b_, acc_, MPFR_RNDN);
    }
    REQUIRE_FALSE(mpfr_inexflag_p());  // the reference is exact
    return acc_;
  }
  // |v − m| ≤ r exactly?  (v exact, m and r doubles)
  bool within(mpfr_srcptr v, double m, double r) {
    mpfr_t d;
    mpfr_init2(d, 2200);  // v and m within [2^-1184, 2^1100]: the difference is exact
    mpfr_clear_inexflag();
    mpfr_sub_d(d, v, m, MPFR_RNDN);
    REQUIRE_FALSE(mpfr_inexflag_p());
    mpfr_abs(d, d, MPFR_RNDN);
    const bool ok = mpfr_cmp_d(d, r) <= 0;
    mpfr_clear(d);
    return ok;
  }

 private:
  mpfr_t acc_, a_, b_;
};

// Matrix entries of several kinds: moderate, wide exponent range, underflowing products, integers (heavy cancellation),
// sparse.
MatD rand_matrix(std::mt19937_64& g, Eigen::Index r, Eigen::Index c, int kind) {
  std::uniform_real_distribution<double> u(-1, 1);
  MatD M(r, c);
  for (Eigen::Index j = 0; j < c; ++j)
    for (Eigen::Index i = 0; i < r; ++i) {
      double v;
      switch (kind) {
        case 0:
          v = std::ldexp(u(g), std::uniform_int_distribution<int>(-5, 5)(g));
          break;
        case 1:
          v = std::ldexp(u(g), std::uniform_int_distribution<int>(-300, 300)(g));
          break;
        case 2:
          v = std::ldexp(u(g), std::uniform_int_distribution<int>(-545, -530)(g));
          break;
        case 3:
          v = static_cast<double>(std::uniform_int_distribution<int>(-3, 3)(g)) + (g() % 7 == 0 ? 0x1p-60 : 0);
          break;
        default:
          v = (g() % 4 == 0) ? u(g) : 0.0;
          break;
      }
      M(i, j) = v;
    }
  return M;
}

// Interval matrix from entrywise bounds [lo, hi]; mid/rad enclose them.
struct Box {
  MatD lo, hi;
  MidRad mr;
};
Box rand_box(std::mt19937_64& g, Eigen::Index r, Eigen::Index c, int kind) {
  Box b{rand_matrix(g, r, c, kind), MatD(r, c), {}};
  b.hi = b.lo;
  b.mr.mid.resize(r, c);
  b.mr.rad.resize(r, c);
  const int wkind = static_cast<int>(g() % 3);
  for (Eigen::Index j = 0; j < c; ++j)
    for (Eigen::Index i = 0; i < r; ++i) {
      double& hi = b.hi(i, j);
      const double lo = b.lo(i, j);
      if (wkind == 1) hi = R::add_up(lo, std::ldexp(std::fabs(lo), -30) + kDmin);
      if (wkind == 2) hi = R::add_up(lo, std::ldexp(std::fabs(lo), -std::uniform_int_distribution<int>(1, 52)(g)));
      const double m = lo * 0.5 + hi * 0.5;
      b.mr.mid(i, j) = m;
      b.mr.rad(i, j) = std::max(R::sub_up(hi, m), R::sub_up(m, lo));
    }
  return b;
}
// A point matrix inside the box: all lower, all upper, or mixed ends and midpoints.
MatD pick(const Box& b, std::mt19937_64& g, int how) {
  if (how == 0) return b.lo;
  if (how == 1) return b.hi;
  MatD P(b.lo.rows(), b.lo.cols());
  for (Eigen::Index j = 0; j < P.cols(); ++j)
    for (Eigen::Index i = 0; i < P.rows(); ++i) {
      const int w = static_cast<int>(g() % 3);
      P(i, j) = w == 0 ? b.lo(i, j) : w == 1 ? b.hi(i, j) : std::clamp(b.mr.mid(i, j), b.lo(i, j), b.hi(i, j));
    }
  return P;
}

std::string hexm(const MatD& M) {
  std::string s;
  for (Eigen::Index i = 0; i < std::min<Eigen::Index>(M.rows(), 4); ++i) {
    for (Eigen::Index j = 0; j < std::min<Eigen::Index>(M.cols(), 4); ++j) s += hex_exact(M(i, j)) + " ";
    s += "; ";
  }
  return s + (M.size() > 16 ? "..." : "");
}

void check_product(const MatD& A, const Box& B, std::mt19937_64& g, Failures& f, const std::string& tag) {
  const MidRad C = product(A, B.mr);
  const Eigen::Index k = A.cols();
  f.add(C.mid.allFinite() && C.rad.allFinite() && (C.rad.array() >= 0).all(),
        [&] { return tag + ": NaN, infinite or negative entries"; });
  // Not grossly loose: rad ≤ 2 |A| (4 k u |Bm| + Br) + 16 (k+1) η (the implementation's γ_k ≈ k u).
  const MatD est = (A.cwiseAbs() * (B.mr.mid.cwiseAbs() * (4.0 * static_cast<double>(k) * 0x1p-53) + B.mr.rad)) * 2.0;
  bool loose_ok = true;
  for (Eigen::Index j = 0; j < C.cols(); ++j)
    for (Eigen::Index i = 0; i < C.rows(); ++i)
      loose_ok = loose_ok && C.rad(i, j) <= est(i, j) + 16.0 * static_cast<double>(k + 1) * kDmin;
  f.add(loose_ok, [&] { return tag + ": radius grossly larger than γ_k |A||B|"; });
  ExactDot ex;
  for (int how = 0; how < 3; ++how) {
    const MatD P = pick(B, g, how);
    for (Eigen::Index j = 0; j < P.cols(); ++j)
      for (Eigen::Index i = 0; i < A.rows(); ++i) {
        mpfr_srcptr v = ex.dot(
            k, [&](Eigen::Index t) { return A(i, t); }, [&](Eigen::Index t) { return P(t, j); });
        f.add(ex.within(v, C.mid(i, j), C.rad(i, j)), [&, i, j] {
          return tag + ": exact (" + std::to_string(i) + "," + std::to_string(j) + ") outside; A = " + hexm(A) +
                 " B.lo = " + hexm(B.lo) + " mid = " + hex_exact(C.mid(i, j)) + " rad = " + hex_exact(C.rad(i, j));
        });
      }
  }
}
}  // namespace

TEST_CASE("midrad product encloses A·B' for every tested B' inside B (n = 3, 17, 60, rectangular)") {
  std::mt19937_64 g(0x3d0001);
  Failures f;
  struct Shape {
    Eigen::Index r, k, c;
    long reps;
  };
  const Shape shapes[] = {{3, 3, 3, 300}, {17, 17, 17, 12}, {60, 60, 60, 4},
                          {5, 60, 2, 20}, {1, 400, 1, 20},  {40, 1, 7, 20}};
  long products = 0;
  for (const Shape& s : shapes) {
    for (long rep = 0; rep < scaled(s.reps); ++rep) {
      for (int kind = 0; kind < 5; ++kind) {
        const MatD A = rand_matrix(g, s.r, s.k, kind);
        const Box B = rand_box(g, s.k, s.c, (kind + static_cast<int>(rep)) % 5);
        check_product(A, B, g, f,
                      "n=" + std::to_string(s.r) + "x" + std::to_string(s.k) + "x" + std::to_string(s.c) + " kind " +
                          std::to_string(kind));
        ++products;
      }
    }
  }
  CHECK(f.count == 0);
  CHECK(products > std::min(1000L, scaled(1000)));  // not vacuous (fewer at a small PORECERT_TEST_SCALE)
}

TEST_CASE("midrad regressions: underflow, the self-test matrix, cancellation, denormal_min products") {
  std::mt19937_64 g(5);
  Failures f;
  const auto box_of = [](const MatD& M) { return Box{M, M, MidRad{M, MatD::Zero(M.rows(), M.cols())}}; };
  MatD A(2, 2), At(2, 2);
  A << 1.0, 0x1p-53, 0.0, 0x1p-53;
  At = A.transpose();
  check_product(A, box_of(At), g, f, "self-test matrix");
  const MidRad C = product(A, box_of(At).mr);
  CHECK(R::add_up(C.mid(0, 0), C.rad(0, 0)) > 1.0);  // exact 1 + 2^-106 is above fl = 1
  MatD D = MatD::Constant(3, 3, kDmin), H = MatD::Constant(3, 3, 0.5);
  check_product(D, box_of(H), g, f, "denorm_min * 0.5");  // every product rounds to 0
  const MidRad U = product(D, box_of(H).mr);
  CHECK((U.rad.array() > 0).all());  // the underflow term is there
  check_product(D, box_of(D), g, f, "denorm_min * denorm_min");
  MatD c1(1, 3), c2(3, 1);
  c1 << 1.0, -1.0, 0x1p-60;
  c2 << 1.0, 1.0, 1.0;
  check_product(c1, box_of(c2), g, f, "cancellation");
  MatD big = MatD::Constant(2, 2, 0x1p1000), small = MatD::Constant(2, 2, 0x1p-1000);
  check_product(big, box_of(small), g, f, "2^1000 * 2^-1000");
  CHECK(f.count == 0);
  CHECK_NOTHROW(midrad_self_test());
}

TEST_CASE("abs_product_up, column norms, identity defect and operator norm are upper bounds") {
  std::mt19937_64 g(0x3d0002);
  Failures f;
  ExactDot ex;
  mpfr_t s, best;
  mpfr_inits2(4000, s, best, static_cast<mpfr_ptr>(nullptr));
  for (long rep = 0; rep < scaled(200); ++rep) {
    const Eigen::Index n = std::uniform_int_distribution<Eigen::Index>(1, 30)(g);
    const int kind = static_cast<int>(rep % 5);
    const MatD A = rand_matrix(g, n, n, kind);
    const MatD M = rand_matrix(g, n, n, (kind + 1) % 5).cwiseAbs();
    const MatD T = abs_product_up(A, M);
    for (Eigen::Index j = 0; j < n; ++j)
      for (Eigen::Index i = 0; i < n; ++i) {
        mpfr_srcptr v = ex.dot(
            n, [&](Eigen::Index t) { return std::fabs(A(i, t)); }, [&](Eigen::Index t) { return M(t, j); });
        f.add(mpfr_cmp_d(v, T(i, j)) <= 0, [&] { return "abs_product_up below |A|M, A = " + hexm(A); });
      }
    // Column sums, exactly.
    const Box B = rand_box(g, n, n, kind);
    const Eigen::VectorXd cn = column_norms_up(B.mr), idn = identity_defect_column_norms_up(B.mr);
    const double on = operator_norm1_up(A);
    mpfr_set_zero(best, 1);
    for (Eigen::Index j = 0; j < n; ++j) {
      mpfr_set_zero(s, 1);
      for (Eigen::Index i = 0; i < n; ++i) {
        mpfr_add_d(s, s, std::fabs(B.mr.mid(i, j)), MPFR_RNDU);
        mpfr_add_d(s, s, B.mr.rad(i, j), MPFR_RNDU);
      }
      f.add(mpfr_cmp_d(s, cn(j)) <= 0, [&] { return "column_norms_up below the exact column sum"; });
      mpfr_set_zero(s, 1);
      for (Eigen::Index i = 0; i < n; ++i) {
        mpfr_t d;
        mpfr_init2(d, 4000);
        mpfr_set_d(d, i == j ? 1.0 : 0.0, MPFR_RNDN);
        mpfr_sub_d(d, d, B.mr.mid(i, j), MPFR_RNDN);
        mpfr_abs(d, d, MPFR_RNDN);
        mpfr_add(s, s, d, MPFR_RNDU);
        mpfr_add_d(s, s, B.mr.rad(i, j), MPFR_RNDU);
        mpfr_clear(d);
      }
      f.add(mpfr_cmp_d(s, idn(j)) <= 0, [&] { return "identity_defect_column_norms_up below the exact sum"; });
      mpfr_set_zero(s, 1);
      for (Eigen::Index i = 0; i < n; ++i) mpfr_add_d(s, s, std::fabs(A(i, j)), MPFR_RNDU);
      if (mpfr_greater_p(s, best)) mpfr_set(best, s, MPFR_RNDU);
    }
    f.add(mpfr_cmp_d(best, on) <= 0, [&] { return "operator_norm1_up below the exact max column sum"; });
  }
  mpfr_clears(s, best, static_cast<mpfr_ptr>(nullptr));
  CHECK(f.count == 0);
  CHECK(f.checks > 1000);
}
