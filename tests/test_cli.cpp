// The command line: exit codes, messages naming option, value and rule; nothing lost on bad input.
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <string>

#include "support/run_cli.hpp"

namespace {
using ::porecert::test::porecert_cli;
using ::porecert::test::Run;
using ::porecert::test::slurp;
const std::string tmp = "/tmp/porecert-test-cli";
}  // namespace

TEST_CASE("verify certifies the demo case and recheck confirms it") {
  std::system(("mkdir -p " + tmp).c_str());
  const auto r = porecert_cli("verify " PORECERT_SOURCE_DIR "/cases/membrane-module.toml --json " + tmp + "/demo.json");
  CHECK(r.rc == 0);
  CHECK(r.out.find("CERTIFIED") != std::string::npos);
  const std::string cert = slurp(tmp + "/demo.json");
  CHECK(cert.find("\"status\": \"certified\"") != std::string::npos);
  const auto rc = porecert_cli("recheck " + tmp + "/demo.json");
  CHECK(rc.rc == 0);
  CHECK(rc.out.find("CONFIRMED") != std::string::npos);
}

TEST_CASE("negative R works in both spellings") {
  CHECK(porecert_cli("verify --R=-10").rc == 0);
  CHECK(porecert_cli("verify --R -10").rc == 0);
}

TEST_CASE("bad input: exit 2, message names option, value and rule") {
  auto r = porecert_cli("verify --R=abc");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--R") != std::string::npos);
  CHECK(r.out.find("abc") != std::string::npos);
  r = porecert_cli("verify --R=nan");
  CHECK(r.rc == 2);
  r = porecert_cli("verify --R=3e5");
  CHECK(r.rc == 2);
  CHECK(r.out.find("range") != std::string::npos);
  r = porecert_cli("verify --R=2:1");
  CHECK(r.rc == 2);
  r = porecert_cli("verify --R=1 --modes 3");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--modes") != std::string::npos);
}

TEST_CASE("malformed case file and truncated certificate: exit 2, nothing already written is lost") {
  std::system(("mkdir -p " + tmp).c_str());
  {
    std::ofstream f(tmp + "/bad.toml");
    f << "[flow]\nreynolds = 12.5\n";
  }
  auto r = porecert_cli("verify " + tmp + "/bad.toml");
  CHECK(r.rc == 2);
  CHECK(r.out.find("flow.reynolds") != std::string::npos);
  {
    std::ofstream f(tmp + "/broken.toml");
    f << "[flow\nreynolds = \"1\"\n";
  }
  CHECK(porecert_cli("verify " + tmp + "/broken.toml").rc == 2);
  // A good certificate, then a truncated copy: recheck refuses the copy; the original is untouched.
  REQUIRE(porecert_cli("verify --R=2 --json " + tmp + "/good.json").rc == 0);
  const std::string good = slurp(tmp + "/good.json");
  {
    std::ofstream f(tmp + "/trunc.json");
    f << good.substr(0, good.size() / 2);
  }
  r = porecert_cli("recheck " + tmp + "/trunc.json");
  CHECK(r.rc == 2);
  CHECK(r.out.find("truncated") != std::string::npos);
  // A failing run must not clobber an existing certificate at the target path.
  r = porecert_cli("verify --R=abc --json " + tmp + "/good.json");
  CHECK(r.rc == 2);
  CHECK(slurp(tmp + "/good.json") == good);
}

TEST_CASE("recheck rejects a tampered certificate") {
  std::system(("mkdir -p " + tmp).c_str());
  REQUIRE(porecert_cli("verify --R=3 --json " + tmp + "/t.json").rc == 0);
  std::string c = slurp(tmp + "/t.json");
  // Narrow the stated K enclosure to a wrong point: the re-proof cannot be contained in it.
  const auto k = c.find("\"K\": [", c.find("\"values\""));
  REQUIRE(k != std::string::npos);
  const auto end = c.find(']', k);
  c.replace(k, end - k + 1, "\"K\": [\"1.0\", \"1.0\"]");
  {
    std::ofstream f(tmp + "/t2.json");
    f << c;
  }
  const auto r = porecert_cli("recheck " + tmp + "/t2.json");
  CHECK(r.rc == 1);
  CHECK(r.out.find("REJECTED") != std::string::npos);
}

TEST_CASE("greens prints the four beta_k and the direct method certifies R = +-0.27") {
  std::system(("mkdir -p " + tmp).c_str());
  auto g = porecert_cli("greens --json " + tmp + "/beta.json");
  CHECK(g.rc == 0);
  const std::string b = slurp(tmp + "/beta.json");
  CHECK(b.find("\"beta\"") != std::string::npos);
  // Reported for the direct method about the Stokes profile: |R| < 0.27 with a ball of about 0.07.
  auto d = porecert_cli("verify --R=0.27 --method direct --json " + tmp + "/d.json");
  CHECK(d.rc == 0);
  CHECK(slurp(tmp + "/d.json").find("\"status\": \"certified\"") != std::string::npos);
  CHECK(porecert_cli("verify --R=-0.27 --method direct").rc == 0);
  auto far = porecert_cli("verify --R=5 --method direct");
  CHECK(far.rc == 1);
  CHECK(far.out.find("NOT CERTIFIED") != std::string::npos);
  CHECK(porecert_cli("verify --R=1 --method banach").rc == 2);
}

TEST_CASE("fold result re-checks from its stored candidate; a moved fold_R is rejected") {
  std::system(("mkdir -p " + tmp).c_str());
  REQUIRE(porecert_cli("fold --no-below-check --json " + tmp + "/fold.json").rc == 0);
  auto r = porecert_cli("recheck " + tmp + "/fold.json");
  CHECK(r.rc == 0);
  CHECK(r.out.find("CONFIRMED") != std::string::npos);
  std::string c = slurp(tmp + "/fold.json");
  const auto k = c.find("\"fold_R\": [");
  REQUIRE(k != std::string::npos);
  c.replace(k, c.find(']', k) - k + 1, "\"fold_R\": [\"12.2\", \"12.3\"]");
  {
    std::ofstream f(tmp + "/fold2.json");
    f << c;
  }
  r = porecert_cli("recheck " + tmp + "/fold2.json");
  CHECK(r.rc == 1);
  CHECK(r.out.find("REJECTED") != std::string::npos);
}
