// --model and its parameters on the command line, in case files and in certificates (docs/models.md).
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <nlohmann/json.hpp>
#include <regex>
#include <sstream>
#include <string>

#include "report/report.hpp"
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

// ---- sweep, check, branches and report with --model (issue 9, deliverable 4) -------------------

namespace {
nlohmann::json read_json(const std::string& path) { return nlohmann::json::parse(slurp(path)); }
// A journal carrying the header this sweep document was made with (the header is the document's
// "parameters" plus format and version: lib/certificate/sweep.cpp identity).
void journal_of(const nlohmann::json& doc, const std::string& path) {
  nlohmann::json h = doc["parameters"];
  h["format"] = "porecert-sweep-journal";
  h["version"] = 1;
  spit(path, h.dump() + "\n");
}
}  // namespace

TEST_CASE("sweep --model full-channel: the model is in every box certificate and recheck rebuilds it") {
  std::system(("mkdir -p " + tmp + " && rm -f " + tmp + "/fsw.json*").c_str());
  auto r = porecert_cli("sweep --R 1:1.002 --width 0.0005 --jobs 1 --model full-channel --wall-ratio 0.5 --json " +
                        tmp + "/fsw.json");
  REQUIRE(r.rc == 0);
  CHECK(r.out.find("full-channel wall-ratio = 0.5") != std::string::npos);
  const auto doc = read_json(tmp + "/fsw.json");
  CHECK(doc["covered"] == true);
  CHECK(doc["parameters"]["model"]["name"] == "full-channel");
  CHECK(doc["parameters"]["model"]["parameters"]["wall-ratio"] == "0.5");
  REQUIRE(doc["boxes"].size() >= 2);
  for (const auto& b : doc["boxes"]) {
    REQUIRE(b["status"] == "certified");
    CHECK(b["certificate"]["problem"]["model_name"] == "full-channel");
    CHECK(b["certificate"]["problem"]["model_parameters"]["wall-ratio"] == "0.5");
    CHECK(b["values"].contains("f''(-1)"));  // the full channel's own value key
  }
  const auto box = doc["boxes"][1]["certificate"];
  spit(tmp + "/fbox.json", box.dump(1));
  r = porecert_cli("recheck " + tmp + "/fbox.json");
  CHECK(r.rc == 0);
  CHECK(r.out.find("full-channel") != std::string::npos);
  // The same box with another wall ratio does not re-prove: recheck really rebuilds the named model.
  auto other = box;
  other["problem"]["model_parameters"]["wall-ratio"] = "0.7";
  spit(tmp + "/fbox7.json", other.dump(1));
  CHECK(porecert_cli("recheck " + tmp + "/fbox7.json").rc == 1);
}

TEST_CASE("sweep --resume refuses a journal of another model or parameters, naming the field") {
  std::system(("mkdir -p " + tmp + " && rm -f " + tmp + "/rsw.json*").c_str());
  const std::string args = "sweep --R 1:1.001 --width 0.0005 --jobs 1 --model full-channel";
  auto r = porecert_cli(args + " --wall-ratio 0.5 --json " + tmp + "/rsw.json");
  REQUIRE(r.rc == 0);
  const auto doc = read_json(tmp + "/rsw.json");
  const std::string j = tmp + "/rsw.journal";
  journal_of(doc, j);
  r = porecert_cli(args + " --wall-ratio 0.6 --resume --journal " + j);
  CHECK(r.rc == 2);
  CHECK(r.out.find("field \"model\"") != std::string::npos);
  CHECK(r.out.find("0.6") != std::string::npos);
  journal_of(doc, j);
  r = porecert_cli("sweep --R 1:1.001 --width 0.0005 --jobs 1 --resume --journal " + j);  // Berman
  CHECK(r.rc == 2);
  CHECK(r.out.find("absent (Berman's model)") != std::string::npos);
  // The same sweep resumes from that header (so the refusals above are about the model alone).
  journal_of(doc, j);
  r = porecert_cli(args + " --wall-ratio 0.5 --resume --journal " + j);
  CHECK(r.rc == 0);
}

