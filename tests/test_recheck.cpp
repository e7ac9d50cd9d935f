// porecert recheck: re-derivation at a different precision; edited or cut-short certificates fail.
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <functional>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "support/run_cli.hpp"

namespace {
using ::porecert::test::Run;
constexpr auto run_porecert = ::porecert::test::porecert_cli;
const std::string dir = "/tmp/porecert-test-recheck";
nlohmann::json load(const std::string& p) {
  std::ifstream in(p);
  return nlohmann::json::parse(in);
}
void save(const std::string& p, const nlohmann::json& j) { std::ofstream(p) << j.dump(1); }
}  // namespace

TEST_CASE("recheck re-derives at another precision and names the first edited field") {
  std::system(("mkdir -p " + dir).c_str());
  const std::string c = dir + "/c53.json", c2 = dir + "/auto.json";
  REQUIRE(run_porecert("verify --R=7.5 --precision 53 --json " + c).rc == 0);  // double: re-derived at 128 bits
  REQUIRE(run_porecert("verify --R=7.5 --json " + c2).rc == 0);                // MPFR: re-derived at stored + 64
  for (const std::string& f : {c, c2}) {
    const auto ok = run_porecert("recheck " + f);
    CHECK(ok.rc == 0);
    CHECK(ok.out.find("re-derived at MPFR") != std::string::npos);
  }
  const nlohmann::json j = load(c2);
  struct Edit {
    const char* field;
    std::function<void(nlohmann::json&)> edit;
  };
  const std::vector<Edit> edits = {
      {"bounds.Y0", [](nlohmann::json& k) { k["bounds"]["Y0"] = "1e-60"; }},
      {"bounds.Z1", [](nlohmann::json& k) { k["bounds"]["Z1"] = "1e-9"; }},
      {"existence_radius", [](nlohmann::json& k) { k["existence_radius"] = "1e-60"; }},
      {"uniqueness_radius", [](nlohmann::json& k) { k["uniqueness_radius"] = "0.5"; }},
      {"error_bounds.sup|f'' - fbar''|", [](nlohmann::json& k) { k["error_bounds"]["sup|f'' - fbar''|"] = "1e-60"; }},
      {"values.f''(1)", [](nlohmann::json& k) { k["values"]["f''(1)"][0] = k["values"]["f''(1)"][1]; }},
  };
  for (const auto& e : edits) {
    nlohmann::json t = j;
    e.edit(t);
    save(dir + "/edited.json", t);
    const auto r = run_porecert("recheck " + dir + "/edited.json");
    CHECK_MESSAGE(r.rc == 1, e.field);
    CHECK_MESSAGE(r.out.find(std::string("first mismatch in field ") + e.field) != std::string::npos, r.out);
  }
  // Cut short: invalid JSON, or a key missing: bad input, exit 2, the problem named.
  std::stringstream ss;
  ss << std::ifstream(c2).rdbuf();
  const std::string text = ss.str();
  std::ofstream(dir + "/cut.json") << text.substr(0, text.size() * 2 / 3);
  auto r = run_porecert("recheck " + dir + "/cut.json");
  CHECK(r.rc == 2);
  CHECK(r.out.find("truncated") != std::string::npos);
  nlohmann::json t = j;
  t["bounds"].erase("Z2");
  save(dir + "/nokey.json", t);
  r = run_porecert("recheck " + dir + "/nokey.json");
  CHECK(r.rc == 2);
  CHECK(r.out.find("bounds.Z2") != std::string::npos);
}
