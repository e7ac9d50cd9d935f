// Certified enclosures against an independent reference that shares no code with the verifier:
// shooting with Boost.Odeint over Boost.Multiprecision (tests/reference/berman_shooting.hpp).
#include <doctest/doctest.h>

#include "arith/interval.hpp"
#include "proof/certify.hpp"
#include "reference/berman_shooting.hpp"

using namespace porecert;

TEST_CASE("reference shooting values lie inside the certified enclosures, R in [-50, 30]") {
  for (const char* Rs : {"-50", "-17.25", "-3", "0.5", "4.75", "12", "21.5", "30"}) {
    CAPTURE(std::string(Rs));
    proof::CertifyRequest q;
    q.R_lo = q.R_hi = Rs;
    const auto o = proof::certify_berman(q);
    REQUIRE(o.certified);
    const auto ref = berman_type1_reference(Rs);
    auto inside = [](const std::string& v, const proof::Enclosure& e) {
      // Compare exactly: the reference's 40-digit decimal, enclosed, must meet the certified interval,
      // and its distance to it must be below the reference's own accuracy (1e-30).
      const arith::Id r = arith::from_decimal<arith::Id>(v);
      return e.lo_d - 1e-30 <= r.upper() && r.lower() <= e.hi_d + 1e-30;
    };
    CHECK(inside(ref.fp0, o.fp0));
    CHECK(inside(ref.fppp0, o.fppp0));
    CHECK(inside(ref.fpp1, o.fpp1));
    CHECK(inside(ref.K, o.K));
    // The enclosures are not vacuous: relative width below 1e-6.
    CHECK(o.K.hi_d - o.K.lo_d <= 1e-6 * std::max(1.0, std::fabs(o.K.lo_d)));
  }
}
