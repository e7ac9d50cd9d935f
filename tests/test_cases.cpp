// Every scenario in cases/ certifies from a fresh build, carries dimensional results, and its report
// renders; the strong-suction case really has three solutions at its R (porecert branches).
// The scenarios are invented demos (see the comment at the top of each file).
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "support/run_cli.hpp"

namespace {
using ::porecert::test::porecert_cli;
using ::porecert::test::Run;
nlohmann::json read_json(const std::string& path) {
  std::ifstream in(path);
  return nlohmann::json::parse(in);
}
const std::string tmp = "/tmp/porecert-test-cases";
}  // namespace

TEST_CASE("every case in cases/ certifies and its report renders") {
  std::system(("rm -rf " + tmp + " && mkdir -p " + tmp).c_str());
  int n = 0;
  for (const auto& e : std::filesystem::directory_iterator(PORECERT_SOURCE_DIR "/cases")) {
    if (e.path().extension() != ".toml") continue;
    ++n;
    const std::string name = e.path().stem().string(), cert = tmp + "/" + name + ".json";
    CAPTURE(name);
    const auto r = porecert_cli("verify " + e.path().string() + " --json " + cert);
    CHECK(r.rc == 0);
    const auto j = read_json(cert);
    CHECK(j["status"] == "certified");
    // Cases with a [channel] table carry certified dimensional results (docs/units.md); a model
    // variant case (docs/models.md) may give R alone.
    std::ifstream in(e.path());
    const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    const bool dimensional = text.find("[channel]") != std::string::npos;
    CHECK(j.contains("dimensional") == dimensional);
    if (dimensional) {
      for (const char* k : {"wall_shear_stress", "pressure_gradient", "centreline_velocity"}) {
        CHECK(j["dimensional"]["results"].contains(k));
        CHECK(j["dimensional"]["results"][k]["value"].size() == 2);
      }
      CHECK(j["dimensional"]["results"]["wall_shear_stress"]["unit"] == "Pa");
      CHECK(j["dimensional"]["results"]["pressure_gradient"]["unit"] == "Pa/m");
    }
    CHECK(porecert_cli("report " + cert + " --html " + tmp + "/" + name + ".html").rc == 0);
  }
  CHECK(n >= 5);
}

TEST_CASE("strong-suction case: three certified, distinct solutions at its R") {
  std::system(("mkdir -p " + tmp).c_str());
  const std::string cert = tmp + "/ss.json", br = tmp + "/ss-branches.json";
  REQUIRE(porecert_cli("verify " PORECERT_SOURCE_DIR "/cases/strong-suction.toml --json " + cert).rc == 0);
  const auto j = read_json(cert);
  const std::string R = j["R"][0].get<std::string>() + ":" + j["R"][1].get<std::string>();
  const auto r = porecert_cli("branches --R=" + R + " --json " + br);
  CHECK(r.rc == 0);
  const auto b = read_json(br);
  CHECK(b["solutions"].size() == 3);
  CHECK(b["pairwise_disjoint"] == true);
  const auto h = porecert_cli("report " + br + " --html " + tmp + "/ss-branches.html");
  CHECK(h.rc == 0);
  std::ifstream in(tmp + "/ss-branches.html");
  std::stringstream ss;
  ss << in.rdbuf();
  CHECK(ss.str().find("id=\"plot-branches\"") != std::string::npos);
}
