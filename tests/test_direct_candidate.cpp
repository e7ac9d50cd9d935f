// Direct contraction about a candidate (lib/proof/direct_candidate.hpp, docs/method.md D15–D25).
// Sources of the checks: the independent shooting solver tests/reference/berman_shooting.hpp (Odeint +
// Multiprecision, no shared code); the Newton–Kantorovich certificate (lib/proof/certify.hpp), whose
// enclosures are rigorous too, so the two must overlap; the exact residual v = G N(φ) = (−η⁷ + 3η³ − 2η)/280 (D4).
#include <doctest/doctest.h>

#include <cmath>
#include <map>
#include <string>

#include "arith/interval.hpp"
#include "proof/certify.hpp"
#include "proof/direct.hpp"
#include "proof/direct_candidate.hpp"
#include "reference/berman_shooting.hpp"

namespace pp = porecert::proof;
namespace bn = boost::numeric;
using porecert::arith::Id;
using porecert::arith::Tri;

namespace {

Id dec(const std::string& s) { return porecert::arith::from_decimal<Id>(s); }

Id value(const pp::DirectCandidateResult& r, const std::string& name) {
  for (const auto& v : r.values)
    if (v.name == name) return v.enclosure;
  FAIL("no value " << name);
  return Id(0);
}

// The reference solves are the slow part: one per R.
const BermanReference& reference(const std::string& R) {
  static std::map<std::string, BermanReference> cache;
  auto it = cache.find(R);
  if (it == cache.end()) it = cache.emplace(R, berman_type1_reference(R)).first;
  return it->second;
}

pp::CertifyOutcome newton_at(const std::string& R) {
  pp::CertifyRequest req;
  req.R_lo = req.R_hi = R;
  return pp::certify_berman(req);
}

// φ = (3η − η³)/2 in the Newton layout: f'(0) = 3/2, K unused, f''' = −3 (antiderivatives: not exact).
const std::vector<std::string> kPhi = {"0x1.8p+0", "0", "-3"};
// φ exactly, from η = (1 + x)/2, η³ = (5 T_0 + 15/2 T_1 + 3 T_2 + 1/2 T_3)/16: (19/32, 33/64, −3/32, −1/64).
const pp::IdSeries kPhiExact = {Id(19.0 / 32), Id(33.0 / 64), Id(-3.0 / 32), Id(-1.0 / 64)};
// and φ' = 3/2 − 3η²/2, φ'' = −3η, φ''' = −3 the same way (η² = (3 T_0 + 4 T_1 + T_2)/8).
const std::array<pp::IdSeries, 4> kPhiChain = {kPhiExact, pp::IdSeries{Id(15.0 / 16), Id(-0.75), Id(-3.0 / 16)},
                                               pp::IdSeries{Id(-1.5), Id(-1.5)}, pp::IdSeries{Id(-3)}};

void check_contains_reference(const pp::DirectCandidateResult& r, const BermanReference& ref) {
  CHECK(bn::subset(dec(ref.fp0), value(r, "f'(0)")));
  CHECK(bn::subset(dec(ref.fppp0), value(r, "f'''(0)")));
  CHECK(bn::subset(dec(ref.fpp1), value(r, "f''(1)")));
  CHECK(bn::subset(dec(ref.K), value(r, "K")));
}

}  // namespace

