// The one-solution verifier against sources outside the project.
#include <doctest/doctest.h>

#include "candidate/galerkin_newton.hpp"
#include "model/berman.hpp"
#include "proof/certify.hpp"
#include "proof/newton_kantorovich.hpp"

using namespace porecert;
using arith::Id;

namespace {
proof::CertifyOutcome run(const std::string& R) {
  proof::CertifyRequest q;
  q.R_lo = q.R_hi = R;
  return proof::certify_berman(q);
}
proof::CertifyOutcome run_box(const std::string& lo, const std::string& hi, const std::string& method = "auto") {
  proof::CertifyRequest q;
  q.R_lo = lo;
  q.R_hi = hi;
  q.method = method;
  return proof::certify_berman(q);
}
Id enc(const proof::Enclosure& e) { return Id(e.lo_d, e.hi_d); }
}  // namespace

TEST_CASE("R = 0: plane Poiseuille f = (3η − η³)/2, K = −3 exactly, inside the enclosures") {
  const auto o = run("0");
  REQUIRE(o.certified);
  CHECK(boost::numeric::in(1.5, enc(o.fp0)));
  CHECK(boost::numeric::in(-3.0, enc(o.K)));
  CHECK(boost::numeric::in(-3.0, enc(o.fpp1)));
  CHECK(boost::numeric::in(-3.0, enc(o.fppp0)));
  CHECK(o.existence_radius < 1e-13);
  CHECK(std::isinf(o.uniqueness_radius));  // linear problem: Z2 = 0
}

TEST_CASE("small R agrees with Berman's 1953 series up to a stated O(R^2) bound") {
  // Berman 1953 (J. Appl. Phys. 24:1232), series re-derived in method.md: the O(R²) remainder
  // is bounded here by 0.05 R² (the largest true coefficient, of K, is about 0.017) and far below R/140.
  for (const char* Rs : {"0.001", "0.01"}) {
    const double R = std::atof(Rs);
    const auto o = run(Rs);
    REQUIRE(o.certified);
    const double tol = 0.05 * R * R;
    CHECK(std::fabs(o.K.lo_d - (-3 + 81.0 / 35 * R)) < tol);
    CHECK(std::fabs(o.fpp1.lo_d - (-3 - 3.0 / 35 * R)) < tol);
    CHECK(std::fabs(o.fp0.lo_d - (1.5 - R / 140)) < tol);
    CHECK(std::fabs(o.fppp0.lo_d - (-3 + 9.0 / 140 * R)) < tol);
    // ...and the first-order term is really there (the solution is not the R = 0 profile).
    CHECK(std::fabs(o.K.lo_d + 3) > 2 * R);
  }
}

TEST_CASE("an interval of R gives one certificate that contains the point certificates") {
  proof::CertifyRequest q;
  q.R_lo = "0.9999";
  q.R_hi = "1.0001";
  const auto wide = proof::certify_berman(q);
  REQUIRE(wide.certified);
  for (const char* Rs : {"0.9999", "1", "1.0001"}) {
    const auto p = run(Rs);
    REQUIRE(p.certified);
    CHECK(boost::numeric::subset(enc(p.K), enc(wide.K)));
    CHECK(boost::numeric::subset(enc(p.fpp1), enc(wide.fpp1)));
  }
}

TEST_CASE("negative tests: wrong-R candidate, truncated candidate, tampered residual are never falsely certified") {
  const Id R = arith::from_decimal<Id>("5");
  const auto good = run("5");
  REQUIRE(good.certified);
  auto make = [](double r) { return model::berman<double>(r); };
  // Candidate for R = 5.5 checked at R = 5: must fail, or certify an enclosure containing the true value.
  auto other = candidate::continuation(make, candidate::poiseuille(make(0), 24), 0, 5.5, 400);
  REQUIRE(other.converged);
  std::vector<Id> xo(other.x.begin(), other.x.end());
  const auto r1 = proof::nk_verify(model::berman(R), xo);
  if (r1.certified) CHECK(boost::numeric::overlap(r1.K, enc(good.K)));
  CHECK_FALSE(r1.certified);
  // Truncated candidate: keep 10 modes only.
  auto right = candidate::continuation(make, candidate::poiseuille(make(0), 24), 0, 5.0, 400);
  std::vector<Id> xt(right.x.begin(), right.x.begin() + 2 + 10);
  const auto r2 = proof::nk_verify(model::berman(R), xt);
  if (r2.certified) CHECK(boost::numeric::overlap(r2.K, enc(good.K)));
  // Tampered: K shifted by 1e-6.
  std::vector<Id> xk(right.x.begin(), right.x.end());
  xk[1] = xk[1] + Id(1e-6);
  const auto r3 = proof::nk_verify(model::berman(R), xk);
  if (r3.certified) {
    CHECK(boost::numeric::overlap(r3.K, enc(good.K)));
    CHECK(r3.existence_radius >= 1e-6 * 0.5);
  }
}

