// porecert report (lib/report): the page's profile tubes contain the independent shooting solution
// (tests/reference/berman_shooting.hpp: Boost.Odeint + Multiprecision, shares no code with lib/),
// the page carries its elements and no network references, and bad input exits 2 without clobbering.
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>

#include "certificate/certificate.hpp"
#include "proof/certify.hpp"
#include "reference/berman_shooting.hpp"
#include "report/report.hpp"
#include "support/run_cli.hpp"

using namespace porecert;

namespace {
using ::porecert::test::porecert_cli;
using ::porecert::test::Run;
using ::porecert::test::slurp;
using ::porecert::test::spit;
const std::string tmp = "/tmp/porecert-test-report";
}  // namespace

TEST_CASE("profile tubes contain the independent shooting solution (R = 7.5 and R = -20)") {
  for (const char* Rs : {"7.5", "-20"}) {
    CAPTURE(Rs);
    proof::CertifyRequest req;
    req.R_lo = req.R_hi = Rs;
    const auto o = proof::certify_berman(req);
    REQUIRE(o.certified);
    const auto j = certificate::to_json({Rs, Rs, "I", ""}, o);
    const auto p = report::certified_profile(j);
    const berman_ref::Real R(Rs);
    const auto g = berman_ref::newton_double(std::stod(Rs), 1.5, -3);
    const auto s = berman_ref::shoot_real(R, berman_ref::Real(g[0]), berman_ref::Real(g[1]));
    for (int i : {16, 64, 100}) {
      const auto y = berman_ref::integrate_berman<berman_ref::Real>(R, s.a, s.b, s.steps, berman_ref::Real(p.eta[i]));
      const double f = static_cast<double>(y[0]), fp = static_cast<double>(y[1]);
      // The reference is accurate to ~1e-40; its rounding to double moves it by half an ulp.
      CHECK(p.f[i].lower() <= std::nextafter(f, INFINITY));
      CHECK(std::nextafter(f, -INFINITY) <= p.f[i].upper());
      CHECK(p.fp[i].lower() <= std::nextafter(fp, INFINITY));
      CHECK(std::nextafter(fp, -INFINITY) <= p.fp[i].upper());
      CHECK(arith::width_up(p.fp[i]) < 1e-9);
    }
  }
}

TEST_CASE("full channel, a = 1: the whole-channel tube contains the half-channel reference mirrored") {
  // For a = 1 the full-channel solution is Berman's, odd in eta (docs/models.md §1): f(eta) =
  // sign(eta) f_half(|eta|), f'(eta) = f_half'(|eta|), with f_half from the independent reference.
  proof::CertifyRequest req;
  req.R_lo = req.R_hi = "4";
  req.model.name = "full-channel";
  req.model.set("wall-ratio", "1");
  const auto o = proof::certify_berman(req);
  REQUIRE(o.certified);
  const auto p = report::certified_profile(certificate::to_json({"4", "4", "I", ""}, o));
  REQUIRE(p.eta.size() == 257);
  CHECK(p.eta.front() == -1.0);
  CHECK(p.eta[128] == 0.0);
  const berman_ref::Real R("4");
  const auto g = berman_ref::newton_double(4.0, 1.5, -3);
  const auto sh = berman_ref::shoot_real(R, berman_ref::Real(g[0]), berman_ref::Real(g[1]));
  for (int i : {0, 40, 100, 128, 170, 256}) {
    CAPTURE(i);
    const double eta = p.eta[i], sg = eta < 0 ? -1 : 1;
    const auto y =
        berman_ref::integrate_berman<berman_ref::Real>(R, sh.a, sh.b, sh.steps, berman_ref::Real(std::fabs(eta)));
    const double f = sg * static_cast<double>(y[0]), fp = static_cast<double>(y[1]);
    // The reference is accurate to about 1e-40 (at the walls it gives f'(±1) ≈ 1e-73, where the page
    // holds the exact 0): allow 1e-30 besides the rounding to double.
    const double tol = 1e-30;
    CHECK(p.f[i].lower() <= std::nextafter(f, INFINITY) + tol);
    CHECK(std::nextafter(f, -INFINITY) - tol <= p.f[i].upper());
    CHECK(p.fp[i].lower() <= std::nextafter(fp, INFINITY) + tol);
    CHECK(std::nextafter(fp, -INFINITY) - tol <= p.fp[i].upper());
    CHECK(arith::width_up(p.fp[i]) < 1e-9);
  }
}

TEST_CASE("full channel, a = 0.5: the page draws the whole channel with f(-1) = -a") {
  std::string log;
  const std::string page =
      ::porecert::test::verify_and_report("--R=3 --model full-channel --wall-ratio 0.5", tmp, "fc", &log);
  INFO(log);
  REQUIRE(!page.empty());
  CHECK(page.find("id=\"plot-u\"") != std::string::npos);
  CHECK(page.find("id=\"profile-table\"") != std::string::npos);
  CHECK(page.find("walls at -1 and 1") != std::string::npos);
  const auto p = report::certified_profile(nlohmann::json::parse(slurp(tmp + "/fc.json")));
  CHECK(p.f.front().lower() == -0.5);  // f(-1) = -a exactly (R2)
  CHECK(p.f.front().upper() == -0.5);
  CHECK(p.f.back().lower() == 1.0);
}

