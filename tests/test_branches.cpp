// Branches I/II/III: found, certified, labelled by certified structure, proved distinct; checked
// against the independent multiprecision shooting reference (tests/reference/berman_shooting.hpp).
#include <doctest/doctest.h>

#include "proof/branches.hpp"
#include "reference/berman_shooting.hpp"

using namespace porecert;

namespace {
bool meets(const std::string& v, const proof::Enclosure& e) {
  const arith::Id r = arith::from_decimal<arith::Id>(v);
  return e.lo_d - 1e-30 <= r.upper() && r.lower() <= e.hi_d + 1e-30;
}
const proof::CertifyOutcome* with_label(const proof::BranchesOutcome& b, const std::string& l) {
  for (const auto& s : b.solutions)
    if (s.certified && s.structure.label == l) return &s;
  return nullptr;
}
// certify_branches at R with exactly three certified, pairwise disjoint solutions labelled I, II, III.
struct Three {
  proof::BranchesOutcome b;
  const proof::CertifyOutcome *s1 = nullptr, *s2 = nullptr, *s3 = nullptr;
};
Three three_at(const std::string& R) {
  Three t;
  proof::CertifyRequest q;
  q.R_lo = q.R_hi = R;
  t.b = proof::certify_branches(q);
  CHECK(t.b.solutions.size() == 3);
  CHECK(t.b.pairwise_disjoint);
  t.s1 = with_label(t.b, "I");
  t.s2 = with_label(t.b, "II");
  t.s3 = with_label(t.b, "III");
  return t;
}
}  // namespace

TEST_CASE("R = 20: three certified, pairwise distinct solutions labelled I, II, III") {
  const Three t = three_at("20");
  const auto *s1 = t.s1, *s2 = t.s2, *s3 = t.s3;
  REQUIRE(s1);
  REQUIRE(s2);
  REQUIRE(s3);
  // Flow reversal: none on type I (certified f' > 0), certified on type III (f'(0) < 0).
  CHECK(s1->structure.reversal == arith::Tri::no);
  CHECK(s3->structure.reversal == arith::Tri::yes);
  // Type II: f' > 0 on [0, eta1] and f'' < 0 on [eta1, 1] certified, so no reversal either.
  CHECK(s2->structure.reversal == arith::Tri::no);
  // Independent reference (Odeint + Multiprecision shooting, shares no code with the verifier).
  const auto r1 = berman_type1_reference("20");
  CHECK(meets(r1.fp0, s1->fp0));
  CHECK(meets(r1.K, s1->K));
  const auto r2 = berman_reference_from("20", s2->fp0.lo_d, s2->fppp0.lo_d);
  CHECK(meets(r2.fp0, s2->fp0));
  CHECK(meets(r2.fpp1, s2->fpp1));
  const auto r3 = berman_reference_from("20", s3->fp0.lo_d, s3->fppp0.lo_d);
  CHECK(meets(r3.fp0, s3->fp0));
  CHECK(meets(r3.K, s3->K));
}

TEST_CASE("below the fold (R = 11; fold near 12.165, Robinson 1976 from memory) the search finds one solution") {
  proof::CertifyRequest q;
  q.R_lo = q.R_hi = "11";
  const auto b = proof::certify_branches(q);
  REQUIRE(b.solutions.size() == 1);
  CHECK(b.solutions[0].certified);
  CHECK(b.solutions[0].structure.label == "I");
  CHECK(b.region.find("grid") != std::string::npos);  // the searched region is stated
}

TEST_CASE("R = 100: types I, II by the reduced method and type III by its eps = -1 chart, disjoint") {
  // Above the Chebyshev search (kSearchUpToR) all three come from the reduced method (docs/method.md
  // §S, (S13)-(S15) for type III); the labels are certified structure, the disjointness from enclosures.
  const Three t = three_at("100");
  const auto& b = t.b;
  const auto *s1 = t.s1, *s2 = t.s2, *s3 = t.s3;
  REQUIRE(s1);
  REQUIRE(s2);
  REQUIRE(s3);
  for (const auto* s : {s1, s2, s3}) CHECK(s->method == "reduced-ivp");
  CHECK(proof::distinct(*s1, *s3) == arith::Tri::yes);
  CHECK(proof::distinct(*s2, *s3) == arith::Tri::yes);
  CHECK(s3->fp0.hi_d < 0);  // reversed centre-plane flow, certified
  CHECK(s3->structure.reversal == arith::Tri::yes);
  CHECK(b.region.find("not searched") == std::string::npos);
  CHECK(b.region.find("type III") != std::string::npos);  // what was searched for type III is stated
}

TEST_CASE("sign cover never claims a sign it cannot prove") {
  // g(η) = η − 1/2 with error 0.01: negative on [0, 0.49), positive on (0.51, 1], unsure between.
  cheb::Series<arith::Id> g = {arith::Id(0), arith::Id(0.5)};  // (1/2)(2η − 1)
  const auto c = proof::sign_cover(g, 0.01, 0.0, 1.0, 1e-4);
  for (const auto& s : c.positive) CHECK(s.first > 0.51 - 1e-4);
  for (const auto& s : c.negative) CHECK(s.second < 0.49 + 1e-4);
  CHECK(!c.unsure.empty());
}
