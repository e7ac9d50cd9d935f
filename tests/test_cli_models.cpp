// --model and its parameters on the command line, in case files and in certificates (docs/models.md).
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <regex>
#include <sstream>
#include <string>

#include "support/run_cli.hpp"

namespace {
using ::porecert::test::porecert_cli;
using ::porecert::test::Run;
using ::porecert::test::slurp;
using ::porecert::test::spit;
const std::string tmp = "/tmp/porecert-test-cli-models";
}  // namespace

TEST_CASE("a full-channel certificate records its model and recheck rebuilds it") {
  std::system(("mkdir -p " + tmp).c_str());
  const std::string c = tmp + "/full.json";
  auto r = porecert_cli("verify --R 10 --model full-channel --wall-ratio 0.5 --json " + c);
  REQUIRE(r.rc == 0);
  const std::string cert = slurp(c);
  CHECK(cert.find("\"model\": \"full-channel\"") != std::string::npos);
  CHECK(cert.find("\"wall-ratio\": \"0.5\"") != std::string::npos);
  CHECK(cert.find("\"f''(-1)\"") != std::string::npos);
  r = porecert_cli("recheck " + c);
  CHECK(r.rc == 0);
  CHECK(r.out.find("CONFIRMED") != std::string::npos);
  // Same candidate, other wall ratio: the proof must fail (the model really is rebuilt from the file).
  spit(tmp + "/other.json", std::regex_replace(cert, std::regex("\"wall-ratio\": \"0.5\""), "\"wall-ratio\": \"0.6\""));
  r = porecert_cli("recheck " + tmp + "/other.json");
  CHECK(r.rc == 1);
  // A stated value that does not contain the re-proved one is rejected, naming the key.
  const auto pos = cert.find("\"f''(-1)\": [");
  REQUIRE(pos != std::string::npos);
  std::string bad = cert;
  bad.replace(pos, std::string("\"f''(-1)\": [").size(), "\"f''(-1)\": [\"7\", \"8\"], \"x\": [");
  spit(tmp + "/bad.json", bad);
  r = porecert_cli("recheck " + tmp + "/bad.json");
  CHECK(r.rc == 1);
  CHECK(r.out.find("f''(-1)") != std::string::npos);
}

TEST_CASE("model options: bad input exits 2 naming the option") {
  auto r = porecert_cli("verify --R 1 --model tube");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--model") != std::string::npos);
  r = porecert_cli("verify --R 1 --model mhd");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--hartmann") != std::string::npos);
  r = porecert_cli("verify --R 1 --model full-channel --wall-ratio 11");
  CHECK(r.rc == 2);
  CHECK(r.out.find("-10 <= a <= 10") != std::string::npos);
  r = porecert_cli("verify --R 1 --model mhd --hartmann 1 --branch II");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--branch") != std::string::npos);
}

TEST_CASE("case file [model] table, and --slip on the plain model") {
  std::system(("mkdir -p " + tmp).c_str());
  spit(tmp + "/case.toml",
       "[case]\ntitle = \"demo: invented\"\n[flow]\nreynolds = \"4\"\n[model]\nname = \"moving-walls\"\nexpansion = "
       "\"0.5\"\n");
  auto r = porecert_cli("verify " + tmp + "/case.toml --json " + tmp + "/mw.json");
  CHECK(r.rc == 0);
  CHECK(slurp(tmp + "/mw.json").find("berman-half-channel-moving-walls") != std::string::npos);
  CHECK(porecert_cli("recheck " + tmp + "/mw.json").rc == 0);
  spit(tmp + "/bad.toml", "[flow]\nreynolds = \"4\"\n[model]\nname = \"mhd\"\nhartmann = 0.5\n");
  r = porecert_cli("verify " + tmp + "/bad.toml");
  CHECK(r.rc == 2);
  CHECK(r.out.find("model.hartmann") != std::string::npos);
  r = porecert_cli("verify --R 3 --slip 0.2 --json " + tmp + "/slip.json");
  CHECK(r.rc == 0);
  CHECK(slurp(tmp + "/slip.json").find("berman-half-channel-slip") != std::string::npos);
  r = porecert_cli("branches --R 3 --model mhd --hartmann 2");
  CHECK(r.rc == 0);
}

TEST_CASE("porecert fold --model full-channel --kind symmetry-breaking prints fold_R; recheck confirms") {
  std::system(("mkdir -p " + tmp).c_str());
  auto r = porecert_cli("fold --model full-channel --kind symmetry-breaking --no-below-check --json -");
  REQUIRE(r.rc == 0);
  CHECK(r.out.find("\"fold_R\"") != std::string::npos);
  CHECK(r.out.find("\"kind\": \"symmetry-breaking\"") != std::string::npos);
  spit(tmp + "/sb.json", r.out);
  r = porecert_cli("recheck " + tmp + "/sb.json");
  CHECK(r.rc == 0);
  CHECK(r.out.find("CONFIRMED") != std::string::npos);
  r = porecert_cli("fold --model full-channel");  // the full channel has no turning-point computation
  CHECK(r.rc == 2);
  CHECK(r.out.find("--kind") != std::string::npos);
}
