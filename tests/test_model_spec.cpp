// Model specs (docs/models.md): the factory, input checks, and the variants through the whole
// certification driver (proof::certify_berman with CertifyRequest::model).
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "model/case_file.hpp"
#include "model/model_spec.hpp"
#include "proof/branches.hpp"
#include "proof/certify.hpp"

using namespace porecert;
using arith::Id;

namespace {
model::ModelSpec spec(const std::string& name, std::vector<std::pair<std::string, std::string>> p = {}) {
  return model::checked(model::ModelSpec{name, std::move(p)});
}
proof::CertifyOutcome run(const model::ModelSpec& s, const std::string& R) {
  proof::CertifyRequest req;
  req.R_lo = req.R_hi = R;
  req.model = s;
  return proof::certify_berman(req);
}
const proof::NamedValue& value(const proof::CertifyOutcome& o, const std::string& key) {
  for (const auto& v : o.values)
    if (v.key == key) return v;
  FAIL("no value " << key);
  return o.values.front();
}
bool overlap(const proof::NamedValue& a, const proof::NamedValue& b) { return boost::numeric::overlap(a.id, b.id); }
double width(const proof::NamedValue& a) { return arith::width_up(a.id); }
}  // namespace

TEST_CASE("model specs: bad input names the option, the value and the rule") {
  auto msg = [](model::ModelSpec s) {
    try {
      model::checked(s);
    } catch (const model::input_error& e) {
      return std::string(e.what());
    }
    return std::string();
  };
  CHECK(msg({"tube", {}}).find("--model: 'tube'") != std::string::npos);
  CHECK(msg({"mhd", {}}).find("--hartmann: missing") != std::string::npos);
  CHECK(msg({"mhd", {{"hartmann", "-1"}}}).find("0 <= M <= 100") != std::string::npos);
  CHECK(msg({"mhd", {{"hartmann", "nan"}}}).find("--hartmann") != std::string::npos);
  CHECK(msg({"full-channel", {{"slip", "0.1"}}}).find("--slip: not a parameter") != std::string::npos);
  CHECK(msg({"berman", {{"expansion", "1"}}}).find("--expansion") != std::string::npos);
  CHECK(model::checked({"full-channel", {}}).get("wall-ratio", "") == "1");  // default a = 1
  CHECK(model::ModelSpec{}.is_berman());
  CHECK(model::build_model<double>(model::ModelSpec{}, 1.0).id == "berman-half-channel");
}

TEST_CASE("each half-channel variant at zero parameter is Berman (R = -4, 3, 9; enclosures overlap)") {
  for (const char* R : {"-4", "3", "9"}) {
    const auto b = run(model::ModelSpec{}, R);
    REQUIRE(b.certified);
    for (const auto& s : {spec("mhd", {{"hartmann", "0"}}), spec("moving-walls", {{"expansion", "0"}}),
                          spec("slip", {{"slip", "0"}})}) {
      CAPTURE(R);
      CAPTURE(s.name);
      const auto v = run(s, R);
      REQUIRE(v.certified);
      CHECK(v.model_id != b.model_id);  // really the variant's model object
      for (const char* k : {"f'(0)", "f'''(0)", "f''(1)", "K"}) {
        CHECK(overlap(value(v, k), value(b, k)));
        CHECK(width(value(v, k)) < 1e-10);
      }
    }
  }
}

TEST_CASE("full channel, a = 1: the symmetric solution is the half-channel one (R = -4, 2, 5, 9)") {
  for (const char* R : {"-4", "2", "5", "9"}) {
    CAPTURE(R);
    const auto h = run(model::ModelSpec{}, R), f = run(spec("full-channel", {{"wall-ratio", "1"}}), R);
    REQUIRE(h.certified);
    REQUIRE(f.certified);
    for (const char* k : {"f'(0)", "f'''(0)", "f''(1)", "K"}) {
      CHECK(overlap(value(f, k), value(h, k)));
      CHECK(width(value(f, k)) < 1e-9);
    }
    // Odd profile: f''(-1) = -f''(1).
    CHECK(boost::numeric::overlap(value(f, "f''(-1)").id, -value(h, "f''(1)").id));
  }
}