TEST_CASE(
    "direct about a Newton candidate closes at R = 0.5, 1, -1; enclosures overlap Newton's and hold the reference") {
  for (const char* R : {"0.5", "1", "-1"}) {
    CAPTURE(R);
    const auto o = newton_at(R);
    REQUIRE(o.certified);
    const auto u = pp::c3_uniqueness_from_newton(o, dec(R));
    REQUIRE(u.attempted);
    const auto& d = u.direct;
    REQUIRE(d.certified);
    CHECK(d.reason.empty());
    for (const auto& q : d.inequalities) {
      CAPTURE(q.name);
      CHECK(q.holds == Tri::yes);
      CHECK(q.margin.lower() >= 0);
    }
    // A Galerkin candidate with tiny residual: defect and ball are tiny, uniqueness radius is O(1).
    for (int k = 0; k < 4; ++k) CHECK(d.defect[k] < 1e-9);
    CHECK(d.radius > 0);
    CHECK(d.radius < 1e-8);
    CHECK(d.uniqueness_radius > 0.1);
    CHECK(d.kappa.upper() < 1);
    CHECK(u.newton_solution_is_it);
    CHECK(u.statement.find("exactly one solution") != std::string::npos);
    // Both proofs are rigorous: their enclosures of the same solution must intersect.
    CHECK(bn::overlap(value(d, "f'(0)"), o.fp0_id));
    CHECK(bn::overlap(value(d, "f'''(0)"), o.fppp0_id));
    CHECK(bn::overlap(value(d, "f''(1)"), o.fpp1_id));
    CHECK(bn::overlap(value(d, "K"), o.K_id));
    for (const auto& v : d.values) CHECK(bn::width(v.enclosure) < 1e-8);
    check_contains_reference(d, reference(R));
    const auto j = pp::to_json(u);
    CHECK(j["status"] == "certified");
    CHECK(j["inequalities"].size() == 6);
    CHECK(j["statement"].get<std::string>() == u.statement);
  }
}

TEST_CASE("direct about phi at R = 0: the defect is exactly zero, rho = 0, uniqueness everywhere") {
  const auto r = pp::certify_direct_about(kPhiChain, Id(0));
  REQUIRE(r.certified);
  for (int k = 0; k < 4; ++k) {
    CHECK(r.defect[k] == 0);
    CHECK(bn::singleton(r.bc_residual[k]));
    CHECK(r.bc_residual[k].lower() == 0);
  }
  CHECK(r.radius == 0);
  CHECK(std::isinf(r.uniqueness_radius));
  CHECK(value(r, "f'(0)").lower() == 1.5);
  CHECK(value(r, "f'(0)").upper() == 1.5);
  CHECK(bn::in(-3.0, value(r, "K")));
  CHECK(bn::width(value(r, "K")) == 0);
  // From the series alone (derivatives by cheb::derivative, multiplications step outward): rounding-size defect.
  const auto s = pp::certify_direct_about(kPhiExact, Id(0));
  REQUIRE(s.certified);
  for (int k = 0; k < 4; ++k) CHECK(s.defect[k] < 1e-14);
  CHECK(bn::in(1.5, value(s, "f'(0)")));
}

TEST_CASE("direct about phi at R = 0.5: the defect is R v of D4 (an independent closed form)") {
  // T(φ) − φ = R G N(φ) = R v exactly; certify_direct computes V_k = ||v^(k)|| from the closed form.
  const auto phi = pp::certify_direct(dec("0.5"));
  const auto r = pp::certify_direct_about(pp::newton_candidate_chain(kPhi), dec("0.5"));
  for (int k = 0; k < 4; ++k) {
    CAPTURE(k);
    const double Vk = (dec("0.5") * phi.v_sup[k]).lower();
    CHECK(r.defect[k] >= Vk);
    CHECK(r.defect[k] <= Vk * 1.002);
  }
  // About φ the candidate route must also close and hold the reference (direct about φ closes to 1.125).
  REQUIRE(r.certified);
  check_contains_reference(r, reference("0.5"));
}

