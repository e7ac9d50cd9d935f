// The porous pipe (--model pipe, docs/models.md §2): Taylor-basis proof checked against the exact
// R = 0 solution (Hagen–Poiseuille), the derived small-R series (V2.3), an independent shooting
// reference (tests/reference/pipe_shooting.hpp, shares no code with lib/), negative cases and the CLI.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <nlohmann/json.hpp>
#include <regex>
#include <string>
#include <vector>

#include "arith/fp_env.hpp"
#include "candidate/taylor_newton.hpp"
#include "model/pipe.hpp"
#include "model/taylor_operator.hpp"
#include "proof/certify.hpp"
#include "proof/taylor_certify.hpp"
#include "proof/taylor_nk.hpp"
#include "reference/pipe_shooting.hpp"
#include "support/run_cli.hpp"

using namespace porecert;
using arith::Id;

namespace {

struct Certified {
  proof::TaylorNKResult r;
  Id fp0, fpp0, fpp1, K;
};

std::vector<double> candidate_at(double R) {
  auto c = candidate::taylor_continuation([](double r) { return model::pipe<double>(r); }, R, 1600);
  REQUIRE(c.converged);
  return c.x;
}

Certified prove_at(const Id& R, const std::vector<double>& x) {
  const arith::FpEnvScope fp_env;
  const auto m = model::pipe<Id>(R);
  const std::vector<Id> xb(x.begin(), x.end());
  Certified c;
  c.r = proof::taylor_nk_verify(m, xb);
  if (!c.r.certified) return c;
  c.fp0 = proof::taylor_value(m, xb, c.r, m.values[0]);
  c.fpp0 = proof::taylor_value(m, xb, c.r, m.values[1]);
  c.fpp1 = proof::taylor_value(m, xb, c.r, m.values[2]);
  c.K = proof::taylor_value(m, xb, c.r, m.values[3]);
  return c;
}

bool inside(double v, const Id& e) { return e.lower() <= v && v <= e.upper(); }

}  // namespace

TEST_CASE("R = 0: F = 2 xi - xi^2, K = -2 (Hagen-Poiseuille, exact)") {
  // The exact solution written by hand in the layout [F'(0), K, u_0, ...]: u = xi F''' + F'' = -2.
  std::vector<double> x(2 + 12, 0.0);
  x[0] = 2;
  x[1] = -2;
  x[2] = -2;
  const Certified c = prove_at(Id(0), x);
  REQUIRE(c.r.certified);
  CHECK(c.r.bounds.Y0 < 1e-300);  // exact candidate: only the underflow term of the matrix product remains
  CHECK(inside(2, c.fp0));
  CHECK(inside(-2, c.fpp0));
  CHECK(inside(-2, c.fpp1));
  CHECK(inside(-2, c.K));
  CHECK(arith::width_up(c.K) < 1e-14);
  // The candidate solver finds the same polynomial.
  const auto xs = candidate_at(0);
  CHECK(xs[0] == doctest::Approx(2).epsilon(1e-15));
  CHECK(xs[1] == doctest::Approx(-2).epsilon(1e-15));
  for (std::size_t k = 3; k < xs.size(); ++k) CHECK(std::fabs(xs[k]) < 1e-15);
  // K = F''(0) + (R/2) F'(0)^2 (derived, docs/models.md §2) at R = 0 is F''(0).
  CHECK(boost::numeric::overlap(c.K, c.fpp0));
}

TEST_CASE("small R: K = -2 + 3R/2, F'(0) = 2 + R/9, F''(1) = -2 + R/6 + O(R^2) (V2.3, derived)") {
  const double h = 0.01;
  const Id Rp = arith::from_decimal<Id>("0.01"), Rm = arith::from_decimal<Id>("-0.01");
  const Certified p = prove_at(Rp, candidate_at(h)), m = prove_at(Rm, candidate_at(-h));
  REQUIRE(p.r.certified);
  REQUIRE(m.r.certified);
  // Whole enclosures within R^2 of the first-order series: the O(R^2) coefficients measured here are
  // below 0.1 (a tolerance, not a bound); a sign error in a first-order term moves a value by
  // 2R/9 = 2.2e-3 or more, far outside 1e-4.
  const double tol = h * h;
  auto near = [&](const Id& e, double v) { return e.lower() >= v - tol && e.upper() <= v + tol; };
  CHECK(near(p.K, -2 + 1.5 * h));
  CHECK(near(m.K, -2 - 1.5 * h));
  CHECK(near(p.fp0, 2 + h / 9));
  CHECK(near(m.fp0, 2 - h / 9));
  CHECK(near(p.fpp1, -2 + h / 6));
  CHECK(near(m.fpp1, -2 - h / 6));
  // Central differences: the even O(R^2) terms cancel, the error is O(R^2) (tolerance 1e-3, common practice).
  auto slope = [&](const Id& a, const Id& b) { return (arith::mid_double(a) - arith::mid_double(b)) / (2 * h); };
  CHECK(std::fabs(slope(p.K, m.K) - 1.5) < 1e-3);
  CHECK(std::fabs(slope(p.fp0, m.fp0) - 1.0 / 9) < 1e-3);
  CHECK(std::fabs(slope(p.fpp1, m.fpp1) - 1.0 / 6) < 1e-3);
  // K = F''(0) + (R/2) F'(0)^2: K is an unknown of the proof, F''(0) and F'(0) are separate values.
  CHECK(boost::numeric::overlap(p.K, p.fpp0 + Rp / Id(2) * p.fp0 * p.fp0));
}