TEST_CASE("report of the demo case: elements, dimensional rows, cautions, no network") {
  std::system(("rm -rf " + tmp + " && mkdir -p " + tmp).c_str());
  REQUIRE(porecert_cli("verify " PORECERT_SOURCE_DIR "/cases/membrane-module.toml --json " + tmp + "/c.json").rc == 0);
  const auto r = porecert_cli("report " + tmp + "/c.json --html " + tmp + "/c.html");
  REQUIRE(r.rc == 0);
  const std::string h = slurp(tmp + "/c.html");
  for (const char* id : {"plot-u", "plot-v", "values", "proof", "dimensional", "dim-wall_shear_stress",
                         "dim-pressure_gradient", "dim-centreline_velocity", "cautions", "profile-table"})
    CHECK_MESSAGE(h.find(std::string("id=\"") + id + "\"") != std::string::npos, id);
  CHECK(h.find("licensed engineering practice") != std::string::npos);
  CHECK(h.find("not a plant") != std::string::npos);
  CHECK(h.find("http://") == std::string::npos);
  CHECK(h.find("https://") == std::string::npos);
  CHECK(h.find(" src=") == std::string::npos);
  CHECK(h.find("<link") == std::string::npos);
  CHECK(h.find("<polygon class=\"tube\"") != std::string::npos);
}

TEST_CASE("bad report input: exit 2 naming the key; an existing page is not clobbered") {
  std::system(("mkdir -p " + tmp).c_str());
  REQUIRE(porecert_cli("verify --R=1 --json " + tmp + "/one.json").rc == 0);
  const std::string good = slurp(tmp + "/one.json");
  spit(tmp + "/keep.html", "KEEP");
  auto j = nlohmann::json::parse(good);
  j.erase("error_bounds");
  spit(tmp + "/noerr.json", j.dump());
  auto r = porecert_cli("report " + tmp + "/noerr.json --html " + tmp + "/keep.html");
  CHECK(r.rc == 2);
  CHECK(r.out.find("error_bounds") != std::string::npos);
  spit(tmp + "/trunc.json", good.substr(0, good.size() / 2));
  r = porecert_cli("report " + tmp + "/trunc.json --html " + tmp + "/keep.html");
  CHECK(r.rc == 2);
  CHECK(r.out.find("not valid JSON") != std::string::npos);
  j = nlohmann::json::parse(good);
  j["values"]["K"] = "three";
  spit(tmp + "/badk.json", j.dump());
  r = porecert_cli("report " + tmp + "/badk.json --html " + tmp + "/keep.html");
  CHECK(r.rc == 2);
  CHECK(r.out.find("values.K") != std::string::npos);
  CHECK(slurp(tmp + "/keep.html") == "KEEP");
  r = porecert_cli("report " + tmp + "/one.json --html /nonexistent-dir/x.html");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--html") != std::string::npos);
}

TEST_CASE("dimensional inputs that do not match the certified R are refused") {
  std::system(("mkdir -p " + tmp).c_str());
  REQUIRE(porecert_cli("verify " PORECERT_SOURCE_DIR "/cases/membrane-module.toml --json " + tmp + "/m.json").rc == 0);
  auto j = nlohmann::json::parse(slurp(tmp + "/m.json"));
  j["dimensional"]["inputs"]["wall_velocity"] = "30 um/s";  // R doubles: not what was certified
  spit(tmp + "/m2.json", j.dump());
  auto r = porecert_cli("report " + tmp + "/m2.json --html " + tmp + "/m2.html");
  CHECK(r.rc == 2);
  CHECK(r.out.find("not inside the certified R") != std::string::npos);
  j["dimensional"]["inputs"]["wall_velocity"] = "30 furlong/s";
  spit(tmp + "/m3.json", j.dump());
  r = porecert_cli("report " + tmp + "/m3.json --html " + tmp + "/m3.html");
  CHECK(r.rc == 2);
  CHECK(r.out.find("furlong") != std::string::npos);
}

TEST_CASE("case files: units are required, unknown units and doubly given R are refused") {
  std::system(("mkdir -p " + tmp).c_str());
  const std::string head =
      "[channel]\nhalf_width = \"1 mm\"\nkinematic_viscosity = \"1e-6 m^2/s\"\n"
      "density = \"998 kg/m^3\"\nmean_inlet_velocity = \"0.1 m/s\"\naxial_position = \"1 mm\"\n";
  spit(tmp + "/u1.toml", head + "wall_velocity = \"5 parsecs/s\"\n");
  auto r = porecert_cli("verify " + tmp + "/u1.toml");
  CHECK(r.rc == 2);
  CHECK(r.out.find("channel.wall_velocity") != std::string::npos);
  CHECK(r.out.find("parsecs") != std::string::npos);
  spit(tmp + "/u2.toml", head + "wall_velocity = 5\n");
  r = porecert_cli("verify " + tmp + "/u2.toml");
  CHECK(r.rc == 2);
  CHECK(r.out.find("unit") != std::string::npos);
  spit(tmp + "/u3.toml", head + "wall_velocity = \"1 mm/s\"\n[flow]\nreynolds = \"1\"\n");
  r = porecert_cli("verify " + tmp + "/u3.toml");
  CHECK(r.rc == 2);
  CHECK(r.out.find("flow.reynolds") != std::string::npos);
}