TEST_CASE("full channel at R = 0: f = (1-a)/2 + (1+a)(3 eta - eta^3)/4 (derived, docs/models.md (V1.4))") {
  for (const char* a : {"0.5", "0", "-0.25"}) {
    CAPTURE(a);
    const auto o = run(spec("full-channel", {{"wall-ratio", a}}), "0");
    REQUIRE(o.certified);
    const Id A = arith::from_decimal<Id>(a), s = (Id(1) + A) * Id(3) / Id(2);
    CHECK(boost::numeric::overlap(value(o, "K").id, -s));
    CHECK(boost::numeric::overlap(value(o, "f''(1)").id, -s));
    CHECK(boost::numeric::overlap(value(o, "f''(-1)").id, s));
    CHECK(boost::numeric::overlap(value(o, "f'(0)").id, s / Id(2)));
    CHECK(width(value(o, "K")) < 1e-12);
  }
}

TEST_CASE("full channel, a = 1, R = 10: three certified solutions, two asymmetric mirror images") {
  proof::CertifyRequest req;
  req.R_lo = req.R_hi = "10";
  req.model = spec("full-channel");
  const auto b = proof::certify_branches(req);
  REQUIRE(b.solutions.size() == 3);
  CHECK(b.pairwise_disjoint);
  int symmetric = 0;
  for (const auto& s : b.solutions) {
    REQUIRE(s.certified);
    const bool sym = boost::numeric::overlap(value(s, "f''(-1)").id, -value(s, "f''(1)").id);
    symmetric += sym ? 1 : 0;
    if (!sym)  // certified asymmetric: |f''(-1)| != |f''(1)| with disjoint enclosures
      CHECK(arith::tri_disjoint(value(s, "f''(-1)").id, -value(s, "f''(1)").id) == arith::Tri::yes);
  }
  CHECK(symmetric == 1);
  // The asymmetric pair: f~(eta) = -f(-eta) maps one onto the other.
  const proof::CertifyOutcome *p = nullptr, *q = nullptr;
  for (const auto& s : b.solutions)
    if (!boost::numeric::overlap(value(s, "f''(-1)").id, -value(s, "f''(1)").id)) (p ? q : p) = &s;
  REQUIRE(q);
  CHECK(boost::numeric::overlap(value(*p, "f''(1)").id, -value(*q, "f''(-1)").id));
  CHECK(boost::numeric::overlap(value(*p, "K").id, value(*q, "K").id));
}

TEST_CASE("slip at R = 0 through the driver: K = -3/(1 + 3 beta), f'(0) = (3 + 6 beta)/(2 + 6 beta) (derived)") {
  for (const char* b : {"0.1", "1"}) {
    const auto o = run(spec("slip", {{"slip", b}}), "0");
    REQUIRE(o.certified);
    const Id beta = arith::from_decimal<Id>(b);
    CHECK(boost::numeric::overlap(value(o, "K").id, Id(-3) / (Id(1) + Id(3) * beta)));
    CHECK(boost::numeric::overlap(value(o, "f'(0)").id, (Id(3) + Id(6) * beta) / (Id(2) + Id(6) * beta)));
  }
}

TEST_CASE("MHD at R = 0 through the driver: K = M^3 cosh M / (sinh M - M cosh M) (derived; libm reference)") {
  const double M = 3.0;
  const auto o = run(spec("mhd", {{"hartmann", "3"}}), "0");
  REQUIRE(o.certified);
  const double B = 1.0 / (std::sinh(M) - M * std::cosh(M));
  // libm values are not rigorous: compared with a tolerance far above their error.
  CHECK(std::fabs(arith::mid_double(value(o, "K").id) - M * M * M * std::cosh(M) * B) < 1e-11);
  CHECK(std::fabs(arith::mid_double(value(o, "f''(1)").id) - B * M * M * std::sinh(M)) < 1e-11);
}

TEST_CASE("moving walls at R = 0: dK/dalpha = 9/5, df''(1)/dalpha = 4/5, df'(0)/dalpha = 1/10 (derived, (V3.4))") {
  // Central differences of certified enclosures at alpha = +-h: error O(h^2) (third derivative of
  // a smooth function of alpha); the tolerance 1e-4 is far above it and far below the coefficients.
  const double h = 1e-3;
  const auto p = run(spec("moving-walls", {{"expansion", "0.001"}}), "0");
  const auto m = run(spec("moving-walls", {{"expansion", "-0.001"}}), "0");
  REQUIRE(p.certified);
  REQUIRE(m.certified);
  auto d = [&](const char* k) {
    return (arith::mid_double(value(p, k).id) - arith::mid_double(value(m, k).id)) / (2 * h);
  };
  CHECK(std::fabs(d("K") - 1.8) < 1e-4);
  CHECK(std::fabs(d("f''(1)") - 0.8) < 1e-4);
  CHECK(std::fabs(d("f'(0)") - 0.1) < 1e-4);
  // And it matters: at alpha = 0.001 K is not Berman's -3.
  CHECK(!boost::numeric::in(-3.0, value(p, "K").id));
}