TEST_CASE("independent shooting reference lies inside the certified enclosures") {
  for (double R : {-20.0, -10.0, -4.0, -1.0, 0.5, 1.0, 2.0}) {
    CAPTURE(R);
    const pipe_ref::Solution s = pipe_ref::solve(R);
    REQUIRE(s.residual < 1e-14);
    const Certified c = prove_at(Id(R), candidate_at(R));
    REQUIRE(c.r.certified);
    CHECK(inside(s.fp0, c.fp0));
    CHECK(inside(s.fpp0, c.fpp0));
    CHECK(inside(s.fpp1, c.fpp1));
    CHECK(inside(s.K, c.K));
    CHECK(arith::width_up(c.K) < 1e-8);  // the enclosures are tight enough for this check to mean something
  }
}

TEST_CASE("a wrong candidate or a wrong R does not certify") {
  const auto x = candidate_at(-5);
  REQUIRE(prove_at(Id(-5), x).r.certified);
  // Same candidate, other R: not a near-zero of that problem.
  CHECK_FALSE(prove_at(Id(-4.9), x).r.certified);
  // Perturbed F'(0) and a perturbed Taylor coefficient.
  auto y = x;
  y[0] += 1e-3;
  CHECK_FALSE(prove_at(Id(-5), y).r.certified);
  y = x;
  y[2 + 5] += 1e-3;
  CHECK_FALSE(prove_at(Id(-5), y).r.certified);
  // The Berman equation in a Taylor basis is a different problem: F = 2 xi - xi^2 is no solution of
  // the pipe at R = 1, so the exact R = 0 candidate fails there.
  std::vector<double> z(2 + 12, 0.0);
  z[0] = 2;
  z[1] = -2;
  z[2] = -2;
  CHECK_FALSE(prove_at(Id(1), z).r.certified);
}

TEST_CASE("R given as an interval: one certificate for every R inside") {
  const Id R = boost::numeric::hull(arith::from_decimal<Id>("-3"), arith::from_decimal<Id>("-2.9999"));
  const Certified c = prove_at(R, candidate_at(-2.99995));
  REQUIRE(c.r.certified);
  for (double r : {-3.0, -2.9999}) {
    const pipe_ref::Solution s = pipe_ref::solve(r);
    CHECK(inside(s.K, c.K));
    CHECK(inside(s.fp0, c.fp0));
  }
}