TEST_CASE(
    "a perturbed candidate gives a larger ball that still holds the reference, or fails; never a false enclosure") {
  const auto o = newton_at("1");
  REQUIRE(o.certified);
  const auto base = pp::certify_direct_about(pp::newton_candidate_chain(o.candidate_hex), Id(1));
  REQUIRE(base.certified);
  const auto ref = reference("1");
  // Shifts of u_1, u_2, u_3 (indices 3, 4, 5) leave the span of {η, η³}: a genuinely worse centre.
  for (int which : {3, 4, 5}) {
    CAPTURE(which);
    auto hex = o.candidate_hex;
    hex[which] = porecert::arith::hex_exact(dec(hex[which]).lower() + 1e-3);
    const auto r = pp::certify_direct_about(pp::newton_candidate_chain(hex), Id(1));
    if (!r.certified) {
      CHECK(!r.reason.empty());
      continue;
    }
    CHECK(r.radius > 1e3 * base.radius);
    CHECK(std::max({r.defect[0], r.defect[1], r.defect[2], r.defect[3]}) > 1e-6);
    check_contains_reference(r, ref);
  }
  // Shifts of f'(0) or u_0 add c η or c η³: the boundary cubic p (D15) removes them, so the ball stays
  // tiny; K does not enter f̄ at all. Both must still hold the reference.
  for (int which : {0, 1, 2}) {
    CAPTURE(which);
    auto hex = o.candidate_hex;
    hex[which] = porecert::arith::hex_exact(dec(hex[which]).lower() + 1e-3);
    const auto r = pp::certify_direct_about(pp::newton_candidate_chain(hex), Id(1));
    REQUIRE(r.certified);
    CHECK(r.radius < 1e3 * base.radius);
    if (which == 1)
      CHECK(r.radius == base.radius);
    else
      CHECK(r.correction_sup[1] > 1e-4);
    check_contains_reference(r, ref);
  }
}

TEST_CASE("direct about a candidate fails honestly for large |R| and for an uncertified Newton outcome") {
  const auto o = newton_at("4");
  REQUIRE(o.certified);
  const auto u = pp::c3_uniqueness_from_newton(o, dec("4"));
  REQUIRE(u.attempted);
  CHECK_FALSE(u.direct.certified);
  CHECK(u.direct.reason.find("too large") != std::string::npos);
  CHECK(u.direct.values.empty());
  bool some_no = false;
  for (const auto& q : u.direct.inequalities) some_no = some_no || q.holds == Tri::no;
  CHECK(some_no);
  CHECK(pp::to_json(u)["status"] == "not certified");

  pp::CertifyOutcome none;
  const auto v = pp::c3_uniqueness_from_newton(none, Id(1));
  CHECK_FALSE(v.attempted);
  CHECK(pp::to_json(v)["status"] == "not attempted");
  CHECK_THROWS_AS(pp::certify_direct_about(pp::IdSeries{}, Id(1)), std::invalid_argument);
  pp::DirectCandidateOptions bad;
  bad.weights[2] = -1;
  CHECK_THROWS_AS(pp::certify_direct_about(pp::newton_candidate_chain(kPhi), Id(1), bad), std::invalid_argument);
}

TEST_CASE("an interval of R about one candidate, and a radius that is too small") {
  const auto o = newton_at("0.5");
  REQUIRE(o.certified);
  const auto chain = pp::newton_candidate_chain(o.candidate_hex);
  // For every R in [0.49, 0.51]: the defect now holds (R − 0.5) G N(f~), the ball is ~1e-2 wide.
  const Id R = bn::hull(dec("0.49"), dec("0.51"));
  const auto r = pp::certify_direct_about(chain, R);
  REQUIRE(r.certified);
  CHECK(r.radius > 1e-4);
  for (const char* x : {"0.49", "0.51"}) {
    CAPTURE(x);
    check_contains_reference(r, reference(x));
  }
  // ρ = 0 cannot hold: the defect is not zero (rounding of the candidate), so self-map fails.
  pp::DirectCandidateOptions zero;
  zero.radius = 0.0;
  const auto z = pp::certify_direct_about(chain, dec("0.5"), zero);
  CHECK_FALSE(z.certified);
  CHECK(z.reason.find("self-map") != std::string::npos);
  CHECK(z.values.empty());
}