TEST_CASE("sweep --model pipe and --model moving-walls cover a small range with glued boxes") {
  std::system(("mkdir -p " + tmp + " && rm -f " + tmp + "/psw.json* " + tmp + "/msw.json*").c_str());
  auto r = porecert_cli("sweep --R 1:1.00002 --width 0.00001 --min-width 0.000001 --jobs 1 --model pipe --json " + tmp +
                        "/psw.json");
  REQUIRE(r.rc == 0);
  auto doc = read_json(tmp + "/psw.json");
  CHECK(doc["one_branch"] == true);
  const auto& c = doc["boxes"][0]["certificate"];
  CHECK(c["method"] == "taylor-newton-kantorovich");
  CHECK(c["problem"]["model_name"] == "pipe");
  // (V2.3) first order: F'(0) = 2 + R/9 + O(R^2); at R near 1 the enclosure lies within R^2 = 1 of 2.111.
  const auto& v = doc["boxes"][0]["values"]["F'(0)"];
  CHECK(std::stod(v[0].get<std::string>()) > 2.111 - 1);
  CHECK(std::stod(v[1].get<std::string>()) < 2.112 + 1);
  spit(tmp + "/pbox.json", c.dump(1));
  CHECK(porecert_cli("recheck " + tmp + "/pbox.json").rc == 0);
  r = porecert_cli("sweep --R 1:1.002 --width 0.001 --jobs 2 --model moving-walls --expansion 0.5 --json " + tmp +
                   "/msw.json");
  REQUIRE(r.rc == 0);
  doc = read_json(tmp + "/msw.json");
  CHECK(doc["covered"] == true);
  CHECK(doc["boxes"][0]["certificate"]["problem"]["model"] == "berman-half-channel-moving-walls");
}

TEST_CASE("sweep: bad model input exits 2 naming the option") {
  auto r = porecert_cli("sweep --R 1:2 --model tube");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--model: 'tube' is not a model") != std::string::npos);
  r = porecert_cli("sweep --R 1:2 --model mhd");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--hartmann") != std::string::npos);
  r = porecert_cli("sweep --R 13:14 --model mhd --hartmann 1 --branch II");
  CHECK(r.rc == 2);
  CHECK(r.out.find("--branch") != std::string::npos);
}

TEST_CASE("check with a [model] table: claims judged against that model") {
  std::system(("mkdir -p " + tmp).c_str());
  // R = 0, a = 1/2: f = (1 - a)/2 + 3(1 + a)/4 eta - (1 + a)/4 eta^3 exactly (the cubic with f(-1) = -a,
  // f(1) = 1, f'(+-1) = 0), so f'(0) = 9/8 and f''(-1) = 9/4.
  const std::string head =
      "[problem]\nR = \"0\"\n[model]\nname = \"full-channel\"\nwall-ratio = \"0.5\"\n"
      "[candidate]\nbranch = \"I\"\n";
  spit(tmp + "/fc.toml", head +
                             "[[claim]]\nquantity = \"f''(-1)\"\nvalue = \"2.25\"\ntolerance = \"1e-9\"\n"
                             "[[claim]]\nquantity = \"f'(0)\"\nvalue = \"1.2\"\ntolerance = \"0.01\"\n");
  auto r = porecert_cli("check " + tmp + "/fc.toml --json " + tmp + "/fc-verdicts.json");
  CHECK(r.rc == 1);  // one claim rejected
  const auto v = read_json(tmp + "/fc-verdicts.json");
  CHECK(v["model"]["name"] == "full-channel");
  REQUIRE(v["verdicts"].size() == 2);
  CHECK(v["verdicts"][0]["verdict"] == "accepted");
  CHECK(v["verdicts"][1]["verdict"] == "rejected");
  spit(tmp + "/fc-true.toml", head + "[[claim]]\nquantity = \"f'(0)\"\nvalue = \"1.125\"\ntolerance = \"1e-9\"\n");
  CHECK(porecert_cli("check " + tmp + "/fc-true.toml").rc == 0);
  // The pipe at R = 0: F = 2 xi - xi^2 (V2.2), so F'(0) = 2, K = -2.
  spit(tmp + "/pipe.toml",
       "[problem]\nR = \"0\"\n[model]\nname = \"pipe\"\n[candidate]\nbranch = \"I\"\n[[claim]]\nquantity = "
       "\"F'(0)\"\nvalue = \"2\"\ntolerance = \"1e-9\"\n[[claim]]\nquantity = \"K\"\nabove = \"0\"\n");
  r = porecert_cli("check " + tmp + "/pipe.toml");
  CHECK(r.rc == 1);
  CHECK(r.out.find("claim 1: accepted") != std::string::npos);
  CHECK(r.out.find("claim 2: rejected") != std::string::npos);
}

TEST_CASE("check: a bad [model] table or a claim the model cannot judge exits 2 naming the key") {
  std::system(("mkdir -p " + tmp).c_str());
  const auto run = [&](const std::string& model, const std::string& claim) {
    spit(tmp + "/bad.toml",
         "[problem]\nR = \"1\"\n[model]\n" + model + "\n[candidate]\nbranch = \"I\"\n[[claim]]\n" + claim + "\n");
    return porecert_cli("check " + tmp + "/bad.toml");
  };
  const std::string k = "quantity = \"K\"\nbelow = \"0\"";
  auto r = run("name = \"tube\"", k);
  CHECK(r.rc == 2);
  CHECK(r.out.find("[model] name: 'tube' is not a model") != std::string::npos);
  r = run("name = \"mhd\"\nhartmann = \"200\"", k);
  CHECK(r.rc == 2);
  CHECK(r.out.find("[model] hartmann: '200' is out of range (rule: 0 <= M <= 100)") != std::string::npos);
  r = run("name = \"pipe\"\nslip = \"1\"", k);
  CHECK(r.rc == 2);
  CHECK(r.out.find("[model] slip") != std::string::npos);
  r = run("name = \"pipe\"", "quantity = \"f'''(0)\"\nbelow = \"0\"");
  CHECK(r.rc == 2);
  CHECK(r.out.find("not a value key of model pipe") != std::string::npos);
  r = run("name = \"full-channel\"", "property = \"f' > 0 on [0, 1)\"");
  CHECK(r.rc == 2);
  CHECK(r.out.find("sign claims") != std::string::npos);
}