TEST_CASE("through the driver and the command line: verify --model pipe, certificate, recheck") {
  using ::porecert::test::porecert_cli;
  using ::porecert::test::slurp;
  using ::porecert::test::spit;
  const std::string tmp = "/tmp/porecert-test-pipe";
  std::system(("mkdir -p " + tmp).c_str());
  const std::string path = tmp + "/pipe.json";
  auto r = porecert_cli("verify --model pipe --R=-4 --json " + path);
  REQUIRE(r.rc == 0);
  CHECK(r.out.find("CERTIFIED") != std::string::npos);
  const auto j = nlohmann::json::parse(slurp(path));
  CHECK(j["method"] == "taylor-newton-kantorovich");
  CHECK(j["problem"]["model"] == "porous-pipe");
  CHECK(j["status"] == "certified");
  const pipe_ref::Solution s = pipe_ref::solve(-4);
  auto num = [](const nlohmann::json& v) { return std::stod(v.get<std::string>()); };
  CHECK(num(j["values"]["K"][0]) <= s.K);
  CHECK(s.K <= num(j["values"]["K"][1]));
  CHECK(num(j["values"]["F''(1)"][0]) <= s.fpp1);
  CHECK(s.fpp1 <= num(j["values"]["F''(1)"][1]));
  CHECK(j["candidate"]["coefficients_hex"].size() == j["candidate"]["modes"].get<std::size_t>() + 2);
  r = porecert_cli("recheck " + path);
  CHECK(r.rc == 0);
  CHECK(r.out.find("CONFIRMED") != std::string::npos);
  // A stated K that excludes the re-proved one: rejected.
  auto bad = j;
  bad["values"]["K"] = {"-1", "-0.5"};
  spit(tmp + "/bad.json", bad.dump(2));
  r = porecert_cli("recheck " + tmp + "/bad.json");
  CHECK(r.rc == 1);
  CHECK(r.out.find("FAIL") != std::string::npos);
  // The stored candidate checked at another R: the proof does not go through.
  bad = j;
  bad["R"] = {"-3.5", "-3.5"};
  bad["problem"]["parameters"]["R"] = {"-3.5", "-3.5"};
  spit(tmp + "/otherR.json", bad.dump(2));
  r = porecert_cli("recheck " + tmp + "/otherR.json");
  CHECK(r.rc == 1);
  CHECK(r.out.find("REJECTED") != std::string::npos);
  // Bad input names the option and the rule, exit 2.
  r = porecert_cli("verify --model pipe --R=1 --start=1,2");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--start") != std::string::npos);
  // A case file naming the pipe: certified from flow.reynolds; with [channel] (dimensional results
  // of the channel models) refused.
  spit(tmp + "/pipe.toml", "[model]\nname = \"pipe\"\n[flow]\nreynolds = \"-3\"\n");
  r = porecert_cli("verify " + tmp + "/pipe.toml");
  CHECK(r.rc == 0);
  CHECK(r.out.find("porous pipe") != std::string::npos);
  spit(tmp + "/pipe-channel.toml",
       "[model]\nname = \"pipe\"\n[channel]\nhalf_width = \"10 mm\"\nwall_velocity = \"-0.15 m/s\"\n"
       "kinematic_viscosity = \"1.5e-5 m^2/s\"\ndensity = \"1.2 kg/m^3\"\nmean_inlet_velocity = \"0 m/s\"\n"
       "axial_position = \"150 mm\"\n");
  r = porecert_cli("verify " + tmp + "/pipe-channel.toml");
  CHECK(r.rc == 2);
  CHECK(r.out.find("[channel]") != std::string::npos);
  r = porecert_cli("verify --model pipe --R=1 --hartmann 2");
  CHECK(r.rc == 2);
  // report, sweep and branches take the pipe (tests/test_cli_models.cpp checks what they certify).
  r = porecert_cli("report " + path + " --html " + tmp + "/page.html");
  CHECK(r.rc == 0);
  r = porecert_cli("sweep --model pipe --R=1:1.1 --branch II");  // types II/III are Berman's
  CHECK(r.rc == 2);
  CHECK(r.out.find("--branch") != std::string::npos);
  r = porecert_cli("branches --model pipe --R=1");
  CHECK(r.rc == 0);
  CHECK(r.out.find("no search") != std::string::npos);
  // Beyond the fold of the branch from R = 0 (docs/models.md §2): not certified, exit 1, with the reason.
  r = porecert_cli("verify --model pipe --R=3");
  CHECK(r.rc == 1);
  CHECK(r.out.find("NOT CERTIFIED") != std::string::npos);
}

TEST_CASE("strong injection: the MPFR remedy for Y0 (R = -26), checked against the reference and rechecked") {
  proof::CertifyRequest req;
  req.R_lo = req.R_hi = "-26";
  req.model.name = "pipe";
  const proof::CertifyOutcome o = proof::certify_berman(req);
  REQUIRE(o.certified);
  CHECK(o.method == "taylor-newton-kantorovich");
  CHECK(o.precision_bits == 128);  // the double proof fails on Y0 here (docs/models.md §2)
  const pipe_ref::Solution s = pipe_ref::solve(-26);
  CHECK(inside(s.fp0, o.fp0_id));
  CHECK(inside(s.fpp1, o.fpp1_id));
  CHECK(inside(s.K, o.K_id));
  const proof::CertifyOutcome re = proof::recheck_taylor(o.model, "-26", "-26", o.candidate_hex, o.precision_bits);
  REQUIRE(re.certified);
  CHECK(re.existence_radius <= o.existence_radius);
  CHECK(boost::numeric::subset(re.K_id, o.K_id));
  // The same candidate read as doubles is not the stored candidate: rejected as input.
  CHECK_THROWS_AS(proof::recheck_taylor(o.model, "-26", "-26", o.candidate_hex, 53), std::invalid_argument);
}
