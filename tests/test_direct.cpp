// Direct Banach contraction about φ = (3η − η³)/2 (docs/method.md D1–D14).
// Reference values: Berman 1953 (small-R series K = −3 + (81/35)R); "reported for the direct
// method about the Stokes profile": |R| below about 0.27; and our own shooting solution of the
// BVP (mpmath odefun Taylor integrator + findroot, 30 digits), values rounded to 14 digits.
#include <doctest/doctest.h>

#include <cmath>
#include <stdexcept>
#include <string>

#include "arith/interval.hpp"
#include "proof/direct.hpp"

using porecert::arith::Id;
using porecert::arith::Tri;
namespace bn = boost::numeric;
namespace pp = porecert::proof;

namespace {
Id dec(const char* s) { return porecert::arith::from_decimal<Id>(s); }
Id value(const pp::DirectResult& r, const std::string& name) {
  for (const auto& v : r.values)
    if (v.name == name) return v.enclosure;
  FAIL("no value " << name);
  return Id(0);
}
}  // namespace

TEST_CASE("direct: certified at R = 0.27 and R = -0.27 with the default weights") {
  for (const char* R : {"0.27", "-0.27"}) {
    CAPTURE(R);
    const auto r = pp::certify_direct(dec(R));
    CHECK(r.certified);
    CHECK(r.reason.empty());
    REQUIRE(r.inequalities.size() == 6);  // 4 self-map, contraction at r, contraction at r_u
    for (const auto& q : r.inequalities) {
      CAPTURE(q.name);
      CHECK(q.holds == Tri::yes);
      CHECK(q.margin.lower() > 0);
      CHECK(q.lhs.upper() < q.rhs.lower() + (q.strict ? 0.0 : 1e-300));
    }
    CHECK(r.radius > 0);
    CHECK(r.uniqueness_radius > r.radius);
    for (int k = 0; k < 4; ++k) CHECK(r.error_bounds[k] >= r.radius / r.weights[k]);
  }
  // One certificate for the whole interval [−0.27, 0.27].
  CHECK(pp::certify_direct(Id(dec("-0.27").lower(), dec("0.27").upper())).certified);
}

TEST_CASE("direct: certified enclosures contain the shooting solution") {
  struct Ref {
    const char* R;
    double fp0, fppp0, fpp1, K;
  };
  const Ref refs[] = {{"1e-3", 1.49999285659938, -2.99993571022247, -3.00008572403296, -2.99768573165262},
                      {"0.27", 1.49803126136939, -2.98234336694621, -3.02386942050554, -2.37643699873542},
                      {"-0.27", 1.50188949929474, -3.01706423611329, -2.97755208771412, -3.62609569449808}};
  for (const Ref& x : refs) {
    CAPTURE(x.R);
    const auto r = pp::certify_direct(dec(x.R));
    REQUIRE(r.certified);
    CHECK(bn::in(x.fp0, value(r, "f'(0)")));
    CHECK(bn::in(x.fppp0, value(r, "f'''(0)")));
    CHECK(bn::in(x.fpp1, value(r, "f''(1)")));
    CHECK(bn::in(x.K, value(r, "K")));
  }
}

TEST_CASE("direct: K at R = 1e-3 lies within the small-R series -3 + (81/35) R +- 1e-5 (Berman 1953)") {
  const Id R = dec("1e-3");
  const auto r = pp::certify_direct(R);
  REQUIRE(r.certified);
  const Id series = Id(-3) + Id(81) / Id(35) * R;
  const Id K = value(r, "K");
  CHECK(bn::subset(K, series + Id(-1e-5, 1e-5)));
  // Without the R f'(0)² term, or about φ alone, K would be near −3 ± r: the enclosure is narrow.
  CHECK(bn::width(K) < 1e-5);
}

TEST_CASE("direct: not certified at R = 5, with the failing inequality and its amount") {
  const auto r = pp::certify_direct(dec("5"));
  CHECK_FALSE(r.certified);
  CHECK(r.reason.find("fails") != std::string::npos);
  CHECK(r.reason.find("too large") != std::string::npos);
  bool some_no = false;
  for (const auto& q : r.inequalities)
    if (q.holds == Tri::no) {
      some_no = true;
      CHECK(q.margin.upper() < 0);
    }
  CHECK(some_no);
  CHECK(r.values.empty());
  const auto j = pp::to_json(r);
  CHECK(j["status"] == "not certified");
  CHECK(j["values"].is_null());
  CHECK(pp::direct_exit_code(j) == 1);
  CHECK(pp::direct_exit_code(r) == 1);
}