TEST_CASE("branches --model pipe certifies the branch from R = 0 and says nothing was searched") {
  std::system(("mkdir -p " + tmp).c_str());
  auto r = porecert_cli("branches --R 0.1 --model pipe --json " + tmp + "/pbr.json");
  REQUIRE(r.rc == 0);
  const auto j = read_json(tmp + "/pbr.json");
  CHECK(j["searched_region"].get<std::string>().find("no search") != std::string::npos);
  CHECK(j["claim"].get<std::string>().find("no claim is made about solutions outside") != std::string::npos);
  REQUIRE(j["solutions"].size() == 1);
  // (V2.3): F'(0) = 2 + R/9 + O(R^2): within R^2 = 0.01 of 2.0111 at R = 0.1.
  const auto& v = j["solutions"][0]["values"]["F'(0)"];
  CHECK(std::stod(v[0].get<std::string>()) > 2.0111 - 0.01);
  CHECK(std::stod(v[1].get<std::string>()) < 2.0112 + 0.01);
}

TEST_CASE("report renders a pipe certificate: F and F' in xi enclose the exact R = 0 profile") {
  std::system(("mkdir -p " + tmp).c_str());
  auto r = porecert_cli("verify --R 0 --model pipe --json " + tmp + "/p0.json");
  REQUIRE(r.rc == 0);
  r = porecert_cli("report " + tmp + "/p0.json --html " + tmp + "/p0.html");
  REQUIRE(r.rc == 0);
  const std::string html = slurp(tmp + "/p0.html");
  CHECK(html.find("id=\"plot-u\"") != std::string::npos);
  CHECK(html.find("F'(xi)") != std::string::npos);
  CHECK(html.find("F''(1) in") != std::string::npos);
  // (V2.2): F = 2 xi - xi^2, F' = 2 - 2 xi at R = 0; every drawn enclosure must contain it.
  const auto p = porecert::report::certified_profile(read_json(tmp + "/p0.json"));
  REQUIRE(p.eta.size() == 129);
  for (std::size_t i = 0; i < p.eta.size(); ++i) {
    const double x = p.eta[i];  // i/128: exact, and so are 2x - x^2 and 2 - 2x
    CHECK(p.f[i].lower() <= 2 * x - x * x);
    CHECK(2 * x - x * x <= p.f[i].upper());
    CHECK(p.fp[i].lower() <= 2 - 2 * x);
    CHECK(2 - 2 * x <= p.fp[i].upper());
  }
  // At R = 1 the profile differs from Hagen-Poiseuille by more than its enclosure width (a report that
  // drew the R = 0 profile for every certificate would fail here).
  REQUIRE(porecert_cli("verify --R 1 --model pipe --json " + tmp + "/p1.json").rc == 0);
  const auto q = porecert::report::certified_profile(read_json(tmp + "/p1.json"));
  CHECK(!(q.fp[64].lower() <= 1.0 && 1.0 <= q.fp[64].upper()));
}

TEST_CASE("check: sign claims for a slip wall use no f'(1) = 0") {
  std::system(("mkdir -p " + tmp).c_str());
  // With slip f'(1) = -beta f''(1) > 0 (f'' < 0 at the wall): "f' > 0 on [0, 1]" is true, and
  // "f' < 0 on (0.5, 1]" false; Berman's f'(1) = 0 would wrongly reject the first.
  spit(tmp + "/slip.toml",
       "[problem]\nR = \"2\"\n[model]\nname = \"slip\"\nslip = \"0.2\"\n[candidate]\nbranch = \"I\"\n"
       "[[claim]]\nproperty = \"f' > 0 on [0, 1]\"\n[[claim]]\nproperty = \"f'' < 0 on (0, 1]\"\n"
       "[[claim]]\nproperty = \"f' < 0 on (0.5, 1]\"\n");
  auto r = porecert_cli("check " + tmp + "/slip.toml");
  CHECK(r.rc == 1);
  CHECK(r.out.find("claim 1: accepted") != std::string::npos);
  CHECK(r.out.find("claim 2: accepted") != std::string::npos);
  CHECK(r.out.find("claim 3: rejected") != std::string::npos);
}