TEST_CASE("injection trend (Taylor 1956, from memory): f'(0) -> pi/2, f''(1) -> -pi^2/4 as R -> -inf") {
  const auto o = run("-200");
  REQUIRE(o.certified);
  // Loose, trend only: the O(1/|R|) corrections are not known to us with constants.
  CHECK(std::fabs(o.fp0.lo_d - M_PI / 2) < 0.01);
  CHECK(std::fabs(o.fpp1.lo_d + M_PI * M_PI / 4) < 0.05);
}

TEST_CASE("a failed proof names the inequality and the margin") {
  // 12 modes at R = 30 cannot resolve the wall layer: the proof must fail and say why.
  auto make = [](double r) { return model::berman<double>(r); };
  auto c = candidate::continuation(make, candidate::poiseuille(make(0), 24), 0, 30.0, 400);
  REQUIRE(c.converged);
  std::vector<Id> x(c.x.begin(), c.x.begin() + 2 + 12);
  const auto r = proof::nk_verify(model::berman(arith::from_decimal<Id>("30")), x);
  CHECK_FALSE(r.certified);
  CHECK(r.failure.find("must be") != std::string::npos);
  CHECK(r.failure.find("short by") != std::string::npos);
}

TEST_CASE("first-order predictor (M3.11) and sharper Z2 (M3.10): an injection box that needs both") {
  // R = -30 +- 5e-4: with a plain interval candidate Y0 is first order in the width (about 2e-3)
  // and fails the radii polynomial; the predictor makes it second order.
  proof::CertifyRequest q;
  q.R_lo = "-30.0005";
  q.R_hi = "-29.9995";
  q.method = "newton";
  q.precision_bits = 53;
  const auto box = proof::certify_berman(q);
  REQUIRE(box.certified);
  REQUIRE(box.tangent_hex.size() == box.candidate_hex.size());
  CHECK(box.Y0 < 1e-5);
  // Z2 only through the function columns of A: far below the crude ‖A‖ Σ 2|c| λ λ.
  CHECK(box.Z2 < 0.1 * box.A_norm * 4 * 30);
  // Point proofs at the ends and the middle lie in the box's enclosures (same true solutions).
  for (const char* Rs : {"-30.0005", "-30", "-29.9995"}) {
    proof::CertifyRequest p = q;
    p.R_lo = p.R_hi = Rs;
    const auto pt = proof::certify_berman(p);
    REQUIRE(pt.certified);
    CHECK(boost::numeric::subset(enc(pt.K), enc(box.K)));
    CHECK(boost::numeric::subset(enc(pt.fpp1), enc(box.fpp1)));
    CHECK(boost::numeric::subset(enc(pt.fp0), enc(box.fp0)));
  }
  // The same box without a useful predictor (tangent 0: the plain interval method) is not certified,
  // so the predictor is what carries the proof; the stored tangent re-proves it.
  std::vector<std::string> zero(box.tangent_hex.size(), "0x0p+0");
  CHECK_FALSE(proof::recheck_berman(q.R_lo, q.R_hi, box.candidate_hex, 53, zero).certified);
  const auto again = proof::recheck_berman(q.R_lo, q.R_hi, box.candidate_hex, 53, box.tangent_hex);
  CHECK(again.certified);
  CHECK(again.existence_radius <= box.existence_radius);
  // A tangent of the wrong length is refused, not padded.
  std::vector<std::string> short_t(box.tangent_hex.begin(), box.tangent_hex.end() - 1);
  CHECK_THROWS_AS(proof::recheck_berman(q.R_lo, q.R_hi, box.candidate_hex, 53, short_t), std::invalid_argument);
}

TEST_CASE("remedies (M5): precision stops when it does not lower Y0; a box is not re-proved for width") {
  // R in [2, 2.4]: the radii polynomial fails on Y0, which is set by the box width (second order in
  // it, (M3.11)), not by rounding. One MPFR attempt shows that; 256..1024 bits are not tried.
  const auto wide = run_box("2", "2.4", "newton");
  CHECK_FALSE(wide.certified);
  CHECK(wide.failure.find("4 Z2 Y0") != std::string::npos);
  int mpfr_attempts = 0;
  bool stopped = false;
  for (const auto& l : wide.log) {
    if (l.rfind("MPFR ", 0) == 0) ++mpfr_attempts;
    if (l.find("more precision did not lower Y0") != std::string::npos) stopped = true;
  }
  CHECK(mpfr_attempts == 1);
  CHECK(stopped);
  // A point R whose double proof is rounding-bound still gets its MPFR re-proof for width
  // (R = 10: relative width 4e-12 in double, docs/performance.md) ...
  const auto point = run("10");
  REQUIRE(point.certified);
  CHECK(point.precision_bits > 53);
  // ... a box does not (its values are as wide as the box), and stays certified in double.
  const auto box = run_box("-30.05", "-29.95");
  REQUIRE(box.certified);
  CHECK(box.precision_bits == 53);
  CHECK(box.K.hi_d - box.K.lo_d > 1e-6 * std::fabs(box.K.lo_d));
}
