// The report renders in a real browser: headless Chromium (Debian package `chromium`) loads the page
// with no network and no script errors, the page's own render check finds every expected element laid
// out, and a screenshot is a PNG. Skips, saying so, where Chromium is not installed (.ci/run installs
// it for this test only, allowed to fail).
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <string>

#include "support/run_cli.hpp"

namespace {
using ::porecert::test::Run;
constexpr auto sh = ::porecert::test::shell;
std::string chromium() {
  for (const char* c : {"/usr/bin/chromium", "/usr/bin/chromium-browser"})
    if (std::ifstream(c).good()) return c;
  return "";
}
const std::string tmp = "/tmp/porecert-test-chromium";
}  // namespace

TEST_CASE("headless Chromium renders the report without errors and shows its elements") {
  const std::string chr = chromium();
  if (chr.empty()) {
    MESSAGE("SKIPPED: chromium not found (/usr/bin/chromium); install the Debian package 'chromium' to run this test");
    return;
  }
  sh("rm -rf " + tmp + " && mkdir -p " + tmp + "/profile");
  const std::string bin = PORECERT_BINARY;
  REQUIRE(sh(bin + " verify " PORECERT_SOURCE_DIR "/cases/strong-suction.toml --json " + tmp + "/c.json").rc == 0);
  REQUIRE(sh(bin + " report " + tmp + "/c.json --html " + tmp + "/c.html").rc == 0);
  REQUIRE(sh(bin + " branches --R=20 --json " + tmp + "/b.json").rc == 0);
  REQUIRE(sh(bin + " report " + tmp + "/b.json --html " + tmp + "/b.html").rc == 0);
  const std::string flags =
      " --headless --no-sandbox --disable-gpu --no-first-run --disable-extensions "
      "--user-data-dir=" +
      tmp + "/profile --window-size=1280,2000 --enable-logging=stderr --v=0 ";
  for (const char* page : {"c", "b"}) {
    CAPTURE(page);
    const std::string url = "file://" + tmp + "/" + page + ".html";
    const auto dom = sh("timeout 120 " + chr + flags + "--dump-dom " + url);
    REQUIRE(dom.rc == 0);
    CHECK(dom.out.find("id=\"render-check\" data-status=\"ok\"") != std::string::npos);
    CHECK(dom.out.find("Uncaught") == std::string::npos);
    CHECK(dom.out.find("Refused to") == std::string::npos);  // the page's content policy blocks any fetch
    for (const char* id : {"plot-u", "plot-v", "values", "proof", "cautions"})
      CHECK_MESSAGE(dom.out.find(std::string("id=\"") + id + "\"") != std::string::npos, id);
    if (std::string(page) == "c") CHECK(dom.out.find("id=\"dimensional\"") != std::string::npos);
    if (std::string(page) == "b") CHECK(dom.out.find("id=\"plot-branches\"") != std::string::npos);
    const std::string png = tmp + "/" + page + ".png";
    const auto shot = sh("timeout 120 " + chr + flags + "--screenshot=" + png + " " + url);
    CHECK(shot.rc == 0);
    std::ifstream in(png, std::ios::binary);
    std::string head(8, '\0');
    in.read(head.data(), 8);
    CHECK(head == std::string("\x89PNG\r\n\x1a\n", 8));
  }
}