TEST_CASE("direct: certified ranges with default and optimised weights (docs/method.md D14)") {
  // Default weights: [0, 1.125] and [−1.125, 0]; 1.13 is out of reach.
  CHECK(pp::certify_direct(Id(0, dec("1.125").upper())).certified);
  CHECK(pp::certify_direct(Id(dec("-1.125").lower(), 0)).certified);
  CHECK_FALSE(pp::certify_direct(dec("1.13")).certified);
  // Optimised weights: [−1.132, 1.132].
  pp::DirectOptions opt;
  opt.weights = pp::optimised_direct_weights();
  CHECK(pp::certify_direct(Id(dec("-1.132").lower(), dec("1.132").upper()), opt).certified);
  CHECK_FALSE(pp::certify_direct(dec("1.134"), opt).certified);
  // Unit weights (the plain C³ max norm) do not reach the reported 0.27: the weights matter.
  opt.weights = {1, 1, 1, 1};
  CHECK(pp::certify_direct(dec("0.16"), opt).certified);
  CHECK_FALSE(pp::certify_direct(dec("0.27"), opt).certified);
  // The reach search agrees.
  const auto reach = pp::direct_reach(1, pp::default_direct_weights(), 4);
  CHECK(reach.R1 == "1.125");
  CHECK(reach.check.certified);
}

TEST_CASE("direct: the weight search improves on the defaults (non-rigorous objective)") {
  const auto w = pp::optimise_direct_weights(pp::default_direct_weights(), 300);
  CHECK(w[3] == 1.0);
  CHECK(pp::direct_feasible_R(w) > pp::direct_feasible_R(pp::default_direct_weights()));
  CHECK(pp::direct_feasible_R(pp::optimised_direct_weights()) > 1.1326);
}

TEST_CASE("direct: JSON certificate layout") {
  const auto j = pp::certify_direct_json(dec("0.27"));
  CHECK(j["status"] == "certified");
  CHECK(j["method"] == "direct");
  CHECK(j["R"].size() == 2);
  CHECK(dec(j["R"][0].get<std::string>().c_str()).lower() <= 0.27);
  CHECK(j["existence_radius"].is_string());
  CHECK(j["uniqueness_radius"].is_string());
  CHECK(j["space"]["weights"] == nlohmann::json::array({"115", "30", "5", "1"}));
  REQUIRE(j["error_bounds"].size() == 4);
  for (const char* k : {"f'(0)", "f'''(0)", "f''(1)", "K"}) CHECK(j["values"][k].size() == 2);
  CHECK(j["inequalities"].size() == 6);
  CHECK(j["inequalities"][0]["holds"] == "yes");
  CHECK(j["uniqueness"].get<std::string>().find("C^3") != std::string::npos);
  CHECK(pp::direct_exit_code(j) == 0);
  // The decimal strings are outward: r ≤ existence_radius, uniqueness_radius ≤ r_u.
  const auto r = pp::certify_direct(dec("0.27"));
  CHECK(dec(j["existence_radius"].get<std::string>().c_str()).upper() >= r.radius);
  CHECK(dec(j["uniqueness_radius"].get<std::string>().c_str()).lower() <= r.uniqueness_radius);
}

TEST_CASE("direct: constants and input checks") {
  const auto r = pp::certify_direct(Id(0));
  CHECK(r.certified);
  CHECK(r.radius == 0);
  CHECK(std::isinf(r.uniqueness_radius));
  // Sup norms of φ⁽ᵏ⁾ (exact: 1, 3/2, 3, 3) and ‖v'''‖ = 192/280 at η = 1.
  const double phis[4] = {1, 1.5, 3, 3};
  for (int k = 0; k < 4; ++k) CHECK(bn::in(phis[k], r.phi_sup[k]));
  CHECK(bn::subset(Id(192) / Id(280), r.v_sup[3]));
  CHECK(bn::width(r.v_sup[0]) < 1e-15);
  pp::DirectOptions bad;
  bad.weights = {1, 0, 1, 1};
  CHECK_THROWS_AS(pp::certify_direct(dec("0.1"), bad), std::invalid_argument);
  bad.weights = pp::default_direct_weights();
  bad.radius = -1.0;
  CHECK_THROWS_AS(pp::certify_direct(dec("0.1"), bad), std::invalid_argument);
  // A user-chosen radius that is too small fails the self-map, with the reason.
  pp::DirectOptions small;
  small.radius = 1e-3;
  const auto s = pp::certify_direct(dec("0.27"), small);
  CHECK_FALSE(s.certified);
  CHECK(s.reason.find("self-map") != std::string::npos);
}
