// The symmetry-breaking point of type I in the full channel (a = 1): the extended system of
// docs/fold.md with the even null space (F14), proved by the same fold verifier.
#include <doctest/doctest.h>

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
