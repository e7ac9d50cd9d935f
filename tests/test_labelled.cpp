// Proofs of a named branch (lib/proof/labelled.cpp): which chart or start serves type II and type III,
// checked against the independent reference solver (tests/reference, Boost.Odeint at 80 digits).
#include <doctest/doctest.h>

#include <string>

#include "arith/interval.hpp"
#include "proof/certify.hpp"
#include "proof/labelled.hpp"
#include "reference/berman_shooting.hpp"

using namespace porecert;

namespace {
// The reference's 40-digit decimal must meet the certified interval (its own accuracy: 1e-30).
bool inside(const std::string& v, const proof::Enclosure& e) {
  const arith::Id r = arith::from_decimal<arith::Id>(v);
  return e.lo_d - 1e-30 <= r.upper() && r.lower() <= e.hi_d + 1e-30;
}
proof::CertifyOutcome labelled(const char* lo, const char* hi, const char* branch) {
  proof::CertifyRequest q;
  q.R_lo = lo;
  q.R_hi = hi;
  q.branch = branch;
  return proof::certify_labelled(q);
}
}  // namespace

TEST_CASE("type II below R = 40: a box in the reduced chart alone, values against the reference") {
  // Before, a type II box below R = 40 went to the Chebyshev search and Newton-Kantorovich boxes
  // ([20, 20.5] did not finish in 900 s); the chart eps = +1, s > 0 proves it in about a second.
  const auto o = labelled("21", "21.25", "II");
  REQUIRE(o.certified);
  CHECK(o.method == "reduced-ivp");
  CHECK(o.structure.label == "II");
  CHECK(o.fppp0.lo_d > 0);  // type II is the s > 0 side of the chart
  // The reference (Boost.Odeint, 80 digits) at R = 21.125, inside the box, started from the box's
  // enclosures, must lie inside every value enclosure of the box (they hold for every R in it).
  const auto ref = berman_reference_from("21.125", 0.5 * (o.fp0.lo_d + o.fp0.hi_d), 0.5 * (o.fppp0.lo_d + o.fppp0.hi_d));
  CHECK(inside(ref.fp0, o.fp0));
  CHECK(inside(ref.fppp0, o.fppp0));
  CHECK(inside(ref.fpp1, o.fpp1));
  CHECK(inside(ref.K, o.K));
  // Not vacuous: the box's f'(0) band is narrower than its change over the box would allow a
  // constant guess (f'(0) ≈ 0.91 at R = 21, measured), and excludes the type I value (≈ 1.2).
  CHECK(o.fp0.hi_d - o.fp0.lo_d < 0.05);
  CHECK(o.fp0.hi_d < 1.1);
}

TEST_CASE("type III below R = 60: Newton-Kantorovich from the reduced shooting's start, no search") {
  // The start comes from the chart eps = -1, wall at the second zero of f' (docs/branches.md); the
  // log says so. With the Chebyshev search instead, this box took 7.6 s (measured).
  const auto o = labelled("20", "20.004", "III");
  REQUIRE(o.certified);
  CHECK(o.method == "newton-kantorovich");
  CHECK(o.structure.label == "III");
  REQUIRE(!o.log.empty());
  CHECK(o.log.front().find("reduced shooting") != std::string::npos);
  const auto ref = berman_reference_from("20.002", 0.5 * (o.fp0.lo_d + o.fp0.hi_d), 0.5 * (o.fppp0.lo_d + o.fppp0.hi_d));
  CHECK(inside(ref.fp0, o.fp0));
  CHECK(inside(ref.fppp0, o.fppp0));
  CHECK(inside(ref.fpp1, o.fpp1));
  CHECK(inside(ref.K, o.K));
  CHECK(o.fp0.hi_d < -3.9);  // type III: strong reversed flow, f'(0) ≈ -3.99 at R = 20 (measured)
  // Near the fold the start must stay on the type III side (s < 1.4711): the other solution with
  // f'(0) < 0 there (the continuation of type II) has f'(0) ≈ -0.39 at R = 12.5 (measured).
  const auto near = labelled("12.5", "12.5", "III");
  REQUIRE(near.certified);
  CHECK(near.structure.label == "III");
  CHECK(near.fp0.hi_d < -1.5);
}
